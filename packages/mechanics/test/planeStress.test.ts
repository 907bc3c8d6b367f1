import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planeStress, reduceRosette } from '@bridgework/mechanics';
import { planeStressReference } from './support/reference.js';

const component = fc.double({ min: -3e-3, max: 3e-3, noNaN: true }).map((x) => (Math.abs(x) < 1e-15 ? 0 : x)); // below any gauge's resolution: 0
const state = fc.record({ strainX: component, strainY: component, shearStrainXY: component });
const material = fc.record({
  modulusPascals: fc.double({ min: 1e9, max: 400e9, noNaN: true }),
  poissonRatio: fc.double({ min: -0.9, max: 0.5, noNaN: true }),
});
const steel = { modulusPascals: 200e9, poissonRatio: 0.3 };

describe('planeStress: check values', () => {
  it('E = 200 GPa, ν = 0.3, (800, −200, 600) µε → σ1 = 175.4212, σ2 = −3.9927, von Mises 177.4513 MPa', () => {
    // Issue 6 check values, derived by hand: c = 300, R = √(500² + 300²) = 583.0952 µε, so
    // ε1 = 883.0952, ε2 = −283.0952 µε; E/(1 − ν²) = 219.7802 GPa; σ1 = 219.7802·(883.0952 −
    // 0.3·283.0952) = 175.4212 MPa, σ2 = 219.7802·(−283.0952 + 0.3·883.0952) = −3.9927 MPa;
    // σvm = √(σ1² − σ1σ2 + σ2²) = 177.4513 MPa.
    const p = planeStress({
      strainState: { strainX: 800e-6, strainY: -200e-6, shearStrainXY: 600e-6 },
      ...steel,
    });
    expect(p.maxStressPascals / 1e6).toBeNear(175.4212, { abs: 5e-5 });
    expect(p.minStressPascals / 1e6).toBeNear(-3.9927, { abs: 5e-5 });
    expect(p.vonMisesPascals / 1e6).toBeNear(177.4513, { abs: 5e-5 });
    // Components: σx = 219.78·(800 − 60) = 162.637 MPa, σy = 219.78·(−200 + 240) = 8.7912 MPa,
    // τxy = G·γ = 76.923 GPa · 600 µ = 46.154 MPa.
    expect(p.stressXPascals).toBeNear((200e9 / 0.91) * 740e-6, { rel: 1e-15 });
    expect(p.stressYPascals).toBeNear((200e9 / 0.91) * 40e-6, { rel: 1e-14 });
    expect(p.shearStressXYPascals).toBeNear((200e9 / 2.6) * 600e-6, { rel: 1e-15 });
    expect(p.maxShearPascals).toBeNear((200e9 / 2.6) * 2 * Math.sqrt(500 ** 2 + 300 ** 2) * 1e-6, {
      rel: 1e-15,
    });
    // σ3 = 0 lies between σ2 < 0 < σ1, so the absolute maximum shear is the in-plane one.
    expect(p.absoluteMaxShearPascals).toBe(p.maxShearPascals);
    expect(p.trescaPascals).toBeNear(p.maxStressPascals - p.minStressPascals, { rel: 1e-15 });
    expect(p.outOfPlaneStrain).toBeNear((-0.3 / 0.7) * 600e-6, { rel: 1e-15 });
  });

  it('gives the same principal stresses from the principal strains, in either order', () => {
    const c = 300e-6;
    const r = Math.hypot(500e-6, 300e-6);
    const a = planeStress({ principalStrains: [c + r, c - r], ...steel });
    const b = planeStress({ principalStrains: [c - r, c + r], ...steel });
    expect(b).toEqual(a);
    expect(a.maxStressPascals / 1e6).toBeNear(175.4212, { abs: 5e-5 });
    expect(a.minStressPascals / 1e6).toBeNear(-3.9927, { abs: 5e-5 });
    expect(a.vonMisesPascals / 1e6).toBeNear(177.4513, { abs: 5e-5 });
    expect('stressXPascals' in a).toBe(false);
  });

  it('uniaxial stress: ε2 = −νε1 gives σ1 = Eε1, σ2 = 0, von Mises = Tresca = σ1', () => {
    // Textbook limiting case (tension test): the transverse strain is −ν times the axial strain.
    const p = planeStress({ principalStrains: [1e-3, -0.3e-3], ...steel });
    expect(p.maxStressPascals).toBeNear(200e6, { rel: 1e-15 });
    expect(p.minStressPascals).toBeNear(0, { abs: 1e-15 * 200e6 }); // cancellation: ε2 + νε1 = 0
    expect(p.vonMisesPascals).toBeNear(200e6, { rel: 1e-15 });
    expect(p.trescaPascals).toBeNear(200e6, { rel: 1e-15 });
    expect(p.maxShearPascals).toBeNear(100e6, { rel: 1e-15 });
    expect(p.outOfPlaneStrain).toBeNear(-0.3e-3, { rel: 1e-15 }); // εz = −νε1 as well
  });

  it('pure shear: ε1 = −ε2 gives σ = ±Eε/(1 + ν), von Mises √3·τ, Tresca 2τ', () => {
    const p = planeStress({ principalStrains: [500e-6, -500e-6], ...steel });
    const tau = (200e9 * 500e-6) / 1.3;
    expect(p.maxStressPascals).toBeNear(tau, { rel: 1e-15 });
    expect(p.minStressPascals).toBeNear(-tau, { rel: 1e-15 });
    expect(p.maxShearPascals).toBeNear(tau, { rel: 1e-15 });
    expect(p.absoluteMaxShearPascals).toBeNear(tau, { rel: 1e-15 });
    expect(p.vonMisesPascals).toBeNear(Math.sqrt(3) * tau, { rel: 1e-15 });
    expect(p.trescaPascals).toBeNear(2 * tau, { rel: 1e-15 });
    expect(p.outOfPlaneStrain).toBe(0);
  });

  it('equibiaxial tension: no in-plane shear, but the absolute maximum shear is σ/2 (σ3 = 0)', () => {
    const p = planeStress({ principalStrains: [700e-6, 700e-6], ...steel });
    const sigma = (200e9 * 700e-6) / 0.7; // E·ε/(1 − ν)
    expect(p.maxStressPascals).toBeNear(sigma, { rel: 1e-15 });
    expect(p.minStressPascals).toBeNear(sigma, { rel: 1e-15 });
    expect(p.maxShearPascals).toBe(0);
    expect(p.absoluteMaxShearPascals).toBeNear(sigma / 2, { rel: 1e-15 });
    expect(p.vonMisesPascals).toBeNear(sigma, { rel: 1e-15 });
    expect(p.trescaPascals).toBeNear(sigma, { rel: 1e-15 });
  });

  it('compression on both axes: the absolute maximum shear is |σ2|/2', () => {
    const p = planeStress({ principalStrains: [-200e-6, -900e-6], ...steel });
    expect(p.maxStressPascals).toBeLessThan(0);
    expect(p.absoluteMaxShearPascals).toBeNear(Math.abs(p.minStressPascals) / 2, { rel: 1e-15 });
    expect(p.absoluteMaxShearPascals).toBeGreaterThan(p.maxShearPascals);
  });
});

