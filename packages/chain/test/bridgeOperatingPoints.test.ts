import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge, type StrainBridgeOptions } from '@bridgework/bridge';
import { bridgeOperatingPoints } from '@bridgework/chain';
import { solveBridgeNetwork } from '../../../test/support/nodal.js';

describe('bridgeOperatingPoints: strain spans', () => {
  it('a quarter bridge: output from the bridge’s exact map, common mode from the two dividers', () => {
    const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    const r = bridgeOperatingPoints({
      span: { bridge, strainRange: { min: -1e-3, max: 2e-3 } },
      excitationVolts: 5,
    });
    expect(r.measurand).toBe('strain');
    expect(r.points.map((p) => p.measurand)).toEqual([-1e-3, 0, 2e-3]);
    for (const p of r.points) {
      expect(p.differentialVolts).toBeNear((5 * (2 * p.measurand)) / (4 + 2 * (2 * p.measurand)), {
        ulps: 4,
      });
      // S+ sits at 2.5 V (two completion resistors); S− = 5·R2/(R1 + R2) moves with arm 1.
      const r1 = 350 * (1 + 2 * p.measurand);
      expect(p.commonModeVolts).toBeNear((2.5 + (5 * 350) / (r1 + 350)) / 2, { ulps: 4 });
    }
    expect(r.gaugeArms).toEqual([true, false, false, false]);
    expect(r.sensitivityVolts).toBe(2.5);
    expect(r.sensitivityRatio).toBe(0.5);
    expect(r.seriesOhms).toBe(0);
  });

  it('omits zero when the span does not straddle it, and shifts the common mode with E−', () => {
    const bridge = createStrainBridge({ arrangement: 'half-bending', gaugeFactor: 2.1 });
    const r = bridgeOperatingPoints({
      span: { bridge, strainRange: { min: 0, max: 1e-3 } },
      excitationVolts: 10,
      excitationLowVolts: -5,
    });
    expect(r.points.map((p) => p.measurand)).toEqual([0, 1e-3]);
    expect(r.points[0]!.commonModeVolts).toBeNear(0, { abs: 1e-15 });
    expect(r.gaugeArms).toEqual([true, true, false, false]);
  });

  it('matches a 40-digit nodal solve for every arrangement with leads and source resistance', () => {
    const arrangements: StrainBridgeOptions[] = [
      { arrangement: 'quarter', gaugeFactor: 2.05, leads: { ohmsPerLead: 1.5, wiring: 'three-wire' } },
      {
        arrangement: 'half-poisson',
        gaugeFactor: 2.1,
        poissonRatio: 0.3,
        leads: { ohmsPerLead: 0.8, wiring: 'three-wire' },
      },
      {
        arrangement: 'full-bending',
        gaugeFactor: 2.0,
        gaugeOhms: 1000,
        leads: { ohmsPerLead: 2, wiring: 'four-wire' },
        sourceOhms: 5,
      },
      { arrangement: 'full-poisson', gaugeFactor: 3.2, gaugeOhms: 120, poissonRatio: 0.29 },
    ];
    fc.assert(
      fc.property(
        fc.constantFrom(...arrangements),
        fc.double({ min: -5e-3, max: 5e-3, noNaN: true }),
        fc.double({ min: 1, max: 12, noNaN: true }),
        (options, strain, e) => {
          const bridge = createStrainBridge(options);
          const r = bridgeOperatingPoints({
            span: { bridge, strainRange: { min: -6e-3, max: strain } },
            excitationVolts: e,
          });
          const p = r.points[r.points.length - 1]!;
          const { outputVolts: vd, commonModeVolts: vcm } = solveBridgeNetwork({
            armsOhms: bridge.armsOhms(strain),
            sourceOhms: bridge.seriesOhms,
            excitationVolts: e,
            meterOhms: Infinity,
          });
          // The nodal solve takes the arms as doubles: their rounding (~1e-16·R) against the
          // imbalance (~GF·ε·R) limits it to ~1e-12 relative near zero strain; the floor covers ε → 0.
          expect(p.differentialVolts).toBeNear(vd, { rel: 1e-11, abs: 1e-15 * e });
          expect(p.differentialVolts).toBe(e * bridge.ratioFromStrain(strain));
          expect(p.commonModeVolts).toBeNear(vcm, { rel: 1e-14 });
          expect(r.gaugeArms).toEqual(bridge.armsOhms(-6e-3).map((a, i) => a !== bridge.armsOhms(strain)[i]));
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('bridgeOperatingPoints: ratio spans', () => {
  it('a 2 mV/V load cell: Vd = ratio·E, the common mode stays at mid-excitation, all arms gauges', () => {
    const r = bridgeOperatingPoints({
      span: { armsOhms: [350, 350, 350, 350], ratioRange: { min: -2e-3, max: 2e-3 } },
      excitationVolts: 10,
    });
    expect(r.measurand).toBe('ratio');
    expect(r.points.map((p) => p.differentialVolts)).toEqual([-0.02, 0, 0.02]);
    expect(r.points.map((p) => p.commonModeVolts)).toEqual([5, 5, 5]);
    expect(r.gaugeArms).toEqual([true, true, true, true]);
    for (const w of r.points[0]!.armWatts) expect(w).toBeNear(25 / 350, { ulps: 4 }); // (E/2)²/R in each arm
    expect(r.sensitivityVolts).toBe(10);
  });
});

describe('bridgeOperatingPoints: bad inputs', () => {
  const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
  it.each([
    ['empty span', { min: 1e-3, max: 1e-3 }, 'out-of-range', 'span.strainRange.max'],
    ['strain beyond the bridge', { min: -0.6, max: 1e-3 }, 'out-of-range', 'span.strainRange.min'],
    ['NaN strain', { min: Number.NaN, max: 1e-3 }, 'not-finite', 'span.strainRange.min'],
  ] as const)('%s → %s', (_name, strainRange, code, param) => {
    expect(() =>
      bridgeOperatingPoints({ span: { bridge, strainRange }, excitationVolts: 5 }),
    ).toThrowBridgeworkError(code, { param });
  });

  it('rejects a non-bridge, bad arms, a bad excitation', () => {
    expect(() =>
      bridgeOperatingPoints({
        span: { bridge: {} as never, strainRange: { min: 0, max: 1 } },
        excitationVolts: 5,
      }),
    ).toThrowBridgeworkError('wrong-type', { param: 'span.bridge' });
    expect(() =>
      bridgeOperatingPoints({
        span: { armsOhms: [350, 350] as never, ratioRange: { min: 0, max: 1e-3 } },
        excitationVolts: 5,
      }),
    ).toThrowBridgeworkError('invalid-shape', { param: 'span.armsOhms' });
    expect(() =>
      bridgeOperatingPoints({ span: { bridge, strainRange: { min: 0, max: 1e-3 } }, excitationVolts: -5 }),
    ).toThrowBridgeworkError('not-positive', { param: 'excitationVolts' });
    expect(() =>
      bridgeOperatingPoints({
        span: { bridge, strainRange: { min: 0, max: 1e-3 } },
        excitationVolts: 5,
        excitationLowVolts: Infinity,
      }),
    ).toThrowBridgeworkError('not-finite', { param: 'excitationLowVolts' });
  });
});
