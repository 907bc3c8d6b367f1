/**
 * The command names no sensor kind (issue 13, "the CLI computes nothing the channel knows"): a
 * sensor kind that exists only in this test, added to the channel package's kinds through a kit,
 * runs through `report` (text, JSON, HTML), `constants`, `convert` and `uncertainty` like a
 * built-in one. The kind is the channel package's invented test kind: an element whose resistance
 * is R = R0·(1 + k·ε), in arm 1 of a quarter bridge.
 *
 * The channel package does not export its kit (`createChannelKit`) or the `SensorKind` contract
 * publicly yet, so this test imports them from its sources, as the channel package's own
 * touch-point test does; the command takes the kit through an internal entry (`runCommandLine`),
 * never through its public index.
 */
import { readFileSync } from 'node:fs';
import { channelBudget } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCommandLine } from '../src/runCli.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';
import { filmKit } from './support/sensorKindKit.js';

const { file, outPath } = useTestFiles('kind-kit');

const channelFile = `# An invented sensor kind, known only to this test's kit.
channels:
  film:
    sensor: { kind: resistive-film, sensitivity: 4, r0Ohms: 1 kΩ }
    bridge: { wiring: three-wire, ohmsPerLead: 0 Ω }
    excitation: { volts: 2.5 V }
    amplifier: { gain: 32 }
    adc: { bits: 24, referenceVolts: 2.5 V, ratiometric: true }
    output: { quantity: strain, unit: µε }
`;

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCommandLine(argv, io, filmKit);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

describe('a sensor kind known only to a kit runs through every command', () => {
  const path = file('film.yaml', channelFile);
  const channel = filmKit.createChannel(
    filmKit.validateChannelSpec({
      name: 'film',
      sensor: { kind: 'resistive-film', sensitivity: 4, r0Ohms: 1000 },
      bridge: { wiring: 'three-wire', ohmsPerLead: 0 },
      excitation: { volts: 2.5 },
      amplifier: { gain: 32 },
      adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε' },
    }).value,
  );

  it('the built-in channels refuse the kind, naming the field', async () => {
    const io = memoryIo();
    expect(await runCommandLine(['report', path], io)).toBe(exitCodes.badInput);
    expect(io.stderr.text()).toMatch(/channels\.film\.sensor\.kind: /);
  });

  it('report shows the kind’s own description and the budget the channel package computes', async () => {
    const r = await run('report', path);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stdout).toMatch(/^ {2}resistive film, R0 1000 Ω, k 4; three-wire/m);
    const json = await run('report', path, '--json');
    const c = (
      JSON.parse(json.stdout) as {
        channels: { combined: { standardUncertainty: number }; checks: { id: string; status: string }[] }[];
      }
    ).channels[0]!;
    const budget = channelBudget(channel);
    expect(c.combined.standardUncertainty).toBe(budget.combined.standardUncertainty);
    expect(c.checks.map((k) => [k.id, k.status])).toEqual(budget.checks.map((k) => [k.id, k.status]));
    // The kind's own plausible range is checked and shown (sensor.sensitivity in [1, 10]).
    expect(c.checks.map((k) => k.id)).toContain('plausible:sensor.sensitivity');
  });

  it('report --html draws the kind’s curves', async () => {
    const html = outPath('film.html');
    expect((await run('report', path, '--html', html)).code).toBe(exitCodes.ok);
    const page = readFileSync(html, 'utf8');
    expect(page).toContain('Resistive film, R0 1000 Ω, k 4; three-wire');
    expect(page.match(/data-plot="film-[a-z-]+"/g)?.length).toBeGreaterThanOrEqual(3);
  });

  it('convert gives the quarter bridge’s textbook strain for each code', async () => {
    // No lead resistance: ratio r = code/(G·2²³) (ratiometric) and ε = 4r/(k(1 − 2r))
    // (quarter bridge, arm 1 active; docs/bridge.md) — the kind's k in place of a gauge factor.
    const codes = [-3_000_000, -12_345, 0, 777_777, 3_500_000];
    const out = outPath('film.csv');
    const r = await run('convert', path, file('codes.bin', int32le(codes)), '-o', out);
    expect(r.code).toBe(exitCodes.ok);
    const values = readFileSync(out, 'utf8').trimEnd().split('\n').slice(1).map(Number);
    codes.forEach((code, i) => {
      const ratio = code / (32 * 2 ** 23);
      expect(values[i]).toBeNear(((4 * ratio) / (4 * (1 - 2 * ratio))) * 1e6, { rel: 1e-12, abs: 1e-9 });
    });
  });

  it('constants writes a C header for it', async () => {
    const r = await run('constants', path, '--verification', 'sampled');
    expect(r.code).toBe(exitCodes.ok);
    // Every evaluator is written for the kit's kind, each with its stated total error.
    for (const type of ['FIXED', 'F32', 'F64'])
      expect(r.stdout).toMatch(new RegExp(`#define BRIDGEWORK_FILM_${type}_TOTAL_ERROR \\d`));
    expect(r.stdout).toMatch(/static inline double bridgework_film_f64\(int32_t code\)/);
  });

  it('uncertainty runs the channel package’s Monte Carlo on it', async () => {
    const r = await run('uncertainty', path, '--trials', '20000', '--seed', '3', '--json');
    expect(r.code).toBe(exitCodes.ok);
    const c = (JSON.parse(r.stdout) as { channels: { monteCarlo: { standardUncertainty: number } }[] })
      .channels[0]!;
    const own = channelBudget(channel, { monteCarlo: { trials: 20_000, seed: 3 } }).monteCarlo!;
    expect(c.monteCarlo.standardUncertainty).toBe(own.standardUncertainty);
  });
});
