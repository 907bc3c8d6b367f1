/**
 * A piecewise polynomial in the code for IEC 60751 RTD channels, each piece checked against the
 * exact composition at every code it serves before it serves any.
 *
 * The map. An RTD channel's value is T(x) = unit(t(R(x))): R(x) = (ra·x + rb)/(rc·x + rd) the
 * element's resistance (a Möbius function of the code, fitted and checked by the channel), t the
 * inverse of the Callendar–Van Dusen curve, `unit` °C, K or °F. "Exact" below means that
 * composition evaluated in real arithmetic with the channel's double coefficients; the scalar
 * path evaluates it in binary64 stage by stage, and the cancellation in R/R0 − 1 costs it up to
 * about 8 ulp of the value above 100 °C, 35 ulp between 10 and 100 °C and more near 0 °C
 * (measured against decimal.js at 50 digits on 20 000 codes of the benchmark's Pt100 channel).
 *
 * Pieces. The valid integer codes [lowI, highI] are cut into segments of W = 2^k codes (about a
 * thousand segments over a 24-bit range). On a segment with centre c, the value is
 * p(x) = T(c) + d·q(d), d = x − c, with T(c) held as a double-double (hi + lo) and q of degree 5
 * interpolating (T(c + d) − T(c))/d at the six Chebyshev nodes of the segment (values in
 * double-double); the powers of 2/W that scale d are exact. The loop evaluates
 * hi + (lo + d·q(d)), q by Estrin's scheme — no division, no square root.
 *
 * The bound, and how it is established. A segment is used only after every code of it has been
 * found convertible by the scalar path (valid code, resistance inside the curve's range) and its
 * polynomial value compared with the exact composition, computed in double-double (one Newton step
 * with a double-double residual from the polynomial's own value: error below 1e-25 of the value),
 * and found within 1 ulp of the exact value — of 1 in the channel's unit (2.2e-16) for values
 * below 1 in magnitude, where the scalar path itself is off by about 3e-14 °C. The check is
 * exhaustive, not a sampled or derivative argument: it runs the first time a conversion meets a
 * code of the segment (tens of ns per code: a few ms per segment of 16 384 codes, a whole 24-bit
 * range 0.3–1.5 s, once per channel and temperature); until then, and for good when the check
 * fails, the segment's codes take the exact scalar loop. It fails on a handful of segments near 0
 * and ±1 in the output unit (rounding of the d·q term close to 1 ulp) and on segments with a code
 * the scalar path refuses. The result is therefore within 1 ulp of the exact composition (as
 * above), and within 1 ulp plus the scalar path's own error of the scalar path.
 */

import { cvdSamples, type CallendarVanDusenKernel } from './curveKernels.js';
import type { Codes, RejectTally } from './kernel.js';
import { WASM_BLOCK, WASM_CHUNK, type RtdPolynomialWasm } from './wasm/rtdPolynomialLoop.js';

/** Binary logarithm of the most segments a channel gets. */
const SEGMENT_BITS = 10;
/** The widest segment checked code by code (a 26-bit converter); wider ranges keep the exact loop. */
const MAX_SEGMENT_BITS = 16;
/** Doubles per segment in the table: hi, lo, b0…b5. */
export const STRIDE = 8;
/** Chebyshev nodes of the quotient's interpolation (degree 5; an even count keeps the centre, where the quotient is 0/0, off the nodes). */
const NODES = 6;
const SPLITTER = 134217729; // 2^27 + 1
const ZERO_CELSIUS_KELVIN = 273.15;
/** Below this magnitude (in the channel's unit) the bound is 1 ulp of 1: 2.2e-16. */
const FLOOR = 1;

/** Segment states. */
const UNCHECKED = 0;
const CHECKED = 1;
const EXACT_PATH = 2;

