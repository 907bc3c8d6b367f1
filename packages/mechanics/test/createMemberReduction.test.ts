/**
 * createMemberReduction: gauge strains of a member → N, My, Mz, T. Checked against the textbook
 * four-gauge formulas, the package's one-resultant members (createAxialMember,
 * createBendingMember, createShaft), strains written here from the handbook equations, and an
 * independent 40-digit least-squares solve (mathjs normal equations) of noisy redundant readings.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  createAxialMember,
  createBendingMember,
  createMemberReduction,
  createShaft,
  sectionProperties,
  type MemberGauge,
} from '@bridgework/mechanics';
import type { ErrorCode } from '@bridgework/core';
import { leastSquaresReference } from './support/reference.js';

/** Expects a typed error with its code and param, and a message in the user's terms. */
function refuses(f: () => unknown, code: ErrorCode, param: string, message: RegExp) {
  expect(f).toThrowBridgeworkError(code, { param });
  expect(f).toThrow(message);
}

const steel = { modulusPascals: 205e9, poissonRatio: 0.29 };
const tube = { shape: 'circular', diameterMeters: 0.0889, innerDiameterMeters: 0.0763 } as const;
const R = 0.0889 / 2;
const Q = Math.PI / 4;
/** Gauges around a tube: four axial at +z, −z, +y, −y, and a ±45° pair at +y. */
const tubeGauges: MemberGauge[] = [
  { yMeters: 0, zMeters: R },
  { yMeters: 0, zMeters: -R },
  { yMeters: R, zMeters: 0 },
  { yMeters: -R, zMeters: 0 },
  { yMeters: R, zMeters: 0, angleRadians: Q },
  { yMeters: R, zMeters: 0, angleRadians: -Q },
];

/**
 * The strain a gauge reads, written here from the handbook equations (Gere & Goodno; from memory):
 * σx = N/A + My·z/Iy − Mz·y/Iz, εx = σx/E, εs = −ν·εx, γ = τ/G, εθ = εx·cos²θ + εs·sin²θ + γ·sinθ·cosθ.
 */
function handbookStrain(
  g: MemberGauge,
  loads: { n: number; my: number; mz: number; t: number },
  p: { a: number; iy: number; iz: number; shearPerTorque: (y: number, z: number) => number },
  m = steel,
): number {
  const sigma = loads.n / p.a + (loads.my * g.zMeters) / p.iy - (loads.mz * g.yMeters) / p.iz;
  const ex = sigma / m.modulusPascals;
  const es = -m.poissonRatio * ex;
  const gmod = m.modulusPascals / (2 * (1 + m.poissonRatio));
  const gamma = (loads.t * p.shearPerTorque(g.yMeters, g.zMeters)) / gmod;
  const th = g.angleRadians ?? 0;
  return ex * Math.cos(th) ** 2 + es * Math.sin(th) ** 2 + gamma * Math.sin(th) * Math.cos(th);
}

const tubeProps = (() => {
  const s = sectionProperties(tube);
  const j = 2 * s.secondMomentOfAreaMeters4;
  return {
    a: s.areaSquareMeters,
    iy: s.secondMomentOfAreaMeters4,
    iz: s.secondMomentOfAreaMeters4,
    shearPerTorque: (y: number, z: number) => Math.hypot(y, z) / j,
  };
})();

