/**
 * Natural logarithm and exponential built only from IEEE 754 operations that JavaScript defines
 * exactly (+, −, ×, ÷, floor and bit access), so they return the same double on every engine and
 * machine. `Math.log` and `Math.exp` are "implementation-approximated" by ECMAScript and may differ
 * in the last bit between engines; the random-variate generators use these instead, which is what
 * makes a seeded Monte Carlo run reproducible bit for bit everywhere.
 *
 * Accuracy: within 2 ulps of the exact value (tested against 40-digit decimal.js). Speed is
 * secondary: they run only on the rare slow paths of the generators and when tables are built.
 */

const view = new DataView(new ArrayBuffer(8));

// ln 2 split so that k·LN2_HI is exact for |k| < 2^21 (fdlibm's split).
const LN2_HI = 6.9314718036912381649e-1;
const LN2_LO = 1.90821492927058770002e-10;
const INV_LN2 = 1.442695040888963387;
const SQRT_HALF = 0.7071067811865476;
const TWO_54 = 18014398509481984;

/** 2^k for −1022 ≤ k ≤ 1023, built from its bits. */
function powerOfTwo(k: number): number {
  view.setUint32(0, (k + 1023) << 20);
  view.setUint32(4, 0);
  return view.getFloat64(0);
}

/**
 * ln(x) for x > 0, reproducible on every engine. Returns −Infinity for 0, NaN for negative or NaN
 * input, Infinity for Infinity.
 */
export function portableLog(x: number): number {
  if (!(x > 0)) return x === 0 ? -Infinity : NaN;
  if (x === Infinity) return x;
  let shift = 0;
  if (x < 2.2250738585072014e-308) {
    x *= TWO_54; // subnormal: bring into the normal range
    shift = -54;
  }
  view.setFloat64(0, x);
  const hi = view.getUint32(0);
  let e = (hi >>> 20) - 1023 + shift;
  view.setUint32(0, (hi & 0x000fffff) | 0x3ff00000);
  let m = view.getFloat64(0); // in [1, 2)
  if (m > 2 * SQRT_HALF) {
    m *= 0.5;
    e += 1;
  }
  // m in [√½, √2]: ln m = 2·atanh(s), s = (m − 1)/(m + 1), |s| ≤ 0.1716, s² ≤ 0.0295.
  const f = m - 1; // exact (Sterbenz)
  const s = f / (2 + f);
  const z = s * s;
  // 2·atanh(s) = 2s·(1 + z/3 + z²/5 + …); terms to z^12/25 leave < 1e-19 relative.
  let p = 1 / 25;
  for (let k = 23; k >= 3; k -= 2) p = 1 / k + z * p;
  const lnm = 2 * s + 2 * s * (z * p);
  return e * LN2_HI + (e * LN2_LO + lnm);
}

/**
 * e^x, reproducible on every engine. Overflows to Infinity above ln(MAX_VALUE), underflows
 * (through the subnormals) to 0 below about −745.13.
 */
export function portableExp(x: number): number {
  if (Number.isNaN(x)) return x;
  if (x > 709.782712893384) return Infinity;
  if (x < -745.1332191019412) return 0;
  // x = k·ln 2 + r with |r| ≤ ln(2)/2 (Cody–Waite reduction).
  const k = Math.floor(x * INV_LN2 + 0.5);
  const r = x - k * LN2_HI - k * LN2_LO;
  // Taylor series of e^r to degree 14: the remainder is below 2e-19 for |r| ≤ 0.347.
  let p = 1;
  for (let n = 14; n >= 1; n--) p = 1 + (r * p) / n;
  if (k > 1023) return p * powerOfTwo(k - 1) * 2;
  if (k < -1022) return p * powerOfTwo(k + 1000) * powerOfTwo(-1000);
  return p * powerOfTwo(k);
}

/**
 * e^x − 1 without the cancellation of the plain formula near 0, reproducible on every engine
 * (Taylor series for |x| < 1/2, where 18 terms leave less than 1e-21; `portableExp(x) − 1` beyond).
 */
export function portableExpm1(x: number): number {
  if (!(Math.abs(x) < 0.5)) return portableExp(x) - 1;
  let p = 1;
  for (let n = 18; n >= 2; n--) p = 1 + (x * p) / n;
  return x * p;
}
