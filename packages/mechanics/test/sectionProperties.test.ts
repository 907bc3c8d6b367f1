import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sectionProperties } from '@bridgework/mechanics';
import { D, dec, integrate } from './support/reference.js';

const length = fc.double({ min: -4, max: 0, noNaN: true }).map((e) => 10 ** e); // 0.1 mm … 1 m

/**
 * Second moment of area of a disc of radius R about a diameter, by quadrature of its definition
 * I = ∫ y²·w(y) dy with the chord w(y) = 2√(R² − y²); substituting y = R·sin t makes the integrand
 * 2R⁴·sin²t·cos²t, smooth, so 24-point Gauss–Legendre is exact to rounding.
 */
const discSecondMoment = (r: number): number =>
  integrate((t) => 2 * r ** 4 * Math.sin(t) ** 2 * Math.cos(t) ** 2, -Math.PI / 2, Math.PI / 2);
/** Area of a disc by the same quadrature: A = ∫ w(y) dy = ∫ 2R²cos²t dt. */
const discArea = (r: number): number =>
  integrate((t) => 2 * r * r * Math.cos(t) ** 2, -Math.PI / 2, Math.PI / 2);

describe('sectionProperties: rectangles', () => {
  it('20 mm × 6 mm: A = 120 mm², I = 360 mm⁴, S = 120 mm³ (bh, bh³/12, bh²/6 by hand)', () => {
    const p = sectionProperties({ shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.006 });
    expect(p.areaSquareMeters).toBeNear(120e-6, { rel: 1e-15 });
    expect(p.secondMomentOfAreaMeters4).toBeNear(360e-12, { rel: 1e-15 });
    expect(p.extremeFibreMeters).toBe(0.003);
    expect(p.sectionModulusCubicMeters).toBeNear(120e-9, { rel: 1e-15 });
  });

  it('matches quadrature of ∫y² dA and 40-digit formulas over random sizes', () => {
    fc.assert(
      fc.property(length, length, (b, h) => {
        const p = sectionProperties({ shape: 'rectangular', widthMeters: b, depthMeters: h });
        // ∫_{−h/2}^{h/2} y²·b dy by Gauss–Legendre (exact for a polynomial of degree 2).
        expect(p.secondMomentOfAreaMeters4).toBeNear(
          integrate((y) => y * y * b, -h / 2, h / 2),
          { rel: 1e-14 },
        );
        expect(p.areaSquareMeters).toBeNear(Number(dec(b).times(dec(h))), { ulps: 1 });
        expect(p.sectionModulusCubicMeters).toBeNear(Number(dec(b).times(dec(h)).times(dec(h)).div(6)), {
          rel: 1e-15,
        });
        expect(p.sectionModulusCubicMeters).toBeNear(p.secondMomentOfAreaMeters4 / p.extremeFibreMeters, {
          rel: 1e-15,
        });
      }),
      { numRuns: 300 },
    );
  });
});

describe('sectionProperties: circles and tubes', () => {
  it('a 25 mm round bar: A = πD²/4, I = πD⁴/64, S = πD³/32 (quadrature of the definitions)', () => {
    const p = sectionProperties({ shape: 'circular', diameterMeters: 0.025 });
    expect(p.areaSquareMeters).toBeNear(discArea(0.0125), { rel: 1e-14 });
    expect(p.secondMomentOfAreaMeters4).toBeNear(discSecondMoment(0.0125), { rel: 1e-14 });
    expect(p.sectionModulusCubicMeters).toBeNear((Math.PI * 0.025 ** 3) / 32, { rel: 1e-15 });
    expect(p.extremeFibreMeters).toBe(0.0125);
  });

  it('a tube is the outer disc minus the bore (quadrature), over random diameters', () => {
    fc.assert(
      fc.property(length, fc.double({ min: 0, max: 0.99, noNaN: true }), (outer, fraction) => {
        const inner = outer * fraction;
        const p = sectionProperties({ shape: 'circular', diameterMeters: outer, innerDiameterMeters: inner });
        expect(p.areaSquareMeters).toBeNear(discArea(outer / 2) - discArea(inner / 2), { rel: 1e-13 });
        expect(p.secondMomentOfAreaMeters4).toBeNear(
          discSecondMoment(outer / 2) - discSecondMoment(inner / 2),
          {
            rel: 1e-13,
          },
        );
      }),
      { numRuns: 300 },
    );
  });

  it('keeps full precision for a thin tube (D⁴ − d⁴ factored; 40-digit reference)', () => {
    // 100 mm tube with a 1 µm wall: D⁴ − d⁴ computed directly would cancel five digits.
    const outer = 0.1;
    const inner = 0.1 - 2e-6;
    const p = sectionProperties({ shape: 'circular', diameterMeters: outer, innerDiameterMeters: inner });
    const pi = new D('3.141592653589793238462643383279502884197');
    const d4 = dec(outer).pow(4).minus(dec(inner).pow(4));
    expect(p.secondMomentOfAreaMeters4).toBeNear(Number(pi.times(d4).div(64)), { rel: 4e-16 });
    expect(p.sectionModulusCubicMeters).toBeNear(Number(pi.times(d4).div(dec(outer).times(32))), {
      rel: 4e-16,
    });
    expect(p.areaSquareMeters).toBeNear(Number(pi.times(dec(outer).pow(2).minus(dec(inner).pow(2))).div(4)), {
      rel: 4e-16,
    });
    // Thin-wall limit (common practice): I ≈ π·r³·t with r the mean radius and t the wall.
    expect(p.secondMomentOfAreaMeters4).toBeNear(
      Math.PI * ((outer + inner) / 4) ** 3 * ((outer - inner) / 2),
      {
        rel: 1e-9,
      },
    );
  });

  it('a bore of 0 is a solid bar', () => {
    expect(sectionProperties({ shape: 'circular', diameterMeters: 0.03, innerDiameterMeters: 0 })).toEqual(
      sectionProperties({ shape: 'circular', diameterMeters: 0.03 }),
    );
  });
});

