import { checkOptions, checkPositive, requireOption } from '@bridgework/core';
import { bandwidthOf, checkFilter, flickerFactorOf, type NoiseFilter } from './filters.js';
import { checkCornerHertz, checkDensity, checkHertz } from './internal/domain.js';

/** A noise spectrum with a white floor and an optional 1/f (flicker) corner. */
export interface NoiseSpectrum {
  /** White (high-frequency) density S₀ per √Hz, in the unit of the source (V/√Hz or A/√Hz), in [0, 1]. */
  readonly whiteDensity: number;
  /** The 1/f corner frequency fc in Hz, in [0, 1e12], where the 1/f part equals the white part. Default 0 (white). */
  readonly cornerHertz?: number;
}

/** Options of {@link noiseDensityAt}. */
export interface NoiseDensityAtOptions extends NoiseSpectrum {
  /** The frequency in Hz, in [1e-9, 1e12]. */
  readonly frequencyHertz: number;
}

/** Options of {@link bandNoiseRms}. */
export interface BandNoiseOptions extends NoiseSpectrum {
  /** The filter that limits the band (see {@link NoiseFilter}). */
  readonly filter: NoiseFilter;
  /**
   * The lowest frequency of interest fL in Hz, in [1e-9, 1e12], for the 1/f part: about 1/(the time between
   * zero readings). Required when `cornerHertz` > 0; otherwise checked but without effect.
   */
  readonly lowHertz?: number;
}

/** @internal Validates a spectrum's white density and corner (param prefix for nested options). */
export function checkSpectrum(prefix: string, o: Record<string, unknown>, density: string, corner: string) {
  return {
    white: o[density] === undefined ? 0 : checkDensity(`${prefix}${density}`, o[density]),
    corner: o[corner] === undefined ? 0 : checkCornerHertz(`${prefix}${corner}`, o[corner]),
  };
}

/**
 * @internal rms of a spectrum S₀²(1 + fc/f) through a checked filter: S₀·√(ENBW + fc·F(fL)).
 * `bandwidth` is the filter's ENBW (passed in so a budget computes it once).
 */
export function integrateSpectrum(
  white: number,
  corner: number,
  filter: ReturnType<typeof checkFilter>,
  bandwidth: number,
  lowHertz: number | undefined,
  lowParam: string,
): number {
  if (white === 0) return 0;
  if (corner === 0) return white * Math.sqrt(bandwidth);
  const fl = checkHertz(lowParam, requireOption(lowParam, lowHertz, 'when a 1/f corner is given'));
  return white * Math.sqrt(bandwidth + corner * flickerFactorOf(filter, fl));
}

/**
 * The density of a noise source with a 1/f corner at one frequency: S₀·√(1 + fc/f).
 *
 * @remarks
 * The usual model of amplifier voltage and current noise (white floor plus flicker noise whose
 * power falls as 1/f, meeting the floor at the corner fc), as op-amp and in-amp data sheets specify
 * it. Exact (a few ulps).
 *
 * @param options - White density, corner and frequency.
 * @returns Density at `frequencyHertz`, in the unit of `whiteDensity`.
 * @throws {@link @bridgework/core!BridgeworkError} `negative` for a density or corner below 0;
 *   `not-positive` for the frequency; `out-of-range` for a density above 1 per √Hz or a frequency
 *   outside [1e-9, 1e12] Hz (a corner up to 1e12 Hz); `not-finite`, `wrong-type`;
 *   `unknown-option` for a key it does not know (naming the closest: `whiteDensty` is refused,
 *   never read as a zero density), `missing-option` without `whiteDensity` or `frequencyHertz`.
 * @example
 * ```ts
 * noiseDensityAt({ whiteDensity: 10e-9, cornerHertz: 100, frequencyHertz: 1 }); // 1.00498…e-7
 * ```
 */
