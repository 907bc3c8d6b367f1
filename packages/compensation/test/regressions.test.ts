/**
 * Regressions of issue 15 in the compensation package: each defect the attacks found, with the
 * test named after what it checks.
 */
import { describe, expect, it } from 'vitest';
import {
  correctRosetteTransverse,
  createBetaThermistor,
  createRtd,
  leadDesensitization,
  leadZeroOffset,
  rtdLeadError,
  wireOhms,
} from '@bridgework/compensation';

describe('regressions: finite inputs never give non-finite outputs (issue 15, item 7)', () => {
  it("a beta thermistor's ohmsAt(-273.14) is refused (its resistance is beyond 1e15 Ω), not Infinity", () => {
    const ntc = createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977 });
    expect(() => ntc.ohmsAt(-273.14)).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
    expect(() => ntc.slopeAt(-273.14)).toThrowBridgeworkError('out-of-range', {
      param: 'temperatureCelsius',
    });
    // The coldest temperature it accepts, where R reaches 1e15 Ω: 1/T = 1/T0 + ln(1e15/R0)/B (the
    // beta model solved for T), a hair inside so rounding cannot cross it.
    const coldest = 1 / (1 / 298.15 + Math.log(1e15 / 10e3) / 3977) - 273.15;
    expect(ntc.ohmsAt(coldest + 1e-9)).toBeNear(1e15, { rel: 1e-9 });
  });

  it('a beta thermistor far above its reference gives a finite resistance (no overflow on the way)', () => {
    const ntc = createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977 });
    // R(T → ∞) = R0·exp(−B/T0): the model's limit, reached to rounding at 1e308 °C.
    expect(ntc.ohmsAt(1e308)).toBeNear(10e3 * Math.exp(-3977 / 298.15), { rel: 1e-14 });
  });

  it('leadDesensitization with completionOhms 1e-308 is refused, not NaN', () => {
    expect(() =>
      leadDesensitization({ wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead: 1, completionOhms: 1e-308 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'completionOhms' });
  });

  it('correctRosetteTransverse gives a finite correction for a strain of 1e308, and refuses one that overflows', () => {
    // The correction is linear in the legs: at 1e308 it is 1e308 times the correction at 1 (the
    // solve is done on scaled legs, so nothing overflows on the way; it gave NaN before).
    const options = { layout: 'rectangular', transverseSensitivity: 0.02 } as const;
    const unit = correctRosetteTransverse({ ...options, strains: [0, 1, 0] });
    const huge = correctRosetteTransverse({ ...options, strains: [0, 1e308, 0] });
    expect(huge).toBeNear(
      unit.map((e) => e * 1e308),
      { rel: 1e-14, abs: 1e-15 * 1e308 },
    );
    // Leg b's factor exceeds 1, so the largest double would overflow: refused against `strains`.
    expect(unit[1]).toBeGreaterThan(1);
    expect(() =>
      correctRosetteTransverse({ ...options, strains: [0, Number.MAX_VALUE, 0] }),
    ).toThrowBridgeworkError('out-of-range', { param: 'strains' });
  });

  it('wireOhms refuses a diameter so small that the resistance would be infinite', () => {
    expect(() => wireOhms({ diameterMeters: 1e-308, lengthMeters: 1 })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'diameterMeters',
      },
    );
  });
});

describe('regressions: errors name the option the caller gave (issue 15, item 12)', () => {
  it('createBetaThermistor({ referenceCelsius: NaN }) names referenceCelsius, not temperatureCelsius', () => {
    expect(() =>
      createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977, referenceCelsius: Number.NaN }),
    ).toThrowBridgeworkError('not-finite', { param: 'referenceCelsius' });
  });

  it('rtdLeadError names ohmsPerLead when the leads push the reading past the RTD, not the internal ohms', () => {
    expect(() =>
      rtdLeadError({ rtd: createRtd(), temperatureCelsius: 849, ohmsPerLead: 1, wiring: 'two-wire' }),
    ).toThrowBridgeworkError('out-of-range', { param: 'ohmsPerLead' });
  });

  it('leadZeroOffset names ohmsPerLead when the lead-free bridge cannot read the offset', () => {
    // 1 PΩ leads on a 1 nΩ gauge: the offset ratio rounds to the quarter bridge's limit 1/2.
    expect(() =>
      leadZeroOffset({ gaugeFactor: 2, gaugeOhms: 1e-9, ohmsPerLead: 1e15, wiring: 'two-wire' }),
    ).toThrowBridgeworkError('out-of-range', { param: 'ohmsPerLead' });
  });
});

describe('regressions: the options rule (issue 15, item 5)', () => {
  it('a misspelt option is refused, naming the closest key, never read as absent', () => {
    expect(() =>
      leadDesensitization({ wiring: 'two-wire', gaugeOhms: 350, ohmsPerLaed: 1 } as never),
    ).toThrow('did you mean `ohmsPerLead`?');
    expect(() => createRtd({ r0Ohm: 1000 } as never)).toThrowBridgeworkError('unknown-option', {
      param: 'options.r0Ohm',
    });
    expect(() =>
      createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977, rangeCelcius: [0, 50] } as never),
    ).toThrow('did you mean `rangeCelsius`?');
  });
});