describe('sectionProperties: bad input', () => {
  it('rejects bad shapes and dimensions', () => {
    expect(() => sectionProperties(null as never)).toThrowBridgeworkError('wrong-type', { param: 'section' });
    expect(() => sectionProperties({ shape: 'square' } as never)).toThrowBridgeworkError('invalid-option', {
      param: 'section.shape',
    });
    expect(() =>
      sectionProperties({ shape: 'rectangular', widthMeters: 0, depthMeters: 0.01 }),
    ).toThrowBridgeworkError('not-positive', { param: 'section.widthMeters' });
    expect(() =>
      sectionProperties({ shape: 'rectangular', widthMeters: 0.01, depthMeters: Number.NaN }),
    ).toThrowBridgeworkError('not-finite', { param: 'section.depthMeters' });
    expect(() =>
      sectionProperties({ shape: 'rectangular', widthMeters: 0.01 } as never),
    ).toThrowBridgeworkError('missing-option', { param: 'section.depthMeters' });
    expect(() => sectionProperties({ shape: 'circular', diameterMeters: -0.01 })).toThrowBridgeworkError(
      'not-positive',
      { param: 'section.diameterMeters' },
    );
    expect(() => sectionProperties({ shape: 'circular', diameterMeters: Infinity })).toThrowBridgeworkError(
      'not-finite',
      { param: 'section.diameterMeters' },
    );
    expect(() =>
      sectionProperties({ shape: 'circular', diameterMeters: 0.02, innerDiameterMeters: -0.001 }),
    ).toThrowBridgeworkError('negative', { param: 'section.innerDiameterMeters' });
    for (const innerDiameterMeters of [0.02, 0.03]) {
      expect(() =>
        sectionProperties({ shape: 'circular', diameterMeters: 0.02, innerDiameterMeters }),
      ).toThrowBridgeworkError('out-of-range', { param: 'section.innerDiameterMeters' });
    }
    expect(() =>
      sectionProperties({ shape: 'circular', diameterMeters: 0.02, innerDiameterMeters: '0' as never }),
    ).toThrowBridgeworkError('wrong-type', { param: 'section.innerDiameterMeters' });
  });
});

describe('sectionProperties: rectangular hollow section', () => {
  it('A and I of a box equal the sum of its four walls (parallel-axis theorem, an independent decomposition)', () => {
    // Two flanges b × t at ±(h − t)/2 and two webs t × (h − 2t) on the axis (Steiner; any statics text, from memory).
    const b = 0.08;
    const h = 0.12;
    const t = 0.006;
    const p = sectionProperties({
      shape: 'rectangular',
      widthMeters: b,
      depthMeters: h,
      wallThicknessMeters: t,
    });
    const flange = { a: b * t, i: (b * t ** 3) / 12, d: (h - t) / 2 };
    const web = { a: t * (h - 2 * t), i: (t * (h - 2 * t) ** 3) / 12 };
    const area = 2 * flange.a + 2 * web.a;
    const inertia = 2 * (flange.i + flange.a * flange.d ** 2) + 2 * web.i;
    expect(p.areaSquareMeters).toBeNear(area, { rel: 1e-14 });
    expect(p.secondMomentOfAreaMeters4).toBeNear(inertia, { rel: 1e-14 });
    expect(p.extremeFibreMeters).toBeNear(h / 2, { ulps: 0 });
    expect(p.sectionModulusCubicMeters).toBeNear(inertia / (h / 2), { rel: 1e-14 });
  });

  it('refuses a wall of half the smaller side or more', () => {
    expect(() =>
      sectionProperties({
        shape: 'rectangular',
        widthMeters: 0.02,
        depthMeters: 0.04,
        wallThicknessMeters: 0.01,
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'section.wallThicknessMeters' });
  });
});
