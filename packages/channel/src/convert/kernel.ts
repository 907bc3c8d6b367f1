/**
 * Per-sample conversion kernels: plain typed-array loops, no allocation per sample or block.
 *
 * A channel's map from code to value is, for every linear-fractional bridge, a Möbius function of
 * the code, q = (a·x + b)/(c·x + d), valid on an open interval of codes (lo, hi): the codes
 * strictly inside the converter's rails whose reading the sensor can produce. The loops here
 * evaluate exactly that expression, in that order of operations (multiply, add, multiply, add,
 * divide), for every sample; emitters (SQL, firmware) that use the same coefficients and the same
 * order reproduce them bit for bit. A map with a pole just beyond the valid codes takes a partial
 * kernel (the Möbius function on the codes where it holds, the exact map per sample at the end near
 * the pole); RTD channels take the loop of ./curveKernels.ts; other maps, the exact scalar map per
 * sample.
 *
 * Range test. Codes are tested in blocks: the hot loop computes every sample and folds the range
 * test of the block into one flag; a block with a rejected code is revisited, and its rejected
 * samples are written as NaN and recorded. Integer codes inside ±2^30 take the integer test
 * `(x − lowI) | (highI − x)`, whose sign bit is set exactly when x < lowI or x > highI (an int32
 * x and |lowI|, |highI| ≤ 2^30: a difference that wraps past ±2^31 in ToInt32 forces the other
 * one negative). The loops are unrolled eight ways: V8 checks bounds and maps once per access in a
 * plain loop, and the unrolled body lets the divisions of eight samples overlap.
 *
 * Aliasing. When `out` and `codes` are the same memory (a Float64Array converted in place), a
 * block is range-tested before any of it is written, so a rejected code is still read as itself.
 * Any other overlap of `codes` and `out` is refused before a kernel runs (see
 * `readConversionArguments`).
 */

import { BridgeworkError } from '@bridgework/core';

/** q = (a·x + b)/(c·x + d) for lo < x < hi; NaN elsewhere. */
export interface LinearFractionalKernel {
  /** a. */
  readonly a: number;
  /** b. */
  readonly b: number;
  /** c. */
  readonly c: number;
  /** d. */
  readonly d: number;
  /** Open lower end of the valid codes. */
  readonly lo: number;
  /** Open upper end of the valid codes. */
  readonly hi: number;
}

/**
 * A Möbius kernel valid on part of a channel's valid codes (the map has a pole just beyond one end,
 * where no rounded Möbius function stays within the kernel tolerance): codes outside (lo, hi) are
 * handed to `scalar`, the channel's exact map per sample, which returns NaN for a code that cannot
 * be converted.
 */
export interface PartialLinearFractionalKernel extends LinearFractionalKernel {
  /** The exact scalar path for one code: its value, or NaN when it cannot be converted. */
  readonly scalar: (code: number) => number;
}

/** Counters filled by the kernels; `locations` keeps the first `maxLocations` rejected indices. */
export class RejectTally {
  railLow = 0;
  railHigh = 0;
  outOfRange = 0;
  located = 0;
  /** Allocated at the first rejection only, so a clean conversion allocates nothing per sample or block. */
  locations: Int32Array | undefined;
  constructor(
    readonly maxLocations: number,
    /** Codes at or below this are the low rail. */
    readonly railLowCode: number,
    /** Codes at or above this are the high rail. */
    readonly railHighCode: number,
  ) {}

  /** Classifies and records the rejected sample `x` at output index `index`. */
  reject(x: number, index: number): void {
    if (x <= this.railLowCode) this.railLow++;
    else if (x >= this.railHighCode) this.railHigh++;
    else this.outOfRange++;
    if (this.located < this.maxLocations) {
      this.locations ??= new Int32Array(this.maxLocations);
      this.locations[this.located++] = index;
    }
  }

  get rejected(): number {
    return this.railLow + this.railHigh + this.outOfRange;
  }
}

/** Codes a kernel reads. */
export type Codes = Int32Array | Float64Array;

/** Samples per range-test block. */
const BLOCK = 256;

