import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  fillArcsine,
  fillNormal,
  fillRectangular,
  fillStudentT,
  fillTriangular,
  uniformOpen,
  uniformSymmetric,
} from '../src/internal/samplers.js';
import { stateFromSeed } from '../src/internal/xoshiro128.js';
import { ZIGGURAT_R } from '../src/internal/ziggurat.js';
import { chiSquareEquiprobable, ksCritical, ksStatistic, moments } from './support/statistics.js';

// Independent CDFs: mathjs's erf (W. J. Cody's rational approximations) for the normal; closed
// forms for the others.
const math = create(all as NonNullable<typeof all>, {});
const normalCdf = (x: number): number => 0.5 * (1 + (math.erf(x / Math.SQRT2) as number));

const N = 1 << 20; // normal variates: the most used, tested hardest
const NS = 1 << 18; // the other distributions
// With a fixed seed these tests are deterministic; each threshold is the value a correct generator
// exceeds with probability 1e-6, so a failure means a wrong distribution, not bad luck.
const ALPHA = 1e-6;
/** 5 standard errors, for moment checks: √(Var/n) of the statistic. */
const five = (variance: number, n = N): number => 5 * Math.sqrt(variance / n);

function draw(fill: (s: Int32Array, out: Float64Array) => void, seed = 2024, n = N): Float64Array {
  const out = new Float64Array(n);
  fill(stateFromSeed(seed), out);
  return out;
}

describe('normal variates (256-layer ziggurat)', () => {
  const z = draw((s, out) => fillNormal(s, out, 0, N, 0, 1));

  it('follow N(0, 1): Kolmogorov–Smirnov and χ² over 200 equiprobable bins', () => {
    expect(ksStatistic(z, normalCdf)).toBeLessThan(ksCritical(N, ALPHA));
    const { statistic, critical } = chiSquareEquiprobable(z, normalCdf, 200);
    expect(statistic).toBeLessThan(critical);
  });

  it('have the moments of N(0, 1) within 5 standard errors', () => {
    const m = moments(z);
    expect(m.mean).toBeNear(0, { abs: five(1) });
    expect(m.variance).toBeNear(1, { abs: five(2) }); // Var(s²) = 2σ⁴/N
    expect(m.skewness).toBeNear(0, { abs: five(6) }); // Var ≈ 6/N
    expect(m.excessKurtosis).toBeNear(0, { abs: five(24) }); // Var ≈ 24/N
  });

  it('reach the tail beyond R = 3.654 as often as N(0, 1) does', () => {
    // P(|Z| > R) = erfc(R/√2) = 2.580e-4; the count is binomial.
    let beyond = 0;
    for (const v of z) if (Math.abs(v) > ZIGGURAT_R) beyond++;
    const p = 1 - (math.erf(ZIGGURAT_R / Math.SQRT2) as number);
    expect(beyond).toBeNear(N * p, { abs: 5 * Math.sqrt(N * p) });
  });

  it('scale exactly: mean + scale·z is the same arithmetic on the same draws', () => {
    const scaled = draw((s, out) => fillNormal(s, out, 0, N, 10, 0.25));
    for (let i = 0; i < 4096; i++) expect(scaled[i]).toBe(10 + 0.25 * (z[i] as number));
  });
});

describe('uniform variates', () => {
  it('carry 53 random bits: U = (m + ½)·2⁻⁵³ lies in (0, 1); W = 2U − 1 style values are symmetric', () => {
    const s = stateFromSeed(7);
    for (let i = 0; i < 2000; i++) {
      const u = uniformOpen(s);
      expect(u > 0 && u < 1).toBe(true);
      expect(Number.isInteger(u * 2 ** 53 - 0.5)).toBe(true);
      const w = uniformSymmetric(s);
      expect(w > -1 && w < 1).toBe(true);
      expect(Number.isInteger(w * 2 ** 52 - 0.5)).toBe(true);
    }
  });

  it('rectangular variates follow U(−a, a) (KS) with variance a²/3', () => {
    const r = draw((s, out) => fillRectangular(s, out, 0, NS, 0, 1), 2024, NS);
    expect(ksStatistic(r, (x) => (x + 1) / 2)).toBeLessThan(ksCritical(NS, ALPHA));
    const m = moments(r);
    expect(m.mean).toBeNear(0, { abs: five(1 / 3, NS) });
    expect(m.variance).toBeNear(1 / 3, { abs: five(4 / 45, NS) }); // Var(s²) = (μ₄ − σ⁴)/n = (1/5 − 1/9)/n
    expect(Math.min(...r.subarray(0, 1000))).toBeGreaterThan(-1);
  });
});

