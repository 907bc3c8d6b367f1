/**
 * The project's one numeric comparison: every assertion states its tolerance.
 *
 * A value passes when it meets any criterion that is given:
 * - `abs`: |actual − expected| ≤ abs
 * - `rel`: |actual − expected| ≤ rel·|expected|
 * - `ulps`: the two doubles are at most `ulps` representable numbers apart
 * At least one criterion is required, so no comparison can fall back to a hidden default.
 */
export interface Tolerance {
  readonly abs?: number;
  readonly rel?: number;
  readonly ulps?: number;
}

const f64 = new Float64Array(1);
const i64 = new BigInt64Array(f64.buffer);

/** Maps a double to an integer whose order is the order of the doubles (−0 and +0 both map to 0). */
function ordinal(x: number): bigint {
  f64[0] = x;
  const bits = i64[0] as bigint;
  return bits < 0n ? -(bits & 0x7fffffffffffffffn) : bits;
}

/** Number of representable doubles between a and b (0 when equal; Infinity when either is NaN). */
export function ulpDistance(a: number, b: number): number {
  if (Number.isNaN(a) || Number.isNaN(b)) return Infinity;
  const d = ordinal(a) - ordinal(b);
  return Number(d < 0n ? -d : d);
}

export function checkTolerance(tolerance: unknown): asserts tolerance is Tolerance {
  if (typeof tolerance !== 'object' || tolerance === null) {
    throw new TypeError('toBeNear needs a tolerance object: { abs?, rel?, ulps? }');
  }
  const t = tolerance as Record<string, unknown>;
  const keys = Object.keys(t);
  if (keys.length === 0 || keys.some((k) => !['abs', 'rel', 'ulps'].includes(k))) {
    throw new TypeError(`toBeNear tolerance must use abs, rel or ulps; got {${keys.join(', ')}}`);
  }
  for (const k of keys) {
    const v = t[k];
    if (typeof v !== 'number' || !(v >= 0)) throw new TypeError(`toBeNear tolerance ${k} must be >= 0`);
  }
}

/** Whether `actual` is within `tolerance` of `expected` (scalars). */
export function isNear(actual: number, expected: number, tolerance: Tolerance): boolean {
  if (Number.isNaN(actual) || Number.isNaN(expected)) return false;
  if (actual === expected) return true;
  const diff = Math.abs(actual - expected);
  if (tolerance.abs !== undefined && diff <= tolerance.abs) return true;
  if (tolerance.rel !== undefined && diff <= tolerance.rel * Math.abs(expected)) return true;
  if (tolerance.ulps !== undefined && ulpDistance(actual, expected) <= tolerance.ulps) return true;
  return false;
}

/** A description of how far apart two values are, for failure messages. */
export function describeDistance(actual: number, expected: number): string {
  const diff = Math.abs(actual - expected);
  const rel = expected === 0 ? Infinity : diff / Math.abs(expected);
  return `|diff| = ${diff.toExponential(3)}, rel = ${rel.toExponential(3)}, ulps = ${ulpDistance(actual, expected)}`;
}
