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
 * root in the cancellation-free form t = 2x/(A + √(A² + 4Bx)), x = R/R0 − 1; below 0 °C the
 * piecewise-polynomial start of `Rtd.inverseStart` and one Newton step on the quartic, kept under
 * the same proved bound (a sample whose step fails it goes to the scalar path, which iterates). A
 * code outside the valid codes or a resistance outside the curve's range is rejected, as the
 * scalar path rejects it.
 */
import { createRtd } from '@bridgework/compensation';
import { integerTestApplies, type Codes, type RejectTally } from './kernel.js';

const ZERO_CELSIUS_KELVIN = 273.15;
/** Terms of `Rtd.inverseStart`'s polynomial this loop reproduces (degree 8). */
const START_TERMS = 9;
/** Samples per block of the Int32 loop. */
const BLOCK = 256;
/** Lower end of the Newton step's proved bound, °C (createRtd). */
const T_BOUND = -201;

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
  /** `Rtd.inverseStart`: x(−200 °C). */
  readonly xMin: number;
  /** 2/|xMin|. */
  readonly scale: number;
  /** The guard of the Newton step's bound. */
  readonly guard: number;
  /** The start polynomial's nine coefficients (degree 8), lowest power first. */
  readonly start: Float64Array;
  /** Scratch of one block: the samples' x = R/R0 − 1. */
  readonly targets: Float64Array;
  /** Scratch of one block: the indices of the samples below 0 °C. */
  readonly below: Int32Array;
  /** The exact scalar path for one code: its value, or NaN when it cannot be converted. */
  readonly scalar: (code: number) => number;
}

/**
 * The kernel of a channel whose resistance is (ra·x + rb)/(rc·x + rd) and whose curve is IEC
 * 60751's; undefined (the scalar path serves) if the compensation package's inverse start is not
 * the layout this loop reproduces.
 */
export function createCallendarVanDusenKernel(options: {
  readonly resistance: { readonly a: number; readonly b: number; readonly c: number; readonly d: number };
  readonly curve: { readonly r0Ohms: number; readonly a: number; readonly b: number; readonly c: number };
  readonly lo: number;
  readonly hi: number;
  readonly unit: TemperatureUnit;
  readonly scalar: (code: number) => number;
}): CallendarVanDusenKernel | undefined {
  const { resistance, curve } = options;
  // The compensation package's own model: its checked coefficients and its resistance range.
  const rtd = createRtd({ r0Ohms: curve.r0Ohms, a: curve.a, b: curve.b, c: curve.c });
  const inverse = rtd.inverseStart;
  if (inverse.coefficients.length !== START_TERMS) return undefined;
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
    xMin: inverse.xMin,
    scale: inverse.scale,
    guard: inverse.guard,
    start: Float64Array.from(inverse.coefficients),
    targets: new Float64Array(BLOCK),
    below: new Int32Array(BLOCK),
    scalar: options.scalar,
  };
}

/**
 * Converts `codes[start + n·stride]` for n = 0…count−1 into `out[outStart + n·outStride]` with a
 * Callendar–Van Dusen kernel; rejected samples become NaN and are recorded in `tally`. Each code
 * is read before its output slot is written (in-place conversion is safe).
 *
 * @remarks
 * Contiguous Int32 codes take blocks of 256 in two passes, without a branch on the data: the
 * first computes every sample's resistance, x and the closed form of the quadratic (written out),
 * and lists the samples with x < 0 (an index stored at the list's end, the end advanced by the
 * comparison's 0 or 1); the second replaces those by the start and Newton step of `inverseStart`.
 * The range test (the integer test of ./kernel.ts), the resistance's range, the finiteness of the
 * closed forms and the Newton step's bound are folded per block; a block that fails any of them is
 * converted again sample by sample. Random temperatures on both sides of 0 °C would otherwise make
 * the processor guess the branch wrong for a fifth of the samples.
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
  if (integerTestApplies(codes, k.lo, k.hi) && stride === 1 && outStride === 1 && !buffersShare(codes, out)) {
    cvdInt32(codes, out, k, tally, start, count, outStart);
    return;
  }
  cvdSamples(codes, out, k, tally, start, stride, count, outStart, outStride);
}

/** Whether two typed arrays share a buffer (the Int32 loop writes a block before it is tested). */
function buffersShare(codes: Codes, out: Float64Array): boolean {
  return codes.buffer === out.buffer;
}

/** The output unit of a temperature in °C (as the unit module computes it). */
function inUnit(t: number, unit: 0 | 1 | 2): number {
  return unit === 0 ? t : unit === 1 ? t + ZERO_CELSIUS_KELVIN : (t * 9) / 5 + 32;
}

