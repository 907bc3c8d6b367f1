import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { createAdc, effectiveBits, quantizationNoiseRms } from '@bridgework/chain';
import { exactDecimalString } from '@bridgework/core';

// Products of doubles' exact decimal expansions need up to ~1100 digits to stay exact; quotients
// are only used as a first guess, at 60 digits.
const E = Decimal.clone({ precision: 1200, rounding: Decimal.ROUND_HALF_EVEN });
const D = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN });
const X = (x: number) => new D(exactDecimalString(x));
const XE = (x: number) => new E(exactDecimalString(x));

/**
 * The exact nearest integer (ties to even) of gain·input·scale/den: a 60-digit quotient gives the
 * candidate k; the exact products y = gain·input·scale and (k ± ½)·den then decide it with no rounding.
 */
function exactCode(gain: number, input: number, scale: number, den: number): number {
  const y = XE(gain).times(XE(input)).times(scale);
  const d = XE(den);
  let k = new D(y.toString()).div(X(den)).floor().toNumber();
  while (y.lt(d.times(k))) k -= 1; // ensure k ≤ x < k + 1 exactly
  while (y.gte(d.times(k + 1))) k += 1;
  const c = y.cmp(d.times(k + 0.5));
  const code = c > 0 ? k + 1 : c < 0 ? k : k % 2 === 0 ? k : k + 1;
  return code + 0; // never −0
}
const clip = (k: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, k));

const adcOptions = fc.record({
  bits: fc.integer({ min: 1, max: 32 }),
  referenceVolts: fc.double({ min: 0.5, max: 10, noNaN: true }),
  gain: fc.oneof(fc.constantFrom(1, 2, 64, 128), fc.double({ min: 0.5, max: 1000, noNaN: true })),
  bipolar: fc.boolean(),
});

describe('createAdc: coding (issue #4 and the channel issue #9)', () => {
  it('ratiometric, 24 bits, gain 128: 2^30 counts per V/V, so 1 mV/V is 1 073 741.824 counts', () => {
    // Derived: code = gain·ratio·2^(bits−1) = 128·2^23·1e-3 = 2^30·1e-3 = 1 073 741.824.
    const adc = createAdc({ bits: 24, referenceVolts: 5, gain: 128, ratiometric: true });
    expect(adc.countsPerRatio).toBe(2 ** 30);
    expect(adc.countsPerRatio * 1e-3).toBeNear(1073741.824, { ulps: 1 });
    expect(adc.codeFromRatio(1e-3)).toEqual({ code: 1073742, clipped: false, atRail: false });
    // A quarter bridge, GF 2, has the exact slope GF/4 = 0.5 V/V per m/m at zero: 536.870912 counts per µε.
    const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    expect(bridge.sensitivity).toBe(0.5);
    expect((adc.countsPerRatio * bridge.sensitivity) / 1e6).toBeNear(536.870912, { ulps: 1 });
  });

  it('bipolar: two’s complement, ±Vref/gain full scale, lsb = Vref/gain/2^(N−1)', () => {
    const adc = createAdc({ bits: 24, referenceVolts: 2.5, gain: 64 });
    expect([adc.codeMin, adc.codeMax, adc.codeScale]).toEqual([-(2 ** 23), 2 ** 23 - 1, 2 ** 23]);
    expect(adc.lsbVolts).toBe(2.5 / 64 / 2 ** 23);
    expect(adc.countsPerVolt).toBe((64 * 2 ** 23) / 2.5);
    expect(adc.fullScaleVolts).toEqual({ min: -2.5 / 64, max: 2.5 / 64 });
    expect(adc.fullScaleRangeVolts).toBe(2 * (2.5 / 64));
    expect(adc.bipolar).toBe(true);
    expect(adc.ratiometric).toBe(false);
    expect('codeFromRatio' in adc).toBe(false);
  });

  it('unipolar: straight binary 0 … 2^N − 1, lsb = Vref/gain/2^N, a negative input clips at 0', () => {
    const adc = createAdc({ bits: 12, referenceVolts: 4.096, bipolar: false });
    expect([adc.codeMin, adc.codeMax]).toEqual([0, 4095]);
    expect(adc.lsbVolts).toBe(0.001);
    expect(adc.fullScaleVolts).toEqual({ min: 0, max: 4.096 });
    expect(adc.codeFromVolts(1.2345)).toEqual({ code: 1234, clipped: false, atRail: false }); // 1234.5 → even
    expect(adc.codeFromVolts(-0.0001)).toEqual({ code: 0, clipped: false, atRail: true }); // −0.1 LSB rounds to 0
    expect(adc.codeFromVolts(-0.01)).toEqual({ code: 0, clipped: true, atRail: true });
    expect(adc.codeFromVolts(4.096)).toEqual({ code: 4095, clipped: true, atRail: true });
  });

  it('1 bit and 32 bits are the ends of the range', () => {
    const one = createAdc({ bits: 1, referenceVolts: 1 });
    expect([one.codeMin, one.codeMax]).toEqual([-1, 0]);
    expect(one.codeFromVolts(0.9)).toEqual({ code: 0, clipped: true, atRail: true });
    const big = createAdc({ bits: 32, referenceVolts: 1, bipolar: false });
    expect(big.codeMax).toBe(2 ** 32 - 1);
    expect(big.codeFromVolts(0.5).code).toBe(2 ** 31);
  });
});

