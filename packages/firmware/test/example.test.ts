/**
 * The hopper-scale example: its TypeScript program generates the header, the committed copy is
 * current, and its C program builds with the strict flags and prints what TypeScript computes.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { codeRange, fullLoadCode, hopperChannel } from '../../../examples/hopper-scale/scenario.js';
import { compile, needCompiler, scratch, STRICT_FLAGS } from './support/cc.js';

const root = fileURLToPath(new URL('../../..', import.meta.url));
const exampleDir = join(root, 'examples', 'hopper-scale');

function runExample(args: readonly string[]): string {
  return execFileSync(
    process.execPath,
    ['--import', 'tsx', '--conditions=@bridgework/source', 'examples/hopper-scale.ts', ...args],
    { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } },
  );
}

describe('examples/hopper-scale', () => {
  it('generates the committed header, builds the C program and prints the TypeScript results', (ctx) => {
    const { dir, remove } = scratch();
    try {
      const report = runExample(['--out', dir]);
      expect(report).toMatch(/do not replace,\s+qualified engineering judgement/);
      const generated = readFileSync(join(dir, 'hopper_scale.h'), 'utf8');
      // The copy beside the C program must be what the example generates now.
      expect(readFileSync(join(exampleDir, 'hopper_scale.h'), 'utf8')).toBe(generated);
      if (!needCompiler('gcc', () => ctx.skip())) return;
      compile(
        'gcc',
        [...STRICT_FLAGS, '-I', dir, join(exampleDir, 'hopper-scale.c'), '-o', join(dir, 'hopper-scale')],
        dir,
      );
      const { fixed, float32 } = hopperChannel();
      const codes = [codeRange.codeMin, codeRange.codeMin + 1, -1, 0, 8421, 8422, 1082645, fullLoadCode];
      codes.push(codeRange.codeMax - 1, codeRange.codeMax, codeRange.codeMax + 1);
      const out = execFileSync(join(dir, 'hopper-scale'), codes.map(String), { encoding: 'utf8' })
        .trimEnd()
        .split('\n');
      expect(out).toHaveLength(codes.length);
      out.forEach((line, i) => {
        const code = codes[i]!;
        if (code > codeRange.codeMax) {
          expect(line).toBe(`${code} out of range`);
          return;
        }
        const [printedCode, centi, , , f] = line.split(' ');
        expect(Number(printedCode)).toBe(code);
        expect(Number(centi)).toBe(fixed!.evaluate(code));
        // %.9g prints a float32 so that it reads back to the same float32.
        expect(Math.fround(Number(f))).toBe(float32!.evaluate(code));
      });
      // Full load reads 3000.00 kg.
      expect(out[codes.indexOf(fullLoadCode)]).toMatch(/^2157301 300000 3000\.00 kg /);
    } finally {
      remove();
    }
  });
});
