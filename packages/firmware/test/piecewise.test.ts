/**
 * Piecewise polynomials: the segmentation, the Chebyshev fit, and the three evaluators built on
 * them (fixed point in int32, float32/float64 Horner, and the Möbius form) — each checked against
 * an independent evaluation: BigInt for the integer algorithm, decimal.js at 60 digits for the
 * exact values, Float32Array for binary32.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  fitPiecewisePolynomial,
  fixedPiecewiseMap,
  floatMobiusMap,
  floatPiecewiseMap,
  segmentCodes,
  type PiecewisePolynomial,
} from '@bridgework/firmware';
import { exactDecimalString } from '@bridgework/core';
import { D } from './support/reference.js';

const exactOf = (x: number) => new D(exactDecimalString(x));

/** The polynomial's value at a code in decimal.js (exact: coefficients are doubles, t an integer). */
function polynomialAt(p: PiecewisePolynomial, code: number): InstanceType<typeof D> {
  const length = 2 ** p.segmentBits;
  const i = Math.floor((code - p.segmentBase) / length);
  const t = code - p.segmentBase - i * length - length / 2;
  const a = p.coefficients[i] as readonly number[];
  let y = exactOf(a[a.length - 1] as number);
  for (let k = a.length - 2; k >= 0; k--) y = y.times(t).plus(exactOf(a[k] as number));
  return y;
}

describe('segmentation', () => {
  it('covers the range with 2^k-code segments found by a shift, the unused codes split between the ends', () => {
    const p = fitPiecewisePolynomial({
      exact: (c) => c,
      codeMin: 0,
      codeMax: 999,
      segmentBits: 8,
      degree: 1,
    });
    // 1000 codes in 256-code segments: 4 segments, 24 unused codes, 12 before code 0.
    expect([p.segmentCount, p.segmentBase]).toEqual([4, -12]);
    let next = 0;
    for (let i = 0; i < p.segmentCount; i++) {
      const s = segmentCodes(p, i);
      expect(s.first).toBe(next);
      expect(s.centre).toBe(-12 + 256 * i + 128);
      next = s.last + 1;
      // The index of each code is the shift of (code − base).
      for (const c of [s.first, s.last]) expect((c - p.segmentBase) >> 8).toBe(i);
    }
    expect(next).toBe(1000);
    // One segment is centred on the range: 1000 codes in 1024, base 12 below.
    const one = fitPiecewisePolynomial({
      exact: (c) => c,
      codeMin: 0,
      codeMax: 999,
      segmentBits: 10,
      degree: 1,
    });
    expect([one.segmentCount, one.segmentBase, segmentCodes(one, 0).centre]).toEqual([1, -12, 500]);
  });

  it('keeps the base inside int32 at the lowest codes', () => {
    const p = fitPiecewisePolynomial({
      exact: () => 1,
      codeMin: -(2 ** 31),
      codeMax: -(2 ** 31) + 999,
      segmentBits: 10,
      degree: 0,
    });
    expect(p.segmentBase).toBe(-(2 ** 31));
    expect(p.segmentCount).toBe(1);
  });

  it('segmentCodes refuses what is not a layout, and an index past the last segment (issue 15 fuzz: NaN codes)', () => {
    const layout = { codeMin: 0, codeMax: 999, segmentBase: -12, segmentBits: 8 };
    expect(segmentCodes(layout, 3)).toEqual({ first: 756, last: 999, centre: 884 });
    expect(() => segmentCodes(layout, 4)).toThrowBridgeworkError('out-of-range', { param: 'index' });
    expect(() => segmentCodes(layout, 0.5)).toThrowBridgeworkError('not-integer', { param: 'index' });
    expect(() => segmentCodes(null as never, 0)).toThrowBridgeworkError('wrong-type', { param: 'p' });
    expect(() => segmentCodes({ ...layout, codeMni: 0 } as never, 0)).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'p.codeMni',
      },
    );
    expect(() => segmentCodes({ ...layout, segmentBase: 1 }, 0)).toThrowBridgeworkError('out-of-range', {
      param: 'p.segmentBase',
    });
    expect(() => segmentCodes({ ...layout, segmentBits: 1e308 }, 0)).toThrowBridgeworkError('out-of-range', {
      param: 'p.segmentBits',
    });
    const { codeMax: _, ...noMax } = layout;
    expect(() => segmentCodes(noMax as never, 0)).toThrowBridgeworkError('missing-option', {
      param: 'codeMax',
    });
  });
});

