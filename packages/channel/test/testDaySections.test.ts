import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { channelBudget, createChannel, validateChannelSpec, type ChannelSpec } from '@bridgework/channel';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });

const strain: ChannelSpec = {
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'strain' },
};

const loadCell: ChannelSpec = {
  sensor: { kind: 'transducer', capacity: 50_000, ratedOutputVoltsPerVolt: 0.002 },
  excitation: { volts: 5 },
  amplifier: { gain: 64 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'force', unit: 'kN', range: [0, 50] },
};

describe('spanCorrection', () => {
  it('converts as the channel whose gain is amplifier.gain / factor (the gain the shunt measured)', () => {
    const k = 1.00857;
    const corrected = createChannel({ ...strain, spanCorrection: { factor: k, shuntOhms: 174_650, arm: 1 } });
    const atGain = createChannel({ ...strain, amplifier: { gain: 128 / k } });
    for (const e of [-1.5e-3, -2e-4, 3e-4, 1.2e-3]) {
      const code = atGain.exactCodeFromQuantity(e);
      expect(corrected.quantityFromCode(code)).toBeNear(e, { rel: 1e-12 });
    }
  });

  it('recovers the strain a channel with a gain error reads (code = k⁻¹ × the nominal code, exact map)', () => {
    // A channel whose real gain is 0.9915 of its nominal one reads every code 0.9915 × the nominal
    // code (ratiometric, bipolar: code = G·2^(n−1)·ratio). The correction k = 1/0.9915 undoes it.
    const g = 0.9915;
    const truth = createChannel({ ...strain, amplifier: { gain: 128 * g } });
    const corrected = createChannel({ ...strain, spanCorrection: { factor: 1 / g } });
    fc.assert(
      fc.property(fc.double({ min: -2e-3, max: 2e-3, noNaN: true }), (e) => {
        const code = truth.exactCodeFromQuantity(e);
        expect(corrected.quantityFromCode(code)).toBeNear(e, { rel: 1e-9, abs: 1e-18 });
      }),
    );
  });

  it('refuses an implausible factor with its path', () => {
    const v = validateChannelSpec({ ...strain, spanCorrection: { factor: 3 } });
    expect(v.ok).toBe(false);
    expect(v.issues[0]?.path).toBe('spanCorrection.factor');
  });
});

describe('calibration', () => {
  // Ratio (V/V) against force in kN: a slightly curved load cell, 2 mV/V at 50 kN.
  const cubic = [1.2e-6, 4.0e-5, -2.0e-9, 1.5e-11];
  const section = { unit: 'kN', coefficients: cubic, range: [0, 50] as [number, number] };

  it('makes the channel convert through the inverse of the fitted polynomial (40-digit forward reference)', () => {
    const channel = createChannel({ ...loadCell, calibration: section });
    // Reference: r = P(q) in 40 digits; code = ratio·G·2^23 exactly for a ratiometric bipolar ADC.
    for (const q of [0.5, 10, 25, 49.5, 52]) {
      const r = cubic.reduceRight((s, c) => s.times(q).plus(c), new D(0));
      const code = r
        .times(64)
        .times(2 ** 23)
        .toNumber();
      expect(channel.quantityFromCode(code)).toBeNear(q, { rel: 1e-12 });
      expect(channel.inputAt(q).bridgeRatio).toBeNear(r.toNumber(), { rel: 1e-14 });
    }
  });

  it('is a Möbius kernel for a straight line, and reads outside its span as out of range', () => {
    const channel = createChannel({
      ...loadCell,
      output: { quantity: 'force', unit: 'kN', range: [1, 49] },
      calibration: { unit: 'kN', coefficients: [1e-6, 4.01e-5], range: [0, 50], extrapolationFraction: 0 },
    });
    expect(channel.method).toBe('kernel');
    const code = (r: number) => r * 64 * 2 ** 23;
    expect(channel.quantityFromCode(code(1e-6 + 4.01e-5 * 20))).toBeNear(20, { rel: 1e-13 });
    expect(() => channel.quantityFromCode(code(1e-6 + 4.01e-5 * 51))).toThrowBridgeworkError(
      'ratio-out-of-range',
    );
  });

  it('refuses a fit that is not monotone over its span, a unit that differs from output.unit, and a covariance of the wrong size', () => {
    const turning = validateChannelSpec({
      ...loadCell,
      calibration: { unit: 'kN', coefficients: [0, 4e-5, -1e-6], range: [0, 50] },
    });
    expect(turning.issues.map((i) => [i.path, i.code])).toEqual([
      ['calibration.coefficients', 'no-solution'],
    ]);
    const unit = validateChannelSpec({ ...loadCell, calibration: { ...section, unit: 'N' } });
    expect(unit.issues.map((i) => [i.path, i.code])).toEqual([['calibration.unit', 'conflicting-options']]);
    const cov = validateChannelSpec({ ...loadCell, calibration: { ...section, covariance: [1, 0, 0, 1] } });
    expect(cov.issues.map((i) => [i.path, i.code])).toEqual([['calibration.covariance', 'invalid-shape']]);
  });
});

