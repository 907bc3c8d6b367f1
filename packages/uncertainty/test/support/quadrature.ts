/** Gauss–Legendre quadrature (nodes by Newton's method on Pₙ, as in Numerical Recipes §4.5). */
export function gaussLegendre(n: number, a: number, b: number): { x: number[]; w: number[] } {
  const x: number[] = new Array<number>(n);
  const w: number[] = new Array<number>(n);
  const mid = (a + b) / 2;
  const half = (b - a) / 2;
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let derivative = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p1 = 1;
      let p2 = 0;
      for (let j = 1; j <= n; j++) {
        const p3 = p2;
        p2 = p1;
        p1 = ((2 * j - 1) * z * p2 - (j - 1) * p3) / j;
      }
      derivative = (n * (z * p1 - p2)) / (z * z - 1);
      const step = p1 / derivative;
      z -= step;
      if (Math.abs(step) < 1e-15) break;
    }
    x[i] = mid - half * z;
    x[n - 1 - i] = mid + half * z;
    w[i] = (2 * half) / ((1 - z * z) * derivative * derivative);
    w[n - 1 - i] = w[i]!;
  }
  return { x, w };
}
