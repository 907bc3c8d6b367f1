/**
 * `bridgework constants` end to end on the example file: the header is the firmware package's
 * header of the channel package's constants for the same channels (written by hand in SI), it
 * compiles under strict C99, and the compiled evaluators give, code for code, what the library
 * says firmware gives, within the proved bounds of the exact map.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { channelConstants, createChannel, type Channel, type ChannelConstants } from '@bridgework/channel';
import { emitCHeader, emitJson } from '@bridgework/firmware';
import { describe, expect, it } from 'vitest';
import { SAFETY_CAUTION } from '../src/caution.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { exampleShown, footbridgeNames, footbridgeSpecs } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { tmp, outPath } = useTestFiles('constants');

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

/** The largest quantity magnitude over a channel's valid codes (the map is monotone). */
function largest(channel: Channel): number {
  const { min, max } = channel.validCodes;
  return Math.max(
    Math.abs(channel.quantityFromCode(Math.floor(min) + 1)),
    Math.abs(channel.quantityFromCode(Math.ceil(max) - 1)),
  );
}

function hasGcc(): boolean {
  try {
    execFileSync('gcc', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

// 'sampled' keeps the test quick: the RTD's exact map over 2.8 million codes takes seconds to verify.
const channels: Record<string, Channel> = Object.fromEntries(
  footbridgeNames.map((n) => [n, createChannel(footbridgeSpecs[n])]),
);
const constants: Record<string, ChannelConstants> = Object.fromEntries(
  footbridgeNames.map((n) => [n, channelConstants(channels[n]!, { verification: 'sampled' })]),
);

describe('bridgework constants on the example file', () => {
  it('writes the firmware package’s header for the three channels, with a first comment naming the file', async () => {
    const r = await run('constants', exampleShown, '--prefix', 'footbridge', '--verification', 'sampled');
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stderr).toBe('');
    const [first, ...rest] = r.stdout.split('\n');
    expect(first).toMatch(
      /^\/\* From the channel file packages\/cli\/demo\/footbridge-monitoring\.yaml \(channels hanger-h3, gusset-g2, deck-temp\) by bridgework \d+\.\d+\.\d+\. \*\/$/,
    );
    const expected = emitCHeader({
      channels: footbridgeNames.map((n) => constants[n]!.firmwareChannel),
      prefix: 'footbridge',
    });
    expect(rest.join('\n')).toBe(expected);
    // The caution, in the header's comment (wrapped there at 96 columns).
    expect(r.stdout.replace(/\n \* /g, ' ')).toContain(`Caution. ${SAFETY_CAUTION}`);
  });

  it('compiles under strict C99, and the evaluators give what the library computes, within the proved bounds', async () => {
    if (!hasGcc()) {
      if (process.env['CI'] !== undefined) throw new Error('gcc is required under CI');
      return;
    }
    const dir = tmp();
    const header = join(dir, 'footbridge_constants.h');
    const written = await run(
      ...['constants', exampleShown, '--prefix', 'footbridge', '--verification', 'sampled'],
      ...['-o', header, '--force'],
    );
    expect(written.code).toBe(exitCodes.ok);
    const probes: Record<string, number[]> = {};
    const calls: string[] = [];
    for (const n of footbridgeNames) {
      const c = constants[n]!;
      const id = n.replace(/-/g, '_');
      probes[n] = [
        c.codeMin,
        c.codeMin + 1,
        Math.round((c.codeMin + c.codeMax) / 2),
        12_345,
        c.codeMax - 1,
        c.codeMax,
      ];
      for (const code of probes[n]!) {
        calls.push(
          `printf("%ld %.9g %.17g\\n", (long)footbridge_${id}_fixed(${code}), (double)footbridge_${id}_f32(${code}), footbridge_${id}_f64(${code}));`,
        );
      }
    }
    writeFileSync(
      join(dir, 'main.c'),
      `#include <stdio.h>\n#include "footbridge_constants.h"\nint main(void) {\n${calls.join('\n')}\nreturn 0;\n}\n`,
    );
    execFileSync(
      'gcc',
      ['-std=c99', '-Wall', '-Wextra', '-Wconversion', '-Werror', '-pedantic', 'main.c', '-o', 'main'],
      { cwd: dir },
    );
    const lines = execFileSync(join(dir, 'main'), { encoding: 'utf8' }).trim().split('\n');
    let k = 0;
    for (const n of footbridgeNames) {
      const c = constants[n]!;
      const lsb = Number(c.fixed.source.outputUnit);
      for (const code of probes[n]!) {
        const [fixed, f32Text, f64] = (lines[k++] as string).split(' ').map(Number) as [
          number,
          number,
          number,
        ];
        // %.9g identifies a binary32 value (the nearest float to it is the value) and %.17g a double.
        const f32 = Math.fround(f32Text);
        // Bit for bit what the library says the firmware computes.
        expect(fixed, `${n} fixed at ${code}`).toBe(c.fixed.evaluate(code));
        expect(f32, `${n} f32 at ${code}`).toBe(c.float32.evaluate(code));
        expect(f64, `${n} f64 at ${code}`).toBe(c.float64.evaluate(code));
        // Against the channel's exact map: within each map's total error, which the library
        // measured at the sampled codes (the range's ends among them) against the reference it was
        // given; for a kernel channel that reference is the conversion kernel, within 1e-12 of the
        // largest quantity of the exact map (the kernel's acceptance bound, docs/channel.md).
        if (code === c.codeMin || code === c.codeMax) {
          const exact = channels[n]!.quantityFromCode(code);
          const kernel = channels[n]!.method === 'kernel' ? 1e-12 * largest(channels[n]!) : 0;
          expect(f32, `${n} f32 at ${code}`).toBeNear(exact, {
            abs: c.float32.totalError!.maxAbsError + kernel,
          });
          expect(f64, `${n} f64 at ${code}`).toBeNear(exact, {
            abs: c.float64.totalError!.maxAbsError + kernel,
          });
          expect(fixed * lsb, `${n} fixed at ${code}`).toBeNear(exact, {
            abs: c.fixed.totalError!.maxAbsError * lsb + kernel,
          });
        }
      }
    }
    expect(k).toBe(lines.length);
  });

  it('prints the firmware package’s JSON with --format json, for one channel', async () => {
    const r = await run(
      'constants',
      exampleShown,
      '--format',
      'json',
      '--channel',
      'gusset-g2',
      '--verification',
      'sampled',
    );
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stdout).toBe(
      emitJson({ channels: [constants['gusset-g2']!.firmwareChannel], prefix: 'bridgework' }),
    );
    expect((JSON.parse(r.stdout) as { caution: string }).caution).toBe(SAFETY_CAUTION);
  });

  it('writes only the evaluators asked for with --types', async () => {
    const r = await run(
      'constants',
      exampleShown,
      '--types',
      'fixed,float32',
      '--channel',
      'hanger-h3',
      '--verification',
      'sampled',
    );
    expect(r.stdout).toContain('bridgework_hanger_h3_fixed(');
    expect(r.stdout).toContain('bridgework_hanger_h3_f32(');
    expect(r.stdout).not.toContain('_f64');
  });

  it('writes a file atomically, never over an existing one without --force', async () => {
    const out = outPath('constants.h');
    const argv = [
      'constants',
      exampleShown,
      '--channel',
      'deck-temp',
      '--verification',
      'sampled',
      '-o',
      out,
    ];
    expect((await run(...argv)).stderr).toBe(`wrote the constants of 1 channel to ${out}\n`);
    expect(readFileSync(out, 'utf8')).toMatch(/^\/\* From the channel file/);
    expect((await run(...argv)).stderr).toBe(
      `bridgework constants: ${out} exists already; pass --force to replace it\n`,
    );
  });

  it('rejects a bad prefix or type list with the option’s name, exit 1', async () => {
    const prefix = await run(
      'constants',
      exampleShown,
      '--prefix',
      'Foot-Bridge',
      '--verification',
      'sampled',
    );
    expect(prefix.code).toBe(exitCodes.badInput);
    expect(prefix.stdout).toBe('');
    expect(prefix.stderr).toMatch(/^bridgework constants: `--prefix` must /);
    const types = await run('constants', exampleShown, '--types', 'fixed,double');
    expect(types.stderr).toBe(
      "bridgework constants: `--types` must list some of fixed, float32, float64, each once; got 'fixed,double'\n",
    );
  });
});
