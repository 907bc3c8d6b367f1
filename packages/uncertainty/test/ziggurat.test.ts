import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ZIGGURAT_LAYERS, ZIGGURAT_R, ZIGGURAT_V, zigguratTables } from '../src/internal/ziggurat.js';

const { x: zigguratX, f: zigguratF, ratio: zigguratRatio } = zigguratTables();

// Fixture: packages/uncertainty/test/fixtures/ziggurat (the ziggurat condition solved at 60 digits
// with decimal.js, independently of src/).
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/ziggurat/reference.json', import.meta.url), 'utf8'),
) as {
  layers: number;
  R: string;
  V: string;
  checkpoints: { i: number; x: string }[];
};

describe('ziggurat tables', () => {
  it('use the R and V that solve the 1024-layer ziggurat condition (60-digit fixture)', () => {
    expect(ZIGGURAT_LAYERS).toBe(reference.layers);
    expect(ZIGGURAT_R).toBe(Number(reference.R)); // the double nearest the root
    expect(ZIGGURAT_V).toBe(Number(reference.V)); // V at that double
  });

  it('build the abscissae x_i as the 60-digit recursion does (1e-12 relative)', () => {
    // The double recursion accumulates rounding over 1022 steps; the fixture's tolerance.
    for (const { i, x } of reference.checkpoints) expect(zigguratX[i]).toBeNear(Number(x), { rel: 1e-12 });
  });

  it('cut the density into layers of equal area V (2e-13 relative; the top closes to 1e-11)', () => {
    // Layer i ≥ 1 is the rectangle [0, x_i] × [f(x_i), f(x_{i+1})]; the base strip is x_0·f(R).
    expect(zigguratX[0]! * zigguratF[1]!).toBeNear(ZIGGURAT_V, { rel: 1e-15 });
    for (let i = 1; i < ZIGGURAT_LAYERS - 1; i++) {
      expect(zigguratX[i]! * (zigguratF[i + 1]! - zigguratF[i]!)).toBeNear(ZIGGURAT_V, { rel: 1e-12 });
    }
    expect(zigguratX[ZIGGURAT_LAYERS - 1]! * (1 - zigguratF[ZIGGURAT_LAYERS - 1]!)).toBeNear(ZIGGURAT_V, {
      rel: 1e-11,
    });
    expect(zigguratX[ZIGGURAT_LAYERS]).toBe(0);
    expect(zigguratF[ZIGGURAT_LAYERS]).toBe(1);
  });

  it('waste 0.19 % of the area, and leave the fast path for 0.43 % of draws', () => {
    // The area under exp(−x²/2) on [0, ∞) is √(π/2); the layers cover 1024·V; their ratio is the
    // probability that a draw is accepted at the first attempt.
    expect(Math.sqrt(Math.PI / 2) / (ZIGGURAT_LAYERS * ZIGGURAT_V)).toBeNear(0.998055, { abs: 1e-6 });
    // The fast path of layer i accepts the fraction x_{i+1}/x_i of its rectangle.
    expect(zigguratRatio.reduce((a, b) => a + b, 0) / ZIGGURAT_LAYERS).toBeNear(0.99572, { abs: 1e-5 });
  });
});