describe('createAdc: rounding is to nearest, ties to even, decided exactly', () => {
  // 4 bits, 8 V reference: lsb = 1 V, codes −8 … 7, so every half volt is an exact tie.
  const adc = createAdc({ bits: 4, referenceVolts: 8 });

  it.each([
    [0.5, 0],
    [1.5, 2],
    [2.5, 2],
    [3.5, 4],
    [-0.5, 0],
    [-1.5, -2],
    [-2.5, -2],
    [6.5, 6],
  ])('%d V → code %i (not Math.round, which sends −2.5 to −2 and 2.5 to 3)', (volts, code) => {
    const r = adc.codeFromVolts(volts);
    expect(r.code).toBe(code);
    expect(Object.is(r.code, -0)).toBe(false);
    expect(r.clipped).toBe(false);
  });

  it('ties at the rails: 7.5 V rounds to 8, beyond codeMax (clipped); −8.5 V rounds to −8 (rail, not clipped)', () => {
    expect(adc.codeFromVolts(7.5)).toEqual({ code: 7, clipped: true, atRail: true });
    expect(adc.codeFromVolts(7.4999999)).toEqual({ code: 7, clipped: false, atRail: true });
    expect(adc.codeFromVolts(-8.5)).toEqual({ code: -8, clipped: false, atRail: true });
    expect(adc.codeFromVolts(-8.5000001)).toEqual({ code: -8, clipped: true, atRail: true });
    expect(adc.codeFromVolts(1e300)).toEqual({ code: 7, clipped: true, atRail: true });
    expect(adc.codeFromVolts(-Number.MAX_VALUE)).toEqual({ code: -8, clipped: true, atRail: true });
  });

  it('agrees with 60-digit decimal rounding one ulp either side of floating-point near-ties', () => {
    const f64 = new Float64Array(1);
    const i64 = new BigInt64Array(f64.buffer);
    const step = (x: number, ulps: number): number => {
      f64[0] = x;
      i64[0] = (i64[0] as bigint) + BigInt(ulps);
      return f64[0] as number;
    };
    fc.assert(
      fc.property(
        adcOptions,
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.integer({ min: -3, max: 3 }),
        (o, u, ulps) => {
          const a = createAdc(o);
          // A half-integer inside the code range, its input voltage rounded to double, nudged by ulps.
          const k = Math.floor((u * (a.codeMax - a.codeMin)) / 2) + 0.5;
          const v = step((k * o.referenceVolts) / (o.gain * a.codeScale), ulps);
          if (v === 0) return;
          const ref = exactCode(o.gain, v, a.codeScale, o.referenceVolts);
          expect(a.codeFromVolts(v).code).toBe(clip(ref, a.codeMin, a.codeMax));
        },
      ),
      { numRuns: 800 },
    );
  });

  it('agrees with 60-digit decimal rounding for arbitrary inputs, clipping included', () => {
    fc.assert(
      fc.property(adcOptions, fc.double({ min: -1.2, max: 1.2, noNaN: true }), (o, u) => {
        const a = createAdc(o);
        const v = (u * o.referenceVolts) / o.gain;
        const ref = exactCode(o.gain, v, a.codeScale, o.referenceVolts);
        const r = a.codeFromVolts(v);
        expect(r.code).toBe(clip(ref, a.codeMin, a.codeMax));
        expect(r.clipped).toBe(ref < a.codeMin || ref > a.codeMax);
        expect(r.atRail).toBe(r.code === a.codeMin || r.code === a.codeMax);
      }),
      { numRuns: 800 },
    );
  });

  it('ratiometric codes agree with 60-digit decimal rounding, near ties too', () => {
    fc.assert(
      fc.property(
        adcOptions,
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.integer({ min: -2, max: 2 }),
        (o, u, d) => {
          const a = createAdc({ ...o, ratiometric: true });
          const k = Math.floor((u * (a.codeMax - a.codeMin)) / 2) + 0.5;
          const ratio = (k / (o.gain * a.codeScale)) * (1 + d * Number.EPSILON);
          const ref = exactCode(o.gain, ratio, a.codeScale, 1);
          expect(a.codeFromRatio(ratio).code).toBe(clip(ref, a.codeMin, a.codeMax));
        },
      ),
      { numRuns: 1000 },
    );
  });
});

