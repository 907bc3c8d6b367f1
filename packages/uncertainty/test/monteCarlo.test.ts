import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  coverageFactor,
  monteCarlo,
  propagate,
  sampleCoverageIntervals,
  type InputQuantities,
} from '@bridgework/uncertainty';
import { impedance, massCalibration } from './support/jcgmExamples.js';
import { gaussLegendre } from './support/quadrature.js';

const math = create(all as NonNullable<typeof all>, {});
const normalCdf = (x: number): number => 0.5 * (1 + (math.erf(x / Math.SQRT2) as number));
const normalPdf = (x: number): number => Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);

/**
 * The sampling standard deviation of the sample q-quantile of M values from a density f at the
 * quantile: √(q(1 − q)/M)/f (the asymptotic law of order statistics). Tolerances below are 4 of
 * these: a correct implementation exceeds that with probability 6e-5, and the seeds are fixed.
 */
const quantileSd = (q: number, trials: number, density: number): number =>
  Math.sqrt((q * (1 - q)) / trials) / density;

const sumOf4 = ({ a, b, c, d }: Readonly<Record<string, number>>): number => a! + b! + c! + d!;
const four = (q: InputQuantities[string]): InputQuantities => ({ a: q, b: q, c: q, d: q });

describe('monteCarlo: JCGM 101 9.2 (additive models, 10⁶ trials)', () => {
  it('9.2.2 — four N(0, 1) inputs: y = 0, u = 2, interval [−3.92, 3.92], and the GUM is validated', () => {
    // JCGM 101:2008 9.2.2 (from memory): GUF and MCM both give u = 2.00 and [−3.92, 3.92].
    // Exact: Y ~ N(0, 4), ends ±2·1.959964 = ±3.919928. Tolerances: 4 sampling standard deviations
    // (mean 2/√M; u: 2/√(2M); ends quantileSd with f = φ(1.96)/2), plus 0.005 of rounding against
    // the published figures.
    const m = 1e6;
    const r = monteCarlo({ model: sumOf4, inputs: four({ value: 0, standardUncertainty: 1 }) });
    expect(r.trials).toBe(m);
    expect(r.value).toBeNear(0, { abs: 4 * (2 / Math.sqrt(m)) });
    expect(r.standardUncertainty).toBeNear(2, { abs: 4 * (2 / Math.sqrt(2 * m)) });
    const end = 2 * coverageFactor(0.95);
    const sd = quantileSd(0.025, m, normalPdf(1.959964) / 2);
    expect([r.interval.min, r.interval.max]).toBeNear([-end, end], { abs: 4 * sd });
    expect([r.interval.min, r.interval.max]).toBeNear([-3.92, 3.92], { abs: 4 * sd + 0.005 });
    // The shortest interval of a symmetric output is the symmetric one, but its ends are picked
    // from where the width is flat, so they scatter more: twice the tolerance.
    expect([r.shortestInterval.min, r.shortestInterval.max]).toBeNear([-end, end], { abs: 8 * sd });
    expect(r.gum?.standardUncertainty).toBeNear(2, { rel: 1e-12 });
    expect(r.gum?.interval.max).toBeNear(3.92, { abs: 0.005 });
    expect(r.gumValidation?.validated).toBe(true);
    expect(r.gumValidation?.tolerance).toBe(0.05); // u = 2.0 = 20 × 10⁻¹ with ndig = 2
  });

  it('9.2.3 — four rectangular inputs of standard deviation 1: MCM interval [−3.88, 3.88]', () => {
    // JCGM 101 9.2.3 (from memory): MCM [−3.88, 3.88] against the GUF's [−3.92, 3.92].
    // Exact, from the Irwin–Hall distribution: Xᵢ = √3(2Uᵢ − 1), Y = 2√3(S − 2) with S = ΣUᵢ;
    // for 3 ≤ s ≤ 4, P(S > s) = (4 − s)⁴/24, so the 97.5 % point is s = 4 − 0.6^¼ and
    // y = 2√3(2 − 0.6^¼) = 3.87939; the density there is f_S/(2√3) with f_S = (4 − s)³/6.
    const m = 1e6;
    const r = monteCarlo({
      model: sumOf4,
      inputs: four({ value: 0, distribution: 'rectangular', halfWidth: Math.sqrt(3) }),
    });
    const root = 0.6 ** 0.25;
    const end = 2 * Math.sqrt(3) * (2 - root);
    const sd = quantileSd(0.025, m, root ** 3 / 6 / (2 * Math.sqrt(3)));
    expect(end).toBeNear(3.88, { abs: 0.005 });
    expect([r.interval.min, r.interval.max]).toBeNear([-end, end], { abs: 4 * sd });
    expect(r.standardUncertainty).toBeNear(2, { abs: 4 * 2 * Math.sqrt((2.7 - 1) / (4 * m)) }); // kurtosis 3 − 1.2/4
    // The GUM interval ±3.92 against ±3.88: d = 0.04, below δ = 0.05 for ndig = 2 but not δ = 0.005
    // for ndig = 3 (JCGM 101 8.2 with 7.9.2).
    expect(r.gumValidation?.dHigh).toBeNear(3.919928 - end, { abs: 4 * sd });
    expect(r.gumValidation?.validated).toBe(true);
    const strict = monteCarlo({
      model: sumOf4,
      inputs: four({ value: 0, distribution: 'rectangular', halfWidth: Math.sqrt(3) }),
      significantDigits: 3,
    });
    expect(strict.gumValidation?.tolerance).toBe(0.005);
    expect(strict.gumValidation?.validated).toBe(false);
  });
});

