/**
 * Number text for CSV output, written as ASCII bytes straight into a buffer, exactly.
 *
 * Two forms:
 * - shortest round trip ({@link writeShortest}): the text ECMAScript's `String(v)` gives, digit for
 *   digit — the fewest significant digits that read back as the same double, the closest such
 *   decimal to the double when several have that length, the even one on a tie;
 * - `digits` significant digits ({@link writeDigits}): the exact binary value correctly rounded to
 *   that many digits (ties to even, IEEE 754's default rounding), trailing zeros dropped. Up to 12
 *   digits, a short path decides first from one correctly rounded scaling by an exact power of
 *   ten (see digitsLean); what it cannot decide goes to the paths below.
 *
 * Both lay the digits out as Number::toString does (plain notation for decimal exponents from −7
 * to 20, else `d.ddde±x`), so a reader sees one format whichever is chosen.
 *
 * Method. A finite double is a = m·2^q with an integer m < 2^53. A fast path scales a by 10^j so
 * that t = a·10^j lies in [10^16, 10^17), with one double-double product (Dekker's exact product of
 * a and the leading part of a double-double 10^j, plus a times its trailing part): the relative
 * error of t is below 2^-103, so t is known within 2^-46 whatever a is. The integer part of t gives
 * 17 digits, and every decision (which way a digit rounds, whether a decimal lies within half a
 * unit in the last place of a) compares t with a threshold: the fast path decides only when t is
 * at least 2^-40 away from it, and otherwise (and for subnormal, huge or tiny values and exact
 * powers of two) defers to an exact path in BigInt arithmetic, which also serves as the reference
 * the fast path is tested against.
 *
 * Why three lengths suffice for the shortest form of a normal double: a decimal of at most 15
 * significant digits that reads back as a is a's correct rounding to 15 digits (Matula's theorem:
 * 10^15 < 2^52), so it is found by rounding to 15 digits and dropping the trailing zeros; failing
 * that, the closest 16-digit decimal (the correct rounding to 16 digits) is the answer if it reads
 * back as a, and 17 digits always do.
 */

const littleEndianHost = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;
const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);
const HI = littleEndianHost ? 1 : 0;
const LO = 1 - HI;

/** 2^27 + 1: Veltkamp's splitting constant for binary64. */
const SPLIT = 134_217_729;
/** How far (in units of t's last integer digit) t must be from a decision's threshold for the fast path to decide. */
const MARGIN = 2 ** -40;
/** log10(2). */
const LOG10_2 = 0.3010299956639812;

// Double-double powers of ten 10^j for j in [J_MIN, J_MAX]: hi + lo within 2^-105 relative of
// 10^j, and Veltkamp's split of hi, built on first use.
const J_MIN = -270;
const J_MAX = 310;
const powHi = new Float64Array(J_MAX - J_MIN + 1);
const powLo = new Float64Array(J_MAX - J_MIN + 1);
const powSplitHi = new Float64Array(J_MAX - J_MIN + 1);
const powSplitLo = new Float64Array(J_MAX - J_MIN + 1);
const powReady = new Uint8Array(J_MAX - J_MIN + 1);

/** 2^e as a BigInt, e ≥ 0. */
function bigPow2(e: number): bigint {
  return 1n << BigInt(e);
}
/** 10^e as a BigInt, e ≥ 0. */
function bigPow10(e: number): bigint {
  return 10n ** BigInt(e);
}

/** Mantissa and exponent of a positive finite double: a = m·2^q exactly, m < 2^53. */
function bigParts(a: number): { m: bigint; q: number; ebits: number; frac: bigint } {
  f64[0] = a;
  const hi = u32[HI] as number;
  const lo = u32[LO] as number;
  const ebits = (hi >>> 20) & 0x7ff;
  const frac = (BigInt(hi & 0xfffff) << 32n) | BigInt(lo);
  return ebits === 0
    ? { m: frac, q: -1074, ebits, frac }
    : { m: frac | (1n << 52n), q: ebits - 1075, ebits, frac };
}

function fillPow(j: number): void {
  const i = j - J_MIN;
  let hi: number;
  let lo: number;
  if (j >= 0) {
    const exact = bigPow10(j);
    hi = Number(exact); // round to nearest
    lo = Number(exact - BigInt(hi));
  } else {
    hi = Number(`1e${j}`); // correctly rounded
    // 10^j − hi = (2^-q − m·10^-j)·2^q / 10^-j, evaluated to 2^-119 of itself.
    const { m, q } = bigParts(hi);
    const s = bigPow10(-j);
    const num = bigPow2(-q) - m * s;
    lo = Number((num << 120n) / s) * 2 ** -120 * 2 ** q;
  }
  const c = SPLIT * hi;
  const sh = c - (c - hi);
  powHi[i] = hi;
  powLo[i] = lo;
  powSplitHi[i] = sh;
  powSplitLo[i] = hi - sh;
  powReady[i] = 1;
}

