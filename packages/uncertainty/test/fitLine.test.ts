import fc from 'fast-check';
import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { fitLine, propagate } from '@bridgework/uncertainty';
import { h3 } from './support/jcgmExamples.js';

const math = create(all as NonNullable<typeof all>, { number: 'BigNumber', precision: 40 });

/** Least squares at 40 digits by the normal equations (mathjs BigNumbers): [y₁, y₂] and (XᵀWX)⁻¹. */
function reference(x: number[], y: number[], x0: number, w: number[]) {
  const X = math.bignumber(x.map((v) => [1, v - x0]));
  const W = math.diag(math.bignumber(w));
  const Y = math.bignumber(y.map((v) => [v]));
  const Xt = math.transpose(X);
  const normal = math.multiply(math.multiply(Xt, W), X);
  const inverse = math.inv(normal);
  const beta = math.multiply(
    math.multiply(math.multiply(inverse, Xt), W),
    Y,
  ) as unknown as math.BigNumber[][];
  const num = (v: unknown): number => Number((v as math.BigNumber).toString());
  return {
    beta: [num(beta[0]![0]), num(beta[1]![0])],
    inverse: (inverse as unknown as math.BigNumber[][]).map((r) => r.map(num)),
  };
}

describe('fitLine: JCGM 100 Annex H.3 (thermometer calibration)', () => {
  it('reproduces y₁, y₂, their uncertainties and correlation, and s', () => {
    // JCGM 100 H.3 (from memory): y₁ = −0.1712 °C, u = 0.0029 °C; y₂ = 0.00218, u = 0.00067;
    // r(y₁, y₂) = −0.930; s = 0.0035 °C with ν = n − 2 = 9. Tolerance: half a unit in the last digit.
    const fit = fitLine({ x: h3.t, y: h3.b, x0: h3.t0 });
    expect(fit.intercept).toBeNear(-0.1712, { abs: 5e-5 });
    expect(fit.interceptUncertainty).toBeNear(0.0029, { abs: 5e-5 });
    expect(fit.slope).toBeNear(0.00218, { abs: 5e-6 });
    expect(fit.slopeUncertainty).toBeNear(0.00067, { abs: 5e-6 });
    expect(fit.correlation).toBeNear(-0.93, { abs: 5e-4 });
    expect(fit.residualStandardDeviation).toBeNear(0.0035, { abs: 5e-5 });
    expect(fit.degreesOfFreedom).toBe(9);
  });

  it('predicts the correction at 30 °C through propagate: b = −0.1494 °C, u = 0.0041 °C', () => {
    // JCGM 100 H.3.4 (from memory): b(30 °C) = −0.1494 °C with u = 0.0041 °C. The fitted
    // parameters enter propagate as correlated inputs with ν = 9 (the GUM's expression of H.3).
    const fit = fitLine({ x: h3.t, y: h3.b, x0: h3.t0 });
    const { inputs, correlations } = fit.quantities();
    const at30 = propagate({
      model: ({ intercept, slope }) => intercept! + slope! * (30 - h3.t0),
      inputs,
      correlations,
    });
    expect(at30.value).toBeNear(-0.1494, { abs: 5e-5 });
    expect(at30.standardUncertainty).toBeNear(0.0041, { abs: 5e-5 });
    const direct = fit.predict(30);
    expect(direct.value).toBeNear(at30.value, { rel: 1e-12 });
    expect(direct.standardUncertainty).toBeNear(at30.standardUncertainty, { rel: 1e-9 });
    expect(direct.degreesOfFreedom).toBe(9);
    // Welch–Satterthwaite assumes independent components; for these strongly correlated ones it
    // gives u_c⁴/((c₁u₁)⁴/9 + (c₂u₂)⁴/9) ≈ 1.3, far below the fit's 9. The fit's ν is given explicitly:
    const contributions = [fit.interceptUncertainty, 10 * fit.slopeUncertainty];
    expect(at30.effectiveDegreesOfFreedom).toBeNear(
      at30.standardUncertainty ** 4 / contributions.reduce((a, c) => a + c ** 4 / 9, 0),
      { rel: 1e-9 },
    );
    const stated = propagate({
      model: ({ intercept, slope }) => intercept! + slope! * 10,
      inputs,
      correlations,
      degreesOfFreedom: 9,
    });
    expect(stated.effectiveDegreesOfFreedom).toBe(9);
    expect(stated.coverageFactor).toBeNear(2.26, { abs: 0.005 }); // JCGM 100 Table G.2, ν = 9
  });

  it('agrees with a 40-digit normal-equations solve (mathjs) on the H.3 data and on random data', () => {
    const check = (x: number[], y: number[], x0: number, u?: number[]) => {
      const fit = fitLine({ x, y, x0, ...(u === undefined ? {} : { yStandardUncertainties: u }) });
      const w = u === undefined ? x.map(() => 1) : u.map((v) => 1 / (v * v));
      const ref = reference(x, y, x0, w);
      const scale = u === undefined ? fit.residualStandardDeviation ** 2 : 1;
      // A coefficient near 0 is a difference of terms of the data's size: its rounding is relative
      // to the largest |y| (a random case of |y| ≤ 10 gave an intercept of 6.6e-4 off by 1.1e-14).
      const floor = 1e-13 * Math.max(1, ...y.map(Math.abs));
      expect(fit.intercept).toBeNear(ref.beta[0]!, { rel: 1e-11, abs: floor });
      expect(fit.slope).toBeNear(ref.beta[1]!, { rel: 1e-11, abs: floor });
      expect(fit.interceptUncertainty ** 2).toBeNear(scale * ref.inverse[0]![0]!, { rel: 1e-10 });
      expect(fit.slopeUncertainty ** 2).toBeNear(scale * ref.inverse[1]![1]!, { rel: 1e-10 });
      // The covariance may be near 0 (x₀ near x̄): compared on the scale of u(y₁)·u(y₂). Data that
      // fit a line to within subnormal residuals (variance below 1e−300) have no relative
      // precision left: there both must be 0 within 1e−300.
      expect(fit.covariance).toBeNear(scale * ref.inverse[0]![1]!, {
        abs: Math.max(1e-10 * fit.interceptUncertainty * fit.slopeUncertainty, 1e-300),
      });
    };
    check(h3.t, h3.b, h3.t0);
    // The random case that found the absolute floor too tight (fast-check seed -1242189186).
    const cx = [-9.99993589569601, 0, -9.99999592210744];
    const cy = [0.1143147619548131, 0, 0];
    check(cx, cy, 0);
    check(cx, cy, 0, [0.01, 0.4379536520718626, 0.01]);
    const point = fc.record({
      x: fc.double({ min: -10, max: 10, noNaN: true }),
      y: fc.double({ min: -10, max: 10, noNaN: true }),
      u: fc.double({ min: 0.01, max: 1, noNaN: true }),
    });
    fc.assert(
      fc.property(
        fc.array(point, { minLength: 3, maxLength: 12 }),
        fc.double({ min: -5, max: 5, noNaN: true }),
        (pts, x0) => {
          const x = pts.map((p) => p.x);
          const spread = Math.max(...x) - Math.min(...x);
          if (spread < 0.1) return; // nearly coincident abscissae: ill-conditioned, tested separately
          check(
            x,
            pts.map((p) => p.y),
            x0,
          );
          check(
            x,
            pts.map((p) => p.y),
            x0,
            pts.map((p) => p.u),
          );
        },
      ),
      { numRuns: 40 },
    );
  });

  it('with known uncertainties: weighted, infinite degrees of freedom, and χ² = Σ r²/u²', () => {
    const fit = fitLine({ x: [0, 1, 2, 3], y: [0.1, 0.9, 2.1, 2.9], yStandardUncertainties: 0.1 });
    expect(fit.degreesOfFreedom).toBe(Infinity);
    expect(fit.sumOfSquaredResiduals).toBeNear(
      fit.residuals.reduce((a, r) => a + (r / 0.1) ** 2, 0),
      { rel: 1e-12 },
    );
    // Equal weights: the same line as unweighted; u(y₂)² = u²/Sxx = 0.01/5.
    expect(fit.slope).toBeNear(fitLine({ x: [0, 1, 2, 3], y: [0.1, 0.9, 2.1, 2.9] }).slope, { rel: 1e-14 });
    expect(fit.slopeUncertainty).toBeNear(Math.sqrt(0.01 / 5), { rel: 1e-14 });
    expect(fit.quantities().inputs.slope.degreesOfFreedom).toBeUndefined();
    // Two points with known uncertainties are enough.
    expect(fitLine({ x: [0, 1], y: [0, 2], yStandardUncertainties: [0.1, 0.1] }).slope).toBeNear(2, {
      ulps: 1,
    });
  });

  it('rejects bad data with specific errors', () => {
    expect(() => fitLine({ x: [1, 2, 3], y: [1, 2] })).toThrowBridgeworkError('invalid-shape', {
      param: 'y',
    });
    expect(() => fitLine({ x: [1, 2], y: [1, 2] })).toThrowBridgeworkError('too-few-points', { param: 'x' });
    expect(() => fitLine({ x: [2, 2, 2], y: [1, 2, 3] })).toThrowBridgeworkError('singular', { param: 'x' });
    expect(() => fitLine({ x: [1, 2, NaN], y: [1, 2, 3] })).toThrowBridgeworkError('not-finite', {
      param: 'x[2]',
    });
    expect(() => fitLine({ x: 'abc' as never, y: [1, 2, 3] })).toThrowBridgeworkError('wrong-type', {
      param: 'x',
    });
    expect(() => fitLine({ x: [1, 2, 3], y: [1, 2, 3], yStandardUncertainties: 0 })).toThrowBridgeworkError(
      'not-positive',
      {
        param: 'yStandardUncertainties',
      },
    );
    expect(() =>
      fitLine({ x: [1, 2, 3], y: [1, 2, 3], yStandardUncertainties: [1, 1] }),
    ).toThrowBridgeworkError('invalid-shape', {
      param: 'yStandardUncertainties',
    });
    expect(() =>
      fitLine({ x: [1, 2, 3], y: [1, 2, 3], yStandardUncertainties: [1, -1, 1] }),
    ).toThrowBridgeworkError('not-positive', {
      param: 'yStandardUncertainties[1]',
    });
    expect(() => fitLine({ x: [1, 2, 3], y: [1, 2, 3], x0: Infinity })).toThrowBridgeworkError('not-finite', {
      param: 'x0',
    });
    expect(() => fitLine({ x: [1, 2, 3], y: [1, 2, 3] }).predict(NaN)).toThrowBridgeworkError('not-finite', {
      param: 'x',
    });
  });
});
