/**
 * The NTC thermistor kind end to end: exact maps against 40-digit references of the beta and
 * Steinhart–Hart models through the bridge, self-heating corrected, its tolerances in the budget.
 */
import { describe, expect, it } from 'vitest';
import {
  channelBudget,
  channelConstants,
  createChannel,
  validateChannelSpec,
  type ChannelSpec,
} from '@bridgework/channel';
import { D, X, arm1Ref, ratioFromCodeRef, type Dec } from './support/reference.js';

const T0 = new D('298.15');
const beta = (ohms: Dec): number =>
  // 1/T = 1/T0 + ln(R/R0)/B (the beta model of every NTC data sheet), T in K.
  new D(1)
    .div(new D(1).div(T0).plus(ohms.div(10_000).ln().div(3977)))
    .minus('273.15')
    .toNumber();

const spec: ChannelSpec = {
  name: 'bath',
  sensor: { kind: 'thermistor', referenceOhms: '10 kΩ', betaKelvin: '3977 K', rangeCelsius: [-40, 125] },
  bridge: { wiring: 'three-wire', ohmsPerLead: 0.2 },
  excitation: { volts: 2.5 },
  adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
  output: { quantity: 'temperature' },
};

/** The element's resistance for a code: arm 1 of the three-wire quarter bridge at 40 digits. */
function elementOhms(code: number): Dec {
  const rl = X(0.2);
  const rc = new D(10_000);
  return arm1Ref(ratioFromCodeRef(code, 1, 24), rc.plus(rl), rc, rc, new D(0)).minus(rl);
}

describe('thermistor: exact maps', () => {
  it('beta model: the channel equals the 40-digit solve of bridge and model over its range', () => {
    const ch = createChannel(spec);
    expect(ch.kind).toBe('thermistor');
    expect(ch.description).toBe('NTC thermistor, R0 10000 Ω at 25 °C, B 3977 K, in a quarter bridge');
    // The model's range, just inside its ends (the sensor's range is open), rounded inward.
    expect(ch.span).toEqual({ min: -39, max: 124 });
    expect(ch.map.form).toBe('resistance-curve');
    for (const code of [-3_900_000, -2_000_000, -1, 0, 1, 1_234_567, 3_200_000]) {
      const ohms = elementOhms(code);
      const t = beta(ohms);
      if (!(t > -40 && t < 125)) continue;
      expect(ch.quantityFromCode(code)).toBeNear(t, { abs: 1e-9 }); // compensation's inverse: a few ulps
      expect(ch.convert(new Int32Array([code])).values[0]).toBeNear(t, { abs: 1e-9 });
    }
    // 25 °C is the balance point: the bridge reads (almost) zero there, the leads being unequal by nothing.
    expect(ch.quantityFromCode(ch.codeFromQuantity(25))).toBeNear(25, { abs: 1e-4 });
  });

  it('Steinhart–Hart: 1/T = a + b·ln R + c·(ln R)³ at 40 digits (coefficients of a 10 kΩ NTC, from memory)', () => {
    const sh = { a: 1.129241e-3, b: 2.341077e-4, c: 8.775468e-8 };
    const ch = createChannel({
      ...spec,
      sensor: { kind: 'thermistor', referenceOhms: 10_000, steinhartHart: sh, rangeCelsius: [-40, 125] },
    });
    for (const code of [-3_000_000, -500_000, 0, 2_500_000]) {
      const l = elementOhms(code).ln();
      const t = new D(1)
        .div(
          X(sh.a)
            .plus(X(sh.b).times(l))
            .plus(X(sh.c).times(l.pow(3))),
        )
        .minus('273.15')
        .toNumber();
      expect(ch.quantityFromCode(code)).toBeNear(t, { abs: 1e-9 });
    }
  });

  it('self-heating: the ambient is the element’s temperature less P/δ, P from the bridge network at 40 digits', () => {
    const ch = createChannel({
      ...spec,
      sensor: {
        kind: 'thermistor',
        referenceOhms: '10 kΩ',
        betaKelvin: '3977 K',
        rangeCelsius: [-40, 125],
        dissipationConstantWattsPerKelvin: '2 mW/K',
      },
    });
    expect(ch.map.form).toBe('exact');
    for (const code of [-2_000_000, 0, 1_500_000]) {
      const ohms = elementOhms(code);
      // Quarter bridge, E = 2.5 V at the bridge: the current through arms 1 and 2 is E/(R1 + R2).
      const i = new D(2.5).div(ohms.plus(X(0.2)).plus(new D(10_000)).plus(X(0.2)));
      const watts = i.times(i).times(ohms);
      const t = beta(ohms) - watts.div(2e-3).toNumber();
      expect(ch.quantityFromCode(code)).toBeNear(t, { abs: 1e-9 });
    }
    // And the inverse: the code of an ambient temperature reads it back.
    expect(ch.quantityFromCode(ch.exactCodeFromQuantity(40))).toBeNear(40, { abs: 1e-9 });
  });
});