// The least double ≥ 10^k, for k in [CEIL_MIN, CEIL_MAX], built on first use (0: not yet). As a
// is a double, a ≥ 10^k exactly when a ≥ ceilPow10(k): one comparison gives the decimal exponent
// E of a from e = ⌊be·log10 2⌋ (E is e or e + 1, as 2^be ≤ a < 2^(be+1)).
const CEIL_MIN = -300;
const CEIL_MAX = 300;
const ceilTable = new Float64Array(CEIL_MAX - CEIL_MIN + 1);

/**
 * Per biased binary exponent (the double's 11 exponent bits), e = ⌊be·log10 2⌋ (be the unbiased
 * exponent), and ceilPow10(e + 1) once used (0: not yet): a normal double a with those bits has
 * the decimal exponent e + 1 when a ≥ it, else e — a table lookup and one comparison.
 */
const EXP_EST = Int16Array.from({ length: 2048 }, (_, ebits) => Math.floor((ebits - 1023) * LOG10_2));
const EXP_NEXT = new Float64Array(2048);

/** ceilPow10(EXP_EST[ebits] + 1), from the table once used (for ebits whose e + 1 is in range). */
function nextPow10(ebits: number): number {
  const c = EXP_NEXT[ebits] as number;
  return c !== 0 ? c : (EXP_NEXT[ebits] = ceilPow10((EXP_EST[ebits] as number) + 1));
}

/** The least double ≥ 10^k (CEIL_MIN ≤ k ≤ CEIL_MAX). */
function ceilPow10(k: number): number {
  const c = ceilTable[k - CEIL_MIN] as number;
  return c !== 0 ? c : fillCeil(k);
}

function fillCeil(k: number): number {
  let c = Number(`1e${k}`); // the nearest double, above or below 10^k
  const { m, q } = bigParts(c);
  // c < 10^k, compared as integers: m·2^q·2^z2·10^z10 against 10^k·2^z2·10^z10.
  const z2 = Math.max(0, -q);
  const z10 = Math.max(0, -k);
  if (m * bigPow2(q + z2) * bigPow10(z10) < bigPow2(z2) * bigPow10(k + z10)) {
    // The next double up (c is normal and positive: its bit pattern plus one).
    f64[0] = c;
    const lo = u32[LO] as number;
    if (lo === 0xffffffff) {
      u32[LO] = 0;
      u32[HI] = (u32[HI] as number) + 1;
    } else u32[LO] = lo + 1;
    c = f64[0] as number;
  }
  ceilTable[k - CEIL_MIN] = c;
  return c;
}

// Results of the fast decomposition, in typed arrays (module-level `let`s cost a check per use).
/** t's fraction F in [0, 1] (1 only by rounding; decisions keep MARGIN away), and W, half an ulp of a in units of t. */
const fastReal = new Float64Array(2);
/**
 * A and B, the 17-digit integer part of t as A·10^9 + B (10^7 ≤ A < 10^8, 0 ≤ B < 10^9); the
 * decimal exponent E (10^E ≤ a < 10^(E+1)); whether t is exact (10^j is a double: 0 ≤ j ≤ 22, so
 * F and ties are exact); whether a's mantissa is even (a decimal exactly half an ulp away reads
 * back as a).
 */
const fastInt = new Int32Array(5);
const F_ = 0;
const W_ = 1;
const A_ = 0;
const B_ = 1;
const E_ = 2;
const EXACT_ = 3;
const EVEN_ = 4;

/**
 * Scales a positive normal double a in the fast path's range into t = a·10^(16−E) in
 * [10^16, 10^17) and fills fastReal and fastInt. Returns false when a is outside the range (about
 * 1e-280 to 4e280) or an exact power of two (whose rounding interval is lopsided), so the exact
 * path must be used.
 */
