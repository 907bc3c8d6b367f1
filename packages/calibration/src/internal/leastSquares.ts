/**
 * The package's one least-squares kernel, in plain doubles (no mathjs in shipped code): Householder
 * QR of a column-equilibrated design matrix, built one column at a time, that rejects a column
 * whose part independent of the columns already accepted is below a tolerance (rank detection by
 * ordered rejection, the rule of the LINPACK-derived QR in R's `lm`, tolerance 1e-7 there; from
 * memory). The normal equations, which square the condition number, are never formed.
 *
 * Method (Golub and Van Loan, _Matrix Computations_, 4th ed., 5.2 Householder QR and 5.3.3 the
 * least-squares solution via QR; 5.4 for rank deficiency):
 * - every column is scaled to unit 2-norm (equilibration; zero columns are rejected at once), so
 *   the rank decision and the reported condition do not depend on units;
 * - column k, once the reflections of the accepted columns are applied, splits into a part in the
 *   span of those columns (its first r rows) and an orthogonal part (rows r…m−1) whose norm is the
 *   sine of its angle to that span: its `independence`. At or below the tolerance the column is
 *   rejected; otherwise a Householder reflection zeroes the orthogonal part below row r;
 * - the solution of min ‖A·x − b‖ over the accepted columns is x = R⁻¹·(Qᵀb)₁..r by back
 *   substitution, and (AᵀA)⁻¹ = R⁻¹R⁻ᵀ (scaled back to the caller's columns) is the unit-variance
 *   covariance of x;
 * - the 2-norm condition of the equilibrated accepted design is σmax/σmin of R from a one-sided
 *   Jacobi SVD (Hestenes 1958; Demmel and Veselić 1992), which is accurate to a few ulps relative
 *   for every singular value of a well-scaled triangular matrix.
 */

/** A factored least-squares design (see {@link factorDesign}). */
export interface DesignFactor {
  /** Rows m (points). */
  readonly rows: number;
  /** Columns n of the design given. */
  readonly columns: number;
  /** The indices of the accepted columns, ascending; their count is the rank. */
  readonly accepted: readonly number[];
  /** For each column given: the sine of its angle to the span of the accepted columns before it (0 for a zero column). */
  readonly independence: Float64Array;
  /** For each column given: its 2-norm (0 for a zero column). */
  readonly norms: Float64Array;
  /** R of the equilibrated accepted columns, r×r row-major (upper triangle). */
  readonly r: Float64Array;
  /** Householder vectors, column-major m×r (vector k in rows k…m−1 of column k). */
  readonly vectors: Float64Array;
  /** Householder scalars β_k (H_k = I − β_k·v_k·v_kᵀ). */
  readonly betas: Float64Array;
}

/**
 * Factors an m×n design (row-major) by Householder QR with ordered rejection of dependent columns.
 *
 * @param a - Row-major m×n design matrix (not modified).
 * @param m - Rows.
 * @param n - Columns.
 * @param tolerance - A column whose independence is at or below this is rejected.
 */
export function factorDesign(a: ArrayLike<number>, m: number, n: number, tolerance: number): DesignFactor {
  const w = new Float64Array(m * n); // column-major working copy, equilibrated
  const norms = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    // Two-pass norm with scaling by the largest entry, so no square overflows or underflows.
    let big = 0;
    for (let i = 0; i < m; i++) big = Math.max(big, Math.abs(a[i * n + j] as number));
    let sum = 0;
    if (big > 0) {
      for (let i = 0; i < m; i++) {
        const v = (a[i * n + j] as number) / big;
        sum += v * v;
      }
    }
    const norm = big * Math.sqrt(sum);
    norms[j] = norm;
    if (norm > 0) {
      // Divide by big first, then by the reduced norm: no intermediate overflows.
      const reduced = Math.sqrt(sum);
      for (let i = 0; i < m; i++) w[j * m + i] = (a[i * n + j] as number) / big / reduced;
    }
  }
  const independence = new Float64Array(n);
  const accepted: number[] = [];
  const maxRank = Math.min(m, n);
  const vectors = new Float64Array(m * maxRank);
  const betas = new Float64Array(maxRank);
  for (let j = 0; j < n; j++) {
    const r = accepted.length;
    // A zero column, or any column once r = m, has no independent part (independence stays 0).
    if (norms[j] === 0 || r === m) continue;
    const col = j * m;
    let big = 0;
    for (let i = r; i < m; i++) big = Math.max(big, Math.abs(w[col + i] as number));
    let sum = 0;
    if (big > 0) {
      for (let i = r; i < m; i++) {
        const v = (w[col + i] as number) / big;
        sum += v * v;
      }
    }
    const alpha = big * Math.sqrt(sum);
    independence[j] = alpha;
    if (!(alpha > tolerance)) continue;
    // Householder vector v = x − s·e1 with s = −sign(x0)·‖x‖ (no cancellation), β = 2/(vᵀv).
    const x0 = w[col + r] as number;
    const s = x0 >= 0 ? -alpha : alpha;
    const vbase = r * m;
    vectors[vbase + r] = x0 - s;
    for (let i = r + 1; i < m; i++) vectors[vbase + i] = w[col + i] as number;
    let vv = 0;
    for (let i = r; i < m; i++) vv += (vectors[vbase + i] as number) ** 2;
    const beta = 2 / vv;
    betas[r] = beta;
    w[col + r] = s;
    for (let i = r + 1; i < m; i++) w[col + i] = 0;
    // Apply H to the later columns.
    for (let k = j + 1; k < n; k++) {
      const ck = k * m;
      let dot = 0;
      for (let i = r; i < m; i++) dot += (vectors[vbase + i] as number) * (w[ck + i] as number);
      const f = beta * dot;
      for (let i = r; i < m; i++) w[ck + i] = (w[ck + i] as number) - f * (vectors[vbase + i] as number);
    }
    accepted.push(j);
  }
  const rank = accepted.length;
  const rr = new Float64Array(rank * rank);
  accepted.forEach((j, k) => {
    for (let i = 0; i <= k; i++) rr[i * rank + k] = w[j * m + i] as number;
  });
  return {
    rows: m,
    columns: n,
    accepted,
    independence,
    norms,
    r: rr,
    vectors: vectors.slice(0, m * rank),
    betas: betas.slice(0, rank),
  };
}

