/**
 * `bridgework constants` end to end on the example file: the header is the firmware package's
 * header of the channel package's constants for the same channels (written by hand in SI), each
 * function within its stated total error of the channel's exact map, the compiled evaluators give
 * what the library says, a target no form meets writes nothing and fails, and --test-program
 * writes a program that passes on the host.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
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
const STRICT = ['-std=c99', '-Wall', '-Wextra', '-Wconversion', '-Werror', '-pedantic'];

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

function hasGcc(): boolean {
  try {
    execFileSync('gcc', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

function needGcc(skip: () => void): boolean {
  if (hasGcc()) return true;
  if (process.env['CI'] !== undefined) throw new Error('gcc is required under CI');
  skip();
  return false;
}

// 'sampled' keeps the test quick: verifying the full bridge's 1.6 million codes exhaustively
// takes its exact map some 20 s; exhaustive verification is tested in the firmware and channel
// packages and in test/firmwareChannels.test.ts.
const channels: Record<string, Channel> = Object.fromEntries(
  footbridgeNames.map((n) => [n, createChannel(footbridgeSpecs[n])]),
);
const constants: Record<string, ChannelConstants> = Object.fromEntries(
  footbridgeNames.map((n) => [n, channelConstants(channels[n]!, { verification: 'sampled' })]),
);

describe('bridgework constants on the example file', () => {
  it('writes the firmware package’s header for the three channels, a first comment naming the file, a summary on stderr', async () => {
    const r = await run('constants', exampleShown, '--prefix', 'footbridge', '--verification', 'sampled');
    expect(r.code).toBe(exitCodes.ok);
    const [first, ...rest] = r.stdout.split('\n');
    expect(first).toMatch(
      /^\/\* From the channel file packages\/cli\/demo\/footbridge-monitoring\.yaml \(channels hanger-h3, gusset-g2, deck-temp\) by bridgework \d+\.\d+\.\d+\. \*\/$/,
    );
    const expected = emitCHeader({
      channels: footbridgeNames.map((n) => constants[n]!.firmwareChannel),
      prefix: 'footbridge',
    });
    expect(rest.join('\n')).toBe(expected);
    expect(r.stdout.replace(/\n \* /g, ' ')).toContain(`Caution. ${SAFETY_CAUTION}`);
    // One line per channel and function, with its form, table, total error and how it was found.
    const lines = r.stderr.trimEnd().split('\n');
    expect(lines.length).toBe(9);
    expect(lines[0]).toMatch(
      /^hanger-h3 fixed: affine, 20 bytes; total error <= [\d.e+-]+ N \(measured on \d+ codes; target [\d.e+-]+ N\)$/,
    );
    expect(r.stderr).toMatch(
      /deck-temp float32: piecewise \w+, \d+ segments?, \d+ bytes; total error <= [\d.e+-]+ °C/,
    );
  });

  it('compiles under strict C99; the evaluators give what the library computes, within each stated total of the exact map', async (ctx) => {
    if (!needGcc(() => ctx.skip())) return;
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
    execFileSync('gcc', [...STRICT, 'main.c', '-o', 'main'], { cwd: dir });
    const lines = execFileSync(join(dir, 'main'), { encoding: 'utf8' }).trim().split('\n');
    let k = 0;
    for (const n of footbridgeNames) {
      const c = constants[n]!;
      for (const code of probes[n]!) {
        const [fixed, f32Text, f64] = (lines[k++] as string).split(' ').map(Number) as [
          number,
          number,
          number,
        ];
        const f32 = Math.fround(f32Text); // %.9g identifies a binary32 value
        expect(fixed, `${n} fixed at ${code}`).toBe(c.fixed!.evaluate(code));
        expect(f32, `${n} f32 at ${code}`).toBe(c.float32!.evaluate(code));
        expect(f64, `${n} f64 at ${code}`).toBe(c.float64!.evaluate(code));
        // Against the channel's exact map itself: the stated totals hold.
        const exact = channels[n]!.quantityFromCode(code);
        expect(f32).toBeNear(exact, { abs: c.totals.float32!.bound });
        expect(f64).toBeNear(exact, { abs: c.totals.float64!.bound });
        expect(fixed * c.outputResolution).toBeNear(exact, { abs: c.totals.fixed!.bound * (1 + 1e-12) });
      }
    }
    expect(k).toBe(lines.length);
  });

  it('takes --target-error per channel, and writes a test program that passes on the host (--test-program)', async (ctx) => {
    if (!needGcc(() => ctx.skip())) return;
    const dir = tmp();
    const header = join(dir, 'deck.h');
    const program = join(dir, 'deck_test.c');
    const r = await run(
      ...['constants', exampleShown, '--channel', 'deck-temp', '--target-error', 'deck-temp=0.01'],
      ...['--verification', 'sampled', '-o', header, '--test-program', program],
    );
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stderr).toMatch(/deck-temp fixed: .*target 0\.01 °C\)/);
    expect(r.stderr).toContain(`wrote the test program to ${program}\n`);
    const deck = channelConstants(channels['deck-temp']!, { targetError: 0.01, verification: 'sampled' });
    expect(readFileSync(header, 'utf8')).toContain(
      `#define BRIDGEWORK_DECK_TEMP_FIXED_TOTAL_ERROR ${String(deck.totals.fixed!.bound)}`,
    );
    const source = readFileSync(program, 'utf8');
    expect(source).toContain('#include "deck.h"');
    execFileSync('gcc', [...STRICT, 'deck_test.c', '-o', 'deck_test'], { cwd: dir });
    expect(execFileSync(join(dir, 'deck_test'), { encoding: 'utf8' })).toMatch(
      /^bridgework test vectors: \d+ checked, 0 failed\n$/,
    );
  });

  it('fails and writes nothing when a target cannot be met, naming the best bound and --target-error', async () => {
    const out = outPath('never.h');
    const program = outPath('never.c');
    const r = await run(
      ...[
        'constants',
        exampleShown,
        '--channel',
        'deck-temp',
        '--target-error',
        '1e-9',
        '--coefficient-bits',
        '16',
      ],
      ...['--verification', 'sampled', '-o', out, '--test-program', program],
    );
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(
      /channels\.deck-temp: `--target-error` 1e-9 °C cannot be met by a \w+ function: /,
    );
    // A bound in the user's unit, and the command's own option names in the advice.
    expect(r.stderr).toMatch(/(best bound reached is|can do better than) [\d.e-]+ °C/);
    expect(r.stderr).not.toMatch(/`(targetError|outputUnit|outputResolution|coefficientBits|maxTableBytes)`/);
    expect(existsSync(out)).toBe(false);
    expect(existsSync(program)).toBe(false);
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
    const json = JSON.parse(r.stdout) as {
      caution: string;
      channels: { fixed: { totalError: { bound: number } } }[];
    };
    expect(json.caution).toBe(SAFETY_CAUTION);
    expect(json.channels[0]!.fixed.totalError.bound).toBe(constants['gusset-g2']!.totals.fixed!.bound);
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
    expect((await run(...argv)).stderr).toMatch(
      new RegExp(`wrote the constants of 1 channel to ${out.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\n$`),
    );
    expect(readFileSync(out, 'utf8')).toMatch(/^\/\* From the channel file/);
    expect((await run(...argv)).stderr).toBe(
      `bridgework constants: ${out} exists already; pass --force to replace it\n`,
    );
  });

  it('rejects a bad prefix, type list, per-channel entry or a test program for JSON, with the option’s name, exit 1', async () => {
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
    expect(prefix.stderr).toMatch(/bridgework constants: `--prefix` must /);
    const types = await run('constants', exampleShown, '--types', 'fixed,double');
    expect(types.stderr).toBe(
      "bridgework constants: `--types` must list some of fixed, float32, float64, each once; got 'fixed,double'\n",
    );
    const entry = await run('constants', exampleShown, '--target-error', 'deck=0.01');
    expect(entry.code).toBe(exitCodes.badInput);
    expect(entry.stderr).toMatch(
      /`--target-error` entries must be name=value for distinct channels of the file \(hanger-h3, gusset-g2, deck-temp\); got 'deck=0\.01'/,
    );
    const negative = await run('constants', exampleShown, '--target-error', '-1');
    expect(negative.stderr).toMatch(/`--target-error` must be a positive number/);
    const json = await run('constants', exampleShown, '--format', 'json', '--test-program', outPath('x.c'));
    expect(json.stderr).toMatch(/`--test-program` checks a C header: it needs `--format c`/);
  });
});