function decompose(a: number): boolean {
  f64[0] = a;
  const hiw = u32[HI] as number;
  const ebits = hiw >>> 20; // a > 0: no sign bit
  if (ebits < 93 || ebits > 1953) return false;
  const low = u32[LO] as number;
  if ((hiw & 0xfffff) === 0 && low === 0) return false;
  const be = ebits - 1023;
  // The decimal exponent E: ⌊be·log10 2⌋ or one more (see ceilPow10).
  let e = EXP_EST[ebits] as number;
  if (a >= nextPow10(ebits)) e++;
  const i = 16 - e - J_MIN;
  if (powReady[i] === 0) fillPow(16 - e);
  const ph = powHi[i] as number;
  const c = SPLIT * a;
  const ah = c - (c - a);
  const al = a - ah;
  const bh = powSplitHi[i] as number;
  const bl = powSplitLo[i] as number;
  const p = a * ph;
  const err = ah * bh - p + ah * bl + al * bh + al * bl;
  const lo = err + a * (powLo[i] as number);
  // t = h + l, h = fl(t) in [10^16, 10^17] (a·10^(16−E) is in [10^16, 10^17); 10^17 by rounding).
  const h = p + lo;
  const l = lo - (h - p);
  // h > 2^53 is an integer and |l| ≤ 8: the integer part of t is h + floor(l).
  const hA = Math.floor(h / 1e9);
  const fl = Math.floor(l);
  // h − hA·1e9 is exact (hA·1e9 = (hA·5^9)·2^9 is a double, and so is the difference).
  let B = (h - hA * 1e9 + fl) | 0;
  let A = hA | 0;
  if (B < 0) {
    B += 1_000_000_000;
    A--;
  } else if (B >= 1_000_000_000) {
    B -= 1_000_000_000;
    A++;
  }
  // Outside [10^16, 10^17) only within t's error of 10^17: the exact path decides.
  if (A < 10_000_000 || A >= 100_000_000) return false;
  fastInt[A_] = A;
  fastInt[B_] = B;
  fastInt[E_] = e;
  fastInt[EXACT_] = powLo[i] === 0 ? 1 : 0;
  fastInt[EVEN_] = (low & 1) === 0 ? 1 : 0;
  fastReal[F_] = l - fl;
  // Half an ulp of a in units of t: 2^(be−53)·10^(16−e).
  fastReal[W_] = ph * (POW2[be - 53 - POW2_MIN] as number);
  return true;
}

/** 2^k for k in [POW2_MIN, POW2_MAX] (the half-ulps of the fast path's range). */
const POW2_MIN = -1000;
const POW2_MAX = 1000;
const POW2 = new Float64Array(POW2_MAX - POW2_MIN + 1).map((_, i) => 2 ** (i + POW2_MIN));

/** ASCII digits of one number from the exact path, most significant first, and their count. */
const digitText = new Uint8Array(24);
let digitCount = 0;
/** Two-digit ASCII pairs 00…99. */
const PAIRS = new Uint8Array(200);
for (let i = 0; i < 100; i++) {
  PAIRS[2 * i] = 48 + Math.floor(i / 10);
  PAIRS[2 * i + 1] = 48 + (i % 10);
}
const POW10_INT = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];

// How the digits reach the buffer. Every path writes the significant digits of its answer, most
// significant first, at `d` (one byte after the sign, if any: the byte at d − 1 is free), finds
// their count k by dropping trailing zeros, and `place` then moves them into Number::toString's
// layout in place. The output never extends beyond 25 bytes from the sign's position.

/** Writes the four digits of x (0 ≤ x < 10^4) at buffer[at]. */
function fourDigits(x: number, buffer: Uint8Array, at: number): void {
  const hi = (x / 100) | 0;
  const lo = x - hi * 100;
  buffer[at] = PAIRS[2 * hi] as number;
  buffer[at + 1] = PAIRS[2 * hi + 1] as number;
  buffer[at + 2] = PAIRS[2 * lo] as number;
  buffer[at + 3] = PAIRS[2 * lo + 1] as number;
}

/** Writes the `count` (≤ 9) low decimal digits of x (an integer, 0 ≤ x < 10^count) ending before `end`, two at a time. */
function lowDigits(x: number, count: number, buffer: Uint8Array, end: number): void {
  while (count >= 2) {
    const q = (x / 100) | 0;
    const r = 2 * (x - q * 100);
    buffer[end - 1] = PAIRS[r + 1] as number;
    buffer[end - 2] = PAIRS[r] as number;
    end -= 2;
    count -= 2;
    x = q;
  }
  if (count === 1) buffer[end - 1] = 48 + x;
}

/**
 * Writes the 17 digits of A·10^9 + B at buffer[d] (after carrying B ≥ 10^9 into A, and A = 10^8
 * into the exponent e), drops their trailing zeros and lays them out ({@link place}).
 */
function place17(A: number, B: number, e: number, buffer: Uint8Array, d: number): number {
  if (B >= 1_000_000_000) {
    B -= 1_000_000_000;
    A++;
  }
  if (A === 100_000_000) {
    A = 10_000_000;
    e++;
  }
  const a1 = (A / 10_000) | 0;
  fourDigits(a1, buffer, d);
  fourDigits(A - a1 * 10_000, buffer, d + 4);
  const b0 = (B / 100_000_000) | 0;
  buffer[d + 8] = 48 + b0;
  const r = B - b0 * 100_000_000;
  const b1 = (r / 10_000) | 0;
  fourDigits(b1, buffer, d + 9);
  fourDigits(r - b1 * 10_000, buffer, d + 13);
  let k = 17;
  while (k > 1 && buffer[d + k - 1] === 48) k--;
  return place(buffer, d, k, e);
}

/**
 * Lays out the k significant digits at buffer[d…] (buffer[d − 1] free), whose first digit's
 * decimal exponent is e, as Number::toString does: plain notation for 1e-7 ≤ |x| < 1e21, else
 * `d.ddde±x`. Returns the position after the text.
 */
