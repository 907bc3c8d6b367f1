/**
 * `bridgework uncertainty`: the Monte Carlo run in seeded batches, pooled. Checked against the
 * channel package's own Monte Carlo runs (bit for bit: one batch is exactly its run; several
 * batches are its runs with the derived seeds, whose values the test pools itself with the order
 * statistics of JCGM 101 7.7), against the GUM result, and against the 95 % interval of a
 * rectangular distribution of half-width a, which is ±0.95a (derived: a rectangle spreads its
 * probability evenly over 2a).
 */
import { readFileSync } from 'node:fs';
import { channelBudget, createChannel } from '@bridgework/channel';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { BATCH_TRIALS, batchSizes, batchedMonteCarlo } from '../src/uncertainty/batchedMonteCarlo.js';
import { exampleShown, footbridgeSpecs } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { outPath } = useTestFiles('uncertainty');

async function run(argv: string[], options: { stderrTTY?: boolean } = {}) {
  const io = memoryIo(options);
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

/** JCGM 101 7.7.1 and 7.7.2 from the sorted values, written out independently of the library. */
function intervalsBySorting(values: Float64Array, p: number) {
  const y = Float64Array.from(values).sort();
  const m = y.length;
  const q = Number.isInteger(p * m) ? p * m : Math.floor(p * m + 0.5);
  const r = Number.isInteger((m - q) / 2) ? (m - q) / 2 : (m - q + 1) / 2;
  // Order statistics y_(k) are 1-based in JCGM 101.
  const symmetric = { min: y[r - 1]!, max: y[r + q - 1]! };
  let best = 1;
  for (let k = 2; k <= m - q; k++) if (y[k + q - 1]! - y[k - 1]! < y[best + q - 1]! - y[best - 1]!) best = k;
  return { symmetric, shortest: { min: y[best - 1]!, max: y[best + q - 1]! } };
}

describe('batch sizes', () => {
  it('splits a run into as few batches of at most 10 000 as possible, equal to within one trial', () => {
    expect(batchSizes(1000)).toEqual([1000]);
    expect(batchSizes(10_000)).toEqual([10_000]);
    expect(batchSizes(10_001)).toEqual([5001, 5000]);
    fc.assert(
      fc.property(fc.integer({ min: 1000, max: 10_000_000 }), (trials) => {
        const sizes = batchSizes(trials);
        expect(sizes.reduce((a, b) => a + b, 0)).toBe(trials);
        expect(sizes).toHaveLength(Math.ceil(trials / BATCH_TRIALS));
        expect(Math.max(...sizes)).toBeLessThanOrEqual(BATCH_TRIALS);
        expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
      }),
      { numRuns: 200 },
    );
  });
});

describe('batchedMonteCarlo', () => {
  const channel = createChannel(footbridgeSpecs['deck-temp']);

  it('with one batch, is exactly the channel package’s own run with that seed', () => {
    const own = channelBudget(channel, { monteCarlo: { trials: 5000, seed: 9 } }).monteCarlo!;
    const ours = batchedMonteCarlo(channel, { trials: 5000, seed: 9 });
    expect(ours.batches).toEqual([5000]);
    expect(ours.seeds).toEqual([9]);
    expect(ours.interval).toEqual(own.interval);
    expect(ours.shortestInterval).toEqual(own.shortestInterval);
    // The moments are summed in another order than the library's block sums.
    expect(ours.value).toBeNear(own.value, { rel: 1e-13 });
    expect(ours.standardUncertainty).toBeNear(own.standardUncertainty, { rel: 1e-10 });
  });

  it('with several batches, pools the runs with seeds seed + i·2³² and takes the intervals over all values', () => {
    const ours = batchedMonteCarlo(channel, { trials: 12_000, seed: 5 });
    expect(ours.batches).toEqual([6000, 6000]);
    expect(ours.seeds).toEqual([5, 5 + 2 ** 32]);
    const parts = ours.seeds.map(
      (seed) =>
        channelBudget(channel, { monteCarlo: { trials: 6000, seed, returnValues: true } }).monteCarlo!
          .values!,
    );
    const all = new Float64Array(12_000);
    all.set(parts[0]!, 0);
    all.set(parts[1]!, 6000);
    const reference = intervalsBySorting(all, 0.95);
    expect(ours.interval).toEqual(reference.symmetric);
    expect(ours.shortestInterval).toEqual(reference.shortest);
    let sum = 0;
    for (const v of all) sum += v;
    const mean = sum / all.length;
    let ss = 0;
    for (const v of all) ss += (v - mean) ** 2;
    expect(ours.value).toBeNear(mean, { rel: 1e-13 });
    expect(ours.standardUncertainty).toBeNear(Math.sqrt(ss / (all.length - 1)), { rel: 1e-10 });
    // And it is not simply the first run repeated.
    expect(parts[0]).not.toEqual(parts[1]);
  });

  it('gives the interval of a rectangular distribution when one rectangular tolerance dominates', () => {
    // The hanger's budget is 99.8 % gauge factor (rectangular, a = |c|·half-width = 600 N at 120 kN).
    const hanger = createChannel(footbridgeSpecs['hanger-h3']);
    const r = batchedMonteCarlo(hanger, { trials: 40_000, seed: 3 });
    const gf = r.budget.lines.find((l) => l.name === 'gauge factor')!;
    const a = Math.abs(gf.value);
    // ±0.95a holds 95 % of a rectangle. Sampling error of the 2.5 % and 97.5 % quantiles at
    // 40 000 trials: √(p(1 − p)/M)·2a ≈ 0.0016a; the small gain and noise terms widen it slightly.
    expect((r.interval.max - r.interval.min) / 2).toBeNear(0.95 * a, { rel: 0.01 });
    // u(y) of the sample against the GUM's root-sum-square: relative standard error of a standard
    // deviation of a near-rectangular sample ≈ √(0.8/(4M)) ≈ 0.2 %; allow 1 %.
    expect(r.standardUncertainty).toBeNear(r.budget.combined.standardUncertainty, { rel: 0.01 });
    // The GUM's ±1.96u is wider than the rectangle's ±1.645u: JCGM 101 clause 8 does not validate it.
    expect(r.gumValidation.validated).toBe(false);
    expect(r.gumValidation.dLow).toBeNear(
      (1.96 - 0.95 * Math.sqrt(3)) * r.budget.combined.standardUncertainty,
      {
        rel: 0.05,
      },
    );
  });

  it('rejects a bad trial count or seed', () => {
    expect(() => batchedMonteCarlo(channel, { trials: 999, seed: 1 })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'trials',
      },
    );
    expect(() => batchedMonteCarlo(channel, { trials: 5000, seed: 1.5 })).toThrowBridgeworkError(
      'not-integer',
      {
        param: 'seed',
      },
    );
  });
});

