import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import {
  bandNoiseRms,
  johnsonNoiseDensity,
  noiseBandwidth,
  resolutionBudget,
  type RatiometricAdc,
} from '@bridgework/chain';

const quarter = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
const sinc3 = { kind: 'sinc', order: 3, dataRateHertz: 10 } as const;
const base = {
  span: { bridge: quarter, strainRange: { min: -2e-3, max: 2e-3 } },
  excitationVolts: 5,
  gain: 128,
  adc: { bits: 24, ratiometric: true },
  filter: sinc3,
};

describe('resolutionBudget: issue #4 check values', () => {
  it('quarter bridge, GF 2, 24 bits ratiometric, gain 128: 536.870912 counts per µε', () => {
    // Derived: slope GF/4 = 0.5 V/V per m/m; 128·2^23 = 2^30 counts per V/V; 0.5·2^30·1e-6.
    const { value, ok } = resolutionBudget(base);
    expect(ok).toBe(true);
    expect(value.countsPerMicrostrain).toBeNear(536.870912, { ulps: 1 });
    expect(value.voltsPerMicrostrain).toBeNear(2.5e-6, { ulps: 1 }); // 5 V × 0.5 / 10⁶
    expect(value.countsPerUnit).toBe(0.5 * 2 ** 30);
    expect(value.measurand).toBe('strain');
  });

  it('the combined budget: 350 Ω, 10 nV/√Hz, 1 pA/√Hz, 25 °C through a 10 Hz sinc3, by hand', () => {
    const r = resolutionBudget({
      ...base,
      amplifier: { inputVoltageNoiseVoltsPerRootHz: 10e-9, currentNoiseAmpsPerRootHz: 1e-12 },
    });
    // Density √(e_n² + 4kTR + 2·(i_n·175 Ω)²) = 10.28709 nV/√Hz (issue #4) over ENBW = 0.275·10 Hz,
    // plus q/√12 with q = 5 V/(128·2^23).
    const density = Math.sqrt(1e-16 + johnsonNoiseDensity({ ohms: 350 }) ** 2 + 2 * (1e-12 * 175) ** 2);
    expect(density * 1e9).toBeNear(10.28709, { abs: 5e-6 });
    const q = 5 / (128 * 2 ** 23);
    const sigma = Math.sqrt(density ** 2 * 2.75 + q ** 2 / 12);
    const b = r.value;
    expect(b.noise.noiseBandwidthHertz).toBeNear(2.75, { ulps: 1 });
    expect(b.noise.totalRmsVolts).toBeNear(sigma, { rel: 1e-14 });
    expect(b.noise.totalPeakToPeakVolts).toBeNear(6.6 * sigma, { rel: 1e-14 });
    expect(b.noise.terms.map((t) => t.name)).toEqual([
      'bridge-thermal',
      'amplifier-voltage',
      'amplifier-current',
      'amplifier-output',
      'quantization',
    ]);
    expect(b.noise.terms[1]!.rmsVolts).toBeNear(10e-9 * Math.sqrt(2.75), { ulps: 2 });
    expect(b.noise.terms.reduce((s, t) => s + t.fractionOfPower, 0)).toBeNear(1, { ulps: 8 });
    expect(b.noise.sourceOhms).toBe(350);
    // Resolution: σ over 2.5 µV per µε; noise-free = 6.6σ; counts over the ±2000 µε span.
    expect(b.resolution.rmsMicrostrain).toBeNear(sigma / 2.5e-6, { rel: 1e-14 });
    expect(b.resolution.noiseFreeMicrostrain).toBeNear((6.6 * sigma) / 2.5e-6, { rel: 1e-14 });
    expect(b.resolution.rms).toBeNear(sigma / 2.5, { rel: 1e-14 });
    const span = 5 * (quarter.ratioFromStrain(2e-3) - quarter.ratioFromStrain(-2e-3));
    expect(b.spanVolts.max - b.spanVolts.min).toBeNear(span, { rel: 1e-14 });
    expect(b.resolution.noiseFreeCounts).toBeNear(span / (6.6 * sigma), { rel: 1e-14 });
    expect(b.resolution.noiseFreeBitsOverSpan).toBeNear(Math.log2(span / (6.6 * sigma)), { rel: 1e-14 });
    expect(b.resolution.rmsCounts).toBeNear(sigma / q, { rel: 1e-14 });
    expect(b.resolution.effectiveBits).toBeNear(Math.log2((2 * 5) / 128 / (sigma * Math.sqrt(12))), {
      rel: 1e-14,
    });
    // Codes at the span's ends and zero: the converter's map of the bridge's exact ratio.
    const adc = b.adc as RatiometricAdc;
    expect(b.points.map((p) => p.adcCode.code)).toEqual(
      [-2e-3, 0, 2e-3].map((e) => adc.codeFromRatio(quarter.ratioFromStrain(e)).code),
    );
    expect(b.points[2]!.adcCode.code).toBe(1071599); // 2^30·0.004/4.008 = 1 071 598.63 by hand
  });

  it('integrates 1/f noise from lowHertz and refers output noise to the input', () => {
    const amplifier = {
      inputVoltageNoiseVoltsPerRootHz: 12e-9,
      voltageCornerHertz: 20,
      currentNoiseAmpsPerRootHz: 0.3e-12,
      currentCornerHertz: 100,
      outputVoltageNoiseVoltsPerRootHz: 120e-9,
    };
    const { value } = resolutionBudget({ ...base, gain: 32, amplifier, lowHertz: 0.01 });
    const t = Object.fromEntries(value.noise.terms.map((x) => [x.name, x.rmsVolts]));
    expect(t['amplifier-voltage']).toBe(
      bandNoiseRms({ whiteDensity: 12e-9, cornerHertz: 20, filter: sinc3, lowHertz: 0.01 }),
    );
    expect(t['amplifier-current']).toBeNear(
      bandNoiseRms({
        whiteDensity: 0.3e-12 * (350 / Math.SQRT2),
        cornerHertz: 100,
        filter: sinc3,
        lowHertz: 0.01,
      }),
      { ulps: 4 },
    );
    expect(t['amplifier-output']).toBeNear((120e-9 * Math.sqrt(2.75)) / 32, { ulps: 2 });
    expect(() => resolutionBudget({ ...base, amplifier })).toThrowBridgeworkError('missing-option', {
      param: 'lowHertz',
    });
  });

  it('a transducer span in ratio: a 2 mV/V load cell on 10 V, resolution in V/V and noise-free divisions', () => {
    const { value } = resolutionBudget({
      span: { armsOhms: [350, 350, 350, 350], ratioRange: { min: 0, max: 2e-3 } },
      excitationVolts: 10,
      gain: 128,
      adc: { bits: 24, ratiometric: true },
      filter: sinc3,
    });
    expect(value.measurand).toBe('ratio');
    expect(value.sensitivityVolts).toBe(10);
    expect(value.countsPerUnit).toBe(2 ** 30);
    expect(value.countsPerMicrostrain).toBeUndefined();
    expect(value.resolution.rmsMicrostrain).toBeUndefined();
    expect(value.resolution.rms).toBeNear(value.noise.totalRmsVolts / 10, { ulps: 1 });
    expect(value.resolution.noiseFreeCounts).toBeNear(0.02 / (6.6 * value.noise.totalRmsVolts), {
      rel: 1e-14,
    });
    expect(value.gaugeWatts).toBeNear(25 / 350, { ulps: 4 }); // every arm carries 5 V
  });

  it('uses the converter’s own noise when given (a number or a function of gain) instead of q/√12', () => {
    const plain = {
      ...base,
      adc: { bits: 24, referenceVolts: 2.5, noiseRmsVolts: (g: number) => 20e-9 / Math.sqrt(g) },
    };
    const { value } = resolutionBudget(plain);
    const adcTerm = value.noise.terms.find((t) => t.name === 'adc')!;
    expect(adcTerm.rmsVolts).toBe(20e-9 / Math.sqrt(128));
    expect(value.noise.terms.some((t) => t.name === 'quantization')).toBe(false);
    expect(value.adc.ratiometric).toBe(false);
    expect(value.countsPerUnit).toBeNear(2.5 * ((128 * 2 ** 23) / 2.5), { ulps: 1 }); // 5 V·0.5 × counts per volt
    const fixed = resolutionBudget({
      ...base,
      adc: { bits: 24, ratiometric: true, noiseRmsVolts: 3e-9 },
    }).value;
    expect(fixed.noise.terms.find((t) => t.name === 'adc')!.rmsVolts).toBe(3e-9);
  });
});

