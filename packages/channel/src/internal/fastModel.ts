/**
 * The channel's value as straight-line arithmetic of the reading (a code) and the parameter
 * vector, for Monte Carlo: the converter's coding in closed form (chain: countsPerRatio = G·s,
 * lsbVolts = Vref/G/s), then the kind's fast map, then the output unit. Nothing is built per
 * evaluation. Before it is used it is checked against the exact composed model (createChannelModel,
 * rebuilt at each checked parameter vector); a model that disagrees is not used.
 */
import { budgetSideOf } from '../kinds/budgetRegistry.js';
import { Parameter } from '../kinds/SensorKind.js';
import { fromBaseUnitFunction } from '../units/quantity.js';
import { createChannelModel } from './model.js';
import type { ResolvedChannel } from './resolve.js';

/** The value in the channel's unit for a reading code under the parameters `p`. */
export type ParametricModel = (code: number, p: Float64Array) => number;

/** Largest disagreement accepted between the fast and the exact model, relative to the span's largest magnitude. */
export const FAST_MODEL_TOLERANCE = 1e-10;

/** The closed-form model of a channel, or undefined when its kind has none. */
export function createFastModel(r: ResolvedChannel): ParametricModel | undefined {
  // A calibrated channel's map is the calibration's inverse: the exact model serves it.
  if (r.spec.calibration !== undefined) return undefined;
  const fast = budgetSideOf(r.kind).fastMap?.(r.context as never);
  if (fast === undefined && r.spec.output.quantity !== 'ratio') return undefined;
  const spec = r.spec;
  const ratiometric = spec.adc.ratiometric;
  const codeScale = spec.adc.bipolar ? 2 ** (spec.adc.bits - 1) : 2 ** spec.adc.bits;
  const sign = r.sign;
  const zeroCode = spec.zero?.code;
  const asRatio = spec.output.quantity === 'ratio';
  const toUnit = fromBaseUnitFunction(asRatio ? 'ratio' : r.dimension, r.unit);
  const E = Parameter.excitationVolts;
  const G = Parameter.gain;
  const REF = Parameter.referenceVolts;
  const OFF = Parameter.offsetVolts;
  return (code, p) => {
    const e = p[E] as number;
    const g = p[G] as number;
    const offset = (p[OFF] as number) / e;
    let ratio: number;
    let zeroRatio = Number.NaN;
    if (ratiometric) {
      const countsPerRatio = g * codeScale;
      ratio = sign * (code / countsPerRatio - offset);
      if (zeroCode !== undefined) zeroRatio = sign * (zeroCode / countsPerRatio - offset);
    } else {
      const lsb = (p[REF] as number) / g / codeScale;
      const off = p[OFF] as number;
      ratio = sign * ((code * lsb - off) / e);
      if (zeroCode !== undefined) zeroRatio = sign * ((zeroCode * lsb - off) / e);
    }
    return toUnit(asRatio ? ratio : (fast as NonNullable<typeof fast>).quantity(ratio, zeroRatio, p));
  };
}

/** The exact composed model as a parametric model (rebuilt per evaluation: slow, the reference). */
export function exactParametricModel(r: ResolvedChannel): ParametricModel {
  return (code, p) => {
    const m = createChannelModel(r, p);
    return m.valueFromRatio(m.ratioFromCode(code));
  };
}

/**
 * Whether the fast model agrees with the exact one at every parameter vector and code given,
 * within FAST_MODEL_TOLERANCE of `scale`.
 */
export function fastModelAgrees(
  r: ResolvedChannel,
  fast: ParametricModel,
  vectors: readonly Float64Array[],
  codes: readonly number[],
  scale: number,
): boolean {
  const exact = exactParametricModel(r);
  for (const p of vectors) {
    for (const code of codes) {
      let want: number;
      try {
        want = exact(code, p);
      } catch {
        continue; // a reading this parameter set cannot produce: nothing to compare
      }
      let got: number;
      try {
        got = fast(code, p);
      } catch {
        return false; // the exact map reads it: the closed form must too
      }
      if (!(Math.abs(got - want) <= FAST_MODEL_TOLERANCE * scale)) return false;
    }
  }
  return true;
}