describe('createMemberReduction: textbook formulas', () => {
  it('four axial gauges at 90° on a tube: N = E·A·mean, My = E·Iy·(ε+z − ε−z)/(2c), Mz = −E·Iz·(ε+y − ε−y)/(2c)', () => {
    // Strength-of-materials four-gauge reduction (common practice); c = D/2.
    const r = createMemberReduction({ ...steel, section: tube, gauges: tubeGauges.slice(0, 4) });
    expect(r.resultants).toEqual(['axial', 'bending-y', 'bending-z']);
    expect(r.redundancy).toBe(1);
    const eps = [412e-6, -96e-6, 201e-6, 115e-6];
    // The four readings are consistent only if ε+z + ε−z = ε+y + ε−y; choose them so.
    eps[3] = eps[0]! + eps[1]! - eps[2]!;
    const x = r.reduce(eps);
    const s = sectionProperties(tube);
    const e = steel.modulusPascals;
    expect(x.axialForceNewtons).toBeNear(
      (e * s.areaSquareMeters * (eps[0]! + eps[1]! + eps[2]! + eps[3]!)) / 4,
      {
        rel: 1e-14,
      },
    );
    expect(x.bendingMomentYNewtonMeters).toBeNear(
      (e * s.secondMomentOfAreaMeters4 * (eps[0]! - eps[1]!)) / (2 * R),
      {
        rel: 1e-14,
      },
    );
    expect(x.bendingMomentZNewtonMeters).toBeNear(
      (-e * s.secondMomentOfAreaMeters4 * (eps[2]! - eps[3]!)) / (2 * R),
      {
        rel: 1e-13,
      },
    );
    expect(x.torqueNewtonMeters).toBeUndefined();
    expect(x.maxResidualStrain).toBeNear(0, { abs: 1e-19 });
  });

  it('agrees with createAxialMember, createBendingMember and createShaft for one resultant at a time', () => {
    const r = createMemberReduction({ ...steel, section: tube, gauges: tubeGauges });
    expect(r.resultants).toEqual(['axial', 'bending-y', 'bending-z', 'torsion']);
    const axial = createAxialMember({ modulusPascals: steel.modulusPascals, section: tube });
    const bending = createBendingMember({ modulusPascals: steel.modulusPascals, section: tube });
    const shaft = createShaft({
      diameterMeters: tube.diameterMeters,
      innerDiameterMeters: tube.innerDiameterMeters,
      ...steel,
    });
    // Pure axial: every axial gauge reads ε, the ±45° gauges (1 − ν)/2·ε.
    const ea = 350e-6;
    const pure = r.reduce([
      ea,
      ea,
      ea,
      ea,
      ((1 - steel.poissonRatio) / 2) * ea,
      ((1 - steel.poissonRatio) / 2) * ea,
    ]);
    expect(pure.axialForceNewtons).toBeNear(axial.forceFromStrain(ea), { rel: 1e-14 });
    expect(pure.bendingMomentYNewtonMeters).toBeNear(0, { abs: 1e-9 * axial.forceFromStrain(ea) * R });
    expect(pure.torqueNewtonMeters).toBeNear(0, { abs: 1e-9 * axial.forceFromStrain(ea) * R });
    // Pure bending about y: ±ε at ±z, 0 on the sides.
    const eb = 520e-6;
    const bent = r.reduce([eb, -eb, 0, 0, 0, 0]);
    expect(bent.bendingMomentYNewtonMeters).toBeNear(bending.momentFromStrain(eb), { rel: 1e-14 });
    // Pure torsion: ±ε45 on the pair, the axial gauges 0.
    const e45 = 240e-6;
    const twisted = r.reduce([0, 0, 0, 0, e45, -e45]);
    expect(twisted.torqueNewtonMeters).toBeNear(shaft.torqueFromGaugePair(e45, -e45), { rel: 1e-14 });
    expect(twisted.torqueNewtonMeters).toBeNear(shaft.torqueFromStrain(e45), { rel: 1e-14 });
    expect(twisted.axialForceNewtons).toBeNear(0, { abs: (1e-9 * shaft.torqueFromStrain(e45)) / R });
  });
});