/**
 * Whether integer codes can take the integer range test (see the module comment): the blocked
 * loops here and in ./curveKernels.ts fold `(x − lo) | (hi − x)` per block, exact only inside ±2^30.
 */
export function integerTestApplies(codes: Codes, lo: number, hi: number): codes is Int32Array {
  return codes instanceof Int32Array && lo >= -(2 ** 30) && hi <= 2 ** 30;
}

/** Whether `codes` and `out` share any memory. */
export function buffersOverlap(codes: Codes, out: Float64Array): boolean {
  if (codes.buffer !== out.buffer) return false;
  const a0 = codes.byteOffset;
  const a1 = a0 + codes.byteLength;
  const b0 = out.byteOffset;
  const b1 = b0 + out.byteLength;
  return a0 < b1 && b0 < a1;
}

/** Whether sample n is read from and written to the same memory (a Float64Array converted in place). */
function sameElements(
  codes: Codes,
  out: Float64Array,
  start: number,
  stride: number,
  outStart: number,
  outStride: number,
): boolean {
  return (
    codes instanceof Float64Array &&
    codes.buffer === out.buffer &&
    codes.byteOffset + 8 * start === out.byteOffset + 8 * outStart &&
    stride === outStride
  );
}

/**
 * Converts `codes[start + k·stride]` for k = 0…count−1 into `out[outStart + k·outStride]` with
 * the Möbius kernel `k`; rejected samples become NaN and are recorded in `tally`.
 */
export function convertLinearFractional(
  codes: Codes,
  out: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  count: number,
  outStart: number,
  outStride: number,
): void {
  if (!(count > 0)) return;
  if (integerTestApplies(codes, k.lo, k.hi)) {
    if (stride === 1 && outStride === 1) mobiusInt32(codes, out, k, tally, start, outStart, count);
    else mobiusInt32Lane(codes, out, k, tally, start, stride, outStart, outStride, count);
    return;
  }
  if (buffersOverlap(codes, out)) {
    if (!sameElements(codes, out, start, stride, outStart, outStride)) {
      throw new BridgeworkError('invalid-shape', '`out` overlaps `codes` without being the same elements', {
        param: 'out',
      });
    }
    mobiusInPlace(codes as Float64Array, k, tally, start, stride, count);
    return;
  }
  mobiusFloat(codes, out, k, tally, start, stride, outStart, outStride, count);
}

/**
 * `count` contiguous integer codes from `start` into `out` from `outStart`. The coefficients are
 * read from `k` inside (one call per conversion: doubles passed per block would be boxed).
 */
function mobiusInt32(
  codes: Int32Array,
  out: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  start: number,
  outStart: number,
  count: number,
): void {
  const { a, b, c, d } = k;
  const lowI = Math.floor(k.lo) + 1;
  const highI = Math.ceil(k.hi) - 1;
  const end = start + count;
  let i = start;
  let o = outStart;
  while (i < end) {
    const blockStart = i;
    const blockEnd = end - i > BLOCK ? i + BLOCK : end;
    const end8 = blockEnd - 7;
    let flags = 0;
    for (; i < end8; i += 8, o += 8) {
      const x0 = codes[i] as number;
      const x1 = codes[i + 1] as number;
      const x2 = codes[i + 2] as number;
      const x3 = codes[i + 3] as number;
      const x4 = codes[i + 4] as number;
      const x5 = codes[i + 5] as number;
      const x6 = codes[i + 6] as number;
      const x7 = codes[i + 7] as number;
      out[o] = (a * x0 + b) / (c * x0 + d);
      out[o + 1] = (a * x1 + b) / (c * x1 + d);
      out[o + 2] = (a * x2 + b) / (c * x2 + d);
      out[o + 3] = (a * x3 + b) / (c * x3 + d);
      out[o + 4] = (a * x4 + b) / (c * x4 + d);
      out[o + 5] = (a * x5 + b) / (c * x5 + d);
      out[o + 6] = (a * x6 + b) / (c * x6 + d);
      out[o + 7] = (a * x7 + b) / (c * x7 + d);
      flags |=
        (x0 - lowI) |
        (highI - x0) |
        (x1 - lowI) |
        (highI - x1) |
        (x2 - lowI) |
        (highI - x2) |
        (x3 - lowI) |
        (highI - x3) |
        (x4 - lowI) |
        (highI - x4) |
        (x5 - lowI) |
        (highI - x5) |
        (x6 - lowI) |
        (highI - x6) |
        (x7 - lowI) |
        (highI - x7);
    }
    for (; i < blockEnd; i++, o++) {
      const x = codes[i] as number;
      out[o] = (a * x + b) / (c * x + d);
      flags |= (x - lowI) | (highI - x);
    }
    if (flags < 0) revisit(codes, out, k, tally, blockStart, 1, o - (i - blockStart), 1, i - blockStart);
  }
}

