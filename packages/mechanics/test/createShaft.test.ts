import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createShaft, planeStress, reduceRosette } from '@bridgework/mechanics';
import { D, dec } from './support/reference.js';

const strain = fc.double({ min: -0.005, max: 0.005, noNaN: true }).map((x) => (Math.abs(x) < 1e-15 ? 0 : x)); // no subnormal strains (products lose their ulps)
const steel = { modulusPascals: 200e9, poissonRatio: 0.3 };

describe('createShaft: check values', () => {
  it('solid shaft D = 25 mm, E = 200 GPa, ν = 0.3, ε45 = 500 µε → 235.997 N·m', () => {
    // Issue 6 check value, derived: T = E·ε45/(1 + ν)·πD³/16 = 200e9·500e-6/1.3 · π·0.025³/16
    // = 76.923 MPa · 3.06796e-6 m³ = 235.997 N·m. 40-digit evaluation beside it.
    const shaft = createShaft({ diameterMeters: 0.025, ...steel });
    expect(shaft.torqueFromStrain(500e-6)).toBeNear(235.997, { abs: 5e-4 });
    const pi = new D('3.141592653589793238462643383279502884197');
    const exact = dec(200e9).times(dec(500e-6)).div(dec(1.3)).times(pi).times(dec(0.025).pow(3)).div(16);
    expect(shaft.torqueFromStrain(500e-6)).toBeNear(Number(exact), { rel: 1e-15 });
    expect(shaft.shearModulusPascals).toBeNear(200e9 / 2.6, { ulps: 0 });
    expect(shaft.polarMomentOfAreaMeters4).toBeNear((Math.PI * 0.025 ** 4) / 32, { rel: 1e-15 });
    expect(shaft.polarSectionModulusCubicMeters).toBeNear((Math.PI * 0.025 ** 3) / 16, { rel: 1e-15 });
  });

  it('hollow shaft: T = E·ε45/(1 + ν)·π(D⁴ − d⁴)/(16D) (40-digit evaluation)', () => {
    const shaft = createShaft({ diameterMeters: 0.06, innerDiameterMeters: 0.045, ...steel });
    const pi = new D('3.141592653589793238462643383279502884197');
    const exact = dec(200e9)
      .times(dec(-420e-6))
      .div(dec(1.3))
      .times(pi)
      .times(dec(0.06).pow(4).minus(dec(0.045).pow(4)))
      .div(dec(0.06).times(16));
    expect(shaft.torqueFromStrain(-420e-6)).toBeNear(Number(exact), { rel: 1e-15 });
  });

  it('the full-shear bridge strain is ε45, and a ±45° pair gives the same torque while rejecting axial and bending', () => {
    // Pure torsion: ε+45 = +γ/2, ε−45 = −γ/2. Adding the same axial-plus-bending strain to both
    // gauges (they read it alike) leaves ε+45 − ε−45 = γ unchanged.
    const shaft = createShaft({ diameterMeters: 0.04, shearModulusPascals: 80e9 });
    const e45 = 350e-6;
    const common = 123e-6;
    expect(shaft.torqueFromGaugePair(e45 + common, -e45 + common)).toBeNear(shaft.torqueFromStrain(e45), {
      rel: 1e-15,
    });
  });

  it('agrees with a rosette on the shaft: rectangular legs (0, ε45, 0) → τmax → T = τ·J/r', () => {
    // A different route through the package: the rosette's gauge a along the axis reads 0 in pure
    // torsion, gauge b (45°) reads ε45, gauge c 0. The reduction gives γxy = 2ε45, plane stress
    // gives τmax = G·γ, and Coulomb's torsion formula T = τ·J/r turns it into torque.
    const shaft = createShaft({ diameterMeters: 0.025, ...steel });
    const r = reduceRosette({ layout: 'rectangular', strains: [0, 500e-6, 0] });
    expect(r.angleRadians).toBeNear(Math.PI / 4, { ulps: 1 }); // ε1 at +45°
    const tau = planeStress({ strainState: r, ...steel }).maxShearPascals;
    const torque = (tau * shaft.polarMomentOfAreaMeters4) / 0.0125;
    expect(shaft.torqueFromStrain(500e-6)).toBeNear(torque, { rel: 1e-15 });
  });

  it('E and ν give the same shaft as G = E/(2(1 + ν)), and torque ↔ strain round-trips', () => {
    const a = createShaft({ diameterMeters: 0.03, ...steel });
    const b = createShaft({ diameterMeters: 0.03, shearModulusPascals: 200e9 / 2.6 });
    expect(b.torqueFromStrain(400e-6)).toBe(a.torqueFromStrain(400e-6));
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 0, noNaN: true }).map((x) => 10 ** x),
        fc.double({ min: 0, max: 0.95, noNaN: true }),
        strain,
        (diameterMeters, bore, e) => {
          const s = createShaft({ diameterMeters, innerDiameterMeters: diameterMeters * bore, ...steel });
          expect(s.strainFromTorque(s.torqueFromStrain(e))).toBeNear(e, { ulps: 4 });
          expect(s.torqueFromGaugePair(e, -e)).toBeNear(s.torqueFromStrain(e), { ulps: 2 });
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('createShaft: bad input', () => {
  it('rejects bad geometry', () => {
    expect(() => createShaft({ ...steel } as never)).toThrowBridgeworkError('missing-option', {
      param: 'options.diameterMeters',
    });
    expect(() => createShaft({ diameterMeters: 0, ...steel })).toThrowBridgeworkError('not-positive', {
      param: 'diameterMeters',
    });
    expect(() =>
      createShaft({ diameterMeters: 0.02, innerDiameterMeters: 0.02, ...steel }),
    ).toThrowBridgeworkError('out-of-range', { param: 'innerDiameterMeters' });
    expect(() =>
      createShaft({ diameterMeters: 0.02, innerDiameterMeters: -1e-3, ...steel }),
    ).toThrowBridgeworkError('negative', { param: 'innerDiameterMeters' });
    expect(() => createShaft({ diameterMeters: Number.NaN, ...steel })).toThrowBridgeworkError('not-finite', {
      param: 'diameterMeters',
    });
  });

  it('rejects missing or conflicting material constants', () => {
    expect(() => createShaft({ diameterMeters: 0.02 })).toThrowBridgeworkError('missing-option', {
      param: 'modulusPascals',
    });
    expect(() => createShaft({ diameterMeters: 0.02, modulusPascals: 200e9 })).toThrowBridgeworkError(
      'missing-option',
      { param: 'poissonRatio' },
    );
    expect(() =>
      createShaft({ diameterMeters: 0.02, shearModulusPascals: 80e9, modulusPascals: 200e9 }),
    ).toThrowBridgeworkError('conflicting-options', { param: 'modulusPascals' });
    expect(() =>
      createShaft({ diameterMeters: 0.02, shearModulusPascals: 80e9, poissonRatio: 0.3 }),
    ).toThrowBridgeworkError('conflicting-options', { param: 'poissonRatio' });
    expect(() => createShaft({ diameterMeters: 0.02, shearModulusPascals: 0 })).toThrowBridgeworkError(
      'not-positive',
      { param: 'shearModulusPascals' },
    );
    expect(() =>
      createShaft({ diameterMeters: 0.02, modulusPascals: 200e9, poissonRatio: 0.7 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'poissonRatio' });
    expect(() => createShaft(undefined as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });

  it('rejects bad readings', () => {
    const s = createShaft({ diameterMeters: 0.02, ...steel });
    expect(() => s.torqueFromStrain(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'strain45' });
    expect(() => s.torqueFromStrain(1)).toThrowBridgeworkError('out-of-range', { param: 'strain45' });
    expect(() => s.torqueFromGaugePair(1e-4, Infinity)).toThrowBridgeworkError('not-finite', {
      param: 'strainMinus45',
    });
    expect(() => s.torqueFromGaugePair('x' as never, 0)).toThrowBridgeworkError('wrong-type', {
      param: 'strainPlus45',
    });
    expect(() => s.strainFromTorque(-Infinity)).toThrowBridgeworkError('not-finite', {
      param: 'torqueNewtonMeters',
    });
  });
});
