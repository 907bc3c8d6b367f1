import fc from 'fast-check';
import { inv } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { createInverseSolver, type InverseModel } from '../src/multicomponent/inverse.js';

/**
 * The per-sample solver on hand-made models (not fitted): the compiled straight-line fixed-point
 * step against the loop it replaces (the same results bit for bit, the same iteration counts), and
 * both against the forward model written here.
 */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface HandModel {
  readonly model: InverseModel;
  readings(f: readonly number[]): Float64Array;
}

/** m components from m bridges; `pairs` the second-order terms; `size` the interactions' share of full-scale output. */
function handModel(m: number, pairs: readonly [number, number][], size: number, seed: number): HandModel {
  const random = mulberry32(seed);
  const fullScale = Array.from({ length: m }, (_, j) => [500, 1000, 20, 15][j % 4]!);
  const offsets = Array.from({ length: m }, () => (random() - 0.5) * 4e-5);
  const s = Array.from({ length: m }, (_, i) =>
    fullScale.map((fs, j) => (1e-3 * (i === j ? 0.9 + 0.2 * random() : 0.03 * (random() - 0.5))) / fs),
  );
  const q = Array.from({ length: m }, () =>
    pairs.map(([a, b]) => (1e-3 * size * 2 * (random() - 0.5)) / (fullScale[a]! * fullScale[b]!)),
  );
  const left = inv(s) as number[][]; // mathjs: S⁻¹, the linear inverse for N = M
  return {
    model: {
      m,
      n: m,
      offsets: Float64Array.from(offsets),
      linear: Float64Array.from(s.flat()),
      termA: Int32Array.from(pairs.map(([a]) => a)),
      termB: Int32Array.from(pairs.map(([, b]) => b)),
      quadratic: Float64Array.from(q.flat()),
      left: Float64Array.from(left.flat()),
      sqrtWeights: new Float64Array(m).fill(1),
      fullScale: Float64Array.from(fullScale),
      tolerance: 2 ** -44,
      maxIterations: 30,
    },
    readings(f) {
      return Float64Array.from(
        offsets.map(
          (a, i) =>
            a +
            s[i]!.reduce((sum, sij, j) => sum + sij * f[j]!, 0) +
            pairs.reduce((sum, [ja, jb], t) => sum + q[i]![t]! * f[ja]! * f[jb]!, 0),
        ),
      );
    },
  };
}

const secondOrder = (m: number): [number, number][] => {
  const pairs: [number, number][] = [];
  for (let j = 0; j < m; j++) pairs.push([j, j]);
  for (let j = 0; j < m; j++) for (let k = j + 1; k < m; k++) pairs.push([j, k]);
  return pairs;
};

describe('the fixed-point step compiled to straight-line code', () => {
  const cases = [
    { name: 'six components, all 21 second-order terms', m: 6, pairs: secondOrder(6), size: 3e-3 },
    {
      name: 'three components, squares and one product',
      m: 3,
      pairs: [
        [0, 0],
        [1, 1],
        [2, 2],
        [0, 2],
      ] as [number, number][],
      size: 5e-3,
    },
    // Interactions of 25 % of full-scale output: near full scale the fixed-point steps contract by
    // less than half, so some samples take the Newton steps (the same in both).
    { name: 'four components, strong interactions', m: 4, pairs: secondOrder(4), size: 0.25 },
  ];
  for (const c of cases) {
    it(`${c.name}: bit for bit the loop's results and iteration counts, and the forward model's loads`, () => {
      const hand = handModel(c.m, c.pairs, c.size, 11 + c.m);
      const compiled = createInverseSolver(hand.model);
      const loop = createInverseSolver({ ...hand.model, compile: false });
      expect(compiled.compiledStep).toBe(true);
      expect(loop.compiledStep).toBe(false);
      const fs = Array.from(hand.model.fullScale);
      const a = new Float64Array(c.m);
      const b = new Float64Array(c.m);
      const counts = new Set<number>();
      fc.assert(
        fc.property(
          fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: c.m, maxLength: c.m }),
          (u) => {
            const f = u.map((x, j) => x * fs[j]!);
            const r = hand.readings(f);
            let ia: number;
            try {
              ia = compiled.solve(r, 0, a, 0);
            } catch (error) {
              // A state the iteration cannot reach fails in both forms alike.
              expect(() => loop.solve(r, 0, b, 0)).toThrowBridgeworkError('not-converged', {
                param: 'readings',
              });
              expect((error as { code?: string }).code).toBe('not-converged');
              return;
            }
            const ib = loop.solve(r, 0, b, 0);
            expect(ia).toBe(ib);
            counts.add(ia);
            for (let j = 0; j < c.m; j++) {
              expect(Object.is(a[j], b[j])).toBe(true);
              // The stated tolerance is 2⁻⁴⁴ of full scale per step; 1e-12 of full scale on the state.
              expect(a[j]!).toBeNear(f[j]!, { abs: 1e-12 * fs[j]! });
            }
          },
        ),
        { numRuns: 400 },
      );
      expect(counts.size).toBeGreaterThan(0);
    });
  }

  it('where the fixed-point steps do not contract by half, Newton steps take over in both forms alike', () => {
    // One component, r = F − 0.5·F² (full scale 1): F = 1 − √(1 − 2r). At r = 0.49 the fixed-point
    // map F ← r + 0.5·F² contracts by ρ = F ≈ 0.86 > 1/2, so the solver changes to Newton steps.
    const model: InverseModel = {
      m: 1,
      n: 1,
      offsets: Float64Array.of(0),
      linear: Float64Array.of(1),
      termA: Int32Array.of(0),
      termB: Int32Array.of(0),
      quadratic: Float64Array.of(-0.5),
      left: Float64Array.of(1),
      sqrtWeights: Float64Array.of(1),
      fullScale: Float64Array.of(1),
      tolerance: 2 ** -44,
      maxIterations: 30,
    };
    const compiled = createInverseSolver(model);
    const loop = createInverseSolver({ ...model, compile: false });
    for (const r of [0.1, 0.3, 0.45, 0.49]) {
      const a = new Float64Array(1);
      const b = new Float64Array(1);
      expect(compiled.solve(Float64Array.of(r), 0, a, 0)).toBe(loop.solve(Float64Array.of(r), 0, b, 0));
      expect(Object.is(a[0], b[0])).toBe(true);
      // Closed form; the stated tolerance 2⁻⁴⁴ ≈ 5.7e-14 of full scale.
      expect(a[0]!).toBeNear(1 - Math.sqrt(1 - 2 * r), { abs: 6e-14 });
    }
  });

  it('a model beyond the compiled size keeps the loop', () => {
    // 12 components with all 78 second-order terms: 936 products, compiled; 13 with 91: 1183, not.
    expect(createInverseSolver(handModel(12, secondOrder(12), 1e-3, 1).model).compiledStep).toBe(true);
    expect(createInverseSolver(handModel(13, secondOrder(13), 1e-3, 1).model).compiledStep).toBe(false);
  });

  it('the linear model has no step to compile', () => {
    expect(createInverseSolver(handModel(6, [], 0, 2).model).compiledStep).toBe(false);
  });
});
