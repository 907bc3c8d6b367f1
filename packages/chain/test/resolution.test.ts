import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  PEAK_TO_PEAK_PER_RMS,
  effectiveBits,
  effectiveResolutionBits,
  enobFromSinad,
  idealSnrDecibels,
  noiseFreeBits,
} from '@bridgework/chain';

describe('idealSnrDecibels and enobFromSinad (IEEE Std 1241)', () => {
  it('24 bits → 146.26 dB (issue #4: 6.02·24 + 1.76 = 146.24 rounded form; exact form 146.2553)', () => {
    // Exact form 20·log10(2^24·√1.5) = 24·6.0205999 + 1.7609126 = 146.2553 dB; the 146.26
    // is this to two decimals (the rounded constants would give 146.24).
    expect(idealSnrDecibels(24)).toBeNear(146.26, { abs: 0.005 });
    expect(idealSnrDecibels(24)).toBeNear(20 * Math.log10(2 ** 24 * Math.sqrt(1.5)), { ulps: 4 });
  });

  it('ENOB for SINAD 74 dB = 12.00 bits (issue #4; IEEE Std 1241 ENOB = (SINAD − 1.76)/6.02)', () => {
    // Exact constants: (74 − 1.7609126)/6.0205999 = 11.99865; the rounded ones give 12.0000.
    expect(enobFromSinad(74)).toBeNear(12.0, { abs: 0.005 });
    expect(enobFromSinad(74)).toBeNear((74 - 10 * Math.log10(1.5)) / (20 * Math.log10(2)), { ulps: 2 });
    expect((74 - 1.76) / 6.02).toBeNear(12, { ulps: 1 });
  });

  it('the two are inverse to each other, for every bit count', () => {
    for (let n = 1; n <= 64; n++) expect(enobFromSinad(idealSnrDecibels(n))).toBeNear(n, { abs: 1e-13 });
  });

  it('ENOB from SINAD equals ENOB from rms noise for a full-scale sine (the IEEE 1241 definition)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.double({ min: -9, max: -2, noNaN: true }),
        (fsr, e) => {
          const sigma = 10 ** e * fsr;
          const sinad = 20 * Math.log10(fsr / (2 * Math.SQRT2) / sigma); // sine rms over noise rms
          expect(enobFromSinad(sinad)).toBeNear(
            effectiveBits({ noiseRmsVolts: sigma, fullScaleRangeVolts: fsr }),
            {
              abs: 1e-12,
            },
          );
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('effectiveBits, effectiveResolutionBits, noiseFreeBits', () => {
  it('relate by the fixed factors √12 and 6.6 (peak-to-peak = 6.6σ, common practice)', () => {
    const o = { noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5 };
    expect(effectiveResolutionBits(o)).toBeNear(Math.log2(5e6), { ulps: 2 });
    expect(effectiveResolutionBits(o) - effectiveBits(o)).toBeNear(Math.log2(Math.sqrt(12)), { abs: 1e-13 });
    expect(effectiveResolutionBits(o) - noiseFreeBits(o)).toBeNear(Math.log2(6.6), { abs: 1e-13 });
    expect(PEAK_TO_PEAK_PER_RMS).toBe(6.6);
    expect(noiseFreeBits({ ...o, peakToPeakFactor: 6 })).toBeNear(Math.log2(5e6 / 6), { ulps: 2 });
  });

  it('a 24-bit sigma-delta with 0.5 µV rms over ±2.5 V: 23.25 effective, 20.53 noise-free (data-sheet style)', () => {
    // FSR = 5 V; log2(5/0.5e-6) = 23.2535; minus log2(6.6) = 2.7225 → 20.5310 (computed by hand).
    const o = { noiseRmsVolts: 0.5e-6, fullScaleRangeVolts: 5 };
    expect(effectiveResolutionBits(o)).toBeNear(23.2535, { abs: 1e-4 });
    expect(noiseFreeBits(o)).toBeNear(20.531, { abs: 1e-3 });
  });

  it.each([
    ['zero noise', { noiseRmsVolts: 0, fullScaleRangeVolts: 5 }, 'not-positive', 'noiseRmsVolts'],
    [
      'NaN range',
      { noiseRmsVolts: 1e-6, fullScaleRangeVolts: Number.NaN },
      'not-finite',
      'fullScaleRangeVolts',
    ],
    [
      'negative range',
      { noiseRmsVolts: 1e-6, fullScaleRangeVolts: -5 },
      'not-positive',
      'fullScaleRangeVolts',
    ],
    [
      'zero factor',
      { noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5, peakToPeakFactor: 0 },
      'not-positive',
      'peakToPeakFactor',
    ],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => noiseFreeBits(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects bad bit counts and SINAD', () => {
    expect(() => idealSnrDecibels(0)).toThrowBridgeworkError('out-of-range', { param: 'bits' });
    expect(() => idealSnrDecibels(16.5)).toThrowBridgeworkError('not-integer', { param: 'bits' });
    expect(() => idealSnrDecibels('16' as never)).toThrowBridgeworkError('wrong-type', { param: 'bits' });
    expect(() => enobFromSinad(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'sinadDecibels' });
    expect(() => effectiveBits(undefined as never)).toThrowBridgeworkError('wrong-type', {
      param: 'options',
    });
  });
});
