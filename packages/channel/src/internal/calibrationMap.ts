/**
 * A channel that converts through a calibration against reference loads: the bridge ratio is a
 * polynomial of the quantity, r = P(q) = c0 + c1·q + c2·q² + c3·q³ (fitted by the calibration
 * package's `fitPolynomial`), and the channel's value is its inverse over the calibrated span.
 * Replaces the sensor kind's ratio ↔ quantity map; the converter's code ↔ ratio map is kept.
 */
import { BridgeworkError, formatValue, type ErrorCode, type Interval } from '@bridgework/core';
import type { KindMap } from '../kinds/SensorKind.js';
import { fromBaseUnit, toBaseUnit } from '../units/quantity.js';
import type { Dimension } from '../units/unitTable.js';

/** The part of a `calibration` section the map needs. */
export interface CalibrationSection {
  /** c0…cd, ratio in V/V against the quantity in `unit`. */
  readonly coefficients: readonly number[];
  /** The reference loads' span, in `unit`. */
  readonly range: Interval;
  /** Extrapolation past the span, a fraction of it on each side. */
  readonly extrapolationFraction: number;
  /** The quantity's unit in the coefficients. */
  readonly unit: string;
}

const horner = (c: readonly number[], q: number): number => {
  let s = 0;
  for (let k = c.length - 1; k >= 0; k--) s = s * q + (c[k] as number);
  return s;
};
const slope = (c: readonly number[], q: number): number => {
  let s = 0;
  for (let k = c.length - 1; k >= 1; k--) s = s * q + k * (c[k] as number);
  return s;
};

/** The span the channel converts over: the calibrated range widened by the extrapolation fraction. */
export function calibratedSpan(section: CalibrationSection): Interval {
  const { min, max } = section.range;
  const w = section.extrapolationFraction * (max - min);
  return { min: min - w, max: max + w };
}

/**
 * Why a calibration cannot serve as the channel's map, or undefined: its slope must keep one sign
 * (and not vanish) over the span it converts, so the map has an inverse there.
 *
 * @remarks
 * The slope P′(q) = c1 + 2c2·q + 3c3·q² is at most quadratic: it keeps its sign on [a, b] when it
 * has the same non-zero sign at both ends and at its one stationary point (−c2/(3c3)) if that lies
 * inside.
 */
export function calibrationProblem(
  section: CalibrationSection,
): { field: string; code: ErrorCode; message: string } | undefined {
  const c = section.coefficients;
  const span = calibratedSpan(section);
  const at = [span.min, span.max];
  const c3 = c[3] ?? 0;
  if (c3 !== 0) {
    const stationary = -(c[2] ?? 0) / (3 * c3);
    if (stationary > span.min && stationary < span.max) at.push(stationary);
  }
  const slopes = at.map((q) => slope(c, q));
  const positive = slopes.every((s) => s > 0);
  const negative = slopes.every((s) => s < 0);
  if (!(positive || negative) || !slopes.every(Number.isFinite)) {
    return {
      field: 'coefficients',
      code: 'no-solution',
      message: `is not monotone over [${formatValue(span.min)}, ${formatValue(span.max)}] ${section.unit} (the reference span with its extrapolation), so a reading would not give one quantity; fit a lower degree or narrow the span`,
    };
  }
  return undefined;
}

/**
 * The kind map of a calibrated channel: r = P(q) + (zeroRatio − c0) (with a zero reading, the
 * calibration is referenced to it), its inverse by safeguarded Newton (bisection when a Newton
 * step leaves the bracket) to a few ulps of the quantity, closed form for degree 1.
 *
 * @param base - The sensor kind's map (its front-end span serves the noise budget).
 * @param section - The calibration (checked by {@link calibrationProblem}).
 * @param dimension - The output dimension.
 * @param zeroRatio - The bridge ratio of the zero reading, if any.
 */
export function calibratedKindMap(
  base: KindMap,
  section: CalibrationSection,
  dimension: Dimension,
  zeroRatio: number | undefined,
): KindMap {
  const c = section.coefficients;
  const unit = section.unit;
  const shift = zeroRatio === undefined ? 0 : zeroRatio - (c[0] as number);
  const span = calibratedSpan(section);
  const rA = horner(c, span.min);
  const rB = horner(c, span.max);
  const increasing = rB > rA;
  const ratioRange: Interval = { min: Math.min(rA, rB) + shift, max: Math.max(rA, rB) + shift };
  const invert = (x: number): number => {
    if (c.length === 2) return (x - (c[0] as number)) / (c[1] as number);
    let lo = span.min;
    let hi = span.max;
    let q = lo + ((x - rA) / (rB - rA)) * (hi - lo);
    if (!(q > lo && q < hi)) q = 0.5 * lo + 0.5 * hi;
    for (let i = 0; i < 200; i++) {
      const f = horner(c, q) - x;
      if (f === 0) return q;
      if (f > 0 === increasing) hi = q;
      else lo = q;
      const d = slope(c, q);
      let next = q - f / d;
      if (!(next > lo && next < hi)) next = 0.5 * lo + 0.5 * hi;
      if (Math.abs(next - q) <= 4 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi))) return next;
      q = next;
    }
    return q;
  };
  return {
    quantityFromRatio(ratio) {
      if (!(ratio > ratioRange.min && ratio < ratioRange.max)) {
        throw new BridgeworkError(
          'ratio-out-of-range',
          `the bridge ratio ${formatValue(ratio)} V/V is outside the calibration's span (${formatValue(ratioRange.min)}, ${formatValue(ratioRange.max)}) V/V, the reference loads' span with its extrapolation`,
          { param: 'calibration', value: ratio, limit: [ratioRange.min, ratioRange.max] },
        );
      }
      return toBaseUnit(invert(ratio - shift), dimension, unit);
    },
    ratioFromQuantity: (quantity) => horner(c, fromBaseUnit(quantity, dimension, unit)) + shift,
    ratioRange,
    linearFractional: c.length === 2,
    frontEndSpan: (ratioMin, ratioMax) => base.frontEndSpan(ratioMin, ratioMax),
  };
}