describe('thermistor: budget', () => {
  it('resistance and beta tolerances enter with the sensitivities of the model (derived), self-heating informatively', () => {
    const ch = createChannel({
      ...spec,
      sensor: {
        kind: 'thermistor',
        referenceOhms: 10_000,
        betaKelvin: 3977,
        rangeCelsius: [-40, 125],
        referenceOhmsToleranceFraction: '1 %',
        betaToleranceFraction: '0.5 %',
        dissipationConstantWattsPerKelvin: '2 mW/K',
        dissipationToleranceFraction: '20 %',
      },
      output: { quantity: 'temperature', range: [0, 80] },
    });
    const b = channelBudget(ch, { at: 60 });
    expect(b.model).toBe('closed-form');
    expect(b.ok).toBe(true);
    // The element sits P/δ above the ambient; the model's sensitivities are at its temperature.
    const selfHeating = b.lines.find((l) => l.name === 'self-heating')!;
    // R_true = R·(1 + δ): T(R/(1 + δ)) ⇒ ∂T/∂δ = −R·dT/dR = T²/B (beta model; T in K).
    const T = 60 + selfHeating.value + 273.15;
    expect(b.combined.sensitivities['thermistor resistance']).toBeNear((T * T) / 3977, { rel: 1e-4 });
    // 1/T = 1/T0 + L/B ⇒ ∂T/∂B = T²·L/B², L = ln(R/R0) = B(1/T − 1/T0).
    const L = 3977 * (1 / T - 1 / 298.15);
    expect(b.combined.sensitivities['thermistor beta']).toBeNear((T * T * L) / 3977 ** 2, { rel: 1e-4 });
    expect(selfHeating.kind).toBe('self-heating');
    expect(selfHeating.value).toBeNear((selfHeating.inputs['powerWatts'] as number) / 2e-3, { rel: 1e-12 });
    const dissipation = b.lines.find((l) => l.name === 'dissipation constant')!;
    // ∂T/∂δ_D = P/δ_D² (the correction is −P/δ_D): u = P/δ_D·0.2/√3.
    expect(dissipation.standardUncertainty).toBeNear((selfHeating.value * 0.2) / Math.sqrt(3), { rel: 1e-3 });
    const mc = channelBudget(ch, { at: 60, monteCarlo: { trials: 50_000, seed: 2 } }).monteCarlo!;
    // Relative standard error of an s.d. from M trials ≈ 1/√(2M) = 0.3 %; allow 3 %.
    expect(mc.standardUncertainty).toBeNear(b.combined.standardUncertainty, { rel: 0.03 });
  });

  it('firmware constants cover its span', () => {
    const c = channelConstants(
      createChannel({ ...spec, output: { quantity: 'temperature', range: [0, 100] } }),
      {
        verification: 'sampled',
      },
    );
    expect(c.codeMax).toBeGreaterThan(c.codeMin);
    // Every function meets the channel's default target against its exact map.
    for (const t of ['fixed', 'float32', 'float64'] as const)
      expect(c.totals[t]!.bound).toBeLessThanOrEqual(c.targetError);
  });

  it('refuses a model given twice or not at all, and a zero reading', () => {
    const both = validateChannelSpec({
      ...spec,
      sensor: {
        kind: 'thermistor',
        referenceOhms: 1e4,
        betaKelvin: 3977,
        steinhartHart: { a: 1e-3, b: 2e-4, c: 1e-7 },
      },
    });
    expect(both.issues.map((i) => i.path)).toEqual(['sensor.betaKelvin']);
    const none = validateChannelSpec({ ...spec, sensor: { kind: 'thermistor', referenceOhms: 1e4 } });
    expect(none.issues.map((i) => i.path)).toEqual(['sensor.betaKelvin']);
    const zero = validateChannelSpec({ ...spec, zero: { code: 10 } });
    expect(zero.issues.map((i) => i.path)).toEqual(['zero']);
  });
});
