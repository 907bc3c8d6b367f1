import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixedPointMap, fixedPointRoundings, type FixedPointMapOptions } from '@bridgework/firmware';
import { fastEvaluator } from '../src/internal/fast.js';
import {
  D,
  decimalOf,
  referenceOutput,
  referenceOutputNumber,
  referenceTarget,
} from './support/reference.js';

const FULL_24 = { codeMin: -(2 ** 23), codeMax: 2 ** 23 - 1 } as const;

describe('fixedPointMap: check values of the issue, derived from first principles', () => {
  // A 24-bit bipolar converter spans ±Vref over ±2^23 codes. Ratiometric (Vref = Vexc) with gain
  // 128, one V/V of bridge output is gain·2^(bits−1) = 128·2^23 = 2^30 codes. The scale is the
  // quantity per code, capacity / (rated output · 2^30), and the output LSB is 0.01 g = 1e-5 kg.

  it('50 kg, 2 mV/V, gain 128, 24-bit, 0.01 g: multiplier 1 250 000 000, shift 29, zero coefficient error', () => {
    // 2 mV/V · 2^30 = 2147483.648 codes at 50 kg. m = (50 / 2147483.648) / 1e-5 = 2.5e9/2^30 LSB per
    // code exactly. M = m·2^s = 2.5e9·2^(s−30): at s = 30, 2.5e9 > 2^31 − 1 = 2147483647 does not fit
    // a signed 32-bit word; at s = 29, M = 1.25e9 exactly. The error is then the rounding alone: 1/2.
    const map = fixedPointMap({
      scale: '50/2147483.648',
      outputUnit: '0.00001',
      ...FULL_24,
      quantityUnit: 'kg',
    });
    expect(map.multiplier).toBe(1_250_000_000);
    expect(map.shift).toBe(29);
    expect(map.coefficientError).toBe(0);
    expect(map.qFormat).toEqual({ integerBits: 2, fractionBits: 29, wordBits: 32, text: 'Q2.29' });
    expect(map.source.outputPerCode).toBe('2.3283064365386962890625');
    expect(map.source.multiplierExact).toBe('1250000000');
    expect(map.errorBound).toBe(0.5);
    expect(map.maxAbsError).toBe(0.5); // exact halves occur (for example at code 2^21), so 1/2 is attained
    expect(map.verification.method).toBe('exhaustive');
    expect(map.verification.codesChecked).toBe(2 ** 24);
    expect(Math.abs(map.verification.worstError)).toBe(0.5);
    // 50 kg is 2147483.648 codes; the converter's rail code 2^23 − 1 is far beyond the cell's range.
    expect(map.evaluate(2147484)).toBe(5_000_001); // 2147484 · 2.3283064365… = 5000000.82 → 5000001
    expect(map.outputRange).toEqual({ min: -19_531_250, max: 19_531_248 });
  });

  it('30 kg at 1.9876 mV/V: shift 30, multiplier 1 509 358 020, bound ≤ 0.503912 LSB', () => {
    // m·2^30 = (3e6 / (0.0019876 · 2^30))·2^30 = 3e6 / 0.0019876 = 1509358019.72… (decimal.js below);
    // it fits 31 bits, twice it does not, so s = 30 and M = 1509358020. The bound is
    // 1/2 + |M − 3e6/0.0019876|·2^23/2^30 (rounding plus coefficient error at the rail −2^23).
    // The 0.503912 is an upper limit: any nearest-rounded multiplier keeps within
    // 1/2 + (1/2)·2^23/2^30 = 0.50390625; this one's actual error 0.2778 gives 0.50217.
    const map = fixedPointMap({
      scale: '30/2134169.2493824', // 0.0019876 · 2^30 = 2134169.2493824 exactly
      outputUnit: '0.00001',
      ...FULL_24,
    });
    const exactMultiplier = new D(3e6).div('0.0019876');
    expect(exactMultiplier.toFixed(6)).toBe('1509358019.722278');
    expect(map.shift).toBe(30);
    expect(map.multiplier).toBe(1_509_358_020);
    expect(exactMultiplier.times(2).greaterThan(2 ** 31 - 1)).toBe(true);
    expect(map.source.multiplierExact).toBe(exactMultiplier.toSignificantDigits(40).toString());
    const bound = new D(0.5).plus(
      new D(map.multiplier)
        .minus(exactMultiplier)
        .abs()
        .times(2 ** 23)
        .div(2 ** 30),
    );
    expect(map.errorBound).toBeNear(bound.toNumber(), { rel: 1e-15 });
    expect(map.errorBound).toBeLessThanOrEqual(0.503912);
    expect(map.maxAbsError).toBeLessThanOrEqual(map.errorBound);
    expect(map.maxAbsError).toBeLessThanOrEqual(0.503912);
    // The worst code found exhaustively, recomputed independently with decimal.js.
    const { worstCode, worstError } = map.verification;
    const err = referenceOutput(map, worstCode).minus(
      referenceTarget('30/2134169.2493824', '0', '0.00001', worstCode),
    );
    expect(worstError).toBeNear(err.toNumber(), { rel: 1e-14 });
    // The proved figure is that worst error plus a measuring margin below 1e-14 LSB.
    expect(map.maxAbsError).toBeNear(Math.abs(worstError), { abs: 1e-14 });
  });
});

