/**
 * Rounds a double to the nearest integer, ties to even (IEEE 754 roundTiesToEven).
 *
 * Written out rather than delegated to `Math.round`, which rounds ties toward +∞ (−2.5 → −2,
 * 2.5 → 3). For x ≥ 0, f = ⌊x⌋ and d = x − f are exact (Sterbenz for x ≥ 1; f = 0 below), so the
 * comparison of d with ½ is exact; negative inputs use the symmetry round(−x) = −round(x).
 * Magnitudes of 2⁵² and more are integers already. The result is never −0.
 */
export function roundHalfEven(x: number): number {
  if (x < 0) return 0 - roundHalfEven(-x);
  if (!(x < 4503599627370496)) return x; // 2^52: every double from here on is an integer (or NaN/∞)
  const f = Math.floor(x);
  const d = x - f;
  if (d > 0.5) return f + 1;
  if (d < 0.5) return f;
  return f % 2 === 0 ? f : f + 1;
}

/** The next double below x (x finite and > the smallest negative double). */
export function nextDown(x: number): number {
  if (x === 0) return -Number.MIN_VALUE;
  const f64 = new Float64Array([x]);
  const u64 = new BigInt64Array(f64.buffer);
  u64[0] = (u64[0] as bigint) + (x > 0 ? -1n : 1n);
  return f64[0] as number;
}