function place(buffer: Uint8Array, d: number, k: number, e: number): number {
  const n = e + 1; // ECMAScript's n: the decimal point sits after n digits
  const s = d - 1;
  if (0 < n && n <= 21) {
    if (k > n) {
      // d…d+n−1 move one byte down; the point takes their last place.
      for (let i = 0; i < n; i++) buffer[s + i] = buffer[d + i] as number;
      buffer[s + n] = 46;
      return d + k;
    }
    for (let i = 0; i < k; i++) buffer[s + i] = buffer[d + i] as number;
    for (let i = k; i < n; i++) buffer[s + i] = 48;
    return s + n;
  }
  if (-6 < n && n <= 0) {
    // 0.000ddd: the digits move up by 1 − n.
    const shift = 1 - n;
    for (let i = k - 1; i >= 0; i--) buffer[d + shift + i] = buffer[d + i] as number;
    buffer[s] = 48;
    buffer[d] = 46;
    for (let i = 1; i < shift; i++) buffer[d + i] = 48;
    return d + shift + k;
  }
  buffer[s] = buffer[d] as number;
  let pos = d;
  if (k > 1) {
    buffer[d] = 46;
    pos = d + k;
  }
  buffer[pos++] = 101; // e
  let x = n - 1;
  if (x < 0) {
    buffer[pos++] = 45;
    x = -x;
  } else buffer[pos++] = 43;
  if (x >= 100) {
    const h = (x / 100) | 0;
    buffer[pos++] = 48 + h;
    x -= h * 100;
    buffer[pos++] = PAIRS[2 * x] as number;
    buffer[pos++] = PAIRS[2 * x + 1] as number;
  } else if (x >= 10) {
    buffer[pos++] = PAIRS[2 * x] as number;
    buffer[pos++] = PAIRS[2 * x + 1] as number;
  } else buffer[pos++] = 48 + x;
  return pos;
}

function writeAscii(text: string, buffer: Uint8Array, pos: number): number {
  for (let i = 0; i < text.length; i++) buffer[pos++] = text.charCodeAt(i);
  return pos;
}

/**
 * Rounding decision for r = R + F against `half` (an integer, or 0.5 for the last digit): 1 up,
 * 0 down, −1 undecided (t too close to the half to tell). When t is exact, a tie is decided here,
 * to the even candidate (`downEven`: the candidate below is even).
 */
function roundsUp(R: number, half: number, F: number, exact: boolean, downEven: boolean): number {
  if (exact) {
    if (half === 0.5) return F > 0.5 ? 1 : F < 0.5 ? 0 : downEven ? 0 : 1;
    if (R !== half) return R > half ? 1 : 0;
    return F > 0 ? 1 : downEven ? 0 : 1;
  }
  if (half === 0.5) {
    if (F > 0.5 + MARGIN) return 1;
    if (F < 0.5 - MARGIN) return 0;
    return -1;
  }
  if (R > half) return 1;
  if (R < half - 1) return 0;
  if (R === half) return F > MARGIN ? 1 : -1;
  return F < 1 - MARGIN ? 0 : -1; // R = half − 1
}

/**
 * Whether a candidate `delta` (candidate − t, in units of t) away from a reads back as a: 1 yes,
 * 0 no, −1 undecided. Exactly half an ulp away (decidable only when t is an exact integer) it
 * reads back as a when a's mantissa is even.
 */
function within(delta: number, W: number, exactInteger: boolean, even: boolean): number {
  const d = delta < 0 ? -delta : delta;
  if (exactInteger) return d < W || (d === W && even) ? 1 : 0;
  if (d < W - MARGIN) return 1;
  if (d > W + MARGIN) return 0;
  return -1;
}

/**
 * The fast path of {@link writeShortest} for a > 0: writes the digits at buffer[d] (d − 1 free) laid
 * out, and returns the position after them, or −1 when it cannot decide (then the exact path is
 * used).
 */
function shortestFast(a: number, buffer: Uint8Array, d: number): number {
  if (!decompose(a)) return -1;
  const end = shortestBranchless(buffer, d);
  return end !== -2 ? end : shortestCareful(buffer, d);
}

/** Fixed point of {@link shortestBranchless}: 2^22 units per unit of t's last integer digit. */
const FIX = 2 ** 22;
const FIX_HALF = FIX / 2;
const FIX_5 = 5 * FIX;
const FIX_10 = 10 * FIX;
const FIX_50 = 50 * FIX;
const FIX_100 = 100 * FIX;
/** How near (in fixed-point units) a comparison may come to its threshold before the careful path decides. */
const FIX_GUARD = 4;

