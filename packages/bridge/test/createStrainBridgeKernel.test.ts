/**
 * The kernel is createStrainBridge with the completion and lead resistances as arguments: the
 * same closed form, so every map agrees bit for bit (checked against createStrainBridge built at
 * each resistance, and through it against solveBridge's network solve in its own tests).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  arrangementTable,
  createStrainBridge,
  createStrainBridgeKernel,
  needsPoissonRatio,
  solveBridge,
  strainArrangements,
} from '@bridgework/bridge';

const cases = fc.record({
  arrangement: fc.constantFrom(...strainArrangements),
  gaugeFactor: fc.double({ min: 1.8, max: 4.5, noNaN: true }),
  gaugeOhms: fc.constantFrom(120, 350, 1000),
  completionFraction: fc.double({ min: 0.99, max: 1.01, noNaN: true }),
  ohmsPerLead: fc.double({ min: 0, max: 5, noNaN: true }),
  sourceOhms: fc.constantFrom(0, 0.5, 20),
  poissonRatio: fc.double({ min: 0.25, max: 0.35, noNaN: true }),
  wiringIndex: fc.nat(3),
  strain: fc.double({ min: -4e-3, max: 4e-3, noNaN: true }),
});

describe('createStrainBridgeKernel', () => {
  it('agrees with createStrainBridge bit for bit, every arrangement and wiring (fast-check, 2000 cases)', () => {
    fc.assert(
      fc.property(cases, (c) => {
        const wirings = arrangementTable[c.arrangement].wirings;
        const wiring = wirings[c.wiringIndex % wirings.length]!;
        const poisson = needsPoissonRatio(c.arrangement) ? { poissonRatio: c.poissonRatio } : {};
        const completionOhms = c.gaugeOhms * c.completionFraction;
        const kernel = createStrainBridgeKernel({
          arrangement: c.arrangement,
          gaugeFactor: c.gaugeFactor,
          gaugeOhms: c.gaugeOhms,
          wiring,
          sourceOhms: c.sourceOhms,
          ...poisson,
        });
        const bridge = createStrainBridge({
          arrangement: c.arrangement,
          gaugeFactor: c.gaugeFactor,
          gaugeOhms: c.gaugeOhms,
          completionOhms,
          leads: { ohmsPerLead: c.ohmsPerLead, wiring },
          sourceOhms: c.sourceOhms,
          ...poisson,
        });
        const ratio = bridge.ratioFromStrain(c.strain);
        expect(kernel.ratioFromStrain(c.strain, completionOhms, c.ohmsPerLead)).toBeNear(ratio, { ulps: 0 });
        expect(kernel.strainFromRatio(ratio, completionOhms, c.ohmsPerLead)).toBeNear(
          bridge.strainFromRatio(ratio),
          { ulps: 0 },
        );
        const arms = bridge.armsOhms(c.strain);
        for (const arm of [1, 2, 3, 4] as const) {
          expect(kernel.armOhms(arm, c.strain, completionOhms, c.ohmsPerLead)).toBeNear(arms[arm - 1]!, {
            ulps: 0,
          });
        }
        expect(kernel.seriesOhms(c.ohmsPerLead)).toBeNear(bridge.seriesOhms, { ulps: 0 });
        expect(kernel.strainRange).toEqual(bridge.strainRange);
      }),
      { numRuns: 2000, seed: 13 },
    );
  });

  it('a quarter bridge with three-wire leads against the network solve (solveBridge, five-resistor closed form)', () => {
    const kernel = createStrainBridgeKernel({
      arrangement: 'quarter',
      gaugeFactor: 2.11,
      wiring: 'three-wire',
    });
    const strain = 1.2e-3;
    // R1 = Rg(1 + GFε) + RL, R2 = Rc + RL, R3 = R4 = Rc; the sense lead carries no current.
    const rl = 0.9;
    const rc = 350.02;
    const arms = [350 * (1 + 2.11 * strain) + rl, rc + rl, rc, rc] as [number, number, number, number];
    const solved = solveBridge({ armsOhms: arms, excitationVolts: 1 });
    // The arms are rounded differently (Rg + RL + Rg·GF·ε here, Rg(1 + GF·ε) + RL in the test), and
    // the ratio, ~6e-4 of the arms, magnifies that rounding ~1600-fold: 1e-12 relative.
    expect(kernel.ratioFromStrain(strain, rc, rl)).toBeNear(solved.outputVolts, { rel: 1e-12 });
    expect(kernel.strainFromRatio(solved.outputVolts, rc, rl)).toBeNear(strain, { rel: 1e-11 });
  });

  it('refuses what createStrainBridge refuses, with the same codes', () => {
    const kernel = createStrainBridgeKernel({ arrangement: 'quarter', gaugeFactor: 2, wiring: 'two-wire' });
    expect(() => kernel.strainFromRatio(0.6, 350, 0)).toThrowBridgeworkError('ratio-out-of-range', {
      param: 'ratio',
    });
    expect(() => kernel.strainFromRatio(Number.NaN, 350, 0)).toThrowBridgeworkError('not-finite', {
      param: 'ratio',
    });
    expect(() => kernel.strainFromRatio(1e-3, 0, 0)).toThrowBridgeworkError('not-positive', {
      param: 'completionOhms',
    });
    expect(() => kernel.strainFromRatio(1e-3, 350, -1)).toThrowBridgeworkError('negative', {
      param: 'ohmsPerLead',
    });
    expect(() => kernel.ratioFromStrain(-0.6, 350, 0)).toThrowBridgeworkError('out-of-range', {
      param: 'strain',
    });
    expect(() => kernel.armOhms(5 as 1, 0, 350, 0)).toThrowBridgeworkError('out-of-range', { param: 'arm' });
    expect(() =>
      createStrainBridgeKernel({ arrangement: 'quarter', gaugeFactor: 2, wiring: 'four-wire' }),
    ).toThrowBridgeworkError('invalid-option', { param: 'wiring' });
    expect(() =>
      createStrainBridgeKernel({ arrangement: 'half-poisson', gaugeFactor: 2 }),
    ).toThrowBridgeworkError('missing-option', { param: 'poissonRatio' });
    expect(() =>
      createStrainBridgeKernel({ arrangement: 'quarter', gaugeFactor: 2, wirng: 'two-wire' } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'options.wirng' });
  });
});
