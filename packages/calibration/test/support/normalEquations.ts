/**
 * Independent reference for least-squares polynomial fits: the normal equations AᵀA·c = Aᵀy in
 * the caller's (unscaled) basis, formed and solved by Gauss–Jordan elimination with partial
 * pivoting in 40-digit decimal.js arithmetic. This is the textbook method the library avoids (it
 * squares the condition number), which is exactly why it is a different method; at 40 digits the
 * squaring costs nothing on well-scaled data. Inputs enter exactly (exactDecimalString).
 */
import { Decimal } from 'decimal.js';
import { exactDecimalString } from '@bridgework/core';

type Big = Decimal;

export interface ReferenceFit {
  readonly coefficients: number[];
  readonly covariance: number[][];
  readonly residualStandardDeviation: number;
  /** The fitted reading at a load, evaluated at the working precision before rounding to a double. */
  readingAt(load: number): number;
}

/** Inverts a square matrix by Gauss–Jordan elimination with partial pivoting. */
function invert(D: typeof Decimal, m: Big[][]): Big[][] {
  const n = m.length;
  const a = m.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => new D(i === j ? 1 : 0))]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (a[r]![col]!.abs().gt(a[pivot]![col]!.abs())) pivot = r;
    [a[col], a[pivot]] = [a[pivot]!, a[col]!];
    const p = a[col]![col]!;
    a[col] = a[col]!.map((v) => v.div(p));
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = a[r]![col]!;
      a[r] = a[r]!.map((v, j) => v.minus(f.times(a[col]![j]!)));
    }
  }
  return a.map((row) => row.slice(n));
}

/**
 * @param digits - Working precision: 40 for well-scaled data; raw loads far from the origin square
 *   an already large condition number, so those checks use more.
 */
export function normalEquationsFit(
  loads: readonly number[],
  readings: readonly number[],
  degree: number,
  digits = 40,
): ReferenceFit {
  const D = Decimal.clone({ precision: digits, rounding: Decimal.ROUND_HALF_EVEN });
  const exact = (x: number): Big => new D(exactDecimalString(x));
  const p = degree + 1;
  const x = loads.map(exact);
  const y = readings.map(exact);
  const rows = x.map((xi) => Array.from({ length: p }, (_, k) => xi.pow(k)));
  const ata = Array.from({ length: p }, (_, i) =>
    Array.from({ length: p }, (_, j) => rows.reduce((s, r) => s.plus(r[i]!.times(r[j]!)), new D(0))),
  );
  const aty = Array.from({ length: p }, (_, i) =>
    rows.reduce((s, r, k) => s.plus(r[i]!.times(y[k]!)), new D(0)),
  );
  const inverse = invert(D, ata);
  const c = inverse.map((row) => row.reduce((s, v, j) => s.plus(v.times(aty[j]!)), new D(0)));
  const ssr = rows.reduce((s, r, k) => {
    const fitted = r.reduce((f, v, j) => f.plus(v.times(c[j]!)), new D(0));
    return s.plus(y[k]!.minus(fitted).pow(2));
  }, new D(0));
  const s2 = ssr.div(loads.length - p);
  return {
    coefficients: c.map((v) => v.toNumber()),
    covariance: inverse.map((row) => row.map((v) => v.times(s2).toNumber())),
    residualStandardDeviation: s2.sqrt().toNumber(),
    readingAt: (load) =>
      c.reduce((sum, ck, k) => sum.plus(ck.times(exact(load).pow(k))), new D(0)).toNumber(),
  };
}
