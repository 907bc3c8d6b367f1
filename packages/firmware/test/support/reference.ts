/**
 * Independent references for the firmware tests, in decimal.js at 60 significant digits (a private
 * clone): the exact fixed-point output by decimal.js's own rounding modes, and the exact map.
 */
import { Decimal } from 'decimal.js';
import type { FixedPointMap, FixedPointRounding } from '@bridgework/firmware';

export const D = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN });

/** decimal.js's rounding modes for the firmware rules (ROUND_HALF_UP is halves away from zero). */
export const decimalRounding: Record<FixedPointRounding, Decimal.Rounding> = {
  'half-even': Decimal.ROUND_HALF_EVEN,
  'half-away': Decimal.ROUND_HALF_UP,
  floor: Decimal.ROUND_FLOOR,
};

/** A decimal or ratio string (the ExactValue grammar) as a 60-digit Decimal. */
export function decimalOf(value: string): Decimal {
  const [n, d] = value.split('/');
  return d === undefined ? new D(n as string) : new D(n as string).div(new D(d));
}

/** The firmware's output at a code, recomputed from the constants with decimal.js rounding. */
export function referenceOutput(map: FixedPointMap, code: number): Decimal {
  const acc = new D(code).minus(map.offsetCode).times(map.multiplier).plus(map.bias);
  return acc.div(new D(2).pow(map.shift)).toDecimalPlaces(0, decimalRounding[map.rounding]);
}

/** {@link referenceOutput} as a number (a decimal.js −0 becomes 0: outputs are integers). */
export function referenceOutputNumber(map: FixedPointMap, code: number): number {
  const y = referenceOutput(map, code).toNumber();
  return y === 0 ? 0 : y;
}

/** The exact target (code − offset)·scale/outputUnit in output LSB. */
export function referenceTarget(scale: string, offset: string, outputUnit: string, code: number): Decimal {
  return new D(code).minus(decimalOf(offset)).times(decimalOf(scale)).div(decimalOf(outputUnit));
}
