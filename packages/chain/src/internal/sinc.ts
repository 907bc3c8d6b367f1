/**
 * Exact combinatorics of sinc^k decimation filters, in integer (BigInt) arithmetic.
 *
 * A sinc^k filter is k cascaded moving sums of N input samples: its impulse response is the
 * k-fold convolution of a length-N boxcar, H(z) = ((1 − z^N)/(1 − z))^k, decimated by N, so one
 * output sample is produced every N inputs (f_ODR = f_mod/N). For white input noise the output
 * variance, and the covariance of outputs l samples apart, are autocorrelations of that impulse
 * response at lags lN:
 *
 *   r(l) = coefficient of z^(k(N−1) + lN) in (1 + z + … + z^(N−1))^(2k)
 *        = Σ_j (−1)^j C(2k, j) C(k(N−1) + lN − jN + 2k − 1, 2k − 1),
 *
 * nonzero for |l| < k. As N → ∞ the filter becomes the continuous sinc^k response
 * |sin(πf/f_ODR)/(πf/f_ODR)|^k, whose kernel is the k-fold convolution of a unit boxcar; its
 * autocorrelation at integer lags is the centred cardinal B-spline of order 2k,
 *
 *   M_2k(l) = (1/(2k − 1)!) Σ_{j=0}^{2k} (−1)^j C(2k, j) (l + k − j)_+^(2k−1)
 *
 * (the same sum that gives ∫₀^∞ (sin x/x)^(2k) dx in closed form).
 */
import { ratioOfBigInts } from './exact.js';

function binomial(n: bigint, k: bigint): bigint {
  if (k < 0n || k > n) return 0n;
  let r = 1n;
  for (let i = 1n; i <= k; i++) r = (r * (n - k + i)) / i;
  return r;
}

function factorial(n: bigint): bigint {
  let r = 1n;
  for (let i = 2n; i <= n; i++) r *= i;
  return r;
}

/** (2k − 1)!·M_2k(l): the continuous kernel's autocorrelation at integer lag l, as an exact integer. */
function splineNumerator(k: bigint, l: bigint): bigint {
  const degree = 2n * k - 1n;
  let sum = 0n;
  for (let j = 0n; j <= 2n * k; j++) {
    const base = l + k - j;
    if (base <= 0n) continue;
    const term = binomial(2n * k, j) * base ** degree;
    sum += j % 2n === 0n ? term : -term;
  }
  return sum;
}

/** r(l) of the discrete kernel with decimation N, exact. */
function discreteNumerator(k: bigint, n: bigint, l: bigint): bigint {
  const m = k * (n - 1n) + l * n;
  let sum = 0n;
  for (let j = 0n; j <= 2n * k; j++) {
    const rest = m - j * n;
    if (rest < 0n) break;
    const term = binomial(2n * k, j) * binomial(rest + 2n * k - 1n, 2n * k - 1n);
    sum += j % 2n === 0n ? term : -term;
  }
  return sum;
}

/**
 * Σ_{|l|<M} (M − |l|)·r(l) over the outputs of an M-sample average, and the normaliser that turns
 * it into a noise bandwidth in units of f_ODR (one-sided): ENBW/f_ODR = sum/normaliser.
 */
function averagedSum(k: number, decimation: number | undefined, samples: number): [bigint, bigint] {
  const K = BigInt(k);
  const M = BigInt(samples);
  const lags = Math.min(samples, k);
  let sum = 0n;
  for (let l = -(lags - 1); l < lags; l++) {
    const L = BigInt(l);
    const weight = M - (L < 0n ? -L : L);
    const r = decimation === undefined ? splineNumerator(K, L) : discreteNumerator(K, BigInt(decimation), L);
    sum += weight * r;
  }
  if (decimation === undefined) {
    // ENBW/f_ODR = ½·Σ(M − |l|)·M_2k(l)/M².
    return [sum, 2n * factorial(2n * K - 1n) * M * M];
  }
  // White noise of one-sided density S₀ over f_mod/2 has variance S₀·f_mod/2; the filter (DC gain
  // N^k) scales it by Σh²/N^(2k), so ENBW = (f_mod/2)·Σr/(N^(2k)·M²) = f_ODR·N·Σr/(2·N^(2k)·M²).
  const N = BigInt(decimation);
  return [N * sum, 2n * N ** (2n * K) * M * M];
}

/**
 * Equivalent noise bandwidth of a sinc^k filter followed by an average of M outputs, in units of
 * the output data rate (M = 1 for the filter alone). Exact to within one ulp.
 */
export function sincBandwidthFactor(order: number, decimation: number | undefined, samples = 1): number {
  const [num, den] = averagedSum(order, decimation, samples);
  return ratioOfBigInts(num, den);
}

/** sin(πx), exactly 0 at every integer x (the argument is reduced exactly before Math.sin). */
export function sinPi(x: number): number {
  if (x < 0) return -sinPi(-x);
  const r = x % 2; // exact
  if (r > 1) return -sinPi(r - 1); // r − 1 exact (Sterbenz)
  const t = r > 0.5 ? 1 - r : r; // sin(πr) = sin(π(1 − r)); 1 − r exact
  return Math.sin(Math.PI * t);
}

/**
 * |H(f)| of a sinc^k filter at x = f/f_ODR: |sin(πx)/(πx)|^k in the continuous model, or
 * |sin(πx)/(N·sin(πx/N))|^k with decimation N (equal to 1 at multiples of the modulator rate).
 */
export function sincGain(order: number, decimation: number | undefined, x: number): number {
  if (x === 0) return 1;
  const num = sinPi(x);
  let den: number;
  if (decimation === undefined) {
    den = Math.PI * x;
  } else {
    den = decimation * sinPi(x / decimation);
    if (den === 0) return 1; // x a multiple of N: the alias of DC
  }
  return Math.abs(num / den) ** order;
}
