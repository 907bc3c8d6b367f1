/**
 * Independent numerical integration for the tests: adaptive Simpson quadrature with Richardson
 * correction (Lyness, "Notes on the adaptive Simpson quadrature routine", J. ACM 16, 1969). A
 * different method from the library's fixed Gauss–Legendre panels, so agreement checks both.
 */
export function adaptiveSimpson(f: (x: number) => number, a: number, b: number, tolerance = 1e-13): number {
  const fa = f(a);
  const fb = f(b);
  const m = (a + b) / 2;
  const fm = f(m);
  const whole = ((b - a) / 6) * (fa + 4 * fm + fb);
  return recurse(f, a, b, fa, fm, fb, whole, tolerance, 40);
}

function recurse(
  f: (x: number) => number,
  a: number,
  b: number,
  fa: number,
  fm: number,
  fb: number,
  whole: number,
  tolerance: number,
  depth: number,
): number {
  const m = (a + b) / 2;
  const lm = (a + m) / 2;
  const rm = (m + b) / 2;
  const flm = f(lm);
  const frm = f(rm);
  const left = ((m - a) / 6) * (fa + 4 * flm + fm);
  const right = ((b - m) / 6) * (fm + 4 * frm + fb);
  const delta = left + right - whole;
  // Stop at the tolerance, or where rounding (1e-15 of the panel's value) makes it unreachable.
  if (depth <= 0 || Math.abs(delta) <= 15 * Math.max(tolerance, 1e-15 * Math.abs(left + right))) {
    return left + right + delta / 15;
  }
  return (
    recurse(f, a, m, fa, flm, fm, left, tolerance / 2, depth - 1) +
    recurse(f, m, b, fm, frm, fb, right, tolerance / 2, depth - 1)
  );
}

/** ∫ f over [a, b] split into `pieces` equal sub-intervals, each integrated adaptively. */
export function piecewise(
  f: (x: number) => number,
  a: number,
  b: number,
  pieces: number,
  tolerance = 1e-14,
): number {
  let sum = 0;
  const h = (b - a) / pieces;
  for (let i = 0; i < pieces; i++) sum += adaptiveSimpson(f, a + i * h, a + (i + 1) * h, tolerance);
  return sum;
}

/** sinc(x) = sin(πx)/(πx) in plain Math (no exact argument reduction: a different evaluation from src). */
export function sinc(x: number): number {
  return x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x);
}
