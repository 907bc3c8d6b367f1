/**
 * The polynomial of a calibration against reference loads, r = P(q) = c0 + c1·q + c2·q² + c3·q³
 * (bridge ratio against the quantity), and whether it can serve as a channel's map (monotone over
 * the span it converts). Used by the schema's check and by the calibrated map.
 */
import { formatValue, type ErrorCode, type Interval } from '@bridgework/core';

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

export const horner = (c: readonly number[], q: number): number => {
  let s = 0;
  for (let k = c.length - 1; k >= 0; k--) s = s * q + (c[k] as number);
  return s;
};
export const slope = (c: readonly number[], q: number): number => {
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