/** Random small maps: decimal scales of either sign, fractional offsets, every rounding and width. */
const smallMap = fc.record({
  scale: fc
    .tuple(fc.integer({ min: 1, max: 999_999 }), fc.integer({ min: -9, max: 3 }), fc.boolean())
    .map(([m, e, neg]) => `${neg ? '-' : ''}${m}e${e}`),
  outputUnit: fc.constantFrom('1', '0.001', '0.00001', '0.5', '1/3'),
  offset: fc.oneof(
    fc.constant('0'),
    fc.integer({ min: -5000, max: 5000 }).map(String),
    fc.integer({ min: -500_000, max: 500_000 }).map((n) => `${n}e-2`),
  ),
  codeMin: fc.integer({ min: -(2 ** 23), max: 2 ** 23 - 2048 }),
  rounding: fc.constantFrom(...fixedPointRoundings),
  coefficientBits: fc.constantFrom(32, 24, 16),
  accumulatorBits: fc.constantFrom(64, 48, 40),
});

type SmallMap = typeof smallMap extends fc.Arbitrary<infer T> ? T : never;

function build(c: SmallMap, count = 512) {
  return fixedPointMap({
    ...c,
    codeMax: c.codeMin + count - 1,
    verification: 'exhaustive',
  } as FixedPointMapOptions);
}

