/**
 * Independent statistical yardsticks for the generator tests (plain textbook formulas, none of
 * them taken from src/).
 */

/** The Kolmogorov–Smirnov statistic D = sup |F_n(x) − F(x)| of a sample against a CDF. */
export function ksStatistic(sample: Float64Array, cdf: (x: number) => number): number {
  const s = Float64Array.from(sample).sort();
  const n = s.length;
  let d = 0;
  for (let i = 0; i < n; i++) {
    const f = cdf(s[i] as number);
    d = Math.max(d, f - i / n, (i + 1) / n - f);
  }
  return d;
}

/**
 * The KS critical value for n draws at a false-alarm probability α, from the asymptotic
 * Kolmogorov distribution P(√n·D > t) ≈ 2·exp(−2t²) (Kolmogorov 1933; accurate for large n).
 */
export function ksCritical(n: number, alpha: number): number {
  return Math.sqrt(Math.log(2 / alpha) / 2) / Math.sqrt(n);
}

/** Sample mean, variance (n − 1), standardized skewness and excess kurtosis (two-pass). */
export function moments(sample: Float64Array): {
  mean: number;
  variance: number;
  skewness: number;
  excessKurtosis: number;
} {
  const n = sample.length;
  let sum = 0;
  for (const v of sample) sum += v;
  const mean = sum / n;
  let m2 = 0;
  let m3 = 0;
  let m4 = 0;
  for (const v of sample) {
    const d = v - mean;
    m2 += d * d;
    m3 += d * d * d;
    m4 += d * d * d * d;
  }
  const variance = m2 / (n - 1);
  const pop = m2 / n;
  return { mean, variance, skewness: m3 / n / pop ** 1.5, excessKurtosis: m4 / n / (pop * pop) - 3 };
}

/**
 * Pearson's χ² statistic of a sample over `bins` equiprobable bins of a distribution given by its
 * quantile function, and the χ² critical value with bins − 1 degrees of freedom at α = 1e-6
 * (Wilson–Hilferty: ν(1 − 2/(9ν) + z·√(2/(9ν)))³ with z = 4.753).
 */
export function chiSquareEquiprobable(
  sample: Float64Array,
  cdf: (x: number) => number,
  bins: number,
): { statistic: number; critical: number } {
  const counts = new Float64Array(bins);
  for (const v of sample) counts[Math.min(bins - 1, Math.floor(cdf(v) * bins))]! += 1;
  const expected = sample.length / bins;
  let statistic = 0;
  for (const c of counts) statistic += (c - expected) ** 2 / expected;
  const nu = bins - 1;
  const z = 4.753; // upper 1e-6 point of the standard normal
  const critical = nu * (1 - 2 / (9 * nu) + z * Math.sqrt(2 / (9 * nu))) ** 3;
  return { statistic, critical };
}
