/**
 * A small dense least-squares operator: the pseudo-inverse of an n × k matrix (k ≤ n, k small)
 * given by its columns, with the condition number of the column-scaled matrix.
 */

/** The operator, or why there is none. */
export interface LeastSquaresOperator {
  /**
   * 2-norm condition number of the matrix with its columns scaled to unit length (+∞ when a
   * column is zero).
   */
  readonly conditionNumber: number;
  /**
   * The columns that take part in the (near) dependence when `conditionNumber` is large: those
   * with a weight above 0.2 in the right singular vector of the smallest singular value (a zero
   * column alone when there is one).
   */
  readonly involved: readonly number[];
  /** k rows of n: x = P·b minimises ‖A·x − b‖₂ (empty when a column is zero). */
  readonly pseudoInverse: readonly (readonly number[])[];
}

/**
 * Builds the least-squares operator of the matrix with the given columns.
 *
 * @remarks
 * Columns are scaled to unit 2-norm (equilibration), then factored by Householder QR
 * (Golub & Van Loan, _Matrix Computations_, §5.2–5.3; from memory); column i of the pseudo-inverse
 * solves min ‖Â·x − eᵢ‖ by Qᵀ then back substitution, and the scaling is undone. The condition
 * number comes from the eigenvalues of ÂᵀÂ by cyclic Jacobi rotations (ibid. §8.5), accurate while
 * it stays below about 1e7, far above the limits callers apply.
 */
export function leastSquaresOperator(columns: readonly (readonly number[])[]): LeastSquaresOperator {
  const k = columns.length;
  const n = (columns[0] as readonly number[]).length;
  const scales = columns.map((c) => Math.hypot(...c));
  const zero = scales.findIndex((s) => !(s > 0) || !Number.isFinite(s));
  if (zero >= 0) return { conditionNumber: Number.POSITIVE_INFINITY, involved: [zero], pseudoInverse: [] };
  // Â as rows.
  const a: number[][] = Array.from({ length: n }, (_, i) =>
    columns.map((c, j) => (c[i] as number) / (scales[j] as number)),
  );

  // Gram matrix and its eigenvalues (condition number, and the weakest direction).
  const gram: number[][] = Array.from({ length: k }, (_, p) =>
    Array.from({ length: k }, (_, q) => {
      let s = 0;
      for (let i = 0; i < n; i++) s += (a[i]?.[p] as number) * (a[i]?.[q] as number);
      return s;
    }),
  );
  const { values, vectors } = jacobiEigen(gram);
  let min = 0;
  let max = 0;
  for (let p = 1; p < k; p++) {
    if ((values[p] as number) < (values[min] as number)) min = p;
    if ((values[p] as number) > (values[max] as number)) max = p;
  }
  const lambdaMin = Math.max(values[min] as number, 0);
  const conditionNumber =
    lambdaMin === 0 ? Number.POSITIVE_INFINITY : Math.sqrt((values[max] as number) / lambdaMin);
  const involved: number[] = [];
  for (let p = 0; p < k; p++) if (Math.abs(vectors[p]?.[min] as number) > 0.2) involved.push(p);
  if (!Number.isFinite(conditionNumber)) return { conditionNumber, involved, pseudoInverse: [] };

  // Householder QR of Â, in place: R in the upper triangle, the reflectors kept aside.
  const reflectors: (number[] | undefined)[] = [];
  for (let j = 0; j < k; j++) {
    const x: number[] = [];
    for (let i = j; i < n; i++) x.push(a[i]?.[j] as number);
    const norm = Math.hypot(...x);
    if (norm === 0) {
      reflectors.push(undefined);
      continue;
    }
    const alpha = (x[0] as number) >= 0 ? -norm : norm;
    const v = x.slice();
    v[0] = (v[0] as number) - alpha;
    const vv = v.reduce((s, t) => s + t * t, 0);
    reflectors.push(vv === 0 ? undefined : v.map((t) => t / Math.sqrt(vv)));
    const u = reflectors[j];
    if (u === undefined) continue;
    for (let q = j; q < k; q++) {
      let dot = 0;
      for (let i = j; i < n; i++) dot += (u[i - j] as number) * (a[i]?.[q] as number);
      for (let i = j; i < n; i++)
        (a[i] as number[])[q] = (a[i]?.[q] as number) - 2 * (u[i - j] as number) * dot;
    }
  }
  return { conditionNumber, involved, pseudoInverse: unscaledSolve(a, reflectors, scales, n, k) };
}

/**
 * The pseudo-inverse rows from the factored Â (R in `a`'s upper triangle): Qᵀ·eᵢ, back
 * substitution in the scaled unknowns, then each row divided by its column's scale.
 */
function unscaledSolve(
  a: readonly (readonly number[])[],
  reflectors: readonly (readonly number[] | undefined)[],
  scales: readonly number[],
  n: number,
  k: number,
): number[][] {
  const scaled: number[][] = Array.from({ length: k }, () => new Array<number>(n).fill(0));
  for (let col = 0; col < n; col++) {
    const b = new Array<number>(n).fill(0);
    b[col] = 1;
    reflectors.forEach((u, j) => {
      if (u === undefined) return;
      let dot = 0;
      for (let i = j; i < n; i++) dot += (u[i - j] as number) * (b[i] as number);
      for (let i = j; i < n; i++) b[i] = (b[i] as number) - 2 * (u[i - j] as number) * dot;
    });
    for (let p = k - 1; p >= 0; p--) {
      let s = b[p] as number;
      for (let q = p + 1; q < k; q++) s -= (a[p]?.[q] as number) * (scaled[q]?.[col] as number);
      (scaled[p] as number[])[col] = s / (a[p]?.[p] as number);
    }
  }
  return scaled.map((row, p) => row.map((x) => x / (scales[p] as number)));
}

/** Eigenvalues and eigenvectors (columns) of a small symmetric matrix by cyclic Jacobi rotations. */
function jacobiEigen(matrix: readonly (readonly number[])[]): { values: number[]; vectors: number[][] } {
  const k = matrix.length;
  const m = matrix.map((r) => r.slice());
  const v = Array.from({ length: k }, (_, i) => Array.from({ length: k }, (_, j) => (i === j ? 1 : 0)));
  for (let sweep = 0; sweep < 60; sweep++) {
    let off = 0;
    for (let p = 0; p < k; p++) for (let q = p + 1; q < k; q++) off += (m[p]?.[q] as number) ** 2;
    if (off === 0) break;
    for (let p = 0; p < k; p++) {
      for (let q = p + 1; q < k; q++) {
        const apq = m[p]?.[q] as number;
        if (apq === 0) continue;
        const theta = ((m[q]?.[q] as number) - (m[p]?.[p] as number)) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let r = 0; r < k; r++) {
          const mrp = m[r]?.[p] as number;
          const mrq = m[r]?.[q] as number;
          (m[r] as number[])[p] = c * mrp - s * mrq;
          (m[r] as number[])[q] = s * mrp + c * mrq;
        }
        for (let r = 0; r < k; r++) {
          const mpr = m[p]?.[r] as number;
          const mqr = m[q]?.[r] as number;
          (m[p] as number[])[r] = c * mpr - s * mqr;
          (m[q] as number[])[r] = s * mpr + c * mqr;
        }
        for (let r = 0; r < k; r++) {
          const vrp = v[r]?.[p] as number;
          const vrq = v[r]?.[q] as number;
          (v[r] as number[])[p] = c * vrp - s * vrq;
          (v[r] as number[])[q] = s * vrp + c * vrq;
        }
      }
    }
  }
  return { values: m.map((r, i) => r[i] as number), vectors: v };
}
