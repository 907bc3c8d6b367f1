// The CSV writer's number text (packages/cli/src/data/numberText.ts) against references outside
// it: ECMAScript's own Number::toString for the shortest round-trip form, and decimal.js at full
// precision over the double's exact value (core's exactDecimalString) for the correctly rounded
// form with a stated number of digits.
import { exactDecimalString } from '@bridgework/core';
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { numberTextPaths, writeDigits, writeShortest } from '../src/data/numberText.js';

const buffer = new Uint8Array(40);
const decoder = new TextDecoder();
const shortest = (v: number): string => decoder.decode(buffer.subarray(0, writeShortest(v, buffer, 0)));
const digits = (v: number, d: number): string =>
  decoder.decode(buffer.subarray(0, writeDigits(v, d, buffer, 0)));

// Exponent form outside 1e-7 ≤ |x| < 1e21, as Number::toString (ECMA-262 §6.1.6.1.20) lays it out.
const D = Decimal.clone({ precision: 1200, toExpNeg: -7, toExpPos: 21 });
/** Reference: the double's exact value rounded to d significant digits, ties to even (IEEE 754-2008 §5.12.2). */
function referenceDigits(v: number, d: number): string {
  if (v === 0) return '0';
  return new D(exactDecimalString(v)).toSignificantDigits(d, Decimal.ROUND_HALF_EVEN).toString();
}

/** Doubles from their 64 bits: every exponent, subnormals included (no NaN or ±∞). */
const anyFinite = fc
  .tuple(fc.integer({ min: 0, max: 0xffffffff }), fc.integer({ min: 0, max: 0xffffffff }))
  .map(([hi, lo]) => {
    const f = new Float64Array(1);
    const u = new Uint32Array(f.buffer);
    u[0] = lo;
    u[1] = hi;
    return f[0] as number;
  })
  .filter((v) => Number.isFinite(v));
/** Values as loggers and converted channels produce them: a few digits at a typical magnitude. */
const measured = fc
  .tuple(fc.integer({ min: -99_999_999, max: 99_999_999 }), fc.integer({ min: -12, max: 6 }))
  .map(([m, k]) => m * 10 ** k);
/** float32 values widened to double (the raw float32 input path). */
const widened = fc.float({ noNaN: true, noDefaultInfinity: true }).map((x) => x);

const edges = [
  0,
  -0,
  1,
  -1,
  0.1,
  0.2,
  0.3,
  0.1 + 0.2,
  2.5,
  1.5,
  0.5,
  0.125,
  9.5,
  99.95,
  4.35,
  -2.675,
  1e21,
  1e-7,
  1e-6,
  9.999999e20,
  999999999999999900000,
  123456789012345680000,
  1e22,
  1e23,
  5e-324,
  2 ** -1074 * 3,
  2 ** -1022,
  2 ** -1022 - 2 ** -1074,
  1.7976931348623157e308,
  2 ** 53,
  2 ** 53 + 2,
  2 ** 60,
  2 ** -60,
  2 ** 1023,
  1e300,
  1e-300,
  1e280,
  1e-280,
  4e280,
  1.5e308,
  9007199254740993,
  0.000001234,
  123456.789,
  Math.PI,
  Math.E,
  1 / 3,
  2 / 3,
  1e16,
  1e17,
  99999999999999999,
  9999999999999998,
  12345678901234567890,
];