export function noiseDensityAt(options: NoiseDensityAtOptions): number {
  const o = checkOptions('options', options, {
    known: ['whiteDensity', 'cornerHertz', 'frequencyHertz'],
    required: ['whiteDensity', 'frequencyHertz'],
  });
  const { white, corner } = checkSpectrum('', o, 'whiteDensity', 'cornerHertz');
  const f = checkHertz('frequencyHertz', o['frequencyHertz']);
  return white * Math.sqrt(1 + corner / f);
}

/**
 * The rms value of a noise source (white plus 1/f) through a filter.
 *
 * @remarks
 * rms² = ∫_{fL}^∞ S₀²(1 + fc/f)·|H(f)|² df ≈ S₀²·(ENBW + fc·F(fL)) with
 * F(fL) = ∫_{fL}^∞ |H(f)|²/f df. The white part is taken over the whole ENBW (from 0, which
 * overstates it by at most S₀²·fL: negligible and conservative); the 1/f part from fL, without
 * which it diverges. F in closed form: brick wall ln(fc/fL); Butterworth of order n (single pole:
 * n = 1) ln(1 + (fc/fL)^(2n))/(2n); two real poles
 * ½·[ln(1 + A/u) − A/(u + A)·ln(1 + δ)/δ] with A = f1², B = f2², u = fL², δ = (B − A)/(u + A);
 * sinc^k by 24-point Gauss–Legendre panels on half-unit intervals of f/f_ODR up to 1025·f_ODR plus
 * the asymptotic tail (relative error below 1e-12, tested against an independent integration),
 * using the continuous sinc model even with a finite decimation (whose response differs from it
 * by a relative k·(πf/(N·f_ODR))²/6 at frequency f). With a brick wall at fH this is the familiar S₀·√(fH + fc·ln(fH/fL)) of op-amp noise
 * application notes (from memory).
 *
 * @param options - Spectrum, filter and lowest frequency.
 * @returns The rms value, in the unit of `whiteDensity` times √Hz (V or A).
 * @throws {@link @bridgework/core!BridgeworkError} as {@link noiseDensityAt} and
 *   {@link noiseBandwidth}; `missing-option` (`lowHertz`) when a corner is given without it, or
 *   without `whiteDensity` or `filter`; `unknown-option` for a key it does not know.
 * @example
 * ```ts
 * bandNoiseRms({ whiteDensity: 10e-9, filter: { kind: 'brick-wall', cutoffHertz: 100 } }); // 1e-7
 * ```
 */
export function bandNoiseRms(options: BandNoiseOptions): number {
  const o = checkOptions('options', options, {
    known: ['whiteDensity', 'cornerHertz', 'filter', 'lowHertz'],
    required: ['whiteDensity', 'filter'],
  });
  const { white, corner } = checkSpectrum('', o, 'whiteDensity', 'cornerHertz');
  const filter = checkFilter('filter', o['filter']);
  const low = o['lowHertz'] === undefined ? undefined : checkHertz('lowHertz', o['lowHertz']);
  return integrateSpectrum(white, corner, filter, bandwidthOf(filter), low, 'lowHertz');
}

/**
 * The rms quantization noise of an ideal uniform quantizer: q/√12.
 *
 * @remarks
 * For an input that spans many codes, the rounding error is uniform on [−q/2, q/2], whose standard
 * deviation is q/√12 (W. R. Bennett, "Spectra of quantized signals", Bell Syst. Tech. J. 27, 1948;
 * IEEE Std 1241). It is a per-sample figure, not filtered by the analog bandwidth. In a
 * sigma-delta converter the modulator shapes its quantization noise: use the data sheet's noise
 * table for those (the budget's `adc.noiseRmsVolts`).
 *
 * @param lsbVolts - The step q in V (> 0), e.g. {@link Adc.lsbVolts}.
 * @returns rms noise in V.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`.
 * @example
 * ```ts
 * quantizationNoiseRms(1e-6); // 2.886751345948129e-7
 * ```
 */
export function quantizationNoiseRms(lsbVolts: number): number {
  return checkPositive('lsbVolts', lsbVolts) / Math.sqrt(12);
}
