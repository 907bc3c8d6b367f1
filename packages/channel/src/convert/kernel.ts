/**
 * Per-sample conversion kernels. Plain typed-array loops, no allocation per sample.
 *
 * A channel's map from code to quantity is, for every linear-fractional bridge, a Möbius function
 * of the code, q = (a·x + b)/(c·x + d), valid on an open interval of codes (lo, hi): the codes
 * strictly inside the converter's rails whose ratio the bridge can produce. Everything else
 * (RTDs, the quadratic full-bending-poisson bridge) goes through an exact scalar map per sample.
 */

/** q = (a·x + b)/(c·x + d) for lo < x < hi; NaN elsewhere. */
export interface LinearFractionalKernel {
  readonly a: number;
  readonly b: number;
  readonly c: number;
  readonly d: number;
  /** Open lower end of the valid codes. */
  readonly lo: number;
  /** Open upper end of the valid codes. */
  readonly hi: number;
}

/** Why a sample was not converted. */
export const enum Reject {
  None = 0,
  RailLow = 1,
  RailHigh = 2,
  OutOfRange = 3,
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

type Codes = Int32Array | Float64Array;

/**
 * Converts `codes[start + k·stride]` for k = 0…count−1 into `out[outStart + k·outStride]`.
 * The hot loop computes every sample and checks the range in blocks: a block whose codes are all
 * valid (the common case) needs no per-sample branch; a block with a rejected code is revisited.
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
  // Integer codes inside ±2^30 take the integer range test: x is valid iff lowI <= x <= highI,
  // i.e. (x − lowI) | (highI − x) has no sign bit. Other inputs take the floating-point test.
  if (codes instanceof Int32Array && k.lo >= -(2 ** 30) && k.hi <= 2 ** 30) {
    convertIntegerCodes(codes, out, k, tally, start, stride, count, outStart, outStride);
    return;
  }
  const { a, b, c, d, lo, hi } = k;
  for (let s = 0; s < count; s += BLOCK) {
    const e = s + BLOCK < count ? s + BLOCK : count;
    let allValid = true;
    let i = start + s * stride;
    let o = outStart + s * outStride;
    for (let n = s; n < e; n++, i += stride, o += outStride) {
      const x = codes[i] as number;
      out[o] = (a * x + b) / (c * x + d);
      allValid = allValid && x > lo && x < hi;
    }
    if (!allValid) revisit(codes, out, k, tally, start, stride, outStart, outStride, s, e);
  }
}

const BLOCK = 256;

function convertIntegerCodes(
  codes: Int32Array,
  out: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  count: number,
  outStart: number,
  outStride: number,
): void {
  const { a, b, c, d } = k;
  const lowI = Math.floor(k.lo) + 1;
  const highI = Math.ceil(k.hi) - 1;
  for (let s = 0; s < count; s += BLOCK) {
    const e = s + BLOCK < count ? s + BLOCK : count;
    let flags = 0;
    if (stride === 1 && outStride === 1 && start === outStart) {
      // The common case: a whole buffer, the same index in and out.
      for (let i = start + s, end = start + e; i < end; i++) {
        const x = codes[i] as number;
        out[i] = (a * x + b) / (c * x + d);
        flags |= (x - lowI) | (highI - x);
      }
    } else if (stride === 1 && outStride === 1) {
      for (let i = start + s, o = outStart + s, end = start + e; i < end; i++, o++) {
        const x = codes[i] as number;
        out[o] = (a * x + b) / (c * x + d);
        flags |= (x - lowI) | (highI - x);
      }
    } else if (start === outStart && stride === outStride) {
      // Interleaved lanes: the same index in and out.
      for (let i = start + s * stride, end = start + e * stride; i < end; i += stride) {
        const x = codes[i] as number;
        out[i] = (a * x + b) / (c * x + d);
        flags |= (x - lowI) | (highI - x);
      }
    } else {
      for (
        let n = s, i = start + s * stride, o = outStart + s * outStride;
        n < e;
        n++, i += stride, o += outStride
      ) {
        const x = codes[i] as number;
        out[o] = (a * x + b) / (c * x + d);
        flags |= (x - lowI) | (highI - x);
      }
    }
    if (flags < 0) revisit(codes, out, k, tally, start, stride, outStart, outStride, s, e);
  }
}

/** Marks the rejected samples of one block as NaN and records them. */
function revisit(
  codes: Codes,
  out: Float64Array,
  k: LinearFractionalKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  outStart: number,
  outStride: number,
  s: number,
  e: number,
): void {
  for (let n = s; n < e; n++) {
    const x = codes[start + n * stride] as number;
    if (!(x > k.lo && x < k.hi)) {
      out[outStart + n * outStride] = Number.NaN;
      tally.reject(x, outStart + n * outStride);
    }
  }
}

/** The same contract with an exact scalar map per sample (throw-free; NaN for an invalid code). */
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
 * One cache-friendly pass over an interleaved buffer of N channels (frame-major): the buffer is
 * taken in tiles of frames small enough to stay in the first-level cache, and each channel's
 * lane of a tile is converted with that channel's kernel (stride N) before moving on, so memory
 * is streamed once whatever N.
 */
export function convertInterleavedLinearFractional(
  codes: Codes,
  out: Float64Array,
  kernels: readonly LinearFractionalKernel[],
  tallies: readonly RejectTally[],
  frames: number,
): void {
  const n = kernels.length;
  const tileFrames = Math.max(64, Math.floor(2048 / n));
  for (let f0 = 0; f0 < frames; f0 += tileFrames) {
    const count = f0 + tileFrames < frames ? tileFrames : frames - f0;
    for (let j = 0; j < n; j++) {
      const start = f0 * n + j;
      convertLinearFractional(
        codes,
        out,
        kernels[j] as LinearFractionalKernel,
        tallies[j] as RejectTally,
        start,
        n,
        count,
        start,
        n,
      );
    }
  }
}
