import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { differenceOfProducts, exactDecimalString, twoProduct } from '@bridgework/core';

// Reference: decimal.js at 60 significant digits (a private clone; global state untouched).
const D = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN });
/** The double's exact value as a Decimal. */
const X = (x: number) => new D(exactDecimalString(x));

const factor = fc.double({ min: 1e-3, max: 1e6, noNaN: true });

describe('twoProduct', () => {
  it('is error-free: p + e equals the exact product (decimal.js, 60 digits)', () => {
    fc.assert(
      fc.property(factor, factor, (a, b) => {
        const [p, e] = twoProduct(a, b);
        const exact = X(a).times(X(b));
        expect(X(p).plus(X(e)).equals(exact)).toBe(true);
        expect(p).toBe(a * b);
      }),
      { numRuns: 2000 },
    );
  });
});

describe('differenceOfProducts', () => {
  it('is within 1 ulp of the exact a·b − c·d, even for nearly balanced bridges', () => {
    // Nearly balanced arms: c and d differ from a and b in the last few digits.
    const nearly = fc
      .tuple(factor, factor, fc.integer({ min: -1000, max: 1000 }), fc.integer({ min: -1000, max: 1000 }))
      .map(([a, b, i, j]) => [a, b, a * (1 + i * 2 ** -40), b * (1 + j * 2 ** -40)] as const);
    fc.assert(
      fc.property(fc.oneof(nearly, fc.tuple(factor, factor, factor, factor)), ([a, b, c, d]) => {
        const exact = X(a)
          .times(X(b))
          .minus(X(c).times(X(d)))
          .toNumber();
        expect(differenceOfProducts(a, b, c, d)).toBeNear(exact, { ulps: 1 });
      }),
      { numRuns: 3000 },
    );
  });

  it('gives exactly 0 for equal products, where the plain formula already does', () => {
    expect(differenceOfProducts(100, 400, 200, 200)).toBe(0);
    expect(differenceOfProducts(350, 350, 350, 350)).toBe(0);
  });

  it('beats the plain formula when products nearly cancel', () => {
    // R1·R3 − R2·R4 for 350.0000001/350/350/350 Ω: exact value 3.5e-5 minus the representation error.
    const a = 350.0000001;
    const exact = X(a).times(350).minus(X(350).times(350)).toNumber();
    expect(differenceOfProducts(a, 350, 350, 350)).toBeNear(exact, { ulps: 1 });
  });
});

describe('exactDecimalString', () => {
  it('gives the exact binary value, not the shortest string', () => {
    // 0.1 as a double is 3602879701896397 / 2^55 exactly.
    expect(exactDecimalString(0.1)).toBe('0.1000000000000000055511151231257827021181583404541015625');
    expect(exactDecimalString(-2.5)).toBe('-2.5');
    expect(exactDecimalString(2 ** 60)).toBe('1152921504606846976');
    expect(exactDecimalString(0)).toBe('0');
    expect(exactDecimalString(-0)).toBe('-0');
    expect(exactDecimalString(5e-324)).toMatch(/^0\.0{323}49406564584124654/);
  });

  it('round-trips every double through decimal.js', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        expect(new D(exactDecimalString(x)).toNumber()).toBe(x);
      }),
      { numRuns: 3000 },
    );
  });

  it('rejects NaN and infinities', () => {
    expect(() => exactDecimalString(Number.NaN)).toThrowBridgeworkError('not-finite');
    expect(() => exactDecimalString(Infinity)).toThrowBridgeworkError('not-finite');
  });
});
