/**
 * Random-variate kernels: each fills `out[i·stride]` for i in [from, to) (stride 1: a column;
 * stride n: one input's place in rows of n) with draws from one distribution, advancing a
 * xoshiro128** state (see xoshiro128.ts). The two hot kernels (normal and rectangular) inline the
 * generator step with the state in local variables; the others call `nextUint32`.
 *
 * Every kernel uses only integer operations, correctly rounded arithmetic, `Math.sqrt` (correctly
 * rounded by IEEE 754) and the portable logarithm and exponential, so a given state produces the
 * same doubles on every engine and machine.
 *
 * Resolution: the two hot kernels use one 32-bit output per variate. A rectangular variate takes
 * 2³² equally spaced values, W = (m + ½)·2⁻³¹ with m uniform on −2³¹ … 2³¹ − 1, symmetric about 0
 * in (−1, 1). A normal variate takes 10 bits for the ziggurat layer and the other 22 for its
 * abscissa, so the layer and the value come from disjoint bits (the remedy of J. A. Doornik, "An
 * improved ziggurat method to generate normal random samples", 2005); the abscissae are spaced
 * 2⁻²¹ of the layer's width, at most 2.1·10⁻⁶ standard deviations. Both are far below anything a
 * Monte Carlo result can resolve (10⁸ trials estimate a 95 % interval to about 10⁻⁴ σ). The
 * other kernels and the slow paths use 53-bit uniforms, U = (m + ½)·2⁻⁵³ with m uniform on
 * 0 … 2⁵³ − 1, in the open interval (0, 1) with 1 − U distributed as U. xoshiro128** gives every
 * output bit full quality, so using the low bits for the layer is safe.
 */
import { portableExp, portableExpm1, portableLog } from './portableMath.js';
import { nextUint32, type GeneratorState } from './xoshiro128.js';
import { ZIGGURAT_R, zigguratTables } from './ziggurat.js';

/** What one input column is drawn from (plain data, so it can be posted to a worker). */
export type SamplerSpec =
  | { readonly kind: 'constant'; readonly mean: number }
  | { readonly kind: 'normal'; readonly mean: number; readonly scale: number }
  | { readonly kind: 'rectangular'; readonly mean: number; readonly halfWidth: number }
  | { readonly kind: 'triangular'; readonly mean: number; readonly halfWidth: number }
  | { readonly kind: 'arcsine'; readonly mean: number; readonly halfWidth: number }
  | { readonly kind: 't'; readonly mean: number; readonly scale: number; readonly degreesOfFreedom: number };

const TWO_POW_26 = 67108864;
const TWO_POW_M21 = 4.76837158203125e-7;
const TWO_POW_M31 = 4.656612873077393e-10;
const TWO_POW_M52 = 2.220446049250313e-16;
const TWO_POW_M53 = 1.1102230246251565e-16;

/** A uniform variate on (0, 1) with 53 random bits. */
export function uniformOpen(s: GeneratorState): number {
  const hi = nextUint32(s) >>> 5;
  const lo = nextUint32(s) >>> 6;
  return (hi * TWO_POW_26 + lo + 0.5) * TWO_POW_M53;
}

/** A uniform variate on (−1, 1), symmetric about 0, with 53 random bits. */
export function uniformSymmetric(s: GeneratorState): number {
  const hi = nextUint32(s) | 0;
  const lo = nextUint32(s) >>> 6;
  return ((hi >> 5) * TWO_POW_26 + lo + 0.5) * TWO_POW_M52;
}

/**
 * The rare part of the ziggurat: the tail beyond R for layer 0 (G. Marsaglia, "Generating a
 * variable from the tail of the normal distribution", Technometrics 6, 1964), or the wedge test
 * for layer i ≥ 1. Returns NaN when the point is rejected and the caller must draw again.
 */
function zigguratSlowPath(s: GeneratorState, layer: number, u: number): number {
  if (layer === 0) {
    let x: number;
    let y: number;
    do {
      x = -portableLog(uniformOpen(s)) / ZIGGURAT_R;
      y = -portableLog(uniformOpen(s));
    } while (y + y < x * x);
    return u < 0 ? -(ZIGGURAT_R + x) : ZIGGURAT_R + x;
  }
  const { x: zigguratX, f: zigguratF } = zigguratTables();
  const z = u * (zigguratX[layer] as number);
  const low = zigguratF[layer] as number;
  const y = low + uniformOpen(s) * ((zigguratF[layer + 1] as number) - low);
  return y < portableExp(-0.5 * z * z) ? z : NaN;
}