/**
 * The decisions of {@link shortestCareful} without a data-dependent branch, for the values far
 * from every threshold (nearly all): writes as {@link shortestFast} does, or returns −2 when one
 * of the comparisons is within {@link FIX_GUARD} units of its threshold (then shortestCareful
 * decides).
 *
 * @remarks
 * Which neighbour of t is nearer, and whether it lies within half an ulp of a, are coin tosses
 * for measured data, which a branch predictor cannot learn; here they are int32 sign bits and
 * masks. The quantities are those of shortestCareful: x = R + F, t's distance above the
 * candidate below at 15 digits (R the last two digits of t's integer part), 16 (R the last digit)
 * and 17 (x = F), and W, half an ulp of a, all in units of t's last integer digit; each is
 * truncated to q = ⌊x·2^22⌋ (R + F < 128 is rounded first, by at most 2^-47: q is within 1 + 2^-25
 * units of x·2^22, W's w likewise). A comparison of two such figures is then off by less than
 * 2.1 units, so wherever every difference is more than {@link FIX_GUARD} units from zero each
 * sign is the true one — and t's own error (below 2^-46 of a unit, i.e. 2^-24 of a fixed-point
 * unit) cannot change it either. Exact ties and exact half-ulp distances are differences of zero,
 * so they always go to shortestCareful, which rounds them to even.
 */
function shortestBranchless(buffer: Uint8Array, d: number): number {
  const B = fastInt[B_] as number;
  const F = fastReal[F_] as number;
  const R100 = B % 100;
  const R10 = B % 10;
  const q100 = ((R100 + F) * FIX) | 0; // above the 15-digit candidate below (< 100·2^22)
  const q10 = ((R10 + F) * FIX) | 0; // above the 16-digit one
  const q1 = (F * FIX) | 0; // above the 17-digit one
  const w = ((fastReal[W_] as number) * FIX) | 0; // half an ulp of a (W < 10^17·2^-53 < 11.2)
  // 1 where t is past the half, so the nearer candidate is the one above.
  const up15 = (FIX_50 - q100) >>> 31;
  const up16 = (FIX_5 - q10) >>> 31;
  const up17 = (FIX_HALF - q1) >>> 31;
  // The distance to the nearer candidate; all-ones masks where it is within half an ulp.
  const d15 = q100 ^ ((q100 ^ (FIX_100 - q100)) & -up15);
  const d16 = q10 ^ ((q10 ^ (FIX_10 - q10)) & -up16);
  const m15 = -((d15 - w) >>> 31);
  const m16 = -((d16 - w) >>> 31);
  if (near(q100 - FIX_50) || near(q10 - FIX_5) || near(q1 - FIX_HALF) || near(d15 - w) || near(d16 - w))
    return -2;
  // The shortest that reads back: 15 digits, else 16, else 17 (the nearer candidate of each).
  const c15 = B - R100 + (100 & -up15);
  const c16 = B - R10 + (10 & -up16);
  const c17 = B + up17;
  const c = (c15 & m15) | (~m15 & ((c16 & m16) | (~m16 & c17)));
  return place17(fastInt[A_] as number, c, fastInt[E_] as number, buffer, d);
}

/** Whether a fixed-point difference is within {@link FIX_GUARD} units of zero. */
function near(x: number): boolean {
  return (x + FIX_GUARD) >>> 0 <= 2 * FIX_GUARD;
}

/**
 * The careful decisions of {@link shortestFast} on the decomposition in fastInt and fastReal
 * (each comparison exact where t is, else kept MARGIN away from its threshold): writes as
 * shortestFast does, or returns −1 when t is too close to a threshold to tell.
 */
function shortestCareful(buffer: Uint8Array, d: number): number {
  const A = fastInt[A_] as number;
  const B = fastInt[B_] as number;
  const e = fastInt[E_] as number;
  const exact = fastInt[EXACT_] === 1;
  const F = fastReal[F_] as number;
  const W = fastReal[W_] as number;
  const exactInteger = exact && F === 0;
  const even = fastInt[EVEN_] === 1;
  // 15 digits: round at the hundreds of the 17-digit integer.
  const B100 = (B / 100) | 0;
  let R = B - B100 * 100;
  let up = roundsUp(R, 50, F, exact, (B100 & 1) === 0);
  if (up < 0) return -1;
  let ok = within(up * 100 - R - F, W, exactInteger, even);
  if (ok === 1) return place17(A, B - R + up * 100, e, buffer, d);
  if (ok < 0) return -1;
  // 16 digits.
  const B10 = (B / 10) | 0;
  R = B - B10 * 10;
  up = roundsUp(R, 5, F, exact, (B10 & 1) === 0);
  if (up < 0) return -1;
  ok = within(up * 10 - R - F, W, exactInteger, even);
  if (ok === 1) return place17(A, B - R + up * 10, e, buffer, d);
  if (ok < 0) return -1;
  // 17 digits: always within half an ulp (W > 10^16·2^-54 > 0.55 for a normal double).
  up = roundsUp(0, 0.5, F, exact, (B & 1) === 0);
  if (up < 0) return -1;
  return place17(A, B + up, e, buffer, d);
}