describe('createMemberReduction: against the handbook equations and a 40-digit solve', () => {
  const load = fc.double({ min: -1, max: 1, noNaN: true });
  it('round trip: strains from the handbook equations reduce to the loads (tube, 1000 runs)', () => {
    const r = createMemberReduction({ ...steel, section: tube, gauges: tubeGauges });
    fc.assert(
      fc.property(load, load, load, load, (a, b, c, d) => {
        const loads = { n: a * 4e5, my: b * 2e4, mz: c * 2e4, t: d * 3e4 };
        const eps = tubeGauges.map((g) => handbookStrain(g, loads, tubeProps));
        const x = r.reduce(eps);
        // Scale of each resultant: what full strain (about 1000 µε) means for it.
        expect(x.axialForceNewtons).toBeNear(loads.n, { abs: 1e-11 * 4e5 });
        expect(x.bendingMomentYNewtonMeters).toBeNear(loads.my, { abs: 1e-11 * 2e4 });
        expect(x.bendingMomentZNewtonMeters).toBeNear(loads.mz, { abs: 1e-11 * 2e4 });
        expect(x.torqueNewtonMeters).toBeNear(loads.t, { abs: 1e-11 * 3e4 });
        // The forward map is the same model.
        const back = r.gaugeStrains({
          axialForceNewtons: loads.n,
          bendingMomentYNewtonMeters: loads.my,
          bendingMomentZNewtonMeters: loads.mz,
          torqueNewtonMeters: loads.t,
        });
        back.forEach((e, i) => expect(e).toBeNear(eps[i]!, { abs: 1e-17 })); // strains up to about 5e-3
      }),
      { numRuns: 1000 },
    );
  });

  it('noisy redundant gauges on a rectangular box section: the 40-digit least-squares solution, residuals orthogonal to the columns', () => {
    // A welded box 120 × 80 mm, 6 mm walls, given by its properties; Bredt's torsion modulus
    // Wt = 2·Am·t with Am = (120 − 6)(80 − 6) mm² at the mid-wall (Roark, thin-walled closed sections; from memory).
    const b = 0.08;
    const h = 0.12;
    const t = 0.006;
    const area = b * h - (b - 2 * t) * (h - 2 * t);
    const iy = (b * h ** 3 - (b - 2 * t) * (h - 2 * t) ** 3) / 12;
    const iz = (h * b ** 3 - (h - 2 * t) * (b - 2 * t) ** 3) / 12;
    const wt = 2 * (b - t) * (h - t) * t;
    const gauges: MemberGauge[] = [
      { yMeters: 0, zMeters: h / 2 },
      { yMeters: 0.025, zMeters: h / 2 },
      { yMeters: 0, zMeters: -h / 2 },
      { yMeters: b / 2, zMeters: 0 },
      { yMeters: -b / 2, zMeters: 0.03 },
      { yMeters: -b / 2, zMeters: -0.03 },
      { yMeters: 0, zMeters: h / 2, angleRadians: Math.PI / 2 },
      { yMeters: b / 2, zMeters: 0, angleRadians: Q },
      { yMeters: b / 2, zMeters: 0, angleRadians: -Q },
      { yMeters: -b / 2, zMeters: 0, angleRadians: Q },
    ];
    const r = createMemberReduction({
      ...steel,
      areaSquareMeters: area,
      secondMomentYMeters4: iy,
      secondMomentZMeters4: iz,
      torsionModulusCubicMeters: wt,
      gauges,
    });
    const p = { a: area, iy, iz, shearPerTorque: () => 1 / wt };
    const loads = { n: -1.8e5, my: 2.2e4, mz: -7.5e3, t: 6.1e3 };
    const noise = [3, -2, 1.5, -4, 2.5, 0.5, -1, 2, -3, 1].map((x) => x * 1e-6);
    const eps = gauges.map((g, i) => handbookStrain(g, loads, p) + noise[i]!);
    // Columns of the design matrix written independently: strain per unit of each resultant.
    const rows = gauges.map((g) =>
      [
        { n: 1, my: 0, mz: 0, t: 0 },
        { n: 0, my: 1, mz: 0, t: 0 },
        { n: 0, my: 0, mz: 1, t: 0 },
        { n: 0, my: 0, mz: 0, t: 1 },
      ].map((unit) => handbookStrain(g, unit, p)),
    );
    const ref = leastSquaresReference(rows, eps);
    const x = r.reduce(eps);
    expect(x.axialForceNewtons).toBeNear(ref[0]!, { rel: 1e-12 });
    expect(x.bendingMomentYNewtonMeters).toBeNear(ref[1]!, { rel: 1e-12 });
    expect(x.bendingMomentZNewtonMeters).toBeNear(ref[2]!, { rel: 1e-12 });
    expect(x.torqueNewtonMeters).toBeNear(ref[3]!, { rel: 1e-12 });
    // Least squares: Aᵀ·r = 0 (each column scaled to unit length, the residuals to 1 µε).
    for (let j = 0; j < 4; j++) {
      const col = rows.map((row) => row[j]!);
      const norm = Math.hypot(...col);
      const dot = col.reduce((s, c, i) => s + (c / norm) * x.residualStrains[i]!, 0);
      expect(dot).toBeNear(0, { abs: 1e-17 }); // strains of 1e-3: rounding of ε − fitted is about 1e-19 a gauge
    }
    expect(r.redundancy).toBe(6);
    expect(r.conditionNumber).toBeGreaterThan(1);
    expect(r.conditionNumber).toBeLessThan(10);
  });

  it('a gauge that disagrees stands out in the residuals', () => {
    const gauges = [
      ...tubeGauges,
      { yMeters: -R, zMeters: 0, angleRadians: Q },
      { yMeters: 0, zMeters: R, angleRadians: Q },
    ];
    const r = createMemberReduction({ ...steel, section: tube, gauges });
    const loads = { n: 1.2e5, my: 4e3, mz: -2e3, t: 5e3 };
    const eps = gauges.map((g) => handbookStrain(g, loads, tubeProps));
    eps[2] = eps[2]! + 80e-6; // a gauge with a zero shift of 80 µε
    const x = r.reduce(eps);
    const worst = x.residualStrains.reduce((w, v, i, all) => (Math.abs(v) > Math.abs(all[w]!) ? i : w), 0);
    expect(worst).toBe(2);
    expect(x.maxResidualStrain).toBeGreaterThan(20e-6);
  });

  it("a box section by shape: Iz from its walls, torsion by Bredt's Wt = 2·Am·t unless given", () => {
    const b = 0.08;
    const h = 0.12;
    const t = 0.006;
    const gauges: MemberGauge[] = [
      { yMeters: 0, zMeters: h / 2 },
      { yMeters: 0, zMeters: -h / 2 },
      { yMeters: b / 2, zMeters: 0 },
      { yMeters: -b / 2, zMeters: 0 },
      { yMeters: b / 2, zMeters: 0, angleRadians: Q },
    ];
    const box = createMemberReduction({
      ...steel,
      section: { shape: 'rectangular', widthMeters: b, depthMeters: h, wallThicknessMeters: t },
      gauges,
    });
    // Iz of the box as two webs t × h at ±(b − t)/2 and two flanges (b − 2t) × t on the axis (Steiner).
    const web = { a: t * h, i: (h * t ** 3) / 12, d: (b - t) / 2 };
    const iz = 2 * (web.i + web.a * web.d ** 2) + (2 * (t * (b - 2 * t) ** 3)) / 12;
    const props = sectionProperties({
      shape: 'rectangular',
      widthMeters: b,
      depthMeters: h,
      wallThicknessMeters: t,
    });
    const byProps = createMemberReduction({
      ...steel,
      areaSquareMeters: props.areaSquareMeters,
      secondMomentYMeters4: props.secondMomentOfAreaMeters4,
      secondMomentZMeters4: iz,
      torsionModulusCubicMeters: 2 * (b - t) * (h - t) * t,
      gauges,
    });
    const eps = [310e-6, -95e-6, 160e-6, 55e-6, 140e-6];
    const x = box.reduce(eps);
    const y = byProps.reduce(eps);
    expect(x.axialForceNewtons).toBeNear(y.axialForceNewtons!, { rel: 1e-13 });
    expect(x.bendingMomentYNewtonMeters).toBeNear(y.bendingMomentYNewtonMeters!, { rel: 1e-13 });
    expect(x.bendingMomentZNewtonMeters).toBeNear(y.bendingMomentZNewtonMeters!, { rel: 1e-13 });
    expect(x.torqueNewtonMeters).toBeNear(y.torqueNewtonMeters!, { rel: 1e-13 });
  });

  it('a rectangular section given by shape equals the same section given by its properties', () => {
    const gauges: MemberGauge[] = [
      { yMeters: 0, zMeters: 0.03 },
      { yMeters: 0, zMeters: -0.03 },
      { yMeters: 0.01, zMeters: 0 },
      { yMeters: -0.01, zMeters: 0.01 },
    ];
    const byShape = createMemberReduction({
      ...steel,
      section: { shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.06 },
      gauges,
    });
    const byProps = createMemberReduction({
      ...steel,
      areaSquareMeters: 0.02 * 0.06,
      secondMomentYMeters4: (0.02 * 0.06 ** 3) / 12,
      secondMomentZMeters4: (0.06 * 0.02 ** 3) / 12,
      gauges,
    });
    const eps = [300e-6, -100e-6, 150e-6, 20e-6];
    const a = byShape.reduce(eps);
    const b = byProps.reduce(eps);
    expect(a.axialForceNewtons).toBeNear(b.axialForceNewtons!, { rel: 1e-14 });
    expect(a.bendingMomentYNewtonMeters).toBeNear(b.bendingMomentYNewtonMeters!, { rel: 1e-14 });
    expect(a.bendingMomentZNewtonMeters).toBeNear(b.bendingMomentZNewtonMeters!, { rel: 1e-13 });
  });
});