describe('triangular, arcsine and Student-t variates', () => {
  it('triangular variates follow the symmetric triangular law on (−1, 1), variance 1/6', () => {
    const t = draw((s, out) => fillTriangular(s, out, 0, NS, 0, 1), 2024, NS);
    const cdf = (x: number): number => (x < 0 ? (1 + x) ** 2 / 2 : 1 - (1 - x) ** 2 / 2);
    expect(ksStatistic(t, cdf)).toBeLessThan(ksCritical(NS, ALPHA));
    expect(moments(t).variance).toBeNear(1 / 6, { abs: five(1 / 15 - 1 / 36, NS) }); // μ₄ = 1/15
  });

  it('arcsine variates follow F(x) = ½ + arcsin(x)/π on (−1, 1), variance 1/2', () => {
    const a = draw((s, out) => fillArcsine(s, out, 0, NS, 0, 1), 2024, NS);
    expect(ksStatistic(a, (x) => 0.5 + Math.asin(x) / Math.PI)).toBeLessThan(ksCritical(NS, ALPHA));
    expect(moments(a).variance).toBeNear(1 / 2, { abs: five(3 / 8 - 1 / 4, NS) }); // μ₄ = 3/8
    for (const v of a.subarray(0, 1000)) expect(Math.abs(v)).toBeLessThanOrEqual(1);
  });

  it('Student-t variates follow the t CDF: ν = 1 (Cauchy), ν = 3, ν = ∞ (normal)', () => {
    // Closed forms: ν = 1: ½ + atan(t)/π; ν = 3: ½ + (1/π)[t/(√3(1 + t²/3)) + atan(t/√3)]
    // (Abramowitz & Stegun 26.7.3 with ν = 1, 3).
    const cauchy = draw((s, out) => fillStudentT(s, out, 0, NS, 0, 1, 1), 2024, NS);
    expect(ksStatistic(cauchy, (t) => 0.5 + Math.atan(t) / Math.PI)).toBeLessThan(ksCritical(NS, ALPHA));
    const t3 = draw((s, out) => fillStudentT(s, out, 0, NS, 0, 1, 3), 2024, NS);
    const cdf3 = (t: number): number =>
      0.5 + (t / (Math.sqrt(3) * (1 + (t * t) / 3)) + Math.atan(t / Math.sqrt(3))) / Math.PI;
    expect(ksStatistic(t3, cdf3)).toBeLessThan(ksCritical(NS, ALPHA));
    const tInf = draw((s, out) => fillStudentT(s, out, 0, NS, 0, 1, Infinity), 2024, NS);
    expect(ksStatistic(tInf, normalCdf)).toBeLessThan(ksCritical(NS, ALPHA));
  });

  it('Student-t variates with large ν are normal to within sampling error, with no cancellation', () => {
    // Var(t_ν) = ν/(ν − 2); for ν = 10⁶ that is 1 + 2e-6, invisible at this sample size.
    const t = draw((s, out) => fillStudentT(s, out, 0, NS, 0, 1, 1e6), 2024, NS);
    expect(ksStatistic(t, normalCdf)).toBeLessThan(ksCritical(NS, ALPHA));
    expect(moments(t).variance).toBeNear(1, { abs: five(2, NS) });
  });
});

describe('reproducibility', () => {
  it('the same state gives the same draws; different seeds give different draws', () => {
    const a = draw((s, out) => fillNormal(s, out, 0, 1000, 0, 1), 99);
    const b = draw((s, out) => fillNormal(s, out, 0, 1000, 0, 1), 99);
    const c = draw((s, out) => fillNormal(s, out, 0, 1000, 0, 1), 100);
    expect(Array.from(a.subarray(0, 1000))).toEqual(Array.from(b.subarray(0, 1000)));
    expect(a[0]).not.toBe(c[0]);
  });

  it('fills in two passes: a fill of a different length is a different (equally valid) draw', () => {
    // The fast path fills positions in order; the 0.4 % that need the slow path are completed
    // after the pass. So the engine always fills whole chunks (see monteCarlo's prefix test).
    const long = draw((s, out) => fillNormal(s, out, 0, 5000, 0, 1), 5);
    const short = draw((s, out) => fillNormal(s, out, 0, 1234, 0, 1), 5);
    let same = 0;
    for (let i = 0; i < 1234; i++) if (short[i] === long[i]) same++;
    expect(same).toBeGreaterThan(1100); // every fast-path value agrees; only completed ones move
    expect(same).toBeLessThan(1234);
  });
});
