import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixedPointRoundings, roundShift, type FixedPointRounding } from '@bridgework/firmware';

// Independent reference: decimal.js dividing exactly by 2^s and rounding to an integer with its own
// rounding modes (ROUND_HALF_UP is "halves away from zero" in decimal.js; ROUND_FLOOR toward −∞).
const D = Decimal.clone({ precision: 200, rounding: Decimal.ROUND_HALF_EVEN });
const modes: Record<FixedPointRounding, Decimal.Rounding> = {
  'half-even': Decimal.ROUND_HALF_EVEN,
  'half-away': Decimal.ROUND_HALF_UP,
  floor: Decimal.ROUND_FLOOR,
};
function reference(n: bigint, shift: number, rounding: FixedPointRounding): bigint {
  const q = new D(n.toString()).div(new D(2).pow(shift));
  return BigInt(q.toDecimalPlaces(0, modes[rounding]).toFixed(0));
}

describe('roundShift', () => {
  it('rounds exact halves by each rule, on both sides of zero', () => {
    // n/2 for n = ±5, ±7: the halves ±2.5 and ±3.5.
    expect([5n, 7n, -5n, -7n].map((n) => roundShift(n, 1, 'half-even'))).toEqual([2n, 4n, -2n, -4n]);
    expect([5n, 7n, -5n, -7n].map((n) => roundShift(n, 1, 'half-away'))).toEqual([3n, 4n, -3n, -4n]);
    expect([5n, 7n, -5n, -7n].map((n) => roundShift(n, 1, 'floor'))).toEqual([2n, 3n, -3n, -4n]);
    // Not Math.round, which sends −2.5 to −2 and 2.5 to 3.
    expect(roundShift(-5n, 1, 'half-away')).not.toBe(BigInt(Math.round(-2.5)));
  });

  it('leaves values unchanged at shift 0 and handles values far beyond 2^64', () => {
    for (const r of fixedPointRoundings) expect(roundShift(-123456789n, 0, r)).toBe(-123456789n);
    const big = (1n << 100n) + (1n << 19n); // an exact half at shift 20
    expect(roundShift(big, 20, 'half-even')).toBe(1n << 80n);
    expect(roundShift(big, 20, 'half-away')).toBe((1n << 80n) + 1n);
    expect(roundShift(-big, 20, 'floor')).toBe(-(1n << 80n) - 1n);
  });

  it('equals decimal.js rounding of n / 2^s for every rule (property, 3 × 800 cases)', () => {
    const n = fc.bigInt({ min: -(1n << 80n), max: 1n << 80n });
    // Bias towards exact halves and near-halves, where the rules differ.
    const tieish = fc
      .tuple(
        fc.bigInt({ min: -(1n << 40n), max: 1n << 40n }),
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: -1, max: 1 }),
      )
      .map(([k, s, e]) => [(2n * k + 1n) * (1n << BigInt(s - 1)) + BigInt(e), s] as const);
    const plain = fc.tuple(n, fc.integer({ min: 0, max: 90 }));
    for (const rounding of fixedPointRoundings) {
      fc.assert(
        fc.property(fc.oneof(tieish, plain), ([value, shift]) => {
          expect(roundShift(value, shift, rounding)).toBe(reference(value, shift, rounding));
        }),
        { numRuns: 800 },
      );
    }
  });

  it('rejects bad input with specific codes', () => {
    expect(() => roundShift(5 as unknown as bigint, 1, 'floor')).toThrowBridgeworkError('wrong-type', {
      param: 'n',
    });
    expect(() => roundShift(5n, -1, 'floor')).toThrowBridgeworkError('out-of-range', { param: 'shift' });
    expect(() => roundShift(5n, 127, 'floor')).toThrowBridgeworkError('out-of-range', { param: 'shift' });
    expect(() => roundShift(5n, 1.5, 'floor')).toThrowBridgeworkError('not-integer', { param: 'shift' });
    expect(() => roundShift(5n, Number.NaN, 'floor')).toThrowBridgeworkError('not-finite', {
      param: 'shift',
    });
    expect(() => roundShift(5n, 1, 'nearest' as FixedPointRounding)).toThrowBridgeworkError(
      'invalid-option',
      {
        param: 'rounding',
      },
    );
  });
});
