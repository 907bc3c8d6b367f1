import { BridgeworkError } from './BridgeworkError.js';
import { checkFinite, formatValue } from './checks.js';

const SPLITTER = 134217729; // 2^27 + 1, Veltkamp's splitting constant for binary64
const f64 = new Float64Array(1);
const u64 = new BigUint64Array(f64.buffer);
/** Above this magnitude SPLITTER·x overflows. */
const SPLIT_LIMIT = 2 ** 996;

function overflow(param: string, value: unknown, what: string): BridgeworkError {
  return new BridgeworkError(
    'out-of-range',
    `\`${param}\` must keep ${what} finite (within ±1.8e308); got ${formatValue(value)}`,
    { param, value },
  );
}

function split(a: number): [number, number] {
  const c = SPLITTER * a;
  const hi = c - (c - a);
  return [hi, a - hi];
}

/**
 * Error-free product: returns `[p, e]` with `p = fl(a·b)` and `a·b = p + e` exactly.
 *
 * @remarks
 * Dekker's TwoProduct with Veltkamp splitting (T. J. Dekker, "A floating-point technique for
 * extending the available precision", Numer. Math. 18, 1971). A factor above 2⁹⁹⁶, where the
 * split would overflow, is scaled by an exact power of two against the other factor first. Exact
 * for every pair of finite inputs whose product is finite and does not underflow (|a·b| ≥ 2⁻⁹⁶⁹ or
 * 0); below that the error term is itself rounded.
 *
 * @param a - First factor (finite).
 * @param b - Second factor (finite).
 * @returns `[p, e]`: the rounded product and its exact rounding error.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `out-of-range` when a·b overflows.
 * @example
 * ```ts
 * twoProduct(0.1, 0.1); // [0.010000000000000002, -8.326672684688674e-19]
 * ```
 */
export function twoProduct(a: number, b: number): [number, number] {
  checkFinite('a', a);
  checkFinite('b', b);
  const p = a * b;
  if (!Number.isFinite(p)) throw overflow('a', a, 'a·b');
  // Veltkamp's split overflows above 2^996: move the scale to the small factor (exact: powers of
  // two, and |p| finite keeps the other factor far from overflow).
  let x = a;
  let y = b;
  if (Math.abs(x) >= SPLIT_LIMIT) {
    x *= 2 ** -64;
    y *= 2 ** 64;
  } else if (Math.abs(y) >= SPLIT_LIMIT) {
    y *= 2 ** -64;
    x *= 2 ** 64;
  }
  const [xh, xl] = split(x);
  const [yh, yl] = split(y);
  const e = xl * yl - (p - xh * yh - xl * yh - xh * yl);
  return [p, e];
}

/**
 * Computes `a·b − c·d` without the cancellation of the plain formula.
 *
 * @remarks
 * Both products are formed error-free with {@link twoProduct}; the difference of the rounded
 * products is then exact whenever they lie within a factor of two of each other (Sterbenz), and
 * the two rounding errors are added back. The result is within about one ulp of the exact value
 * even when a·b and c·d agree to all but the last bits, which is exactly the case of a nearly
 * balanced bridge (R1·R3 − R2·R4). When a·b = c·d exactly the result is exactly 0. Factors
 * beyond 2⁹⁹⁶ (or products beyond binary64 on the way) take a slower path that reduces every
 * factor to [1, 2) by exact powers of two and scales the result back, so any finite inputs whose
 * result is finite give it.
 *
 * @param a - First factor of the first product.
 * @param b - Second factor of the first product.
 * @param c - First factor of the second product.
 * @param d - Second factor of the second product.
 * @returns a·b − c·d.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite` for a bad factor; `out-of-range` when
 *   the result lies beyond binary64.
 * @example
 * ```ts
 * differenceOfProducts(350.0000001, 350, 350, 350); // 0.000035000000... (correct to ~1 ulp)
 * ```
 */
export function differenceOfProducts(a: number, b: number, c: number, d: number): number {
  if (typeof a !== 'number' || typeof b !== 'number' || typeof c !== 'number' || typeof d !== 'number') {
    return differenceOfProductsChecked(a, b, c, d);
  }
  const r = fastDifferenceOfProducts(a, b, c, d);
  return Number.isFinite(r) ? r : differenceOfProductsChecked(a, b, c, d);
}