describe('writeShortest', () => {
  it('is String(v) for every double (property over 64-bit patterns, measured values and float32 values)', () => {
    // Reference: ECMAScript Number::toString (ECMA-262 §6.1.6.1.20), the shortest round trip.
    for (const arb of [anyFinite, measured, widened]) {
      fc.assert(
        fc.property(arb, (v) => {
          expect(shortest(v)).toBe(String(v));
        }),
        { numRuns: 10_000 },
      );
    }
  });

  it('is String(v) at the edges: powers of two and ten, subnormals, notation thresholds, NaN and ±∞', () => {
    for (const v of [...edges, ...edges.map((x) => -x), NaN, Infinity, -Infinity]) {
      expect(shortest(v), String(v)).toBe(String(v));
    }
    for (let k = -1074; k <= 1023; k++) expect(shortest(2 ** k), `2^${k}`).toBe(String(2 ** k));
    for (let k = -323; k <= 308; k++) {
      const v = Number(`1e${k}`);
      for (const w of [v, v * (1 + Number.EPSILON), v * (1 - Number.EPSILON / 2)]) {
        expect(shortest(w), String(w)).toBe(String(w));
      }
    }
  });

  it('fast and exact paths agree wherever the fast path decides', () => {
    let decided = 0;
    fc.assert(
      fc.property(fc.oneof(anyFinite, measured), (v) => {
        if (v === 0) return;
        const fast = numberTextPaths.fast(v, 0);
        expect(numberTextPaths.exact(v, 0)).toBe(String(v));
        if (fast !== undefined) {
          decided++;
          expect(fast).toBe(String(v));
        }
      }),
      { numRuns: 5_000 },
    );
    // The fast path must carry the load (it defers only near a decision's threshold).
    expect(decided).toBeGreaterThan(4_000);
    // Powers of ten (the exponent threshold met with equality, or by the double nearest 10^-k)
    // are decided, not deferred.
    for (let k = 1; k <= 19; k++) {
      for (const v of [Number(`1e${k}`), Number(`1e-${k}`), 3 * Number(`1e${k}`)]) {
        expect(numberTextPaths.fast(v, 0), String(v)).toBe(String(v));
        expect(numberTextPaths.fast(v, 9), String(v)).toBe(referenceDigits(v, 9));
      }
    }
    // 1e20 scaled by the inexact 10^-4 lands within the product's error of 10^16 (its 17-digit
    // integer part can come out as 10^16 − 1): the fast path defers, the exact path decides.
    expect(numberTextPaths.fast(1e20, 0)).toBeUndefined();
    expect(shortest(1e20)).toBe('100000000000000000000');
    expect(digits(1e20, 9)).toBe(referenceDigits(1e20, 9));
  });
  it('the branch-free and the careful decisions each equal String(v) wherever they decide, and defer near thresholds', () => {
    let branchless = 0;
    let careful = 0;
    for (const arb of [anyFinite, measured, widened]) {
      fc.assert(
        fc.property(arb, (v) => {
          if (v === 0 || !Number.isFinite(v)) return;
          const b = numberTextPaths.branchless(v);
          const c = numberTextPaths.careful(v);
          if (b !== undefined) {
            branchless++;
            expect(b, String(v)).toBe(String(v));
          }
          if (c !== undefined) {
            careful++;
            expect(c, String(v)).toBe(String(v));
          }
        }),
        { numRuns: 4_000 },
      );
    }
    // Both carry the values of a practical magnitude (anyFinite's are mostly outside the range).
    expect(branchless).toBeGreaterThan(6_000);
    expect(careful).toBeGreaterThan(6_000);
    // Exact ties at the 17th digit, a shorter decimal exactly half an ulp away, and near-ties:
    // the branch-free decisions defer them to the careful ones (each checked against String(v)).
    const nearThresholds = [
      1e23, 1000000000000000.5, 3000000000000000.5, 3860228252031853.5, 30881826016254828, 61763652032509656,
      1125899906842625, 1125899906842623.8, 965057063007963.4,
    ];
    for (const v of nearThresholds) {
      expect(numberTextPaths.branchless(v), String(v)).toBeUndefined();
      expect(shortest(v)).toBe(String(v));
      expect(shortest(-v)).toBe(String(-v));
      const c = numberTextPaths.careful(v);
      if (c !== undefined) expect(c).toBe(String(v));
    }
  });
});