/** The table of an RTD channel's piecewise polynomial (filled segment by segment, on first use). */
export interface RtdPolynomial {
  /** First code of segment 0 (lowI). */
  readonly base: number;
  /** Binary logarithm of the segment width. */
  readonly shift: number;
  /** Segment width − 1 (mask of the offset in a segment). */
  readonly offsetMask: number;
  /** Half the segment width (the centre's offset). */
  readonly half: number;
  /** Table slots − 1 (a power of two minus one; slots beyond the segments hold NaN). */
  readonly slotMask: number;
  /** Number of segments. */
  readonly segments: number;
  /** STRIDE doubles per slot; NaN in slot·STRIDE until the segment is checked, and for good if it fails. */
  readonly table: Float64Array;
  /** Per segment: 0 unchecked, 1 checked (polynomial), 2 the exact loop. */
  readonly states: Uint8Array;
  /** Lowest and highest valid integer codes. */
  readonly lowI: number;
  /** Highest valid integer code. */
  readonly highI: number;
  /** A value in the channel's unit back in °C (binary64; a start for {@link RtdPolynomial.exactPair}). */
  readonly toCelsius: (v: number) => number;
  /** Segments checked so far (1) and sent to the exact loop (2), for tests and the benchmark. */
  readonly counts: { checked: number; exact: number };
  /**
   * The exact value at code `x` in double-double, written into `pair`: one Newton step with a
   * double-double residual from `startCelsius` (a value within a few ulp; NaN to compute one).
   */
  readonly exactPair: (x: number, startCelsius: number, pair: Float64Array) => void;
}

/** What the polynomial needs of a Callendar–Van Dusen kernel (its fields, same meanings). */
export type RtdPolynomialSource = Pick<
  CallendarVanDusenKernel,
  'ra' | 'rb' | 'rc' | 'rd' | 'lo' | 'hi' | 'r0Ohms' | 'a' | 'b' | 'c' | 'minOhms' | 'maxOhms' | 'unit'
>;

// Double-double arithmetic without fused multiply-add (Dekker, Knuth); results in H + L.
let H = 0;
let L = 0;

function twoProd(a: number, b: number): void {
  const p = a * b;
  const ca = SPLITTER * a;
  const ah = ca - (ca - a);
  const al = a - ah;
  const cb = SPLITTER * b;
  const bh = cb - (cb - b);
  const bl = b - bh;
  H = p;
  L = ah * bh - p + ah * bl + al * bh + al * bl;
}

/** Dekker's split of a double into two halves of 26 bits. */
function halves(a: number): [number, number] {
  const t = SPLITTER * a;
  const hi = t - (t - a);
  return [hi, a - hi];
}

function renormalize(s: number, e: number): void {
  H = s + e;
  L = e - (H - s);
}

function ddAdd(xh: number, xl: number, yh: number, yl: number): void {
  const s = xh + yh;
  const bb = s - xh;
  const e = xh - (s - bb) + (yh - bb) + (xl + yl);
  renormalize(s, e);
}

function ddMulD(xh: number, xl: number, y: number): void {
  twoProd(xh, y);
  renormalize(H, L + xl * y);
}

/**
 * The piecewise polynomial of an RTD channel, or undefined when the codes are too many to check
 * code by code (segments wider than 2^16 codes) or too few (under 256). At most 1024 segments
 * (2^SEGMENT_BITS), so at most 1024 slots; `storage`, when given and long enough, holds the table.
 */
