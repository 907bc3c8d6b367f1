/**
 * Conversion loops for channels whose value is not one Möbius function of the code: a platinum
 * RTD read through a bridge (a Möbius map from the code to the element's resistance, then the
 * IEC 60751 Callendar–Van Dusen inverse), and maps whose value is the root of a quadratic with
 * coefficients affine in the code (full-bending-poisson bridges; see {@link QuadraticKernel}).
 *
 * RTD loop.
 * The loop evaluates, per sample, exactly the operations of the channel's exact scalar path for
 * these channels (the resistance's Möbius function, then `createRtd(...).temperatureAt` of the
 * compensation package, then the output unit), in the same order, so its results are bit-identical
 * to that path (checked over every code of a 24-bit range in the tests): above 0 °C the quadratic's
 * root in the cancellation-free form t = 2x/(A + √(A² + 4Bx)), x = R/R0 − 1; below 0 °C the same
 * safeguarded Newton iteration on the quartic, started from the quadratic's root. A code outside
 * the valid codes or a resistance outside the curve's range is rejected, as the scalar path
 * rejects it; an iteration that would not converge goes to the scalar path.
 */
import { createRtd } from '@bridgework/compensation';
import type { Codes, RejectTally } from './kernel.js';

/** Output unit of a temperature kernel: °C, K (t + 273.15) or °F (t·9/5 + 32), as the unit module computes them. */
export type TemperatureUnit = 'celsius' | 'kelvin' | 'fahrenheit';

/** A Callendar–Van Dusen channel's kernel: code → R by a Möbius function, then R → t, then the unit. */
export interface CallendarVanDusenKernel {
  /** Coefficients of R = (ra·x + rb)/(rc·x + rd), Ω. */
  readonly ra: number;
  /** rb. */
  readonly rb: number;
  /** rc. */
  readonly rc: number;
  /** rd. */
  readonly rd: number;
  /** Open lower end of the valid codes. */
  readonly lo: number;
  /** Open upper end. */
  readonly hi: number;
  /** R0, Ω. */
  readonly r0Ohms: number;
  /** A, 1/°C. */
  readonly a: number;
  /** B, 1/°C². */
  readonly b: number;
  /** C, 1/°C⁴ (below 0 °C). */
  readonly c: number;
  /** Resistances the curve covers (closed), Ω: R(−200 °C) and R(850 °C). */
  readonly minOhms: number;
  /** Upper end, Ω. */
  readonly maxOhms: number;
  /** 0 for °C, 1 for K, 2 for °F. */
  readonly unit: 0 | 1 | 2;
  /** The exact scalar path for one code: its value, or NaN when it cannot be converted. */
  readonly scalar: (code: number) => number;
}

/** The kernel of a channel whose resistance is (ra·x + rb)/(rc·x + rd) and whose curve is IEC 60751's. */
export function createCallendarVanDusenKernel(options: {
  readonly resistance: { readonly a: number; readonly b: number; readonly c: number; readonly d: number };
  readonly curve: { readonly r0Ohms: number; readonly a: number; readonly b: number; readonly c: number };
  readonly lo: number;
  readonly hi: number;
  readonly unit: TemperatureUnit;
  readonly scalar: (code: number) => number;
}): CallendarVanDusenKernel {
  const { resistance, curve } = options;
  // The compensation package's own model: its checked coefficients and its resistance range.
  const rtd = createRtd({ r0Ohms: curve.r0Ohms, a: curve.a, b: curve.b, c: curve.c });
  return {
    ra: resistance.a,
    rb: resistance.b,
    rc: resistance.c,
    rd: resistance.d,
    lo: options.lo,
    hi: options.hi,
    r0Ohms: rtd.r0Ohms,
    a: rtd.a,
    b: rtd.b,
    c: rtd.c,
    minOhms: rtd.rangeOhms[0],
    maxOhms: rtd.rangeOhms[1],
    unit: options.unit === 'celsius' ? 0 : options.unit === 'kelvin' ? 1 : 2,
    scalar: options.scalar,
  };
}

const T_MIN = -200;
/** The compensation package's Newton stop (createRtd): a step below this, °C. */
const STEP_TOLERANCE_CELSIUS = 1e-12;
const MAX_ITERATIONS = 100;
const ZERO_CELSIUS_KELVIN = 273.15;

/**
 * t below 0 °C for x = R/R0 − 1 < 0: createRtd's safeguarded Newton on the quartic over
 * [−200, 0] °C, operation for operation; NaN where it would not converge.
 */