describe('fitPiecewisePolynomial: Chebyshev interpolation', () => {
  it('stays within the interpolation bound max|f^(n+1)|·h^(n+1) / (2^n (n+1)!) on every segment', () => {
    // Chebyshev-node interpolation error on [m − h, m + h] (e.g. Burden & Faires, Numerical
    // Analysis, §8.3 — from memory). f(code) = exp(code/1000): f^(4) = exp(x/1000)/1000^4.
    const f = (c: number) => Math.exp(c / 1000);
    const p = fitPiecewisePolynomial({ exact: f, codeMin: 0, codeMax: 4095, segmentBits: 10, degree: 3 });
    for (let i = 0; i < p.segmentCount; i++) {
      const s = segmentCodes(p, i);
      const h = (s.last - s.first) / 2;
      const bound = ((Math.exp(s.last / 1000) / 1000 ** 4) * h ** 4) / (2 ** 3 * 24);
      let worst = 0;
      // Every third code: the error curve is smooth, its peaks are a few hundred codes wide.
      for (let c = s.first; c <= s.last; c = c === s.last ? c + 1 : Math.min(c + 3, s.last)) {
        worst = Math.max(worst, polynomialAt(p, c).minus(new D(c).div(1000).exp()).abs().toNumber());
      }
      expect(worst).toBeLessThanOrEqual(bound * (1 + 1e-6) + 1e-15);
      // Near-minimax: the error equioscillates close to the bound, far from a poor fit.
      expect(worst).toBeGreaterThan(bound / 4);
    }
  });

  it('reproduces a polynomial of its degree to rounding', () => {
    const q = (c: number) => 3 - 2e-3 * c + 5e-8 * c * c;
    const p = fitPiecewisePolynomial({ exact: q, codeMin: -5000, codeMax: 5000, segmentBits: 12, degree: 2 });
    for (const c of [-5000, -1, 0, 1234, 5000])
      expect(polynomialAt(p, c).toNumber()).toBeNear(q(c), { abs: 1e-12 });
  });

  it('rejects bad options with their names', () => {
    const ok = { exact: (c: number) => c, codeMin: 0, codeMax: 100, segmentBits: 4, degree: 2 };
    expect(() => fitPiecewisePolynomial({ ...ok, degree: 6 })).toThrowBridgeworkError('out-of-range', {
      param: 'degree',
    });
    expect(() => fitPiecewisePolynomial({ ...ok, segmentBits: 0 })).toThrowBridgeworkError('out-of-range', {
      param: 'segmentBits',
    });
    expect(() => fitPiecewisePolynomial({ ...ok, exact: () => Number.NaN })).toThrowBridgeworkError(
      'model-not-finite',
      { param: 'exact' },
    );
    expect(() => fitPiecewisePolynomial({ ...ok, degre: 2 } as never)).toThrowBridgeworkError(
      'unknown-option',
      { param: 'options.degre' },
    );
    const { degree: _, ...missing } = ok;
    expect(() => fitPiecewisePolynomial(missing as never)).toThrowBridgeworkError('missing-option', {
      param: 'degree',
    });
  });
});

/** The C algorithm of the fixed map, step by step in BigInt, with the largest intermediate magnitude. */
function fixedByBigInt(map: ReturnType<typeof fixedPiecewiseMap>, code: number): { y: bigint; peak: bigint } {
  const length = 2 ** map.segmentBits;
  const u = BigInt(code - map.segmentBase);
  const i = Number(u >> BigInt(map.segmentBits));
  const t = (u & BigInt(length - 1)) - BigInt(length / 2);
  const seg = map.segments[i]!;
  const floorShift = (n: bigint, s: number) => (n >= 0n ? n >> BigInt(s) : -(-(n + 1n) >> BigInt(s)) - 1n);
  let y = BigInt(seg.coefficients[map.degree]!);
  let peak = y < 0n ? -y : y;
  for (let j = map.degree - 1; j >= 0; j--) {
    const product = y * t;
    peak = product < 0n ? (-product > peak ? -product : peak) : product > peak ? product : peak;
    y = floorShift(product, seg.shifts[j]!) + BigInt(seg.coefficients[j]!);
    peak = y < 0n ? (-y > peak ? -y : peak) : y > peak ? y : peak;
  }
  return { y: floorShift(y, seg.shifts[map.degree]!), peak };
}

