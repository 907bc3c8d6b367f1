import { describe, expect, it } from 'vitest';
import {
  monteCarlo,
  numericalTolerance,
  sampleCoverageIntervals,
  type InputQuantities,
} from '@bridgework/uncertainty';

const inputs: InputQuantities = {
  a: { value: 0, standardUncertainty: 1 },
  b: { value: 0, standardUncertainty: 1 },
  c: { value: 0, distribution: 'rectangular', halfWidth: 1 },
};
const model = ({ a, b, c }: Readonly<Record<string, number>>): number => a! + b! * c!;

/** JCGM 101 7.9.4 (h)–(i) restated: the standard deviation of the average of h sequence values. */
function spread(values: number[]): number {
  const h = values.length;
  const mean = values.reduce((x, y) => x + y, 0) / h;
  return Math.sqrt(values.reduce((x, v) => x + (v - mean) ** 2, 0) / (h * (h - 1)));
}

/** The statistics of each sequence, from the model values (mean, sd, JCGM 101 7.7 by a full sort). */
function sequenceStatistics(values: Float64Array, perSequence: number) {
  const out: { y: number; u: number; min: number; max: number }[] = [];
  for (let start = 0; start < values.length; start += perSequence) {
    const v = Array.from(values.subarray(start, start + perSequence));
    const y = v.reduce((x, z) => x + z, 0) / v.length;
    const u = Math.sqrt(v.reduce((x, z) => x + (z - y) ** 2, 0) / (v.length - 1));
    const { interval } = sampleCoverageIntervals(v, 0.95);
    out.push({ y, u, min: interval.min, max: interval.max });
  }
  return out;
}

describe('monteCarlo: the adaptive procedure of JCGM 101 7.9', () => {
  it('stops at the first h where 2s ≤ δ for y, u(y) and both ends — recomputed from the values', () => {
    const r = monteCarlo({ model, inputs, adaptive: true, returnValues: true, seed: 3 });
    const report = r.adaptive!;
    // M = max(J, 10⁴) with J = ⌈100/(1 − p)⌉ = 2000, rounded up to one block of 16 384 trials.
    expect(report.trialsPerSequence).toBe(16384);
    expect(r.trials).toBe(report.sequences * report.trialsPerSequence);
    const stats = sequenceStatistics(r.values!, report.trialsPerSequence);
    const test = (h: number) => {
      const first = stats.slice(0, h);
      const all = Array.from(r.values!.subarray(0, h * report.trialsPerSequence));
      const mean = all.reduce((x, z) => x + z, 0) / all.length;
      const u = Math.sqrt(all.reduce((x, z) => x + (z - mean) ** 2, 0) / (all.length - 1));
      const delta = numericalTolerance(u, 2);
      const s = [
        spread(first.map((q) => q.y)),
        spread(first.map((q) => q.u)),
        spread(first.map((q) => q.min)),
        spread(first.map((q) => q.max)),
      ];
      return { delta, s, stable: s.every((v) => 2 * v <= delta) };
    };
    const last = test(report.sequences);
    expect(last.stable).toBe(true);
    expect(report.tolerance).toBe(last.delta);
    expect([
      report.spread.value,
      report.spread.standardUncertainty,
      report.spread.min,
      report.spread.max,
    ]).toBeNear(last.s, { rel: 1e-9 });
    for (let h = 2; h < report.sequences; h++) expect(test(h).stable).toBe(false);
    expect(report.sequences).toBeGreaterThanOrEqual(2);
  });

  it('reports exactly what a fixed run of the same number of trials and seed reports', () => {
    const adaptive = monteCarlo({ model, inputs, adaptive: { interval: 'both' }, seed: 9 });
    const fixed = monteCarlo({ model, inputs, trials: adaptive.trials, seed: 9 });
    expect({ ...adaptive, adaptive: undefined }).toEqual({ ...fixed, adaptive: undefined });
    expect(adaptive.adaptive?.interval).toBe('both');
    const { spread: s, tolerance } = adaptive.adaptive!;
    for (const v of Object.values(s)) expect(2 * v).toBeLessThanOrEqual(tolerance);
  });

  it('gives up with not-converged when δ cannot be reached within maxTrials', () => {
    // ndig = 6 asks for u(y) to one part in 10⁶: about 10¹² trials.
    expect(() =>
      monteCarlo({ model, inputs, adaptive: { maxTrials: 5 * 16384 }, significantDigits: 6 }),
    ).toThrowBridgeworkError('not-converged', { param: 'adaptive.maxTrials' });
  });
});
