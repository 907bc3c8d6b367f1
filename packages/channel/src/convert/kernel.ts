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

/** Counters filled by the kernels; `locations` keeps the first `locations.length` rejected indices. */
export class RejectTally {
  railLow = 0;
  railHigh = 0;
  outOfRange = 0;
  located = 0;
  constructor(
    readonly locations: Int32Array,
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
    if (this.located < this.locations.length) this.locations[this.located++] = index;
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
  const { a, b, c, d, lo, hi } = k;
  const BLOCK = 256;
  for (let s = 0; s < count; s += BLOCK) {
    const e = s + BLOCK < count ? s + BLOCK : count;
    let allValid = true;
    if (stride === 1 && outStride === 1) {
      let i = start + s;
      let o = outStart + s;
      for (let n = s; n < e; n++, i++, o++) {
        const x = codes[i] as number;
        out[o] = (a * x + b) / (c * x + d);
        allValid = allValid && x > lo && x < hi;
      }
    } else {
      let i = start + s * stride;
      let o = outStart + s * outStride;
      for (let n = s; n < e; n++, i += stride, o += outStride) {
        const x = codes[i] as number;
        out[o] = (a * x + b) / (c * x + d);
        allValid = allValid && x > lo && x < hi;
      }
    }
    if (!allValid) {
      for (let n = s; n < e; n++) {
        const x = codes[start + n * stride] as number;
        if (!(x > lo && x < hi)) {
          out[outStart + n * outStride] = Number.NaN;
          tally.reject(x, outStart + n * outStride);
        }
      }
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
