import { BridgeworkError, checkInteger, checkOptions } from '@bridgework/core';
import { checkFilter, type SincFilter } from './filters.js';
import { sincBandwidthFactor } from './internal/sinc.js';

/** Options of {@link averagingGain}. */
export interface AveragingOptions {
  /** Number of consecutive samples averaged, M (an integer in [1, 2^30]). */
  readonly samples: number;
  /**
   * The sinc^k filter that produced the samples. Omitted: the samples are taken as uncorrelated
   * (white noise sampled slower than its bandwidth, or a sinc¹ filter).
   */
  readonly filter?: SincFilter;
}

/** What averaging M samples gains (see {@link averagingGain}). */
export interface AveragingGain {
  /** rms noise of the average over rms noise of one sample (≤ 1). */
  readonly noiseFactor: number;
  /** −log2(noiseFactor): the resolution gained, in bits. */
  readonly bitsGained: number;
  /** The output rate divided by M: rate factor 1/M. */
  readonly rateFactor: number;
  /** ENBW of the averaged output in Hz (with a filter; else `undefined`). */
  readonly noiseBandwidthHertz: number | undefined;
}

/**
 * The noise reduction from averaging M consecutive converter outputs, and its gain in bits.
 *
 * @remarks
 * Uncorrelated samples: the variance falls by M, so the rms falls by √M and the gain is
 * ½·log2(M) bits (common practice: four samples for one bit).
 *
 * A sinc^k filter with k ≥ 2 produces correlated outputs (its impulse response spans k output
 * periods), so averaging gains less. For white input noise the variance of the average of M
 * outputs is exact in terms of the kernel's autocorrelation r(l) at lags of whole output periods:
 * Var(avg)/Var(one) = Σ_{|l|<M} (M − |l|)·r(l)/(M²·r(0)), with r(l) the centred B-spline M_2k(l)
 * in the continuous limit or the integer kernel's autocorrelation with a decimation N (both exact,
 * in integer arithmetic). In the continuous limit the averaged output's ENBW is
 * f_ODR·½·Σ_{|l|<M} (M − |l|)·M_2k(l)/M², which tends to f_ODR/(2M) for large M whatever k, since
 * Σ_l M_2k(l) = 1: a sinc³ average of many samples gains √(0.55·M) rather than √M. Averaging does not reduce 1/f noise in the same proportion; this
 * function is for white noise.
 *
 * @param options - Samples averaged and optionally the sinc filter that produced them.
 * @returns Noise factor, bits gained, rate factor and the averaged ENBW.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer` or `out-of-range` for `samples`;
 *   `invalid-option` for a filter that is not a sinc filter; filter errors as
 *   {@link noiseBandwidth}; `unknown-option` for a key it does not know (naming the closest),
 *   `missing-option` without `samples`.
 * @example
 * ```ts
 * averagingGain({ samples: 16 }).bitsGained; // 2
 * averagingGain({ samples: 16, filter: { kind: 'sinc', order: 3, dataRateHertz: 10 } }).bitsGained; // 1.59…
 * ```
 */
export function averagingGain(options: AveragingOptions): AveragingGain {
  const o = checkOptions('options', options, { known: ['samples', 'filter'], required: ['samples'] });
  const samples = checkInteger('samples', o['samples'], { min: 1, max: 2 ** 30 });
  if (o['filter'] === undefined) {
    return {
      noiseFactor: 1 / Math.sqrt(samples),
      bitsGained: Math.log2(samples) / 2,
      rateFactor: 1 / samples,
      noiseBandwidthHertz: undefined,
    };
  }
  const filter = checkFilter('filter', o['filter']);
  if (filter.kind !== 'sinc') {
    throw new BridgeworkError(
      'invalid-option',
      `\`filter.kind\` must be 'sinc' for averaging; got '${filter.kind}'`,
      {
        param: 'filter.kind',
        value: (o['filter'] as { kind: unknown }).kind,
        limit: ['sinc'],
      },
    );
  }
  const single = sincBandwidthFactor(filter.order, filter.decimation, 1);
  const averaged = sincBandwidthFactor(filter.order, filter.decimation, samples);
  const noiseFactor = Math.sqrt(averaged / single);
  return {
    noiseFactor,
    bitsGained: -Math.log2(noiseFactor),
    rateFactor: 1 / samples,
    noiseBandwidthHertz: averaged * filter.dataRateHertz,
  };
}
