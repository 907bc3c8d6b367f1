import { checkFinite, checkInteger, checkOptions, checkVolts } from '@bridgework/core';
import { checkGain } from './internal/domain.js';
import { checkBoolean } from './internal/checkBoolean.js';
import { signOfProductDifference } from './internal/exact.js';
import { roundHalfEven } from './internal/rounding.js';
import { effectiveBits, idealSnrDecibels, noiseFreeBits } from './resolution.js';
import type { Interval } from '@bridgework/core';

/** Options of {@link createAdc}. */
export interface AdcOptions {
  /** Resolution N in bits, an integer in [1, 32]. */
  readonly bits: number;
  /** Reference voltage in V, in [1e-9, 1e6]. In ratiometric use, the nominal value of the excitation used as reference. */
  readonly referenceVolts: number;
  /** Bipolar (two's complement, ±full scale) or unipolar (straight binary, 0 to full scale). Default true. */
  readonly bipolar?: boolean;
  /**
   * The analog gain in front of the quantizer, in [1e-9, 1e9]: a programmable-gain amplifier inside the
   * converter, or the whole front-end gain. Every input-referred figure divides by it. Default 1.
   */
  readonly gain?: number;
  /**
   * The reference is the bridge excitation (measured at the bridge or at the instrument), so codes
   * map to the ratio Vin/Vexc whatever the excitation's exact value. Adds `codeFromRatio`,
   * `ratioFromCode` and `countsPerRatio`. Default false.
   */
  readonly ratiometric?: boolean;
}

/** A converter code with its flags (see {@link Adc.codeFromVolts}). */
export interface AdcCode {
  /** The output code, an integer in [`codeMin`, `codeMax`]. */
  readonly code: number;
  /**
   * True when the input lay beyond what the codes cover (the nearest code was outside
   * [`codeMin`, `codeMax`]), so `code` is a rail value that does not represent the input.
   */
  readonly clipped: boolean;
  /**
   * True when `code` is `codeMin` or `codeMax`. A receiver of codes cannot tell a rail code of an
   * in-range input from a clipped one, so downstream conversion treats every rail code as invalid.
   */
  readonly atRail: boolean;
}

/**
 * An ideal converter: coding rules, input-referred step and counts, and its ideal noise figures
 * (see {@link createAdc}). Every field is a plain number, so a per-sample kernel can fold them in.
 */
export interface Adc {
  /** Resolution N in bits. */
  readonly bits: number;
  /** Reference voltage in V. */
  readonly referenceVolts: number;
  /** Analog gain in front of the quantizer. */
  readonly gain: number;
  /** Two's complement ±full scale (true) or straight binary 0…full scale (false). */
  readonly bipolar: boolean;
  /** Whether the reference is the excitation (see {@link RatiometricAdc}). */
  readonly ratiometric: boolean;
  /** Codes per reference at unit gain: 2^(N−1) bipolar, 2^N unipolar. */
  readonly codeScale: number;
  /** Lowest code: −2^(N−1) bipolar, 0 unipolar. */
  readonly codeMin: number;
  /** Highest code: 2^(N−1) − 1 bipolar, 2^N − 1 unipolar. */
  readonly codeMax: number;
  /** Input-referred step in V: referenceVolts/(gain·codeScale). */
  readonly lsbVolts: number;
  /** Input-referred counts per volt: gain·codeScale/referenceVolts. */
  readonly countsPerVolt: number;
  /** Nominal input-referred full scale in V: [−ref/gain, +ref/gain] bipolar, [0, ref/gain] unipolar. */
  readonly fullScaleVolts: Interval;
  /** fullScaleVolts.max − fullScaleVolts.min = 2^N·lsbVolts, in V. */
  readonly fullScaleRangeVolts: number;
  /**
   * Input-referred inputs whose code lies strictly inside the rails, in V:
   * ((codeMin + ½)·lsb, (codeMax − ½)·lsb). Outside it the code is a rail code.
   */
  readonly unclippedInputVolts: Interval;
  /** Input-referred ideal quantization noise lsbVolts/√12, in V rms. */
  readonly quantizationNoiseRmsVolts: number;
  /** Ideal SNR for a full-scale sine, 20·log10(2^N·√(3/2)) dB. */
  readonly idealSnrDecibels: number;
  /**
   * The code for an input voltage (input-referred, at the amplifier input): the nearest integer to
   * gain·volts/referenceVolts·codeScale, ties to even, decided exactly; clipped to the code range.
   *
   * @param volts - Input in V (finite).
   * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`.
   */
  codeFromVolts(volts: number): AdcCode;
  /**
   * The input voltage at the centre of a code's step: code·lsbVolts (exactly this product, within
   * 2 ulps of code·referenceVolts/(gain·codeScale)).
   *
   * @param code - An integer in [codeMin, codeMax].
   * @throws {@link @bridgework/core!BridgeworkError} `not-integer`, `out-of-range`, `not-finite`, `wrong-type`.
   */
  voltsFromCode(code: number): number;
  /**
   * True for a code at or beyond the rails (≤ codeMin or ≥ codeMax).
   *
   * @param code - A code (finite number).
   * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`.
   */
  isRail(code: number): boolean;
  /**
   * IEEE Std 1241 effective bits for an input-referred rms noise, over this full scale (see {@link effectiveBits}).
   *
   * @param noiseRmsVolts - rms noise in V (> 0), input-referred.
   */
  effectiveBits(noiseRmsVolts: number): number;
  /**
   * Noise-free bits for an input-referred rms noise, over this full scale (see {@link noiseFreeBits}).
   *
   * @param noiseRmsVolts - rms noise in V (> 0), input-referred.
   * @param peakToPeakFactor - Peak-to-peak per rms (> 0). Default 6.6.
   */
  noiseFreeBits(noiseRmsVolts: number, peakToPeakFactor?: number): number;
}