export function createRtdPolynomial(
  k: RtdPolynomialSource,
  storage?: Float64Array,
): RtdPolynomial | undefined {
  const lowI = Math.floor(k.lo) + 1;
  const highI = Math.ceil(k.hi) - 1;
  const span = highI - lowI + 1;
  if (!(span >= 2 ** 8) || Math.abs(lowI) > 2 ** 30 || Math.abs(highI) > 2 ** 30) return undefined;
  const shift = Math.max(4, Math.ceil(Math.log2(span)) - SEGMENT_BITS);
  if (shift > MAX_SEGMENT_BITS) return undefined;
  const width = 2 ** shift;
  const segments = Math.ceil(span / width);
  const slots = 2 ** Math.ceil(Math.log2(segments));
  // The table: in `storage` when given (the WebAssembly loop's memory, 1024 slots), else its own.
  const table = (
    storage !== undefined && storage.length >= slots * STRIDE
      ? storage.subarray(0, slots * STRIDE)
      : new Float64Array(slots * STRIDE)
  ).fill(Number.NaN);
  const { ra, rb, rc, rd, r0Ohms, a, b, c, unit } = k;
  // x' = R/R0 − 1 = N/D with N = (ra − R0·rc)·x + (rb − R0·rd) and D = R0·rc·x + R0·rd, in double-double.
  twoProd(r0Ohms, rc);
  const [drh, drl] = [H, L];
  twoProd(r0Ohms, rd);
  const [ddh, ddl] = [H, L];
  ddAdd(ra, 0, -drh, -drl);
  const [nph, npl] = [H, L];
  ddAdd(rb, 0, -ddh, -ddl);
  const [nqh, nql] = [H, L];
  const b2 = 2 * b;

  /** The binary64 start: t from x' (the quadratic's root, then Newton on the quartic below 0 °C). */
  function start(target: number): number {
    const disc = a * a + 4 * b * target;
    let t = disc >= 0 ? (2 * target) / (a + Math.sqrt(disc)) : target / a;
    if (target < 0) {
      for (let i = 0; i < 4; i++) {
        const f = t * (a + t * (b + t * (c * (t - 100)))) - target;
        t -= f / (a + t * (b2 + t * (c * (4 * t - 300))));
      }
    }
    return t;
  }

  // Dekker's halves of the constant factors.
  const [nph1, nph2] = halves(nph);
  const [drh1, drh2] = halves(drh);
  const [a1, a2] = halves(a);
  const [b1, b2h] = halves(b);
  const [c1, c2] = halves(c);

  function exactPair(x: number, startCelsius: number, pair: Float64Array): void {
    // Everything inline, in locals: Dekker's product and Knuth's sum (no fused multiply-add).
    let t = SPLITTER * x;
    const x1 = t - (t - x);
    const x2 = x - x1;
    // N = np·x + nq.
    let p = nph * x;
    let e = nph1 * x1 - p + nph1 * x2 + nph2 * x1 + nph2 * x2 + npl * x;
    let s = p + nqh;
    let v = s - p;
    e += p - (s - v) + (nqh - v) + nql;
    const nh = s + e;
    const nl = e - (nh - s);
    // D = dr·x + dd.
    p = drh * x;
    e = drh1 * x1 - p + drh1 * x2 + drh2 * x1 + drh2 * x2 + drl * x;
    s = p + ddh;
    v = s - p;
    e += p - (s - v) + (ddh - v) + ddl;
    const dh = s + e;
    const dl = e - (dh - s);
    const target = nh / dh;
    const t0 = startCelsius === startCelsius ? startCelsius : start(target);
    t = SPLITTER * t0;
    const t1 = t - (t - t0);
    const t2 = t0 - t1;
    // t0² = qh + ql.
    const qh = t0 * t0;
    const ql = t1 * t1 - qh + 2 * t1 * t2 + t2 * t2;
    t = SPLITTER * qh;
    const q1 = t - (t - qh);
    const q2 = qh - q1;
    // A·t0 and B·t0².
    const ah = a * t0;
    const ae = a1 * t1 - ah + a1 * t2 + a2 * t1 + a2 * t2;
    const bh = b * qh;
    const be = b1 * q1 - bh + b1 * q2 + b2h * q1 + b2h * q2 + b * ql;
    s = ah + bh;
    v = s - ah;
    let gl = ae + be + (ah - (s - v) + (bh - v));
    let gh = s;
    let slope = a + b2 * t0;
    if (target < 0) {
      // C·(t0 − 100)·t0³: t0³ = ch + cl, t0 − 100 = u + ue, then the products.
      const ch = qh * t0;
      const cl = q1 * t1 - ch + q1 * t2 + q2 * t1 + q2 * t2 + ql * t0;
      const u = t0 - 100;
      v = u - t0;
      const ue = t0 - (u - v) + (-100 - v);
      t = SPLITTER * ch;
      const c1h = t - (t - ch);
      const c2h = ch - c1h;
      t = SPLITTER * u;
      const u1 = t - (t - u);
      const u2 = u - u1;
      const mh = ch * u;
      const me = c1h * u1 - mh + c1h * u2 + c2h * u1 + c2h * u2 + (ch * ue + cl * u);
      t = SPLITTER * mh;
      const m1 = t - (t - mh);
      const m2 = mh - m1;
      const kh = mh * c;
      const ke = m1 * c1 - kh + m1 * c2 + m2 * c1 + m2 * c2 + me * c;
      s = gh + kh;
      v = s - gh;
      gl += ke + (gh - (s - v) + (kh - v));
      gh = s;
      slope = a + t0 * (b2 + t0 * (c * (4 * t0 - 300)));
    }
    // Residual D·g − N (g = gh + gl), then one Newton step.
    t = SPLITTER * dh;
    const d1 = t - (t - dh);
    const d2 = dh - d1;
    t = SPLITTER * gh;
    const g1 = t - (t - gh);
    const g2 = gh - g1;
    const rh = dh * gh;
    const re = d1 * g1 - rh + d1 * g2 + d2 * g1 + d2 * g2 + (dh * gl + dl * gh);
    s = rh - nh;
    v = s - rh;
    const residual = s + (rh - (s - v) + (-nh - v) + (re - nl));
    const delta = residual / (dh * slope);
    // t = t0 − δ as a double-double.
    const th = t0 - delta;
    const tl = t0 - th - delta;
    if (unit === 0) {
      pair[0] = th;
      pair[1] = tl;
    } else if (unit === 1) {
      ddAdd(th, tl, ZERO_CELSIUS_KELVIN, 0);
      pair[0] = H;
      pair[1] = L;
    } else {
      ddMulD(th, tl, 9);
      const f1 = H / 5;
      const mh = H;
      const ml = L;
      twoProd(f1, 5);
      const f2 = (mh - H - L + ml) / 5;
      ddAdd(f1, f2, 32, 0);
      pair[0] = H;
      pair[1] = L;
    }
  }

  return {
    base: lowI,
    shift,
    offsetMask: width - 1,
    half: width / 2,
    slotMask: slots - 1,
    segments,
    table,
    states: new Uint8Array(segments),
    lowI,
    highI,
    counts: { checked: 0, exact: 0 },
    toCelsius:
      unit === 0
        ? (v: number) => v
        : unit === 1
          ? (v: number) => v - ZERO_CELSIUS_KELVIN
          : (v: number) => ((v - 32) * 5) / 9,
    exactPair,
  };
}

