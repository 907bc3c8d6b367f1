import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exactDecimalString } from '@bridgework/core';
import { BINARY32, BINARY64, roundToBinary } from '../src/internal/binary.js';
import { exactRational } from '../src/internal/exact.js';
import { rat, type Rational } from '../src/internal/rational.js';

const D = Decimal.clone({ precision: 80, rounding: Decimal.ROUND_HALF_EVEN });
const Wide = Decimal.clone({ precision: 1200, rounding: Decimal.ROUND_HALF_EVEN });
const asDecimal = (r: Rational) => new D(r.n.toString()).div(r.d.toString());

describe('ExactValue reading', () => {
  it('reads decimals, ratios, bigints and doubles exactly', () => {
    expect(exactRational('x', '0.1')).toEqual(rat(1n, 10n));
    expect(exactRational('x', '-2.5e-3')).toEqual(rat(-1n, 400n));
    expect(exactRational('x', '.5')).toEqual(rat(1n, 2n));
    expect(exactRational('x', '30/2134169.2493824')).toEqual(rat(300000000n, 21341692493824n));
    expect(exactRational('x', ' 3 / 4 ')).toEqual(rat(3n, 4n));
    expect(exactRational('x', 12345678901234567890n)).toEqual(rat(12345678901234567890n));
    // The double 0.1 is 3602879701896397 / 2^55 exactly (from its bits), not one tenth.
    expect(exactRational('x', 0.1)).toEqual(rat(3602879701896397n, 1n << 55n));
  });

  it('agrees with decimal.js on random decimal numerals (property)', () => {
    const numeral = fc
      .tuple(fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n }), fc.integer({ min: -60, max: 60 }))
      .map(([m, e]) => `${m}e${e}`);
    fc.assert(
      fc.property(numeral, (text) => {
        expect(asDecimal(exactRational('x', text)).equals(new D(text))).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it('reads doubles through their exact decimal expansion (property)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        // Subnormals have some 750 significant digits: compare at 1200.
        const r = exactRational('x', x);
        expect(new Wide(r.n.toString()).div(r.d.toString()).equals(new Wide(exactDecimalString(x)))).toBe(
          true,
        );
      }),
      { numRuns: 500 },
    );
  });

  it('rejects bad values with specific codes', () => {
    expect(() => exactRational('scale', 'abc')).toThrowBridgeworkError('parse-error', { param: 'scale' });
    expect(() => exactRational('scale', '1/2/3')).toThrowBridgeworkError('parse-error', { param: 'scale' });
    expect(() => exactRational('scale', '')).toThrowBridgeworkError('parse-error', { param: 'scale' });
    expect(() => exactRational('scale', '1e')).toThrowBridgeworkError('parse-error', { param: 'scale' });
    expect(() => exactRational('scale', '1/0')).toThrowBridgeworkError('not-finite', { param: 'scale' });
    expect(() => exactRational('scale', '1e5000')).toThrowBridgeworkError('out-of-range', { param: 'scale' });
    expect(() => exactRational('scale', Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'scale' });
    expect(() => exactRational('scale', -Infinity)).toThrowBridgeworkError('not-finite', { param: 'scale' });
    expect(() => exactRational('scale', {})).toThrowBridgeworkError('wrong-type', { param: 'scale' });
    expect(() => exactRational('scale', null)).toThrowBridgeworkError('wrong-type', { param: 'scale' });
  });
});

// Neighbours of a binary32 value, from its bit pattern (an independent construction).
const f32 = new Float32Array(1);
const u32 = new Uint32Array(f32.buffer);
function nextFloat32(x: number, up: boolean): number {
  f32[0] = x;
  if (x === 0) return up ? 2 ** -149 : -(2 ** -149);
  u32[0] = (u32[0] as number) + (x > 0 === up ? 1 : -1);
  return f32[0] as number;
}