describe('resolutionBudget: headroom and self-heating', () => {
  it('reports a first-stage clip, and the converter rails at an oversized span', () => {
    const r = resolutionBudget({
      ...base,
      gain: 128,
      amplifier: { limits: { firstStageVolts: { min: 2.0, max: 3.0 } } },
    });
    // ±2000 µε on 5 V is ±5 mV; G1·Vd/2 = 0.32 V around 2.5 V: inside 2.0–3.0 V.
    expect(r.ok).toBe(true);
    const wide = resolutionBudget({
      ...base,
      span: { bridge: quarter, strainRange: { min: -2e-2, max: 2e-2 } },
      amplifier: { limits: { firstStageVolts: { min: 2.0, max: 3.0 } } },
    });
    expect(wide.ok).toBe(false);
    expect(wide.issues.map((i) => i.limit).sort()).toEqual([
      'adc-high',
      'adc-low',
      'first-stage-high',
      'first-stage-low',
    ]);
    expect(wide.value.points[0]!.adcCode.atRail).toBe(true);
  });

  it('always reports the hottest gauge, and checks it against a limit when one is given', () => {
    const r = resolutionBudget({
      ...base,
      excitationVolts: 10,
      selfHeating: { gridAreaSquareMeters: 1e-5, heatSink: 'fair' },
    });
    // The gauge's power E²·R1/(R1 + R2)² peaks at R1 = R2, i.e. at zero strain: 5²/350 ≈ 71 mW,
    // against 1e-5 m² × 775 W/m² = 7.75 mW allowed.
    expect(r.value.gaugeWatts).toBeNear(25 / 350, { ulps: 4 });
    expect(r.value.selfHeating!.limitWatts).toBeNear(1e-5 * (0.5 / 6.4516e-4), { rel: 1e-15 });
    expect(r.ok).toBe(false);
    expect(r.issues.map((i) => i.limit)).toEqual(['self-heating']);
    expect(r.value.selfHeating!.maxExcitationVolts).toBeNear(
      10 * Math.sqrt(r.value.selfHeating!.limitWatts / r.value.gaugeWatts),
      {
        ulps: 4,
      },
    );
    expect(resolutionBudget(base).value.selfHeating).toBeUndefined();
  });
});

