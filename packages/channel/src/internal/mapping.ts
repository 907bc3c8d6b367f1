/**
 * A channel's exact code → value map at one parameter vector, with its valid codes and its fast
 * kernel: one Möbius function of the code when the map is linear-fractional, or a Möbius map to
 * the sensor's resistance followed by the sensor's curve (RTDs, thermistors).
 */
import { BridgeworkError, formatValue, isBridgeworkError } from '@bridgework/core';
import type { Thermistor } from '@bridgework/compensation';
import { createBetaThermistor, createRtd, createSteinhartHartThermistor } from '@bridgework/compensation';
import {
  createCallendarVanDusenKernel,
  type CallendarVanDusenKernel,
  type QuadraticKernel,
  type TemperatureUnit,
} from '../convert/curveKernels.js';
import type { LinearFractionalKernel, PartialLinearFractionalKernel } from '../convert/kernel.js';
import type { SensorCurve } from '../kinds/SensorKind.js';
import { findUnit, fromBaseUnit } from '../units/quantity.js';
import { createChannelModel, type ChannelModel } from './model.js';
import type { ResolvedChannel } from './resolve.js';

/** The Möbius coefficients of q = (a·x + b)/(c·x + d). */
export interface Mobius {
  /** a. */
  readonly a: number;
  /** b. */
  readonly b: number;
  /** c. */
  readonly c: number;
  /** d. */
  readonly d: number;
}

/** The exact map at one parameter vector, with the valid codes and the kernel. */
export interface Mapping {
  /** The exact model. */
  readonly model: ChannelModel;
  /** Open lower end of the codes that convert (inside the rails, ratio inside the sensor's range). */
  readonly lo: number;
  /** Open upper end. */
  readonly hi: number;
  /** The Möbius kernel of the value, or undefined. */
  readonly kernel: LinearFractionalKernel | undefined;
  /**
   * Without a kernel over every valid code (a linear-fractional map with a pole just beyond one
   * end): the Möbius kernel on the codes where it holds, the exact map at the end near the pole.
   */
  readonly partialKernel: PartialLinearFractionalKernel | undefined;
  /**
   * For a map that is not linear-fractional and has no sensor curve: the root of a quadratic with
   * coefficients affine in the code, when one follows the exact map (full-bending-poisson bridges).
   */
  readonly quadraticKernel: QuadraticKernel | undefined;
  /** A Möbius map to the sensor's resistance and the curve after it, when the map factors so. */
  readonly resistanceCurve:
    | {
        readonly resistance: Mobius;
        readonly curve: SensorCurve;
        readonly evaluate: (code: number) => number;
        /** The conversion loop of the curve, when it has one (IEC 60751 platinum RTDs). */
        readonly kernel: CallendarVanDusenKernel | undefined;
      }
    | undefined;
  /** The value for a valid code; NaN for an invalid one (no throw: for kernels). */
  valueOrNaN(code: number): number;
  /** The exact value for a code; throws `clipped` or `ratio-out-of-range`. */
  valueFromCode(code: number): number;
}

/** Largest relative disagreement accepted between a kernel and the exact map. */
export const KERNEL_TOLERANCE = 1e-12;

/** Throws the channel's error for a code that cannot be converted. */
export function rejectCode(code: number, m: { lo: number; hi: number; model: ChannelModel }): never {
  const adc = m.model.adc;
  if (code <= adc.codeMin || code >= adc.codeMax) {
    throw new BridgeworkError(
      'clipped',
      `\`code\` must lie strictly inside the converter's rails (${adc.codeMin}, ${adc.codeMax}); got ${formatValue(code)}`,
      { param: 'code', value: code, limit: [adc.codeMin, adc.codeMax] },
    );
  }
  throw new BridgeworkError(
    'ratio-out-of-range',
    `\`code\` must be in (${m.lo}, ${m.hi}) for a reading the sensor can produce; got ${formatValue(code)}`,
    { param: 'code', value: code, limit: [m.lo, m.hi] },
  );
}