describe('planeStress: against 40-digit references', () => {
  it('matches Hooke-then-eigs (decimal.js: Hooke at 40 digits, the closed-form eigenvalues at 80) over random states and materials', () => {
    fc.assert(
      fc.property(state, material, (s, m) => {
        const p = planeStress({ strainState: s, ...m });
        const ref = planeStressReference(
          s.strainX,
          s.strainY,
          s.shearStrainXY,
          m.modulusPascals,
          m.poissonRatio,
        );
        const big = Math.max(
          Math.abs(ref.principal[0]),
          Math.abs(ref.principal[1]),
          Math.abs(ref.shearStressXY),
        );
        // 1e-14 relative, or 1e-14 of the largest stress for a field that is much smaller than the
        // others (σ = k(ε1 + νε2) cancels when ε1 ≈ −νε2; the inputs' own rounding sets that floor).
        const tol = { rel: 1e-14, abs: 1e-14 * big + 1e-300 };
        expect(p.stressXPascals).toBeNear(ref.stressX, tol);
        expect(p.stressYPascals).toBeNear(ref.stressY, tol);
        expect(p.shearStressXYPascals).toBeNear(ref.shearStressXY, tol);
        expect(p.minStressPascals).toBeNear(ref.principal[0], tol);
        expect(p.maxStressPascals).toBeNear(ref.principal[1], tol);
        expect(p.vonMisesPascals).toBeNear(ref.vonMises, tol);
        expect(p.outOfPlaneStrain).toBeNear(ref.outOfPlaneStrain, { rel: 1e-14, abs: 1e-17 });
        expect(p.maxShearPascals).toBeNear((ref.principal[1] - ref.principal[0]) / 2, tol);
        expect(p.absoluteMaxShearPascals).toBeNear(
          Math.max(
            ref.principal[1] - ref.principal[0],
            Math.abs(ref.principal[0]),
            Math.abs(ref.principal[1]),
          ) / 2,
          tol,
        );
      }),
      { numRuns: 150 },
    );
  });

  it('composes with reduceRosette: a reduction is a strain state', () => {
    const r = reduceRosette({ layout: 'rectangular', strains: [800e-6, 600e-6, -200e-6] });
    // γxy = 2·600 − 800 + 200 = 600 µ: the state (800, −200, 600) µε.
    const p = planeStress({ strainState: r, ...steel });
    expect(p.maxStressPascals / 1e6).toBeNear(175.4212, { abs: 5e-5 });
    expect(p.vonMisesPascals / 1e6).toBeNear(177.4513, { abs: 5e-5 });
  });

  it('ν = 0.5 (incompressible) is accepted: εz = −(ε1 + ε2)', () => {
    const p = planeStress({ principalStrains: [400e-6, 100e-6], modulusPascals: 3e6, poissonRatio: 0.5 });
    expect(p.outOfPlaneStrain).toBeNear(-500e-6, { rel: 1e-15 });
    expect(p.maxStressPascals).toBeNear((3e6 / 0.75) * (400e-6 + 50e-6), { rel: 1e-15 });
  });
});