describe('createAdc: inverse maps and round trips', () => {
  it('voltsFromCode is exactly code·lsbVolts, within 2 ulps of the exact code·Vref/(gain·s)', () => {
    fc.assert(
      fc.property(adcOptions, fc.double({ min: 0, max: 1, noNaN: true }), (o, u) => {
        const a = createAdc(o);
        const code = a.codeMin + Math.floor(u * (a.codeMax - a.codeMin));
        const v = a.voltsFromCode(code);
        expect(v).toBe(code * a.lsbVolts);
        const ref = X(code).times(X(o.referenceVolts)).div(X(o.gain).times(a.codeScale)).toNumber();
        expect(v).toBeNear(ref, { ulps: 2, abs: 0 });
      }),
      { numRuns: 1000 },
    );
  });

  it('ratioFromCode is correctly rounded (code/countsPerRatio with an exact divisor)', () => {
    fc.assert(
      fc.property(adcOptions, fc.double({ min: 0, max: 1, noNaN: true }), (o, u) => {
        const a = createAdc({ ...o, ratiometric: true });
        const code = a.codeMin + Math.floor(u * (a.codeMax - a.codeMin));
        expect(X(a.countsPerRatio).eq(X(o.gain).times(a.codeScale))).toBe(true); // exact
        const ref = X(code).div(X(o.gain).times(a.codeScale)).toNumber();
        expect(a.ratioFromCode(code)).toBeNear(ref, { ulps: 0, abs: 0 });
      }),
      { numRuns: 1000 },
    );
  });

  it('round trip: every code maps to a voltage (and a ratio) that maps back to it', () => {
    fc.assert(
      fc.property(adcOptions, fc.double({ min: 0, max: 1, noNaN: true }), (o, u) => {
        const a = createAdc({ ...o, ratiometric: true });
        const code = Math.min(a.codeMax, a.codeMin + Math.floor(u * (a.codeMax - a.codeMin + 1)));
        const fromVolts = a.codeFromVolts(a.voltsFromCode(code));
        const fromRatio = a.codeFromRatio(a.ratioFromCode(code));
        expect(fromVolts.code).toBe(code);
        expect(fromRatio.code).toBe(code);
        expect(fromVolts.clipped).toBe(false);
        expect(fromVolts.atRail).toBe(code === a.codeMin || code === a.codeMax);
      }),
      { numRuns: 2000 },
    );
  });

  it('unclippedInputVolts: just inside its ends the codes are one step inside the rails', () => {
    const a = createAdc({ bits: 16, referenceVolts: 2.5, gain: 8 });
    const up = (x: number) => x + Math.abs(x) * Number.EPSILON;
    const down = (x: number) => x - Math.abs(x) * Number.EPSILON;
    expect(a.codeFromVolts(up(a.unclippedInputVolts.min)).code).toBe(a.codeMin + 1);
    expect(a.codeFromVolts(down(a.unclippedInputVolts.max)).code).toBe(a.codeMax - 1);
    expect(a.codeFromVolts(down(a.unclippedInputVolts.min)).atRail).toBe(true);
    expect(a.codeFromVolts(up(a.unclippedInputVolts.max)).atRail).toBe(true);
    expect(a.isRail(a.codeMin)).toBe(true);
    expect(a.isRail(a.codeMax)).toBe(true);
    expect(a.isRail(a.codeMax + 5)).toBe(true);
    expect(a.isRail(0)).toBe(false);
  });
});