/** An evaluator of a named sensor curve (resistance → °C), from the compensation package. */
function curveEvaluator(
  curve: SensorCurve,
  rangeCelsius: readonly [number, number] | undefined,
): (ohms: number) => number {
  let t: Pick<Thermistor, 'temperatureAt'>;
  if (curve.model === 'callendar-van-dusen')
    t = createRtd({ r0Ohms: curve.r0Ohms, a: curve.a, b: curve.b, c: curve.c });
  else if (curve.model === 'beta') {
    t = createBetaThermistor({
      referenceOhms: curve.referenceOhms,
      referenceCelsius: curve.referenceCelsius,
      betaKelvin: curve.betaKelvin,
      ...(rangeCelsius === undefined ? {} : { rangeCelsius }),
    });
  } else
    t = createSteinhartHartThermistor({
      a: curve.a,
      b: curve.b,
      c: curve.c,
      ...(rangeCelsius === undefined ? {} : { rangeCelsius }),
    });
  return (ohms) => t.temperatureAt(ohms);
}

/** Builds the mapping of a channel at the parameter vector `p`. */
export function createMapping(r: ResolvedChannel, p: Float64Array): Mapping {
  const model = createChannelModel(r, p);
  const { adc } = model;
  // Valid codes: strictly inside the rails, and a ratio strictly inside the sensor's range. The
  // ratio is affine in the code, so the range maps to an interval of codes.
  const atMin = model.exactCodeFromRatio(model.ratioRange.min);
  const atMax = model.exactCodeFromRatio(model.ratioRange.max);
  const lo = Math.max(adc.codeMin, Math.min(atMin, atMax));
  const hi = Math.min(adc.codeMax, Math.max(atMin, atMax));
  const exact = (code: number) => model.valueFromRatio(model.ratioFromCode(code));
  const valueOrNaN = (code: number): number => {
    if (!(code > lo && code < hi)) return Number.NaN;
    try {
      return exact(code);
    } catch (e) {
      if (isBridgeworkError(e)) return Number.NaN;
      throw e;
    }
  };
  const mapping = { model, lo, hi };
  const valueFromCode = (code: number): number => {
    if (!(code > lo && code < hi)) rejectCode(code, mapping);
    return exact(code);
  };
  const kernel = model.linearFractional ? fitMobius(valueFromCode, lo, hi) : undefined;
  const partialKernel =
    model.linearFractional && kernel === undefined ? partialMobius(valueOrNaN, lo, hi) : undefined;
  let resistanceCurve: Mapping['resistanceCurve'];
  const rc = model.kindMap.resistance;
  if (kernel === undefined && rc !== undefined && r.spec.output.quantity === 'temperature') {
    const ohmsFromCode = (code: number) => rc.fromRatio(model.ratioFromCode(code));
    const fit = fitMobius(ohmsFromCode, lo, hi);
    if (fit !== undefined) {
      const range = r.spec.sensor['rangeCelsius'] as { min: number; max: number } | undefined;
      const temperatureAt = curveEvaluator(
        rc.curve,
        range === undefined ? undefined : [range.min, range.max],
      );
      const unit = r.unit;
      const { a, b, c, d } = fit;
      const evaluate = (code: number) =>
        fromBaseUnit(temperatureAt((a * code + b) / (c * code + d)), 'temperature', unit);
      // Accepted only when the composition agrees with the exact map (KERNEL_TOLERANCE of the largest value).
      if (agrees(evaluate, valueOrNaN, lo, hi)) {
        const scalar = (code: number): number => {
          if (!(code > lo && code < hi)) return Number.NaN;
          try {
            return evaluate(code);
          } catch (e) {
            if (isBridgeworkError(e)) return Number.NaN;
            throw e;
          }
        };
        const symbol = temperatureUnitOf(findUnit('temperature', unit)?.unit.symbol);
        const curve = rc.curve;
        resistanceCurve = {
          resistance: { a, b, c, d },
          curve,
          evaluate,
          kernel:
            curve.model === 'callendar-van-dusen' && symbol !== undefined
              ? createCallendarVanDusenKernel({
                  resistance: { a, b, c, d },
                  curve,
                  lo,
                  hi,
                  unit: symbol,
                  scalar,
                })
              : undefined,
        };
      }
    }
  }
  const quadraticKernel =
    !model.linearFractional && resistanceCurve === undefined ? fitQuadratic(valueOrNaN, lo, hi) : undefined;
  return {
    model,
    lo,
    hi,
    kernel,
    partialKernel,
    quadraticKernel,
    resistanceCurve,
    valueOrNaN,
    valueFromCode,
  };
}

