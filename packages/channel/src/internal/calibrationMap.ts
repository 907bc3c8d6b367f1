/**
 * A channel that converts through a calibration against reference loads: the bridge ratio is a
 * polynomial of the quantity, r = P(q) = c0 + c1·q + c2·q² + c3·q³ (fitted by the calibration
 * package's `fitPolynomial`), and the channel's value is its inverse over the calibrated span.
 * Replaces the sensor kind's ratio ↔ quantity map; the converter's code ↔ ratio map is kept.
 */
import { BridgeworkError, formatValue, type Interval } from '@bridgework/core';
import type { KindMap } from '../kinds/SensorKind.js';
import { calibratedSpan, horner, slope, type CalibrationSection } from './calibrationPolynomial.js';
import { fromBaseUnit, toBaseUnit } from '../units/quantity.js';
import type { Dimension } from '../units/unitTable.js';

/**
 * The kind map of a calibrated channel: r = P(q) + (zeroRatio − c0) (with a zero reading, the
 * calibration is referenced to it), its inverse by safeguarded Newton (bisection when a Newton
 * step leaves the bracket) to a few ulps of the quantity, closed form for degree 1.
 *
 * @param base - The sensor kind's map (its front-end span serves the noise budget).
 * @param section - The calibration (checked by {@link calibrationProblem}).
 * @param dimension - The output dimension.
 * @param zeroRatio - The bridge ratio of the zero reading, if any.
 * @param offsetRatio - An offset of the curve, V/V (0 nominally; the budget varies it).
 */
export function calibratedKindMap(
  base: KindMap,
  section: CalibrationSection,
  dimension: Dimension,
  zeroRatio: number | undefined,
  offsetRatio: number,
): KindMap {
  const c = section.coefficients;
  const unit = section.unit;
  const shift = (zeroRatio === undefined ? 0 : zeroRatio - (c[0] as number)) + offsetRatio;
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
