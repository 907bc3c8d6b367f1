import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveBridge } from '@bridgework/bridge';
import { leadZeroOffset } from '@bridgework/compensation';

const gaugeOhms = fc.constantFrom(120, 350, 1000);
const leadOhms = fc.double({ min: 0, max: 10, noNaN: true });
const gaugeFactor = fc.double({ min: 1.8, max: 4.5, noNaN: true });

describe('leadZeroOffset', () => {
  it('two-wire: apparent strain exactly 2RL/(GF·Rg) whatever the completion; offset RL/(2(Rg + RL)) at Rc = Rg', () => {
    // Derived: the leads add 2RL to arm 1; the lead-free bridge reads the same ratio when its gauge
    // Rg(1 + GF·ε) equals Rg + 2RL, so ε = 2RL/(GF·Rg). With Rc = Rg the ratio is
    // 1/2 − Rg/(2Rg + 2RL) = RL/(2(Rg + RL)).
    fc.assert(
      fc.property(
        gaugeOhms,
        leadOhms,
        gaugeFactor,
        fc.double({ min: 0.9, max: 1.1, noNaN: true }),
        (rg, rl, gf, c) => {
          const z = leadZeroOffset({
            gaugeFactor: gf,
            gaugeOhms: rg,
            completionOhms: rg * c,
            ohmsPerLead: rl,
            wiring: 'two-wire',
          });
          // Absolute floors: arm 1 = Rg + 2RL is rounded to a double, an error of ulp(Rg)/2 ≈ 3e-14 Ω
          // at 350 Ω, which is 1e-16 in strain (÷ GF·Rg) and 2e-17 in ratio (÷ 4Rg).
          expect(z.apparentStrain).toBeNear((2 * rl) / (gf * rg), { rel: 1e-12, abs: 2e-16 });
          const balanced = leadZeroOffset({
            gaugeFactor: gf,
            gaugeOhms: rg,
            ohmsPerLead: rl,
            wiring: 'two-wire',
          });
          expect(balanced.offsetRatio).toBeNear(rl / (2 * (rg + rl)), { rel: 1e-14, abs: 5e-17 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('two-wire check value: 350 Ω, GF 2, 1 Ω per lead → 1/702 V/V and 2857.14 µε', () => {
    const z = leadZeroOffset({ gaugeFactor: 2, gaugeOhms: 350, ohmsPerLead: 1, wiring: 'two-wire' });
    expect(z.offsetRatio).toBeNear(1 / 702, { ulps: 2 });
    expect(z.apparentStrain).toBeNear(2 / 700, { rel: 1e-14 });
  });

  it('three-wire with completion = Rg: exactly no offset (the reason for the three-wire circuit)', () => {
    fc.assert(
      fc.property(gaugeOhms, leadOhms, gaugeFactor, (rg, rl, gf) => {
        const z = leadZeroOffset({ gaugeFactor: gf, gaugeOhms: rg, ohmsPerLead: rl, wiring: 'three-wire' });
        expect(z.offsetRatio).toBe(0);
        expect(z.apparentStrain).toBeNear(0, { abs: 0 });
      }),
      { numRuns: 100 },
    );
  });

  it('three-wire with completion ≠ Rg: the offset is that of solveBridge on the arms with leads', () => {
    fc.assert(
      fc.property(
        gaugeOhms,
        leadOhms,
        gaugeFactor,
        fc.double({ min: 0.95, max: 1.05, noNaN: true }),
        (rg, rl, gf, c) => {
          const rc = rg * c;
          const z = leadZeroOffset({
            gaugeFactor: gf,
            gaugeOhms: rg,
            completionOhms: rc,
            ohmsPerLead: rl,
            wiring: 'three-wire',
          });
          const withLeads = solveBridge({ armsOhms: [rg + rl, rc + rl, rc, rc], excitationVolts: 1 }).ratio;
          // Same arms, same network: only the rounding of the arm sums differs (floor as above).
          expect(z.offsetRatio).toBeNear(withLeads, { rel: 1e-13, abs: 5e-17 });
          // The apparent strain reproduces the offset through the lead-free bridge. Derived: equal
          // ratios need equal R1/R2, Rg(1 + GF·ε)/Rc = (Rg + RL)/(Rc + RL), so
          // GF·ε = RL·(Rc − Rg)/(Rg·(Rc + RL)) (cancellation-free form).
          const expected = (rl * (rc - rg)) / (rg * (rc + rl));
          // Floor 2e-16: the rounding of the arm sums (see above).
          expect(z.apparentStrain * gf).toBeNear(expected, { rel: 1e-11, abs: 2e-16 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it.each([
    ['no gauge factor', { ohmsPerLead: 1, wiring: 'two-wire' }, 'missing-option', 'options.gaugeFactor'],
    [
      'zero gauge factor',
      { gaugeFactor: 0, ohmsPerLead: 1, wiring: 'two-wire' },
      'not-positive',
      'gaugeFactor',
    ],
    ['four-wire', { gaugeFactor: 2, ohmsPerLead: 1, wiring: 'four-wire' }, 'invalid-option', 'wiring'],
    ['negative lead', { gaugeFactor: 2, ohmsPerLead: -1, wiring: 'two-wire' }, 'negative', 'ohmsPerLead'],
    [
      'NaN lead',
      { gaugeFactor: 2, ohmsPerLead: Number.NaN, wiring: 'two-wire' },
      'not-finite',
      'ohmsPerLead',
    ],
    [
      'zero gauge',
      { gaugeFactor: 2, gaugeOhms: 0, ohmsPerLead: 1, wiring: 'two-wire' },
      'not-positive',
      'gaugeOhms',
    ],
    [
      'infinite completion',
      { gaugeFactor: 2, completionOhms: Infinity, ohmsPerLead: 1, wiring: 'two-wire' },
      'not-finite',
      'completionOhms',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => leadZeroOffset(options as never)).toThrowBridgeworkError(code, { param });
  });
});
