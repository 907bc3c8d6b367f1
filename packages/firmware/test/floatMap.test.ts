import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exactDecimalString } from '@bridgework/core';
import { floatMap, type FloatMap, type FloatMapOptions, type FloatPrecision } from '@bridgework/firmware';
import { D, decimalOf } from './support/reference.js';

// Independent emulation: every operation stored into a Float32Array (a different rounding path from
// the library's Math.fround), or plain doubles.
const cell = new Float32Array(1);
function to32(x: number): number {
  cell[0] = x;
  return cell[0] as number;
}
function emulate(map: FloatMap, code: number): number {
  const r = map.precision === 'float32' ? to32 : (x: number) => x;
  const x = r(r(code) - map.offset);
  if (map.kind === 'affine') return r(x * map.scale);
  const c = map.coefficients;
  let y = c[c.length - 1] as number;
  for (let k = c.length - 2; k >= 0; k--) y = r(r(y * x) + (c[k] as number));
  return y;
}

/** The exact map Σ a_k (code − offset)^k in decimal.js (60 digits). */
function exactMap(coefficients: readonly string[], offset: string, code: number): Decimal {
  const t = new D(code).minus(decimalOf(offset));
  return coefficients.reduceRight((acc, a) => acc.times(t).plus(decimalOf(a)), new D(0));
}
const exactOf = (x: number) => new D(exactDecimalString(x));

const FULL_24 = { codeMin: -(2 ** 23), codeMax: 2 ** 23 - 1 } as const;

describe('floatMap: the 50 kg cell, exhaustively', () => {
  // scale = 50 kg / (0.002 · 2^30) = 25000 · 2^-30 kg per code = 3125 · 2^-27: exact in both formats.
  it('float32 over all 2^24 codes: the only error is the final rounding, half an ulp of 195 kg, 2^-17 kg', () => {
    const map = floatMap({ kind: 'affine', scale: '50/2147483.648', precision: 'float32', ...FULL_24 });
    expect(map.kind === 'affine' && map.scale).toBe(3125 * 2 ** -27);
    // Codes up to 2^23 convert exactly and the offset is 0, so y = fl32(code·scale). Results reach
    // 2^23 · 3125·2^-27 = 195.3 kg, in [128, 256) where the float32 spacing is 2^-16: half of it is
    // the largest rounding error, 2^-17 = 7.62939453125e-6 kg, attained since code·3125 has up to
    // 36 significant bits.
    expect(map.verification.method).toBe('exhaustive');
    expect(Math.abs(map.verification.worstError)).toBe(2 ** -17);
    expect(map.maxAbsError).toBeGreaterThanOrEqual(2 ** -17);
    // The binary64 reference's bound inflates the figure by about 1e-8 relative.
    expect(map.maxAbsError).toBeNear(2 ** -17, { rel: 1e-7 });
    expect(map.errorBound).toBeGreaterThanOrEqual(map.maxAbsError);
    expect(map.evaluate(2147484)).toBe(Math.fround(2147484 * 3125 * 2 ** -27));
  });

  it('float64 over 2^22 codes (the double-double scan is the slow one): code·scale is exact, error zero', () => {
    // code·3125 needs at most 36 bits, so every product is exact in binary64.
    const map = floatMap({
      kind: 'affine',
      scale: '50/2147483.648',
      precision: 'float64',
      codeMin: -(2 ** 23),
      codeMax: -(2 ** 23) + 2 ** 22 - 1,
    });
    expect(map.verification.codesChecked).toBe(2 ** 22);
    expect(map.verification.worstError).toBe(0);
    // Only the double-double reference's own bound remains, some 1e-28 kg.
    expect(map.maxAbsError).toBeLessThan(1e-25);
    expect(map.evaluate(-(2 ** 23))).toBe(-(2 ** 23) * 3125 * 2 ** -27);
  });
});

const exactValue = fc
  .tuple(fc.integer({ min: -999_999, max: 999_999 }), fc.integer({ min: -16, max: 0 }))
  .map(([m, e]) => `${m}e${e}`);
const polynomialCase = fc.record({
  coefficients: fc.array(exactValue, { minLength: 1, maxLength: 5 }),
  offset: fc.oneof(
    fc.constant('0'),
    exactValue,
    fc.integer({ min: -100_000, max: 100_000 }).map((n) => `${n}.5`),
  ),
  // |x| < 2^21 keeps degree-4 values below 1e31, inside the float32 range (3.4e38).
  codeMin: fc.integer({ min: -(2 ** 20), max: 2 ** 20 }),
  precision: fc.constantFrom<FloatPrecision>('float32', 'float64'),
});