/** As {@link mobiusInt32} with strides (one lane of an interleaved buffer), four ways unrolled. */
function mobiusInt32Lane(
  codes: Int32Array,
  out: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  outStart: number,
  outStride: number,
  count: number,
): void {
  const { a, b, c, d } = k;
  const lowI = Math.floor(k.lo) + 1;
  const highI = Math.ceil(k.hi) - 1;
  const i2 = 2 * stride;
  const i3 = 3 * stride;
  const i4 = 4 * stride;
  const o2 = 2 * outStride;
  const o3 = 3 * outStride;
  const o4 = 4 * outStride;
  for (let s = 0; s < count; s += BLOCK) {
    const n = count - s > BLOCK ? BLOCK : count - s;
    const blockI = start + s * stride;
    const blockO = outStart + s * outStride;
    let i = blockI;
    let o = blockO;
    let flags = 0;
    let m = 0;
    for (; m + 4 <= n; m += 4, i += i4, o += o4) {
      const x0 = codes[i] as number;
      const x1 = codes[i + stride] as number;
      const x2 = codes[i + i2] as number;
      const x3 = codes[i + i3] as number;
      out[o] = (a * x0 + b) / (c * x0 + d);
      out[o + outStride] = (a * x1 + b) / (c * x1 + d);
      out[o + o2] = (a * x2 + b) / (c * x2 + d);
      out[o + o3] = (a * x3 + b) / (c * x3 + d);
      flags |=
        (x0 - lowI) |
        (highI - x0) |
        (x1 - lowI) |
        (highI - x1) |
        (x2 - lowI) |
        (highI - x2) |
        (x3 - lowI) |
        (highI - x3);
    }
    for (; m < n; m++, i += stride, o += outStride) {
      const x = codes[i] as number;
      out[o] = (a * x + b) / (c * x + d);
      flags |= (x - lowI) | (highI - x);
    }
    if (flags < 0) revisit(codes, out, k, tally, blockI, stride, blockO, outStride, n);
  }
}

/** Codes of any value (fractional, beyond ±2^30), into separate memory: map, then the range test per block. */
function mobiusFloat(
  codes: Codes,
  out: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  outStart: number,
  outStride: number,
  count: number,
): void {
  const { a, b, c, d, lo, hi } = k;
  for (let s = 0; s < count; s += BLOCK) {
    const n = count - s > BLOCK ? BLOCK : count - s;
    const blockI = start + s * stride;
    const blockO = outStart + s * outStride;
    let inside = true;
    for (let m = 0, i = blockI, o = blockO; m < n; m++, i += stride, o += outStride) {
      const x = codes[i] as number;
      out[o] = (a * x + b) / (c * x + d);
      inside = inside && x > lo && x < hi;
    }
    if (!inside) revisit(codes, out, k, tally, blockI, stride, blockO, outStride, n);
  }
}

/**
 * A Float64Array converted in place: each block is range-tested before any of it is written (a
 * rejected code must still be read as itself), then mapped, or taken sample by sample.
 */
