import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { leadDesensitization, wireOhms } from '@bridgework/compensation';

const gaugeOhms = fc.constantFrom(120, 350, 1000);
const leadOhms = fc.double({ min: 0, max: 20, noNaN: true });

describe('leadDesensitization: check values', () => {
  it('350 Ω gauge, AWG 26, 10 m per lead: 0.99240626 two-wire, 0.99618866 three-wire', () => {
    // Issue #3 check values, derived: RL = 10 m of AWG 26 copper at 20 °C = 1.3390722 Ω
    // (wireOhms, checked against the wire tables); 350/(350 + 2·1.3390722) = 0.992406265 and
    // 350/(350 + 1.3390722) = 0.996188661.
    const ohmsPerLead = wireOhms({ awg: 26, lengthMeters: 10 });
    expect(ohmsPerLead).toBeNear(1.3390722, { abs: 1e-7 });
    expect(leadDesensitization({ wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead })).toBeNear(0.99240626, {
      abs: 5e-9,
    });
    expect(leadDesensitization({ wiring: 'three-wire', gaugeOhms: 350, ohmsPerLead })).toBeNear(0.99618866, {
      abs: 5e-9,
    });
  });

  it('is exactly 1 without lead resistance and with six-wire remote sense', () => {
    expect(leadDesensitization({ wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead: 0 })).toBe(1);
    expect(leadDesensitization({ wiring: 'three-wire', gaugeOhms: 350, ohmsPerLead: 0 })).toBe(1);
    expect(leadDesensitization({ wiring: 'four-wire', inputOhms: 350, ohmsPerLead: 0 })).toBe(1);
    expect(leadDesensitization({ wiring: 'six-wire', inputOhms: 350, ohmsPerLead: 5 })).toBe(1);
  });
});

describe('leadDesensitization agrees with createStrainBridge under its stated conditions', () => {
  it('three-wire, completion = Rg: Rg/(Rg + RL) equals the slope ratio of the bridge', () => {
    fc.assert(
      fc.property(gaugeOhms, leadOhms, (rg, rl) => {
        const withLeads = createStrainBridge({
          arrangement: 'quarter',
          gaugeFactor: 2.1,
          gaugeOhms: rg,
          leads: { ohmsPerLead: rl, wiring: 'three-wire' },
        });
        const ideal = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2.1, gaugeOhms: rg });
        // 1e-15: both are exact to a few roundings.
        expect(leadDesensitization({ wiring: 'three-wire', gaugeOhms: rg, ohmsPerLead: rl })).toBeNear(
          withLeads.sensitivity / ideal.sensitivity,
          { rel: 1e-15 },
        );
      }),
      { numRuns: 300 },
    );
  });

  it('two-wire, balanced with its leads (completion = Rg + 2RL): Rg/(Rg + 2RL) equals the slope / (GF/4)', () => {
    fc.assert(
      fc.property(gaugeOhms, leadOhms, (rg, rl) => {
        const gf = 2.05;
        const bridge = createStrainBridge({
          arrangement: 'quarter',
          gaugeFactor: gf,
          gaugeOhms: rg,
          completionOhms: rg + 2 * rl,
          leads: { ohmsPerLead: rl, wiring: 'two-wire' },
        });
        expect(bridge.offsetRatio).toBe(0);
        expect(leadDesensitization({ wiring: 'two-wire', gaugeOhms: rg, ohmsPerLead: rl })).toBeNear(
          bridge.sensitivity / (gf / 4),
          { rel: 2e-15 },
        );
      }),
      { numRuns: 300 },
    );
  });

  it('two-wire with completion = Rg: the exact slope ratio is (Rg/(Rg + RL))², not Rg/(Rg + 2RL)', () => {
    // Derived: R1 = Rg(1 + x) + 2RL, R2 = R3 = R4 = Rg, ratio = 1/2 − Rg/(R1 + Rg), so
    // d(ratio)/dx at 0 = Rg²/(2Rg + 2RL)² = (1/4)·(Rg/(Rg + RL))².
    fc.assert(
      fc.property(gaugeOhms, leadOhms, (rg, rl) => {
        const exact = leadDesensitization({
          wiring: 'two-wire',
          gaugeOhms: rg,
          ohmsPerLead: rl,
          completionOhms: rg,
        });
        expect(exact).toBeNear((rg / (rg + rl)) ** 2, { rel: 1e-15 });
      }),
      { numRuns: 300 },
    );
    const closed = leadDesensitization({ wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead: 5 });
    const exact = leadDesensitization({
      wiring: 'two-wire',
      gaugeOhms: 350,
      ohmsPerLead: 5,
      completionOhms: 350,
    });
    expect(Math.abs(closed - exact)).toBeGreaterThan(1e-4); // (5/355)² ≈ 2e-4 apart
  });

  it('with completionOhms given, equals the closed form where its condition holds', () => {
    const rg = 350;
    const rl = 2.5;
    expect(
      leadDesensitization({
        wiring: 'two-wire',
        gaugeOhms: rg,
        ohmsPerLead: rl,
        completionOhms: rg + 2 * rl,
      }),
    ).toBeNear(rg / (rg + 2 * rl), { rel: 1e-15 });
    expect(
      leadDesensitization({ wiring: 'three-wire', gaugeOhms: rg, ohmsPerLead: rl, completionOhms: rg }),
    ).toBeNear(rg / (rg + rl), { rel: 1e-15 });
  });

  it('four-wire full bridge: Rin/(Rin + 2RL) equals the ratio of bridges with and without leads at every strain', () => {
    fc.assert(
      fc.property(
        gaugeOhms,
        leadOhms,
        fc.constantFrom('full-bending', 'full-shear') as fc.Arbitrary<'full-bending' | 'full-shear'>,
        fc.double({ min: -0.02, max: 0.02, noNaN: true }).filter((e) => Math.abs(e) > 1e-9),
        (rg, rl, arrangement, strain) => {
          const four = createStrainBridge({
            arrangement,
            gaugeFactor: 2,
            gaugeOhms: rg,
            leads: { ohmsPerLead: rl, wiring: 'four-wire' },
          });
          const six = createStrainBridge({
            arrangement,
            gaugeFactor: 2,
            gaugeOhms: rg,
            leads: { ohmsPerLead: rl, wiring: 'six-wire' },
          });
          const ideal = createStrainBridge({ arrangement, gaugeFactor: 2, gaugeOhms: rg });
          // The input resistance of these bridges is Rg at every strain, so Rin = Rg.
          expect(leadDesensitization({ wiring: 'four-wire', inputOhms: rg, ohmsPerLead: rl })).toBeNear(
            four.ratioFromStrain(strain) / ideal.ratioFromStrain(strain),
            { rel: 1e-14 },
          );
          expect(six.ratioFromStrain(strain)).toBe(ideal.ratioFromStrain(strain));
        },
      ),
      { numRuns: 300 },
    );
  });

  it('four-wire Poisson full bridge: the factor is the slope ratio at zero strain', () => {
    const options = {
      arrangement: 'full-poisson',
      gaugeFactor: 2,
      gaugeOhms: 350,
      poissonRatio: 0.3,
    } as const;
    const four = createStrainBridge({ ...options, leads: { ohmsPerLead: 3, wiring: 'four-wire' } });
    const ideal = createStrainBridge(options);
    expect(leadDesensitization({ wiring: 'four-wire', inputOhms: 350, ohmsPerLead: 3 })).toBeNear(
      four.sensitivity / ideal.sensitivity,
      { rel: 1e-15 },
    );
  });
});