describe('floatMap: against decimal.js over every code of small ranges', () => {
  it('proves a maximum no smaller than the brute-force maximum, tight to the reference bound', () => {
    fc.assert(
      fc.property(polynomialCase, (c) => {
        const options: FloatMapOptions = {
          kind: 'polynomial',
          coefficients: c.coefficients,
          offset: c.offset,
          precision: c.precision,
          codeMin: c.codeMin,
          codeMax: c.codeMin + 511,
        };
        const map = floatMap(options);
        let max = new D(0);
        let scale = new D(0); // S = Σ|a_k| X^k, the magnitude that scales every bound
        for (let code = map.codeMin; code <= map.codeMax; code++) {
          const y = emulate(map, code);
          expect(map.evaluate(code)).toBe(y);
          const e = exactOf(y)
            .minus(exactMap(c.coefficients, c.offset, code))
            .abs();
          if (e.greaterThan(max)) max = e;
          const t = new D(code).minus(decimalOf(c.offset)).abs();
          const s = c.coefficients.reduceRight((acc, a) => acc.times(t).plus(decimalOf(a).abs()), new D(0));
          if (s.greaterThan(scale)) scale = s;
        }
        // The reference's a priori error is below 2^-47·S (binary64 Horner, float32 maps) or 2^-90·S
        // (double-double, float64 maps) for degree ≤ 4; the 60-digit decimal reference adds ~1e-55·S.
        const slack = scale.times(new D(2).pow(c.precision === 'float32' ? -47 : -90)).toNumber();
        const floor = scale.times(1e-50).toNumber();
        expect(map.maxAbsError).toBeGreaterThanOrEqual(max.toNumber() - floor);
        expect(map.maxAbsError).toBeNear(max.toNumber(), { abs: slack + floor, rel: 1e-15 });
        expect(map.errorBound).toBeGreaterThanOrEqual(map.maxAbsError);
      }),
      { numRuns: 16 },
    );
  });

  it('rounds every constant once, to the nearest value of the precision', () => {
    fc.assert(
      fc.property(polynomialCase, (c) => {
        const map = floatMap({ kind: 'polynomial', ...c, codeMax: c.codeMin + 1 });
        if (map.kind !== 'polynomial') throw new Error('kind');
        const ulpCheck = (rounded: number, exact: string) => {
          // |rounded − exact| ≤ half the spacing at rounded: compare with the neighbours' midpoints.
          const delta = exactOf(rounded).minus(decimalOf(exact)).abs();
          const spacing = c.precision === 'float32' ? 2 ** -23 : 2 ** -52;
          const magnitude = Math.max(Math.abs(rounded), c.precision === 'float32' ? 2 ** -126 : 2 ** -1022);
          const exponent = Math.floor(Math.log2(magnitude));
          expect(delta.lessThanOrEqualTo(new D(2).pow(exponent).times(spacing).div(2))).toBe(true);
          if (c.precision === 'float32') expect(Math.fround(rounded)).toBe(rounded);
        };
        map.coefficients.forEach((a, k) => ulpCheck(a, c.coefficients[k] as string));
        ulpCheck(map.offset, c.offset);
        expect(map.source.coefficients).toEqual(c.coefficients.map((a) => decimalOf(a).toString()));
      }),
      { numRuns: 200 },
    );
  });

  it('evaluates bit for bit like an independent Float32Array emulation (random codes)', () => {
    const map = floatMap({
      kind: 'polynomial',
      coefficients: ['-0.25', '30/2134169.2493824', '-3.1e-14', '7e-22'],
      offset: '1234.5',
      precision: 'float32',
      ...FULL_24,
      verification: 'sampled',
    });
    fc.assert(
      fc.property(fc.integer({ min: FULL_24.codeMin, max: FULL_24.codeMax }), (code) => {
        expect(map.evaluate(code)).toBe(emulate(map, code));
      }),
      { numRuns: 2000 },
    );
  });

  it('includes the conversion error of codes beyond 2^24 in float32', () => {
    const range = { codeMin: 2 ** 30, codeMax: 2 ** 30 + 511 };
    const map = floatMap({
      kind: 'affine',
      scale: '1e-6',
      offset: '1073741000.25',
      precision: 'float32',
      ...range,
    });
    // (float)code rounds to multiples of 2^7 = 128 near 2^30: x is off by up to 64 codes, 6.4e-5.
    let max = new D(0);
    for (let code = range.codeMin; code <= range.codeMax; code++) {
      const e = exactOf(emulate(map, code))
        .minus(exactMap(['0', '1e-6'], '1073741000.25', code))
        .abs();
      if (e.greaterThan(max)) max = e;
    }
    expect(max.toNumber()).toBeGreaterThan(6e-5);
    expect(map.maxAbsError).toBeGreaterThanOrEqual(max.toNumber());
    expect(map.maxAbsError).toBeNear(max.toNumber(), { rel: 1e-7 });
    expect(map.errorBound).toBeGreaterThanOrEqual(map.maxAbsError);
  });

  it('reports a constant map exactly: the one rounding of c0', () => {
    const map = floatMap({
      kind: 'polynomial',
      coefficients: ['0.1'],
      precision: 'float32',
      codeMin: 0,
      codeMax: 9,
    });
    const expected = exactOf(Math.fround(0.1)).minus('0.1').abs().toNumber();
    expect(Math.abs(map.verification.worstError)).toBeNear(expected, { rel: 1e-15 });
    expect(map.errorBound).toBeNear(expected, { rel: 1e-15 });
  });
});

