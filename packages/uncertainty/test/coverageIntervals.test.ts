import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sampleCoverageIntervals } from '@bridgework/uncertainty';
import { bucketSortInPlace } from '../src/internal/bucketSort.js';
import {
  coveredCount,
  intervalsFromSortedParts,
  sampleIntervalsInPlace,
  selectInPlace,
  sortTailPart,
} from '../src/internal/select.js';

/**
 * JCGM 101 7.7 restated with a full sort (the straightforward reading of the standard), 1-based
 * order statistics as there: q = pM if integer else ⌊pM + ½⌋; r = (M − q)/2 if integer else
 * (M − q + 1)/2; shortest: r* minimising y₍ᵣ₊q₎ − y₍ᵣ₎ over r = 1 … M − q, the first on ties.
 */
function byFullSort(values: readonly number[], p: number) {
  const y = Array.from(Float64Array.from(values).sort());
  const m = y.length;
  const pm = p * m;
  const q = Math.abs(pm - Math.round(pm)) < 1e-9 ? Math.round(pm) : Math.floor(pm + 0.5);
  const r = (m - q) % 2 === 0 ? (m - q) / 2 : (m - q + 1) / 2;
  let best = 1;
  for (let k = 1; k <= m - q; k++) if (y[k + q - 1]! - y[k - 1]! < y[best + q - 1]! - y[best - 1]!) best = k;
  return {
    interval: { min: y[r - 1]!, max: y[r + q - 1]! },
    shortestInterval: { min: y[best - 1]!, max: y[best + q - 1]! },
  };
}

describe('selectInPlace (Floyd–Rivest)', () => {
  it('puts the kth smallest at k with smaller values before and larger after, duplicates included', () => {
    const values = fc.array(
      fc.oneof(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.integer({ min: -3, max: 3 })),
      {
        minLength: 1,
        maxLength: 3000,
      },
    );
    fc.assert(
      fc.property(values, fc.nat(), (v, kRaw) => {
        const a = Float64Array.from(v);
        const k = kRaw % a.length;
        selectInPlace(a, k);
        const sorted = Float64Array.from(v).sort();
        expect(a[k] === sorted[k]).toBe(true); // === : selection does not order −0 and +0
        for (let i = 0; i < k; i++) expect(a[i]! <= a[k]!).toBe(true);
        for (let i = k + 1; i < a.length; i++) expect(a[i]! >= a[k]!).toBe(true);
        expect(Array.from(Float64Array.from(a).sort())).toEqual(Array.from(sorted)); // a permutation
      }),
      { numRuns: 200 },
    );
  });
});

describe('bucketSortInPlace', () => {
  it('sorts like the built-in sort, stably, whatever the spread: extremes, subnormals, ties, spikes', () => {
    const special = fc.constantFrom(
      0,
      -0,
      5e-324,
      -5e-324,
      Number.MAX_VALUE,
      -Number.MAX_VALUE,
      1,
      -1,
      1 + 2 ** -52,
    );
    const value = fc.oneof(
      fc.double({ noNaN: true, noDefaultInfinity: true }),
      special,
      fc.integer({ min: -5, max: 5 }),
    );
    fc.assert(
      fc.property(fc.array(value, { maxLength: 4000 }), (v) => {
        const a = Float64Array.from(v);
        expect(bucketSortInPlace(a)).toBe(true);
        const b = Float64Array.from(v).sort();
        for (let i = 0; i < a.length; i++) expect(a[i] === b[i]).toBe(true); // ±0 keep their input order
        // Stable: −0 and +0 (equal) appear in their input order.
        const zeros = v.filter((x) => x === 0).map((x) => Object.is(x, -0));
        expect(
          Array.from(a)
            .filter((x) => x === 0)
            .map((x) => Object.is(x, -0)),
        ).toEqual(zeros);
      }),
      { numRuns: 300 },
    );
    // A spike (most values within 1e-12 of each other) with far outliers: merge sort takes over.
    const spike = Float64Array.from({ length: 20000 }, (_, i) =>
      i % 1000 === 0 ? 1e6 : 1 + ((i * 7919) % 997) * 1e-12,
    );
    bucketSortInPlace(spike);
    for (let i = 1; i < spike.length; i++) expect(spike[i - 1]! <= spike[i]!).toBe(true);
    expect(bucketSortInPlace(Float64Array.from([1, Infinity]))).toBe(false); // not for infinities
  });
});