function mobiusInPlace(
  codes: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  count: number,
): void {
  const { a, b, c, d, lo, hi } = k;
  const scalar = (k as Partial<PartialLinearFractionalKernel>).scalar;
  for (let s = 0; s < count; s += BLOCK) {
    const n = count - s > BLOCK ? BLOCK : count - s;
    const blockI = start + s * stride;
    let inside = true;
    for (let m = 0, i = blockI; m < n; m++, i += stride) {
      const x = codes[i] as number;
      inside = inside && x > lo && x < hi;
    }
    for (let m = 0, i = blockI; m < n; m++, i += stride) {
      const x = codes[i] as number;
      if (inside || (x > lo && x < hi)) codes[i] = (a * x + b) / (c * x + d);
      else {
        const q = scalar === undefined ? Number.NaN : scalar(x);
        codes[i] = q;
        if (q !== q) tally.reject(x, i);
      }
    }
  }
}

/**
 * Revisits one block with a code outside the kernel's interval: such a sample goes to the
 * kernel's scalar path when it has one (a partial kernel), else it is rejected: written as NaN
 * and recorded.
 */
function revisit(
  codes: Codes,
  out: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  i: number,
  stride: number,
  o: number,
  outStride: number,
  n: number,
): void {
  const scalar = (k as Partial<PartialLinearFractionalKernel>).scalar;
  for (let m = 0; m < n; m++, i += stride, o += outStride) {
    const x = codes[i] as number;
    if (!(x > k.lo && x < k.hi)) {
      const q = scalar === undefined ? Number.NaN : scalar(x);
      out[o] = q;
      if (q !== q) tally.reject(x, o);
    }
  }
}

/**
 * The same contract with an exact scalar map per sample (throw-free; NaN for an invalid code).
 * Each code is read before its output slot is written, so in-place conversion is safe.
 */
export function convertScalar(
  codes: Codes,
  out: Float64Array,
  map: (code: number) => number,
  lo: number,
  hi: number,
  tally: RejectTally,
  start: number,
  stride: number,
  count: number,
  outStart: number,
  outStride: number,
): void {
  for (let n = 0; n < count; n++) {
    const x = codes[start + n * stride] as number;
    const o = outStart + n * outStride;
    const q = x > lo && x < hi ? map(x) : Number.NaN;
    if (Number.isNaN(q)) {
      out[o] = Number.NaN;
      tally.reject(x, o);
    } else out[o] = q;
  }
}

/**
 * One pass over an interleaved buffer of N channels (frame-major: sample k of channel j at
 * k·N + j), each channel with its own Möbius kernel; the result equals converting each channel's
 * codes alone, bit for bit.
 *
 * @remarks
 * The buffer is taken in tiles of frames small enough to stay in the first-level cache. With
 * integer codes, lanes are converted in groups of eight (then four, two, one) adjacent channels:
 * the group's loop reads the group's codes of a frame contiguously, each with its own channel's
 * coefficients held in locals, and folds the range test of the whole tile into one flag; a tile
 * with a rejected code is revisited lane by lane. Other codes take each lane with a stride.
 */
export function convertInterleavedLinearFractional(
  codes: Codes,
  out: Float64Array,
  kernels: readonly LinearFractionalKernel[],
  tallies: readonly RejectTally[],
  frames: number,
): void {
  const n = kernels.length;
  const integer = kernels.every((k) => integerTestApplies(codes, k.lo, k.hi));
  if (!integer) {
    const tileFrames = Math.max(64, Math.floor(4096 / n));
    for (let f0 = 0; f0 < frames; f0 += tileFrames) {
      const count = f0 + tileFrames < frames ? tileFrames : frames - f0;
      for (let j = 0; j < n; j++) {
        const start = f0 * n + j;
        convertLinearFractional(codes, out, kernels[j]!, tallies[j]!, start, n, count, start, n);
      }
    }
    return;
  }
  const ints = codes as Int32Array;
  const bounds = new Int32Array(2 * n);
  for (let j = 0; j < n; j++) {
    bounds[2 * j] = Math.floor(kernels[j]!.lo) + 1;
    bounds[2 * j + 1] = Math.ceil(kernels[j]!.hi) - 1;
  }
  const tileFrames = Math.max(32, Math.floor(2048 / n));
  for (let f0 = 0; f0 < frames; f0 += tileFrames) {
    const count = f0 + tileFrames < frames ? tileFrames : frames - f0;
    let j = 0;
    while (j < n) {
      const g = n - j >= 8 ? 8 : n - j >= 4 ? 4 : n - j >= 2 ? 2 : 1;
      const start = f0 * n + j;
      let flags: number;
      if (g === 8) flags = mobiusGroup8(ints, out, kernels, bounds, j, start, n, count);
      else if (g === 4) flags = mobiusGroup4(ints, out, kernels, bounds, j, start, n, count);
      else if (g === 2) flags = mobiusGroup2(ints, out, kernels, bounds, j, start, n, count);
      else {
        mobiusInt32Lane(ints, out, kernels[j]!, tallies[j]!, start, n, start, n, count);
        flags = 0;
      }
      if (flags < 0) {
        for (let m = 0; m < g; m++)
          revisit(ints, out, kernels[j + m]!, tallies[j + m]!, start + m, n, start + m, n, count);
      }
      j += g;
    }
  }
}