describe('monteCarlo: JCGM 101 9.3 (mass calibration, a non-linear model)', () => {
  // Independent reference: δm = X + c·A·B with X ~ N(1.234 mg, 0.05² + 0.02² mg²), c = 100 001.234 mg,
  // A = ρa − ρa0 uniform on ±0.1, B = 1/ρW − 1/ρR (the term (X − E X)·A·B, below 1e-7 mg, is
  // dropped). Var = σ²_X + c²·E[A²]·E[B²] with E[1/ρ] = ln(b/a)/(b − a), E[1/ρ²] = 1/(ab) for ρ
  // uniform on [a, b]; the CDF is E[Φ((y − 1.234 − cAB)/σ_X)] by 3-D Gauss–Legendre quadrature.
  const sigmaX = Math.sqrt(0.05 ** 2 + 0.02 ** 2);
  const c = 100001.234;
  const inverseMoments = (a: number, b: number) => ({ m1: Math.log(b / a) / (b - a), m2: 1 / (a * b) });
  const w = inverseMoments(7000, 9000);
  const rr = inverseMoments(7950, 8050);
  const eB2 = w.m2 - 2 * w.m1 * rr.m1 + rr.m2;
  const exactU = Math.sqrt(sigmaX ** 2 + c * c * (0.01 / 3) * eB2);
  const A = gaussLegendre(24, -0.1, 0.1);
  const W = gaussLegendre(24, 7000, 9000);
  const R = gaussLegendre(8, 7950, 8050);
  function cdf(y: number): number {
    let sum = 0;
    A.x.forEach((a, i) =>
      W.x.forEach((rw, j) =>
        R.x.forEach((rr2, k) => {
          sum += A.w[i]! * W.w[j]! * R.w[k]! * normalCdf((y - 1.234 - c * a * (1 / rw - 1 / rr2)) / sigmaX);
        }),
      ),
    );
    return sum / (0.2 * 2000 * 100);
  }
  function quantile(p: number): number {
    let lo = 1.234 - 6 * exactU;
    let hi = 1.234 + 6 * exactU;
    for (let k = 0; k < 40; k++) {
      const mid = (lo + hi) / 2;
      if (cdf(mid) < p) lo = mid;
      else hi = mid;
    }
    return (lo + hi) / 2;
  }

  it('matches the exact standard uncertainty and the quadrature quantiles; the first-order GUM is not validated', () => {
    // JCGM 101 9.3 (from memory) publishes u = 0.0754 mg for the MCM; the exact value is 0.07548 mg.
    const m = 1e6;
    const r = monteCarlo(massCalibration);
    expect(exactU).toBeNear(0.0754, { abs: 1e-4 });
    expect(r.value).toBeNear(1.234, { abs: 4 * (exactU / Math.sqrt(m)) });
    expect(r.standardUncertainty).toBeNear(exactU, { abs: 4 * exactU * Math.sqrt(2 / (4 * m)) });
    const low = quantile(0.025);
    const high = quantile(0.975);
    const density = (cdf(high + 1e-4) - cdf(high - 1e-4)) / 2e-4;
    const sd = quantileSd(0.025, m, density);
    expect([r.interval.min, r.interval.max]).toBeNear([low, high], { abs: 4 * sd });
    // The first-order GUM misses the ρW and ρR terms (their sensitivities vanish at the estimates):
    // u = 0.0539 mg, and the comparison of clause 8 fails by far at ndig = 2 (δ = 0.0005 mg).
    expect(r.gum?.standardUncertainty).toBeNear(0.0539, { abs: 5e-5 });
    expect(r.gumValidation?.validated).toBe(false);
    expect(r.gumValidation?.dLow).toBeGreaterThan(0.04);
  });
});

