/**
 * Ascending sort of a Float64Array by least-significant-digit radix sort on the bits of the
 * doubles (six passes of 11, 11, 10, 11, 11 and 10 bits; a pass whose digit is the same for
 * every value is skipped). Linear time and about twice as fast as the built-in sort for the
 * coverage-interval tails. The order is the built-in sort's: −0 before +0; no NaN allowed.
 *
 * A double's bits become an unsigned key that sorts like the number: flip the sign bit of a
 * positive value, every bit of a negative one.
 */

const littleEndian = new Uint32Array(new Float64Array([1]).buffer)[1] === 0x3ff00000;
const HI = littleEndian ? 1 : 0;
const LO = littleEndian ? 0 : 1;
const SHIFTS = [0, 11, 22, 0, 11, 22] as const;
const WIDTHS = [11, 11, 10, 11, 11, 10] as const;

let keyHi = new Uint32Array(0);
let keyLo = new Uint32Array(0);
let auxHi = new Uint32Array(0);
let auxLo = new Uint32Array(0);
const counts = new Int32Array(2048);

/** Sorts `a` in place (ascending). */
export function radixSortInPlace(a: Float64Array): void {
  const n = a.length;
  if (n < 2) return;
  if (keyHi.length < n) {
    keyHi = new Uint32Array(n);
    keyLo = new Uint32Array(n);
    auxHi = new Uint32Array(n);
    auxLo = new Uint32Array(n);
  }
  const words = new Uint32Array(a.buffer, a.byteOffset, 2 * n);
  let hi = keyHi;
  let lo = keyLo;
  let hi2 = auxHi;
  let lo2 = auxLo;
  for (let i = 0; i < n; i++) {
    const h = words[2 * i + HI] as number;
    const mask = h >> 31; // −1 for a negative double
    hi[i] = (h ^ (mask | 0x80000000)) >>> 0;
    lo[i] = ((words[2 * i + LO] as number) ^ mask) >>> 0;
  }
  for (let pass = 0; pass < 6; pass++) {
    const shift = SHIFTS[pass] as number;
    const size = 1 << (WIDTHS[pass] as number);
    const digitMask = size - 1;
    const source = pass < 3 ? lo : hi;
    counts.fill(0, 0, size);
    for (let i = 0; i < n; i++) {
      const d = ((source[i] as number) >>> shift) & digitMask;
      counts[d] = (counts[d] as number) + 1;
    }
    let trivial = false;
    let sum = 0;
    for (let b = 0; b < size; b++) {
      const c = counts[b] as number;
      if (c === n) trivial = true;
      counts[b] = sum;
      sum += c;
    }
    if (trivial) continue;
    for (let i = 0; i < n; i++) {
      const d = ((source[i] as number) >>> shift) & digitMask;
      const at = counts[d] as number;
      counts[d] = at + 1;
      hi2[at] = hi[i] as number;
      lo2[at] = lo[i] as number;
    }
    const th = hi;
    hi = hi2;
    hi2 = th;
    const tl = lo;
    lo = lo2;
    lo2 = tl;
  }
  for (let i = 0; i < n; i++) {
    const h = hi[i] as number;
    const mask = (h >>> 31) - 1; // 0 for a positive double (sign bit set in the key), −1 else
    words[2 * i + HI] = (h ^ (mask | 0x80000000)) >>> 0;
    words[2 * i + LO] = ((lo[i] as number) ^ mask) >>> 0;
  }
}