/** One standard normal variate by the whole ziggurat (fast test, then the slow path), state in `s`. */
function normalOne(s: GeneratorState): number {
  const { x: zigguratX, ratio: zigguratRatio } = zigguratTables();
  for (;;) {
    const r = nextUint32(s) | 0;
    const layer = r & 1023;
    const u = ((r >> 10) + 0.5) * TWO_POW_M21;
    if (Math.abs(u) < (zigguratRatio[layer] as number)) return u * (zigguratX[layer] as number);
    const z = zigguratSlowPath(s, layer, u);
    if (z === z) return z;
  }
}

// The fast test in integers: with h = r >> 10 (22 signed bits) and m = |h + ½| − ½ (h, or −h − 1),
// |u| < x_{i+1}/x_i for u = (h + ½)·2⁻²¹ exactly when m < ⌈ratio_i·2²¹ − ½⌉ (the scaling by 2²¹ and
// the subtraction of ½ are exact). Accepted values are (h + ½)·(x_i·2⁻²¹): the same double as
// u·x_i, since scaling by a power of two is exact.
// Built with the ziggurat's tables, on first use.
let fastTables: { readonly limit: Int32Array; readonly scale: Float64Array } | undefined;
function fastTest(): { readonly limit: Int32Array; readonly scale: Float64Array } {
  if (fastTables === undefined) {
    const { x, ratio } = zigguratTables();
    fastTables = {
      limit: Int32Array.from(ratio, (r) => Math.ceil(r * 2097152 - 0.5)),
      scale: x.map((v) => v * TWO_POW_M21),
    };
  }
  return fastTables;
}

// Draws that failed the fast test (their output word and position), completed after the pass.
let rejectedWord = new Int32Array(256);
let rejectedAt = new Int32Array(256);

/**
 * Fills out[from…to) with mean + scale·Z, Z standard normal (1024-layer ziggurat).
 *
 * Two passes, so that the hot loop is a leaf (no call, the generator state stays in registers):
 * the first makes one ziggurat draw per position and keeps those that pass the fast test
 * (99.6 %); the second completes the others in order — the slow path for their own draw, then
 * whole new draws until one is accepted — continuing the same stream. The values therefore
 * depend on `to − from`: callers fill whole chunks of a fixed length.
 */
export function fillNormal(
  s: GeneratorState,
  out: Float64Array,
  from: number,
  to: number,
  mean: number,
  scale: number,
  stride = 1,
): void {
  if (rejectedAt.length < to - from) {
    rejectedWord = new Int32Array(to - from);
    rejectedAt = new Int32Array(to - from);
  }
  const words = rejectedWord;
  const at = rejectedAt;
  const { limit, scale: width } = fastTest();
  let rejected = 0;
  let a = s[0] as number;
  let b = s[1] as number;
  let c = s[2] as number;
  let d = s[3] as number;
  for (let i = from; i < to; i++) {
    const m = Math.imul(b, 5);
    const r = Math.imul((m << 7) | (m >>> 25), 9);
    const t = b << 9;
    c ^= a;
    d ^= b;
    b ^= c;
    a ^= d;
    c ^= t;
    d = (d << 11) | (d >>> 21);
    const layer = r & 1023;
    const h = r >> 10; // the top 22 bits, signed: u = (h + ½)·2⁻²¹ is uniform on (−1, 1)
    if ((h ^ (h >> 31)) < (limit[layer] as number)) {
      out[i * stride] = mean + scale * ((h + 0.5) * (width[layer] as number));
    } else {
      words[rejected] = r;
      at[rejected++] = i;
    }
  }
  s[0] = a;
  s[1] = b;
  s[2] = c;
  s[3] = d;
  for (let k = 0; k < rejected; k++) {
    const r = words[k] as number;
    let z = zigguratSlowPath(s, r & 1023, ((r >> 10) + 0.5) * TWO_POW_M21);
    if (z !== z) z = normalOne(s);
    out[(at[k] as number) * stride] = mean + scale * z;
  }
}

