/**
 * Mohr's circle of `reduce-rosette --html`: the geometry against the strain-transformation
 * equations written here (any mechanics text: ε(θ) = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ and
 * γ(θ)/2 = −(εx − εy)/2·sin 2θ + γxy/2·cos 2θ), for layouts whose leg a is not at 0°, where the
 * page once drew the legs off the circle's right points (it took the row's angle from leg a as the
 * angle from the layout's x axis).
 */
import { describe, expect, it } from 'vitest';
import { mohrCircle, mohrHtml, rowStrainCircle } from '../src/commands/rosette/mohrHtml.js';
import { createRowReducer } from '../src/commands/rosette/rosetteRows.js';

const deg = Math.PI / 180;
/** An invented plane strain state in the layout's frame, m/m. */
const state = { x: 620e-6, y: -180e-6, xy: 410e-6 };
const normalAt = (t: number) =>
  state.x * Math.cos(t) ** 2 + state.y * Math.sin(t) ** 2 + state.xy * Math.sin(t) * Math.cos(t);
const halfShearAt = (t: number) =>
  (-(state.x - state.y) / 2) * Math.sin(2 * t) + (state.xy / 2) * Math.cos(2 * t);

describe("Mohr's circle of a reduced rosette row", () => {
  for (const angles of [
    [0, 45 * deg, 90 * deg],
    [30 * deg, 75 * deg, 150 * deg],
    [-40 * deg, 20 * deg, 80 * deg],
  ] as [number, number, number][]) {
    it(`puts every direction at its transformed strain (legs at ${angles.map((a) => Math.round(a / deg))}°)`, () => {
      const reducer = createRowReducer({
        layout: { anglesRadians: angles },
        transverseSensitivity: undefined,
        poissonRatio0: 0.285,
        material: undefined,
      });
      const row = reducer.reduce([normalAt(angles[0]), normalAt(angles[1]), normalAt(angles[2])]);
      const circle = rowStrainCircle(angles, row);
      // Tolerance: 1e-12 of the largest strain (the reduction's own rounding is far below it).
      const tol = 1e-12 * 1e-3;
      for (const t of [...angles, 0, 90 * deg, 12.5 * deg, -63 * deg]) {
        const p = circle.at(t);
        expect(Math.abs(p.x - normalAt(t))).toBeLessThan(tol);
        expect(Math.abs(p.y - halfShearAt(t))).toBeLessThan(tol);
      }
    });
  }

  it('puts the principal directions on the normal axis, p1 at θ1 and p2 at θ1 + 90°', () => {
    const c = mohrCircle(300, -100, 0.3);
    expect(c.centre).toBe(100);
    expect(c.radius).toBe(200);
    // Tolerance: a few ulps of 300 (one cosine and one sine of a multiple of π/2).
    expect(Math.abs(c.at(0.3).x - 300)).toBeLessThan(1e-12);
    expect(Math.abs(c.at(0.3).y)).toBeLessThan(1e-12);
    expect(Math.abs(c.at(0.3 + Math.PI / 2).x + 100)).toBeLessThan(1e-12);
  });

  it('draws the circle, both diameters and the legs, and the stress circle with its diameters', () => {
    const angles: [number, number, number] = [30 * deg, 75 * deg, 150 * deg];
    const reducer = createRowReducer({
      layout: { anglesRadians: angles },
      transverseSensitivity: undefined,
      poissonRatio0: 0.285,
      material: { modulusPascals: 200e9, poissonRatio: 0.3 },
    });
    const reduced = reducer.reduce([normalAt(angles[0]), normalAt(angles[1]), normalAt(angles[2])]);
    const page = mohrHtml({
      recording: 'own.csv',
      row: 1,
      line: 2,
      why: 'chosen',
      anglesRadians: angles,
      reduced,
      strainUnit: 'µε',
      perStrain: 1e-6,
      stressUnit: 'MPa',
      pascalsPerUnit: 1e6,
      generator: 'bridgework test',
    });
    expect(page).toMatch(/data-plot="mohr-strain"[^>]*data-series-count="6"/);
    expect(page).toMatch(/data-plot="mohr-stress"[^>]*data-series-count="3"/);
    expect(page.match(/class="bw-series" data-series="x–y diameter \(0°, 90°\)"/g)?.length).toBe(2);
  });
});
