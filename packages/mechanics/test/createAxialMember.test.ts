import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createAxialMember } from '@bridgework/mechanics';
import { dec } from './support/reference.js';

const strain = fc.double({ min: -0.02, max: 0.02, noNaN: true }).map((x) => (Math.abs(x) < 1e-15 ? 0 : x)); // no subnormal strains (products lose their ulps)

describe('createAxialMember', () => {
  it('F = E·A·ε: a 561 mm² steel rod at 730.4 µε carries 84.0 kN (by hand)', () => {
    // E·A = 205e9 · 561e-6 = 115.005 MN; · 730.4e-6 = 83 999.652 N (the bridge demo's hanger).
    const rod = createAxialMember({ modulusPascals: 205e9, areaSquareMeters: 561e-6 });
    expect(rod.axialRigidityNewtons).toBeNear(205e9 * 561e-6, { ulps: 0 });
    expect(rod.forceFromStrain(730.4e-6)).toBeNear(83_999.652, { rel: 1e-12 });
    expect(rod.strainFromForce(84e3)).toBeNear(84e3 / (205e9 * 561e-6), { ulps: 1 });
    expect(rod.forceFromStrain(-730.4e-6)).toBe(-rod.forceFromStrain(730.4e-6)); // compression
    expect(rod.forceFromStrain(0)).toBe(0);
  });

  it('takes the area from a section: a 30 mm round bar, A = π·0.03²/4', () => {
    const bar = createAxialMember({
      modulusPascals: 205e9,
      section: { shape: 'circular', diameterMeters: 0.03 },
    });
    expect(bar.areaSquareMeters).toBeNear((Math.PI * 0.03 ** 2) / 4, { ulps: 1 });
    const tube = createAxialMember({
      modulusPascals: 70e9,
      section: { shape: 'circular', diameterMeters: 0.05, innerDiameterMeters: 0.04 },
    });
    expect(tube.areaSquareMeters).toBeNear((Math.PI * (0.05 ** 2 - 0.04 ** 2)) / 4, { rel: 1e-15 });
    const flat = createAxialMember({
      modulusPascals: 200e9,
      section: { shape: 'rectangular', widthMeters: 0.05, depthMeters: 0.01 },
    });
    expect(flat.areaSquareMeters).toBeNear(5e-4, { ulps: 1 });
  });

  it('is within 1 ulp of the 40-digit product E·A·ε, and strain → force → strain round-trips', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e9, max: 400e9, noNaN: true }),
        fc.double({ min: 1e-8, max: 1, noNaN: true }),
        strain,
        (modulusPascals, areaSquareMeters, e) => {
          const m = createAxialMember({ modulusPascals, areaSquareMeters });
          const rigidity = dec(modulusPascals).times(dec(areaSquareMeters));
          // E·A is rounded once, then the product once: within 2 ulps of the exact product.
          expect(m.forceFromStrain(e)).toBeNear(Number(rigidity.times(dec(e))), { ulps: 2 });
          expect(m.strainFromForce(m.forceFromStrain(e))).toBeNear(e, { ulps: 2 });
        },
      ),
      { numRuns: 500 },
    );
  });

  it('rejects bad input', () => {
    expect(() => createAxialMember({ areaSquareMeters: 1e-4 } as never)).toThrowBridgeworkError(
      'missing-option',
      {
        param: 'options.modulusPascals',
      },
    );
    expect(() => createAxialMember({ modulusPascals: 200e9 })).toThrowBridgeworkError('missing-option', {
      param: 'areaSquareMeters',
    });
    expect(() =>
      createAxialMember({
        modulusPascals: 200e9,
        areaSquareMeters: 1e-4,
        section: { shape: 'circular', diameterMeters: 0.01 },
      }),
    ).toThrowBridgeworkError('conflicting-options', { param: 'areaSquareMeters' });
    expect(() => createAxialMember({ modulusPascals: 200e9, areaSquareMeters: 0 })).toThrowBridgeworkError(
      'not-positive',
      { param: 'areaSquareMeters' },
    );
    expect(() => createAxialMember({ modulusPascals: -1, areaSquareMeters: 1e-4 })).toThrowBridgeworkError(
      'not-positive',
      { param: 'modulusPascals' },
    );
    expect(() =>
      createAxialMember({
        modulusPascals: 200e9,
        section: { shape: 'circular', diameterMeters: Number.NaN },
      }),
    ).toThrowBridgeworkError('not-finite', { param: 'section.diameterMeters' });
    const m = createAxialMember({ modulusPascals: 200e9, areaSquareMeters: 1e-4 });
    expect(() => m.forceFromStrain(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'strain' });
    expect(() => m.forceFromStrain(500)).toThrowBridgeworkError('out-of-range', { param: 'strain' });
    expect(() => m.strainFromForce(Infinity)).toThrowBridgeworkError('not-finite', { param: 'forceNewtons' });
    expect(() => m.strainFromForce('1' as never)).toThrowBridgeworkError('wrong-type', {
      param: 'forceNewtons',
    });
    expect(() => createAxialMember(42 as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });
});