describe('fixedPiecewiseMap: 32-bit integer Horner with per-segment Q-formats', () => {
  // A thermistor-like curve over a 16-bit range, in 0.01 steps (invented).
  const curve = (c: number) => 25 + 40 * Math.tanh((c - 8000) / 6000) + 1e-8 * c * c;
  const polynomial = fitPiecewisePolynomial({
    exact: curve,
    codeMin: 0,
    codeMax: 16383,
    segmentBits: 10,
    degree: 3,
  });

  for (const coefficientBits of [32, 16] as const) {
    it(`evaluates as the C algorithm does, never leaves int32, and stays within its arithmetic bound (${coefficientBits}-bit coefficients)`, () => {
      const map = fixedPiecewiseMap({ polynomial, outputUnit: '0.01', coefficientBits });
      const limit = 2n ** 31n - 1n;
      const coefLimit = 2 ** (coefficientBits - 1) - 1;
      for (const s of map.segments) {
        for (const c of s.coefficients) expect(Math.abs(c)).toBeLessThanOrEqual(coefLimit);
        for (const sh of s.shifts) expect(sh >= 0 && sh <= 30).toBe(true);
        expect(s.accumulatorBound).toBeLessThanOrEqual(2 ** 31 - 1);
      }
      let observed = 0;
      for (let code = 0; code <= 16383; code++) {
        const { y, peak } = fixedByBigInt(map, code);
        expect(peak <= limit).toBe(true);
        const out = map.evaluate(code);
        if (BigInt(out) !== y) expect(out, `code ${code}`).toBe(Number(y));
        const e = new D(out).minus(polynomialAt(polynomial, code).div('0.01')).abs().toNumber();
        observed = Math.max(observed, e);
      }
      expect(observed).toBeLessThanOrEqual(map.arithmeticBound);
      // The bound is the output rounding (½) plus what the words cost: close to the truth.
      expect(map.arithmeticBound).toBeLessThan(observed + (coefficientBits === 32 ? 0.05 : 3));
    });
  }

  it('rounds halves up (floor(x + ½)): the integer map y = code/2 in steps of 1', () => {
    const p = fitPiecewisePolynomial({
      exact: (c) => c / 2,
      codeMin: -8,
      codeMax: 7,
      segmentBits: 4,
      degree: 1,
    });
    const map = fixedPiecewiseMap({ polynomial: p, outputUnit: '1' });
    // −3.5 → −3, −2.5 → −2, 2.5 → 3, 3.5 → 4.
    expect([-7, -5, 5, 7].map((c) => map.evaluate(c))).toEqual([-3, -2, 3, 4]);
    expect(map.rounding).toBe('half-up');
  });

  it('refuses outputs an int32 cannot hold, and bad options', () => {
    const big = fitPiecewisePolynomial({
      exact: () => 5e9,
      codeMin: 0,
      codeMax: 15,
      segmentBits: 4,
      degree: 0,
    });
    expect(() => fixedPiecewiseMap({ polynomial: big, outputUnit: '1' })).toThrowBridgeworkError('overflow', {
      param: 'polynomial',
    });
    expect(() => fixedPiecewiseMap({ polynomial, outputUnit: '0' })).toThrowBridgeworkError('not-positive', {
      param: 'outputUnit',
    });
    expect(() =>
      fixedPiecewiseMap({ polynomial, outputUnit: '1', coefficientBits: 7 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'coefficientBits' });
    expect(() =>
      fixedPiecewiseMap({ polynomial: { ...polynomial, segmentCount: 3 }, outputUnit: '1' }),
    ).toThrowBridgeworkError('out-of-range', { param: 'polynomial.segmentCount' });
    expect(() =>
      fixedPiecewiseMap({ polynomial, outputUnit: '1', accumulatorBits: 64 } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'options.accumulatorBits' });
    expect(() => map0().evaluate(16384)).toThrowBridgeworkError('out-of-range', { param: 'code' });
  });
  const map0 = () => fixedPiecewiseMap({ polynomial, outputUnit: '0.01' });
});

/** Horner in binary32 through Float32Array stores (an emulation independent of Math.fround). */
function horner32(a: readonly number[], t: number): number {
  const r = new Float32Array(1);
  const x = new Float32Array([t])[0] as number;
  r[0] = a[a.length - 1] as number;
  for (let k = a.length - 2; k >= 0; k--) {
    r[0] = (r[0] as number) * x;
    r[0] = (r[0] as number) + (a[k] as number);
  }
  return r[0] as number;
}

describe('floatPiecewiseMap: Horner in float32 and float64', () => {
  const curve = (c: number) => 100 * Math.log1p(c / 20000);
  const polynomial = fitPiecewisePolynomial({
    exact: curve,
    codeMin: 0,
    codeMax: 12000,
    segmentBits: 11,
    degree: 4,
  });

  it('float32: bit for bit a Float32Array emulation, within its arithmetic bound of the exact polynomial', () => {
    const map = floatPiecewiseMap({ polynomial, precision: 'float32' });
    let observed = 0;
    for (let code = 0; code <= 12000; code++) {
      const i = Math.floor((code - map.segmentBase) / 2048);
      const t = code - map.segmentBase - i * 2048 - 1024;
      const y = map.evaluate(code);
      if (y !== horner32(map.coefficients[i]!, t)) expect(y).toBe(horner32(map.coefficients[i]!, t));
      observed = Math.max(observed, exactOf(y).minus(polynomialAt(polynomial, code)).abs().toNumber());
    }
    expect(observed).toBeLessThanOrEqual(map.arithmeticBound);
    // A priori bounds of Horner's rule are pessimistic by a few ulps, not by orders of magnitude.
    expect(map.arithmeticBound).toBeLessThan(observed * 16);
  });

  it('float64: within its arithmetic bound of the exact polynomial', () => {
    const map = floatPiecewiseMap({ polynomial, precision: 'float64' });
    let observed = 0;
    for (const code of fc.sample(fc.integer({ min: 0, max: 12000 }), 3000)) {
      observed = Math.max(
        observed,
        exactOf(map.evaluate(code)).minus(polynomialAt(polynomial, code)).abs().toNumber(),
      );
    }
    expect(observed).toBeLessThanOrEqual(map.arithmeticBound);
    expect(map.coefficients[0]).toEqual(polynomial.coefficients[0]); // binary64 coefficients stay as fitted
  });

  it('refuses a coefficient beyond float32 and bad options', () => {
    const huge = { ...polynomial, coefficients: polynomial.coefficients.map((r) => [1e39, ...r.slice(1)]) };
    expect(() => floatPiecewiseMap({ polynomial: huge, precision: 'float32' })).toThrowBridgeworkError(
      'overflow',
      { param: 'polynomial.coefficients[0][0]' },
    );
    expect(() => floatPiecewiseMap({ polynomial, precision: 'half' as never })).toThrowBridgeworkError(
      'invalid-option',
      { param: 'precision' },
    );
    expect(() =>
      floatPiecewiseMap({ polynomial: { ...polynomial, coefficients: [] }, precision: 'float64' }),
    ).toThrowBridgeworkError('invalid-shape', { param: 'polynomial.coefficients' });
  });
});

describe('floatMobiusMap: (b + a·x)/(1 + c·x) with a hardware divide', () => {
  // y = 100·code/(1000 + code) over 0 … 1000, centred at 500: with x = code − 500,
  // y = (50000 + 100·x)/(1500 + x) = (b + a·x)/(1 + c·x), b = 50000/1500, a = 100/1500, c = 1/1500.
  const options = {
    a: '100/1500',
    b: '50000/1500',
    c: '1/1500',
    centre: 500,
    codeMin: 0,
    codeMax: 1000,
  } as const;

  it('float32: bit for bit a Float32Array emulation, within its arithmetic bound of the exact map', () => {
    const map = floatMobiusMap({ ...options, precision: 'float32' });
    const f = new Float32Array(4);
    let observed = 0;
    for (let code = 0; code <= 1000; code++) {
      f[0] = code - 500; // x
      f[1] = map.a * (f[0] as number);
      f[1] = map.b + (f[1] as number);
      f[2] = map.c * (f[0] as number);
      f[2] = 1 + (f[2] as number);
      f[3] = (f[1] as number) / (f[2] as number);
      expect(map.evaluate(code)).toBe(f[3]);
      observed = Math.max(
        observed,
        exactOf(map.evaluate(code))
          .minus(new D(100 * code).div(1000 + code))
          .abs()
          .toNumber(),
      );
    }
    expect(observed).toBeLessThanOrEqual(map.arithmeticBound);
    expect(map.arithmeticBound).toBeLessThan(observed * 16);
  });

  it('float64: within its bound; refuses a denominator that changes sign', () => {
    const map = floatMobiusMap({ ...options, precision: 'float64' });
    for (const code of [0, 1, 500, 999, 1000]) {
      expect(
        exactOf(map.evaluate(code))
          .minus(new D(100 * code).div(1000 + code))
          .abs()
          .toNumber(),
      ).toBeLessThanOrEqual(map.arithmeticBound);
    }
    expect(() => floatMobiusMap({ ...options, c: '-1/400', precision: 'float64' })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'c' },
    );
    expect(() => floatMobiusMap({ ...options, centre: 2000, precision: 'float64' })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'centre' },
    );
  });
});
