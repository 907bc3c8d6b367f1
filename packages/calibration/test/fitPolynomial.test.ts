import { readFileSync, readdirSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitPolynomial } from '@bridgework/calibration';
import { isBridgeworkError } from '@bridgework/core';
import { normalEquationsFit } from './support/normalEquations.js';

describe('fitPolynomial: JCGM 100:2008 (GUM) Annex H.3, calibration of a thermometer', () => {
  // Data and published results of H.3, recalled FROM MEMORY: b = y1 + y2(t − t0), t0 = 20 °C. The
  // fit reproduces every published figure to its printed digits, which is what validates the
  // recalled data (a wrong digit in the data would move y1 or y2 beyond the rounding).
  const t = [21.521, 22.012, 22.512, 23.003, 23.507, 23.999, 24.513, 25.002, 25.503, 26.01, 26.511];
  const b = [-0.171, -0.169, -0.166, -0.159, -0.164, -0.165, -0.156, -0.157, -0.159, -0.161, -0.16];

  it('gives y1 = −0.1712 °C, u(y1) = 0.0029 °C, y2 = 0.00218, u(y2) = 0.00067, r = −0.930', () => {
    const fit = fitPolynomial({ loads: t.map((x) => x - 20), readings: b, degree: 1 });
    const [y1, y2] = fit.coefficients as [number, number];
    const [u1, u2] = fit.standardUncertainties as [number, number];
    // Tolerances: half a unit in the last published digit.
    expect(y1).toBeNear(-0.1712, { abs: 0.00005 });
    expect(u1).toBeNear(0.0029, { abs: 0.00005 });
    expect(y2).toBeNear(0.00218, { abs: 0.000005 });
    expect(u2).toBeNear(0.00067, { abs: 0.000005 });
    expect(fit.correlation[0]![1]).toBeNear(-0.93, { abs: 0.0005 });
    expect(fit.correlation[1]![0]).toBeNear(-0.93, { abs: 0.0005 });
    expect(fit.degreesOfFreedom).toBe(9);
    // H.3 also gives s = 0.0035 °C and the correction at 30 °C, b(30 °C) = −0.1494 °C with
    // u = 0.0041 °C (from memory).
    expect(fit.residualStandardDeviation).toBeNear(0.0035, { abs: 0.00005 });
    expect(fit.readingAt(10)).toBeNear(-0.1494, { abs: 0.00005 });
    expect(fit.readingUncertaintyAt(10)).toBeNear(0.0041, { abs: 0.00005 });
  });

  it('agrees with the 40-digit normal equations to 1e-13 (a different method)', () => {
    const loads = t.map((x) => x - 20);
    const fit = fitPolynomial({ loads, readings: b, degree: 1 });
    const ref = normalEquationsFit(loads, b, 1);
    expect(fit.coefficients).toBeNear(ref.coefficients, { rel: 1e-13 });
    expect(fit.residualStandardDeviation!).toBeNear(ref.residualStandardDeviation, { rel: 1e-12 });
    for (let i = 0; i < 2; i++) expect(fit.covariance[i]!).toBeNear(ref.covariance[i]!, { rel: 1e-12 });
  });
});