function belowZero(k: CallendarVanDusenKernel, target: number, quadratic: number): number {
  const { a, b, c } = k;
  let lo = T_MIN;
  let hi = 0;
  let t = Math.min(hi, Math.max(lo, quadratic));
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const x = t >= 0 ? t * (a + t * b) : t * (a + t * (b + t * (c * (t - 100))));
    const f = x - target;
    if (f === 0) return t;
    if (f < 0) lo = t;
    else hi = t;
    const dx = t >= 0 ? a + 2 * b * t : a + t * (2 * b + t * (c * (4 * t - 300)));
    let next = t - f / dx;
    if (!(next >= lo && next <= hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - t) <= STEP_TOLERANCE_CELSIUS) return next;
    t = next;
  }
  return Number.NaN;
}

/**
 * Converts `codes[start + n·stride]` for n = 0…count−1 into `out[outStart + n·outStride]` with a
 * Callendar–Van Dusen kernel; rejected samples become NaN and are recorded in `tally`. Each code
 * is read before its output slot is written (in-place conversion is safe).
 */
export function convertCallendarVanDusen(
  codes: Codes,
  out: Float64Array,
  k: CallendarVanDusenKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  count: number,
  outStart: number,
  outStride: number,
): void {
  const { ra, rb, rc, rd, lo, hi, r0Ohms, a, b, minOhms, maxOhms, unit, scalar } = k;
  const aa = a * a;
  const b4 = 4 * b;
  for (let n = 0, i = start, o = outStart; n < count; n++, i += stride, o += outStride) {
    const x = codes[i] as number;
    let t = Number.NaN;
    if (x > lo && x < hi) {
      const ohms = (ra * x + rb) / (rc * x + rd);
      // The scalar path refuses a resistance outside the curve's range (or not a number): rejected.
      if (ohms >= minOhms && ohms <= maxOhms) {
        const target = ohms / r0Ohms - 1;
        const disc = aa + b4 * target;
        const quadratic = disc >= 0 ? (2 * target) / (a + Math.sqrt(disc)) : target / a;
        t = target >= 0 ? quadratic : belowZero(k, target, quadratic);
        if (t !== t) {
          // An iteration that would not converge: the scalar path decides (its value is in the unit).
          const q = scalar(x);
          if (q === q) {
            out[o] = q;
            continue;
          }
        }
      }
    }
    if (t === t) out[o] = unit === 0 ? t : unit === 1 ? t + ZERO_CELSIUS_KELVIN : (t * 9) / 5 + 32;
    else {
      out[o] = Number.NaN;
      tally.reject(x, o);
    }
  }
}

/**
 * A kernel for a map whose value q is a root of a quadratic with coefficients affine in the code,
 * A(x)·q² + B(x)·q + C(x) = 0 (a bridge whose ratio is a ratio of quadratics in strain, such as
 * the full-bending-poisson arrangement, followed by affine corrections): per sample the root
 * q = 2C/(−B − sgn(B)·√(B² − 4AC)), the form without cancellation that tends to −C/B as A → 0.
 */
export interface QuadraticKernel {
  /** A(x) = a0 + a1·x. */
  readonly a0: number;
  /** a1. */
  readonly a1: number;
  /** B(x) = b0 + b1·x; of one sign over the valid codes. */
  readonly b0: number;
  /** b1. */
  readonly b1: number;
  /** C(x) = c0 + c1·x. */
  readonly c0: number;
  /** c1. */
  readonly c1: number;
  /** Open lower end of the codes the kernel covers. */
  readonly lo: number;
  /** Open upper end. */
  readonly hi: number;
  /** The exact scalar path for one code: its value, or NaN when it cannot be converted. */
  readonly scalar: (code: number) => number;
}

/**
 * Converts with a quadratic kernel, as {@link convertCallendarVanDusen} does with its own: codes
 * outside the kernel's interval, and any sample whose root is not a finite number, go to the
 * scalar path. Contiguous Int32 codes take blocks of 256 computed four at a time, with the range
 * test (the integer test of ./kernel.ts) and a finiteness test (q − q is 0 only for a finite q)
 * folded per block; a block that fails either is revisited sample by sample.
 */