/** The fast path of {@link writeDigits} for a > 0 and 1 ≤ p ≤ 17, as {@link shortestFast} writes; −1 when undecided. */
function digitsFast(a: number, p: number, buffer: Uint8Array, d: number): number {
  if (!decompose(a)) return -1;
  const A = fastInt[A_] as number;
  const B = fastInt[B_] as number;
  const e = fastInt[E_] as number;
  const exact = fastInt[EXACT_] === 1;
  const F = fastReal[F_] as number;
  if (p === 17) {
    const up = roundsUp(0, 0.5, F, exact, (B & 1) === 0);
    return up < 0 ? -1 : place17(A, B + up, e, buffer, d);
  }
  const drop = 17 - p; // digits dropped
  if (drop < 9) {
    const u = POW10_INT[drop] as number;
    const Bu = (B / u) | 0;
    const R = B - Bu * u;
    const up = roundsUp(R, u / 2, F, exact, (Bu & 1) === 0);
    return up < 0 ? -1 : place17(A, B - R + up * u, e, buffer, d);
  }
  const ua = POW10_INT[drop - 9] as number; // unit within A
  const Au = (A / ua) | 0;
  const RA = A - Au * ua;
  const R = RA * 1e9 + B; // < 10^16: exact
  const up = roundsUp(R, ua * 5e8, F, exact, (Au & 1) === 0);
  if (up < 0) return -1;
  return place17(A - RA + up * ua, 0, e, buffer, d);
}

// ---------------------------------------------------------------------------------------------
// The short fixed-digit path of writeDigits (1 ≤ p ≤ LEAN_MAX_DIGITS): one correctly rounded
// operation on exact operands instead of the double-double product.

/** The most significant digits the short path takes: 10^12 · 2^-53 leaves a margin of 1.1e-4. */
const LEAN_MAX_DIGITS = 12;
/** 10^k for k in [0, 22]: exact doubles. */
const POW10_EXACT = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));
/**
 * Per p, how far t's fraction must be from one half for the short path to round (it rounds when
 * the distance exceeds this): 10^p · 2^-50,
 * eight times the largest error of t (half an ulp of t < 10^p, at most 10^p · 2^-53).
 */
const LEAN_MARGIN = Float64Array.from({ length: LEAN_MAX_DIGITS + 1 }, (_, p) => 10 ** p * 2 ** -50);

/**
 * The short path of {@link writeDigits} for a > 0 and 1 ≤ p ≤ {@link LEAN_MAX_DIGITS}, as
 * {@link shortestFast} writes; −1 when it cannot decide.
 *
 * @remarks
 * With E the decimal exponent of a (10^E ≤ a < 10^(E+1)), the answer is the integer nearest to
 * a·10^(p−1−E). The binary exponent gives e = ⌊be·log10 2⌋ with E ∈ {e, e + 1}; for
 * j = p − 1 − e in [−22, 22], 10^|j| is an exact double, so t = a·10^j (or a / 10^−j) is one
 * correctly rounded operation on exact operands: |t − a·10^j| ≤ half an ulp of t < 10^p·2^-53
 * (t < 2^53 as p ≤ 12). E = e + 1 exactly when a ≥ {@link ceilPow10}(e + 1), the least double
 * ≥ 10^(e+1); then j is one less. The fraction of t decides the rounding when it is more than
 * {@link LEAN_MARGIN} (eight error bounds) away from one half; otherwise (a possible tie or a
 * near one) the double-double or exact path decides. A rounding up to 10^p (t within an error
 * bound of 10^p, or equal to it by rounding) carries into the exponent. About 2·10^p·2^-50 of uniformly spread
 * fractions defer: about 2·10^-6 at p = 9, 2·10^-9 at p = 6.
 */
function digitsLean(a: number, p: number, buffer: Uint8Array, d: number): number {
  f64[0] = a;
  const ebits = (u32[HI] as number) >>> 20;
  let e = EXP_EST[ebits] as number;
  let j = p - 1 - e;
  if (j > 22 || j < -21) return -1;
  if (a >= nextPow10(ebits)) {
    e++;
    j--;
  }
  const limit = POW10_EXACT[p] as number;
  const t = j >= 0 ? a * (POW10_EXACT[j] as number) : a / (POW10_EXACT[-j] as number);
  // t's fraction less one half (exact: t < 2^53), then the nearest integer without a branch on
  // its side of one half (t + 0.5 is exact below 2^52).
  const f = t - Math.floor(t) - 0.5;
  if (Math.abs(f) <= (LEAN_MARGIN[p] as number)) return -1;
  let r = Math.floor(t + 0.5);
  if (r === limit) {
    r = limit / 10;
    e++;
  }
  // The p digits of r, two at a time from the last (int32 arithmetic, which the JIT keeps in
  // integer registers), then trailing zeros dropped.
  if (r < 1_000_000_000) lowDigits(r | 0, p, buffer, d + p);
  else {
    const hi = Math.floor(r / 1e9); // exact: r < 10^12 is an integer, r/1e9 is ≥ 10^-12 from the next integer
    lowDigits((r - hi * 1e9) | 0, 9, buffer, d + p);
    lowDigits(hi | 0, p - 9, buffer, d + p - 9);
  }
  let k = p;
  while (k > 1 && buffer[d + k - 1] === 48) k--;
  return place(buffer, d, k, e);
}