describe('leadDesensitization: bad inputs', () => {
  it.each([
    ['unknown wiring', { wiring: 'five-wire', gaugeOhms: 350, ohmsPerLead: 1 }, 'invalid-option', 'wiring'],
    ['missing wiring', { gaugeOhms: 350, ohmsPerLead: 1 }, 'missing-option', 'options.wiring'],
    ['zero gauge', { wiring: 'two-wire', gaugeOhms: 0, ohmsPerLead: 1 }, 'not-positive', 'gaugeOhms'],
    ['NaN gauge', { wiring: 'two-wire', gaugeOhms: Number.NaN, ohmsPerLead: 1 }, 'not-finite', 'gaugeOhms'],
    [
      'four-wire with gaugeOhms only',
      { wiring: 'four-wire', gaugeOhms: 350, ohmsPerLead: 1 },
      'unknown-option',
      'options.gaugeOhms',
    ],
    ['negative lead', { wiring: 'three-wire', gaugeOhms: 350, ohmsPerLead: -0.1 }, 'negative', 'ohmsPerLead'],
    [
      'infinite lead',
      { wiring: 'three-wire', gaugeOhms: 350, ohmsPerLead: Infinity },
      'not-finite',
      'ohmsPerLead',
    ],
    [
      'negative lead (four-wire)',
      { wiring: 'four-wire', inputOhms: 350, ohmsPerLead: -1 },
      'negative',
      'ohmsPerLead',
    ],
    ['string lead', { wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead: '1' }, 'wrong-type', 'ohmsPerLead'],
    [
      'zero completion',
      { wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead: 1, completionOhms: 0 },
      'not-positive',
      'completionOhms',
    ],
    ['zero input', { wiring: 'six-wire', inputOhms: 0, ohmsPerLead: 1 }, 'not-positive', 'inputOhms'],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => leadDesensitization(options as never)).toThrowBridgeworkError(code, { param });
  });
});