/** Inlined TwoProduct for both products: no allocation, so this is safe in per-sample code. */
function fastDifferenceOfProducts(a: number, b: number, c: number, d: number): number {
  const p1 = a * b;
  let t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b);
  const bl = b - bh;
  const e1 = al * bl - (p1 - ah * bh - al * bh - ah * bl);
  const p2 = c * d;
  t = SPLITTER * c;
  const ch = t - (t - c);
  const cl = c - ch;
  t = SPLITTER * d;
  const dh = t - (t - d);
  const dl = d - dh;
  const e2 = cl * dl - (p2 - ch * dh - cl * dh - ch * dl);
  return p1 - p2 + (e1 - e2);
}

/** The binary exponent of a finite non-zero double: 2^e ≤ |x| < 2^(e+1). */
function exponentOf(x: number): number {
  f64[0] = x;
  const biased = Number((u64[0] as bigint) >> 52n) & 0x7ff;
  return biased === 0 ? Math.floor(Math.log2(Math.abs(x))) : biased - 1023;
}

/** x·2^k without intermediate overflow or underflow of 2^k itself. */
function scaleByPowerOfTwo(x: number, k: number): number {
  let y = x;
  let n = k;
  while (n > 1000) {
    y *= 2 ** 1000;
    n -= 1000;
  }
  while (n < -1000) {
    y *= 2 ** -1000;
    n += 1000;
  }
  return y * 2 ** n;
}

/**
 * The slow path: checked inputs, each factor reduced to [1, 2) so nothing overflows on the way,
 * then the result scaled back (an `out-of-range` error when it truly lies beyond binary64).
 */
function differenceOfProductsChecked(a: unknown, b: unknown, c: unknown, d: unknown): number {
  const x = [checkFinite('a', a), checkFinite('b', b), checkFinite('c', c), checkFinite('d', d)];
  const e = x.map((v) => (v === 0 ? 0 : exponentOf(v)));
  const m = x.map((v, i) => scaleByPowerOfTwo(v, -(e[i] as number)));
  const first = (e[0] as number) + (e[1] as number);
  const second = (e[2] as number) + (e[3] as number);
  const top = x[0] === 0 || x[1] === 0 ? second : x[2] === 0 || x[3] === 0 ? first : Math.max(first, second);
  // |m| < 2: the products are below 4 and the scaled-down one may only lose bits far below the
  // other's last bit.
  const r = fastDifferenceOfProducts(
    scaleByPowerOfTwo(m[0] as number, first - top),
    m[1] as number,
    scaleByPowerOfTwo(m[2] as number, second - top),
    m[3] as number,
  );
  const result = scaleByPowerOfTwo(r, top);
  if (!Number.isFinite(result)) throw overflow('a', a, 'a·b − c·d');
  return result;
}

/**
 * The exact decimal expansion of a double, as a string (no rounding at all).
 *
 * @remarks
 * Every finite double is m·2^e with an integer m, so its value has a finite decimal expansion:
 * m·2^e for e ≥ 0, and m·5^(−e)/10^(−e) for e < 0. This is what arbitrary-precision libraries
 * need to see: `new Decimal(0.1)` reads the shortest round-trip string "0.1", which is not the
 * double's value (0.1000000000000000055511151231257827…). Use
 * `new Decimal(exactDecimalString(x))` whenever a double is a reference computation's input.
 *
 * @param x - A finite double.
 * @returns Its exact value in plain decimal notation (up to ~770 significant digits for subnormals).
 * @throws {@link BridgeworkError} `not-finite` for NaN or ±Infinity.
 * @example
 * ```ts
 * exactDecimalString(0.1); // '0.1000000000000000055511151231257827021181583404541015625'
 * exactDecimalString(-2.5); // '-2.5'
 * ```
 */
export function exactDecimalString(x: number): string {
  checkFinite('x', x);
  if (x === 0) return Object.is(x, -0) ? '-0' : '0';
  f64[0] = x;
  const bits = u64[0] as bigint;
  const negative = bits >> 63n === 1n;
  const biased = Number((bits >> 52n) & 0x7ffn);
  const fraction = bits & 0xfffffffffffffn;
  const mantissa = biased === 0 ? fraction : fraction | 0x10000000000000n;
  const exponent = (biased === 0 ? 1 : biased) - 1075;
  let digits: string;
  if (exponent >= 0) {
    digits = (mantissa << BigInt(exponent)).toString();
  } else {
    const places = -exponent;
    const scaled = (mantissa * 5n ** BigInt(places)).toString().padStart(places + 1, '0');
    const whole = scaled.slice(0, scaled.length - places);
    const frac = scaled.slice(scaled.length - places).replace(/0+$/, '');
    digits = frac === '' ? whole : `${whole}.${frac}`;
  }
  return negative ? `-${digits}` : digits;
}
