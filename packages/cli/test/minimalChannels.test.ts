/**
 * The minimal channel files (issue 13: the RTD and quarter-bridge strain files it quotes, and one
 * per sensor kind) run end to end through the real command: `report`, `constants`, `convert` and
 * `uncertainty` each exit 0 and print their result, nothing on standard error but notes.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const folder = fileURLToPath(new URL('./fixtures/minimal/', import.meta.url));
const files = readdirSync(folder).filter((f) => f.endsWith('.yaml'));
const { file, outPath } = useTestFiles('minimal');

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

describe('minimal channel files, end to end', () => {
  it('holds the two files of issue 13 and one per sensor kind', () => {
    expect(files).toEqual(
      expect.arrayContaining(['rtd.yaml', 'strain-quarter.yaml', 'transducer.yaml', 'thermistor.yaml']),
    );
  });

  describe.each(files)('%s', (name) => {
    const path = join(folder, name);

    it('report exits 0 with every section', async () => {
      const r = await run('report', path);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(exitCodes.ok);
      expect(r.stdout).toMatch(/^Design report: /);
      // No check fails; a default gain of 1 may leave the span a small share of the converter's
      // range, and a transducer without a rated-output tolerance has no calibration line in its
      // budget: the report shows each as a warning with what to change.
      expect(r.stdout).toMatch(
        /^(Every check passed\.|No check failed, but (1 warning|2 warnings): see the WARN lines above\.)$/m,
      );
      if (name === 'transducer.yaml')
        expect(r.stdout).toMatch(/WARN {2}the sensor's calibration uncertainty in the budget: /);
      expect(r.stdout).not.toMatch(/FAIL/);
      expect(r.stdout).toMatch(/qualified engineering judgement/);
    });

    it('report --json exits 0 and parses', async () => {
      const r = await run('report', path, '--json');
      expect(r.code).toBe(exitCodes.ok);
      expect(() => JSON.parse(r.stdout) as unknown).not.toThrow();
    });

    it('constants exits 0 with a C header', async () => {
      const r = await run('constants', path, '--verification', 'sampled');
      expect(r.code).toBe(exitCodes.ok);
      expect(r.stdout).toMatch(/#define /);
    });

    it('uncertainty exits 0', async () => {
      const r = await run('uncertainty', path, '--trials', '2000');
      expect(r.stderr).toBe('');
      expect(r.code).toBe(exitCodes.ok);
      expect(r.stdout).toMatch(/^Monte Carlo uncertainty \(JCGM 101\): /);
    });

    it('convert exits 0 and writes one value per code', async () => {
      const channels = Object.keys(
        (await import('yaml')).parse(readFileSync(path, 'utf8')).channels as Record<string, unknown>,
      );
      // Codes near mid-scale of a 24-bit converter: small inputs that any of these channels reads.
      const codes = channels.flatMap(() => [0, 1000, -1000]);
      const data = file('codes.bin', int32le(codes));
      const out = outPath('out.csv');
      const r = await run('convert', path, data, '-o', out);
      expect(r.code).toBe(exitCodes.ok);
      const lines = readFileSync(out, 'utf8').trimEnd().split('\n');
      expect(lines).toHaveLength(1 + codes.length / channels.length);
    });
  });
});
