/**
 * Regressions of issue 15 in the chain package: each defect the attacks found, with the test named
 * after what it checks.
 */
import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import {
  bandNoiseRms,
  checkHeadroom,
  checkSelfHeating,
  effectiveBits,
  filterGain,
  inputNoiseDensity,
  mainsRejection,
  noiseDensityAt,
  resolutionBudget,
  selectGain,
} from '@bridgework/chain';
import { selfHeatingVerdict } from '../src/selfHeating.js';

const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
const budget = {
  span: { bridge, strainRange: { min: -2e-3, max: 2e-3 } },
  excitationVolts: 5,
  adc: { bits: 24, ratiometric: true },
  filter: { kind: 'sinc', order: 3, dataRateHertz: 10 },
} as const;

describe('regressions: a check whose figure is not finite is never ok (issue 15, item 3)', () => {
  it('checkSelfHeating with an arm of 1e308 Ω is refused, never { ok: true, gaugeWatts: NaN }', () => {
    expect(() =>
      checkSelfHeating({
        armsOhms: [1e308, 350, 350, 350],
        excitationVolts: 5,
        limit: { maxWattsPerGauge: 0.01 },
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'armsOhms[0]' });
  });

  it('the self-heating verdict is not ok when the gauge power is NaN, though NaN < limit is false', () => {
    const limit = {
      maxWattsPerGauge: 0.01,
      basis: 'power',
      powerDensityWattsPerSquareMeter: undefined,
    } as const;
    const verdict = selfHeatingVerdict([Number.NaN, 0, 0, 0], Number.NaN, 5, limit);
    expect(verdict.issues).toEqual([]);
    expect(verdict.ok).toBe(false);
  });

  it('checkHeadroom with a differential input beyond ±1e6 V is refused, never ok with −∞ margins', () => {
    expect(() =>
      checkHeadroom({ points: [{ differentialVolts: 1e308, commonModeVolts: 2.5 }], gain: 1 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'points[0].differentialVolts' });
  });
});

describe('regressions: misspelt or missing options are never read as zero (issue 15, item 5)', () => {
  const filter = { kind: 'brick-wall', cutoffHertz: 100 } as const;

  it('bandNoiseRms({ whiteDensty }) names whiteDensity instead of integrating a zero density', () => {
    expect(() => bandNoiseRms({ whiteDensty: 15e-9, filter } as never)).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'options.whiteDensty',
      },
    );
    expect(() => bandNoiseRms({ whiteDensty: 15e-9, filter } as never)).toThrow(
      'did you mean `whiteDensity`?',
    );
  });

  it('bandNoiseRms without whiteDensity is a missing option, not a zero density', () => {
    expect(() => bandNoiseRms({ filter } as never)).toThrowBridgeworkError('missing-option', {
      param: 'options.whiteDensity',
    });
  });

  it('noiseDensityAt with a misspelt or missing whiteDensity is refused, not 0', () => {
    expect(() => noiseDensityAt({ whiteDenisty: 1e-8, frequencyHertz: 1 } as never)).toThrowBridgeworkError(
      'unknown-option',
    );
    expect(() => noiseDensityAt({ frequencyHertz: 1 } as never)).toThrowBridgeworkError('missing-option', {
      param: 'options.whiteDensity',
    });
  });

  it('inputNoiseDensity refuses a misspelt amplifier field instead of dropping it', () => {
    expect(() =>
      inputNoiseDensity({
        armsOhms: [350, 350, 350, 350],
        amplifier: { inputVoltageNoiseVoltPerRootHz: 15e-9 } as never,
      }),
    ).toThrowBridgeworkError('unknown-option', { param: 'amplifier.inputVoltageNoiseVoltPerRootHz' });
  });

  it('a budget refuses misspelt keys inside adc, filter and amplifier limits', () => {
    expect(() =>
      resolutionBudget({ ...budget, gain: 1, adc: { bits: 24, ratiometrik: true } } as never),
    ).toThrow('did you mean `ratiometric`?');
    expect(() =>
      resolutionBudget({ ...budget, gain: 1, filter: { kind: 'sinc', order: 3, dataRate: 10 } } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'filter.dataRate' });
    expect(() =>
      resolutionBudget({
        ...budget,
        gain: 1,
        amplifier: { limits: { outputVolt: { min: 0, max: 5 } } },
      } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'amplifier.limits.outputVolt' });
  });
});

describe('regressions: finite inputs never give non-finite outputs (issue 15, item 7)', () => {
  it('filterGain at a data rate of 1e-308 Hz is refused (outside [1e-9, 1e12] Hz), not NaN', () => {
    expect(() => filterGain({ kind: 'sinc', order: 3, dataRateHertz: 1e-308 }, 50)).toThrowBridgeworkError(
      'out-of-range',
      { param: 'filter.dataRateHertz' },
    );
  });

  it('filterGain at the ends of the frequency domain is finite', () => {
    for (const dataRateHertz of [1e-9, 1e12]) {
      for (const f of [-1e12, 0, 1e-9, 1e12]) {
        const g = filterGain({ kind: 'sinc', order: 5, dataRateHertz }, f);
        expect(g >= 0 && g <= 1, `${dataRateHertz} Hz, f = ${f}`).toBe(true);
      }
    }
  });

  it('effectiveBits is finite for any positive noise and range (log form, no overflow)', () => {
    // log2(FSR/(σ√12)) with FSR = 1e308, σ = 1e-308: 2048.6… bits, formed as a difference of logs.
    const bits = effectiveBits({ noiseRmsVolts: 1e-308, fullScaleRangeVolts: 1e308 });
    expect(bits).toBeNear(Math.log2(1e308) - Math.log2(1e-308) - Math.log2(Math.sqrt(12)), { ulps: 4 });
    expect(Number.isFinite(effectiveBits({ noiseRmsVolts: 1e308, fullScaleRangeVolts: 1e-308 }))).toBe(true);
  });
});

describe('regressions: bounded work (issue 15, item 8)', () => {
  it('selectGain refuses a list of a million gains at once instead of hanging', () => {
    // Refused before any budget is formed (the documented limit is 4096 gains).
    const gains = new Array<number>(1_000_000).fill(1);
    expect(() => selectGain({ ...budget, gains })).toThrowBridgeworkError('out-of-range', { param: 'gains' });
  });

  it('mainsRejection refuses a band spanning more than 100 000 nulls instead of searching them all', () => {
    expect(() =>
      mainsRejection({ filter: { kind: 'sinc', order: 3, dataRateHertz: 1e-9 }, mainsHertz: 50 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'deviationHertz' });
  });
});
