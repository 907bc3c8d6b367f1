/**
 * Nonsense designs through the real command (issue 15 item 4): the example with one absurd value
 * each is either refused (exit 1, the field's path and the limit on standard error, nothing on
 * standard output) or reported with the design check that a reviewing engineer would raise — a
 * failure (exit 2) when the channel cannot measure its span, a warning for an input outside its
 * usual range — and never "Every check passed".
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { examplePath } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file } = useTestFiles('nonsense');
const example = readFileSync(examplePath, 'utf8');

/** The example with `from` replaced by `to` (which must occur exactly once). */
function edited(name: string, from: string, to: string): string {
  expect(example.split(from).length, from).toBe(2);
  return file(name, example.replace(from, to));
}

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  // A check's text wrapped under its mark is joined back into one line.
  return { code, stdout: io.stdout.text().replace(/\n {10}(?=\S)/g, ' '), stderr: io.stderr.text() };
}

describe('nonsense designs are refused', () => {
  it.each([
    // [what, from, to, channel, field, text of the limit]
    ['gain 1e−300', 'gain: 128', 'gain: 1e-300', 'hanger-h3', 'amplifier.gain', '1e-300'],
    [
      'a data rate of 1e308 Hz',
      'dataRateHertz: 10 Hz } }\n    environment',
      'dataRateHertz: 1e308 Hz } }\n    environment',
      'hanger-h3',
      'adc.filter.dataRateHertz',
      '<= 1e12 Hz',
    ],
    [
      'an RTD of R0 = 1e17 Ω',
      'r0Ohms: 1000 Ω',
      'r0Ohms: 1e17 Ω',
      'deck-temp',
      'sensor.r0Ohms',
      '1000000000000000',
    ],
    [
      'a 50 000 km cable',
      'lengthMeters: 22 m',
      'lengthMeters: 50000 km',
      'gusset-g2',
      'bridge.cable.lengthMeters',
      '100000 m',
    ],
  ] as const)('%s: exit 1, the field and its limit', async (what, from, to, channel, field, limit) => {
    const r = await run('report', edited(`${what}.yaml`, from, to), '--channel', channel);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stdout).toBe('');
    // Every refusal names the field the user can change, never the channel as a whole.
    const path = `channels.${channel}.${field}`;
    expect(r.stderr).toMatch(
      new RegExp(`:\\d+:\\d+: ${path.replace(/[.]/g, '\\.')}: .*${limit.replace(/[.]/g, '\\.')}`),
    );
  });
});

describe('nonsense designs that can be built are failed or flagged by the design checks', () => {
  it('gain 1e−6: the span covers a hundredth of a code, and the uncertainty and noise exceed it (exit 2)', async () => {
    const path = edited('tiny-gain.yaml', 'gain: 128', 'gain: 1e-6');
    const r = await run('report', path, '--channel', 'hanger-h3');
    expect(r.code).toBe(exitCodes.failedCheck);
    expect(r.stdout).toMatch(
      /^ {4}FAIL {2}converter codes across the span: .* covers only 0\.01\d+ converter codes/m,
    );
    expect(r.stdout).toMatch(/^ {4}FAIL {2}expanded uncertainty against the span: /m);
    expect(r.stdout).toMatch(/^ {4}FAIL {2}rms noise against the span: /m);
    expect(r.stdout).toMatch(
      /^ {4}WARN {2}amplifier\.gain in its usual range: amplifier\.gain = 1e−6 lies outside/m,
    );
    expect(r.stdout).toMatch(/A design check failed: see the FAIL lines above \(exit code 2\)/);
    expect(r.stdout).not.toMatch(/Every check passed/);
    const json = await run('report', path, '--channel', 'hanger-h3', '--json');
    const parsed = JSON.parse(json.stdout) as {
      ok: boolean;
      channels: { checks: { id: string; status: string }[] }[];
    };
    expect(parsed.ok).toBe(false);
    expect(parsed.channels[0]!.checks.find((k) => k.id === 'span-codes')!.status).toBe('fail');
  });

  it('8 mV/√Hz amplifier noise on a quarter bridge: u_c many times the span (exit 2)', async () => {
    const path = edited(
      'noisy.yaml',
      'inputVoltageNoiseVoltsPerRootHz: 8e-9\n    adc: { bits: 24, referenceVolts: 2.5 V',
      'inputVoltageNoiseVoltsPerRootHz: 8e-3\n    adc: { bits: 24, referenceVolts: 2.5 V',
    );
    const r = await run('report', path, '--channel', 'gusset-g2');
    expect(r.code).toBe(exitCodes.failedCheck);
    expect(r.stdout).toMatch(
      /^ {4}FAIL {2}expanded uncertainty against the span: U = [\d.]+\u00a0µε is \d+\u00a0% of the span/m,
    );
    expect(r.stdout).toMatch(/^ {4}FAIL {2}rms noise against the span: /m);
    expect(r.stdout).toMatch(
      /amplifier\.inputVoltageNoiseVoltsPerRootHz = 8e6\u00a0nV\/√Hz lies outside the usual/,
    );
  });

  it('a source resistance of 1e12 Ω: refused with a ratiometric converter, never a clean pass', async () => {
    // A ratiometric converter's reference is the excitation at the terminals: the source
    // resistance only lowers the bridge voltage, which the channel asks for as excitation.volts.
    const path = edited(
      'source.yaml',
      'excitation: { volts: 2.5 V }',
      'excitation: { volts: 2.5 V, sourceOhms: 1e12 Ω }',
    );
    const r = await run('report', path, '--channel', 'gusset-g2');
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(
      /:\d+:\d+: channels\.gusset-g2\.excitation\.sourceOhms: must be 0 with a ratiometric converter: its reference is taken at the excitation terminals/,
    );
    expect(r.stdout).not.toMatch(/Every check passed/);
    // With an absolute reference the 1e12 Ω starves the bridge: refused, with what to check.
    const absolute = file(
      'absolute.yaml',
      `channels:
  load:
    sensor: { kind: transducer, capacity: 20 t, ratedOutputVoltsPerVolt: 2 mV/V }
    excitation: { volts: 5 V, sourceOhms: 1e12 Ω }
    amplifier: { gain: 128 }
    adc: { bits: 24, referenceVolts: 2.5 V }
    output: { quantity: mass }
`,
    );
    const a = await run('report', absolute);
    expect(a.code).toBe(exitCodes.badInput);
    expect(a.stderr).toMatch(
      /:\d+:\d+: channels\.load\.amplifier\.gain: leaves no converter code .*; check /,
    );
  });
});
