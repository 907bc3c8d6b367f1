import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { normalStrainAtAngle, principalStrainsFromState } from '@bridgework/mechanics';
import { legStrainsReference, strainTensorEigs } from './support/reference.js';

const deg = Math.PI / 180;
/**
 * Strain components up to ±5000 µε. Magnitudes below 1e-15 (1e-9 µε, far below any gauge's
 * resolution) become 0: eigenvalues of such states can fall below the smallest normal double,
 * where no relative precision exists. Tiny strains have a test of their own below.
 */
const component = fc.double({ min: -5e-3, max: 5e-3, noNaN: true }).map((x) => (Math.abs(x) < 1e-15 ? 0 : x));
const state = fc.record({ strainX: component, strainY: component, shearStrainXY: component });
const scaleOf = (s: { strainX: number; strainY: number; shearStrainXY: number }): number =>
  Math.max(Math.abs(s.strainX), Math.abs(s.strainY), Math.abs(s.shearStrainXY));

describe('normalStrainAtAngle', () => {
  it('gives εx at 0, εy at 90° and (εx + εy + γxy)/2 at 45° (the transformation equation)', () => {
    const s = { strainX: 800e-6, strainY: -200e-6, shearStrainXY: 600e-6 };
    expect(normalStrainAtAngle(s, 0)).toBe(800e-6);
    expect(normalStrainAtAngle(s, 90 * deg)).toBeNear(-200e-6, { rel: 1e-15 });
    expect(normalStrainAtAngle(s, 45 * deg)).toBeNear(600e-6, { rel: 1e-15 });
    // 30°: 800·3/4 − 200·1/4 + 600·(√3/4) = 600 − 50 + 259.8076 µε, by hand.
    expect(normalStrainAtAngle(s, 30 * deg)).toBeNear((550 + 150 * Math.sqrt(3)) * 1e-6, { rel: 1e-15 });
  });

  it('matches a 40-digit evaluation at any angle, and is periodic in π', () => {
    fc.assert(
      fc.property(state, fc.double({ min: -7, max: 7, noNaN: true }), (s, theta) => {
        const [ref] = legStrainsReference([theta, 0, 0], s.strainX, s.strainY, s.shearStrainXY);
        const tol = { abs: 1e-15 * scaleOf(s) + 1e-300 };
        expect(normalStrainAtAngle(s, theta)).toBeNear(ref, tol);
        expect(normalStrainAtAngle(s, theta + Math.PI)).toBeNear(ref, { abs: 1e-14 * scaleOf(s) + 1e-300 });
        // First invariant: perpendicular gauges add up to εx + εy.
        expect(normalStrainAtAngle(s, theta) + normalStrainAtAngle(s, theta + Math.PI / 2)).toBeNear(
          s.strainX + s.strainY,
          { abs: 1e-14 * scaleOf(s) + 1e-300 },
        );
      }),
      { numRuns: 200 },
    );
  });

  it('rejects bad input', () => {
    const s = { strainX: 0, strainY: 0, shearStrainXY: 0 };
    expect(() => normalStrainAtAngle(s, Number.NaN)).toThrowBridgeworkError('not-finite', {
      param: 'angleRadians',
    });
    expect(() => normalStrainAtAngle(s, '1' as never)).toThrowBridgeworkError('wrong-type', {
      param: 'angleRadians',
    });
    expect(() => normalStrainAtAngle({ ...s, strainX: Infinity }, 0)).toThrowBridgeworkError('not-finite', {
      param: 'state.strainX',
    });
    expect(() => normalStrainAtAngle({ ...s, shearStrainXY: 2 }, 0)).toThrowBridgeworkError('out-of-range', {
      param: 'state.shearStrainXY',
    });
    expect(() => normalStrainAtAngle(null as never, 0)).toThrowBridgeworkError('wrong-type', {
      param: 'state',
    });
  });
});