// ---------------------------------------------------------------------------------------------
// The exact path (BigInt): the reference, and the fallback of the fast path.

/** Exact decimal exponent of a > 0: 10^e ≤ a < 10^(e+1). a = M / D. */
function exactExponent(M: bigint, D: bigint, a: number): number {
  let e = Math.floor(Math.log10(a));
  const below = (x: number): boolean =>
    // a < 10^x ?
    x >= 0 ? M < D * bigPow10(x) : M * bigPow10(-x) < D;
  while (below(e)) e--;
  while (!below(e + 1)) e++;
  return e;
}

/** Puts a digit string into digitText, trailing zeros dropped. */
function scratchFromString(s: string): void {
  let n = s.length;
  while (n > 1 && s.charCodeAt(n - 1) === 48) n--;
  for (let i = 0; i < n; i++) digitText[i] = s.charCodeAt(i);
  digitCount = n;
}

/**
 * Exact decimal of a > 0 (finite): `p` significant digits correctly rounded (ties to even), or with
 * p = 0 the shortest decimal that reads back as a (closest, then even). Fills digitText;
 * returns the decimal exponent.
 */
function exactDecimal(a: number, p: number): number {
  const { m, q, ebits, frac } = bigParts(a);
  const M = q >= 0 ? m << BigInt(q) : m;
  const D = q >= 0 ? 1n : bigPow2(-q);
  const e = exactExponent(M, D, a);
  /** floor and remainder of a·10^s: a·10^s = N/Dd. */
  const scaled = (s: number): { N: bigint; Dd: bigint } =>
    s >= 0 ? { N: M * bigPow10(s), Dd: D } : { N: M, Dd: D * bigPow10(-s) };
  if (p > 0) {
    const { N, Dd } = scaled(p - 1 - e);
    let d = N / Dd;
    const r2 = 2n * (N % Dd);
    if (r2 > Dd || (r2 === Dd && d % 2n === 1n)) d++;
    let ee = e;
    if (d === bigPow10(p)) {
      d = bigPow10(p - 1);
      ee++;
    }
    scratchFromString(d.toString());
    return ee;
  }
  // Shortest: for each length, the candidates below and above a that lie in a's rounding interval
  // (half an ulp either side; half of that below an exact power of two; ends included when m is
  // even, as reading rounds ties to even); the closest wins, the even one on a tie.
  const even = m % 2n === 0n;
  const lowerCloser = frac === 0n && ebits > 1;
  for (let len = 1; len <= 17; len++) {
    const K = e + 1 - len; // candidate = d·10^K
    const { N, Dd } = scaled(-K);
    const below = N / Dd;
    // Everything times 2^z2·10^z10 is an integer.
    const z2 = Math.max(0, 2 - q);
    const z10 = Math.max(0, -K);
    const aUnits = m * bigPow2(q + z2) * bigPow10(z10);
    const gapUp = bigPow2(q - 1 + z2) * bigPow10(z10);
    const gapLow = lowerCloser ? bigPow2(q - 2 + z2) * bigPow10(z10) : gapUp;
    let best: bigint | undefined;
    let bestDistance = 0n;
    for (const d of N % Dd === 0n ? [below] : [below, below + 1n]) {
      if (d === 0n) continue;
      const delta = d * bigPow2(z2) * bigPow10(K + z10) - aUnits;
      const distance = delta < 0n ? -delta : delta;
      const gap = delta < 0n ? gapLow : gapUp;
      if (distance > gap || (distance === gap && !even)) continue;
      if (best === undefined || distance < bestDistance || (distance === bestDistance && d % 2n === 0n)) {
        best = d;
        bestDistance = distance;
      }
    }
    if (best !== undefined) {
      const s = best.toString();
      scratchFromString(s);
      return s.length > len ? e + 1 : e; // a carry to 10^len moves the exponent up
    }
  }
  throw new Error(`no decimal of at most 17 digits reads back as ${a}`);
}

// ---------------------------------------------------------------------------------------------

/**
 * Writes the shortest round-trip text of `v`: exactly `String(v)` (NaN as `NaN`, ±Infinity as
 * `Infinity`/`-Infinity`), except that −0 is written `0` (as `String(-0)` does).
 *
 * @param v - The value.
 * @param buffer - The output bytes (at least 25 free at `pos`).
 * @param pos - Where to write.
 * @returns The position after the text.
 */
export function writeShortest(v: number, buffer: Uint8Array, pos: number): number {
  if (v !== v || v === 0 || v === Infinity || v === -Infinity) return writeSpecial(v, buffer, pos);
  const a = v < 0 ? -v : v;
  const d = v < 0 ? writeMinus(buffer, pos) : pos + 1;
  const end = shortestFast(a, buffer, d);
  return end >= 0 ? end : exactPlaced(a, 0, buffer, d);
}

