import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { leadTemperatureEffect, wireOhms } from '@bridgework/compensation';

const gaugeOhms = fc.constantFrom(120, 350, 1000);
const leadOhms = fc.double({ min: 0, max: 10, noNaN: true });
const gaugeFactor = fc.double({ min: 1.8, max: 4.5, noNaN: true });
const strain = fc.double({ min: -5e-3, max: 5e-3, noNaN: true });

describe('leadTemperatureEffect: closed forms', () => {
  it('two-wire: apparent strain exactly 2ΔRL/(GF·Rg) at every strain and completion', () => {
    // Derived: the leads change arm 1 by 2ΔRL, which the reference bridge reads as a gauge change
    // Rg·GF·Δε = 2ΔRL (the other arms are identical), whatever the strain.
    fc.assert(
      fc.property(
        gaugeOhms,
        leadOhms,
        leadOhms,
        gaugeFactor,
        strain,
        fc.double({ min: 0.95, max: 1.05, noNaN: true }),
        (rg, rl0, rl1, gf, e, c) => {
          const r = leadTemperatureEffect({
            gaugeFactor: gf,
            gaugeOhms: rg,
            completionOhms: rg * c,
            wiring: 'two-wire',
            referenceOhmsPerLead: rl0,
            ohmsPerLead: rl1,
            strain: e,
          });
          // Floor 3e-16 m/m: arm sums are rounded (ulp(R) ≈ 6e-14 Ω) and divided by GF·Rg. 1e-9
          // relative: apparent = indicated − true cancels by up to |ε|/|apparent| when ΔRL is small.
          expect(r.apparentStrain).toBeNear((2 * (rl1 - rl0)) / (gf * rg), { rel: 1e-9, abs: 3e-16 });
          expect(r.indicatedStrain - e).toBeNear(r.apparentStrain, { ulps: 0 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('three-wire: apparent strain at zero strain ΔRL·(Rc − Rg)/(GF·Rg·(Rc + RL1)); exactly 0 when Rc = Rg', () => {
    // Derived: the bridge reads the same when R1/R2 is the same:
    // (Rg + RL1)/(Rc + RL1) = (Rg(1 + GF·ε) + RL0)/(Rc + RL0) ⇒ Rg·GF·ε = ΔRL(Rc − Rg)/(Rc + RL1).
    fc.assert(
      fc.property(
        gaugeOhms,
        leadOhms,
        leadOhms,
        gaugeFactor,
        fc.double({ min: 0.95, max: 1.05, noNaN: true }),
        (rg, rl0, rl1, gf, c) => {
          const rc = rg * c;
          const r = leadTemperatureEffect({
            gaugeFactor: gf,
            gaugeOhms: rg,
            completionOhms: rc,
            wiring: 'three-wire',
            referenceOhmsPerLead: rl0,
            ohmsPerLead: rl1,
          });
          expect(r.apparentStrain).toBeNear(((rl1 - rl0) * (rc - rg)) / (gf * rg * (rc + rl1)), {
            rel: 1e-9,
            abs: 3e-16,
          });
          const balanced = leadTemperatureEffect({
            gaugeFactor: gf,
            gaugeOhms: rg,
            wiring: 'three-wire',
            referenceOhmsPerLead: rl0,
            ohmsPerLead: rl1,
          });
          expect(balanced.zeroShiftRatio).toBe(0);
          expect(balanced.apparentStrain).toBeNear(0, { abs: 0 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('three-wire, Rc = Rg: the span changes by (Rg + RL0)/(Rg + RL1) − 1, so a strained gauge reads a little off', () => {
    // Derived from the three-wire slope Rg/(Rg + RL) (see leadDesensitization).
    fc.assert(
      fc.property(gaugeOhms, leadOhms, leadOhms, (rg, rl0, rl1) => {
        const r = leadTemperatureEffect({
          gaugeFactor: 2,
          gaugeOhms: rg,
          wiring: 'three-wire',
          referenceOhmsPerLead: rl0,
          ohmsPerLead: rl1,
          strain: 1e-3,
        });
        // (Rg + RL0)/(Rg + RL1) − 1 = (RL0 − RL1)/(Rg + RL1), cancellation-free.
        expect(r.spanChange).toBeNear((rl0 - rl1) / (rg + rl1), { rel: 1e-9, abs: 1e-15 });
      }),
      { numRuns: 200 },
    );
  });

  it('agrees with reading createStrainBridge by hand: forward with the new leads, inverse with the old', () => {
    const options = { gaugeFactor: 2.08, gaugeOhms: 120, completionOhms: 120 } as const;
    const quarter = { ...options, arrangement: 'quarter' } as const;
    const before = createStrainBridge({ ...quarter, leads: { ohmsPerLead: 0.9, wiring: 'two-wire' } });
    const after = createStrainBridge({ ...quarter, leads: { ohmsPerLead: 0.95, wiring: 'two-wire' } });
    const r = leadTemperatureEffect({
      ...options,
      wiring: 'two-wire',
      referenceOhmsPerLead: 0.9,
      ohmsPerLead: 0.95,
      strain: 8e-4,
    });
    expect(r.indicatedStrain).toBe(before.strainFromRatio(after.ratioFromStrain(8e-4)));
    expect(r.zeroShiftRatio).toBe(after.offsetRatio - before.offsetRatio);
    expect(r.spanChange).toBe(after.sensitivity / before.sensitivity - 1);
  });

  it('scenario: 350 Ω gauge on 10 m of AWG 26 copper warming from 20 to 35 °C, two-wire vs three-wire', () => {
    const rl0 = wireOhms({ awg: 26, lengthMeters: 10 });
    const rl1 = wireOhms({ awg: 26, lengthMeters: 10, temperatureCelsius: 35 });
    const common = { gaugeFactor: 2, gaugeOhms: 350, referenceOhmsPerLead: rl0, ohmsPerLead: rl1 } as const;
    const two = leadTemperatureEffect({ ...common, wiring: 'two-wire' });
    const three = leadTemperatureEffect({ ...common, wiring: 'three-wire' });
    // By hand: ΔRL = 1.33907·0.00393·15 = 0.078938 Ω; two-wire 2ΔRL/(GF·Rg) = 225.5 µε.
    expect(two.apparentStrain * 1e6).toBeNear(225.54, { abs: 0.01 });
    expect(three.apparentStrain).toBeNear(0, { abs: 0 });
  });

  it.each([
    [
      'no gauge factor',
      { wiring: 'two-wire', referenceOhmsPerLead: 1, ohmsPerLead: 1 },
      'missing-option',
      'options.gaugeFactor',
    ],
    [
      'four-wire',
      { gaugeFactor: 2, wiring: 'four-wire', referenceOhmsPerLead: 1, ohmsPerLead: 1 },
      'invalid-option',
      'wiring',
    ],
    [
      'no reference lead',
      { gaugeFactor: 2, wiring: 'two-wire', ohmsPerLead: 1 },
      'missing-option',
      'options.referenceOhmsPerLead',
    ],
    [
      'negative reference lead',
      { gaugeFactor: 2, wiring: 'two-wire', referenceOhmsPerLead: -1, ohmsPerLead: 1 },
      'negative',
      'referenceOhmsPerLead',
    ],
    [
      'NaN lead',
      { gaugeFactor: 2, wiring: 'two-wire', referenceOhmsPerLead: 1, ohmsPerLead: Number.NaN },
      'not-finite',
      'ohmsPerLead',
    ],
    [
      'infinite strain',
      { gaugeFactor: 2, wiring: 'two-wire', referenceOhmsPerLead: 1, ohmsPerLead: 1, strain: Infinity },
      'not-finite',
      'strain',
    ],
    [
      'strain −0.6 at GF 2',
      { gaugeFactor: 2, wiring: 'two-wire', referenceOhmsPerLead: 1, ohmsPerLead: 1, strain: -0.6 },
      'out-of-range',
      'strain',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => leadTemperatureEffect(options as never)).toThrowBridgeworkError(code, { param });
  });
});