describe('calibration in the budget', () => {
  it("adds the fitted curve's standard uncertainty at the budget point: √(gᵀVg)/|P′(q)| in the channel's unit (JCGM 100 H.3, first order)", () => {
    const c = [1.2e-6, 4.0e-5, -2.0e-9];
    const covariance = [4e-16, -1e-17, 1e-19, -1e-17, 9e-19, -2e-20, 1e-19, -2e-20, 8e-22];
    const channel = createChannel({
      ...loadCell,
      calibration: { unit: 'kN', coefficients: c, covariance, range: [0, 50] },
    });
    const budget = channelBudget(channel, { at: 40 });
    const line = budget.lines.find((l) => l.name === 'calibration fit');
    expect(line?.kind).toBe('calibration');
    const g = [1, 40, 1600];
    let variance = 0;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) variance += g[i]! * covariance[3 * i + j]! * g[j]!;
    const slope = c[1]! + 2 * c[2]! * 40;
    // The GUM's sensitivity is a numerical derivative of the exact map: agreement to 1e-6.
    expect(line?.standardUncertainty).toBeNear(Math.sqrt(variance) / Math.abs(slope), { rel: 1e-6 });
    // The rated output no longer counts: the calibration replaced the sensor's map.
    expect(budget.lines.find((l) => l.name === 'rated output')?.standardUncertainty ?? 0).toBeNear(0, {
      abs: 1e-15,
    });
    expect(budget.combined.standardUncertainty).toBeGreaterThanOrEqual(line!.standardUncertainty!);
  });
});

describe('span correction in the budget', () => {
  it("replaces the gain tolerance by the span factor's uncertainty: |∂q/∂G|·(G/k)·u(k)/k, the derivative by the channel's own map", () => {
    const k = 1.0038;
    const uk = 3.5e-4;
    const spec: ChannelSpec = {
      ...strain,
      tolerances: { gainFraction: 0.01 },
      spanCorrection: { factor: k, factorStandardUncertainty: uk },
    };
    const budget = channelBudget(createChannel(spec), { at: 1000e-6 });
    const line = budget.lines.find((l) => l.name === 'span correction');
    expect(line?.kind).toBe('calibration');
    // The shunt measured the gain: the gain tolerance no longer counts.
    expect(budget.lines.find((l) => l.name === 'gain')).toBeUndefined();
    // Independently: the channel without a span correction at gain G/k·(1 ± δ) reads the budget's
    // code; the central difference gives ∂q/∂G (the map is smooth in G).
    const g = 128 / k;
    const at = (gain: number) =>
      createChannel({ ...strain, amplifier: { gain } }).quantityFromCode(budget.code);
    const d = 1e-6;
    const slope = (at(g * (1 + d)) - at(g * (1 - d))) / (2 * d * g);
    expect(line?.standardUncertainty).toBeNear(Math.abs(slope) * g * (uk / k), { rel: 1e-6 });
    // Near proportional: the strain's relative uncertainty is about u(k)/k.
    expect(line!.standardUncertainty! / 1000e-6).toBeNear(uk / k, { rel: 2e-3 });
    // Without the factor's uncertainty the gain tolerance stays.
    const plain = channelBudget(createChannel({ ...spec, spanCorrection: { factor: k } }), { at: 1000e-6 });
    expect(plain.lines.find((l) => l.name === 'gain')?.standardUncertainty).toBeGreaterThan(0);
    expect(plain.lines.find((l) => l.name === 'span correction')).toBeUndefined();
  });
});