/** A ratiometric converter: codes map to the ratio Vin/Vexc (see {@link createAdc}). */
export interface RatiometricAdc extends Adc {
  /** Always true. */
  readonly ratiometric: true;
  /** Counts per unit ratio (per V/V): gain·codeScale, exact. 1 mV/V is countsPerRatio/1000 counts. */
  readonly countsPerRatio: number;
  /**
   * The code for a ratio Vin/Vexc (V/V): the nearest integer to gain·ratio·codeScale, ties to even,
   * decided exactly; clipped to the code range.
   *
   * @param ratio - Vin/Vexc in V/V (finite).
   * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`.
   */
  codeFromRatio(ratio: number): AdcCode;
  /**
   * The ratio at the centre of a code's step: code/countsPerRatio (correctly rounded).
   *
   * @param code - An integer in [codeMin, codeMax].
   * @throws {@link @bridgework/core!BridgeworkError} `not-integer`, `out-of-range`, `not-finite`, `wrong-type`.
   */
  ratioFromCode(code: number): number;
}

const TWO_POW_40 = 2 ** 40;

/**
 * The nearest integer to a·b/den with ties to even, decided exactly. The quotient t is computed in
 * floating point (two roundings: |t − x| ≤ 2.0000001·2⁻⁵³·|x|); only when t lies within 2ε·|t| of a
 * half-integer h is the side of h decided by the exact sign of a·b − h·den.
 */
function nearestInteger(a: number, b: number, den: number): number {
  const t = (a * b) / den;
  if (!(Math.abs(t) < TWO_POW_40)) return t; // far beyond any code range (or ±∞): clipped by the caller
  const f = Math.floor(t);
  const h = f + 0.5;
  if (Math.abs(t - h) > 2 * Number.EPSILON * Math.abs(t)) return roundHalfEven(t) + 0;
  const side = signOfProductDifference(a, b, h, den);
  if (side > 0) return f + 1;
  if (side < 0) return f + 0;
  return f % 2 === 0 ? f + 0 : f + 1;
}

/**
 * Creates an ideal analog-to-digital converter model with its coding, rounding and clipping rules.
 *
 * @remarks
 * Coding (N bits, gain G, reference Vref, s = codeScale):
 * - bipolar (default): two's complement, code = G·Vin/Vref·2^(N−1), codes −2^(N−1) … 2^(N−1) − 1,
 *   full scale ±Vref/G, lsbVolts = Vref/(G·2^(N−1));
 * - unipolar: straight binary, code = G·Vin/Vref·2^N, codes 0 … 2^N − 1, full scale 0 … Vref/G,
 *   lsbVolts = Vref/(G·2^N);
 * - ratiometric: the reference is the excitation, so code = G·(Vin/Vexc)·s and
 *   countsPerRatio = G·s (24 bits, G = 128: 2^30 = 1 073 741 824 counts per V/V, so 1 mV/V is
 *   1 073 741.824 counts).
 *
 * Rounding: to the nearest code, ties to even (IEEE 754 roundTiesToEven), implemented explicitly
 * (`Math.round` rounds ties toward +∞). The decision is exact: the quotient is formed in floating
 * point, and when it lies within two ulps of a tie the side is decided by an exact integer
 * comparison of G·Vin·s with (k + ½)·Vref. Code centres sit at integer multiples of the step (a
 * mid-tread quantizer: 0 V gives code 0). This is the ideal transfer function of IEEE Std 1241.
 *
 * Clipping: a nearest code outside [codeMin, codeMax] is replaced by the rail and flagged
 * `clipped`; every rail code is flagged `atRail`. Converters differ in what they output beyond
 * full scale; treat rail codes as invalid (the channel package does).
 *
 * All fields are plain numbers (bits, gain, referenceVolts, codeMin, codeMax, lsbVolts,
 * countsPerVolt, countsPerRatio) for per-sample kernels that fold them into their own loops:
 * `voltsFromCode(c)` is exactly `c * lsbVolts`, `ratioFromCode(c)` exactly `c / countsPerRatio`.
 *
 * @param options - Bits, reference, polarity, gain, ratiometric.
 * @returns The converter; a {@link RatiometricAdc} when `ratiometric` is true.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer` or `out-of-range` for bits outside
 *   [1, 32]; `not-positive`, `not-finite`, `wrong-type` for the reference or gain, `out-of-range`
 *   for a reference outside [1e-9, 1e6] V or a gain outside [1e-9, 1e9]; `wrong-type` for
 *   non-boolean flags; `unknown-option` for a key it does not know (naming the closest),
 *   `missing-option` without `bits` or `referenceVolts`.
 * @example
 * ```ts
 * const adc = createAdc({ bits: 24, referenceVolts: 2.5, gain: 128, ratiometric: true });
 * adc.countsPerRatio; // 1073741824
 * adc.codeFromRatio(1e-3); // { code: 1073742, clipped: false, atRail: false }
 * adc.lsbVolts; // 2.3283064365386963e-9
 * ```
 */