describe('floatMap: sampling, overflow and bad input', () => {
  it('samples ranges beyond 2^24 codes and states the analytic bound', () => {
    const map = floatMap({
      kind: 'affine',
      scale: '1e-3',
      offset: '7.5',
      precision: 'float32',
      codeMin: -(2 ** 31),
      codeMax: 2 ** 31 - 1,
    });
    expect(map.verification.method).toBe('sampled');
    expect(map.maxAbsError).toBe(map.errorBound);
    expect(Math.abs(map.verification.worstError)).toBeLessThanOrEqual(map.errorBound);
  });

  it('refuses constants or results beyond the precision', () => {
    expect(() =>
      floatMap({ kind: 'polynomial', coefficients: ['1e39'], precision: 'float32', codeMin: 0, codeMax: 1 }),
    ).toThrowBridgeworkError('overflow', { param: 'coefficients[0]' });
    expect(() =>
      floatMap({ kind: 'affine', scale: '1e38', precision: 'float32', codeMin: 0, codeMax: 1000 }),
    ).toThrowBridgeworkError('overflow', { param: 'scale' });
    expect(() =>
      floatMap({
        kind: 'polynomial',
        coefficients: ['0', '0', '1e300'],
        precision: 'float64',
        codeMin: 0,
        codeMax: 1e6,
      }),
    ).toThrowBridgeworkError('overflow', { param: 'coefficients' });
  });

  const ok: FloatMapOptions = {
    kind: 'affine',
    scale: '1e-3',
    precision: 'float32',
    codeMin: 0,
    codeMax: 10,
  };
  it.each([
    ['kind', { kind: undefined }, 'missing-option'],
    ['kind', { kind: 'cubic' }, 'invalid-option'],
    ['precision', { precision: 'float16' }, 'invalid-option'],
    ['precision', { precision: undefined }, 'missing-option'],
    ['scale', { scale: undefined }, 'missing-option'],
    ['scale', { scale: '0' }, 'out-of-range'],
    ['scale', { scale: 'fast' }, 'parse-error'],
    ['coefficients', { coefficients: ['1'] }, 'conflicting-options'],
    ['offset', { offset: Number.NaN }, 'not-finite'],
    ['codeMin', { codeMin: 1.5 }, 'not-integer'],
    ['codeMax', { codeMax: -1 }, 'out-of-range'],
    ['quantityUnit', { quantityUnit: null }, 'wrong-type'],
    ['options.exact', { exact: () => 0 }, 'unknown-option'],
    ['options.precison', { precison: 'float32' }, 'unknown-option'],
    ['verification', { verification: 'all' }, 'invalid-option'],
  ] as const)('%s: %o → %s', (param, patch, code) => {
    expect(() => floatMap({ ...ok, ...patch } as unknown as FloatMapOptions)).toThrowBridgeworkError(code, {
      param,
    });
  });

  it.each([
    ['coefficients', { coefficients: undefined }, 'missing-option'],
    ['coefficients', { coefficients: [] }, 'invalid-shape'],
    ['coefficients', { coefficients: Array.from({ length: 17 }, () => '1') }, 'invalid-shape'],
    ['coefficients[1]', { coefficients: ['1', 'x'] }, 'parse-error'],
    ['scale', { coefficients: ['1'], scale: '2' }, 'conflicting-options'],
  ] as const)('polynomial %s: %o → %s', (param, patch, code) => {
    const base = { kind: 'polynomial', precision: 'float64', codeMin: 0, codeMax: 10 };
    expect(() => floatMap({ ...base, ...patch } as unknown as FloatMapOptions)).toThrowBridgeworkError(code, {
      param,
    });
  });

  it('checks the codes given to evaluate', () => {
    const map = floatMap(ok);
    expect(() => map.evaluate(11)).toThrowBridgeworkError('out-of-range', { param: 'code' });
    expect(() => map.evaluate(0.5)).toThrowBridgeworkError('not-integer', { param: 'code' });
    expect(() => floatMap(null as unknown as FloatMapOptions)).toThrowBridgeworkError('wrong-type', {
      param: 'options',
    });
  });
});
