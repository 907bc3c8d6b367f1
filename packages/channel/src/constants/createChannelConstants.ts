/**
 * Firmware constants for a channel: the firmware package turns the channel's map into
 * fixed-point and float constants with proved error bounds, verified against the exact map.
 */
import { BridgeworkError, checkInteger, checkObject, checkPositive } from '@bridgework/core';
import {
  fixedPointMap,
  floatMap,
  type FirmwareChannel,
  type FixedPointMap,
  type FixedPointRounding,
  type FloatMap,
  type VerificationMode,
} from '@bridgework/firmware';
import type { Mapping } from '../internal/mapping.js';
import type { ResolvedChannel } from '../internal/resolve.js';
import { asciiUnit } from '../units/quantity.js';

/** Options of a channel's `constants`. */
export interface ConstantsOptions {
  /** Output LSB of the fixed-point map, in the output unit (> 0). Default: `output.firmwareResolution`, else 1e-4 of the span's largest magnitude rounded down to a power of ten. */
  readonly outputResolution?: number;
  /** Width of the signed multiplier word in bits. Default 32. */
  readonly coefficientBits?: number;
  /** Width of the signed accumulator in bits. Default 64. */
  readonly accumulatorBits?: number;
  /** Rounding of the fixed-point output. Default `'half-even'`. */
  readonly rounding?: FixedPointRounding;
  /** Degree of the float polynomial maps (integer 1…5). Default 3. */
  readonly polynomialDegree?: number;
  /** How the firmware package verifies the bounds. Default `'auto'` (exhaustive up to 2^24 codes). */
  readonly verification?: VerificationMode;
}

/** A channel's firmware constants (see `Channel.constants`). */
export interface ChannelConstants {
  /** Codes the constants cover (the span of interest), inclusive. */
  readonly codeMin: number;
  /** Highest code covered, inclusive. */
  readonly codeMax: number;
  /** The fixed-point affine map (minimax line of the exact map over the codes). */
  readonly fixed: FixedPointMap;
  /** The float32 polynomial map (Chebyshev interpolant of the exact map). */
  readonly float32: FloatMap;
  /** The float64 polynomial map (same polynomial, double precision). */
  readonly float64: FloatMap;
  /** The line the fixed-point map implements: quantity = (code − offset)·scale. */
  readonly line: {
    /** Quantity per code. */
    readonly scale: number;
    /** The code where the line gives zero. */
    readonly offset: number;
  };
  /** The polynomial the float maps implement, in powers of (code − offset). */
  readonly polynomial: {
    /** Coefficients in ascending powers of (code − offset), output unit per code^k. */
    readonly coefficients: readonly number[];
    /** The code subtracted first. */
    readonly offset: number;
  };
  /** Ready for `emitCHeader` / `emitJson` of `@bridgework/firmware`. */
  readonly firmwareChannel: FirmwareChannel;
}

export function createChannelConstants(
  r: ResolvedChannel,
  nominal: Mapping,
  span: { readonly min: number; readonly max: number },
  options: ConstantsOptions = {},
): ChannelConstants {
  const o = checkObject('options', options);
  const degree =
    o['polynomialDegree'] === undefined
      ? 3
      : checkInteger('polynomialDegree', o['polynomialDegree'], { min: 1, max: 5 });
  const resolution =
    o['outputResolution'] !== undefined
      ? checkPositive('outputResolution', o['outputResolution'])
      : (r.spec.output.firmwareResolution ?? defaultResolution(span));
  const { model } = nominal;
  // The span's codes, kept strictly inside the valid codes.
  const ends = [span.min, span.max]
    .map((q) => model.exactCodeFromRatio(model.ratioFromValue(q)))
    .sort((a, b) => a - b);
  const codeMin = Math.max(Math.ceil(ends[0] as number), Math.floor(nominal.lo) + 1);
  const codeMax = Math.min(Math.floor(ends[1] as number), Math.ceil(nominal.hi) - 1);
  if (!(codeMax > codeMin)) {
    throw new BridgeworkError('out-of-range', '`output.range` must span at least two valid converter codes', {
      param: 'output.range',
      limit: [codeMin, codeMax],
    });
  }
  const exact = nominal.kernel === undefined ? nominal.valueFromCode : kernelMap(nominal);
  const line = minimaxLine(exact, codeMin, codeMax);
  const quantityUnit = asciiUnit(r.unit);
  const verification = (o['verification'] as VerificationMode | undefined) ?? 'auto';
  const fixed = fixedPointMap({
    scale: line.scale,
    offset: line.offset,
    codeMin,
    codeMax,
    outputUnit: resolution,
    quantityUnit,
    exact,
    verification,
    ...(o['coefficientBits'] === undefined ? {} : { coefficientBits: o['coefficientBits'] as number }),
    ...(o['accumulatorBits'] === undefined ? {} : { accumulatorBits: o['accumulatorBits'] as number }),
    ...(o['rounding'] === undefined ? {} : { rounding: o['rounding'] as FixedPointRounding }),
  });
  const polynomial = chebyshevPolynomial(exact, codeMin, codeMax, degree);
  const float = (precision: 'float32' | 'float64') =>
    floatMap({
      kind: 'polynomial',
      coefficients: polynomial.coefficients,
      offset: polynomial.offset,
      precision,
      codeMin,
      codeMax,
      quantityUnit,
      exact,
      verification,
    });
  const float32 = float('float32');
  const float64 = float('float64');
  return {
    codeMin,
    codeMax,
    fixed,
    float32,
    float64,
    line,
    polynomial,
    firmwareChannel: { name: r.name, fixed, float32, float64 },
  };
}

