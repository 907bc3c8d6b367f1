/**
 * Solves a 3×3 linear system A·x = b by Gaussian elimination with partial pivoting.
 *
 * Backward stable (Wilkinson): the computed x solves a system within a few ulps of A·x = b, so its
 * relative error is about cond(A)·u. The caller rules out singular systems first.
 */
export function solve3(
  a: readonly (readonly [number, number, number])[],
  b: readonly [number, number, number],
): [number, number, number] {
  const m = a.map((row, i) => [row[0], row[1], row[2], b[i] as number]);
  for (let col = 0; col < 3; col++) {
    let pivot = col;
    for (let r = col + 1; r < 3; r++) {
      if (Math.abs(m[r]![col]!) > Math.abs(m[pivot]![col]!)) pivot = r;
    }
    if (pivot !== col) [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    const p = m[col]!;
    for (let r = col + 1; r < 3; r++) {
      const row = m[r]!;
      const f = row[col]! / p[col]!;
      for (let c = col; c < 4; c++) row[c] = row[c]! - f * p[c]!;
    }
  }
  const x: [number, number, number] = [0, 0, 0];
  for (let r = 2; r >= 0; r--) {
    const row = m[r]!;
    let s = row[3]!;
    for (let c = r + 1; c < 3; c++) s -= row[c]! * x[c]!;
    x[r] = s / row[r]!;
  }
  return x;
}