describe('fixedPointMap: constants and bounds against decimal.js over every code', () => {
  it('evaluates exactly as decimal.js rounding, and the proved maximum is the brute-force maximum', () => {
    // Regression (seed -1227284578): a 40-bit accumulator forces shift 10, so the coefficient error
    // reaches 1041 LSB at the rail; the margin must then be judged relative to the error.
    const wide = build({
      scale: '29352e-3',
      outputUnit: '1/3',
      offset: '0',
      codeMin: -3098094,
      rounding: 'half-even',
      coefficientBits: 32,
      accumulatorBits: 40,
    });
    expect(wide.shift).toBe(10);
    expect(wide.maxAbsError).toBeNear(1041.264, { rel: 1e-14 });
    fc.assert(
      fc.property(smallMap, (c) => {
        let map;
        try {
          map = build(c);
        } catch (e) {
          // Tiny scales with narrow words are refused (no non-zero multiplier) or outputs overflow:
          // both are tested below; anything else is a failure.
          expect((e as { code: string }).code).toMatch(/^(out-of-range|overflow)$/);
          return;
        }
        let max = new D(0);
        for (let code = map.codeMin; code <= map.codeMax; code++) {
          const out = referenceOutput(map, code);
          expect(map.evaluate(code)).toBe(referenceOutputNumber(map, code));
          const e = out.minus(referenceTarget(c.scale, c.offset, c.outputUnit, code)).abs();
          if (e.greaterThan(max)) max = e;
        }
        // Upper bound, tight: the measuring margin ε = 8u(D|Δ| + |β|) + 2u is at most 8u ≈ 9e-16 of
        // the error itself plus 2u; narrow words make errors of hundreds of LSB, hence rel 1e-14.
        // The 60-digit reference itself carries ~1e-57 from ratios such as 1/3: hence the 1e-40 floor.
        expect(map.maxAbsError).toBeGreaterThanOrEqual(max.toNumber() - 1e-40);
        expect(map.maxAbsError).toBeNear(max.toNumber(), { abs: 1e-12, rel: 1e-14 });
        expect(map.errorBound).toBeGreaterThanOrEqual(map.maxAbsError);
        expect(Math.abs(map.verification.worstError)).toBeNear(max.toNumber(), { rel: 1e-14, abs: 1e-40 });
      }),
      { numRuns: 8 },
    );
  });

  it('chooses the largest shift: one more would overflow the word or the accumulator', () => {
    fc.assert(
      fc.property(smallMap, (c) => {
        let map;
        try {
          map = build(c, 64);
        } catch (e) {
          expect((e as { code: string }).code).toMatch(/^(out-of-range|overflow)$/); // as above
          return;
        }
        // The constants one shift higher, recomputed with decimal.js from the exact inputs.
        const m = decimalOf(c.scale).div(decimalOf(c.outputUnit));
        const s1 = map.shift + 1;
        const next = m.times(new D(2).pow(s1)).toDecimalPlaces(0, D.ROUND_HALF_EVEN);
        const oc = map.offsetCode;
        const bias = new D(oc)
          .minus(decimalOf(c.offset))
          .times(m)
          .times(new D(2).pow(s1))
          .toDecimalPlaces(0, D.ROUND_HALF_EVEN);
        const half = c.rounding === 'floor' ? new D(0) : new D(2).pow(s1 - 1);
        const limit = new D(2).pow(map.accumulatorBits - 1).minus(1);
        const wordFull = next.abs().greaterThan(new D(2).pow(map.coefficientBits - 1).minus(1));
        const ends = [map.codeMin - oc, map.codeMax - oc].map((d) => new D(d));
        const values = [
          next,
          bias,
          ...ends.map((d) => d.times(next)),
          ...ends.map((d) => d.times(next).plus(bias).abs().plus(half)),
        ];
        const accFull = values.some((v) => v.abs().greaterThan(limit));
        const shiftFull = s1 > map.accumulatorBits - 2;
        expect(wordFull || accFull || shiftFull).toBe(true);
        // And the multiplier is the nearest integer to m·2^s.
        const exact = m.times(new D(2).pow(map.shift));
        expect(new D(map.multiplier).minus(exact).abs().lessThanOrEqualTo(0.5)).toBe(true);
        expect(map.accumulatorRange.max <= map.accumulatorLimit).toBe(true);
        expect(-map.accumulatorRange.min <= map.accumulatorLimit).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('gives the exact worst cases of an exact coefficient (m = 3/8): 7/8 for floor, 1/2 for the halves', () => {
    // d·3/8 mod 1 takes every value k/8: floor loses up to 7/8; the nearest rules 1/2, at the exact
    // halves d ≡ 4 (mod 8).
    const base = { scale: '0.375', outputUnit: '1', codeMin: -1000, codeMax: 1000 };
    expect(fixedPointMap({ ...base, rounding: 'floor' }).maxAbsError).toBe(0.875);
    expect(fixedPointMap({ ...base, rounding: 'half-even' }).maxAbsError).toBe(0.5);
    expect(fixedPointMap({ ...base, rounding: 'half-away' }).maxAbsError).toBe(0.5);
    const floor = fixedPointMap({ ...base, rounding: 'floor' });
    expect(floor.coefficientError).toBe(0);
    expect(floor.evaluate(-3)).toBe(-2); // −1.125 → −2
    expect(fixedPointMap({ ...base, rounding: 'half-away' }).evaluate(-4)).toBe(-2); // −1.5 → −2
    expect(fixedPointMap({ ...base, rounding: 'half-even' }).evaluate(-4)).toBe(-2); // −1.5 → −2 (even)
    expect(fixedPointMap({ ...base, rounding: 'half-even' }).evaluate(4)).toBe(2); // 1.5 → 2 (even)
    expect(fixedPointMap({ ...base, rounding: 'half-even' }).evaluate(12)).toBe(4); // 4.5 → 4 (even)
  });

  it('carries a fractional offset in the bias, exactly to within 2^-(s+1) LSB', () => {
    const map = fixedPointMap({
      scale: '0.375',
      outputUnit: '1',
      offset: '0.5',
      codeMin: -100,
      codeMax: 100,
    });
    expect(map.offsetCode).toBe(0); // 0.5 → 0 (ties to even)
    // bias = round((0 − 0.5)·0.375·2^s) = −0.1875·2^s exactly.
    expect(map.bias).toBe(-0.1875 * 2 ** map.shift);
    expect(map.evaluate(4)).toBe(1); // (4 − 0.5)·0.375 = 1.3125 → 1
    expect(map.evaluate(-4)).toBe(-2); // −1.6875 → −2
  });

  it('handles a negative scale (an inverted bridge) symmetrically', () => {
    const pos = fixedPointMap({
      scale: '30/2134169.2493824',
      outputUnit: '0.00001',
      codeMin: -4096,
      codeMax: 4096,
    });
    const neg = fixedPointMap({
      scale: '-30/2134169.2493824',
      outputUnit: '0.00001',
      codeMin: -4096,
      codeMax: 4096,
    });
    expect(neg.multiplier).toBe(-pos.multiplier);
    expect(neg.shift).toBe(pos.shift);
    // Half-even is symmetric about zero: y(−code) under −m equals y(code) under m.
    for (const code of [-4096, -1234, -1, 0, 1, 777, 4096])
      expect(neg.evaluate(-code)).toBe(pos.evaluate(code));
    expect(neg.maxAbsError).toBeNear(pos.maxAbsError, { rel: 1e-12 });
  });

  it('steps exactly through BigInt when the shift exceeds 52 (a tiny scale)', () => {
    const map = fixedPointMap({ scale: '3e-9', outputUnit: '1', codeMin: 2 ** 22, codeMax: 2 ** 22 + 1023 });
    expect(map.shift).toBeGreaterThan(52);
    let max = new D(0);
    for (let code = map.codeMin; code <= map.codeMax; code++) {
      const out = referenceOutput(map, code);
      expect(map.evaluate(code)).toBe(referenceOutputNumber(map, code));
      const e = out.minus(referenceTarget('3e-9', '0', '1', code)).abs();
      if (e.greaterThan(max)) max = e;
    }
    expect(map.maxAbsError).toBeNear(max.toNumber(), { abs: 1e-12 });
  });

  it('uses shift 0 when the coefficient needs the whole word, with exact results', () => {
    // m = 1.5e9: 2m = 3e9 > 2^31 − 1, so s = 0 and M = m; every output is exact.
    const map = fixedPointMap({ scale: '1500000000', outputUnit: '1', codeMin: -1, codeMax: 1 });
    expect(map.shift).toBe(0);
    expect(map.qFormat.text).toBe('Q31.0');
    expect([map.evaluate(-1), map.evaluate(0), map.evaluate(1)]).toEqual([-1.5e9, 0, 1.5e9]);
    expect(map.maxAbsError).toBe(0);
  });
});

describe('fixedPointMap: overflow is an error', () => {
  it('refuses outputs beyond the output word', () => {
    // 1000 LSB per code over ±2^23 codes reaches ±8.4e9 > 2^31 − 1.
    expect(() => fixedPointMap({ scale: '1000', outputUnit: '1', ...FULL_24 })).toThrowBridgeworkError(
      'overflow',
      {
        param: 'outputBits',
      },
    );
    expect(() =>
      fixedPointMap({ scale: '1', outputUnit: '1', ...FULL_24, outputBits: 16 }),
    ).toThrowBridgeworkError('overflow', { param: 'outputBits' });
  });

  it('refuses a coefficient that does not fit the word even at shift 0', () => {
    expect(() =>
      fixedPointMap({ scale: '3e9', outputUnit: '1', codeMin: 0, codeMax: 1 }),
    ).toThrowBridgeworkError('overflow', { param: 'scale' });
    expect(() =>
      fixedPointMap({ scale: '40000', outputUnit: '1', codeMin: 0, codeMax: 1, coefficientBits: 16 }),
    ).toThrowBridgeworkError('overflow', { param: 'scale' });
  });

  it('refuses an accumulator too narrow at every shift', () => {
    // ±2^23 codes times a multiplier ≥ 1 need 24 bits plus sign; a 16-bit accumulator cannot hold them.
    expect(() =>
      fixedPointMap({ scale: '1', outputUnit: '1000', ...FULL_24, accumulatorBits: 16 }),
    ).toThrowBridgeworkError('overflow', { param: 'accumulatorBits' });
  });

  it('never falls back to a zero multiplier to make the accumulator fit', () => {
    // m = 2^-20 with codes ±(2^23 − 2^18) and a 24-bit accumulator (limit 2^23 − 1): at shift 20,
    // M = 1 and |d|·M + 2^19 = 2^23 + 2^18 overflows; at shift 19, M = round(1/2) = 0 would fit, but
    // it maps every code to 0. That is refused as an accumulator overflow.
    const range = { codeMin: -(2 ** 23 - 2 ** 18), codeMax: 2 ** 23 - 2 ** 18 };
    expect(() =>
      fixedPointMap({ scale: String(2 ** -20), outputUnit: '1', ...range, accumulatorBits: 24 }),
    ).toThrowBridgeworkError('overflow', { param: 'accumulatorBits' });
    // One bit more and shift 20 fits.
    expect(
      fixedPointMap({ scale: String(2 ** -20), outputUnit: '1', ...range, accumulatorBits: 25 }).multiplier,
    ).toBeGreaterThan(0);
  });

  it('keeps every intermediate within the accumulator: the range and limit are reported', () => {
    const map = fixedPointMap({
      scale: '30/2134169.2493824',
      outputUnit: '0.00001',
      ...FULL_24,
      accumulatorBits: 48,
      verification: 'sampled',
    });
    expect(map.accumulatorLimit).toBe(2n ** 47n - 1n);
    expect(
      map.accumulatorRange.max <= map.accumulatorLimit && -map.accumulatorRange.min <= map.accumulatorLimit,
    ).toBe(true);
    // The largest shift within 48 bits: 2^23·m·2^s + 2^(s−1) ≤ 2^47 − 1 with m = 1.4057 ⇒
    // 2^s ≤ 2^24/1.4057 = 2^23.51 ⇒ s = 23 (at 24 the product reaches 1.98e14 > 2^47 = 1.41e14).
    expect(map.shift).toBe(23);
  });
});

describe('fixedPointMap: reference maps, sampling and defaults', () => {
  it('evaluates in the scans exactly as evaluate does, at every shift (binary64 parts, and BigInt past 52)', () => {
    // The generator's total-error scans use the fast binary64 evaluator; it must equal the BigInt one.
    const cases: FixedPointMapOptions[] = [
      { scale: '30/2134169.2493824', offset: '-2.75', outputUnit: '0.00001', ...FULL_24 }, // shift 30
      {
        scale: '3/7',
        offset: '100.5',
        outputUnit: '1',
        codeMin: -70000,
        codeMax: 70000,
        rounding: 'half-away',
      },
      {
        scale: '-1/3',
        outputUnit: '1',
        codeMin: -5000,
        codeMax: 5000,
        rounding: 'floor',
        coefficientBits: 16,
      },
      { scale: '1e-9', outputUnit: '1', codeMin: -3000, codeMax: 3000 }, // shift beyond 52
    ];
    for (const options of cases) {
      const map = fixedPointMap({ ...options, verification: 'sampled' });
      const fast = fastEvaluator(map);
      const codes = fc.sample(fc.integer({ min: map.codeMin, max: map.codeMax }), 3000);
      codes.push(map.codeMin, map.codeMax, map.offsetCode, map.offsetCode + 1);
      for (const code of codes) expect(fast(code), `${map.shift} at ${code}`).toBe(map.evaluate(code));
    }
  });

  it('samples ranges beyond 2^24 codes and then states the analytic bound', () => {
    const map = fixedPointMap({ scale: '1e-3', outputUnit: '1', codeMin: -(2 ** 31), codeMax: 2 ** 31 - 1 });
    expect(map.verification.method).toBe('sampled');
    expect(map.verification.codesChecked).toBeGreaterThan(40_000);
    expect(map.maxAbsError).toBe(map.errorBound);
    expect(Math.abs(map.verification.worstError)).toBeLessThanOrEqual(map.errorBound);
    // The rails are among the samples: both ends of the int32 range evaluate without overflow.
    expect(map.evaluate(-(2 ** 31))).toBe(-2147484); // −2147483.648 → −2147484
    expect(map.evaluate(2 ** 31 - 1)).toBe(2147484); //  2147483.647 → 2147484
  });

  it('uses the documented defaults', () => {
    const map = fixedPointMap({ scale: '1/3', outputUnit: '1', codeMin: 0, codeMax: 10 });
    expect([map.rounding, map.coefficientBits, map.accumulatorBits, map.outputBits]).toEqual([
      'half-even',
      32,
      64,
      32,
    ]);
    expect([map.kind, map.offsetCode, map.bias, map.quantityUnit]).toEqual(['affine', 0, 0, '']);
  });
});

describe('fixedPointMap: bad input', () => {
  const ok = { scale: '1/3', outputUnit: '1', codeMin: 0, codeMax: 10 };
  it.each([
    ['scale', { scale: undefined }, 'missing-option'],
    ['scale', { scale: 0 }, 'out-of-range'],
    ['scale', { scale: Number.NaN }, 'not-finite'],
    ['scale', { scale: 'one third' }, 'parse-error'],
    ['scale', { scale: [1] }, 'wrong-type'],
    ['offset', { offset: Infinity }, 'not-finite'],
    ['outputUnit', { outputUnit: undefined }, 'missing-option'],
    ['outputUnit', { outputUnit: '0' }, 'not-positive'],
    ['outputUnit', { outputUnit: -1 }, 'not-positive'],
    ['codeMin', { codeMin: 0.5 }, 'not-integer'],
    ['codeMin', { codeMin: -(2 ** 31) - 1 }, 'out-of-range'],
    ['codeMax', { codeMax: -1 }, 'out-of-range'],
    ['codeMax', { codeMax: '10' }, 'wrong-type'],
    ['coefficientBits', { coefficientBits: 33 }, 'out-of-range'],
    ['accumulatorBits', { accumulatorBits: 65 }, 'out-of-range'],
    ['outputBits', { outputBits: 1 }, 'out-of-range'],
    ['rounding', { rounding: 'nearest' }, 'invalid-option'],
    ['quantityUnit', { quantityUnit: 5 }, 'wrong-type'],
    ['options.exact', { exact: () => 0 }, 'unknown-option'],
    ['options.scal', { scal: '1/3' }, 'unknown-option'],
    ['verification', { verification: 'full' }, 'invalid-option'],
  ] as const)('%s: %o → %s', (param, patch, code) => {
    expect(() =>
      fixedPointMap({ ...ok, ...patch } as unknown as FixedPointMapOptions),
    ).toThrowBridgeworkError(code, {
      param,
    });
  });

  it('rejects a missing options object, a scale too small for any multiplier, and bad codes', () => {
    expect(() => fixedPointMap(undefined as unknown as FixedPointMapOptions)).toThrowBridgeworkError(
      'wrong-type',
      {
        param: 'options',
      },
    );
    expect(() => fixedPointMap({ ...ok, scale: '1e-30' })).toThrowBridgeworkError('out-of-range', {
      param: 'scale',
    });
    const map = fixedPointMap(ok);
    expect(() => map.evaluate(11)).toThrowBridgeworkError('out-of-range', { param: 'code' });
    expect(() => map.evaluate(1.5)).toThrowBridgeworkError('not-integer', { param: 'code' });
    expect(() => map.evaluate(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'code' });
  });
});