/** Contiguous Int32 codes: two passes per block of 256 (see {@link convertCallendarVanDusen}). */
function cvdInt32(
  codes: Int32Array,
  out: Float64Array,
  k: CallendarVanDusenKernel,
  tally: RejectTally,
  start: number,
  count: number,
  outStart: number,
): void {
  const { ra, rb, rc, rd, r0Ohms, a, b, c, minOhms, maxOhms, unit, xMin, scale, guard, targets, below } = k;
  const p = k.start;
  const [p0, p1, p2, p3, p4, p5, p6, p7, p8] = [
    p[0]!,
    p[1]!,
    p[2]!,
    p[3]!,
    p[4]!,
    p[5]!,
    p[6]!,
    p[7]!,
    p[8]!,
  ];
  const aa = a * a;
  const b4 = 4 * b;
  const b2 = 2 * b;
  const lowI = Math.floor(k.lo) + 1;
  const highI = Math.ceil(k.hi) - 1;
  const end = start + count;
  for (let i0 = start, o0 = outStart; i0 < end; i0 += BLOCK, o0 += BLOCK) {
    const n = end - i0 > BLOCK ? BLOCK : end - i0;
    let flags = 0;
    let finite = 0;
    // max(minOhms − R, R − maxOhms) and the Newton bound's terms: ≤ 0 when every sample holds.
    let worst = -1;
    let nb = 0;
    for (let m = 0; m < n; m++) {
      const x = codes[i0 + m] as number;
      const ohms = (ra * x + rb) / (rc * x + rd);
      const target = ohms / r0Ohms - 1;
      const q = (2 * target) / (a + Math.sqrt(aa + b4 * target));
      out[o0 + m] = unit === 0 ? q : unit === 1 ? q + ZERO_CELSIUS_KELVIN : (q * 9) / 5 + 32;
      targets[m] = target;
      below[nb] = m;
      nb += +(target < 0);
      flags |= (x - lowI) | (highI - x);
      finite += q - q;
      worst = Math.max(worst, minOhms - ohms, ohms - maxOhms);
    }
    for (let j = 0; j < nb; j++) {
      const m = below[j] as number;
      const target = targets[m] as number;
      const u = (target - xMin) * scale - 1;
      const u2 = u * u;
      const u4 = u2 * u2;
      const t0 =
        target *
        (p0 + p1 * u + (p2 + p3 * u) * u2 + (p4 + p5 * u + (p6 + p7 * u) * u2) * u4 + p8 * (u4 * u4));
      const f = t0 * (a + t0 * (b + t0 * (c * (t0 - 100)))) - target;
      const delta = f / (a + t0 * (b2 + t0 * (c * (4 * t0 - 300))));
      // The step's proved bound (createRtd): δ²·guard ≤ |t₀| and −201 °C ≤ t₀ < 0 (t₀ ≠ 0 for x < 0).
      worst = Math.max(worst, delta * delta * guard - Math.abs(t0), T_BOUND - t0, t0);
      const t = t0 - delta;
      out[o0 + m] = unit === 0 ? t : unit === 1 ? t + ZERO_CELSIUS_KELVIN : (t * 9) / 5 + 32;
    }
    if (flags < 0 || finite !== 0 || !(worst <= 0)) cvdSamples(codes, out, k, tally, i0, 1, n, o0, 1);
  }
}

/**
 * One sample at a time (any codes, strides, in place): the scalar path's branches, in its order.
 * Also the exact path of the opt-in polynomial converter (../rtdPolynomialConverter.ts).
 */
export function cvdSamples(
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
  const { ra, rb, rc, rd, lo, hi, r0Ohms, a, b, c, minOhms, maxOhms, unit, scalar } = k;
  const { xMin, scale, guard } = k;
  const p = k.start;
  const [p0, p1, p2, p3, p4, p5, p6, p7, p8] = [
    p[0]!,
    p[1]!,
    p[2]!,
    p[3]!,
    p[4]!,
    p[5]!,
    p[6]!,
    p[7]!,
    p[8]!,
  ];
  const b2 = 2 * b;
  for (let n = 0, i = start, o = outStart; n < count; n++, i += stride, o += outStride) {
    const x = codes[i] as number;
    let t = Number.NaN;
    if (x > lo && x < hi) {
      const ohms = (ra * x + rb) / (rc * x + rd);
      // The scalar path refuses a resistance outside the curve's range (or not a number): rejected.
      if (ohms >= minOhms && ohms <= maxOhms) {
        const target = ohms / r0Ohms - 1;
        if (target >= 0) {
          const disc = a * a + 4 * b * target;
          t = disc >= 0 ? (2 * target) / (a + Math.sqrt(disc)) : target / a;
        } else {
          const u = (target - xMin) * scale - 1;
          const u2 = u * u;
          const u4 = u2 * u2;
          const t0 =
            target *
            (p0 + p1 * u + (p2 + p3 * u) * u2 + (p4 + p5 * u + (p6 + p7 * u) * u2) * u4 + p8 * (u4 * u4));
          const f = t0 * (a + t0 * (b + t0 * (c * (t0 - 100)))) - target;
          const delta = f / (a + t0 * (b2 + t0 * (c * (4 * t0 - 300))));
          if (delta * delta * guard <= Math.abs(t0) && t0 >= T_BOUND && t0 < 0) t = t0 - delta;
          else {
            // The step's bound does not hold: the scalar path iterates (its value is in the unit).
            const q = scalar(x);
            if (q === q) {
              out[o] = q;
              continue;
            }
          }
        }
      }
    }
    if (t === t) out[o] = inUnit(t, unit);
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
  if (integerTestApplies(codes, k.lo, k.hi) && stride === 1 && outStride === 1) {
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