/** NaN, ±0 (as `0`) and ±Infinity, as Number::toString writes them; returns the position after. */
function writeSpecial(v: number, buffer: Uint8Array, pos: number): number {
  if (v === 0) {
    buffer[pos] = 48;
    return pos + 1;
  }
  return writeAscii(v !== v ? 'NaN' : v > 0 ? 'Infinity' : '-Infinity', buffer, pos);
}

/**
 * Writes the minus sign at `pos`; returns where the digits of a negative value start (one byte
 * further on than a positive value's, which start at `pos + 1`).
 */
function writeMinus(buffer: Uint8Array, pos: number): number {
  buffer[pos] = 45; // '-'
  return pos + 2;
}

/**
 * Writes `v` correctly rounded to `digits` significant digits (the exact binary value rounded to
 * nearest, ties to even), trailing zeros dropped, laid out as Number::toString lays out a number
 * (plain notation for decimal exponents from −7 to 20, else `d.ddde±x`); NaN as `NaN`, zeros as
 * `0`.
 *
 * @param v - The value.
 * @param digits - Significant digits (integer in [1, 17]; not checked here).
 * @param buffer - The output bytes (at least 25 free at `pos`).
 * @param pos - Where to write.
 * @returns The position after the text.
 */
export function writeDigits(v: number, digits: number, buffer: Uint8Array, pos: number): number {
  if (v !== v || v === 0 || v === Infinity || v === -Infinity) return writeSpecial(v, buffer, pos);
  const a = v < 0 ? -v : v;
  const d = v < 0 ? writeMinus(buffer, pos) : pos + 1;
  let end = digits <= LEAN_MAX_DIGITS ? digitsLean(a, digits, buffer, d) : -1;
  if (end < 0) end = digitsFast(a, digits, buffer, d);
  return end >= 0 ? end : exactPlaced(a, digits, buffer, d);
}

/** The exact path's text of a > 0 written at buffer[d] (d − 1 free) and laid out; returns the position after it. */
function exactPlaced(a: number, p: number, buffer: Uint8Array, d: number): number {
  const e = exactDecimal(a, p);
  for (let i = 0; i < digitCount; i++) buffer[d + i] = digitText[i] as number;
  return place(buffer, d, digitCount, e);
}

/** Runs one path on |v| into a fresh buffer and returns its text (`undefined` where it defers). */
function pathText(
  v: number,
  write: (a: number, buffer: Uint8Array, d: number) => number,
): string | undefined {
  const buffer = new Uint8Array(40);
  const negative = v < 0;
  if (negative) buffer[0] = 45;
  const end = write(Math.abs(v), buffer, negative ? 2 : 1);
  return end < 0 ? undefined : new TextDecoder().decode(buffer.subarray(0, end));
}

/**
 * The paths apart, for tests: the fast path's text, or `undefined` where it defers (and its
 * shortest form's two ways of deciding, each alone); the short fixed-digit path's (digits 1 to
 * 12), likewise; the exact path's text; and the power-of-ten thresholds that give the decimal
 * exponent.
 *
 * @internal
 */
export const numberTextPaths = {
  fast(v: number, digits: number): string | undefined {
    return pathText(v, (a, buffer, d) =>
      digits === 0 ? shortestFast(a, buffer, d) : digitsFast(a, digits, buffer, d),
    );
  },
  /** The shortest form by the branch-free decisions alone (`undefined` where they defer). */
  branchless(v: number): string | undefined {
    return pathText(v, (a, buffer, d) => {
      if (!decompose(a)) return -1;
      const end = shortestBranchless(buffer, d);
      return end === -2 ? -1 : end;
    });
  },
  /** The shortest form by the careful decisions alone (`undefined` where they defer). */
  careful(v: number): string | undefined {
    return pathText(v, (a, buffer, d) => (decompose(a) ? shortestCareful(buffer, d) : -1));
  },
  lean(v: number, digits: number): string | undefined {
    return pathText(v, (a, buffer, d) => digitsLean(a, digits, buffer, d));
  },
  exact(v: number, digits: number): string {
    return pathText(v, (a, buffer, d) => exactPlaced(a, digits, buffer, d)) as string;
  },
  /** The least double ≥ 10^k, for k in [−300, 300]. */
  ceilPow10(k: number): number {
    return ceilPow10(k);
  },
  /** The decimal exponent E of a > 0 (10^E ≤ a < 10^(E+1)) as the fast paths find it (biased exponent bits 93 to 1953). */
  decimalExponent(a: number): number {
    f64[0] = a;
    const ebits = (u32[HI] as number) >>> 20;
    return (EXP_EST[ebits] as number) + (a >= nextPow10(ebits) ? 1 : 0);
  },
};
