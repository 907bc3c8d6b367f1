/**
 * Regressions of issue 15 in the bridge package: each defect the attacks found, with the test
 * named after what it checks.
 */
import { describe, expect, it } from 'vitest';
import { createStrainBridge, needsPoissonRatio, solveArm, solveBridge } from '@bridgework/bridge';

const finite = (o: object): boolean =>
  Object.values(o).every((v) => (Array.isArray(v) ? v.every(Number.isFinite) : Number.isFinite(v)));

describe('regressions: finite inputs never give non-finite outputs (issue 15, item 7)', () => {
  it('ratioFromStrain at 1e308, inside strainRange, gives the limit ratio instead of NaN', () => {
    const quarter = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    expect(quarter.strainRange.max).toBe(Infinity);
    // R1 = R(1 + GF·ε): ratio = GF·ε/(2(2 + GF·ε)) → 1/2 as ε → ∞ (closed form, exact limit).
    expect(quarter.ratioFromStrain(1e308)).toBeNear(0.5, { ulps: 1 });
    expect(quarter.ratioFromStrain(1e150)).toBeNear(0.5, { ulps: 1 });
    expect(quarter.nonlinearity(1e308)).toBeNear(1, { ulps: 2 }); // the response saturates completely
  });

  it('a full-poisson bridge with ν ≤ 2.6e-152 has a finite ratioRange (±1), not {NaN, NaN}', () => {
    for (const nu of [2.6e-152, 1e-200, 1e-300]) {
      const b = createStrainBridge({ arrangement: 'full-poisson', gaugeFactor: 2, poissonRatio: nu });
      // At ε → −1/GF arms 1 and 3 vanish: ratio → −1; at ε = 1/(GF·ν) arms 2 and 4 vanish: ratio → 1.
      expect(b.ratioRange.min).toBeNear(-1, { abs: 1e-12 });
      expect(b.ratioRange.max).toBeNear(1, { abs: 1e-12 });
    }
  });

  it('solveBridge refuses an arm of 1e308 Ω (outside OHMS_LIMITS) instead of returning NaN fields', () => {
    expect(() =>
      solveBridge({ armsOhms: [1e308, 350, 350, 350], excitationVolts: 5 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'armsOhms[0]' });
  });

  it('solveBridge gives finite fields at the ends of its documented domain', () => {
    for (const armsOhms of [
      [1e15, 1e-9, 1e15, 1e-9],
      [1e-9, 1e-9, 1e-9, 1e-9],
      [1e15, 1e15, 1e15, 1e-9],
    ] as const) {
      for (const excitationVolts of [1e-9, 1e6]) {
        for (const sourceOhms of [0, 1e15]) {
          const s = solveBridge({ armsOhms, excitationVolts, sourceOhms, meterOhms: 1e-9 });
          expect(finite(s), JSON.stringify({ armsOhms, excitationVolts, sourceOhms })).toBe(true);
        }
      }
    }
  });

  it('armsOhms and linearRatioFromStrain refuse a strain whose result would overflow', () => {
    const quarter = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    expect(() => quarter.armsOhms(1e308)).toThrowBridgeworkError('out-of-range', { param: 'strain' });
    // GF 1000: the tangent's slope is 250, so 250·1e308 overflows.
    const semiconductor = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 1000 });
    expect(() => semiconductor.linearRatioFromStrain(1e308)).toThrowBridgeworkError('out-of-range', {
      param: 'strain',
    });
  });
});

describe('regressions: typed errors, never TypeErrors (issue 15, item 11)', () => {
  it('ratioFromStrain(1e-3, null) is a wrong-type error, not a TypeError', () => {
    const b = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    expect(() => b.ratioFromStrain(1e-3, null as never)).toThrowBridgeworkError('wrong-type', {
      param: 'options',
    });
    expect(() => b.strainFromRatio(1e-3, null as never)).toThrowBridgeworkError('wrong-type', {
      param: 'options',
    });
  });

  it("needsPoissonRatio('Quarter') is an invalid-option error naming 'quarter'", () => {
    expect(() => needsPoissonRatio('Quarter' as never)).toThrowBridgeworkError('invalid-option', {
      param: 'arrangement',
    });
    expect(() => needsPoissonRatio('Quarter' as never)).toThrow("did you mean 'quarter'?");
  });
});

describe('regressions: the options rule (issue 15, item 5)', () => {
  it('a misspelt option is refused, naming the closest key, at every level', () => {
    expect(() =>
      createStrainBridge({ arrangement: 'quarter', gaugeFactr: 2 } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'options.gaugeFactr' });
    expect(() =>
      createStrainBridge({
        arrangement: 'quarter',
        gaugeFactor: 2,
        leads: { ohmsPerLaed: 1, wiring: 'two-wire' },
      } as never),
    ).toThrow('did you mean `ohmsPerLead`?');
    expect(() =>
      solveArm({ armsOhms: [null, 350, 350, 350], excitationVolts: 5, outputVolt: 0 } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'options.outputVolt' });
    const b = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
    expect(() => b.strainFromRatio(1e-3, { zeroRatoi: 0 } as never)).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'options.zeroRatoi',
      },
    );
  });
});
