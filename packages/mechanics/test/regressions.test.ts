/**
 * Regressions of issue 15 in the mechanics package: each defect the attacks found, with the test
 * named after what it checks.
 */
import { describe, expect, it } from 'vitest';
import { createRosette, planeStress, sectionProperties } from '@bridgework/mechanics';

// A layout whose two first legs are 0.178° apart: accepted (κF ≈ 557 < 1000) but ill-conditioned.
const narrow = {
  anglesRadians: [0, (0.17823966125280105 * Math.PI) / 180, Math.PI / 2] as [number, number, number],
};

describe('regressions: an ill-conditioned rosette is flagged at reduce (issue 15, item 13)', () => {
  it('reduce refuses legs that reduce to a state beyond (−1, 1) m/m, naming strains and κF', () => {
    const rosette = createRosette({ layout: narrow });
    expect(rosette.conditionNumber).toBeNear(556.78, { abs: 0.01 });
    // Inconsistent legs of a few mε: they reduce to a shear strain beyond −1, which legStrains and
    // planeStress would reject later; reduce refuses it here.
    expect(() => rosette.reduce([1e-3, -3e-3, 2e-3])).toThrowBridgeworkError('out-of-range', {
      param: 'strains',
    });
    expect(() => rosette.reduce([1e-3, -3e-3, 2e-3])).toThrow('557');
  });

  it('reduce on the same layout passes consistent legs, and its state feeds planeStress', () => {
    const rosette = createRosette({ layout: narrow });
    const legs = rosette.legStrains({ strainX: 5e-4, strainY: -1.5e-4, shearStrainXY: 2e-4 });
    const state = rosette.reduce(legs);
    // Round trip within 64·u·κF of the largest leg (the documented bound is 1e-15·κF).
    expect(state.strainX).toBeNear(5e-4, { abs: 1e-15 * rosette.conditionNumber * 5e-4 * 10 });
    expect(
      planeStress({ strainState: state, modulusPascals: 200e9, poissonRatio: 0.3 }).vonMisesPascals > 0,
    ).toBe(true);
  });

  it('parallel legs are refused with "parallel legs", never "condition number NaN"', () => {
    let message = '';
    try {
      createRosette({ layout: { anglesRadians: [0, 0, Math.PI / 2] } });
    } catch (e) {
      message = (e as Error).message;
    }
    expect(message).toContain('parallel legs');
    expect(message).not.toContain('NaN');
  });
});

describe('regressions: finite inputs never give non-finite outputs (issue 15, item 7)', () => {
  it('section properties of a 1e308 m bar are refused (lengths in [1e-6, 1e3] m), not Infinity', () => {
    expect(() => sectionProperties({ shape: 'circular', diameterMeters: 1e308 })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'section.diameterMeters' },
    );
  });

  it('plane stress with a modulus of 1e308 Pa is refused (at most 1e13 Pa), not an infinite von Mises', () => {
    expect(() =>
      planeStress({ principalStrains: [1e-3, 0], modulusPascals: 1e308, poissonRatio: 0.3 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'modulusPascals' });
  });
});