describe('resolutionBudget: bad inputs', () => {
  it.each([
    ['no reference for a plain converter', { adc: { bits: 24 } }, 'missing-option', 'adc.referenceVolts'],
    [
      'a ratiometric reference other than the excitation',
      { adc: { bits: 24, ratiometric: true, referenceVolts: 2.5 } },
      'conflicting-options',
      'adc.referenceVolts',
    ],
    ['zero bits', { adc: { bits: 0, ratiometric: true } }, 'out-of-range', 'adc.bits'],
    ['a non-boolean ratiometric', { adc: { bits: 24, ratiometric: 'yes' } }, 'wrong-type', 'adc.ratiometric'],
    [
      'a NaN converter noise',
      { adc: { bits: 24, ratiometric: true, noiseRmsVolts: Number.NaN } },
      'not-finite',
      'adc.noiseRmsVolts',
    ],
    [
      'a converter-noise function returning 0',
      { adc: { bits: 24, ratiometric: true, noiseRmsVolts: () => 0 } },
      'not-positive',
      'adc.noiseRmsVolts',
    ],
    ['zero gain', { gain: 0 }, 'not-positive', 'gain'],
    ['negative excitation', { excitationVolts: -5 }, 'not-positive', 'excitationVolts'],
    ['no filter', { filter: undefined }, 'missing-option', 'options.filter'],
    ['a bad peak-to-peak factor', { peakToPeakFactor: 0 }, 'out-of-range', 'peakToPeakFactor'],
    [
      'a bad self-heating limit',
      { selfHeating: { maxWattsPerGauge: -1 } },
      'not-positive',
      'selfHeating.maxWattsPerGauge',
    ],
    [
      'a bad amplifier noise',
      { amplifier: { inputVoltageNoiseVoltsPerRootHz: -1 } },
      'negative',
      'amplifier.inputVoltageNoiseVoltsPerRootHz',
    ],
    [
      'bad input series resistors',
      { amplifier: { inputSeriesOhms: [1] } },
      'invalid-shape',
      'amplifier.inputSeriesOhms',
    ],
    ['a cold bridge', { temperatureCelsius: -300 }, 'out-of-range', 'temperatureCelsius'],
  ] as const)('%s → %s', (_name, extra, code, param) => {
    expect(() => resolutionBudget({ ...base, ...extra } as never)).toThrowBridgeworkError(code, { param });
  });

  it('noiseBandwidth of the budget is that of its filter', () => {
    expect(resolutionBudget(base).value.noise.noiseBandwidthHertz).toBe(noiseBandwidth(sinc3));
  });
});
