/**
 * Gauss–Legendre quadrature (nodes and weights by Newton's method on the Legendre polynomial, the
 * classical construction: Golub & Welsch give the same nodes as eigenvalues). An n-point rule is
 * exact for polynomials of degree 2n − 1; for the smooth integrands it is used on here (sinc
 * powers on half-unit panels) it reaches double precision.
 */
const POINTS = 24;

function legendreRule(n: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = x;
      for (let j = 2; j <= n; j++) {
        const p2 = ((2 * j - 1) * x * p1 - (j - 1) * p0) / j;
        p0 = p1;
        p1 = p2;
      }
      dp = (n * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    const w = 2 / ((1 - x * x) * dp * dp);
    nodes[i] = -x;
    nodes[n - 1 - i] = x;
    weights[i] = w;
    weights[n - 1 - i] = w;
  }
  return { nodes, weights };
}

const rule = legendreRule(POINTS);

/** ∫_a^b f(x) dx with one 24-point Gauss–Legendre panel. */
export function gaussLegendre(f: (x: number) => number, a: number, b: number): number {
  const half = (b - a) / 2;
  const mid = (a + b) / 2;
  let sum = 0;
  for (let i = 0; i < POINTS; i++)
    sum += (rule.weights[i] as number) * f(mid + half * (rule.nodes[i] as number));
  return sum * half;
}