/** Eight adjacent lanes from lane `j`, `count` frames from index `i` (frame stride `n`); returns the or-ed range flags. */
function mobiusGroup8(
  codes: Int32Array,
  out: Float64Array,
  ks: readonly LinearFractionalKernel[],
  bounds: Int32Array,
  j: number,
  i: number,
  n: number,
  count: number,
): number {
  const k0 = ks[j]!;
  const k1 = ks[j + 1]!;
  const k2 = ks[j + 2]!;
  const k3 = ks[j + 3]!;
  const k4 = ks[j + 4]!;
  const k5 = ks[j + 5]!;
  const k6 = ks[j + 6]!;
  const k7 = ks[j + 7]!;
  const a0 = k0.a;
  const b0 = k0.b;
  const c0 = k0.c;
  const d0 = k0.d;
  const a1 = k1.a;
  const b1 = k1.b;
  const c1 = k1.c;
  const d1 = k1.d;
  const a2 = k2.a;
  const b2 = k2.b;
  const c2 = k2.c;
  const d2 = k2.d;
  const a3 = k3.a;
  const b3 = k3.b;
  const c3 = k3.c;
  const d3 = k3.d;
  const a4 = k4.a;
  const b4 = k4.b;
  const c4 = k4.c;
  const d4 = k4.d;
  const a5 = k5.a;
  const b5 = k5.b;
  const c5 = k5.c;
  const d5 = k5.d;
  const a6 = k6.a;
  const b6 = k6.b;
  const c6 = k6.c;
  const d6 = k6.d;
  const a7 = k7.a;
  const b7 = k7.b;
  const c7 = k7.c;
  const d7 = k7.d;
  const b = 2 * j;
  const l0 = bounds[b]!;
  const h0 = bounds[b + 1]!;
  const l1 = bounds[b + 2]!;
  const h1 = bounds[b + 3]!;
  const l2 = bounds[b + 4]!;
  const h2 = bounds[b + 5]!;
  const l3 = bounds[b + 6]!;
  const h3 = bounds[b + 7]!;
  const l4 = bounds[b + 8]!;
  const h4 = bounds[b + 9]!;
  const l5 = bounds[b + 10]!;
  const h5 = bounds[b + 11]!;
  const l6 = bounds[b + 12]!;
  const h6 = bounds[b + 13]!;
  const l7 = bounds[b + 14]!;
  const h7 = bounds[b + 15]!;
  let flags = 0;
  for (let f = 0; f < count; f++, i += n) {
    const x0 = codes[i] as number;
    const x1 = codes[i + 1] as number;
    const x2 = codes[i + 2] as number;
    const x3 = codes[i + 3] as number;
    const x4 = codes[i + 4] as number;
    const x5 = codes[i + 5] as number;
    const x6 = codes[i + 6] as number;
    const x7 = codes[i + 7] as number;
    out[i] = (a0 * x0 + b0) / (c0 * x0 + d0);
    out[i + 1] = (a1 * x1 + b1) / (c1 * x1 + d1);
    out[i + 2] = (a2 * x2 + b2) / (c2 * x2 + d2);
    out[i + 3] = (a3 * x3 + b3) / (c3 * x3 + d3);
    out[i + 4] = (a4 * x4 + b4) / (c4 * x4 + d4);
    out[i + 5] = (a5 * x5 + b5) / (c5 * x5 + d5);
    out[i + 6] = (a6 * x6 + b6) / (c6 * x6 + d6);
    out[i + 7] = (a7 * x7 + b7) / (c7 * x7 + d7);
    flags |=
      (x0 - l0) |
      (h0 - x0) |
      (x1 - l1) |
      (h1 - x1) |
      (x2 - l2) |
      (h2 - x2) |
      (x3 - l3) |
      (h3 - x3) |
      (x4 - l4) |
      (h4 - x4) |
      (x5 - l5) |
      (h5 - x5) |
      (x6 - l6) |
      (h6 - x6) |
      (x7 - l7) |
      (h7 - x7);
  }
  return flags;
}

