import { checkFinite } from './checks.js';

const SPLITTER = 134217729; // 2^27 + 1, Veltkamp's splitting constant for binary64

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
 * extending the available precision", Numer. Math. 18, 1971). Exact for finite inputs whose
 * product neither overflows nor underflows (|a·b| within about 2⁻⁹⁶⁹ … 2⁹⁹⁶).
 *
 * @param a - First factor.
 * @param b - Second factor.
 * @returns `[p, e]`: the rounded product and its exact rounding error.
 * @example
 * ```ts
 * twoProduct(0.1, 0.1); // [0.010000000000000002, -8.326672684688674e-19]
 * ```
 */
export function twoProduct(a: number, b: number): [number, number] {
  const p = a * b;
  const [ah, al] = split(a);
  const [bh, bl] = split(b);
  const e = al * bl - (p - ah * bh - al * bh - ah * bl);
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
 * balanced bridge (R1·R3 − R2·R4). When a·b = c·d exactly the result is exactly 0.
 *
 * @param a - First factor of the first product.
 * @param b - Second factor of the first product.
 * @param c - First factor of the second product.
 * @param d - Second factor of the second product.
 * @returns a·b − c·d.
 * @example
 * ```ts
 * differenceOfProducts(350.0000001, 350, 350, 350); // 0.000035000000... (correct to ~1 ulp)
 * ```
 */
export function differenceOfProducts(a: number, b: number, c: number, d: number): number {
  // Inlined TwoProduct for both products: no allocation, so this is safe in per-sample code.
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

const f64 = new Float64Array(1);
const u64 = new BigUint64Array(f64.buffer);

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