describe('fitPolynomial against 40-digit decimal.js normal equations', () => {
  // A load cell read at 11 loads 0…10 kN: a gentle quadratic with deterministic scatter (invented).
  const loads = Array.from({ length: 11 }, (_, i) => i);
  const quadratic = loads.map((x, i) => 2e-5 + 2.003e-4 * x - 1.5e-7 * x * x + 3e-8 * Math.sin(7 * i));

  it('quadratic: coefficients, covariance and s within 1e-12 relative', () => {
    const fit = fitPolynomial({ loads, readings: quadratic, degree: 2 });
    const ref = normalEquationsFit(loads, quadratic, 2);
    // QR in doubles on t ∈ [−1, 1] (condition ~10): ~1e-15 in the scaled basis; the change of basis
    // to x adds a few ulps times the binomial sums. 1e-12 leaves two orders of margin.
    expect(fit.coefficients).toBeNear(ref.coefficients, { rel: 1e-12 });
    // s and the covariance (∝ s²) rest on residuals of 3e-8 computed from readings of 2e-3, each
    // carrying ulp(2e-3) ≈ 4e-19: a relative 1e-11 per residual, so 1e-10 for s² is the honest bound.
    expect(fit.residualStandardDeviation!).toBeNear(ref.residualStandardDeviation, { rel: 1e-10 });
    for (let i = 0; i < 3; i++) expect(fit.covariance[i]!).toBeNear(ref.covariance[i]!, { rel: 1e-10 });
    const residualSum = fit.residuals.reduce((s, r) => s + r, 0);
    // A fit with a constant term has Σ residuals = 0; in doubles about n·ulp(reading) ≈ 11·4e-19.
    expect(residualSum).toBeNear(0, { abs: 2e-17 });
  });

  it('cubic on 25 random data sets, any offset and span of loads', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1000, max: 1000, noNaN: true }),
        fc.double({ min: 0.1, max: 1000, noNaN: true }),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 8, maxLength: 15 }),
        (offset, span, noise) => {
          const x = noise.map((_, i) => offset + (span * i) / (noise.length - 1));
          const y = x.map((xi, i) => {
            const u = (xi - offset) / span;
            return 1 + 2 * u - 0.5 * u * u + 0.25 * u * u * u + 1e-3 * noise[i]!;
          });
          const fit = fitPolynomial({ loads: x, readings: y, degree: 3 });
          // Raw loads up to 1e4 spans from the origin make AᵀA's condition number ~1e24 or more in
          // x: the reference works at 100 digits and evaluates its curve there.
          const ref = normalEquationsFit(x, y, 3, 100);
          // The fitted curves agree to 1e-13 of the reading scale (≈ 3) at every load: the library
          // evaluates in the scaled variable, so the offset costs it nothing.
          for (const xi of x) expect(fit.readingAt(xi)).toBeNear(ref.readingAt(xi), { abs: 1e-13 });
          // s: relative 1e-8, with an absolute floor of 1e-14 (about 30 ulps of the readings) for
          // noise-free draws, where s is itself rounding.
          expect(fit.residualStandardDeviation!).toBeNear(ref.residualStandardDeviation, {
            rel: 1e-8,
            abs: 1e-14,
          });
        },
      ),
      { numRuns: 25 },
    );
  });

  it('recovers an exact polynomial exactly (residuals at rounding level)', () => {
    const x = [0, 1, 2, 3, 4, 5, 6];
    const y = x.map((v) => 1 - 2 * v + 0.5 * v * v - 0.125 * v * v * v);
    const fit = fitPolynomial({ loads: x, readings: y, degree: 3 });
    expect(fit.coefficients).toBeNear([1, -2, 0.5, -0.125], { rel: 1e-13, abs: 1e-13 });
    for (const r of fit.residuals) expect(r).toBeNear(0, { abs: 1e-13 });
    expect(fit.residualStandardDeviation!).toBeNear(0, { abs: 1e-13 });
  });

  it('uses a given reading uncertainty: V = u²(AᵀA)⁻¹, and allows as many points as coefficients', () => {
    const fit = fitPolynomial({
      loads: [0, 1, 2],
      readings: [0, 1, 4],
      degree: 2,
      readingStandardUncertainty: 0.1,
    });
    expect(fit.uncertaintySource).toBe('given');
    expect(fit.residualStandardDeviation).toBeUndefined();
    // Interpolating [0, 1, 2]: c = (0, 0, 1); (AᵀA)⁻¹ = (AᵀA)⁻¹ of the 3×3 Vandermonde V: V⁻¹V⁻ᵀ.
    // V⁻¹ = [[1,0,0],[−1.5,2,−0.5],[0.5,−1,0.5]] (by hand) ⇒ var(c0) = 0.01·1, var(c2) = 0.01·1.5.
    expect(fit.coefficients).toBeNear([0, 0, 1], { abs: 1e-14 });
    expect(fit.covariance[0]![0]).toBeNear(0.01, { rel: 1e-13 });
    expect(fit.covariance[2]![2]).toBeNear(0.01 * (0.25 + 1 + 0.25), { rel: 1e-13 });
    expect(fit.covariance[1]![1]).toBeNear(0.01 * (2.25 + 4 + 0.25), { rel: 1e-13 });
  });
});

