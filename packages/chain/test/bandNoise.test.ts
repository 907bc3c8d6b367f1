import { describe, expect, it } from 'vitest';
import { bandNoiseRms, noiseBandwidth, noiseDensityAt, quantizationNoiseRms } from '@bridgework/chain';
import { piecewise } from './support/integrate.js';

describe('noiseDensityAt', () => {
  it('is S₀·√(1 + fc/f): √2 times the floor at the corner, the floor far above it', () => {
    expect(noiseDensityAt({ whiteDensity: 10e-9, cornerHertz: 100, frequencyHertz: 100 })).toBeNear(
      10e-9 * Math.SQRT2,
      {
        ulps: 2,
      },
    );
    expect(noiseDensityAt({ whiteDensity: 10e-9, cornerHertz: 100, frequencyHertz: 1 })).toBeNear(
      10e-9 * Math.sqrt(101),
      {
        ulps: 2,
      },
    );
    expect(noiseDensityAt({ whiteDensity: 10e-9, frequencyHertz: 1e-3 })).toBe(10e-9);
  });
});

describe('bandNoiseRms', () => {
  it('white noise through any filter is S₀·√ENBW', () => {
    const filter = { kind: 'sinc', order: 4, dataRateHertz: 20 } as const;
    expect(bandNoiseRms({ whiteDensity: 7e-9, filter })).toBeNear(7e-9 * Math.sqrt(noiseBandwidth(filter)), {
      ulps: 2,
    });
    expect(bandNoiseRms({ whiteDensity: 10e-9, filter: { kind: 'brick-wall', cutoffHertz: 100 } })).toBeNear(
      1e-7,
      {
        ulps: 2,
      },
    );
  });

  it('brick wall with a 1/f corner: S₀·√(fH + fc·ln(fH/fL)) (op-amp noise application notes, from memory)', () => {
    const rms = bandNoiseRms({
      whiteDensity: 10e-9,
      cornerHertz: 10,
      filter: { kind: 'brick-wall', cutoffHertz: 10 },
      lowHertz: 0.1,
    });
    expect(rms).toBeNear(10e-9 * Math.sqrt(10 + 10 * Math.log(100)), { ulps: 4 });
  });

  it('single pole with a 1/f corner equals the direct integral of S₀²(1 + fc/f)|H|² from fL (plus white from 0)', () => {
    const f0 = 5;
    const fc = 30;
    const fL = 0.02;
    const rms = bandNoiseRms({
      whiteDensity: 1,
      cornerHertz: fc,
      filter: { kind: 'single-pole', cutoffHertz: f0 },
      lowHertz: fL,
    });
    const h2 = (f: number) => 1 / (1 + (f / f0) ** 2);
    // White part over [0, ∞) and 1/f part over [fL, ∞), both on a log grid up to 1e6·f0 plus tails.
    const white = piecewise(h2, 0, 1e3 * f0, 2000) + f0 * (1 / 1e3);
    const flicker = piecewise((u) => h2(Math.exp(u)), Math.log(fL), Math.log(1e6 * f0), 400) + 0.5e-12;
    expect(rms * rms).toBeNear(white + fc * flicker, { rel: 1e-9 });
  });

  it('requires lowHertz when a corner is given, and ignores it otherwise', () => {
    const filter = { kind: 'single-pole', cutoffHertz: 1 } as const;
    expect(() => bandNoiseRms({ whiteDensity: 1e-9, cornerHertz: 1, filter })).toThrowBridgeworkError(
      'missing-option',
      {
        param: 'lowHertz',
      },
    );
    expect(() =>
      bandNoiseRms({ whiteDensity: 1e-9, cornerHertz: 1, filter, lowHertz: 0 }),
    ).toThrowBridgeworkError('not-positive', { param: 'lowHertz' });
    // Without a corner a (valid) lowHertz has no effect; an invalid one is refused all the same.
    expect(bandNoiseRms({ whiteDensity: 1e-9, filter, lowHertz: 1e-3 })).toBeNear(
      1e-9 * Math.sqrt(Math.PI / 2),
      { ulps: 2 },
    );
    expect(() => bandNoiseRms({ whiteDensity: 1e-9, filter, lowHertz: 0 })).toThrowBridgeworkError(
      'not-positive',
      { param: 'lowHertz' },
    );
    expect(bandNoiseRms({ whiteDensity: 0, cornerHertz: 5, filter })).toBe(0);
  });

  it.each([
    ['negative density', { whiteDensity: -1 }, 'negative', 'whiteDensity'],
    ['NaN corner', { whiteDensity: 1, cornerHertz: Number.NaN }, 'not-finite', 'cornerHertz'],
    ['no filter', { whiteDensity: 1, filter: undefined }, 'missing-option', 'options.filter'],
    ['string low', { whiteDensity: 1, cornerHertz: 1, lowHertz: '1' }, 'wrong-type', 'lowHertz'],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() =>
      bandNoiseRms({ filter: { kind: 'brick-wall', cutoffHertz: 1 }, ...options } as never),
    ).toThrowBridgeworkError(code, { param });
  });

  it('noiseDensityAt rejects a zero frequency and a negative corner', () => {
    expect(() => noiseDensityAt({ whiteDensity: 1, frequencyHertz: 0 })).toThrowBridgeworkError(
      'not-positive',
      {
        param: 'frequencyHertz',
      },
    );
    expect(() =>
      noiseDensityAt({ whiteDensity: 1, cornerHertz: -1, frequencyHertz: 1 }),
    ).toThrowBridgeworkError('negative', { param: 'cornerHertz' });
  });
});

describe('quantizationNoiseRms', () => {
  it('is q/√12, the standard deviation of a uniform error on (−q/2, q/2) (Bennett 1948)', () => {
    const q = 2.5e-6;
    const variance = piecewise((e) => e * e, -q / 2, q / 2, 4) / q; // ∫ e² de / q over one step
    expect(quantizationNoiseRms(q)).toBeNear(Math.sqrt(variance), { rel: 1e-13 });
    expect(quantizationNoiseRms(q)).toBeNear(q / Math.sqrt(12), { ulps: 1 });
    expect(() => quantizationNoiseRms(0)).toThrowBridgeworkError('not-positive', { param: 'lsbVolts' });
  });
});
