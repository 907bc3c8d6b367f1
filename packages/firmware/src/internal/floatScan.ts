/**
 * Error scans of a float map: the emulated firmware result against a reference evaluation of the
 * exact map P(t) = Σ a_k t^k, t = code − offset.
 *
 * float32 maps: the reference is Horner's rule in binary64 on the coefficients and offset rounded
 * to binary64; its a priori error (about 2^−50 of the map's magnitude, floatBounds.ts) is added to
 * the largest error found, which it inflates by some 10^−8 relative.
 *
 * float64 maps: the reference runs in double-double. Every a_k and the offset are unevaluated
 * sums hi + lo of two doubles (the exact rational rounded to nearest, then the remainder rounded to
 * nearest); t is formed with Knuth's TwoSum; Horner's rule uses Dekker's product (Veltkamp
 * splitting) and the accurate double-double sum. Each double-double operation has a relative
 * error below 2^−100 (the published bounds are about 3u² to 7u² with u = 2^−53: Joldes, Muller and
 * Popescu, "Tight and rigorous error bounds for basic building blocks of double-word arithmetic",
 * ACM TOMS 44(2), 2017 — from memory; the factor of 16 or more is margin). Its a priori error,
 * some 10^−29 of the map's magnitude, is added likewise.
 */
import { twoProduct } from '@bridgework/core';
import type { FloatProgram } from './floatEval.js';

/** The exact map in double-double form. */
export interface ReferenceMap {
  readonly offsetHi: number;
  readonly offsetLo: number;
  /** Ascending coefficients. */
  readonly hi: readonly number[];
  readonly lo: readonly number[];
}

export interface FloatScanResult {
  /** Largest |ŷ − P| measured (before the reference bound is added) and its code. */
  maxError: number;
  maxCode: number;
  count: number;
  /** A non-finite result was met at this code (overflow), or undefined. */
  nonFiniteCode: number | undefined;
}

/**
 * Scans the codes codeMin…codeMax (exhaustive) or the listed codes (sampled). Stops at the first
 * non-finite result.
 */
export function scanFloat(
  program: FloatProgram,
  ref: ReferenceMap,
  codes: { readonly codeMin: number; readonly codeMax: number } | readonly number[],
): FloatScanResult {
  const list = Array.isArray(codes) ? (codes as readonly number[]) : undefined;
  const first = list === undefined ? (codes as { codeMin: number }).codeMin : 0;
  const count = list === undefined ? (codes as { codeMax: number }).codeMax - first + 1 : list.length;
  // Booleans rather than function values: V8 keeps every variant fast in this one loop.
  const f32 = program.precision === 'float32';
  const dd = !f32;
  const off = program.offset;
  const c = program.coefficients;
  const n = c.length - 1;
  const affine = program.kind === 'affine';
  const scale = c[0] as number;
  const hi = ref.hi;
  const lo = ref.lo;
  const rn = hi.length - 1;
  const minusOffset = -ref.offsetHi;
  const offsetLo = ref.offsetLo;
  let maxError = -Infinity;
  let maxCode = 0;
  for (let i = 0; i < count; i++) {
    const code = list === undefined ? first + i : (list[i] as number);
    // The firmware's evaluation, operation for operation (floatEval.ts).
    const xc = f32 ? Math.fround(code) : code;
    const x = f32 ? Math.fround(xc - off) : xc - off;
    let y: number;
    if (affine) {
      y = f32 ? Math.fround(x * scale) : x * scale;
    } else {
      y = c[n] as number;
      for (let k = n - 1; k >= 0; k--) {
        const p = f32 ? Math.fround(y * x) : y * x;
        y = f32 ? Math.fround(p + (c[k] as number)) : p + (c[k] as number);
      }
    }
    // The reference: t = code − offset, then Horner.
    let th = code + minusOffset;
    let rh = hi[rn] as number;
    let rl = 0;
    if (!dd) {
      for (let k = rn - 1; k >= 0; k--) rh = rh * th + (hi[k] as number);
    } else {
      let bv = th - code;
      let tl = code - (th - bv) + (minusOffset - bv) - offsetLo;
      let s = th + tl; // renormalise with a full TwoSum: |tl| may exceed |th| when code ≈ offset
      bv = s - th;
      tl = th - (s - bv) + (tl - bv);
      th = s;
      rl = lo[rn] as number;
      for (let k = rn - 1; k >= 0; k--) {
        // (rh + rl)·(th + tl): Dekker's product of the high parts (core's twoProduct; V8 removes the
        // pair's allocation) plus the cross terms.
        const [p, pe] = twoProduct(rh, th);
        const cross = pe + (rh * tl + rl * th);
        let mh = p + cross;
        let ml = cross - (mh - p);
        // (mh + ml) + (ch + cl): the accurate double-double sum.
        const ch = hi[k] as number;
        const cl = lo[k] as number;
        s = mh + ch;
        bv = s - mh;
        let e = mh - (s - bv) + (ch - bv);
        const v = ml + cl;
        bv = v - ml;
        const f = ml - (v - bv) + (cl - bv);
        e += v;
        mh = s + e;
        ml = e - (mh - s);
        ml += f;
        rh = mh + ml;
        rl = ml - (rh - mh);
      }
    }
    const e = Math.abs(y - rh - rl);
    if (!(e <= Number.MAX_VALUE)) {
      return { maxError, maxCode, count: i, nonFiniteCode: code };
    }
    if (e > maxError) {
      maxError = e;
      maxCode = code;
    }
  }
  return { maxError, maxCode, count, nonFiniteCode: undefined };
}
