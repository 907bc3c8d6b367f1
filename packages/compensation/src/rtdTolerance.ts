import { BridgeworkError, checkFinite, checkOneOf, checkOptions } from '@bridgework/core';

/** An IEC 60751 tolerance class of an industrial platinum resistance thermometer. */
export type RtdToleranceClass = 'AA' | 'A' | 'B' | 'C';

/** The construction of a platinum sensing element, which sets the validity range of each class. */
export type RtdElement = 'wire-wound' | 'film';

/** One IEC 60751 tolerance class: ±(fixed + proportional·|t|) °C over its validity ranges. */
export interface RtdToleranceClassSpec {
  /** The fixed part of the tolerance, °C. */
  readonly fixedCelsius: number;
  /** The part proportional to |t| (t in °C), per °C. */
  readonly proportional: number;
  /** Validity range [min, max] in °C for wire-wound elements. */
  readonly wireWoundRangeCelsius: readonly [number, number];
  /** Validity range [min, max] in °C for film elements. */
  readonly filmRangeCelsius: readonly [number, number];
}

/**
 * The tolerance classes of IEC 60751:2008 (table of tolerance classes; from memory):
 *
 * | class | tolerance, °C | wire-wound | film |
 * |---|---|---|---|
 * | AA | ±(0.1 + 0.0017·abs(t)) | −50 … +250 °C | 0 … +150 °C |
 * | A | ±(0.15 + 0.002·abs(t)) | −100 … +450 °C | −30 … +300 °C |
 * | B | ±(0.3 + 0.005·abs(t)) | −196 … +600 °C | −50 … +500 °C |
 * | C | ±(0.6 + 0.01·abs(t)) | −196 … +600 °C | −50 … +600 °C |
 *
 * @example
 * ```ts
 * RTD_TOLERANCE_CLASSES.A.fixedCelsius; // 0.15
 * ```
 */
export const RTD_TOLERANCE_CLASSES: Readonly<Record<RtdToleranceClass, RtdToleranceClassSpec>> =
  Object.freeze({
    AA: {
      fixedCelsius: 0.1,
      proportional: 0.0017,
      wireWoundRangeCelsius: [-50, 250],
      filmRangeCelsius: [0, 150],
    },
    A: {
      fixedCelsius: 0.15,
      proportional: 0.002,
      wireWoundRangeCelsius: [-100, 450],
      filmRangeCelsius: [-30, 300],
    },
    B: {
      fixedCelsius: 0.3,
      proportional: 0.005,
      wireWoundRangeCelsius: [-196, 600],
      filmRangeCelsius: [-50, 500],
    },
    C: {
      fixedCelsius: 0.6,
      proportional: 0.01,
      wireWoundRangeCelsius: [-196, 600],
      filmRangeCelsius: [-50, 600],
    },
  });

/** Options of {@link rtdToleranceCelsius}. */
export interface RtdToleranceOptions {
  /** The tolerance class: `'AA'`, `'A'`, `'B'` or `'C'`. */
  readonly toleranceClass: RtdToleranceClass;
  /** The temperature t in °C, inside the class's validity range for the element. */
  readonly temperatureCelsius: number;
  /** `'wire-wound'` (default) or `'film'`. */
  readonly element?: RtdElement;
}

/**
 * The IEC 60751 tolerance of a platinum resistance thermometer at a temperature, in °C.
 *
 * @remarks
 * The half-width ±(fixed + proportional·|t|) of the class (see {@link RTD_TOLERANCE_CLASSES}):
 * the largest deviation from the standard curve that a sensor of the class may have. Class A at
 * 100 °C is ±0.35 °C. A class holds only over its validity range, which depends on the element
 * construction; a temperature outside it is rejected rather than extrapolated. For the tolerance
 * in ohms use the evaluator's `toleranceAt` (see `createRtd`), which multiplies by the local
 * slope dR/dt.
 *
 * @param options - Class, temperature and element construction.
 * @returns The tolerance half-width in °C (> 0).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown class or
 *   element; `out-of-range` outside the validity range; `not-finite`, `wrong-type`;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * rtdToleranceCelsius({ toleranceClass: 'A', temperatureCelsius: 100 }); // 0.35
 * ```
 */
export function rtdToleranceCelsius(options: RtdToleranceOptions): number {
  const o = checkOptions('options', options, {
    known: ['toleranceClass', 'temperatureCelsius', 'element'],
    required: ['toleranceClass', 'temperatureCelsius'],
  });
  const toleranceClass = checkOneOf('toleranceClass', o['toleranceClass'], ['AA', 'A', 'B', 'C']);
  const element =
    o['element'] === undefined ? 'wire-wound' : checkOneOf('element', o['element'], ['wire-wound', 'film']);
  const t = checkFinite('temperatureCelsius', o['temperatureCelsius']);
  const spec = RTD_TOLERANCE_CLASSES[toleranceClass];
  const [min, max] = element === 'film' ? spec.filmRangeCelsius : spec.wireWoundRangeCelsius;
  if (!(t >= min && t <= max)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`temperatureCelsius\` must be in [${min}, ${max}] for class ${toleranceClass} (${element}); got ${t}`,
      { param: 'temperatureCelsius', value: t, limit: [min, max] },
    );
  }
  return spec.fixedCelsius + spec.proportional * Math.abs(t);
}
