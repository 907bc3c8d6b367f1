/**
 * Regression tests for the defects issue 15 found in this package by attacking it (items 5, 7, 8,
 * 9), each named after what it checks. The worker pool's (items 11, 14) are in node.test.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isBridgeworkError } from '@bridgework/core';
import {
  MONTE_CARLO_MAX_TRIALS,
  fitLine,
  monteCarlo,
  numericalTolerance,
  propagate,
  standardUncertaintyOf,
  typeAEvaluation,
  validateGum,
  welchSatterthwaite,
  type InputQuantities,
} from '@bridgework/uncertainty';

const sum = ({ V, I }: Readonly<Record<string, number>>): number => V! + I!;

describe('issue 15 item 7: finite inputs never give non-finite outputs', () => {
  it('propagate with uncertainties of 1e200 gives finite u_c, ν_eff and interval (was Infinity)', () => {
    const r = propagate({
      model: ({ V, I }) => V! / I!,
      inputs: { V: { value: 5, standardUncertainty: 1e200 }, I: { value: 0.02, standardUncertainty: 1e-5 } },
    });
    // c_V = 1/I = 50 exactly in the limit; the I term is negligible: u_c = 50·1e200 (Ridders: 1e-9).
    expect(r.standardUncertainty).toBeNear(5e201, { rel: 1e-9 });
    expect(r.expandedUncertainty).toBeNear(1.959963984540054 * 5e201, { rel: 1e-9 });
    expect(Number.isFinite(r.interval.min) && Number.isFinite(r.interval.max)).toBe(true);
    // Welch–Satterthwaite at both ends of the range: two equal components with ν = 3 and 4 give
    // ν_eff = (2u²)²/(u⁴/3 + u⁴/4) = 48/7 whatever u (u⁴ alone would overflow or underflow).
    for (const u of [1e200, 1e-200]) {
      const w = propagate({
        model: sum,
        inputs: {
          V: { value: 5, standardUncertainty: u, degreesOfFreedom: 3 },
          I: { value: 0.02, standardUncertainty: u, degreesOfFreedom: 4 },
        },
      });
      expect(w.effectiveDegreesOfFreedom).toBeNear(48 / 7, { rel: 1e-9 });
      expect(w.standardUncertainty).toBeNear(Math.SQRT2 * u, { rel: 1e-9 });
    }
    expect(
      welchSatterthwaite({
        components: [
          { contribution: 1e200, degreesOfFreedom: 3 },
          { contribution: 1e200, degreesOfFreedom: 4 },
        ],
      }),
    ).toBeNear(48 / 7, { rel: 1e-15 });
  });

  it('propagate refuses a result past binary64 with a typed error instead of Infinity', () => {
    // u_c = 1e308 is representable; U = 1.96·u_c is not.
    expect(() =>
      propagate({ model: ({ V }) => V!, inputs: { V: { value: 0, standardUncertainty: 1e308 } } }),
    ).toThrowBridgeworkError('out-of-range', { param: 'inputs' });
  });

  it('fitLine gives finite results or a typed error for data anywhere in the binary64 range (was NaN)', () => {
    const magnitude = fc.integer({ min: -307, max: 307 }).map((e) => 10 ** e);
    fc.assert(
      fc.property(
        fc.tuple(magnitude, magnitude),
        fc.array(
          fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true })),
          {
            minLength: 3,
            maxLength: 12,
          },
        ),
        ([sx, sy], points) => {
          let fit;
          try {
            fit = fitLine({ x: points.map((p) => p[0] * sx), y: points.map((p) => p[1] * sy) });
          } catch (e) {
            expect(isBridgeworkError(e)).toBe(true);
            return;
          }
          const figures = [
            fit.intercept,
            fit.slope,
            fit.interceptUncertainty,
            fit.slopeUncertainty,
            fit.covariance,
            fit.correlation,
            fit.sumOfSquaredResiduals,
            fit.residualStandardDeviation,
            ...fit.residuals,
          ];
          expect(figures.every(Number.isFinite)).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('fitLine scales exactly: x·2⁻¹⁰⁰⁰ gives the slope ·2¹⁰⁰⁰ bit for bit, and y·2⁵⁰⁰ every y figure ·2⁵⁰⁰', () => {
    // Scaling by a power of two is exact in binary64, so the fit must commute with it exactly
    // (ulps: 0) — data near 1e-301 and 1e150 included, where the unscaled sums would underflow
    // or overflow.
    const x = [1, 2, 3, 4, 5.5];
    const y = [2.1, 3.9, 6.2, 7.8, 11.3];
    const base = fitLine({ x, y });
    const small = fitLine({ x: x.map((v) => v * 2 ** -1000), y });
    expect(small.slope).toBe(base.slope * 2 ** 1000);
    expect(small.slopeUncertainty).toBe(base.slopeUncertainty * 2 ** 1000);
    expect(small.intercept).toBe(base.intercept);
    const big = fitLine({ x, y: y.map((v) => v * 2 ** 500) });
    expect(big.slope).toBe(base.slope * 2 ** 500);
    expect(big.interceptUncertainty).toBe(base.interceptUncertainty * 2 ** 500);
    expect(big.covariance).toBe(base.covariance * 2 ** 1000); // y units squared
    expect(big.residualStandardDeviation).toBe(base.residualStandardDeviation * 2 ** 500);
    expect(big.correlation).toBe(base.correlation);
    // At 2⁹⁰⁰ the covariance (y units squared) is past binary64: refused, not Infinity.
    expect(() => fitLine({ x, y: y.map((v) => v * 2 ** 900) })).toThrowBridgeworkError('out-of-range', {
      param: 'y',
    });
  });

  it('typeAEvaluation of observations near 1e308 gives the finite mean and u (was Infinity)', () => {
    // Mean of [1e308, 1.7e308, −1e308] = 1.7e308/3; u = s/√3 with s² = Σ(q − q̄)²/2, restated at 2⁻¹⁰²⁴ scale.
    const q = [1e308, 1.7e308, -1e308];
    const r = typeAEvaluation({ a: q }).inputs['a']!;
    const scaled = q.map((v) => v / 2 ** 1000);
    const mean = (scaled[0]! + scaled[1]! + scaled[2]!) / 3;
    const s2 = scaled.reduce((acc, v) => acc + (v - mean) ** 2, 0) / 2;
    expect(r.value).toBeNear(mean * 2 ** 1000, { rel: 1e-15 });
    expect(r.standardUncertainty).toBeNear(Math.sqrt(s2 / 3) * 2 ** 1000, { rel: 1e-15 });
  });

  it('monteCarlo refuses model values beyond ±1e150 and inputs drawn past binary64, instead of NaN or Infinity', () => {
    // u = 1e307: the variance of the values would overflow; before, u(y) came out NaN.
    expect(() =>
      monteCarlo({
        model: ({ a }) => a!,
        inputs: { a: { value: 0, standardUncertainty: 1e307 } },
        trials: 1000,
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'model' });
    // Within the limit u(y) is finite and right: N(0, (1e148)²), u within 4 sampling standard deviations.
    const big = monteCarlo({
      model: ({ a }) => a!,
      inputs: { a: { value: 0, standardUncertainty: 1e148 } },
      trials: 100_000,
    });
    expect(big.standardUncertainty).toBeNear(1e148, { rel: 4 / Math.sqrt(2 * 100_000) });
    // value ± halfWidth past 1.8e308 is refused before drawing.
    expect(() =>
      monteCarlo({
        model: ({ a }) => a! * 1e-200,
        inputs: { a: { value: 1e308, distribution: 'rectangular', halfWidth: 1.7e308 } },
        trials: 1000,
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'inputs.a.halfWidth' });
    // A normal input whose draw overflows is named as the input, not blamed on the model.
    expect(() =>
      monteCarlo({
        model: ({ a }) => (Number.isFinite(a!) ? 0 : a!),
        inputs: { a: { value: 1.7e308, standardUncertainty: 1e307 } },
        trials: 100_000,
        compareWithGum: false,
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'inputs.a' });
  });

  it('standardUncertaintyOf and validateGum refuse figures past binary64 (were Infinity)', () => {
    expect(() =>
      standardUncertaintyOf({ value: 1, expandedUncertainty: 1e308, coverageFactor: 1e-308 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'quantity.coverageFactor' });
    // d_high = |y + U − y_high| = |1e308 + 1e308 − 1.7e308| = 3e307: representable, though y + U is not.
    const v = validateGum({
      gum: { value: 1e308, expandedUncertainty: 1e308 },
      monteCarlo: { standardUncertainty: 1e308, interval: { min: -1.7e308, max: 1.7e308 } },
    });
    expect(v.dHigh).toBeNear(3e307, { rel: 1e-15 });
    expect(v.dLow).toBeNear(1.7e308, { rel: 1e-15 });
  });

  it('numericalTolerance of a u(y) below 1e-250 is ½·10ˡ, not 0', () => {
    // 1.2e-300 to two digits is 12 × 10⁻³⁰¹: δ = 5e-302 (within 4 ulps after the rescaling).
    expect(numericalTolerance(1.2e-300, 2)).toBeNear(5e-302, { ulps: 4 });
    expect(numericalTolerance(3.7e-260, 1)).toBeNear(5e-261, { ulps: 4 });
    expect(numericalTolerance(1e-320, 1)).toBeGreaterThan(0); // subnormal, but not 0
  });
});

describe('issue 15 item 8: unbounded work', () => {
  const inputs: InputQuantities = { a: { value: 1, standardUncertainty: 0.1 } };
  it('monteCarlo({ trials: 1e9 }) is refused at once with the limit derived from memory (was 3 GB and growing)', () => {
    const run = () => monteCarlo({ model: ({ a }) => a!, inputs, trials: 1e9 });
    expect(run).toThrowBridgeworkError('out-of-range', { param: 'trials' });
    expect(run).toThrow(/at most 50000000 trials \(a run holds about 10 bytes per trial, 0\.5 GB/);
    expect(() =>
      monteCarlo({ model: ({ a }) => a!, inputs, adaptive: { maxTrials: MONTE_CARLO_MAX_TRIALS + 1 } }),
    ).toThrowBridgeworkError('out-of-range', { param: 'adaptive.maxTrials' });
    // With the values returned the stated cost per trial is 18 bytes.
    expect(() =>
      monteCarlo({ model: ({ a }) => a!, inputs, trials: MONTE_CARLO_MAX_TRIALS + 1, returnValues: true }),
    ).toThrow(/18 bytes per trial/);
  });

  it('the adaptive procedure needs room for two sequences', () => {
    // p = 0.999: J = 100/(1 − p) = 10⁵ trials, rounded up to 7 blocks of 16 384 = 114 688; two are 229 376.
    expect(() =>
      monteCarlo({ model: ({ a }) => a!, inputs, coverage: 0.999, adaptive: { maxTrials: 200_000 } }),
    ).toThrowBridgeworkError('out-of-range', { param: 'adaptive.maxTrials' });
  });
});

describe('issue 15 item 9: heavy-tailed inputs', () => {
  const model = ({ a, b }: Readonly<Record<string, number>>): number => a! + b!;
  it('a Student-t input with ν ≤ 2 is refused by Monte Carlo (no finite variance; was u = 594)', () => {
    const t = (nu: number): InputQuantities => ({
      a: { value: 1, distribution: 't', scale: 0.1, degreesOfFreedom: nu },
      b: { value: 2, standardUncertainty: 0.1 },
    });
    for (const nu of [1, 2, 0.5]) {
      expect(() => monteCarlo({ model, inputs: t(nu), trials: 1000 })).toThrowBridgeworkError(
        'out-of-range',
        {
          param: 'inputs.a.degreesOfFreedom',
        },
      );
      expect(() => monteCarlo({ model, inputs: t(nu), adaptive: true })).toThrowBridgeworkError(
        'out-of-range',
        {
          param: 'inputs.a.degreesOfFreedom',
        },
      );
    }
    // A normal quantity with finite degrees of freedom is drawn as t too: the same rule.
    expect(() =>
      monteCarlo({
        model,
        inputs: {
          a: { value: 1, standardUncertainty: 0.1, degreesOfFreedom: 2 },
          b: { value: 2, standardUncertainty: 0.1 },
        },
        trials: 1000,
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'inputs.a.degreesOfFreedom' });
    expect(monteCarlo({ model, inputs: t(2.5), trials: 1000 }).trials).toBe(1000);
  });

  it('the law of propagation keeps the GUM’s Type A u = s for any ν (documented), with k from t at ν_eff', () => {
    // One input, ν = 1: u_c = s, ν_eff = 1, k = t₀.₉₇₅(1) = tan(0.475π) = 12.706… (JCGM 100 Table G.2: 12.71).
    const r = propagate({
      model: ({ a }) => a!,
      inputs: { a: { value: 1, distribution: 't', scale: 0.1, degreesOfFreedom: 1 } },
    });
    expect(r.standardUncertainty).toBeNear(0.1, { rel: 1e-12 }); // c = 1 by Ridders' differences
    expect(r.coverageFactor).toBeNear(Math.tan(0.475 * Math.PI), { rel: 1e-12 });
  });
});

describe('issue 15 item 5: every public options object follows checkOptions', () => {
  const inputs: InputQuantities = { a: { value: 1, standardUncertainty: 0.1 } };
  const model = ({ a }: Readonly<Record<string, number>>): number => a!;
  const cases: {
    name: string;
    call: (o: Record<string, unknown>) => unknown;
    valid: Record<string, unknown>;
    required: string[];
  }[] = [
    {
      name: 'monteCarlo',
      call: (o) => monteCarlo(o as never),
      valid: { model, inputs, trials: 100 },
      required: ['model', 'inputs'],
    },
    {
      name: 'propagate',
      call: (o) => propagate(o as never),
      valid: { model, inputs },
      required: ['model', 'inputs'],
    },
    {
      name: 'fitLine',
      call: (o) => fitLine(o as never),
      valid: { x: [1, 2, 3], y: [1, 2, 4] },
      required: ['x', 'y'],
    },
    {
      name: 'welchSatterthwaite',
      call: (o) => welchSatterthwaite(o as never),
      valid: { components: [{ contribution: 1, degreesOfFreedom: 3 }] },
      required: ['components'],
    },
    {
      name: 'validateGum',
      call: (o) => validateGum(o as never),
      valid: {
        gum: { value: 0, expandedUncertainty: 1 },
        monteCarlo: { standardUncertainty: 0.5, interval: { min: -1, max: 1 } },
      },
      required: ['gum', 'monteCarlo'],
    },
  ];
  for (const c of cases) {
    it(`${c.name}: a misspelt key is unknown-option naming the closest key; a missing one missing-option`, () => {
      expect(c.call(c.valid)).toBeDefined();
      for (const key of Object.keys(c.valid)) {
        const { [key]: value, ...rest } = c.valid;
        const misspelt = `${key}z`;
        expect(() => c.call({ ...rest, [misspelt]: value })).toThrowBridgeworkError('unknown-option', {
          param: `options.${misspelt}`,
        });
        expect(() => c.call({ ...rest, [misspelt]: value })).toThrow(new RegExp(`did you mean \`${key}\``));
        if (c.required.includes(key)) {
          expect(() => c.call(rest)).toThrowBridgeworkError('missing-option', { param: `options.${key}` });
        }
      }
    });
  }
  it('nested options objects too: adaptive, correlations entries, components entries', () => {
    expect(() => monteCarlo({ model, inputs, adaptive: { maxTrial: 1e6 } as never })).toThrowBridgeworkError(
      'unknown-option',
      { param: 'adaptive.maxTrial' },
    );
    expect(() =>
      welchSatterthwaite({ components: [{ contribution: 1, degreeOfFreedom: 3 } as never] }),
    ).toThrowBridgeworkError('unknown-option', { param: 'components[0].degreeOfFreedom' });
    expect(() =>
      propagate({
        model,
        inputs: { a: inputs['a']!, b: { value: 2, standardUncertainty: 0.1 } },
        correlations: [{ between: ['a', 'b'], coeficient: 0.5 } as never],
      }),
    ).toThrowBridgeworkError('unknown-option', { param: 'correlations[0].coeficient' });
  });

  it('validateGum checks the keys of gum, monteCarlo and its interval, yet takes whole results', () => {
    const gum = { value: 0, expandedUncertainty: 1 };
    const mc = { standardUncertainty: 0.5, interval: { min: -1, max: 1 } };
    // A misspelt expanded uncertainty used to be read as missing only when required; now it is named.
    expect(() =>
      validateGum({ gum: { value: 0, expandedUncertainity: 1 } as never, monteCarlo: mc }),
    ).toThrowBridgeworkError('unknown-option', { param: 'gum.expandedUncertainity' });
    expect(() =>
      validateGum({ gum: { value: 0, expandedUncertainity: 1 } as never, monteCarlo: mc }),
    ).toThrow('did you mean `expandedUncertainty`?');
    expect(() => validateGum({ gum: { value: 0 } as never, monteCarlo: mc })).toThrowBridgeworkError(
      'missing-option',
      { param: 'gum.expandedUncertainty' },
    );
    expect(() =>
      validateGum({ gum, monteCarlo: { standardUncertainty: 0.5, intervall: mc.interval } as never }),
    ).toThrowBridgeworkError('unknown-option', { param: 'monteCarlo.intervall' });
    expect(() =>
      validateGum({ gum, monteCarlo: { standardUncertainty: 0.5, interval: { min: -1, maxx: 1 } } as never }),
    ).toThrowBridgeworkError('unknown-option', { param: 'monteCarlo.interval.maxx' });
    // Whole results are accepted as they are (their other keys are known).
    const inputs: InputQuantities = {
      V: { value: 5, standardUncertainty: 0.1 },
      I: { value: 2, standardUncertainty: 0.1 },
    };
    const r = monteCarlo({ model: sum, inputs, trials: 200_000, compareWithGum: false, returnValues: true });
    const p = propagate({ model: sum, inputs });
    const v = validateGum({ gum: p, monteCarlo: r });
    // A linear model of normals: the GUM is exact, so clause 8 validates it (JCGM 101 9.2.2 is
    // the same case with four inputs); u(y) ≈ 0.1414 to two digits is 14 × 10⁻², so δ = 5 × 10⁻³.
    expect(v.tolerance).toBeNear(0.005, { rel: 1e-15 });
    expect(v.validated).toBe(true);
  });
});