describe('planeStress: bad input', () => {
  const s = { strainX: 1e-4, strainY: 0, shearStrainXY: 0 };
  it('needs exactly one strain input', () => {
    expect(() => planeStress({ ...steel } as never)).toThrowBridgeworkError('missing-option', {
      param: 'principalStrains',
    });
    expect(() =>
      planeStress({ principalStrains: [1e-4, 0], strainState: s, ...steel } as never),
    ).toThrowBridgeworkError('conflicting-options', { param: 'strainState' });
  });

  it('rejects bad strains', () => {
    expect(() => planeStress({ principalStrains: [1e-4] as never, ...steel })).toThrowBridgeworkError(
      'invalid-shape',
      { param: 'principalStrains' },
    );
    expect(() => planeStress({ principalStrains: [Number.NaN, 0], ...steel })).toThrowBridgeworkError(
      'not-finite',
      { param: 'principalStrains[0]' },
    );
    expect(() => planeStress({ principalStrains: [0, 1000], ...steel })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'principalStrains[1]',
      },
    );
    expect(() =>
      planeStress({ strainState: { ...s, shearStrainXY: Infinity }, ...steel }),
    ).toThrowBridgeworkError('not-finite', { param: 'strainState.shearStrainXY' });
    expect(() => planeStress({ strainState: 'x' as never, ...steel })).toThrowBridgeworkError('wrong-type', {
      param: 'strainState',
    });
  });

  it('rejects bad material constants', () => {
    expect(() => planeStress({ strainState: s, poissonRatio: 0.3 } as never)).toThrowBridgeworkError(
      'missing-option',
      { param: 'options.modulusPascals' },
    );
    expect(() => planeStress({ strainState: s, modulusPascals: 200e9 } as never)).toThrowBridgeworkError(
      'missing-option',
      { param: 'options.poissonRatio' },
    );
    expect(() =>
      planeStress({ strainState: s, modulusPascals: 0, poissonRatio: 0.3 }),
    ).toThrowBridgeworkError('not-positive', { param: 'modulusPascals' });
    expect(() =>
      planeStress({ strainState: s, modulusPascals: Number.NaN, poissonRatio: 0.3 }),
    ).toThrowBridgeworkError('not-finite', { param: 'modulusPascals' });
    expect(() =>
      planeStress({ strainState: s, modulusPascals: '200e9' as never, poissonRatio: 0.3 }),
    ).toThrowBridgeworkError('wrong-type', { param: 'modulusPascals' });
    for (const poissonRatio of [-1, 0.51, 2]) {
      expect(() =>
        planeStress({ strainState: s, modulusPascals: 200e9, poissonRatio }),
      ).toThrowBridgeworkError('out-of-range', { param: 'poissonRatio' });
    }
    expect(() =>
      planeStress({ strainState: s, modulusPascals: 200e9, poissonRatio: Infinity }),
    ).toThrowBridgeworkError('not-finite', { param: 'poissonRatio' });
    expect(() => planeStress(undefined as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });
});
