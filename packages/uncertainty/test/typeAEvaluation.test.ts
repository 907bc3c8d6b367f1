import { describe, expect, it } from 'vitest';
import { typeAEvaluation } from '@bridgework/uncertainty';
import { h2Observations } from './support/jcgmExamples.js';

describe('typeAEvaluation (JCGM 100 4.2 and 5.2.3)', () => {
  it('reproduces JCGM 100 Table H.3 from the observations of Table H.2', () => {
    // Table H.3 (from memory): V̄ = 4.9990 V, u = 0.0032 V; Ī = 19.6610 mA, u = 0.0095 mA;
    // φ̄ = 1.04446 rad, u = 0.00075 rad; r(V, I) = −0.36, r(V, φ) = 0.86, r(I, φ) = −0.65.
    // Tolerance: half a unit in the last printed digit.
    const { inputs, correlations } = typeAEvaluation(h2Observations);
    expect(inputs['V']!.value).toBeNear(4.999, { abs: 5e-5 });
    expect(inputs['V']!.standardUncertainty).toBeNear(0.0032, { abs: 5e-5 });
    expect(inputs['I']!.value).toBeNear(19.661e-3, { abs: 5e-8 });
    expect(inputs['I']!.standardUncertainty).toBeNear(0.0095e-3, { abs: 5e-8 });
    expect(inputs['phi']!.value).toBeNear(1.04446, { abs: 5e-6 });
    expect(inputs['phi']!.standardUncertainty).toBeNear(0.00075, { abs: 5e-6 });
    expect(inputs['V']!.degreesOfFreedom).toBe(4);
    expect(correlations.map((c) => c.between)).toEqual([
      ['V', 'I'],
      ['V', 'phi'],
      ['I', 'phi'],
    ]);
    expect(correlations.map((c) => c.coefficient)).toBeNear([-0.36, 0.86, -0.65], { abs: 5e-3 });
  });

  it('computes s(q̄) and r by the textbook formulas (by hand for two short series)', () => {
    // q = 1, 2, 3: mean 2, s² = 1, u = 1/√3. r = 2, 4, 7: mean 13/3; deviations −7/3, −1/3, 8/3;
    // Σ(q − q̄)(r − r̄) = 7/3 + 0 + 8/3 = 5; s(q̄, r̄) = 5/6; s²(r) = (49 + 1 + 64)/9/2 = 19/3.
    // r = (5/6)/(√(1/3)·√(19/9)) = 5·√(3/76) = 0.99340 (JCGM 100 eq. 14 and 17).
    const { inputs, correlations } = typeAEvaluation({ q: [1, 2, 3], r: [2, 4, 7] });
    expect(inputs['q']).toEqual({ value: 2, standardUncertainty: Math.sqrt(1 / 3), degreesOfFreedom: 2 });
    expect(inputs['r']!.standardUncertainty).toBeNear(Math.sqrt(19 / 9), { ulps: 2 });
    expect(correlations[0]!.coefficient).toBeNear(5 * Math.sqrt(3 / 76), { ulps: 4 });
    // A series without scatter gets no correlation entry.
    expect(typeAEvaluation({ q: [1, 2, 3], c: [5, 5, 5] }).correlations).toEqual([]);
  });

  it('rejects bad observations with specific errors', () => {
    expect(() => typeAEvaluation({})).toThrowBridgeworkError('invalid-shape', { param: 'observations' });
    expect(() => typeAEvaluation({ a: [1] })).toThrowBridgeworkError('too-few-points', {
      param: 'observations',
    });
    expect(() => typeAEvaluation({ a: [1, 2], b: [1, 2, 3] })).toThrowBridgeworkError('invalid-shape', {
      param: 'observations.b',
    });
    expect(() => typeAEvaluation({ a: [1, NaN] })).toThrowBridgeworkError('not-finite', {
      param: 'observations.a[1]',
    });
    expect(() => typeAEvaluation({ a: 3 as never })).toThrowBridgeworkError('wrong-type', {
      param: 'observations.a',
    });
    expect(() => typeAEvaluation(null as never)).toThrowBridgeworkError('wrong-type', {
      param: 'observations',
    });
  });
});