describe('monteCarlo: distributions, correlations and reproducibility', () => {
  it('samples a Student-t input: u = s√(ν/(ν − 2)), while the interval equals the GUM’s ±t₉₅(ν)·s', () => {
    // t₅ with scale 1: Var = 5/3 (JCGM 101 6.4.9.4); the 95 % interval is ±t₀.₉₇₅(5) = ±2.5706,
    // exactly what the GUM gives with u = s and ν = 5 — the two methods agree on the interval.
    const m = 2e5;
    const r = monteCarlo({
      model: ({ x }) => x!,
      inputs: { x: { value: 0, distribution: 't', scale: 1, degreesOfFreedom: 5 } },
      trials: m,
    });
    expect(r.standardUncertainty).toBeNear(Math.sqrt(5 / 3), {
      abs: 4 * Math.sqrt(5 / 3) * Math.sqrt((9 - 1) / (4 * m)),
    }); // kurtosis 9
    const t = coverageFactor(0.95, 5);
    const density = (8 / (3 * Math.PI * Math.sqrt(5))) * (1 + (t * t) / 5) ** -3; // t₅ density: Γ(3)/(√(5π)Γ(5/2))
    expect([r.interval.min, r.interval.max]).toBeNear([-t, t], { abs: 4 * quantileSd(0.025, m, density) });
    expect(r.gum?.interval.max).toBeNear(t, { rel: 1e-12 });
    expect(r.gumValidation?.validated).toBe(true);
  });

  it('draws correlated Gaussian inputs: u(a − b) follows eq. (16) and the sample correlation is r', () => {
    const m = 2e5;
    const rho = 0.8;
    const r = monteCarlo({
      model: ({ a, b }) => a! - b!,
      inputs: { a: { value: 1, standardUncertainty: 0.3 }, b: { value: 2, standardUncertainty: 0.4 } },
      correlations: [{ between: ['a', 'b'], coefficient: rho }],
      trials: m,
      returnValues: true,
    });
    const exact = Math.sqrt(0.09 + 0.16 - 2 * rho * 0.12);
    expect(r.standardUncertainty).toBeNear(exact, { abs: 4 * exact * Math.sqrt(2 / (4 * m)) });
    expect(r.gum?.standardUncertainty).toBeNear(exact, { rel: 1e-12 });
    // The sample correlation of the inputs themselves, from a second model on the same seed:
    const sa = monteCarlo({
      model: ({ a }) => a!,
      inputs: { a: { value: 1, standardUncertainty: 0.3 }, b: { value: 2, standardUncertainty: 0.4 } },
      correlations: [{ between: ['a', 'b'], coefficient: rho }],
      trials: m,
      returnValues: true,
      compareWithGum: false,
    });
    const sb = monteCarlo({
      model: ({ b }) => b!,
      inputs: { a: { value: 1, standardUncertainty: 0.3 }, b: { value: 2, standardUncertainty: 0.4 } },
      correlations: [{ between: ['a', 'b'], coefficient: rho }],
      trials: m,
      returnValues: true,
      compareWithGum: false,
    });
    let sab = 0;
    for (let i = 0; i < m; i++) sab += (sa.values![i]! - sa.value) * (sb.values![i]! - sb.value);
    const sampleR = sab / (m - 1) / (sa.standardUncertainty * sb.standardUncertainty);
    expect(sampleR).toBeNear(rho, { abs: (4 * (1 - rho * rho)) / Math.sqrt(m) }); // sd of r ≈ (1 − ρ²)/√M
    expect(r.values![7]).toBeNear(sa.values![7]! - sb.values![7]!, { ulps: 0 });
  });

  it('agrees with the law of propagation for JCGM 100 H.2 (correlated V, I, φ; R to 1 %)', () => {
    const inputs: InputQuantities = {
      V: { value: 4.999, standardUncertainty: 0.0032 },
      I: { value: 19.661e-3, standardUncertainty: 0.0095e-3 },
      phi: { value: 1.04446, standardUncertainty: 0.00075 },
    };
    const correlations = [
      { between: ['V', 'I'] as const, coefficient: -0.36 },
      { between: ['V', 'phi'] as const, coefficient: 0.86 },
      { between: ['I', 'phi'] as const, coefficient: -0.65 },
    ];
    const gum = propagate({ model: (x) => impedance(x)[0]!, inputs, correlations });
    const r = monteCarlo({ model: (x) => impedance(x)[0]!, inputs, correlations, trials: 2e5 });
    expect(r.value).toBeNear(gum.value, { abs: 4 * (gum.standardUncertainty / Math.sqrt(2e5)) + 1e-4 });
    expect(r.standardUncertainty).toBeNear(gum.standardUncertainty, { rel: 0.01 });
  });

  it('gives the same result for the same seed, and a different but consistent one for another seed', () => {
    const options = {
      model: sumOf4,
      inputs: four({ value: 0, distribution: 'triangular', halfWidth: 1 }),
      trials: 50000,
    } as const;
    const a = monteCarlo({ ...options, seed: 11 });
    const b = monteCarlo({ ...options, seed: 11 });
    const c = monteCarlo({ ...options, seed: 12 });
    expect(b).toEqual(a);
    expect(c.value).not.toBe(a.value);
    // u = 2·(1/√6); two independent estimates differ by at most 4·√2 sampling sd.
    const u = 2 / Math.sqrt(6);
    expect(c.standardUncertainty).toBeNear(a.standardUncertainty, {
      abs: 4 * Math.SQRT2 * u * Math.sqrt((3 - 0.6 / 4 - 1) / (4 * 50000)),
    });
    expect(c.value).toBeNear(a.value, { abs: 4 * Math.SQRT2 * (u / Math.sqrt(50000)) });
    expect(a.seed).toBe(11);
    expect(
      monteCarlo({ model: sumOf4, inputs: four({ value: 0, standardUncertainty: 1 }), trials: 1000 }).seed,
    ).toBe(1); // default
  });

  it('makes every run a prefix of a longer run with the same seed, across block boundaries', () => {
    const inputs = {
      x: { value: 0, standardUncertainty: 1 },
      y: { value: 0, distribution: 'arcsine', halfWidth: 1 },
    } as const;
    const model = ({ x, y }: Readonly<Record<string, number>>) => x! * y!;
    const short = monteCarlo({ model, inputs, trials: 20000, returnValues: true, compareWithGum: false });
    const long = monteCarlo({ model, inputs, trials: 50000, returnValues: true, compareWithGum: false });
    expect(Array.from(short.values!)).toEqual(Array.from(long.values!.subarray(0, 20000)));
    // The intervals are those of the returned values (JCGM 101 7.7 from a full sort).
    expect({ interval: short.interval, shortestInterval: short.shortestInterval }).toEqual(
      sampleCoverageIntervals(short.values!, 0.95),
    );
  });
});
