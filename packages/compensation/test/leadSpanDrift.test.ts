import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { leadDesensitization, leadSpanDrift, wireOhms } from '@bridgework/compensation';

describe('leadSpanDrift', () => {
  it('equals the change of the four-wire span factor, and of createStrainBridge outputs at every strain', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(120, 350, 1000),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.double({ min: -0.01, max: 0.01, noNaN: true }).filter((e) => Math.abs(e) > 1e-8),
        (rin, rl0, rl1, strain) => {
          const drift = leadSpanDrift({
            wiring: 'four-wire',
            inputOhms: rin,
            referenceOhmsPerLead: rl0,
            ohmsPerLead: rl1,
          });
          const f0 = leadDesensitization({ wiring: 'four-wire', inputOhms: rin, ohmsPerLead: rl0 });
          const f1 = leadDesensitization({ wiring: 'four-wire', inputOhms: rin, ohmsPerLead: rl1 });
          // f1/f0 − 1 cancels: absolute floor 1e-15.
          expect(drift).toBeNear(f1 / f0 - 1, { rel: 1e-12, abs: 1e-15 });
          const bridge = (rl: number) =>
            createStrainBridge({
              arrangement: 'full-bending',
              gaugeFactor: 2,
              gaugeOhms: rin,
              leads: { ohmsPerLead: rl, wiring: 'four-wire' },
            });
          expect(drift).toBeNear(
            bridge(rl1).ratioFromStrain(strain) / bridge(rl0).ratioFromStrain(strain) - 1,
            {
              rel: 1e-12,
              abs: 2e-15,
            },
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it('six-wire remote sense removes the drift', () => {
    expect(
      leadSpanDrift({ wiring: 'six-wire', inputOhms: 350, referenceOhmsPerLead: 1, ohmsPerLead: 5 }),
    ).toBe(0);
  });

  it('scenario: a 350 Ω load cell on 50 m of AWG 24 copper warming by 30 K loses 0.276 % of span', () => {
    // By hand: RL = 84.215 Ω/km · 50 m = 4.2108 Ω at 20 °C; +30 K adds 4.2108·0.00393·30 = 0.49645 Ω;
    // −2·0.49645/(350 + 2·4.7072) = −2.7625e-3.
    const rl0 = wireOhms({ awg: 24, lengthMeters: 50 });
    const rl1 = wireOhms({ awg: 24, lengthMeters: 50, temperatureCelsius: 50 });
    const drift = leadSpanDrift({
      wiring: 'four-wire',
      inputOhms: 350,
      referenceOhmsPerLead: rl0,
      ohmsPerLead: rl1,
    });
    expect(drift).toBeNear(-2.7625e-3, { abs: 1e-7 });
    expect(drift).toBeNear((-2 * (rl1 - rl0)) / (350 + 2 * rl1), { rel: 1e-15 });
    // The first-order estimate −2RL·α·ΔT/Rin is 2.6 % larger (it ignores 2RL in the denominator).
    expect(drift).toBeNear((-2 * rl0 * 0.00393 * 30) / 350, { rel: 0.03 });
  });

  it.each([
    [
      'two-wire',
      { wiring: 'two-wire', inputOhms: 350, referenceOhmsPerLead: 1, ohmsPerLead: 1 },
      'invalid-option',
      'wiring',
    ],
    [
      'zero input',
      { wiring: 'four-wire', inputOhms: 0, referenceOhmsPerLead: 1, ohmsPerLead: 1 },
      'not-positive',
      'inputOhms',
    ],
    [
      'negative lead',
      { wiring: 'four-wire', inputOhms: 350, referenceOhmsPerLead: 1, ohmsPerLead: -1 },
      'negative',
      'ohmsPerLead',
    ],
    [
      'NaN reference',
      { wiring: 'four-wire', inputOhms: 350, referenceOhmsPerLead: Number.NaN, ohmsPerLead: 1 },
      'not-finite',
      'referenceOhmsPerLead',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => leadSpanDrift(options as never)).toThrowBridgeworkError(code, { param });
  });
});