export function convertQuadratic(
  codes: Codes,
  out: Float64Array,
  k: QuadraticKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  count: number,
  outStart: number,
  outStride: number,
): void {
  if (
    codes instanceof Int32Array &&
    stride === 1 &&
    outStride === 1 &&
    k.lo >= -(2 ** 30) &&
    k.hi <= 2 ** 30
  ) {
    quadraticInt32(codes, out, k, tally, start, count, outStart);
    return;
  }
  quadraticSamples(codes, out, k, tally, start, stride, count, outStart, outStride);
}

/** The sign s of q = 2C/(s·√(B² − 4AC) − B): +1 where B < 0, −1 where B > 0 (one sign over the codes). */
function rootSign(k: QuadraticKernel): number {
  return k.b0 + k.b1 * ((k.lo + k.hi) / 2) < 0 ? 1 : -1;
}

/** One sample at a time (any codes, strides, in place). */
function quadraticSamples(
  codes: Codes,
  out: Float64Array,
  k: QuadraticKernel,
  tally: RejectTally,
  start: number,
  stride: number,
  count: number,
  outStart: number,
  outStride: number,
): void {
  const { a0, a1, b0, b1, c0, c1, lo, hi, scalar } = k;
  const sg = rootSign(k);
  for (let n = 0, i = start, o = outStart; n < count; n++, i += stride, o += outStride) {
    const x = codes[i] as number;
    let q = Number.NaN;
    if (x > lo && x < hi) {
      const qb = b0 + b1 * x;
      const qc = c0 + c1 * x;
      q = (2 * qc) / (sg * Math.sqrt(qb * qb - 4 * (a0 + a1 * x) * qc) - qb);
    }
    if (q - q !== 0) q = scalar(x);
    if (q === q) out[o] = q;
    else {
      out[o] = Number.NaN;
      tally.reject(x, o);
    }
  }
}

/** Contiguous Int32 codes: blocks of 256, four samples per step, flags folded per block. */
function quadraticInt32(
  codes: Int32Array,
  out: Float64Array,
  k: QuadraticKernel,
  tally: RejectTally,
  start: number,
  count: number,
  outStart: number,
): void {
  const { a0, a1, b0, b1, c0, c1 } = k;
  const sg = rootSign(k);
  const lowI = Math.floor(k.lo) + 1;
  const highI = Math.ceil(k.hi) - 1;
  const end = start + count;
  let i = start;
  let o = outStart;
  while (i < end) {
    const blockStart = i;
    const blockOut = o;
    const blockEnd = end - i > 256 ? i + 256 : end;
    const end4 = blockEnd - 3;
    let flags = 0;
    let finite = 0;
    for (; i < end4; i += 4, o += 4) {
      const x0 = codes[i] as number;
      const x1 = codes[i + 1] as number;
      const x2 = codes[i + 2] as number;
      const x3 = codes[i + 3] as number;
      const qb0 = b0 + b1 * x0;
      const qb1 = b0 + b1 * x1;
      const qb2 = b0 + b1 * x2;
      const qb3 = b0 + b1 * x3;
      const qc0 = c0 + c1 * x0;
      const qc1 = c0 + c1 * x1;
      const qc2 = c0 + c1 * x2;
      const qc3 = c0 + c1 * x3;
      const q0 = (2 * qc0) / (sg * Math.sqrt(qb0 * qb0 - 4 * (a0 + a1 * x0) * qc0) - qb0);
      const q1 = (2 * qc1) / (sg * Math.sqrt(qb1 * qb1 - 4 * (a0 + a1 * x1) * qc1) - qb1);
      const q2 = (2 * qc2) / (sg * Math.sqrt(qb2 * qb2 - 4 * (a0 + a1 * x2) * qc2) - qb2);
      const q3 = (2 * qc3) / (sg * Math.sqrt(qb3 * qb3 - 4 * (a0 + a1 * x3) * qc3) - qb3);
      out[o] = q0;
      out[o + 1] = q1;
      out[o + 2] = q2;
      out[o + 3] = q3;
      finite += q0 - q0 + (q1 - q1) + (q2 - q2) + (q3 - q3);
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
    for (; i < blockEnd; i++, o++) {
      const x = codes[i] as number;
      const qb = b0 + b1 * x;
      const qc = c0 + c1 * x;
      const q = (2 * qc) / (sg * Math.sqrt(qb * qb - 4 * (a0 + a1 * x) * qc) - qb);
      out[o] = q;
      finite += q - q;
      flags |= (x - lowI) | (highI - x);
    }
    if (flags < 0 || finite !== 0)
      quadraticSamples(codes, out, k, tally, blockStart, 1, i - blockStart, blockOut, 1);
  }
}
