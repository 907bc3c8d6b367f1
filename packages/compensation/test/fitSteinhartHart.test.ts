import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createSteinhartHartThermistor, fitSteinhartHart } from '@bridgework/compensation';
import { D, X, type Dec } from './support/decimal.js';

/** 3×3 solve of yᵢ = a + b·uᵢ + c·uᵢ³ by Cramer's rule in 40-digit arithmetic (a different method). */
function referenceFit(points: readonly { ohms: number; temperatureCelsius: number }[]): [Dec, Dec, Dec] {
  const u = points.map((p) => X(p.ohms).ln());
  const y = points.map((p) => new D(1).div(X(p.temperatureCelsius).plus('273.15')));
  const det3 = (m: Dec[][]) =>
    m[0]![0]!
      .times(m[1]![1]!.times(m[2]![2]!).minus(m[1]![2]!.times(m[2]![1]!)))
      .minus(m[0]![1]!.times(m[1]![0]!.times(m[2]![2]!).minus(m[1]![2]!.times(m[2]![0]!))))
      .plus(m[0]![2]!.times(m[1]![0]!.times(m[2]![1]!).minus(m[1]![1]!.times(m[2]![0]!))));
  const rows = u.map((ui) => [new D(1), ui, ui.pow(3)]);
  const det = det3(rows);
  return [0, 1, 2].map((col) =>
    det3(rows.map((r, i) => r.map((v, j) => (j === col ? y[i]! : v)))).div(det),
  ) as [Dec, Dec, Dec];
}

const datasheet = [
  { ohms: 32650, temperatureCelsius: 0 },
  { ohms: 10000, temperatureCelsius: 25 },
  { ohms: 1752, temperatureCelsius: 70 },
];

describe('fitSteinhartHart', () => {
  it('passes through its three points to 1e-9 K and equals a 40-digit Cramer solve', () => {
    const k = fitSteinhartHart({ points: datasheet });
    const [a, b, c] = referenceFit(datasheet);
    // Tolerances from the data's conditioning: rounding ln R and 1/T (u = 1.1e-16 each) moves
    // c by up to about u·|y|/|Δ²y| ≈ 1e-12 relative here, a and b by far less (measured:
    // 2e-15 for a and b, 2e-14 for c).
    expect(k.a).toBeNear(a.toNumber(), { rel: 1e-13 });
    expect(k.b).toBeNear(b.toNumber(), { rel: 1e-13 });
    expect(k.c).toBeNear(c.toNumber(), { rel: 1e-11 });
    const m = createSteinhartHartThermistor(k);
    for (const p of datasheet) {
      expect(m.temperatureAt(p.ohms)).toBeNear(p.temperatureCelsius, { abs: 1e-9 });
      expect(m.ohmsAt(p.temperatureCelsius)).toBeNear(p.ohms, { rel: 1e-11 });
    }
  });

  it('recovers the coefficients from three points of a known curve, in any point order (round trip)', () => {
    const curves = fc.record({
      a: fc.double({ min: 0.8e-3, max: 1.5e-3, noNaN: true }),
      b: fc.double({ min: 2.0e-4, max: 3.0e-4, noNaN: true }),
      c: fc.double({ min: 5e-8, max: 2e-7, noNaN: true }),
    });
    fc.assert(
      fc.property(
        curves,
        fc.double({ min: -40, max: 0, noNaN: true }),
        fc.double({ min: 20, max: 50, noNaN: true }),
        fc.double({ min: 80, max: 150, noNaN: true }),
        fc.constantFrom([0, 1, 2], [2, 0, 1], [1, 2, 0]),
        (k, t1, t2, t3, order) => {
          const truth = createSteinhartHartThermistor(k);
          const pts = [t1, t2, t3].map((t) => ({ ohms: truth.ohmsAt(t), temperatureCelsius: t }));
          const fit = fitSteinhartHart({ points: order.map((i) => pts[i]!) });
          const m = createSteinhartHartThermistor(fit);
          // The fitted curve reproduces the true one across the fitted span to 1e-9 K.
          for (const t of [t1, (t1 + t2) / 2, t2, (t2 + t3) / 2, t3]) {
            expect(m.temperatureAt(truth.ohmsAt(t))).toBeNear(t, { abs: 1e-9 });
          }
          // c is the ill-determined one (a second divided difference): 1e-6 relative.
          expect(fit.c).toBeNear(k.c, { rel: 1e-6 });
          expect(fit.b).toBeNear(k.b, { rel: 1e-8 });
        },
      ),
      { numRuns: 500 },
    );
  });

  it('gives c ≈ 0 for points of a beta-model thermistor, which createSteinhartHartThermistor accepts', () => {
    const beta = 3950;
    const r = (t: number) => 1e4 * Math.exp(beta * (1 / (t + 273.15) - 1 / 298.15));
    const pts = [-10, 25, 90].map((t) => ({ ohms: r(t), temperatureCelsius: t }));
    const fit = fitSteinhartHart({ points: pts });
    expect(fit.b).toBeNear(1 / beta, { rel: 1e-10 });
    expect(Math.abs(fit.c)).toBeLessThan(1e-15);
    const m = createSteinhartHartThermistor(fit);
    for (const p of pts) expect(m.temperatureAt(p.ohms)).toBeNear(p.temperatureCelsius, { abs: 1e-9 });
  });

  it.each([
    ['two points', { points: datasheet.slice(0, 2) }, 'too-few-points', 'points'],
    [
      'four points',
      { points: [...datasheet, { ohms: 500, temperatureCelsius: 110 }] },
      'invalid-shape',
      'points',
    ],
    [
      'a repeated resistance',
      { points: [datasheet[0], datasheet[1], { ohms: 10000, temperatureCelsius: 30 }] },
      'singular',
      'points',
    ],
    [
      'a PTC',
      {
        points: [
          { ohms: 100, temperatureCelsius: 0 },
          { ohms: 120, temperatureCelsius: 50 },
          { ohms: 140, temperatureCelsius: 100 },
        ],
      },
      'no-solution',
      'points',
    ],
    [
      'ln R summing to zero',
      {
        points: [
          { ohms: 0.5, temperatureCelsius: 50 },
          { ohms: 1, temperatureCelsius: 25 },
          { ohms: 2, temperatureCelsius: 0 },
        ],
      },
      'singular',
      'points',
    ],
    [
      'a negative resistance',
      { points: [{ ohms: -1, temperatureCelsius: 0 }, datasheet[1], datasheet[2]] },
      'not-positive',
      'points[0].ohms',
    ],
    [
      'a NaN temperature',
      { points: [datasheet[0], { ohms: 1e4, temperatureCelsius: Number.NaN }, datasheet[2]] },
      'not-finite',
      'points[1].temperatureCelsius',
    ],
    ['not an array', { points: 'three' }, 'wrong-type', 'points'],
    ['no points', {}, 'missing-option', 'options.points'],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => fitSteinhartHart(options as never)).toThrowBridgeworkError(code, { param });
  });
});