describe('createAdc: ideal noise figures', () => {
  it('quantization noise is q/√12; it equals the rms error of a uniform sweep (Bennett 1948)', () => {
    const a = createAdc({ bits: 10, referenceVolts: 1 });
    expect(a.quantizationNoiseRmsVolts).toBe(quantizationNoiseRms(a.lsbVolts));
    // Deterministic sweep of m points per step over 64 steps: the error is uniform on (−q/2, q/2)
    // up to the grid, rms² = q²/12·(1 − 1/m²) exactly for a midpoint grid.
    const m = 500;
    let sum = 0;
    const n = 64 * m;
    for (let i = 0; i < n; i++) {
      const v = (100 + (i + 0.5) / m - 0.5) * a.lsbVolts;
      const e = a.voltsFromCode(a.codeFromVolts(v).code) - v;
      sum += e * e;
    }
    expect(Math.sqrt(sum / n)).toBeNear(a.quantizationNoiseRmsVolts * Math.sqrt(1 - 1 / m ** 2), {
      rel: 1e-9,
    });
  });

  it('an ideal converter’s quantization noise gives exactly its bits of ENOB; SNR is 6.02N + 1.76 dB', () => {
    for (const bits of [8, 16, 24]) {
      const a = createAdc({ bits, referenceVolts: 2.5, gain: 4 });
      expect(a.effectiveBits(a.quantizationNoiseRmsVolts)).toBeNear(bits, { abs: 1e-12 });
      expect(
        effectiveBits({
          noiseRmsVolts: a.quantizationNoiseRmsVolts,
          fullScaleRangeVolts: a.fullScaleRangeVolts,
        }),
      ).toBe(a.effectiveBits(a.quantizationNoiseRmsVolts));
      expect(a.noiseFreeBits(a.quantizationNoiseRmsVolts)).toBeNear(bits - Math.log2(6.6 / Math.sqrt(12)), {
        abs: 1e-12,
      });
      expect(a.idealSnrDecibels).toBeNear(6.0206 * bits + 1.7609, { abs: 1e-4 * bits + 1e-4 });
    }
  });
});

describe('createAdc: bad inputs', () => {
  const good = { bits: 24, referenceVolts: 2.5 };
  it.each([
    ['zero bits', { ...good, bits: 0 }, 'out-of-range', 'bits'],
    ['33 bits', { ...good, bits: 33 }, 'out-of-range', 'bits'],
    ['fractional bits', { ...good, bits: 12.5 }, 'not-integer', 'bits'],
    ['NaN bits', { ...good, bits: Number.NaN }, 'not-finite', 'bits'],
    ['missing bits', { referenceVolts: 2.5 }, 'missing-option', 'options.bits'],
    ['negative reference', { ...good, referenceVolts: -2.5 }, 'not-positive', 'referenceVolts'],
    ['zero reference', { ...good, referenceVolts: 0 }, 'not-positive', 'referenceVolts'],
    ['infinite reference', { ...good, referenceVolts: Infinity }, 'not-finite', 'referenceVolts'],
    ['zero gain', { ...good, gain: 0 }, 'not-positive', 'gain'],
    ['NaN gain', { ...good, gain: Number.NaN }, 'not-finite', 'gain'],
    ['string bipolar', { ...good, bipolar: 'yes' }, 'wrong-type', 'bipolar'],
    ['numeric ratiometric', { ...good, ratiometric: 1 }, 'wrong-type', 'ratiometric'],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => createAdc(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects bad inputs to the maps', () => {
    const a = createAdc({ ...good, ratiometric: true });
    expect(() => a.codeFromVolts(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'volts' });
    expect(() => a.codeFromVolts('1' as never)).toThrowBridgeworkError('wrong-type', { param: 'volts' });
    expect(() => a.codeFromRatio(Infinity)).toThrowBridgeworkError('not-finite', { param: 'ratio' });
    expect(() => a.voltsFromCode(0.5)).toThrowBridgeworkError('not-integer', { param: 'code' });
    expect(() => a.voltsFromCode(2 ** 23)).toThrowBridgeworkError('out-of-range', { param: 'code' });
    expect(() => a.ratioFromCode(-(2 ** 23) - 1)).toThrowBridgeworkError('out-of-range', { param: 'code' });
    expect(() => a.isRail(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'code' });
    expect(() => a.effectiveBits(0)).toThrowBridgeworkError('not-positive', { param: 'noiseRmsVolts' });
    expect(() => createAdc(null as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });
});