const pair = new Float64Array(2);
const nodeValues = new Float64Array(NODES);

/**
 * Fits and checks segment `s` of `p` (see the module's remarks); returns its new state.
 * `convertible(x)` is the scalar path's acceptance of an integer code.
 */
export function checkSegment(p: RtdPolynomial, s: number, convertible: (x: number) => boolean): number {
  const { states, table } = p;
  if (states[s] !== UNCHECKED) return states[s] as number;
  const width = p.offsetMask + 1;
  const first = p.base + s * width;
  // The last segment may reach past the valid codes: those are never served (the range test).
  const last = Math.min(first + width - 1, p.highI);
  const centre = first + p.half;
  let ok = true;
  let b0 = 0;
  let b1 = 0;
  let b2 = 0;
  let b3 = 0;
  let b4 = 0;
  let b5 = 0;
  let ch = 0;
  let cl = 0;
  if (ok) {
    p.exactPair(centre, Number.NaN, pair);
    ch = pair[0] as number;
    cl = pair[1] as number;
    // (T(c + d) − T(c))/d at the Chebyshev nodes d = (W/2)·u_j, then its Chebyshev coefficients.
    const r = p.half;
    for (let j = 0; j < NODES; j++) {
      const u = Math.cos((Math.PI * (j + 0.5)) / NODES);
      // The node as a double, and its exact offset from the centre.
      const node = centre + r * u;
      const d = node - centre;
      p.exactPair(node, Number.NaN, pair);
      nodeValues[j] = ((pair[0] as number) - ch + ((pair[1] as number) - cl)) / d;
    }
    const cheb = [0, 0, 0, 0, 0, 0];
    for (let m = 0; m < NODES; m++) {
      let sum = 0;
      for (let j = 0; j < NODES; j++)
        sum += (nodeValues[j] as number) * Math.cos((Math.PI * m * (j + 0.5)) / NODES);
      cheb[m] = ((m === 0 ? 1 : 2) * sum) / NODES;
    }
    const [a0, a1, a2, a3, a4, a5] = cheb as [number, number, number, number, number, number];
    // Monomials of u = d/r (T2 = 2u² − 1, T3 = 4u³ − 3u, T4 = 8u⁴ − 8u² + 1, T5 = 16u⁵ − 20u³ + 5u),
    // then the powers of 1/r (exact: r is a power of two).
    const ir = 1 / r;
    b0 = a0 - a2 + a4;
    b1 = (a1 - 3 * a3 + 5 * a5) * ir;
    b2 = (2 * a2 - 8 * a4) * ir * ir;
    b3 = (4 * a3 - 20 * a5) * ir * ir * ir;
    b4 = 8 * a4 * ir * ir * ir * ir;
    b5 = 16 * a5 * ir * ir * ir * ir * ir;
    // Every code: convertible, and within 1 ulp of its exact value, or of 1 in the channel's unit
    // for values below 1 in magnitude (see the module's remarks). T is monotone in the code, so
    // the smallest |T| over the segment is at an end, or 0 if the ends differ in sign.
    p.exactPair(first, Number.NaN, pair);
    const t1 = pair[0] as number;
    p.exactPair(last, Number.NaN, pair);
    const t2 = pair[0] as number;
    const smallest = t1 * t2 <= 0 ? 0 : Math.min(Math.abs(t1), Math.abs(t2));
    ok = Number.isFinite(t1) && Number.isFinite(t2) && Number.isFinite(ch);
    // ulp(max(smallest, 1)), doubled from the next power of two up (values past a second power of
    // two keep the doubled figure, which is then the smaller one: the test stays conservative).
    const tolerance = ok ? ulpOf(Math.max(smallest, FLOOR)) : 0;
    const scratch = Float64Array.of(ch, cl, b0, b1, b2, b3, b4, b5);
    const binade = tolerance * 2 ** 53;
    const toCelsius = p.toCelsius;
    for (let x = first; ok && x <= last; x++) {
      if (!convertible(x)) {
        ok = false;
        break;
      }
      const d = x - centre;
      const v = segmentValue(scratch, 0, d);
      // The polynomial's own value is the Newton step's start (see the module's remarks).
      p.exactPair(x, toCelsius(v), pair);
      const err = v - (pair[0] as number) - (pair[1] as number);
      if (!(Math.abs(err) <= (Math.abs(pair[0] as number) >= binade ? 2 * tolerance : tolerance))) ok = false;
    }
  }
  if (ok) {
    const o = s * STRIDE;
    table[o + 1] = cl;
    table[o + 2] = b0;
    table[o + 3] = b1;
    table[o + 4] = b2;
    table[o + 5] = b3;
    table[o + 6] = b4;
    table[o + 7] = b5;
    table[o] = ch;
    states[s] = CHECKED;
    p.counts.checked++;
  } else {
    states[s] = EXACT_PATH;
    p.counts.exact++;
  }
  return states[s] as number;
}

