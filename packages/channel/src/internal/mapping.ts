/**
 * A channel's exact code → value map at one parameter vector, with its valid codes and its fast
 * kernel: one Möbius function of the code when the map is linear-fractional, or a Möbius map to
 * the sensor's resistance followed by the sensor's curve (RTDs, thermistors).
 */
import { BridgeworkError, formatValue, isBridgeworkError } from '@bridgework/core';
import type { Thermistor } from '@bridgework/compensation';
import { createBetaThermistor, createRtd, createSteinhartHartThermistor } from '@bridgework/compensation';
import type { LinearFractionalKernel } from '../convert/kernel.js';
import type { SensorCurve } from '../kinds/SensorKind.js';
import { fromBaseUnit } from '../units/quantity.js';
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
  /** A Möbius map to the sensor's resistance and the curve after it, when the map factors so. */
  readonly resistanceCurve:
    | {
        readonly resistance: Mobius;
        readonly curve: SensorCurve;
        readonly evaluate: (code: number) => number;
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
      if (agrees(evaluate, valueOrNaN, lo, hi))
        resistanceCurve = { resistance: { a, b, c, d }, curve: rc.curve, evaluate };
    }
  }
  return { model, lo, hi, kernel, resistanceCurve, valueOrNaN, valueFromCode };
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
  const kernel: LinearFractionalKernel = {
    a: alpha,
    b: q0 * h - alpha * x0,
    c: gamma,
    d: h - gamma * x0,
    lo,
    hi,
  };
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
