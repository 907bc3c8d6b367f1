/**
 * The one place this package touches mathjs: a small typed adapter around a private instance that
 * holds only `qr` and `usolve`.
 *
 * Why an adapter: mathjs's factory exports are typed possibly-undefined under
 * `noUncheckedIndexedAccess`, a partial instance is typed as complete, and its results are typed
 * as the union of every collection type. This module narrows all of that once, to plain arrays.
 *
 * Why lazy: importing mathjs costs about 0.8 s on Node. It is loaded by a dynamic `import()` the
 * first time a fit needs it, and the promise is cached, so importing `@bridgework/calibration`
 * (for the shunt, certificate and class functions) never pays for it.
 */
/** The two mathjs operations the least-squares fit uses, on plain arrays of doubles. */
export interface LinearAlgebra {
  /**
   * Householder QR factorization of an m×n matrix (m ≥ n): A = Q·R with Q orthogonal (m×m) and
   * R upper triangular (m×n).
   */
  qr(a: readonly (readonly number[])[]): { readonly q: number[][]; readonly r: number[][] };
  /** Solves U·x = b by back substitution, for a square upper-triangular U. */
  usolve(u: readonly (readonly number[])[], b: readonly number[]): number[];
}

let pending: Promise<LinearAlgebra> | undefined;

function toRows(value: unknown, what: string): number[][] {
  const rows = (
    typeof value === 'object' && value !== null && 'toArray' in value
      ? (value as { toArray(): unknown }).toArray()
      : value
  ) as unknown;
  if (!Array.isArray(rows) || !rows.every((row) => Array.isArray(row))) {
    // An internal invariant (mathjs returns nested arrays for array input), not a user error.
    throw new Error(`mathjs returned an unexpected ${what}`);
  }
  return rows as number[][];
}

async function load(): Promise<LinearAlgebra> {
  const mathjs = await import('mathjs');
  const { qrDependencies, usolveDependencies } = mathjs;
  if (qrDependencies === undefined || usolveDependencies === undefined) {
    throw new Error('the installed mathjs does not provide qr and usolve');
  }
  // A private instance in plain double arithmetic: no shared configuration is touched.
  const math = mathjs.create({ qrDependencies, usolveDependencies }, { number: 'number' });
  return {
    qr(a) {
      const { Q, R } = math.qr(a.map((row) => [...row]));
      return { q: toRows(Q, 'Q'), r: toRows(R, 'R') };
    },
    usolve(u, b) {
      const x = toRows(
        math.usolve(
          u.map((row) => [...row]),
          b.map((v) => [v]),
        ),
        'solution',
      );
      return x.map((row) => row[0] as number);
    },
  };
}

/**
 * Loads mathjs on first use (about 0.8 s once per process) and returns the adapter.
 *
 * @returns The cached adapter; a failed load is not cached, so a later call retries.
 */
export function loadLinearAlgebra(): Promise<LinearAlgebra> {
  pending ??= load().catch((error: unknown) => {
    pending = undefined;
    throw error;
  });
  return pending;
}