describe('bridgework uncertainty', () => {
  const argv = ['uncertainty', exampleShown, '--channel', 'deck-temp', '--trials', '12000', '--seed', '5'];

  it('prints JSON equal to the pooled run, and the same for the same seed', async () => {
    const r = await run([...argv, '--json']);
    expect(r.code).toBe(exitCodes.ok);
    const json = JSON.parse(r.stdout) as {
      caution: string;
      channels: {
        name: string;
        trials: number;
        seeds: number[];
        monteCarlo: { value: number; standardUncertainty: number; interval: { min: number; max: number } };
        gum: { standardUncertainty: number; coverageFactor: number };
        gumValidation: { validated: boolean };
      }[];
    };
    const ours = batchedMonteCarlo(createChannel(footbridgeSpecs['deck-temp']), { trials: 12_000, seed: 5 });
    const c = json.channels[0]!;
    expect(c.name).toBe('deck-temp');
    expect(c.seeds).toEqual([5, 5 + 2 ** 32]);
    expect(c.monteCarlo.value).toBe(ours.value);
    expect(c.monteCarlo.standardUncertainty).toBe(ours.standardUncertainty);
    expect(c.monteCarlo.interval).toEqual(ours.interval);
    expect(c.gum.standardUncertainty).toBe(ours.budget.combined.standardUncertainty);
    expect(json.caution).toMatch(/do not replace, qualified engineering judgement/);
    expect((await run([...argv, '--json'])).stdout).toBe(r.stdout);
    expect((await run([...argv.slice(0, -1), '6', '--json'])).stdout).not.toBe(r.stdout);
  });

  it('prints a table of the Monte Carlo and GUM results with the clause 8 verdict', async () => {
    const r = await run(argv);
    expect(r.stdout).toMatch(
      /^Monte Carlo uncertainty \(JCGM 101\): packages\/cli\/demo\/footbridge-monitoring\.yaml$/m,
    );
    expect(r.stdout).toMatch(
      /12000 trials per channel in 2 batches; seed 5 \(batch i runs with seed \+ i·2³²\)/,
    );
    expect(r.stdout).toMatch(/^deck-temp: temperature at 60 °C$/m);
    expect(r.stdout).toMatch(
      /^ {2}Monte Carlo \(JCGM 101\), symmetric +60\.\d{3} +0\.\d+ +59\.\d{3} +60\.\d{3}$/m,
    );
    expect(r.stdout).toMatch(/^ {2}GUM \(JCGM 100\), k = 1\.96 +60\.000 +0\.157 +59\.692 +60\.308$/m);
    expect(r.stdout).toMatch(/JCGM 101 clause 8: .+ the GUM interval is (not )?validated/s);
    expect(r.stdout).toMatch(/do not replace, qualified engineering judgement/);
  });

  it('uses --coverage for both methods', async () => {
    const r = await run([...argv, '--coverage', '0.9', '--json']);
    const c = (JSON.parse(r.stdout) as { channels: { coverage: number; gum: { coverageFactor: number } }[] })
      .channels[0]!;
    expect(c.coverage).toBe(0.9);
    // ν_eff = ∞ here (rectangular and exact inputs): k is the normal quantile, 1.6448536… (from memory).
    expect(c.gum.coverageFactor).toBeNear(1.6448536269514722, { rel: 1e-12 });
  });

  it('draws a progress bar per channel only on a terminal', async () => {
    const tty = await run(argv, { stderrTTY: true });
    expect(tty.stderr).toMatch(/\rdeck-temp \[[█░]+\] +50\.0 %/);
    expect(tty.stderr).toMatch(/\rdeck-temp \[█+\] 100\.0 %/);
    expect((await run(argv)).stderr).toBe('');
  });

  it('writes to a file, never over an existing one without --force', async () => {
    const out = outPath('mc.txt');
    expect((await run([...argv, '-o', out])).stderr).toBe(`wrote the Monte Carlo results to ${out}\n`);
    expect(readFileSync(out, 'utf8')).toMatch(/^Monte Carlo uncertainty/);
    expect((await run([...argv, '-o', out])).code).toBe(exitCodes.badInput);
  });
});
