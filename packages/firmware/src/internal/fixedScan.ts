/**
 * Error scans of a fixed-point map over its codes: every code (exhaustive) or a list (sampled).
 *
 * The firmware computes y(d) = R(acc(d)) with acc(d) = d·M + B, d = code − offsetCode, and R the
 * rounding of acc/2^s. Against the exact map t = (code − offset)·m the error splits exactly into
 *
 *   e(d) = ρ(d) + d·Δ + β,   ρ = y − acc/2^s,   Δ = M/2^s − m,   β = B/2^s − (offsetCode − offset)·m,
 *
 * a rounding part ρ that depends only on acc modulo 2^s (and on the sign or parity of the
 * quotient) and an affine coefficient part. The exhaustive scan steps acc by M from one code to the
 * next as a quotient Q and a remainder r (acc = Q·2^s + r, 0 ≤ r < 2^s): for s ≤ 52 every step is
 * an exact operation on integers below 2^53 in binary64, so y and ρ are exact without BigInt. The
 * affine part is evaluated in binary64 as e~ = ρ + (d·Δ~ + β~), with Δ~ and β~ the nearest
 * doubles. With A = D|Δ|, B = |β| (u = 2^−53, D = max|d|): Δ~, β~, the product and the first sum
 * each contribute a relative u, so |(d·Δ~ + β~) − (dΔ + β)| ≤ 3.01u(A + B); the last sum adds
 * u|ρ + t| ≤ u(1 + A + B). Hence |e~ − e| ≤ ε = 8u(A + B) + 2u, and e~ = e exactly when Δ = β = 0
 * (then t = 0 and ρ is exact). The caller adds ε to the largest |e~| found. For s > 52 the scan
 * steps in BigInt and ρ is rounded once on conversion (relative u, inside the 2u term).
 */
import type { FixedPointRounding } from '../roundShift.js';
import { roundShiftUnchecked } from '../roundShift.js';

export interface FixedKernel {
  readonly dMin: number;
  readonly dMax: number;
  readonly offsetCode: number;
  readonly multiplier: number;
  readonly shift: number;
  readonly bias: bigint;
  readonly rounding: FixedPointRounding;
  /** Δ and β rounded to the nearest double. */
  readonly delta: number;
  readonly beta: number;
}

export interface ScanResult {
  /** Largest and smallest approximate error (output LSB) and the codes where they occur. */
  maxError: number;
  maxCode: number;
  minError: number;
  minCode: number;
  count: number;
}

function emptyResult(): ScanResult {
  return {
    maxError: -Infinity,
    maxCode: 0,
    minError: Infinity,
    minCode: 0,
    count: 0,
  };
}

/** y and ρ at one offset-relative code d, through BigInt (any shift). */
function pointAt(k: FixedKernel, d: number): { y: number; rho: number } {
  const acc = BigInt(d) * BigInt(k.multiplier) + k.bias;
  const s = BigInt(k.shift);
  const y = roundShiftUnchecked(acc, s, k.rounding);
  // ρ = (y·2^s − acc)/2^s: the integer is below 2^s in magnitude; its conversion rounds to nearest,
  // a relative error of at most u on |ρ| ≤ 1, inside ε.
  return { y: Number(y), rho: Number((y << s) - acc) / 2 ** k.shift };
}

function record(r: ScanResult, code: number, e: number): void {
  r.count += 1;
  if (e > r.maxError) {
    r.maxError = e;
    r.maxCode = code;
  }
  if (e < r.minError) {
    r.minError = e;
    r.minCode = code;
  }
}

/** Evaluates the listed codes (sampled verification). */
export function scanCodes(k: FixedKernel, codes: readonly number[]): ScanResult {
  const r = emptyResult();
  for (const code of codes) {
    const d = code - k.offsetCode;
    record(r, code, pointAt(k, d).rho + (d * k.delta + k.beta));
  }
  return r;
}

/** Evaluates every code from dMin to dMax (exhaustive verification). */
export function scanAll(k: FixedKernel): ScanResult {
  if (k.shift > 52) {
    // Remainders would pass 2^53: step through BigInt instead (slower, still exact).
    const r = emptyResult();
    for (let d = k.dMin; d <= k.dMax; d++)
      record(r, d + k.offsetCode, pointAt(k, d).rho + (d * k.delta + k.beta));
    return r;
  }
  const T = 2 ** k.shift;
  const half = T / 2;
  const M = k.multiplier;
  const qM = Math.floor(M / T); // exact: division by a power of two
  const rM = M - qM * T; // in [0, T)
  const acc0 = BigInt(k.dMin) * BigInt(M) + k.bias;
  const s = BigInt(k.shift);
  const q0 = acc0 >> s; // floor (BigInt shifts are floor divisions)
  let Q = Number(q0); // |Q| ≈ |y| < 2^32
  let rem = Number(acc0 - (q0 << s)); // in [0, 2^s), below 2^52
  const { delta, beta, rounding, offsetCode } = k;
  const floorMode = rounding === 'floor';
  const awayMode = rounding === 'half-away';
  let maxError = -Infinity;
  let minError = Infinity;
  let maxCode = 0;
  let minCode = 0;
  for (let d = k.dMin; d <= k.dMax; d++) {
    let y = Q;
    if (!floorMode) {
      if (awayMode) {
        if (Q >= 0 ? rem >= half : rem > half) y = Q + 1;
      } else if (rem > half || (rem === half && (Q & 1) !== 0)) {
        y = Q + 1;
      }
    }
    const e = y - Q - rem / T + (d * delta + beta);
    if (e > maxError) {
      maxError = e;
      maxCode = d + offsetCode;
    }
    if (e < minError) {
      minError = e;
      minCode = d + offsetCode;
    }
    rem += rM;
    Q += qM;
    if (rem >= T) {
      rem -= T;
      Q += 1;
    }
  }
  return {
    maxError,
    maxCode,
    minError,
    minCode,
    count: k.dMax - k.dMin + 1,
  };
}
