/**
 * Independent reference for linear least squares: the normal equations AᵀA·x = Aᵀy formed and
 * solved by Gauss–Jordan elimination with partial pivoting in 50-digit decimal.js arithmetic (the
 * method the library avoids because it squares the condition number, which at 50 digits costs
 * nothing here). Inputs enter exactly (exactDecimalString).
 */
import { Decimal } from 'decimal.js';
import { exactDecimalString } from '@bridgework/core';

const D = Decimal.clone({ precision: 50, rounding: Decimal.ROUND_HALF_EVEN });

/** Least-squares solution of rows·x ≈ y, as doubles. */
export function decimalLeastSquares(rows: readonly (readonly number[])[], y: readonly number[]): number[] {
  const p = rows[0]!.length;
  const a = rows.map((r) => r.map((v) => new D(exactDecimalString(v))));
  const b = y.map((v) => new D(exactDecimalString(v)));
  const ata = Array.from({ length: p }, (_, i) =>
    Array.from({ length: p }, (_, j) => a.reduce((s, r) => s.plus(r[i]!.times(r[j]!)), new D(0))),
  );
  const atb = Array.from({ length: p }, (_, i) =>
    a.reduce((s, r, k) => s.plus(r[i]!.times(b[k]!)), new D(0)),
  );
  const m = ata.map((row, i) => [...row, atb[i]!]);
  for (let col = 0; col < p; col++) {
    let pivot = col;
    for (let r = col + 1; r < p; r++) if (m[r]![col]!.abs().gt(m[pivot]![col]!.abs())) pivot = r;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    const pv = m[col]![col]!;
    m[col] = m[col]!.map((v) => v.div(pv));
    for (let r = 0; r < p; r++) {
      if (r === col) continue;
      const f = m[r]![col]!;
      if (f.isZero()) continue;
      m[r] = m[r]!.map((v, j) => v.minus(f.times(m[col]![j]!)));
    }
  }
  return m.map((row) => row[p]!.toNumber());
}