describe('writeDigits', () => {
  it('is the exact value correctly rounded to d digits, ties to even (decimal.js reference, property)', () => {
    for (const arb of [anyFinite, measured, widened]) {
      fc.assert(
        fc.property(arb, fc.integer({ min: 1, max: 17 }), (v, d) => {
          expect(digits(v, d)).toBe(referenceDigits(v, d));
        }),
        { numRuns: 4_000 },
      );
    }
  });

  it('rounds exact ties to even, carries into the next power of ten, and never writes Infinity for a finite value', () => {
    for (const v of [...edges, ...edges.map((x) => -x)]) {
      for (let d = 1; d <= 17; d++) expect(digits(v, d), `${v} to ${d}`).toBe(referenceDigits(v, d));
    }
    // Ties (the double is exactly halfway): IEEE 754's default rounding keeps the even digit.
    expect(digits(2.5, 1)).toBe('2');
    expect(digits(3.5, 1)).toBe('4');
    expect(digits(0.125, 2)).toBe('0.12');
    expect(digits(-1054994633229674.5, 16)).toBe('-1054994633229674');
    expect(digits(9.5, 1)).toBe('10');
    expect(digits(1.5e308, 1)).toBe('2e+308');
    expect(digits(NaN, 3)).toBe('NaN');
    // The non-finite values and both zeros as String(v) writes them.
    expect([Infinity, -Infinity, 0, -0].map((v) => digits(v, 6))).toEqual([
      'Infinity',
      '-Infinity',
      '0',
      '0',
    ]);
  });

  it('the short path (one correctly rounded scaling, up to 12 digits) equals decimal.js wherever it decides', () => {
    let decided = 0;
    let tried = 0;
    for (const arb of [anyFinite, measured, widened]) {
      fc.assert(
        fc.property(arb, fc.integer({ min: 1, max: 12 }), (v, d) => {
          const lean = numberTextPaths.lean(v, d);
          if (v === 0 || !Number.isFinite(v)) return;
          tried++;
          if (lean !== undefined) {
            decided++;
            expect(lean, `${v} to ${d}`).toBe(referenceDigits(v, d));
          }
        }),
        { numRuns: 4_000 },
      );
    }
    // It decides every value of a practical magnitude (1e-13 to 1e21) but near-ties; anyFinite's
    // values are mostly far outside, measured and float32 values mostly inside.
    expect(decided).toBeGreaterThan(tried / 3);
  });

  it('the short path decides measured values at 6 and 9 digits, and defers exact ties and far exponents', () => {
    const rng = fc.sample(measured, { numRuns: 2_000, seed: 17 });
    for (const d of [6, 9]) {
      const undecided = rng.filter((v) => v !== 0 && numberTextPaths.lean(v, d) === undefined);
      expect(undecided.length, `${d} digits: ${undecided.slice(0, 5).join(', ')}`).toBeLessThan(100);
    }
    expect(numberTextPaths.lean(2.5, 1)).toBeUndefined(); // a tie: the exact path rounds it to even
    expect(numberTextPaths.lean(0.125, 2)).toBeUndefined();
    expect(numberTextPaths.lean(1e300, 6)).toBeUndefined(); // 10^j not an exact double
    expect(numberTextPaths.lean(5e-324, 6)).toBeUndefined();
    expect(numberTextPaths.lean(9.9999996, 6)).toBe('10'); // carries into the next power of ten
    expect(numberTextPaths.lean(-0.000123456789, 4)).toBe('-0.0001235');
  });

  it('the decimal exponent estimate ⌊be·log10 2⌋ is exact for every binary exponent (BigInt check)', () => {
    for (let be = -1022; be <= 1023; be++) {
      const e = Math.floor(be * 0.3010299956639812);
      // 10^e ≤ 2^be < 10^(e+1), compared exactly.
      const two = be >= 0 ? [2n ** BigInt(be), 1n] : [1n, 2n ** BigInt(-be)];
      const ten = (k: number) => (k >= 0 ? [10n ** BigInt(k), 1n] : [1n, 10n ** BigInt(-k)]);
      const le = (x: bigint[], y: bigint[]) => x[0]! * y[1]! <= y[0]! * x[1]!;
      const lt = (x: bigint[], y: bigint[]) => x[0]! * y[1]! < y[0]! * x[1]!;
      expect(le(ten(e), two) && lt(two, ten(e + 1)), `be = ${be}`).toBe(true);
    }
  });

  it('the power-of-ten thresholds are the least doubles ≥ 10^k (decimal.js reference, every k)', () => {
    // The decimal exponent of a is e or e + 1 (e = ⌊be·log10 2⌋); a ≥ ceilPow10(e + 1) decides it.
    const f = new Float64Array(1);
    const u = new BigUint64Array(f.buffer);
    for (let k = -300; k <= 300; k++) {
      const c = numberTextPaths.ceilPow10(k);
      f[0] = c;
      u[0] = (u[0] as bigint) - 1n;
      const below = f[0] as number; // the double just below c
      const ten = new D(10).pow(k);
      expect(new D(exactDecimalString(c)).gte(ten), `10^${k} ≤ ${c}`).toBe(true);
      expect(new D(exactDecimalString(below)).lt(ten), `${below} < 10^${k}`).toBe(true);
    }
  });

  it("the decimal exponent (per-exponent-bits table and threshold) is decimal.js's, at powers of ten, their neighbours and random values", () => {
    const f = new Float64Array(1);
    const u = new BigUint64Array(f.buffer);
    const values: number[] = [];
    for (let k = -279; k <= 279; k++) {
      const ten = Number(`1e${k}`);
      for (const step of [0n, 1n, -1n, 7n, -7n]) {
        f[0] = ten;
        u[0] = (u[0] as bigint) + step;
        values.push(f[0] as number);
      }
    }
    values.push(...fc.sample(anyFinite, { numRuns: 3_000, seed: 5 }).map(Math.abs));
    let checked = 0;
    for (const v of values) {
      // The fast paths' range: biased exponent bits 93 to 1953.
      f[0] = v;
      const ebits = Number(((u[0] as bigint) >> 52n) & 0x7ffn);
      if (ebits < 93 || ebits > 1953) continue;
      checked++;
      expect(numberTextPaths.decimalExponent(v), String(v)).toBe(new D(exactDecimalString(v)).e);
    }
    expect(checked).toBeGreaterThan(3_500);
  });

  it('the short path at powers of ten and their neighbours: the exponent step and the carry (decimal.js reference)', () => {
    let decided = 0;
    const f = new Float64Array(1);
    const u = new BigUint64Array(f.buffer);
    for (let k = -22; k <= 30; k++) {
      const ten = Number(`1e${k}`);
      f[0] = ten;
      const neighbours = [ten];
      for (const step of [1n, 2n, 1000n]) {
        f[0] = ten;
        u[0] = (u[0] as bigint) + step;
        neighbours.push(f[0] as number);
        f[0] = ten;
        u[0] = (u[0] as bigint) - step;
        neighbours.push(f[0] as number);
      }
      for (const v of neighbours) {
        for (let d = 1; d <= 12; d++) {
          const lean = numberTextPaths.lean(v, d);
          if (lean === undefined) continue;
          decided++;
          expect(lean, `${v} to ${d}`).toBe(referenceDigits(v, d));
          expect(digits(-v, d), `${-v} to ${d}`).toBe(referenceDigits(-v, d));
        }
      }
    }
    // Below a power of ten by a few ulps, every digit count rounds up to it (the carry).
    expect(numberTextPaths.lean(99999.99999999999, 6)).toBe('100000');
    expect(decided).toBeGreaterThan(3_000);
  });

  it('reads back within half a unit in the d-th digit, and at 17 digits as the same double', () => {
    fc.assert(
      fc.property(anyFinite, fc.integer({ min: 1, max: 17 }), (v, d) => {
        const text = digits(v, d);
        if (d === 17) expect(Number(text)).toBe(v);
        const error = new D(text).minus(new D(exactDecimalString(v))).abs();
        const halfUnit = new D(10).pow(new D(exactDecimalString(Math.abs(v) || 1)).e - d + 1).div(2);
        expect(error.lte(halfUnit)).toBe(true);
      }),
      { numRuns: 3_000 },
    );
  });
});
