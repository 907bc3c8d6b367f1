/**
 * Approximations of a smooth map over an interval of codes, in binary64 (set-up work only; the
 * firmware's own arithmetic is designed and proved elsewhere):
 * - Chebyshev interpolation (near-minimax; Trefethen, _Approximation Theory and Approximation
 *   Practice_, 2013, ch. 16: within a factor 2 + (2/π)·ln(n + 1) of the best polynomial);
 * - the best uniform line on a grid by Remez's exchange (Cheney, _Introduction to Approximation
 *   Theory_, 1966, ch. 3 — from memory).
 */
import { callReference } from './codes.js';

/** Binomial coefficients C(k, j) for k ≤ 16. */
const BINOMIAL: number[][] = (() => {
  const rows: number[][] = [[1]];
  for (let k = 1; k <= 16; k++) {
    const prev = rows[k - 1] as number[];
    rows.push(
      Array.from({ length: k + 1 }, (_, j) =>
        j === 0 || j === k ? 1 : (prev[j - 1] as number) + (prev[j] as number),
      ),
    );
  }
  return rows;
})();

/** Chebyshev polynomials T_0 … T_n in monomial form (ascending powers). */
function chebyshevMonomials(n: number): number[][] {
  const t: number[][] = [[1], [0, 1]];
  for (let k = 2; k <= n; k++) {
    const a = t[k - 1] as number[];
    const b = t[k - 2] as number[];
    const next = new Array<number>(k + 1).fill(0);
    for (let i = 0; i < a.length; i++) next[i + 1] = (next[i + 1] as number) + 2 * (a[i] as number);
    for (let i = 0; i < b.length; i++) next[i] = (next[i] as number) - (b[i] as number);
    t.push(next);
  }
  return t.slice(0, n + 1);
}

/**
 * Rewrites p(s) = Σ b_k s^k with s = (t + δ)/h as Σ a_j t^j.
 */
export function shiftPolynomial(b: readonly number[], delta: number, h: number): number[] {
  const n = b.length - 1;
  const a = new Array<number>(n + 1).fill(0);
  for (let k = 0; k <= n; k++) {
    const bk = (b[k] as number) / h ** k;
    if (bk === 0) continue;
    const row = BINOMIAL[k] as number[];
    for (let j = 0; j <= k; j++) a[j] = (a[j] as number) + bk * (row[j] as number) * delta ** (k - j);
  }
  return a;
}

/**
 * The polynomial of the given degree that interpolates `f` at the Chebyshev points (first kind)
 * of [lo, hi], in ascending powers of (code − centre). `f` is called at fractional codes inside
 * [lo, hi]; with lo = hi the constant f(lo).
 */
export function chebyshevInterpolant(
  f: (code: number) => number,
  lo: number,
  hi: number,
  centre: number,
  degree: number,
): number[] {
  if (hi === lo || degree === 0) {
    const value = callReference(f, hi === lo ? lo : (lo + hi) / 2);
    return [value, ...new Array<number>(degree).fill(0)];
  }
  const n = degree + 1;
  const mid = (lo + hi) / 2;
  const h = (hi - lo) / 2;
  const nodes = Array.from({ length: n }, (_, k) => Math.cos((Math.PI * (2 * k + 1)) / (2 * n)));
  // Nodes strictly inside [lo, hi]: mid + h·s stays in range (|s| < 1).
  const values = nodes.map((s) => callReference(f, Math.min(hi, Math.max(lo, mid + h * s))));
  // Discrete orthogonality of T_j at these nodes: c_j = (2/n) Σ v_k T_j(s_k), c_0 halved.
  const cheb = Array.from({ length: n }, (_, j) => {
    let sum = 0;
    for (let k = 0; k < n; k++)
      sum += (values[k] as number) * Math.cos((j * Math.PI * (2 * k + 1)) / (2 * n));
    return ((j === 0 ? 1 : 2) * sum) / n;
  });
  const T = chebyshevMonomials(degree);
  const b = new Array<number>(n).fill(0);
  cheb.forEach((c, j) => (T[j] as number[]).forEach((m, k) => (b[k] = (b[k] as number) + c * m)));
  return shiftPolynomial(b, centre - mid, h);
}