/**
 * Least-squares coefficients of the accepted columns for one right-hand side b (length m), in the
 * caller's column units, in the order of `accepted`.
 */
export function solveDesign(f: DesignFactor, b: ArrayLike<number>): Float64Array {
  const { rows: m, accepted, betas, vectors, r } = f;
  const rank = accepted.length;
  const y = Float64Array.from(b as ArrayLike<number>);
  for (let k = 0; k < rank; k++) {
    const base = k * m;
    let dot = 0;
    for (let i = k; i < m; i++) dot += (vectors[base + i] as number) * (y[i] as number);
    const g = (betas[k] as number) * dot;
    for (let i = k; i < m; i++) y[i] = (y[i] as number) - g * (vectors[base + i] as number);
  }
  const x = new Float64Array(rank);
  for (let i = rank - 1; i >= 0; i--) {
    let sum = y[i] as number;
    for (let k = i + 1; k < rank; k++) sum -= (r[i * rank + k] as number) * (x[k] as number);
    x[i] = sum / (r[i * rank + i] as number);
  }
  // Undo the equilibration: column j was divided by its norm.
  accepted.forEach((j, k) => (x[k] = (x[k] as number) / (f.norms[j] as number)));
  return x;
}

/** R⁻¹ of an upper-triangular r×r row-major matrix, by back substitution column by column. */
function invertUpper(r: Float64Array, n: number): Float64Array {
  const inv = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    inv[j * n + j] = 1 / (r[j * n + j] as number);
    for (let i = j - 1; i >= 0; i--) {
      let sum = 0;
      for (let k = i + 1; k <= j; k++) sum += (r[i * n + k] as number) * (inv[k * n + j] as number);
      inv[i * n + j] = -sum / (r[i * n + i] as number);
    }
  }
  return inv;
}

/**
 * (AᵀA)⁻¹ over the accepted columns, in the caller's column units (r×r row-major, order of
 * `accepted`): the covariance of the coefficients per unit variance of b.
 */
export function unitCovariance(f: DesignFactor): Float64Array {
  const n = f.accepted.length;
  const inv = invertUpper(f.r, n);
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let sum = 0;
      for (let k = j; k < n; k++) sum += (inv[i * n + k] as number) * (inv[j * n + k] as number);
      const v =
        sum / ((f.norms[f.accepted[i] as number] as number) * (f.norms[f.accepted[j] as number] as number));
      out[i * n + j] = v;
      out[j * n + i] = v;
    }
  }
  return out;
}

/**
 * Singular values of a square matrix (row-major n×n), descending, by one-sided Jacobi rotations
 * on its columns until every pair is orthogonal to 4ε (at most 60 sweeps).
 */
export function singularValues(a: ArrayLike<number>, n: number): Float64Array {
  const u = new Float64Array(n * n); // column-major copy
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) u[j * n + i] = a[i * n + j] as number;
  for (let sweep = 0; sweep < 60; sweep++) {
    let rotated = false;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < n; i++) {
          const x = u[p * n + i] as number;
          const y = u[q * n + i] as number;
          alpha += x * x;
          beta += y * y;
          gamma += x * y;
        }
        if (gamma === 0 || Math.abs(gamma) <= 4 * Number.EPSILON * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = Math.sign(zeta || 1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let i = 0; i < n; i++) {
          const x = u[p * n + i] as number;
          const y = u[q * n + i] as number;
          u[p * n + i] = c * x - s * y;
          u[q * n + i] = s * x + c * y;
        }
      }
    }
    if (!rotated) break;
  }
  const sigma = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let sum = 0;
    for (let i = 0; i < n; i++) sum += (u[j * n + i] as number) ** 2;
    sigma[j] = Math.sqrt(sum);
  }
  return sigma.sort().reverse();
}

/**
 * The 2-norm condition number of the equilibrated accepted design, σmax/σmin (1 for one column);
 * Infinity when the design has no accepted column.
 */
export function designCondition(f: DesignFactor): number {
  const n = f.accepted.length;
  if (n === 0) return Infinity;
  const s = singularValues(f.r, n);
  return (s[0] as number) / (s[n - 1] as number);
}
