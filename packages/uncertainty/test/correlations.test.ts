import fc from 'fast-check';
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { propagate, type Correlation } from '@bridgework/uncertainty';
import { choleskySemidefinite, normalizeCorrelations } from '../src/correlations.js';

const math = create(all as NonNullable<typeof all>, {});
const names = ['a', 'b', 'c', 'd'];
const inputs = Object.fromEntries(names.map((n) => [n, { value: 1, standardUncertainty: 0.1 }]));

describe('correlation matrices', () => {
  it('are accepted exactly when positive semidefinite (against mathjs eigenvalues)', () => {
    // Random symmetric matrices with unit diagonal. mathjs's eigs is accurate to about 1e-9 on
    // nearly singular matrices, so cases within 1e-6 of the boundary are left to the next test.
    const coefficient = fc.double({ min: -1, max: 1, noNaN: true });
    fc.assert(
      fc.property(fc.array(coefficient, { minLength: 6, maxLength: 6 }), (r) => {
        const m = [
          [1, r[0]!, r[1]!, r[2]!],
          [r[0]!, 1, r[3]!, r[4]!],
          [r[1]!, r[3]!, 1, r[5]!],
          [r[2]!, r[4]!, r[5]!, 1],
        ];
        const values = math.eigs(m).values as unknown as number[];
        const smallest = Math.min(...values);
        if (Math.abs(smallest) < 1e-6) return;
        const factor = choleskySemidefinite(Float64Array.from(m.flat()), 4);
        expect('lower' in factor).toBe(smallest > 0);
      }),
      { numRuns: 400 },
    );
  });

  it('draw the boundary sharply: r₁₂ = r₁₃ = 0.9 needs r₂₃ ≥ 2·0.81 − 1 = 0.62', () => {
    // det = 1 + 2·0.81·r₂₃ − 1.62 − r₂₃² = −(r₂₃ − 0.62)(r₂₃ − 1): zero at 0.62, negative below.
    const m = (r23: number) => Float64Array.from([1, 0.9, 0.9, 0.9, 1, r23, 0.9, r23, 1]);
    expect('lower' in choleskySemidefinite(m(0.62 + 1e-9), 3)).toBe(true);
    expect('lower' in choleskySemidefinite(m(0.62), 3)).toBe(true); // singular: semidefinite
    expect('lower' in choleskySemidefinite(m(0.62 - 1e-9), 3)).toBe(false);
  });

  it('factor as R = L·Lᵀ, also when singular (perfectly correlated inputs)', () => {
    const singular = [1, 1, 0.5, 1, 1, 0.5, 0.5, 0.5, 1];
    const factor = choleskySemidefinite(Float64Array.from(singular), 3);
    if (!('lower' in factor)) throw new Error('singular PSD matrix rejected');
    const l = Array.from(factor.lower);
    const product = math.multiply(
      math.reshape(l, [3, 3]),
      math.transpose(math.reshape(l, [3, 3])),
    ) as unknown as number[][];
    expect(product.flat()).toBeNear(singular, { abs: 1e-15 });
  });

  it('are built symmetric from pairs in any order', () => {
    const { matrix, pairs } = normalizeCorrelations(names, [
      { between: ['c', 'a'], coefficient: 0.5 },
      { between: ['b', 'd'], coefficient: -0.25 },
      { between: ['a', 'b'], coefficient: 0 },
    ]);
    expect(Array.from(matrix)).toEqual([1, 0, 0.5, 0, 0, 1, 0, -0.25, 0.5, 0, 1, 0, 0, -0.25, 0, 1]);
    expect(pairs).toEqual([
      { i: 0, j: 2, entry: 0 },
      { i: 1, j: 3, entry: 1 },
    ]);
  });

  it('reject contradictory coefficients and bad entries with specific errors', () => {
    const run = (correlations: unknown) => () =>
      propagate({
        model: (x) => x['a']! + x['b']! + x['c']!,
        inputs,
        correlations: correlations as Correlation[],
      });
    // r(a,b) = r(b,c) = 0.9 force a and c to be strongly positively correlated: −0.9 is impossible.
    expect(
      run([
        { between: ['a', 'b'], coefficient: 0.9 },
        { between: ['b', 'c'], coefficient: 0.9 },
        { between: ['a', 'c'], coefficient: -0.9 },
      ]),
    ).toThrowBridgeworkError('not-positive-semidefinite', { param: 'correlations' });
    expect(run({})).toThrowBridgeworkError('wrong-type', { param: 'correlations' });
    expect(run([3])).toThrowBridgeworkError('wrong-type', { param: 'correlations[0]' });
    expect(run([{ between: ['a'], coefficient: 0.1 }])).toThrowBridgeworkError('invalid-shape', {
      param: 'correlations[0].between',
    });
    expect(run([{ between: ['a', 'x'], coefficient: 0.1 }])).toThrowBridgeworkError('invalid-option', {
      param: 'correlations[0].between[1]',
    });
    expect(run([{ between: ['a', 'a'], coefficient: 0.1 }])).toThrowBridgeworkError('invalid-option', {
      param: 'correlations[0].between',
    });
    expect(run([{ between: ['a', 'b'], coefficient: 1.5 }])).toThrowBridgeworkError('out-of-range', {
      param: 'correlations[0].coefficient',
    });
    expect(run([{ between: ['a', 'b'], coefficient: NaN }])).toThrowBridgeworkError('not-finite', {
      param: 'correlations[0].coefficient',
    });
    expect(run([{ between: ['a', 'b'] }])).toThrowBridgeworkError('missing-option', {
      param: 'correlations[0].coefficient',
    });
    expect(
      run([
        { between: ['a', 'b'], coefficient: 0.1 },
        { between: ['b', 'a'], coefficient: 0.2 },
      ]),
    ).toThrowBridgeworkError('conflicting-options', { param: 'correlations[1]' });
  });
});