/** 1e-4 of the span's largest magnitude, rounded down to a power of ten. */
function defaultResolution(span: { min: number; max: number }): number {
  const m = Math.max(Math.abs(span.min), Math.abs(span.max));
  return 10 ** Math.floor(Math.log10(m * 1e-4));
}

/** The channel's kernel as a plain function (the exact map to within 1e-12, checked at creation). */
function kernelMap(m: Mapping): (code: number) => number {
  const k = m.kernel!;
  return (x) => (k.a * x + k.b) / (k.c * x + k.d);
}

/**
 * The best uniform line of a convex or concave map over [x1, x2] (Chebyshev's equioscillation):
 * the chord's slope, shifted by half the largest gap between map and chord. The largest gap is
 * found on 1025 points and refined by golden-section search.
 */
function minimaxLine(f: (x: number) => number, x1: number, x2: number): { scale: number; offset: number } {
  const f1 = f(x1);
  const f2 = f(x2);
  const scale = (f2 - f1) / (x2 - x1);
  const gap = (x: number) => f(x) - (f1 + scale * (x - x1));
  let best = 0;
  let bestX = x1;
  for (let i = 1; i < 1024; i++) {
    const x = x1 + ((x2 - x1) * i) / 1024;
    const g = gap(x);
    if (Math.abs(g) > Math.abs(best)) {
      best = g;
      bestX = x;
    }
  }
  let a = Math.max(x1, bestX - (x2 - x1) / 1024);
  let b = Math.min(x2, bestX + (x2 - x1) / 1024);
  const sign = Math.sign(best) || 1;
  const phi = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 60 && b - a > 1e-6; i++) {
    const c = b - phi * (b - a);
    const d = a + phi * (b - a);
    if (sign * gap(c) > sign * gap(d)) b = d;
    else a = c;
  }
  const peak = gap((a + b) / 2);
  const extreme = Math.abs(peak) > Math.abs(best) ? peak : best;
  // quantity = f1 + scale·(x − x1) + extreme/2 = (x − offset)·scale
  const intercept = f1 - scale * x1 + extreme / 2;
  return { scale, offset: -intercept / scale };
}

/**
 * The polynomial of the given degree interpolating the map at the Chebyshev nodes of
 * [x1, x2] (near-minimax), in powers of (code − offset) with offset the middle code.
 */
function chebyshevPolynomial(
  f: (x: number) => number,
  x1: number,
  x2: number,
  degree: number,
): { coefficients: number[]; offset: number } {
  const offset = Math.round((x1 + x2) / 2);
  const h = Math.max(offset - x1, x2 - offset);
  const n = degree + 1;
  const nodes = Array.from({ length: n }, (_, k) => Math.cos((Math.PI * (2 * k + 1)) / (2 * n)));
  const values = nodes.map((t) => f(offset + h * t));
  // Newton divided differences in t, then expansion to powers of t, then of (code − offset).
  const dd = [...values];
  for (let j = 1; j < n; j++) {
    for (let i = n - 1; i >= j; i--)
      dd[i] = ((dd[i] as number) - (dd[i - 1] as number)) / ((nodes[i] as number) - (nodes[i - j] as number));
  }
  let poly = [dd[n - 1] as number];
  for (let i = n - 2; i >= 0; i--) {
    // poly ← poly·(t − nodes[i]) + dd[i]
    const next = new Array<number>(poly.length + 1).fill(0);
    for (let k = 0; k < poly.length; k++) {
      next[k + 1] = (next[k + 1] as number) + (poly[k] as number);
      next[k] = (next[k] as number) - (poly[k] as number) * (nodes[i] as number);
    }
    next[0] = (next[0] as number) + (dd[i] as number);
    poly = next;
  }
  return { coefficients: poly.map((c, k) => c / h ** k), offset };
}
