import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exactDecimalString } from '@bridgework/core';
import { portableExp, portableExpm1, portableLog } from '../src/internal/portableMath.js';

// Reference: decimal.js at 40 significant digits, from the doubles' exact values.
const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
const X = (x: number) => new D(exactDecimalString(x));

describe('portableLog', () => {
  it('is within 2 ulps of the exact ln x over the whole range of doubles (decimal.js, 40 digits)', () => {
    const anyPositive = fc.double({ min: 5e-324, max: Number.MAX_VALUE, noNaN: true });
    const nearOne = fc.double({ min: 0.5, max: 2, noNaN: true });
    fc.assert(
      fc.property(fc.oneof(anyPositive, nearOne), (x) => {
        expect(portableLog(x)).toBeNear(X(x).ln().toNumber(), { ulps: 2 });
      }),
      { numRuns: 400 },
    );
  });

  it('gives the special values: ln 1 = 0, −∞ at 0, NaN below 0, ∞ at ∞', () => {
    expect(portableLog(1)).toBe(0);
    expect(portableLog(0)).toBe(-Infinity);
    expect(portableLog(-1)).toBeNaN();
    expect(portableLog(NaN)).toBeNaN();
    expect(portableLog(Infinity)).toBe(Infinity);
    expect(portableLog(2)).toBeNear(Math.LN2, { ulps: 1 });
  });
});

describe('portableExp and portableExpm1', () => {
  it('portableExp is within 2 ulps of the exact eˣ from underflow to overflow (decimal.js, 40 digits)', () => {
    fc.assert(
      fc.property(fc.double({ min: -708, max: 709.7, noNaN: true }), (x) => {
        expect(portableExp(x)).toBeNear(X(x).exp().toNumber(), { ulps: 2 });
      }),
      { numRuns: 400 },
    );
  });

  it('portableExp gives the special values and the subnormal range', () => {
    expect(portableExp(0)).toBe(1);
    expect(portableExp(-Infinity)).toBe(0);
    expect(portableExp(Infinity)).toBe(Infinity);
    expect(portableExp(710)).toBe(Infinity);
    expect(portableExp(-746)).toBe(0);
    // e^−740 ≈ 4.2e−322 is subnormal: compared absolutely, to 2 units of the smallest subnormal.
    expect(portableExp(-740)).toBeNear(X(-740).exp().toNumber(), { abs: 1e-323 });
  });

  it('portableExpm1 is within 2 ulps of eˣ − 1, including tiny x where eˣ − 1 would cancel', () => {
    const small = fc.double({ min: -0.5, max: 0.5, noNaN: true }).filter((x) => x !== 0);
    fc.assert(
      fc.property(fc.oneof(small, fc.double({ min: -30, max: 30, noNaN: true })), (x) => {
        // Below 1e-5 the reference is the series x + x²/2 + x³/6 (the rest is under 1e-21 relative),
        // since exp(x) − 1 at 40 digits would itself cancel.
        const r = X(x);
        const exact = Math.abs(x) < 1e-5 ? r.plus(r.pow(2).div(2)).plus(r.pow(3).div(6)) : r.exp().minus(1);
        expect(portableExpm1(x)).toBeNear(exact.toNumber(), { ulps: 2 });
      }),
      { numRuns: 400 },
    );
    expect(portableExpm1(1e-300)).toBe(1e-300);
  });
});