/** The temperature kernels' name of a unit symbol (as fromBaseUnit reads it), or undefined. */
function temperatureUnitOf(symbol: string | undefined): TemperatureUnit | undefined {
  return symbol === '°C' ? 'celsius' : symbol === 'K' ? 'kelvin' : symbol === '°F' ? 'fahrenheit' : undefined;
}

/** Whether `f` agrees with the exact map at 65 codes across (lo, hi), within KERNEL_TOLERANCE of the largest value. */
function agrees(f: (x: number) => number, exact: (x: number) => number, lo: number, hi: number): boolean {
  const first = Math.floor(lo) + 1;
  const last = Math.ceil(hi) - 1;
  let scale = 0;
  let worst = 0;
  for (let i = 0; i <= 64; i++) {
    const x = Math.round(first + ((last - first) * i) / 64);
    const q = exact(x);
    if (Number.isNaN(q)) continue;
    let k: number;
    try {
      k = f(x);
    } catch {
      return false;
    }
    scale = Math.max(scale, Math.abs(q));
    worst = Math.max(worst, Math.abs(k - q));
  }
  return scale > 0 && worst <= KERNEL_TOLERANCE * scale;
}

/**
 * The Möbius function q = (a·x + b)/(c·x + d) through three exact values of the map: with
 * t = (x − x0)/h at t = −τ, 0, τ: β = q(0), γ = (q₋ + q₊ − 2β)/(τ(q₋ − q₊)), α = (q₊ − β + γτq₊)/τ,
 * q = (αt + β)/(γt + 1). Checked against the exact map at 65 codes; undefined when it disagrees
 * by more than KERNEL_TOLERANCE of the largest value (then the exact map is used).
 */
function fitMobius(
  exact: (code: number) => number,
  lo: number,
  hi: number,
): LinearFractionalKernel | undefined {
  const kernel = mobiusThroughThree(exact, lo, hi);
  if (kernel === undefined) return undefined;
  const f = (x: number) => (kernel.a * x + kernel.b) / (kernel.c * x + kernel.d);
  const safe = (x: number) => {
    try {
      return exact(x);
    } catch (e) {
      if (isBridgeworkError(e)) return Number.NaN;
      throw e;
    }
  };
  return agrees(f, safe, lo, hi) ? kernel : undefined;
}

/** The Möbius function through three exact values of the map (see {@link fitMobius}), unchecked. */
function mobiusThroughThree(
  exact: (code: number) => number,
  lo: number,
  hi: number,
): LinearFractionalKernel | undefined {
  const first = Math.floor(lo) + 1;
  const last = Math.ceil(hi) - 1;
  if (!(last - first >= 4)) return undefined;
  const x0 = Math.round((first + last) / 2);
  const h = Math.min(x0 - first, last - x0);
  const tau = 0.9;
  const xm = x0 - Math.round(tau * h);
  const xp = x0 + Math.round(tau * h);
  const tm = (xm - x0) / h;
  const tp = (xp - x0) / h;
  let qm: number;
  let q0: number;
  let qp: number;
  try {
    qm = exact(xm);
    q0 = exact(x0);
    qp = exact(xp);
  } catch (e) {
    if (isBridgeworkError(e)) return undefined;
    throw e;
  }
  // Solve α·t + β − γ·t·q = q at t = tm and tp with β = q0 (Cramer's rule on the 2×2 system).
  const det = -tm * tp * qp + tp * tm * qm;
  if (det === 0 || !Number.isFinite(det)) return undefined;
  const rm = qm - q0;
  const rp = qp - q0;
  const alpha = (rm * -tp * qp - -tm * qm * rp) / det;
  const gamma = (tm * rp - tp * rm) / det;
  // Back to code coordinates: q = (α(x − x0) + βh)/(γ(x − x0) + h).
  return { a: alpha, b: q0 * h - alpha * x0, c: gamma, d: h - gamma * x0, lo, hi };
}

