/**
 * A private 40-digit decimal.js for reference computations. Inputs are converted from their exact
 * double values (`exactDecimalString`), never from their shortest printed form.
 */
import { Decimal } from 'decimal.js';
import { exactDecimalString } from '@bridgework/core';

export const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
export type Dec = InstanceType<typeof D>;

/** The exact value of a double as a 40-digit decimal. */
export const X = (x: number): Dec => new D(exactDecimalString(x));

/** The 40-digit value of π. */
export const PI = D.acos(-1);

/**
 * Root of an increasing function on [lo, hi] by bisection in decimal arithmetic, to `digits`
 * significant digits of the bracket width relative to 1 (an independent, slow, sure method).
 */
export function bisect(f: (x: Dec) => Dec, lo: Dec, hi: Dec, iterations = 140): Dec {
  let a = lo;
  let b = hi;
  for (let i = 0; i < iterations; i++) {
    const m = a.plus(b).div(2);
    if (f(m).isNegative()) a = m;
    else b = m;
  }
  return a.plus(b).div(2);
}
