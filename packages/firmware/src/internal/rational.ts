/**
 * Exact rational arithmetic on BigInt: the number system in which every constant and bound of
 * this package is derived. Arithmetic results keep a positive denominator but are not reduced (a
 * gcd per operation costs more than the growth it saves over the few dozen operations of a bound);
 * `rat` reduces, and every function accepts either form.
 */

/** An exact rational number n/d, d > 0 (not necessarily in lowest terms). */
export interface Rational {
  readonly n: bigint;
  readonly d: bigint;
}

function gcd(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

/** Builds n/d in lowest terms (d ≠ 0). */
export function rat(n: bigint, d: bigint = 1n): Rational {
  if (d === 0n) throw new RangeError('rational with zero denominator');
  if (d < 0n) [n, d] = [-n, -d];
  const g = gcd(n, d);
  return g === 1n || g === 0n ? { n, d } : { n: n / g, d: d / g };
}

/** n/d for d > 0, without reduction. */
function raw(n: bigint, d: bigint): Rational {
  return { n, d };
}

export const ZERO: Rational = { n: 0n, d: 1n };
export const ONE: Rational = { n: 1n, d: 1n };

export function add(a: Rational, b: Rational): Rational {
  return a.d === b.d ? raw(a.n + b.n, a.d) : raw(a.n * b.d + b.n * a.d, a.d * b.d);
}

export function sub(a: Rational, b: Rational): Rational {
  return a.d === b.d ? raw(a.n - b.n, a.d) : raw(a.n * b.d - b.n * a.d, a.d * b.d);
}

export function mul(a: Rational, b: Rational): Rational {
  return raw(a.n * b.n, a.d * b.d);
}

export function div(a: Rational, b: Rational): Rational {
  if (b.n === 0n) throw new RangeError('rational division by zero');
  return b.n < 0n ? raw(-a.n * b.d, -a.d * b.n) : raw(a.n * b.d, a.d * b.n);
}

export function neg(a: Rational): Rational {
  return { n: -a.n, d: a.d };
}

export function abs(a: Rational): Rational {
  return a.n < 0n ? { n: -a.n, d: a.d } : a;
}

/** −1, 0 or 1. */
export function sign(a: Rational): -1 | 0 | 1 {
  return a.n < 0n ? -1 : a.n > 0n ? 1 : 0;
}

/** Compares a and b: −1, 0 or 1. */
export function cmp(a: Rational, b: Rational): -1 | 0 | 1 {
  const l = a.n * b.d;
  const r = b.n * a.d;
  return l < r ? -1 : l > r ? 1 : 0;
}

export function max(a: Rational, b: Rational): Rational {
  return cmp(a, b) >= 0 ? a : b;
}

/** a · 2^k for any integer k. */
export function mulPow2(a: Rational, k: number): Rational {
  return k >= 0 ? raw(a.n << BigInt(k), a.d) : raw(a.n, a.d << BigInt(-k));
}

/** a^k for an integer k ≥ 0. */
export function pow(a: Rational, k: number): Rational {
  return raw(a.n ** BigInt(k), a.d ** BigInt(k));
}

/** ⌊a⌋. */
export function floor(a: Rational): bigint {
  const q = a.n / a.d; // truncates toward zero
  return a.n < 0n && q * a.d !== a.n ? q - 1n : q;
}

/** The integer nearest to a, ties to even. */
export function roundHalfEven(a: Rational): bigint {
  const f = floor(a);
  const twiceRest = 2n * (a.n - f * a.d); // 2·(a − ⌊a⌋)·d, in [0, 2d)
  if (twiceRest > a.d) return f + 1n;
  if (twiceRest < a.d) return f;
  return f % 2n === 0n ? f : f + 1n;
}

/** a in lowest terms. */
export function reduce(a: Rational): Rational {
  return rat(a.n, a.d);
}

/** Bit length of a non-negative bigint (0 for 0). */
export function bitLength(x: bigint): number {
  return x === 0n ? 0 : x.toString(2).length;
}

/**
 * ⌊log2 |a|⌋ for a ≠ 0: the e with 2^e ≤ |a| < 2^(e+1).
 */
export function floorLog2(a: Rational): number {
  const n = a.n < 0n ? -a.n : a.n;
  let e = bitLength(n) - bitLength(a.d);
  // 2^e ≤ n/d ⇔ n ≥ d·2^e (or n·2^−e ≥ d).
  const atLeast = (k: number) => (k >= 0 ? n >= a.d << BigInt(k) : n << BigInt(-k) >= a.d);
  if (!atLeast(e)) e -= 1;
  return e;
}