/** As {@link mobiusGroup8} for four adjacent lanes. */
function mobiusGroup4(
  codes: Int32Array,
  out: Float64Array,
  ks: readonly LinearFractionalKernel[],
  bounds: Int32Array,
  j: number,
  i: number,
  n: number,
  count: number,
): number {
  const k0 = ks[j]!;
  const k1 = ks[j + 1]!;
  const k2 = ks[j + 2]!;
  const k3 = ks[j + 3]!;
  const a0 = k0.a;
  const b0 = k0.b;
  const c0 = k0.c;
  const d0 = k0.d;
  const a1 = k1.a;
  const b1 = k1.b;
  const c1 = k1.c;
  const d1 = k1.d;
  const a2 = k2.a;
  const b2 = k2.b;
  const c2 = k2.c;
  const d2 = k2.d;
  const a3 = k3.a;
  const b3 = k3.b;
  const c3 = k3.c;
  const d3 = k3.d;
  const b = 2 * j;
  const l0 = bounds[b]!;
  const h0 = bounds[b + 1]!;
  const l1 = bounds[b + 2]!;
  const h1 = bounds[b + 3]!;
  const l2 = bounds[b + 4]!;
  const h2 = bounds[b + 5]!;
  const l3 = bounds[b + 6]!;
  const h3 = bounds[b + 7]!;
  let flags = 0;
  for (let f = 0; f < count; f++, i += n) {
    const x0 = codes[i] as number;
    const x1 = codes[i + 1] as number;
    const x2 = codes[i + 2] as number;
    const x3 = codes[i + 3] as number;
    out[i] = (a0 * x0 + b0) / (c0 * x0 + d0);
    out[i + 1] = (a1 * x1 + b1) / (c1 * x1 + d1);
    out[i + 2] = (a2 * x2 + b2) / (c2 * x2 + d2);
    out[i + 3] = (a3 * x3 + b3) / (c3 * x3 + d3);
    flags |= (x0 - l0) | (h0 - x0) | (x1 - l1) | (h1 - x1) | (x2 - l2) | (h2 - x2) | (x3 - l3) | (h3 - x3);
  }
  return flags;
}

/** As {@link mobiusGroup8} for two adjacent lanes. */
function mobiusGroup2(
  codes: Int32Array,
  out: Float64Array,
  ks: readonly LinearFractionalKernel[],
  bounds: Int32Array,
  j: number,
  i: number,
  n: number,
  count: number,
): number {
  const k0 = ks[j]!;
  const k1 = ks[j + 1]!;
  const a0 = k0.a;
  const b0 = k0.b;
  const c0 = k0.c;
  const d0 = k0.d;
  const a1 = k1.a;
  const b1 = k1.b;
  const c1 = k1.c;
  const d1 = k1.d;
  const l0 = bounds[2 * j]!;
  const h0 = bounds[2 * j + 1]!;
  const l1 = bounds[2 * j + 2]!;
  const h1 = bounds[2 * j + 3]!;
  let flags = 0;
  for (let f = 0; f < count; f++, i += n) {
    const x0 = codes[i] as number;
    const x1 = codes[i + 1] as number;
    out[i] = (a0 * x0 + b0) / (c0 * x0 + d0);
    out[i + 1] = (a1 * x1 + b1) / (c1 * x1 + d1);
    flags |= (x0 - l0) | (h0 - x0) | (x1 - l1) | (h1 - x1);
  }
  return flags;
}