/** Fills out[from…to) with mean + halfWidth·W, W uniform on (−1, 1) with 2³² values. */
export function fillRectangular(
  s: GeneratorState,
  out: Float64Array,
  from: number,
  to: number,
  mean: number,
  halfWidth: number,
  stride = 1,
): void {
  let a = s[0] as number;
  let b = s[1] as number;
  let c = s[2] as number;
  let d = s[3] as number;
  for (let i = from; i < to; i++) {
    const m = Math.imul(b, 5);
    const r = Math.imul((m << 7) | (m >>> 25), 9);
    const t = b << 9;
    c ^= a;
    d ^= b;
    b ^= c;
    a ^= d;
    c ^= t;
    d = (d << 11) | (d >>> 21);
    out[i * stride] = mean + halfWidth * ((r + 0.5) * TWO_POW_M31);
  }
  s[0] = a;
  s[1] = b;
  s[2] = c;
  s[3] = d;
}

/** Fills out[from…to) with a symmetric triangular variate: mean + halfWidth·(U₁ + U₂ − 1). */
export function fillTriangular(
  s: GeneratorState,
  out: Float64Array,
  from: number,
  to: number,
  mean: number,
  halfWidth: number,
  stride = 1,
): void {
  for (let i = from; i < to; i++) out[i * stride] = mean + halfWidth * (uniformOpen(s) + uniformOpen(s) - 1);
}

/**
 * Fills out[from…to) with an arcsine (U-shaped) variate mean + halfWidth·cos(2Θ), Θ uniform: a
 * point (p, q) uniform in the unit disc has (p² − q²)/(p² + q²) = cos 2Θ, so no trigonometric
 * function is needed (rejection from the square, acceptance π/4).
 */
export function fillArcsine(
  s: GeneratorState,
  out: Float64Array,
  from: number,
  to: number,
  mean: number,
  halfWidth: number,
  stride = 1,
): void {
  for (let i = from; i < to;) {
    const p = uniformSymmetric(s);
    const q = uniformSymmetric(s);
    const p2 = p * p;
    const q2 = q * q;
    const w = p2 + q2;
    if (w < 1) out[stride * i++] = mean + halfWidth * ((p2 - q2) / w);
  }
}

/**
 * Fills out[from…to) with mean + scale·T, T Student-t with ν degrees of freedom, by Bailey's polar
 * method (R. W. Bailey, "Polar generation of random variates with the t-distribution", Math.
 * Comp. 62, 1994): for (p, q) uniform in the unit disc and w = p² + q²,
 * T = p·√(ν(w^(−2/ν) − 1)/w). w^(−2/ν) − 1 is formed as expm1(−(2/ν)·ln w), accurate for large ν.
 * An infinite ν gives the normal limit p·√(−2 ln w / w) (Marsaglia's polar method).
 */
export function fillStudentT(
  s: GeneratorState,
  out: Float64Array,
  from: number,
  to: number,
  mean: number,
  scale: number,
  degreesOfFreedom: number,
  stride = 1,
): void {
  const nu = degreesOfFreedom;
  for (let i = from; i < to;) {
    const p = uniformSymmetric(s);
    const q = uniformSymmetric(s);
    const w = p * p + q * q;
    if (!(w < 1)) continue;
    const lnw = portableLog(w);
    const radial = nu === Infinity ? -2 * lnw : nu * portableExpm1((-2 / nu) * lnw);
    out[stride * i++] = mean + scale * (p * Math.sqrt(radial / w));
  }
}

/** Fills out[i·stride] for i in [from, to) from a sampler specification. */
export function fillFrom(
  spec: SamplerSpec,
  s: GeneratorState,
  out: Float64Array,
  from: number,
  to: number,
  stride = 1,
): void {
  switch (spec.kind) {
    case 'constant':
      if (stride === 1) out.fill(spec.mean, from, to);
      else for (let i = from; i < to; i++) out[i * stride] = spec.mean;
      return;
    case 'normal':
      fillNormal(s, out, from, to, spec.mean, spec.scale, stride);
      return;
    case 'rectangular':
      fillRectangular(s, out, from, to, spec.mean, spec.halfWidth, stride);
      return;
    case 'triangular':
      fillTriangular(s, out, from, to, spec.mean, spec.halfWidth, stride);
      return;
    case 'arcsine':
      fillArcsine(s, out, from, to, spec.mean, spec.halfWidth, stride);
      return;
    case 't':
      fillStudentT(s, out, from, to, spec.mean, spec.scale, spec.degreesOfFreedom, stride);
      return;
  }
}