describe('fitPolynomial: inverse map', () => {
  it('degree 1 is closed form; degrees 2 and 3 a safeguarded Newton iteration', () => {
    const x = [0, 1, 2, 3, 4];
    expect(fitPolynomial({ loads: x, readings: [0, 1.1, 1.9, 3.2, 3.9], degree: 1 }).inverseMethod).toBe(
      'closed-form',
    );
    expect(fitPolynomial({ loads: x, readings: [0, 1.1, 2.3, 3.2, 4.6], degree: 2 }).inverseMethod).toBe(
      'safeguarded-newton',
    );
  });

  it('round trip load → reading → load over the inverse range, degrees 1–3 (300 random monotone fits)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 3 }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: 1, max: 5000, noNaN: true }),
        fc.double({ min: -0.2, max: 0.2, noNaN: true }),
        fc.double({ min: -0.1, max: 0.1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (degree, offset, span, bow, twist, where) => {
          // Readings 0.002·u(1 + bow·u + twist·u²), u ∈ [0, 1]: the slope 0.002(1 + 2·bow·u + 3·twist·u²)
          // stays above 0.002·0.25 out to u = 1.05 for these bounds, so every fit is monotone there.
          const x = Array.from({ length: 9 }, (_, i) => offset + (span * i) / 8);
          const y = x.map((_, i) => {
            const u = i / 8;
            return 0.002 * u * (1 + bow * u + twist * u * u) + 1e-7 * Math.cos(5 * i);
          });
          const fit = fitPolynomial({ loads: x, readings: y, degree });
          const range = fit.inverseRange!;
          const load = range.min + where * (range.max - range.min);
          // 1e-12 of the span: Newton stops at 4ε of the scaled variable, and a reading's rounding
          // (ulp(0.002) ≈ 4e-19) over the smallest slope (5e-4 per span) is about 1e-15 of the span.
          expect(fit.loadAt(fit.readingAt(load))).toBeNear(load, {
            abs: 1e-12 * span + 1e-12 * Math.abs(offset),
          });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('extends the inverse 5 % of the span beyond the calibrated loads and rejects readings further out', () => {
    const fit = fitPolynomial({
      loads: [0, 250, 500, 750, 1000],
      readings: [0, 0.5, 1.0, 1.5, 2.0],
      degree: 1,
    });
    expect(fit.inverseRange!.min).toBeNear(-50, { abs: 1e-12 });
    expect(fit.inverseRange!.max).toBeNear(1050, { abs: 1e-12 });
    expect(fit.loadAt(2.09)).toBeNear(1045, { rel: 1e-14 });
    expect(() => fit.loadAt(2.11)).toThrowBridgeworkError('out-of-range', { param: 'reading' });
    expect(() => fit.loadAt(-0.11)).toThrowBridgeworkError('out-of-range', { param: 'reading' });
    const strict = fitPolynomial({
      loads: [0, 250, 500, 750, 1000],
      readings: [0, 0.5, 1.0, 1.5, 2.0],
      degree: 1,
      extrapolationFraction: 0,
    });
    expect(() => strict.loadAt(2.0001)).toThrowBridgeworkError('out-of-range', { param: 'reading' });
  });

  it('has no inverse when the fit turns inside the calibrated range, and stops the range at a turning point outside it', () => {
    // y = x(2 − x) on [0, 2] turns at x = 1.
    const x = [0, 0.5, 1, 1.5, 2];
    const turning = fitPolynomial({ loads: x, readings: x.map((v) => v * (2 - v)), degree: 2 });
    expect(turning.inverseRange).toBeUndefined();
    expect(() => turning.loadAt(0.5)).toThrowBridgeworkError('no-solution', { param: 'reading' });
    // y = x(2.08 − x) on [0, 1] turns at 1.04, inside the 5 % extension (to 1.05): the range ends there.
    const u = [0, 0.25, 0.5, 0.75, 1];
    const near = fitPolynomial({ loads: u, readings: u.map((v) => v * (2.08 - v)), degree: 2 });
    expect(near.inverseRange!.max).toBeNear(1.04, { rel: 1e-12 });
    expect(near.inverseRange!.min).toBeNear(-0.05, { rel: 1e-12 });
    // Near the turning point the slope is small (0.02 at 1.03), so the load is less well determined.
    expect(near.loadAt(near.readingAt(1.03))).toBeNear(1.03, { rel: 1e-10 });
  });
});

describe('fitPolynomial: bad input', () => {
  const good = { loads: [0, 1, 2, 3], readings: [0, 1, 2, 3.1], degree: 1 };
  it.each([
    [
      'fewer points than coefficients',
      { loads: [0, 1], readings: [0, 1], degree: 2 },
      'too-few-points',
      'loads',
    ],
    [
      'no degrees of freedom without a reading uncertainty',
      { loads: [0, 1], readings: [0, 1], degree: 1 },
      'too-few-points',
      'loads',
    ],
    ['duplicate x only', { loads: [2, 2, 2, 2], readings: [0, 1, 2, 3], degree: 1 }, 'singular', 'loads'],
    [
      'two distinct x for a quadratic',
      { loads: [1, 1, 2, 2, 2], readings: [0, 1, 2, 3, 4], degree: 2 },
      'singular',
      'loads',
    ],
    ['NaN reading', { ...good, readings: [0, 1, Number.NaN, 3] }, 'not-finite', 'readings[2]'],
    ['Infinity load', { ...good, loads: [0, Infinity, 2, 3] }, 'not-finite', 'loads[1]'],
    ['string reading', { ...good, readings: [0, '1', 2, 3] }, 'wrong-type', 'readings[1]'],
    ['length mismatch', { ...good, readings: [0, 1, 2] }, 'invalid-shape', 'readings'],
    ['loads not an array', { ...good, loads: 5 }, 'invalid-shape', 'loads'],
    ['degree 4', { ...good, degree: 4 }, 'out-of-range', 'degree'],
    ['degree 0', { ...good, degree: 0 }, 'out-of-range', 'degree'],
    ['degree 1.5', { ...good, degree: 1.5 }, 'not-integer', 'degree'],
    ['missing degree', { loads: good.loads, readings: good.readings }, 'missing-option', 'options.degree'],
    ['misspelt option', { ...good, degre: 2 }, 'unknown-option', 'options.degre'],
    ['load beyond 1e100', { ...good, loads: [0, 1, 2, 1e101] }, 'out-of-range', 'loads[3]'],
    [
      'negative reading uncertainty',
      { ...good, readingStandardUncertainty: -1 },
      'not-positive',
      'readingStandardUncertainty',
    ],
    ['extrapolation above 1', { ...good, extrapolationFraction: 2 }, 'out-of-range', 'extrapolationFraction'],
  ] as const)('%s', (_, options, code, param) => {
    expect(() => fitPolynomial(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects a non-finite load or reading in the maps', () => {
    const fit = fitPolynomial(good);
    expect(() => fit.readingAt(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'load' });
    expect(() => fit.readingUncertaintyAt(Infinity)).toThrowBridgeworkError('not-finite', { param: 'load' });
    expect(() => fit.loadAt(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'reading' });
  });
});

describe('no mathjs in the shipped code (issue 18: browser weight)', () => {
  it('no source file imports mathjs and the package does not depend on it', () => {
    const dir = new URL('../src/', import.meta.url);
    const files = readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.ts'));
    expect(files.length).toBeGreaterThan(10);
    for (const file of files) expect(readFileSync(new URL(file, dir), 'utf8'), file).not.toMatch(/mathjs'/);
    const manifest = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as {
      dependencies: Record<string, string>;
    };
    expect(Object.keys(manifest.dependencies)).not.toContain('mathjs');
  });
});

describe('no accepted input yields a non-finite figure (issue 15)', () => {
  const fit = fitPolynomial({ loads: [0, 1, 2, 3, 4], readings: [0.1, 1.1, 2.3, 3.2, 4.6], degree: 3 });

  it('readingUncertaintyAt far beyond the calibrated range: finite, or refused naming the load', () => {
    // 1e160 gave NaN before (Infinity − Infinity in gᵀVg).
    expect(() => fit.readingUncertaintyAt(1e160)).toThrowBridgeworkError('out-of-range', { param: 'load' });
    expect(() => fit.readingAt(1e160)).toThrowBridgeworkError('out-of-range', { param: 'load' });
    // At 1e50 the powers still fit: √(gᵀVg) grows as |x|³ (compare with x = 1e49: ratio 1000).
    const u50 = fit.readingUncertaintyAt(1e50);
    expect(Number.isFinite(u50)).toBe(true);
    expect(u50 / fit.readingUncertaintyAt(1e49)).toBeNear(1000, { rel: 1e-9 });
  });

  it('loads at the magnitude limit and tiny spans: a fit or a typed refusal, never NaN', () => {
    for (const loads of [
      [1e100, -1e100, 0.5e100, -0.5e100, 0],
      [0, 1e-300, 2e-300, 3e-300, 4e-300],
      [1e-320, 2e-320, 3e-320, 4e-320, 5e-320],
    ]) {
      let ok: boolean;
      try {
        const f = fitPolynomial({ loads, readings: [1, 2, 3, 4.5, 5], degree: 3 });
        ok = [...f.coefficients, ...f.covariance.flat(), ...f.correlation.flat()].every(Number.isFinite);
      } catch (error) {
        ok = isBridgeworkError(error, 'out-of-range') && error.param === 'loads';
      }
      expect(ok).toBe(true);
    }
  });
});