/**
 * A segment's value at offset d from its centre, from its STRIDE doubles at `table[j]`: the
 * quotient by Estrin's scheme (a short chain of dependent operations), then hi + (lo + d·q). The
 * loops and the check evaluate this one expression, so the check covers what the loops compute.
 */
export function segmentValue(table: Float64Array, j: number, d: number): number {
  const d2 = d * d;
  const q =
    (table[j + 2] as number) +
    d * (table[j + 3] as number) +
    d2 *
      ((table[j + 4] as number) +
        d * (table[j + 5] as number) +
        d2 * ((table[j + 6] as number) + d * (table[j + 7] as number)));
  return (table[j] as number) + ((table[j + 1] as number) + d * q);
}

/** The spacing of doubles at |v| (v normal, nonzero): 2^(⌊log₂|v|⌋ − 52). */
export function ulpOf(v: number): number {
  let e = Math.floor(Math.log2(Math.abs(v)));
  // log2 may round across a power of two: correct the exponent.
  if (2 ** e > Math.abs(v)) e--;
  else if (2 ** (e + 1) <= Math.abs(v)) e++;
  return 2 ** (e - 52);
}

/** Segment state values (for the loops). */
export const SEGMENT = { UNCHECKED, CHECKED, EXACT_PATH } as const;

