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
 * safeguarded Newton iteration on the quartic, started from the quadratic's root. Anything else (a
 * code outside the valid codes, a resistance outside the curve's range, an iteration that does
 * not converge) goes to the scalar path, which decides between a value and a rejection.
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
      if (ohms >= minOhms && ohms <= maxOhms) {
        const target = ohms / r0Ohms - 1;
        const disc = aa + b4 * target;
        const quadratic = disc >= 0 ? (2 * target) / (a + Math.sqrt(disc)) : target / a;
        t = target >= 0 ? quadratic : belowZero(k, target, quadratic);
      }
    }
    if (t === t) {
      out[o] = unit === 0 ? t : unit === 1 ? t + ZERO_CELSIUS_KELVIN : (t * 9) / 5 + 32;
      continue;
    }
    // Not a plain sample: the scalar path decides (and classifies a rejection).
    const q = scalar(x);
    if (q === q) out[o] = q;
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
 * outside the kernel's interval, and any sample whose root is not a number, go to the scalar path.
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
  const { a0, a1, b0, b1, c0, c1, lo, hi, scalar } = k;
  const negative = b0 + b1 * ((lo + hi) / 2) < 0;
  for (let n = 0, i = start, o = outStart; n < count; n++, i += stride, o += outStride) {
    const x = codes[i] as number;
    if (x > lo && x < hi) {
      const qa = a0 + a1 * x;
      const qb = b0 + b1 * x;
      const qc = c0 + c1 * x;
      const root = Math.sqrt(qb * qb - 4 * qa * qc);
      const q = (2 * qc) / (negative ? root - qb : -qb - root);
      if (q === q) {
        out[o] = q;
        continue;
      }
    }
    const q = scalar(x);
    if (q === q) out[o] = q;
    else {
      out[o] = Number.NaN;
      tally.reject(x, o);
    }
  }
}