/**
 * A partial kernel for a linear-fractional map that no Möbius kernel follows over every valid
 * code: its pole x = −d/c lies just beyond (or at) one end, where the value grows without bound and
 * both roundings (kernel and exact map) lose digits. The kernel keeps the codes at least δ from the
 * pole, δ = 1, 4, 16… codes, the first that agrees with the exact map at every checked code within
 * KERNEL_TOLERANCE of the larger of that code's value and the values at the fit points; the codes
 * nearer the pole take the exact map per sample. Undefined when no such interval keeps 99 % of the
 * codes.
 */
function partialMobius(
  exact: (code: number) => number,
  lo: number,
  hi: number,
): PartialLinearFractionalKernel | undefined {
  let fit: LinearFractionalKernel | undefined;
  try {
    fit = mobiusThroughThree(exact, lo, hi);
  } catch (e) {
    if (isBridgeworkError(e)) return undefined;
    throw e;
  }
  if (fit === undefined || fit.c === 0) return undefined;
  const { a, b, c, d } = fit;
  const pole = -d / c;
  if (!Number.isFinite(pole)) return undefined;
  const f = (x: number) => (a * x + b) / (c * x + d);
  const floor = Math.max(
    ...[lo + 0.05 * (hi - lo), (lo + hi) / 2, hi - 0.05 * (hi - lo)].map((x) =>
      Math.abs(exact(Math.round(x))),
    ),
  );
  if (!(floor > 0)) return undefined;
  const upper = pole > (lo + hi) / 2;
  for (let delta = 1; delta <= 0.01 * (hi - lo); delta *= 4) {
    const l = upper ? lo : Math.max(lo, pole + delta);
    const h = upper ? Math.min(hi, pole - delta) : hi;
    if (agreesPointwise(f, exact, l, h, floor, upper)) return { a, b, c, d, lo: l, hi: h, scalar: exact };
  }
  return undefined;
}

/**
 * Whether `f` agrees with the exact map at 65 codes across (lo, hi) and at the 64 codes next to
 * the end near the pole, each within KERNEL_TOLERANCE of max(|value|, floor).
 */
function agreesPointwise(
  f: (x: number) => number,
  exact: (x: number) => number,
  lo: number,
  hi: number,
  floor: number,
  upper: boolean,
): boolean {
  const first = Math.floor(lo) + 1;
  const last = Math.ceil(hi) - 1;
  if (!(last - first >= 128)) return false;
  const codes: number[] = [];
  for (let i = 0; i <= 64; i++) codes.push(Math.round(first + ((last - first) * i) / 64));
  for (let i = 0; i < 64; i++) codes.push(upper ? last - i : first + i);
  for (const x of codes) {
    const q = exact(x);
    if (Number.isNaN(q)) return false;
    if (!(Math.abs(f(x) - q) <= KERNEL_TOLERANCE * Math.max(Math.abs(q), floor))) return false;
  }
  return true;
}

/**
 * The quadratic kernel through five exact values of the map: with t = (x − x0)/h at
 * t = −0.95, −0.5, 0, 0.5, 0.95 and u = q/s (s the largest |q| there), the coefficients of
 * (α0 + α1·t)·u² + (1 + β1·t)·u + (γ0 + γ1·t) = 0 solve a 5×5 linear system (Gaussian elimination
 * with partial pivoting); then back to code coordinates and q. Kept only when B(x) keeps one sign
 * over the codes and the kernel agrees with the exact map at 1025 codes across them within
 * KERNEL_TOLERANCE of the largest value (a map that is no such root fails this and keeps the
 * exact path).
 */
