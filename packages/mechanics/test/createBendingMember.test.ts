import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createBendingMember, sectionProperties } from '@bridgework/mechanics';

const strain = fc.double({ min: -0.01, max: 0.01, noNaN: true }).map((x) => (Math.abs(x) < 1e-15 ? 0 : x)); // no subnormal strains (products lose their ulps)

describe('createBendingMember', () => {
  it('cantilever: ε = 6FL/(E·b·h²) — 120 N at 100 mm on a 20 × 6 mm steel bar reads 500 µε', () => {
    // Surface strain of a rectangular cantilever at distance L from the load (beam theory, any
    // strength-of-materials text; worked by hand): 6·120·0.1/(200e9·0.02·0.006²) = 72/144e3.
    const beam = createBendingMember({
      modulusPascals: 200e9,
      section: { shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.006 },
      leverArmMeters: 0.1,
    });
    expect(beam.strainFromForce(120)).toBeNear(500e-6, { rel: 1e-15 });
    expect(beam.forceFromStrain(500e-6)).toBeNear(120, { rel: 1e-15 });
    expect(beam.momentFromStrain(500e-6)).toBeNear(12, { rel: 1e-15 });
    expect(beam.strainFromMoment(12)).toBeNear(500e-6, { rel: 1e-15 });
    expect(beam.leverArmMeters).toBe(0.1);
  });

  it('round bar and tube: σ = 32M/(πD³) and 32MD/(π(D⁴ − d⁴)) at the surface', () => {
    const e = 210e9;
    const bar = createBendingMember({
      modulusPascals: e,
      section: { shape: 'circular', diameterMeters: 0.04 },
    });
    const m = 150; // N·m
    expect(bar.strainFromMoment(m)).toBeNear((32 * m) / (Math.PI * 0.04 ** 3) / e, { rel: 1e-15 });
    const tube = createBendingMember({
      modulusPascals: e,
      section: { shape: 'circular', diameterMeters: 0.04, innerDiameterMeters: 0.03 },
    });
    expect(tube.strainFromMoment(m)).toBeNear((32 * m * 0.04) / (Math.PI * (0.04 ** 4 - 0.03 ** 4)) / e, {
      rel: 1e-14,
    });
  });

  it('accepts the section modulus directly, with the same result as the section', () => {
    const section = { shape: 'rectangular', widthMeters: 0.03, depthMeters: 0.008 } as const;
    const a = createBendingMember({ modulusPascals: 70e9, section, leverArmMeters: 0.25 });
    const b = createBendingMember({
      modulusPascals: 70e9,
      sectionModulusCubicMeters: sectionProperties(section).sectionModulusCubicMeters,
      leverArmMeters: 0.25,
    });
    expect(b.sectionModulusCubicMeters).toBe(a.sectionModulusCubicMeters);
    expect(b.forceFromStrain(-321e-6)).toBe(a.forceFromStrain(-321e-6));
  });

  it('round-trips strain ↔ moment and strain ↔ force (property, ≤ 4 ulps)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e9, max: 400e9, noNaN: true }),
        fc.double({ min: 1e-9, max: 1e-3, noNaN: true }),
        fc.double({ min: 1e-3, max: 10, noNaN: true }),
        strain,
        (modulusPascals, sectionModulusCubicMeters, leverArmMeters, e) => {
          const b = createBendingMember({ modulusPascals, sectionModulusCubicMeters, leverArmMeters });
          expect(b.strainFromMoment(b.momentFromStrain(e))).toBeNear(e, { ulps: 4 });
          expect(b.strainFromForce(b.forceFromStrain(e))).toBeNear(e, { ulps: 4 });
          expect(b.forceFromStrain(e) * leverArmMeters).toBeNear(b.momentFromStrain(e), { ulps: 4 });
        },
      ),
      { numRuns: 500 },
    );
  });

  it('rejects bad input, and the force maps without a lever arm', () => {
    const section = { shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.006 } as const;
    const noArm = createBendingMember({ modulusPascals: 200e9, section });
    expect(noArm.leverArmMeters).toBeUndefined();
    expect(noArm.momentFromStrain(1e-4)).toBeNear(200e9 * 1.2e-7 * 1e-4, { rel: 1e-15 });
    expect(() => noArm.forceFromStrain(1e-4)).toThrowBridgeworkError('missing-option', {
      param: 'leverArmMeters',
    });
    expect(() => noArm.strainFromForce(10)).toThrowBridgeworkError('missing-option', {
      param: 'leverArmMeters',
    });
    expect(() => createBendingMember({ modulusPascals: 200e9 })).toThrowBridgeworkError('missing-option', {
      param: 'sectionModulusCubicMeters',
    });
    expect(() =>
      createBendingMember({ modulusPascals: 200e9, section, sectionModulusCubicMeters: 1e-7 }),
    ).toThrowBridgeworkError('conflicting-options', { param: 'sectionModulusCubicMeters' });
    expect(() =>
      createBendingMember({ modulusPascals: 200e9, section, leverArmMeters: 0 }),
    ).toThrowBridgeworkError('not-positive', { param: 'leverArmMeters' });
    expect(() =>
      createBendingMember({ modulusPascals: 200e9, section, leverArmMeters: Number.NaN }),
    ).toThrowBridgeworkError('not-finite', { param: 'leverArmMeters' });
    expect(() => createBendingMember({ section } as never)).toThrowBridgeworkError('missing-option', {
      param: 'options.modulusPascals',
    });
    expect(() =>
      createBendingMember({ modulusPascals: 200e9, sectionModulusCubicMeters: -1 }),
    ).toThrowBridgeworkError('not-positive', { param: 'sectionModulusCubicMeters' });
    expect(() =>
      createBendingMember({ modulusPascals: 200e9, section: { ...section, depthMeters: 0 } }),
    ).toThrowBridgeworkError('not-positive', { param: 'section.depthMeters' });
    const beam = createBendingMember({ modulusPascals: 200e9, section, leverArmMeters: 0.1 });
    expect(() => beam.momentFromStrain(Infinity)).toThrowBridgeworkError('not-finite', { param: 'strain' });
    expect(() => beam.forceFromStrain(1)).toThrowBridgeworkError('out-of-range', { param: 'strain' });
    expect(() => beam.strainFromMoment(Number.NaN)).toThrowBridgeworkError('not-finite', {
      param: 'momentNewtonMeters',
    });
    expect(() => beam.strainFromForce(null as never)).toThrowBridgeworkError('wrong-type', {
      param: 'forceNewtons',
    });
  });
});