export function createAdc(options: AdcOptions & { readonly ratiometric: true }): RatiometricAdc;
/**
 * Creates an ideal analog-to-digital converter model (see the ratiometric overload for the
 * coding, rounding and clipping rules).
 *
 * @param options - Bits, reference, polarity, gain, ratiometric.
 * @returns The converter; a {@link RatiometricAdc} when `ratiometric` is true.
 * @throws {@link @bridgework/core!BridgeworkError} as the ratiometric overload.
 * @example
 * ```ts
 * const adc = createAdc({ bits: 16, referenceVolts: 4.096 });
 * adc.lsbVolts; // 0.000125
 * adc.codeFromVolts(-4.2); // { code: -32768, clipped: true, atRail: true }
 * ```
 */
export function createAdc(options: AdcOptions): Adc | RatiometricAdc;
export function createAdc(options: AdcOptions): Adc | RatiometricAdc {
  const o = checkOptions('options', options, {
    known: ['bits', 'referenceVolts', 'bipolar', 'gain', 'ratiometric'],
    required: ['bits', 'referenceVolts'],
  });
  const bits = checkInteger('bits', o['bits'], { min: 1, max: 32 });
  const referenceVolts = checkVolts('referenceVolts', o['referenceVolts']);
  const bipolar = checkBoolean('bipolar', o['bipolar'], true);
  const gain = o['gain'] === undefined ? 1 : checkGain('gain', o['gain']);
  const ratiometric = checkBoolean('ratiometric', o['ratiometric'], false);

  const codeScale = bipolar ? 2 ** (bits - 1) : 2 ** bits;
  const codeMin = bipolar ? -codeScale : 0;
  const codeMax = codeScale - 1;
  const lsbVolts = referenceVolts / gain / codeScale;
  const countsPerVolt = (gain * codeScale) / referenceVolts;
  const fullScaleMax = referenceVolts / gain;
  const fullScaleVolts: Interval = { min: bipolar ? -fullScaleMax : 0, max: fullScaleMax };

  function flagged(k: number): AdcCode {
    if (k > codeMax) return { code: codeMax, clipped: true, atRail: true };
    if (k < codeMin) return { code: codeMin, clipped: true, atRail: true };
    return { code: k, clipped: false, atRail: k === codeMax || k === codeMin };
  }
  const checkCode = (code: number): number => checkInteger('code', code, { min: codeMin, max: codeMax });

  const adc: Adc = {
    bits,
    referenceVolts,
    gain,
    bipolar,
    ratiometric,
    codeScale,
    codeMin,
    codeMax,
    lsbVolts,
    countsPerVolt,
    fullScaleVolts,
    fullScaleRangeVolts: fullScaleVolts.max - fullScaleVolts.min,
    unclippedInputVolts: { min: (codeMin + 0.5) * lsbVolts, max: (codeMax - 0.5) * lsbVolts },
    quantizationNoiseRmsVolts: lsbVolts / Math.sqrt(12),
    idealSnrDecibels: idealSnrDecibels(bits),
    codeFromVolts(volts: number): AdcCode {
      // x = gain·(volts·s)/ref; volts·s is exact (a power of two), barring overflow (then clipped).
      return flagged(nearestInteger(gain, checkFinite('volts', volts) * codeScale, referenceVolts));
    },
    voltsFromCode(code: number): number {
      return checkCode(code) * lsbVolts;
    },
    isRail(code: number): boolean {
      const c = checkFinite('code', code);
      return c <= codeMin || c >= codeMax;
    },
    effectiveBits(noiseRmsVolts: number): number {
      return effectiveBits({ noiseRmsVolts, fullScaleRangeVolts: fullScaleVolts.max - fullScaleVolts.min });
    },
    noiseFreeBits(noiseRmsVolts: number, peakToPeakFactor?: number): number {
      return noiseFreeBits({
        noiseRmsVolts,
        fullScaleRangeVolts: fullScaleVolts.max - fullScaleVolts.min,
        ...(peakToPeakFactor === undefined ? {} : { peakToPeakFactor }),
      });
    },
  };
  if (!ratiometric) return adc;
  const countsPerRatio = gain * codeScale;
  const ratiometricAdc: RatiometricAdc = {
    ...adc,
    ratiometric: true,
    countsPerRatio,
    codeFromRatio(ratio: number): AdcCode {
      return flagged(nearestInteger(gain, checkFinite('ratio', ratio) * codeScale, 1));
    },
    ratioFromCode(code: number): number {
      return checkCode(code) / countsPerRatio;
    },
  };
  return ratiometricAdc;
}