/** A channel's polynomial with what its conversion needs besides: the exact loop, and the scalar path's acceptance of a code. */
export interface RtdPolynomialPath {
  /** The exact loop's kernel (./curveKernels.ts): codes the polynomial does not serve. */
  readonly kernel: CallendarVanDusenKernel;
  /** The polynomial, or undefined (the codes are too many or too few: every code takes the exact loop). */
  readonly polynomial: RtdPolynomial | undefined;
  /** Whether the scalar path converts integer code x (valid, its resistance inside the curve's range). */
  readonly convertible: (x: number) => boolean;
  /** The WebAssembly loop whose memory holds the polynomial's table, or undefined (the JavaScript loop). */
  readonly wasm: RtdPolynomialWasm | undefined;
}

/** Samples per block of the Int32 loop (the range and finiteness tests are folded per block). */
const BLOCK = 256;

/**
 * Converts `codes[0…count−1]` into `out` through a channel's polynomial: contiguous Int32 codes
 * by blocks ({@link polynomialInt32}), Float64 codes (fractional, or in place) one at a time; the
 * exact loop of ./curveKernels.ts for the rest, and for every code when there is no polynomial.
 */
export function convertRtdPolynomial(
  codes: Codes,
  out: Float64Array,
  prepared: RtdPolynomialPath,
  tally: RejectTally,
  count: number,
): void {
  const p = prepared.polynomial;
  if (p === undefined) cvdSamples(codes, out, prepared.kernel, tally, 0, 1, count, 0, 1);
  else if (codes instanceof Int32Array) {
    if (prepared.wasm !== undefined && prepared.wasm.table.buffer === p.table.buffer)
      wasmInt32(codes, out, prepared, p, prepared.wasm, tally, count);
    else polynomialInt32(codes, out, prepared, p, tally, count);
  } else polynomialSamples(codes, out, prepared, p, tally, 0, count);
}

/**
 * Contiguous Int32 codes through the WebAssembly loop (./wasm/rtdPolynomial.wat), in chunks of
 * 16 384 copied into the module's memory and back: the same expression as {@link polynomialInt32}
 * bit for bit, the same per-block tests (the module marks a block with a code outside the valid
 * ones or a value that is not finite), and a marked block converted again sample by sample.
 */
function wasmInt32(
  codes: Int32Array,
  out: Float64Array,
  prepared: RtdPolynomialPath,
  p: RtdPolynomial,
  w: RtdPolynomialWasm,
  tally: RejectTally,
  count: number,
): void {
  const { base, shift, offsetMask, half, slotMask, lowI, highI } = p;
  for (let s = 0; s < count; s += WASM_CHUNK) {
    const n = count - s > WASM_CHUNK ? WASM_CHUNK : count - s;
    w.codes.set(codes.subarray(s, s + n));
    const marked = w.run(n, base, shift, offsetMask, half, slotMask, lowI, highI);
    out.set(n === WASM_CHUNK ? w.values : w.values.subarray(0, n), s);
    if (marked === 0) continue;
    for (let b = 0, o = 0; o < n; b++, o += WASM_BLOCK) {
      if (w.marks[b] !== 0)
        revisitInt32(codes, out, prepared, p, tally, s + o, n - o > WASM_BLOCK ? WASM_BLOCK : n - o);
    }
  }
}