describe('principalStrainsFromState', () => {
  it('εx = 770, εy = −350, γxy = 1940 µ → ε1 = 1330.04 µε, ε2 = −910.04 µε', () => {
    // Issue 6 check values, recomputed from Mohr's circle (published source not confirmed):
    // c = 210, R = √(560² + 970²) = 1120.0446 µε.
    const p = principalStrainsFromState({ strainX: 770e-6, strainY: -350e-6, shearStrainXY: 1940e-6 });
    expect(p.maxStrain * 1e6).toBeNear(1330.04, { abs: 0.005 });
    expect(p.minStrain * 1e6).toBeNear(-910.04, { abs: 0.005 });
    expect(p.maxShearStrain * 1e6).toBeNear(2240.09, { abs: 0.005 });
    const eig = strainTensorEigs(770e-6, -350e-6, 1940e-6);
    expect([p.minStrain, p.maxStrain]).toBeNear(eig.values, { rel: 2e-16 });
  });

  it('equals the eigenvalues of [[εx, γ/2], [γ/2, εy]] (closed form, decimal.js at 400 digits) to 1e-14 relative each', () => {
    fc.assert(
      fc.property(state, (s) => {
        const p = principalStrainsFromState(s);
        const eig = strainTensorEigs(s.strainX, s.strainY, s.shearStrainXY);
        // No floor: the smaller eigenvalue comes from ε1·ε2 = εxεy − (γ/2)², not from c − R.
        expect(p.minStrain).toBeNear(eig.values[0], { rel: 1e-14 });
        expect(p.maxStrain).toBeNear(eig.values[1], { rel: 1e-14 });
        // λ1 − λ2 = 2R formed at 400 digits: the difference of the two rounded eigenvalues loses
        // their rounding relative to a small difference (1e-14 seen for a near-isotropic state).
        expect(p.maxShearStrain).toBeNear(eig.maxShear, { rel: 1e-14 });
        // Invariants.
        expect(p.maxStrain + p.minStrain).toBeNear(s.strainX + s.strainY, { abs: 1e-15 * scaleOf(s) });
      }),
      { numRuns: 150 },
    );
  });

  it('keeps full relative precision in a principal strain that nearly cancels', () => {
    // εx·εy = (γ/2)² up to rounding: ε2 ≈ (εxεy − γ²/4)/ε1 is ~1e-20 while c − R would leave
    // only rounding noise of ~1e-19. Reference: the closed form at 400 digits (decimal.js).
    const g = Math.sqrt(4e-7); // γ/2 for εx = 1e-3, εy = 4e-4
    const s = { strainX: 1e-3, strainY: 4e-4, shearStrainXY: 2 * g };
    const p = principalStrainsFromState(s);
    const eig = strainTensorEigs(s.strainX, s.strainY, s.shearStrainXY);
    expect(Math.abs(eig.values[0])).toBeLessThan(1e-18);
    expect(p.minStrain).toBeNear(eig.values[0], { rel: 1e-14 });
    expect(p.maxStrain).toBeNear(eig.values[1], { rel: 1e-15 });
    // Negative centre: the larger one (near zero) comes from the product.
    const q = principalStrainsFromState({ strainX: -1e-3, strainY: -4e-4, shearStrainXY: 2 * g });
    const qe = strainTensorEigs(-1e-3, -4e-4, 2 * g);
    expect(q.maxStrain).toBeNear(qe.values[1], { rel: 1e-14 });
    expect(q.minStrain).toBeNear(qe.values[0], { rel: 1e-15 });
  });

  it('keeps precision for very small strains (the product is formed on rescaled inputs)', () => {
    const s = { strainX: 0, strainY: 0, shearStrainXY: -1e-290 };
    const p = principalStrainsFromState(s);
    expect(p.maxStrain).toBeNear(5e-291, { rel: 1e-15 });
    expect(p.minStrain).toBeNear(-5e-291, { rel: 1e-15 });
    expect(p.angleFromXRadians).toBeNear(-45 * deg, { ulps: 1 });
  });

  it('flags equal principal strains (εx = εy, γxy = 0), with direction 0 (every one is principal), and nothing else', () => {
    const p = principalStrainsFromState({ strainX: 300e-6, strainY: 300e-6, shearStrainXY: 0 });
    expect(p.equalPrincipalStrains).toBe(true);
    expect(p.angleFromXRadians).toBe(0);
    expect(p.maxStrain).toBe(300e-6);
    expect(p.minStrain).toBe(300e-6);
    expect(p.maxShearStrain).toBe(0);
    const zero = principalStrainsFromState({ strainX: 0, strainY: 0, shearStrainXY: 0 });
    expect(zero.equalPrincipalStrains).toBe(true);
    expect(zero.maxStrain).toBe(0);
    // The given state is exact: a shear of 1e-20 has a direction (45°).
    const q = principalStrainsFromState({ strainX: 300e-6, strainY: 300e-6, shearStrainXY: 1e-20 });
    expect(q.equalPrincipalStrains).toBe(false);
    expect(q.angleFromXRadians).toBeNear(45 * deg, { ulps: 1 });
  });

  it('rejects bad input', () => {
    expect(() => principalStrainsFromState({ strainX: 0, strainY: 0 } as never)).toThrowBridgeworkError(
      'missing-option',
      { param: 'state.shearStrainXY' },
    );
    expect(() =>
      principalStrainsFromState({ strainX: Number.NaN, strainY: 0, shearStrainXY: 0 }),
    ).toThrowBridgeworkError('not-finite', { param: 'state.strainX' });
    expect(() =>
      principalStrainsFromState({ strainX: 0, strainY: -1.5, shearStrainXY: 0 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'state.strainY' });
    expect(() => principalStrainsFromState([0, 0, 0] as never)).toThrowBridgeworkError('wrong-type', {
      param: 'state',
    });
  });
});
