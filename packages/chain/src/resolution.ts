import { checkFinite, checkInteger, checkOptions, checkPositive } from '@bridgework/core';

/**
 * Peak-to-peak noise per rms noise, 6.6: the common-practice factor for "noise-free" resolution.
 *
 * @remarks
 * For Gaussian noise, ±3.3σ contains 99.9 % of samples, so sigma-delta converter data sheets quote
 * peak-to-peak noise as 6.6 × rms and noise-free resolution from it (common practice). It is a
 * convention, not a bound: longer records show larger peaks.
 */
export const PEAK_TO_PEAK_PER_RMS = 6.6;

/** 20·log10(2) = 6.0206 dB: the SNR gained per bit. */
const DB_PER_BIT = 20 * Math.log10(2);
/** 20·log10(√(3/2)) = 10·log10(1.5) = 1.7609 dB: full-scale sine rms over q/√12, less 2^N. */
const DB_SINE_OFFSET = 10 * Math.log10(1.5);

/**
 * The ideal signal-to-noise ratio of an N-bit converter for a full-scale sine: 6.02·N + 1.76 dB,
 * in its exact form 20·log10(2^N·√(3/2)).
 *
 * @remarks
 * A full-scale sine of amplitude 2^N·q/2 has the rms 2^N·q/(2√2); ideal quantization noise is
 * q/√12 (see {@link quantizationNoiseRms}); the ratio is 2^N·√(3/2). So
 * SNR = N·20·log10(2) + 10·log10(1.5) = 6.020600·N + 1.760913 dB (IEEE Std 1241, the ideal ADC;
 * the rounded 6.02N + 1.76 of data sheets is this expression to two decimals). Within a few ulps.
 *
 * @param bits - Resolution N, an integer in [1, 64].
 * @returns SNR in dB.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer`, `out-of-range`, `not-finite`, `wrong-type`.
 * @example
 * ```ts
 * idealSnrDecibels(24); // 146.25531…
 * ```
 */
export function idealSnrDecibels(bits: number): number {
  return checkInteger('bits', bits, { min: 1, max: 64 }) * DB_PER_BIT + DB_SINE_OFFSET;
}

/**
 * Effective number of bits from a measured SINAD: (SINAD − 1.76)/6.02, in the exact form
 * (SINAD − 20·log10√(3/2))/(20·log10 2).
 *
 * @remarks
 * IEEE Std 1241 defines ENOB = log2(FSR/(NAD·√12)) with NAD the rms noise and distortion; for a
 * full-scale sine test signal (rms FSR/(2√2)) that is exactly the inverse of
 * {@link idealSnrDecibels}: ENOB = (SINAD − 10·log10 1.5)/(20·log10 2). The exact constants
 * (1.760913 and 6.020600 dB) are used rather than the rounded 1.76 and 6.02, so the function
 * inverts {@link idealSnrDecibels} to the ulp; with the rounded ones, SINAD 74 dB gives exactly
 * 12.000, with the exact ones 11.9987 (12.00 to two decimals). A sine below full scale needs its
 * level correction added to SINAD first.
 *
 * @param sinadDecibels - SINAD in dB (finite).
 * @returns ENOB in bits.
 * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`.
 * @example
 * ```ts
 * enobFromSinad(74); // 11.99865…
 * ```
 */
export function enobFromSinad(sinadDecibels: number): number {
  return (checkFinite('sinadDecibels', sinadDecibels) - DB_SINE_OFFSET) / DB_PER_BIT;
}

/** Options of {@link effectiveBits}, {@link effectiveResolutionBits} and {@link noiseFreeBits}. */
export interface NoiseResolutionOptions {
  /** rms noise in V (> 0), referred to the same point as the range. */
  readonly noiseRmsVolts: number;
  /** Full-scale range in V (> 0): the span of inputs the converter codes, e.g. {@link Adc.fullScaleRangeVolts}. */
  readonly fullScaleRangeVolts: number;
  /** Peak-to-peak per rms, for {@link noiseFreeBits} (> 0). Default {@link PEAK_TO_PEAK_PER_RMS} (6.6). */
  readonly peakToPeakFactor?: number;
}

/** log2(range/(noise·factor)) for positive finite values, without overflow or underflow on the way. */
function log2Ratio(range: number, noise: number, factor: number): number {
  const ratio = range / (noise * factor);
  if (Number.isFinite(ratio) && ratio >= Number.MIN_VALUE * 2 ** 52) return Math.log2(ratio);
  return Math.log2(range) - Math.log2(noise) - Math.log2(factor);
}

function read(
  options: NoiseResolutionOptions,
  withFactor: boolean,
): { range: number; noise: number; factor: number } {
  const known = ['noiseRmsVolts', 'fullScaleRangeVolts', ...(withFactor ? ['peakToPeakFactor'] : [])];
  const o = checkOptions('options', options, { known, required: ['noiseRmsVolts', 'fullScaleRangeVolts'] });
  return {
    range: checkPositive('fullScaleRangeVolts', o['fullScaleRangeVolts']),
    noise: checkPositive('noiseRmsVolts', o['noiseRmsVolts']),
    factor:
      o['peakToPeakFactor'] === undefined
        ? PEAK_TO_PEAK_PER_RMS
        : checkPositive('peakToPeakFactor', o['peakToPeakFactor']),
  };
}

/**
 * Effective number of bits from an rms noise, by the IEEE Std 1241 definition:
 * log2(FSR/(σ·√12)).
 *
 * @remarks
 * The number of bits of an ideal converter whose quantization noise q/√12 equals the measured
 * noise σ over the same full-scale range: an ideal N-bit converter gives exactly N. Within a few ulps.
 *
 * @param options - rms noise and full-scale range.
 * @returns ENOB in bits (may exceed the converter's bits when σ < q/√12, or be negative).
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option`.
 * @example
 * ```ts
 * effectiveBits({ noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5 }); // 20.4…
 * ```
 */
export function effectiveBits(options: NoiseResolutionOptions): number {
  const { range, noise } = read(options, false);
  return log2Ratio(range, noise, Math.sqrt(12));
}

/**
 * Effective resolution log2(FSR/σ), the figure sigma-delta converter data sheets tabulate
 * (common practice; it is √12 larger, 1.79 bits more, than the IEEE 1241 ENOB).
 *
 * @param options - rms noise and full-scale range.
 * @returns Effective resolution in bits.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option`.
 * @example
 * ```ts
 * effectiveResolutionBits({ noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5 }); // 22.25…
 * ```
 */
export function effectiveResolutionBits(options: NoiseResolutionOptions): number {
  const { range, noise } = read(options, false);
  return log2Ratio(range, noise, 1);
}

/**
 * Noise-free (flicker-free) resolution log2(FSR/(6.6·σ)): the bits that do not toggle
 * (common practice, with peak-to-peak = 6.6σ; see {@link PEAK_TO_PEAK_PER_RMS}).
 *
 * @param options - rms noise, full-scale range and optionally the peak-to-peak factor.
 * @returns Noise-free bits.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option`.
 * @example
 * ```ts
 * noiseFreeBits({ noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5 }); // 19.53…
 * ```
 */
export function noiseFreeBits(options: NoiseResolutionOptions): number {
  const { range, noise, factor } = read(options, true);
  return log2Ratio(range, noise, factor);
}