/**
 * Contiguous Int32 codes (never sharing memory with `out`: the arguments' check refuses it):
 * blocks of 256, the range test `(x − lowI) | (highI − x)` and the finiteness of the values folded
 * per block (a segment not checked yet, or sent to the exact loop, holds NaN in its table slot, so
 * its samples fail the block's test); a failed block is revisited ({@link revisitInt32}).
 */
function polynomialInt32(
  codes: Int32Array,
  out: Float64Array,
  prepared: RtdPolynomialPath,
  p: RtdPolynomial,
  tally: RejectTally,
  count: number,
): void {
  const { table, base, shift, offsetMask, half, slotMask, lowI, highI } = p;
  // Slot offset j = segment·STRIDE in one shift and mask (STRIDE = 8); valid codes give r ≥ 0.
  const s3 = shift - 3;
  const jm = slotMask << 3;
  for (let i0 = 0; i0 < count; i0 += BLOCK) {
    const n = count - i0 > BLOCK ? BLOCK : count - i0;
    let flags = 0;
    let finite = 0;
    for (let m = i0, end = i0 + n; m < end; m++) {
      const x = codes[m] as number;
      const r = (x - base) | 0;
      const j = (r >> s3) & jm;
      const d = (r & offsetMask) - half;
      // segmentValue's expression, with the eight coefficients read first.
      const c0 = table[j] as number;
      const c1 = table[j + 1] as number;
      const c2 = table[j + 2] as number;
      const c3 = table[j + 3] as number;
      const c4 = table[j + 4] as number;
      const c5 = table[j + 5] as number;
      const c6 = table[j + 6] as number;
      const c7 = table[j + 7] as number;
      const d2 = d * d;
      const v = c0 + (c1 + d * (c2 + d * c3 + d2 * (c4 + d * c5 + d2 * (c6 + d * c7))));
      out[m] = v;
      finite += v - v;
      flags |= (x - lowI) | (highI - x);
    }
    if (flags < 0 || finite !== 0) revisitInt32(codes, out, prepared, p, tally, i0, n);
  }
}

/**
 * A block of contiguous Int32 codes that failed its test, after the loop wrote every sample (the
 * codes never share memory with `out`): a valid code whose value is a number was served by a
 * checked segment (a slot not checked yet, or sent to the exact loop, holds NaN, and so gives NaN)
 * and stands; every other sample is converted again as {@link polynomialSamples} does (its segment
 * checked now if met for the first time, else the exact loop, which converts or rejects it).
 */
function revisitInt32(
  codes: Int32Array,
  out: Float64Array,
  prepared: RtdPolynomialPath,
  p: RtdPolynomial,
  tally: RejectTally,
  start: number,
  count: number,
): void {
  const { lowI, highI } = p;
  for (let i = start, end = start + count; i < end; i++) {
    const x = codes[i] as number;
    const v = out[i] as number;
    if (x >= lowI && x <= highI && v === v) continue;
    polynomialSamples(codes, out, prepared, p, tally, i, 1);
  }
}

/**
 * Codes one at a time, reading each before its output is written (in place is safe): an integer
 * code of a checked segment takes the polynomial (a segment met for the first time is checked
 * now); any other code, the exact loop, which converts or rejects it as `channel.convert` does.
 */
function polynomialSamples(
  codes: Codes,
  out: Float64Array,
  prepared: RtdPolynomialPath,
  p: RtdPolynomial,
  tally: RejectTally,
  start: number,
  count: number,
): void {
  const { table, base, shift, offsetMask, half, states, lowI, highI } = p;
  for (let i = start, end = start + count; i < end; i++) {
    const x = codes[i] as number;
    if (x >= lowI && x <= highI && Math.floor(x) === x) {
      const s = (x - base) >>> shift;
      const state = states[s] === SEGMENT.UNCHECKED ? checkSegment(p, s, prepared.convertible) : states[s];
      if (state === SEGMENT.CHECKED) {
        out[i] = segmentValue(table, s * STRIDE, ((x - base) & offsetMask) - half);
        continue;
      }
    }
    cvdSamples(codes, out, prepared.kernel, tally, i, 1, 1, i, 1);
  }
}