/** Horner's rule in binary64 on ascending coefficients. */
export function horner(a: readonly number[], t: number): number {
  let y = a[a.length - 1] as number;
  for (let k = a.length - 2; k >= 0; k--) y = y * t + (a[k] as number);
  return y;
}

/**
 * Integer codes at which to estimate the error of a fit on [first, last]: every code when there
 * are at most `dense`, otherwise both ends, an even grid of `dense` codes, and the points between
 * the Chebyshev extrema where an interpolation error peaks (their neighbours too).
 */
export function probeCodes(first: number, last: number, degree: number, dense = 48): number[] {
  const count = last - first + 1;
  if (count <= dense) return Array.from({ length: count }, (_, i) => first + i);
  const picked = new Set<number>([first, first + 1, last - 1, last]);
  for (let i = 0; i <= dense; i++) picked.add(first + Math.round(((count - 1) * i) / dense));
  const mid = (first + last) / 2;
  const h = (last - first) / 2;
  const m = 4 * (degree + 1);
  for (let k = 0; k <= m; k++) {
    const c = Math.round(mid + h * Math.cos((Math.PI * k) / m));
    for (const d of [-1, 0, 1]) if (c + d >= first && c + d <= last) picked.add(c + d);
  }
  return [...picked].sort((x, y) => x - y);
}

/**
 * The best uniform line on a grid of codes by Remez's exchange: y = c0 + c1·(code − centre), with
 * the levelled error |E| on the final reference; `f` values are taken from `values`.
 */
export function remezLine(
  codes: readonly number[],
  values: readonly number[],
  centre: number,
): { readonly coefficients: [number, number]; readonly levelled: number } {
  const n = codes.length;
  const x = codes.map((c) => c - centre);
  // Start from the ends and the middle.
  let ref = [0, Math.floor(n / 2), n - 1];
  let c0 = 0;
  let c1 = 0;
  let levelled = 0;
  for (let iter = 0; iter < 32; iter++) {
    const [i, j, k] = ref as [number, number, number];
    // Solve c0 + c1·x_r + (−1)^r·E = f_r for r = i, j, k.
    const [xi, xj, xk] = [x[i] as number, x[j] as number, x[k] as number];
    const [fi, fj, fk] = [values[i] as number, values[j] as number, values[k] as number];
    // From i and k: c1 = (fk − fi)/(xk − xi) (the E terms cancel: same sign at i and k).
    c1 = xk === xi ? 0 : (fk - fi) / (xk - xi);
    // With a = fi − c1·xi (= c0 + E) and b = fj − c1·xj (= c0 − E).
    const a = fi - c1 * xi;
    const b = fj - c1 * xj;
    c0 = (a + b) / 2;
    levelled = Math.abs(a - b) / 2;
    // The largest error over the grid.
    let worst = 0;
    let at = 0;
    for (let r = 0; r < n; r++) {
      const e = Math.abs((values[r] as number) - (c0 + c1 * (x[r] as number)));
      if (e > worst) {
        worst = e;
        at = r;
      }
    }
    if (worst <= levelled * (1 + 1e-9) + 1e-300) break;
    // Exchange: the new point replaces the reference point whose error sign it shares, keeping
    // the alternation (single-point exchange for three reference points).
    const err = (r: number) => (values[r] as number) - (c0 + c1 * (x[r] as number));
    const s = Math.sign(err(at));
    const next = [...ref, at].sort((p, q) => p - q);
    // Keep three alternating points containing `at`.
    const signs = next.map(err).map(Math.sign);
    const pos = next.indexOf(at);
    let chosen: number[];
    if (pos === 0) chosen = signs[1] === s ? [at, next[2] as number, next[3] as number] : next.slice(0, 3);
    else if (pos === 3) chosen = signs[2] === s ? [next[0] as number, next[1] as number, at] : next.slice(1);
    else if (signs[pos - 1] === s) chosen = next.filter((_, q) => q !== pos - 1);
    else chosen = next.filter((_, q) => q !== pos + 1);
    if (chosen.length !== 3) chosen = chosen.slice(0, 3);
    if (chosen.join() === ref.join()) break;
    ref = chosen;
  }
  return { coefficients: [c0, c1], levelled };
}