describe('sampleCoverageIntervals (JCGM 101 7.7)', () => {
  it('equals the full-sort reading of JCGM 101 7.7 for any sample and coverage', () => {
    const sample = fc.array(
      fc.oneof(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 5 })),
      {
        minLength: 40,
        maxLength: 4000,
      },
    );
    fc.assert(
      fc.property(sample, fc.constantFrom(0.5, 0.68, 0.9, 0.95, 0.99, 0.3), (v, p) => {
        if (Math.floor(p * v.length + 0.5) >= v.length) return;
        const ours = sampleCoverageIntervals(v, p);
        const ref = byFullSort(v, p);
        // Exact (abs: 0 compares with ===, so −0 and +0 are equal: their order is not specified).
        expect([
          ours.interval.min,
          ours.interval.max,
          ours.shortestInterval.min,
          ours.shortestInterval.max,
        ]).toBeNear(
          [ref.interval.min, ref.interval.max, ref.shortestInterval.min, ref.shortestInterval.max],
          { abs: 0 },
        );
      }),
      { numRuns: 300 },
    );
  });

  it('takes the sampled-threshold path and the selection path to the same result on large samples', () => {
    // Above 131 072 values the tails are found by a pass against sampled thresholds; heavy ties
    // defeat the thresholds and send it to Floyd–Rivest selection. Both must equal the full sort.
    const smooth = Float64Array.from(
      { length: 200_000 },
      (_, i) => Math.sin(i * 12.9898) * 43758.5453 - Math.floor(Math.sin(i * 12.9898) * 43758.5453),
    );
    const tied = Float64Array.from({ length: 200_000 }, (_, i) => (i * 7919) % 13);
    for (const v of [smooth, tied])
      expect(sampleCoverageIntervals(v, 0.95)).toEqual(byFullSort(Array.from(v), 0.95));
  });

  it('follows the index rules on a hand-checked sample: M = 21, p = 0.9', () => {
    // q = ⌊18.9 + ½⌋ = 19, M − q = 2 so r = 1: [y₍₁₎, y₍₂₀₎] = [1, 20]; shortest over r = 1, 2:
    // widths 20 − 1 = 19 and 21 − 2 = 19 tie, so the first: [1, 20]. Shuffled input.
    const y = [13, 2, 21, 8, 1, 17, 5, 11, 20, 3, 14, 9, 19, 4, 16, 7, 12, 18, 6, 15, 10];
    expect(sampleCoverageIntervals(y, 0.9)).toEqual({
      interval: { min: 1, max: 20 },
      shortestInterval: { min: 1, max: 20 },
    });
    // M = 20, p = 0.9: q = 18, M − q = 2 → r = 1: [1, 19] of 1…20; widths 18, 18: first.
    expect(
      sampleCoverageIntervals(
        [...Array(20).keys()].map((k) => k + 1),
        0.9,
      ).interval,
    ).toEqual({ min: 1, max: 19 });
    // A skewed sample, M = 21, p = 0.5: q = ⌊10.5 + ½⌋ = 11, r = 5: symmetric [y₍₅₎, y₍₁₆₎] = [0.4, 21];
    // the shortest interval moves to the dense side: r = 1 gives [0, y₍₁₂₎] = [0, 5], width 5.
    const skewed = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1, 5, 9, 13, 17, 21, 25, 29, 33, 37, 41];
    expect(sampleCoverageIntervals(skewed, 0.5)).toEqual({
      interval: { min: 0.4, max: 21 },
      shortestInterval: { min: 0, max: 5 },
    });
  });

  it('does not reorder its input', () => {
    const y = [3, 1, 2, 5, 4, 9, 8, 7, 6, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20, 21];
    const copy = [...y];
    sampleCoverageIntervals(y, 0.9);
    expect(y).toEqual(copy);
  });

  it('rejects a bad sample or coverage', () => {
    const y = Array.from({ length: 30 }, (_, i) => i);
    expect(() => sampleCoverageIntervals(y, 1)).toThrowBridgeworkError('out-of-range', { param: 'coverage' });
    expect(() => sampleCoverageIntervals(y, NaN)).toThrowBridgeworkError('not-finite', { param: 'coverage' });
    expect(() => sampleCoverageIntervals([...y, NaN], 0.9)).toThrowBridgeworkError('not-finite', {
      param: 'values[30]',
    });
    expect(() => sampleCoverageIntervals([...y, '1' as unknown as number], 0.9)).toThrowBridgeworkError(
      'wrong-type',
      { param: 'values[30]' },
    );
    // A bigint among the values is named, not a TypeError from the copy (issue 15 fuzz).
    expect(() => sampleCoverageIntervals([...y, 10n as unknown as number], 0.9)).toThrowBridgeworkError(
      'wrong-type',
      { param: 'values[30]' },
    );
    // eslint-disable-next-line no-sparse-arrays -- the hole is the case under test
    expect(() => sampleCoverageIntervals([...y, , 1] as number[], 0.9)).toThrowBridgeworkError('wrong-type', {
      param: 'values[30]',
    });
    expect(() => sampleCoverageIntervals('abc' as unknown as number[], 0.9)).toThrowBridgeworkError(
      'wrong-type',
      { param: 'values' },
    );
    expect(() => sampleCoverageIntervals([1, 2, 3], 0.95)).toThrowBridgeworkError('too-few-points', {
      param: 'values',
    });
  });

  it('gives the same intervals from tails split into any parts (how the workers collect them), ±0 ties included', () => {
    // The worker pool sorts the tails of each worker's blocks (an arbitrary set of trials) and
    // merges the parts by value. The intervals are order statistics, so any split must give the
    // values of one pass over the whole sample, bit for bit: Object.is, so a zero end must be +0.
    const value = fc.oneof(
      fc.double({ min: -50, max: 50, noNaN: true }),
      fc.constantFrom(0, -0, 0, -0, 1, -1),
    );
    fc.assert(
      fc.property(
        fc.array(value, { minLength: 60, maxLength: 3000 }),
        fc.integer({ min: 1, max: 5 }),
        fc.constantFrom(0.9, 0.95, 0.99),
        fc.nat(),
        (v, parts, p, salt) => {
          const m = v.length;
          if (coveredCount(p, m) >= m) return;
          const whole = sampleIntervalsInPlace(Float64Array.from(v), p);
          // Everything goes to some part's tails here (thresholds at ±Infinity): the merge alone is tested.
          const lows: number[][] = Array.from({ length: parts }, () => []);
          v.forEach((x, i) => lows[(i * 7919 + salt) % parts]!.push(x));
          const sorted = lows.map((part) => {
            const a = Float64Array.from(part);
            sortTailPart(a);
            return a;
          });
          const split = intervalsFromSortedParts(sorted, sorted, p, m);
          for (const [a, b] of [
            [split!.interval.min, whole.interval.min],
            [split!.interval.max, whole.interval.max],
            [split!.shortestInterval.min, whole.shortestInterval.min],
            [split!.shortestInterval.max, whole.shortestInterval.max],
          ] as const) {
            expect(Object.is(a, b)).toBe(true);
            expect(Object.is(a, -0)).toBe(false);
          }
          const ref = byFullSort(v, p);
          expect(split!.interval.min).toBeNear(ref.interval.min, { abs: 0 });
          expect(split!.shortestInterval.max).toBeNear(ref.shortestInterval.max, { abs: 0 });
        },
      ),
      { numRuns: 300 },
    );
  });
});
