/**
 * Number text for CSV output, written straight into a byte buffer.
 *
 * Two forms, both exactly the text JavaScript gives, so a test can compare them character for
 * character with the language's own formatting:
 * - shortest round trip: `String(v)`, the shortest decimal that reads back as the same double;
 * - `digits` significant digits: `String(Number(v.toPrecision(digits)))`, the value correctly
 *   rounded to that many digits, written without trailing zeros.
 *
 * The second has a fast path in integer arithmetic (no string is made) for up to 15 digits, with
 * an exact check that sends every case it cannot decide to the language's own formatting.
 */

/** 10^0 … 10^22: every one is a double exactly (5^22 < 2^53). */
const POW10: readonly number[] = Array.from({ length: 23 }, (_, k) => 10 ** k);

/** Writes ASCII text; returns the new position. */
function writeAscii(text: string, buffer: Uint8Array, pos: number): number {
  for (let i = 0; i < text.length; i++) buffer[pos++] = text.charCodeAt(i);
  return pos;
}

/**
 * Writes the shortest round-trip text of `v` (`String(v)`; NaN as `NaN`, −0 as `0`).
 *
 * @param v - The value.
 * @param buffer - The output bytes (at least 25 free at `pos`).
 * @param pos - Where to write.
 * @returns The position after the text.
 */
export function writeShortest(v: number, buffer: Uint8Array, pos: number): number {
  return writeAscii(String(v), buffer, pos);
}

/** Scratch for the digits of one number. */
const digitScratch = new Uint8Array(24);

/**
 * Writes `v` correctly rounded to `digits` significant digits, in the text
 * `String(Number(v.toPrecision(digits)))` gives (no trailing zeros; exponent form below 1e-6 and
 * from 1e21 on).
 *
 * @remarks
 * Fast path (1–15 digits, decimal exponent of `v` within ±22 of the digits): with e the decimal
 * exponent of |v| and k = digits − 1 − e, the scaled value s = |v|·10^k is formed with one
 * correctly rounded operation (10^|k| is exact), so |s − |v|·10^k| ≤ ulp(s)/2. The digits are
 * round(|v|·10^k); s decides that rounding unless its fraction lies within ulp(s) of one half, and
 * those cases (and every value outside the fast path's range) go to `toPrecision`, which rounds
 * exactly. The integer's digits are then written with trailing zeros dropped and the decimal point
 * or exponent placed as ECMAScript's Number::toString places them.
 *
 * @param v - The value.
 * @param digits - Significant digits (integer in [1, 17]).
 * @param buffer - The output bytes (at least 25 free at `pos`).
 * @param pos - Where to write.
 * @returns The position after the text.
 */
export function writeDigits(v: number, digits: number, buffer: Uint8Array, pos: number): number {
  if (v !== v) return writeAscii('NaN', buffer, pos);
  if (v === 0) {
    buffer[pos] = 48;
    return pos + 1;
  }
  const a = v < 0 ? -v : v;
  if (digits > 15 || !(a >= 1e-300 && a < 1e300)) return slowDigits(v, digits, buffer, pos);
  // Decimal exponent e with 10^e <= a < 10^(e+1), up to one off (checked through m below).
  let e = Math.floor(Math.log10(a));
  const k = digits - 1 - e;
  if (k > 22 || k < -22) return slowDigits(v, digits, buffer, pos);
  const s = k >= 0 ? a * (POW10[k] as number) : a / (POW10[-k] as number);
  let m = Math.floor(s);
  // e one off (a next to a power of ten): m has one digit too many or too few; decide exactly instead.
  if (m >= (POW10[digits] as number) || m < (POW10[digits - 1] as number)) {
    return slowDigits(v, digits, buffer, pos);
  }
  const frac = s - m;
  // ulp(s) within a factor 2 (log2 may be off by one); the margin 2·ulp covers the error ulp(s)/2.
  const ulp = 2 ** (Math.floor(Math.log2(s)) - 52);
  if (Math.abs(frac - 0.5) <= 2 * ulp) return slowDigits(v, digits, buffer, pos);
  if (frac > 0.5) {
    m++;
    if (m === POW10[digits]) {
      m = POW10[digits - 1] as number;
      e++;
    }
  }
  // Digits of m, most significant first, trailing zeros dropped.
  let hi = Math.floor(m / 1e8);
  let lo = m - hi * 1e8;
  for (let i = 0; i < 8; i++) {
    digitScratch[15 - i] = lo % 10;
    lo = Math.floor(lo / 10);
  }
  for (let i = 8; i < 16; i++) {
    digitScratch[15 - i] = hi % 10;
    hi = Math.floor(hi / 10);
  }
  const first = 16 - digits;
  let last = 15;
  while (last > first && digitScratch[last] === 0) last--;
  const n = last - first + 1;
  if (v < 0) buffer[pos++] = 45;
  const point = e + 1; // ECMAScript's n: the decimal point sits after `point` digits
  if (n <= point && point <= 21) {
    for (let i = first; i <= last; i++) buffer[pos++] = 48 + (digitScratch[i] as number);
    for (let i = n; i < point; i++) buffer[pos++] = 48;
  } else if (0 < point && point <= 21) {
    for (let i = 0; i < n; i++) {
      if (i === point) buffer[pos++] = 46;
      buffer[pos++] = 48 + (digitScratch[first + i] as number);
    }
  } else if (-6 < point && point <= 0) {
    buffer[pos++] = 48;
    buffer[pos++] = 46;
    for (let i = point; i < 0; i++) buffer[pos++] = 48;
    for (let i = first; i <= last; i++) buffer[pos++] = 48 + (digitScratch[i] as number);
  } else {
    buffer[pos++] = 48 + (digitScratch[first] as number);
    if (n > 1) {
      buffer[pos++] = 46;
      for (let i = first + 1; i <= last; i++) buffer[pos++] = 48 + (digitScratch[i] as number);
    }
    buffer[pos++] = 101; // e
    const x = point - 1;
    buffer[pos++] = x < 0 ? 45 : 43;
    pos = writeAscii(String(x < 0 ? -x : x), buffer, pos);
  }
  return pos;
}

function slowDigits(v: number, digits: number, buffer: Uint8Array, pos: number): number {
  return writeAscii(String(Number(v.toPrecision(digits))), buffer, pos);
}
