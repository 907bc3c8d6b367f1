import { describe, expect, it } from 'vitest';
import { spanCorrectionFromShunt, strainFromShunt, shuntRatios } from '@bridgework/calibration';
import { createStrainBridge } from '@bridgework/bridge';

describe('spanCorrectionFromShunt', () => {
  it('recovers a simulated strain: shunt → measured step → span correction → convert (1e-9)', () => {
    // A quarter bridge on 15 m of two-wire cable (0.75 Ω per lead, invented). The instrument
    // converts as if there were no leads, so it reads low; the shunt at the gauge finds the loss.
    const leads = { ohmsPerLead: 0.75, wiring: 'two-wire' } as const;
    const options = { gaugeOhms: 350, gaugeFactor: 2.05, leads, shuntOhms: 100_000 };
    const installed = createStrainBridge({
      arrangement: 'quarter',
      gaugeOhms: 350,
      gaugeFactor: 2.05,
      leads,
    });
    const ideal = createStrainBridge({ arrangement: 'quarter', gaugeOhms: 350, gaugeFactor: 2.05 });
    // Measured: the real (leaded) network; expected: the instrument's own model (no leads) at the
    // strain the shunt simulates (resistance-equivalent definition: the gauge's own change).
    const { zeroRatio, shuntedRatio } = shuntRatios(options);
    const simulated = strainFromShunt(options);
    const expectedStep = ideal.ratioFromStrain(simulated) - ideal.ratioFromStrain(0);
    const c = spanCorrectionFromShunt({ expectedStep, measuredStep: shuntedRatio - zeroRatio });
    expect(c.ok).toBe(true);
    // Convert a real strain through the leaded bridge with the instrument's lead-free model, then
    // correct the span: for small strains the leads are a pure gain error to first order.
    const realStrain = simulated;
    const reading = installed.ratioFromStrain(realStrain);
    const corrected = c.value.correct(reading, installed.ratioFromStrain(0));
    const indicated = ideal.strainFromRatio(
      corrected - installed.ratioFromStrain(0) + ideal.ratioFromStrain(0),
    );
    // At the shunt's own strain the corrected indication recovers it within rounding.
    expect(indicated).toBeNear(realStrain, { rel: 1e-9 });
    // The loss is the two-wire desensitization 2RL/(Rg + 2RL) ≈ 0.43 % (common practice).
    expect(c.value.spanErrorFraction).toBeNear(-1.5 / 351.5, { rel: 2e-3 });
  });

  it('from two recordings: Type A uncertainty of the means in quadrature (JCGM 100 4.2.3, 5.1.6)', () => {
    const zeroReadings = [1, 3, 2, 2]; // mean 2, s² = 2/3, u = √(2/3/4)
    const shuntedReadings = [1001, 1003, 1002, 1002, 1002, 1002]; // mean 1002, s² = 0.4, u = √(0.4/6)
    const c = spanCorrectionFromShunt({ expectedStep: 1010, zeroReadings, shuntedReadings });
    const uStep = Math.sqrt(2 / 3 / 4 + 0.4 / 6);
    expect(c.value.measuredStep).toBeNear(1000, { rel: 1e-15 });
    expect(c.value.measuredStepStandardUncertainty!).toBeNear(uStep, { rel: 1e-14 });
    expect(c.value.factor).toBeNear(1.01, { rel: 1e-15 });
    expect(c.value.spanErrorFraction).toBeNear(1000 / 1010 - 1, { rel: 1e-14 });
    expect(c.value.factorStandardUncertainty!).toBeNear(1.01 * (uStep / 1000), { rel: 1e-14 });
    const withTolerance = spanCorrectionFromShunt({
      expectedStep: 1010,
      expectedStepStandardUncertainty: 1.01,
      zeroReadings,
      shuntedReadings,
    });
    expect(withTolerance.value.factorStandardUncertainty!).toBeNear(1.01 * Math.hypot(1e-3, uStep / 1000), {
      rel: 1e-14,
    });
    // One sample each: no Type A estimate.
    const single = spanCorrectionFromShunt({ expectedStep: 10, zeroReadings: [0], shuntedReadings: [9] });
    expect(single.value.measuredStepStandardUncertainty).toBeUndefined();
    expect(single.value.factorStandardUncertainty).toBeUndefined();
  });

  it('flags a reversed step and an implausible span error, with the figures', () => {
    const reversed = spanCorrectionFromShunt({ expectedStep: -1e-3, measuredStep: 1e-3 });
    expect(reversed.ok).toBe(false);
    expect(reversed.issues[0]).toMatch(/opposite sign/);
    expect(reversed.value.factor).toBe(-1);
    const far = spanCorrectionFromShunt({ expectedStep: 1e-3, measuredStep: 0.9e-3 });
    expect(far.ok).toBe(false);
    expect(far.issues[0]).toMatch(/-10\.00 % exceeds the plausible 5\.00 %/);
    expect(
      spanCorrectionFromShunt({ expectedStep: 1e-3, measuredStep: 0.9e-3, plausibleSpanErrorFraction: 0.2 })
        .ok,
    ).toBe(true);
  });

  it.each([
    ['options.expectedStep', { measuredStep: 1 }, 'missing-option'],
    ['options.measuredStp', { expectedStep: 1, measuredStp: 1 }, 'unknown-option'],
    ['options', { expectedStep: 1 }, 'conflicting-options'],
    [
      'measuredStep',
      { expectedStep: 1, measuredStep: 1, zeroReadings: [0], shuntedReadings: [1] },
      'conflicting-options',
    ],
    ['expectedStep', { expectedStep: 0, measuredStep: 1 }, 'out-of-range'],
    ['measuredStep', { expectedStep: 1, measuredStep: 0 }, 'out-of-range'],
    ['measuredStep', { expectedStep: 1, measuredStep: 1e-320 }, 'out-of-range'],
    ['shuntedReadings', { expectedStep: 1, zeroReadings: [1], shuntedReadings: [] }, 'too-few-points'],
    [
      'zeroReadings[1]',
      { expectedStep: 1, zeroReadings: [1, Number.NaN], shuntedReadings: [2] },
      'not-finite',
    ],
    [
      'expectedStepStandardUncertainty',
      { expectedStep: 1, measuredStep: 1, expectedStepStandardUncertainty: -1 },
      'negative',
    ],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => spanCorrectionFromShunt(options as never)).toThrowBridgeworkError(code, { param });
  });
});
