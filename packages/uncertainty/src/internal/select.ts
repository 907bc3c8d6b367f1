/**
 * Order statistics without a full sort: Floyd and Rivest's selection algorithm (R. W. Floyd and
 * R. L. Rivest, "Algorithm 489: The algorithm SELECT — for finding the ith smallest of n
 * elements", Comm. ACM 18(3), 1975), expected 1.5·n comparisons.
 */
import type { Interval } from '@bridgework/core';
import { bucketSortInPlace } from './bucketSort.js';

/** Ascending sort of finite values (bucket sort; the built-in sort if a value is not finite). */
function sortFinite(a: Float64Array): void {
  if (!bucketSortInPlace(a)) a.sort();
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i] as number;
  a[i] = a[j] as number;
  a[j] = t;
}

/**
 * Rearranges `a[left…right]` so that `a[k]` holds the value it would have if that range were
 * sorted, every element before it is ≤ `a[k]` and every element after it is ≥ `a[k]`.
 * The values must not be NaN.
 */
export function selectInPlace(a: Float64Array, k: number, left = 0, right = a.length - 1): void {
  while (right > left) {
    if (right - left > 600) {
      // Recurse on a sample to find two pivots that bracket the kth element closely.
      const n = right - left + 1;
      const i = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (i - n / 2 < 0 ? -1 : 1);
      const newLeft = Math.max(left, Math.floor(k - (i * s) / n + sd));
      const newRight = Math.min(right, Math.floor(k + ((n - i) * s) / n + sd));
      selectInPlace(a, k, newLeft, newRight);
    }
    const t = a[k] as number;
    let i = left;
    let j = right;
    swap(a, left, k);
    if ((a[right] as number) > t) swap(a, left, right);
    while (i < j) {
      swap(a, i, j);
      i++;
      j--;
      while ((a[i] as number) < t) i++;
      while ((a[j] as number) > t) j--;
    }
    if (a[left] === t) swap(a, left, j);
    else {
      j++;
      swap(a, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
}

/** The two coverage intervals of JCGM 101 7.7 computed from a sample. */
export interface SampleIntervals {
  /** Probabilistically symmetric coverage interval (JCGM 101 7.7.1). */
  readonly interval: Interval;
  /** Shortest coverage interval (JCGM 101 7.7.2). */
  readonly shortestInterval: Interval;
}

/**
 * The number of values a coverage interval spans, q = pM rounded as JCGM 101 7.7.1 prescribes
 * (pM if it is an integer, else the integer part of pM + ½).
 */
export function coveredCount(coverage: number, trials: number): number {
  return Math.floor(coverage * trials + 0.5);
}

/** An interval end as reported: a zero is +0, so the sign of a zero never depends on the order of ties. */
function end(v: number): number {
  return v === 0 ? 0 : v;
}

/** The two intervals from the sorted lowest and highest M − q values (1-based rules of JCGM 101 7.7). */
function intervalsFromTails(
  low: Float64Array,
  high: Float64Array,
  q: number,
  candidates: number,
): SampleIntervals {
  // low[i] = y₍ᵢ₊₁₎ for i < M − q; high[i] = y₍q+i+1₎ for i < M − q.
  const r = Math.ceil(candidates / 2); // (M − q)/2 if an integer, else (M − q + 1)/2
  const interval = { min: end(low[r - 1] as number), max: end(high[r - 1] as number) };
  let best = 0;
  let bestWidth = Infinity;
  for (let i = 0; i < candidates; i++) {
    const width = (high[i] as number) - (low[i] as number);
    if (width < bestWidth) {
      bestWidth = width;
      best = i;
    }
  }
  return { interval, shortestInterval: { min: end(low[best] as number), max: end(high[best] as number) } };
}

/** Two values that enclose the central part of a sample, and room for what lies beyond them. */
export interface TailThresholds {
  /** Values below this go to the lower tail. */
  readonly below: number;
  /** Values above this go to the upper tail. */
  readonly above: number;
  /** The most values either tail may hold before the thresholds are deemed to have failed. */
  readonly capacity: number;
}

/**
 * Thresholds for the lowest and highest `count` of `trials` values, from a sample of n of them
 * (reordered here: the two order statistics needed are selected, not the whole sample sorted):
 * each is set 1.2 % of the sample beyond the expected rank (five standard errors of the sample
 * quantile for n = 8192, ten for 16 384), so a tail holds about 6.2 % of the values when count is
 * 5 %. `undefined` when the sample cannot separate the tails. The same sample gives the same
 * thresholds.
 */
export function thresholdsFromSample(
  sample: Float64Array,
  trials: number,
  count: number,
): TailThresholds | undefined {
  const n = sample.length;
  const margin = Math.ceil(0.012 * n);
  const rank = Math.ceil((count / trials) * n);
  const lowRank = rank + margin;
  const highRank = n - 1 - rank - margin;
  if (lowRank >= highRank) return undefined;
  selectInPlace(sample, lowRank);
  selectInPlace(sample, highRank, lowRank + 1, n - 1);
  return {
    below: sample[lowRank] as number,
    above: sample[highRank] as number,
    capacity: Math.ceil(trials * ((rank + 2 * margin) / n)) + 1024,
  };
}

/**
 * Thresholds for the lowest and highest `count` values of `a`, from a strided sample of 8192
 * values (see {@link thresholdsFromSample}); `undefined` for samples too small to be worth it.
 * Deterministic: the same values give the same thresholds.
 */
export function tailThresholds(a: Float64Array, count: number): TailThresholds | undefined {
  const m = a.length;
  const n = 8192;
  if (m < 16 * n) return undefined;
  const sample = new Float64Array(n);
  const stride = Math.floor(m / n);
  for (let i = 0; i < n; i++) sample[i] = a[i * stride] as number;
  return thresholdsFromSample(sample, m, count);
}

/**
 * Copies the values of a[from…to) below and above the thresholds to low[lowCount…) and
 * high[highCount…), after what is there already. Returns the new counts, or −1 for both when a
 * side would exceed `capacity`.
 */
export function extractTails(
  a: Float64Array,
  from: number,
  to: number,
  t: TailThresholds,
  low: Float64Array,
  high: Float64Array,
  lowCount = 0,
  highCount = 0,
): { readonly low: number; readonly high: number } {
  const { below, above, capacity } = t;
  let nl = lowCount;
  let nh = highCount;
  for (let i = from; i < to; i++) {
    const v = a[i] as number;
    if (v < below) {
      if (nl === capacity) return { low: -1, high: -1 };
      low[nl++] = v;
    } else if (v > above) {
      if (nh === capacity) return { low: -1, high: -1 };
      high[nh++] = v;
    }
  }
  return { low: nl, high: nh };
}

/**
 * Both JCGM 101 coverage intervals by the slow, sure route: a full sort when p ≤ ½, else
 * Floyd–Rivest selection of the lowest and highest M − q values and a sort of those. Permutes `a`.
 */
export function intervalsBySelection(a: Float64Array, coverage: number): SampleIntervals {
  const m = a.length;
  const q = coveredCount(coverage, m);
  const candidates = m - q;
  if (q <= candidates) {
    sortFinite(a);
    return intervalsFromTails(a, a.subarray(q), q, candidates);
  }
  selectInPlace(a, candidates - 1);
  sortFinite(a.subarray(0, candidates));
  selectInPlace(a, q, candidates, m - 1);
  sortFinite(a.subarray(q));
  return intervalsFromTails(a, a.subarray(q), q, candidates);
}

/**
 * Both JCGM 101 coverage intervals of the values. Only the lowest and the highest M − q values are
 * sorted (q = the covered count): every candidate end of the shortest interval lies there; with
 * p ≥ ½ that is 2(1 − p) of the sample, a tenth for p = 0.95. They are found by one pass against
 * sampled thresholds, or else (ties, small samples) by Floyd–Rivest selection, which permutes `a`.
 * The intervals are order statistics, so every route — and any split of the values into parts —
 * gives the same values (a zero end is reported as +0, whatever the order of ±0 ties).
 *
 * Requires q < M (at least one candidate interval) and no NaN in `a`.
 */
export function sampleIntervalsInPlace(a: Float64Array, coverage: number): SampleIntervals {
  const m = a.length;
  const candidates = m - coveredCount(coverage, m);
  const t = candidates < m / 2 ? tailThresholds(a, candidates) : undefined;
  if (t !== undefined) {
    const low = new Float64Array(t.capacity);
    const high = new Float64Array(t.capacity);
    const n = extractTails(a, 0, m, t, low, high);
    if (n.low >= 0) {
      const lows = low.subarray(0, n.low);
      const highs = high.subarray(0, n.high);
      sortTailPart(lows);
      sortTailPart(highs);
      const r = intervalsFromSortedParts([lows], [highs], coverage, m);
      if (r !== undefined) return r;
    }
  }
  return intervalsBySelection(a, coverage);
}

/** Sorts one part of an extracted tail in place, as a worker does before the merge. */
export function sortTailPart(part: Float64Array): void {
  sortFinite(part);
}

/**
 * The intervals from tails extracted in parts (any split of the values) and each sorted, or
 * `undefined` when a side holds fewer than M − q values (then the thresholds did not enclose the
 * tails and another route must be taken). The order statistics are read by walking both unions
 * of parts from the top at once — the highest M − q values of the upper tails and, after skipping
 * what lies above the M − q lowest, the lower tails — so nothing is merged into a new array, and
 * candidate i pairs y₍ᵢ₊₁₎ with y₍q+i+1₎ as JCGM 101 7.7 prescribes. The order of equal values
 * does not matter, as the intervals are values and a zero end is reported as +0.
 */
export function intervalsFromSortedParts(
  lows: readonly Float64Array[],
  highs: readonly Float64Array[],
  coverage: number,
  trials: number,
): SampleIntervals | undefined {
  const q = coveredCount(coverage, trials);
  const candidates = trials - q;
  const total = (parts: readonly Float64Array[]): number => parts.reduce((a, p) => a + p.length, 0);
  const totalLow = total(lows);
  const totalHigh = total(highs);
  if (totalLow < candidates || totalHigh < candidates) return undefined;
  if (lows.length === 1 && highs.length === 1) {
    const high = highs[0] as Float64Array;
    return intervalsFromTails(
      lows[0] as Float64Array,
      high.subarray(high.length - candidates),
      q,
      candidates,
    );
  }
  const low = new TopCursor(lows);
  low.skip(totalLow - candidates);
  const high = new TopCursor(highs);
  // Candidates i = M − q − 1 … 0 (1-based r = i + 1): the shortest is the first on ties, so a
  // width equal to the best so far replaces it (a lower i).
  const r = Math.ceil(candidates / 2);
  let min = 0;
  let max = 0;
  let bestWidth = Infinity;
  let bestLow = 0;
  let bestHigh = 0;
  for (let i = candidates - 1; i >= 0; i--) {
    const l = low.next();
    const h = high.next();
    if (i === r - 1) {
      min = l;
      max = h;
    }
    const width = h - l;
    if (width <= bestWidth) {
      bestWidth = width;
      bestLow = l;
      bestHigh = h;
    }
  }
  return {
    interval: { min: end(min), max: end(max) },
    shortestInterval: { min: end(bestLow), max: end(bestHigh) },
  };
}

/** Yields the values of ascending sorted parts from the largest down, as one merged sequence would. */
class TopCursor {
  private readonly parts: readonly Float64Array[];
  private readonly back: Int32Array;
  private readonly a: Float64Array;
  private readonly b: Float64Array;
  private i: number;
  private j: number;

  constructor(parts: readonly Float64Array[]) {
    this.parts = parts;
    this.back = Int32Array.from(parts, (p) => p.length - 1);
    const empty = new Float64Array(0);
    this.a = parts[0] ?? empty;
    this.b = parts[1] ?? empty;
    this.i = this.a.length - 1;
    this.j = this.b.length - 1;
  }

  /** Drops the `count` largest values. */
  skip(count: number): void {
    for (let k = 0; k < count; k++) this.next();
  }

  /** The largest value not yet taken (there must be one). */
  next(): number {
    if (this.parts.length <= 2) {
      const a = this.a;
      const b = this.b;
      if (this.j < 0 || (this.i >= 0 && (a[this.i] as number) >= (b[this.j] as number)))
        return a[this.i--] as number;
      return b[this.j--] as number;
    }
    const back = this.back;
    let best = -1;
    let value = -Infinity;
    for (let p = 0; p < this.parts.length; p++) {
      const k = back[p] as number;
      if (k >= 0) {
        const v = (this.parts[p] as Float64Array)[k] as number;
        if (best < 0 || v > value) {
          best = p;
          value = v;
        }
      }
    }
    back[best] = (back[best] as number) - 1;
    return value;
  }
}