describe('createMemberReduction: refusals in the user’s terms', () => {
  const rect = { shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.04 } as const;
  it('names the resultants the gauges cannot separate or measure', () => {
    refuses(
      () =>
        createMemberReduction({
          ...steel,
          section: rect,
          gauges: [
            { yMeters: 0, zMeters: 0.02 },
            { yMeters: 0.01, zMeters: 0.02 },
          ],
          resultants: ['axial', 'bending-y'],
        }),
      'singular',
      'gauges',
      /cannot separate axial from bending-y/,
    );
    refuses(
      () =>
        createMemberReduction({
          ...steel,
          section: tube,
          gauges: tubeGauges.slice(0, 4),
          resultants: ['axial', 'bending-y', 'torsion'],
        }),
      'singular',
      'gauges',
      /cannot measure torsion.*±45°/,
    );
    refuses(
      () =>
        createMemberReduction({
          ...steel,
          section: rect,
          gauges: [
            { yMeters: 0, zMeters: 0.02 },
            { yMeters: 0, zMeters: -0.02 },
          ],
        }),
      'invalid-shape',
      'gauges',
      /at least one gauge per resultant \(3/,
    );
  });

  it('refuses torsion on a non-circular section without Wt, a gauge outside the section, µε as m/m', () => {
    expect(() =>
      createMemberReduction({
        ...steel,
        section: rect,
        gauges: [
          ...tubeGauges.slice(0, 4).map((g) => ({ yMeters: g.yMeters / 5, zMeters: g.zMeters / 5 })),
          { yMeters: 0.01, zMeters: 0, angleRadians: Q },
        ],
      }),
    ).toThrowBridgeworkError('missing-option', { param: 'torsionModulusCubicMeters' });
    refuses(
      () =>
        createMemberReduction({
          ...steel,
          section: tube,
          gauges: [{ yMeters: 0, zMeters: 0.05 }],
          resultants: ['axial'],
        }),
      'invalid-option',
      'gauges[0]',
      /outside the section/,
    );
    const r = createMemberReduction({ ...steel, section: tube, gauges: tubeGauges.slice(0, 4) });
    expect(() => r.reduce([300, 1, 2, 3])).toThrowBridgeworkError('out-of-range', { param: 'strains[0]' });
    expect(() => r.reduce([1e-4, 2e-4])).toThrowBridgeworkError('invalid-shape', { param: 'strains' });
    expect(() => r.reduce([Number.NaN, 0, 0, 0])).toThrowBridgeworkError('not-finite', {
      param: 'strains[0]',
    });
    expect(() => r.gaugeStrains({ torqueNewtonMeters: 5 })).toThrowBridgeworkError('invalid-option', {
      param: 'torqueNewtonMeters',
    });
    expect(() =>
      createMemberReduction({ ...steel, section: tube, gauges: tubeGauges, resultant: [] } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'options.resultant' });
    expect(() =>
      createMemberReduction({ ...steel, section: tube, gauges: tubeGauges, resultants: ['axial', 'axial'] }),
    ).toThrowBridgeworkError('invalid-option', { param: 'resultants' });
    expect(() =>
      createMemberReduction({ ...steel, areaSquareMeters: 1e-3, gauges: tubeGauges }),
    ).toThrowBridgeworkError('missing-option', { param: 'secondMomentYMeters4' });
  });
});
