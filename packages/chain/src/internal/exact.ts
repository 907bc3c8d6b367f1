/** A finite double as an exact integer mantissa and a power-of-two exponent: x = m·2^e. */
interface Dyadic {
  readonly m: bigint;
  readonly e: number;
}

const f64 = new Float64Array(1);
const u64 = new BigUint64Array(f64.buffer);

function dyadic(x: number): Dyadic {
  f64[0] = x;
  const bits = u64[0] as bigint;
  const biased = Number((bits >> 52n) & 0x7ffn);
  const fraction = bits & 0xfffffffffffffn;
  const mantissa = biased === 0 ? fraction : fraction | 0x10000000000000n;
  const m = bits >> 63n === 1n ? -mantissa : mantissa;
  return { m, e: (biased === 0 ? 1 : biased) - 1075 };
}

/**
 * The exact sign (−1, 0 or 1) of a·b − c·d for finite doubles, in integer arithmetic.
 *
 * Each double is m·2^e with an integer m, so both products are exact integers times powers of two;
 * aligning the exponents and subtracting in BigInt decides the sign with no rounding at all. Slow
 * (about a microsecond): used only when a floating-point decision is too close to call.
 */
export function signOfProductDifference(a: number, b: number, c: number, d: number): -1 | 0 | 1 {
  const x = dyadic(a);
  const y = dyadic(b);
  const z = dyadic(c);
  const w = dyadic(d);
  let p = x.m * y.m;
  let q = z.m * w.m;
  const ep = x.e + y.e;
  const eq = z.e + w.e;
  if (ep > eq) p <<= BigInt(ep - eq);
  else q <<= BigInt(eq - ep);
  return p > q ? 1 : p < q ? -1 : 0;
}

/**
 * The double nearest num/den for positive BigInts (within one ulp: the quotient is truncated to at
 * least 64 significant bits before the final, correctly rounded conversion).
 */
export function ratioOfBigInts(num: bigint, den: bigint): number {
  if (num === 0n) return 0;
  const shift = Math.max(0, 64 - (num.toString(2).length - den.toString(2).length));
  const q = (num << BigInt(shift)) / den;
  return Number(q) / 2 ** shift;
}
