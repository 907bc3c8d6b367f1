import { BridgeworkError, checkOptions, checkRange, formatValue } from '@bridgework/core';

/** The correlation coefficient r(xᵢ, xⱼ) between two named input quantities (JCGM 100 5.2.2). */
export interface Correlation {
  /** The names of the two inputs (distinct, both keys of `inputs`). */
  readonly between: readonly [string, string];
  /** The correlation coefficient r, in [−1, 1]. */
  readonly coefficient: number;
}

/** The checked correlations: the full symmetric matrix and the pairs with a non-zero coefficient. */
export interface CorrelationMatrix {
  /** r(xᵢ, xⱼ), row-major n×n, with ones on the diagonal. */
  readonly matrix: Float64Array;
  /** Index pairs [i, j] (i < j) with r ≠ 0, with the position of their entry in `correlations`. */
  readonly pairs: readonly { readonly i: number; readonly j: number; readonly entry: number }[];
}

/** Tolerance on pivots of the semidefinite Cholesky factorization, relative to the unit diagonal. */
const PIVOT_TOLERANCE = 1e-12;

/**
 * Factors a correlation matrix R = L·Lᵀ, accepting semidefinite matrices (a zero pivot gives a zero
 * column when the rest of that column vanishes too). Returns L row-major, or the index of the
 * first pivot that proves R not positive semidefinite.
 */
export function choleskySemidefinite(
  r: Float64Array,
  n: number,
): { lower: Float64Array } | { failedAt: number } {
  const lower = new Float64Array(n * n);
  for (let k = 0; k < n; k++) {
    let d = r[k * n + k] as number;
    for (let c = 0; c < k; c++) d -= (lower[k * n + c] as number) ** 2;
    const tol = PIVOT_TOLERANCE * (k + 1);
    if (d < -tol) return { failedAt: k };
    if (d <= tol) {
      // Zero pivot: the rest of column k must vanish for R to be semidefinite.
      for (let i = k + 1; i < n; i++) {
        let v = r[i * n + k] as number;
        for (let c = 0; c < k; c++) v -= (lower[i * n + c] as number) * (lower[k * n + c] as number);
        if (Math.abs(v) > Math.sqrt(tol)) return { failedAt: k };
      }
      continue;
    }
    const pivot = Math.sqrt(d);
    lower[k * n + k] = pivot;
    for (let i = k + 1; i < n; i++) {
      let v = r[i * n + k] as number;
      for (let c = 0; c < k; c++) v -= (lower[i * n + c] as number) * (lower[k * n + c] as number);
      lower[i * n + k] = v / pivot;
    }
  }
  return { lower };
}

/**
 * Checks `correlations` against the input names and builds the correlation matrix.
 *
 * @throws `wrong-type` unless an array of objects; `invalid-shape` unless `between` holds two
 *   names; `invalid-option` for an unknown name or a quantity correlated with itself;
 *   `out-of-range` for a coefficient outside [−1, 1]; `conflicting-options` for a pair given
 *   twice; `not-positive-semidefinite` when the matrix is not positive semidefinite.
 */
export function normalizeCorrelations(names: readonly string[], correlations: unknown): CorrelationMatrix {
  const n = names.length;
  const matrix = new Float64Array(n * n);
  for (let i = 0; i < n; i++) matrix[i * n + i] = 1;
  const pairs: { i: number; j: number; entry: number }[] = [];
  if (correlations === undefined) return { matrix, pairs };
  if (!Array.isArray(correlations)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`correlations\` must be an array of { between, coefficient }; got ${formatValue(correlations)}`,
      { param: 'correlations', value: correlations },
    );
  }
  const seen = new Set<string>();
  correlations.forEach((entry: unknown, e) => {
    const path = `correlations[${e}]`;
    const c = checkOptions(path, entry, {
      known: ['between', 'coefficient'],
      required: ['between', 'coefficient'],
    });
    const between = c['between'];
    if (!Array.isArray(between) || between.length !== 2) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`${path}.between\` must be an array of two input names; got ${formatValue(between)}`,
        {
          param: `${path}.between`,
          value: between,
          limit: 2,
        },
      );
    }
    const index = between.map((name: unknown, side) => {
      const at = typeof name === 'string' ? names.indexOf(name) : -1;
      if (at < 0) {
        throw new BridgeworkError(
          'invalid-option',
          `\`${path}.between[${side}]\` must name an input (${names.map((x) => `'${x}'`).join(', ')}); got ${formatValue(name)}`,
          { param: `${path}.between[${side}]`, value: name, limit: names },
        );
      }
      return at;
    });
    const [a, b] = index as [number, number];
    if (a === b) {
      throw new BridgeworkError(
        'invalid-option',
        `\`${path}.between\` must name two different inputs; got '${names[a]}' twice`,
        {
          param: `${path}.between`,
          value: between,
        },
      );
    }
    const coefficient = checkRange(`${path}.coefficient`, c['coefficient'], { min: -1, max: 1 });
    const i = Math.min(a, b);
    const j = Math.max(a, b);
    const key = `${i},${j}`;
    if (seen.has(key)) {
      throw new BridgeworkError(
        'conflicting-options',
        `\`${path}\` must not repeat the pair '${names[i]}', '${names[j]}'`,
        {
          param: path,
          value: between,
        },
      );
    }
    seen.add(key);
    matrix[i * n + j] = coefficient;
    matrix[j * n + i] = coefficient;
    if (coefficient !== 0) pairs.push({ i, j, entry: e });
  });
  const factor = choleskySemidefinite(matrix, n);
  if ('failedAt' in factor) {
    throw new BridgeworkError(
      'not-positive-semidefinite',
      `\`correlations\` must form a positive semidefinite matrix; the coefficients involving '${names[factor.failedAt]}' contradict the others`,
      { param: 'correlations', value: correlations },
    );
  }
  return { matrix, pairs };
}