function fitQuadratic(exact: (code: number) => number, lo: number, hi: number): QuadraticKernel | undefined {
  const first = Math.floor(lo) + 1;
  const last = Math.ceil(hi) - 1;
  if (!(last - first >= 8)) return undefined;
  const x0 = Math.round((first + last) / 2);
  const h = Math.min(x0 - first, last - x0);
  const xs = [-0.95, -0.5, 0, 0.5, 0.95].map((tau) => x0 + Math.round(tau * h));
  const ts = xs.map((x) => (x - x0) / h);
  const qs = xs.map(exact);
  const s = Math.max(...qs.map(Math.abs));
  if (!(s > 0 && Number.isFinite(s))) return undefined;
  // Rows: [u², t·u², t·u, 1, t | −u] for the unknowns α0, α1, β1, γ0, γ1.
  const rows = ts.map((t, i) => {
    const u = (qs[i] as number) / s;
    return [u * u, t * u * u, t * u, 1, t, -u];
  });
  const solution = solveLinear(rows);
  if (solution === undefined) return undefined;
  const [alpha0, alpha1, beta1, gamma0, gamma1] = solution as [number, number, number, number, number];
  // In q and x: A = (α0 + α1·t)/s, B = 1 + β1·t, C = (γ0 + γ1·t)·s, t = (x − x0)/h.
  const kernel: QuadraticKernel = {
    a0: (alpha0 - (alpha1 * x0) / h) / s,
    a1: alpha1 / h / s,
    b0: 1 - (beta1 * x0) / h,
    b1: beta1 / h,
    c0: (gamma0 - (gamma1 * x0) / h) * s,
    c1: (gamma1 / h) * s,
    lo,
    hi,
    scalar: exact,
  };
  const bLo = kernel.b0 + kernel.b1 * first;
  const bHi = kernel.b0 + kernel.b1 * last;
  if (!(bLo > 0 === bHi > 0) || bLo === 0 || bHi === 0) return undefined;
  const sg = kernel.b0 + kernel.b1 * ((lo + hi) / 2) < 0 ? 1 : -1;
  // The kernel's expression (convert/curveKernels.ts), operation for operation.
  const f = (x: number) => {
    const qb = kernel.b0 + kernel.b1 * x;
    const qc = kernel.c0 + kernel.c1 * x;
    return (2 * qc) / (sg * Math.sqrt(qb * qb - 4 * (kernel.a0 + kernel.a1 * x) * qc) - qb);
  };
  let scale = 0;
  let worst = 0;
  for (let i = 0; i <= 1024; i++) {
    const x = Math.round(first + ((last - first) * i) / 1024);
    const q = exact(x);
    if (Number.isNaN(q)) continue;
    scale = Math.max(scale, Math.abs(q));
    const d = Math.abs(f(x) - q);
    if (!(d <= worst)) worst = d; // NaN from the kernel fails below
  }
  return scale > 0 && worst <= KERNEL_TOLERANCE * scale ? kernel : undefined;
}

/** Solves the square system given as augmented rows [A | b] (partial pivoting); undefined if singular. */
function solveLinear(rows: number[][]): number[] | undefined {
  const n = rows.length;
  const m = rows.map((r) => r.slice());
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r]![col]!) > Math.abs(m[pivot]![col]!)) pivot = r;
    if (!(Math.abs(m[pivot]![col]!) > 0)) return undefined;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    const p = m[col]!;
    for (let r = col + 1; r < n; r++) {
      const row = m[r]!;
      const factor = row[col]! / p[col]!;
      for (let c = col; c <= n; c++) row[c] = row[c]! - factor * p[c]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    const row = m[r]!;
    let sum = row[n]!;
    for (let c = r + 1; c < n; c++) sum -= row[c]! * x[c]!;
    x[r] = sum / row[r]!;
  }
  return x.every(Number.isFinite) ? x : undefined;
}