describe('roundToBinary', () => {
  const rational = fc
    .tuple(
      fc.bigInt({ min: -(10n ** 40n), max: 10n ** 40n }),
      fc.bigInt({ min: 1n, max: 10n ** 40n }),
      fc.integer({ min: -200, max: 200 }),
    )
    .filter(([n]) => n !== 0n)
    .map(([n, d, e]) => (e >= 0 ? rat(n * 2n ** BigInt(e), d) : rat(n, d * 2n ** BigInt(-e))));

  it('rounds to binary64 as JavaScript parses a decimal (a correctly rounded conversion)', () => {
    // An exactly representable decimal expansion: n/2^k has a terminating decimal expansion.
    const dyadic = fc
      .tuple(fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n }), fc.integer({ min: 0, max: 300 }))
      .map(([n, k]) => rat(n, 2n ** BigInt(k)));
    fc.assert(
      fc.property(dyadic, (r) => {
        // Exact: n/2^k (|n| < 2^100, k ≤ 300) has at most about 400 significant digits, within
        // Wide's 1200 (decimal.js's default 20 digits rounded the text and, near a binary64 tie,
        // the double read from it: seed 897218323).
        const text = new Wide(r.n.toString())
          .div(new Wide(2).pow(Number(r.d.toString(2).length - 1)))
          .toFixed();
        expect(roundToBinary(r, BINARY64)).toBe(Number(text));
      }),
      { numRuns: 300 },
    );
  });

  it('gives the nearest binary32, ties to even, checked against both neighbours exactly', () => {
    fc.assert(
      fc.property(rational, (r) => {
        const x = roundToBinary(r, BINARY32);
        const value = new Wide(r.n.toString()).div(r.d.toString());
        if (!Number.isFinite(x)) {
          // Beyond the largest binary32 plus half its ulp, (2 − 2^-24)·2^127, round-to-nearest overflows.
          expect(
            value.abs().greaterThanOrEqualTo(new D(2).minus(new D(2).pow(-24)).times(new D(2).pow(127))),
          ).toBe(true);
          return;
        }
        expect(Math.fround(x)).toBe(x);
        const dist = (y: number) => value.minus(new Wide(exactDecimalString(y))).abs();
        const here = dist(x);
        for (const y of [nextFloat32(x, true), nextFloat32(x, false)]) {
          if (Number.isFinite(y)) expect(here.lessThanOrEqualTo(dist(y))).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
    // Ties: 1 + 2^-24 lies halfway between 1 and 1 + 2^-23 and goes to the even 1.
    expect(roundToBinary(rat((1n << 24n) + 1n, 1n << 24n), BINARY32)).toBe(1);
    expect(roundToBinary(rat((1n << 24n) + 3n, 1n << 24n), BINARY32)).toBe(1 + 2 ** -22);
    // Subnormals and the overflow threshold.
    expect(roundToBinary(rat(3n, 1n << 150n), BINARY32)).toBe(2 ** -148); // 1.5 · 2^-149 → even 2 · 2^-149
    expect(roundToBinary(rat(1n << 128n), BINARY32)).toBe(Infinity);
    expect(roundToBinary(rat(-(1n << 128n)), BINARY32)).toBe(-Infinity);
  });

  it('rounds upward and downward around the exact value', () => {
    fc.assert(
      fc.property(rational, (r) => {
        const up = roundToBinary(r, BINARY64, 'up');
        const down = roundToBinary(r, BINARY64, 'down');
        // Compared at 1200 digits, beyond the longest exact expansion of a double.
        const value = new Wide(r.n.toString()).div(r.d.toString());
        expect(new Wide(exactDecimalString(up)).greaterThanOrEqualTo(value)).toBe(true);
        expect(new Wide(exactDecimalString(down)).lessThanOrEqualTo(value)).toBe(true);
        expect(up === down || up === nextAfter(down)).toBe(true);
      }),
      { numRuns: 200 },
    );
  });
});

const f64 = new Float64Array(1);
const i64 = new BigInt64Array(f64.buffer);
/** The next double above x (x finite, not the largest). */
function nextAfter(x: number): number {
  if (x === 0) return 2 ** -1074;
  f64[0] = x;
  i64[0] = (i64[0] as bigint) + (x > 0 ? 1n : -1n);
  return f64[0] as number;
}
