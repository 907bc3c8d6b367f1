import {
  BridgeworkError,
  checkInteger,
  checkLength,
  checkNonNegative,
  checkObject,
  checkOneOf,
  checkOptions,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { FREQUENCY_LIMITS_HERTZ, checkHertz } from './internal/domain.js';
import { gaussLegendre } from './internal/quadrature.js';
import { sincBandwidthFactor, sincGain, sinPi } from './internal/sinc.js';

/** A first-order low-pass (one real pole): |H(f)|² = 1/(1 + (f/fc)²). */
export interface SinglePoleFilter {
  /** Discriminant. */
  readonly kind: 'single-pole';
  /** The −3 dB (pole) frequency fc in Hz, in [1e-9, 1e12]. */
  readonly cutoffHertz: number;
}

/** An n-th order Butterworth low-pass: |H(f)|² = 1/(1 + (f/fc)^(2n)). */
export interface ButterworthFilter {
  /** Discriminant. */
  readonly kind: 'butterworth';
  /** The −3 dB frequency fc in Hz, in [1e-9, 1e12]. */
  readonly cutoffHertz: number;
  /** The order n, an integer in [1, 10]. Default 2. */
  readonly order?: number;
}

/** Two cascaded, non-interacting real poles: |H(f)|² = 1/((1 + (f/f1)²)(1 + (f/f2)²)). */
export interface TwoRealPolesFilter {
  /** Discriminant. */
  readonly kind: 'two-real-poles';
  /** The two pole frequencies [f1, f2] in Hz (each in [1e-9, 1e12]; equal poles allowed). */
  readonly poleHertz: readonly [number, number];
}

/** An ideal low-pass: |H(f)| = 1 below fc and 0 above. */
export interface BrickWallFilter {
  /** Discriminant. */
  readonly kind: 'brick-wall';
  /** The cut-off frequency fc in Hz, in [1e-9, 1e12]. */
  readonly cutoffHertz: number;
}

/**
 * A sinc^k digital filter of a sigma-delta converter (k cascaded moving sums, decimated to the
 * output data rate).
 */
export interface SincFilter {
  /** Discriminant. */
  readonly kind: 'sinc';
  /** The order k, an integer in [1, 5]. */
  readonly order: number;
  /** The output data rate f_ODR in Hz, in [1e-9, 1e12]; the first null of the response lies at f_ODR. */
  readonly dataRateHertz: number;
  /**
   * The decimation ratio N (an integer in [1, 2^24]; modulator rate = N·f_ODR). Default: the continuous limit
   * N → ∞, |H(f)| = |sin(πf/f_ODR)/(πf/f_ODR)|^k, which data sheets quote and which is within about
   * k·(πf/(N·f_ODR))²/6 of the discrete response at low frequency.
   */
  readonly decimation?: number;
}

/** A filter that sets the noise bandwidth of a channel. */
export type NoiseFilter =
  SinglePoleFilter | ButterworthFilter | TwoRealPolesFilter | BrickWallFilter | SincFilter;

/** Every {@link NoiseFilter} kind, for option checks. */
export const noiseFilterKinds: readonly NoiseFilter['kind'][] = [
  'single-pole',
  'butterworth',
  'two-real-poles',
  'brick-wall',
  'sinc',
];

/** @internal A validated filter with its defaults applied. */
export type CheckedFilter =
  | { readonly kind: 'butterworth'; readonly cutoffHertz: number; readonly order: number }
  | { readonly kind: 'two-real-poles'; readonly low: number; readonly high: number }
  | { readonly kind: 'brick-wall'; readonly cutoffHertz: number }
  | {
      readonly kind: 'sinc';
      readonly order: number;
      readonly dataRateHertz: number;
      readonly decimation: number | undefined;
    };

/** @internal Validates a filter description; a single pole is a first-order Butterworth. */
const filterKeys: Readonly<Record<NoiseFilter['kind'], { known: string[]; required: string[] }>> = {
  'single-pole': { known: ['kind', 'cutoffHertz'], required: ['cutoffHertz'] },
  butterworth: { known: ['kind', 'cutoffHertz', 'order'], required: ['cutoffHertz'] },
  'two-real-poles': { known: ['kind', 'poleHertz'], required: ['poleHertz'] },
  'brick-wall': { known: ['kind', 'cutoffHertz'], required: ['cutoffHertz'] },
  sinc: { known: ['kind', 'order', 'dataRateHertz', 'decimation'], required: ['order', 'dataRateHertz'] },
};

export function checkFilter(param: string, value: unknown): CheckedFilter {
  const kind = checkOneOf(`${param}.kind`, checkObject(param, value)['kind'], noiseFilterKinds);
  const o = checkOptions(param, value, filterKeys[kind]);
  switch (kind) {
    case 'single-pole':
      return {
        kind: 'butterworth',
        cutoffHertz: checkHertz(`${param}.cutoffHertz`, o['cutoffHertz']),
        order: 1,
      };
    case 'butterworth':
      return {
        kind,
        cutoffHertz: checkHertz(`${param}.cutoffHertz`, o['cutoffHertz']),
        order: o['order'] === undefined ? 2 : checkInteger(`${param}.order`, o['order'], { min: 1, max: 10 }),
      };
    case 'two-real-poles': {
      const poles = checkLength<unknown>(`${param}.poleHertz`, o['poleHertz'], 2);
      const f1 = checkHertz(`${param}.poleHertz[0]`, poles[0]);
      const f2 = checkHertz(`${param}.poleHertz[1]`, poles[1]);
      return { kind, low: Math.min(f1, f2), high: Math.max(f1, f2) };
    }
    case 'brick-wall':
      return { kind, cutoffHertz: checkHertz(`${param}.cutoffHertz`, o['cutoffHertz']) };
    case 'sinc':
      return {
        kind,
        order: checkInteger(`${param}.order`, o['order'], { min: 1, max: 5 }),
        dataRateHertz: checkHertz(`${param}.dataRateHertz`, o['dataRateHertz']),
        decimation:
          o['decimation'] === undefined
            ? undefined
            : checkInteger(`${param}.decimation`, o['decimation'], { min: 1, max: 2 ** 24 }),
      };
  }
}

/** @internal ENBW of a checked filter, in Hz. */
export function bandwidthOf(f: CheckedFilter): number {
  switch (f.kind) {
    case 'butterworth': {
      const a = Math.PI / (2 * f.order);
      return (f.cutoffHertz * a) / Math.sin(a);
    }
    case 'two-real-poles':
      return (Math.PI / 2) * ((f.low * f.high) / (f.low + f.high));
    case 'brick-wall':
      return f.cutoffHertz;
    case 'sinc':
      return f.dataRateHertz * sincBandwidthFactor(f.order, f.decimation);
  }
}

/** @internal |H(f)| of a checked filter (DC gain 1). */
export function gainOf(f: CheckedFilter, frequencyHertz: number): number {
  const x = Math.abs(frequencyHertz);
  switch (f.kind) {
    case 'butterworth':
      return 1 / Math.sqrt(1 + (x / f.cutoffHertz) ** (2 * f.order));
    case 'two-real-poles':
      return 1 / Math.sqrt((1 + (x / f.low) ** 2) * (1 + (x / f.high) ** 2));
    case 'brick-wall':
      return x <= f.cutoffHertz ? 1 : 0;
    case 'sinc':
      return sincGain(f.order, f.decimation, x / f.dataRateHertz);
  }
}

/** log(1 + e^t) without overflow. */
function softplus(t: number): number {
  return t > 30 ? t + Math.log1p(Math.exp(-t)) : Math.log1p(Math.exp(t));
}

// ∫_{n}^{∞} sinc^(2k)(x)/x dx for integer n ≥ 1, cached per (k, n = 1).
const PANELS = 1024;
const tailCache = new Map<number, number>();

function sincPower(x: number, power: number): number {
  return (sinPi(x) / (Math.PI * x)) ** power;
}

function sincTail(order: number, from: number): number {
  if (from === 1 && tailCache.has(order)) return tailCache.get(order) as number;
  const power = 2 * order;
  const g = (x: number): number => sincPower(x, power) / x;
  let sum = 0;
  for (let i = 0; i < PANELS; i++) {
    const a = from + i;
    sum += gaussLegendre(g, a, a + 0.5) + gaussLegendre(g, a + 0.5, a + 1);
  }
  // Beyond X = from + PANELS: sin^(2k) averages C(2k, k)/4^k, so the tail is
  // C(2k,k)/(4^k·π^(2k)·2k·X^(2k)), with a relative error of order 1/X² (by parts).
  let central = 1;
  for (let i = 1; i <= order; i++) central = (central * (order + i)) / i;
  const X = from + PANELS;
  sum += central / (4 ** order * Math.PI ** power * power * X ** power);
  if (from === 1) tailCache.set(order, sum);
  return sum;
}

/**
 * @internal ∫_{fL}^∞ |H(f)|²/f df: the factor that multiplies a 1/f corner frequency fc in the
 * integrated noise power S₀·(ENBW + fc·F). Closed forms for the brick-wall, Butterworth and
 * two-real-pole filters; for sinc^k, 24-point Gauss–Legendre panels plus an asymptotic tail
 * (continuous model, also used with a finite decimation).
 */
export function flickerFactorOf(f: CheckedFilter, lowHertz: number): number {
  switch (f.kind) {
    case 'brick-wall':
      return lowHertz < f.cutoffHertz ? Math.log(f.cutoffHertz / lowHertz) : 0;
    case 'butterworth':
      // ∫ df/(f(1 + (f/fc)^(2n))) from fL to ∞ = ln(1 + (fc/fL)^(2n))/(2n).
      return softplus(2 * f.order * Math.log(f.cutoffHertz / lowHertz)) / (2 * f.order);
    case 'two-real-poles': {
      // With A = f1², B = f2² (A ≤ B), u = fL²: partial fractions give
      // F = ½·[ln(1 + A/u) − A/(u + A)·ln(1 + δ)/δ], δ = (B − A)/(u + A) (→ 1 as δ → 0).
      const u = lowHertz * lowHertz;
      const A = f.low * f.low;
      const B = f.high * f.high;
      const delta = (B - A) / (u + A);
      const divided = delta === 0 ? 1 : Math.log1p(delta) / delta;
      return 0.5 * (Math.log1p(A / u) - (A / (u + A)) * divided);
    }
    case 'sinc': {
      const xL = lowHertz / f.dataRateHertz;
      const power = 2 * f.order;
      if (xL < 1) {
        // ∫_{xL}^1 (sinc^(2k) − 1)/x dx + ln(1/xL) + ∫_1^∞ sinc^(2k)/x dx.
        const h = (x: number): number => (sincPower(x, power) - 1) / x;
        const mid = (xL + 1) / 2;
        return gaussLegendre(h, xL, mid) + gaussLegendre(h, mid, 1) - Math.log(xL) + sincTail(f.order, 1);
      }
      const n0 = Math.ceil(xL);
      const g = (x: number): number => sincPower(x, power) / x;
      return (n0 > xL ? gaussLegendre(g, xL, n0) : 0) + sincTail(f.order, n0);
    }
  }
}

/**
 * Equivalent noise bandwidth (ENBW) of a filter, one-sided, in Hz.
 *
 * @remarks
 * ENBW = ∫₀^∞ |H(f)|² df / |H(0)|²: white noise of density S₀ (per √Hz) through the filter has the
 * rms value S₀·√ENBW. Closed forms:
 *
 * | filter | ENBW |
 * |---|---|
 * | single pole at fc | (π/2)·fc ≈ 1.5708·fc |
 * | Butterworth of order n at fc | fc·(π/2n)/sin(π/2n) (n = 2: π/(2√2)·fc ≈ 1.1107·fc) |
 * | two real poles f1, f2 | (π/2)·f1·f2/(f1 + f2) (equal poles: (π/4)·fc) |
 * | brick wall at fc | fc |
 * | sinc^k, continuous | f_ODR·½·M_2k(0) = f_ODR·Σ_{j=0}^{k} (−1)^j C(2k, j)(k − j)^(2k−1) / (2·(2k − 1)!) |
 * | sinc^k, decimation N | f_ODR·N·r(0)/(2·N^(2k)), r(0) = Σ h[n]² of the integer kernel |
 *
 * The Butterworth integral is the standard ∫₀^∞ dx/(1 + x^(2n)) = (π/2n)/sin(π/2n); the two-pole
 * form follows by partial fractions; the sinc^k forms come from Parseval: ∫|H|² equals the
 * kernel's autocorrelation at lag 0 (a B-spline value in the continuous limit, which also gives
 * the classical ∫₀^∞ (sin x/x)^(2k) dx). Sinc values: k = 1 → 0.5, 2 → 1/3, 3 → 0.275 (11/40),
 * 4 → 151/630 ≈ 0.23968, 5 → 15619/72576 ≈ 0.21521 times f_ODR. The sinc forms are evaluated in
 * exact integer arithmetic, so they are within one ulp; the others within a few ulps. The tests
 * check every form against direct numerical integration of |H(f)|² and the discrete sinc form
 * against the brute-force sum of the squared kernel.
 *
 * @param filter - The filter (see {@link NoiseFilter}).
 * @returns ENBW in Hz.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown kind;
 *   `not-positive`, `not-finite`, `wrong-type` for a bad frequency, `out-of-range` for one
 *   outside [1e-9, 1e12] Hz; `not-integer` or `out-of-range` for a bad order or decimation;
 *   `invalid-shape` for `poleHertz` not of length 2; `unknown-option` for a key the filter's kind
 *   does not have (naming the closest), `missing-option` for one it needs.
 * @example
 * ```ts
 * noiseBandwidth({ kind: 'single-pole', cutoffHertz: 10 }); // 15.707963267948966
 * noiseBandwidth({ kind: 'sinc', order: 3, dataRateHertz: 10 }); // 2.75
 * ```
 */
export function noiseBandwidth(filter: NoiseFilter): number {
  return bandwidthOf(checkFilter('filter', filter));
}

/**
 * The magnitude of a filter's response |H(f)| at a frequency, normalised to 1 at DC.
 *
 * @remarks
 * Single pole 1/√(1 + (f/fc)²); Butterworth 1/√(1 + (f/fc)^(2n)); two real poles
 * 1/√((1 + (f/f1)²)(1 + (f/f2)²)); brick wall 1 for f ≤ fc, else 0; sinc^k
 * |sin(πf/f_ODR)/(πf/f_ODR)|^k, or with decimation N |sin(πf/f_ODR)/(N·sin(πf/(N·f_ODR)))|^k.
 * The sine is evaluated with exact argument reduction, so the nulls at multiples of f_ODR are
 * exactly 0. Negative frequencies give the same value as positive ones.
 *
 * @param filter - The filter.
 * @param frequencyHertz - Frequency in Hz, within ±1e12.
 * @returns |H(f)|, dimensionless in [0, 1].
 * @throws {@link @bridgework/core!BridgeworkError} as {@link noiseBandwidth}; `not-finite` or
 *   `wrong-type` for a bad frequency, `out-of-range` for one beyond ±1e12 Hz.
 * @example
 * ```ts
 * filterGain({ kind: 'single-pole', cutoffHertz: 10 }, 10); // 0.7071067811865475
 * filterGain({ kind: 'sinc', order: 3, dataRateHertz: 10 }, 50); // 0
 * ```
 */
export function filterGain(filter: NoiseFilter, frequencyHertz: number): number {
  const f = checkFilter('filter', filter);
  const limit = FREQUENCY_LIMITS_HERTZ.max;
  return gainOf(f, checkRange('frequencyHertz', frequencyHertz, { min: -limit, max: limit }));
}

/**
 * The attenuation of a filter at a frequency, in dB (positive = attenuated): −20·log10|H(f)|.
 *
 * @remarks
 * `Infinity` at an exact null (a sinc^k filter at a multiple of its output data rate, a brick wall
 * above its cut-off). For a sinc^k filter this is the rejection of an interfering tone such as
 * mains hum; see {@link mainsRejection} for the worst case over a band around it.
 *
 * @param filter - The filter.
 * @param frequencyHertz - Frequency in Hz, within ±1e12.
 * @returns Attenuation in dB (≥ 0; `Infinity` at a null).
 * @throws {@link @bridgework/core!BridgeworkError} as {@link filterGain}.
 * @example
 * ```ts
 * rejectionDecibels({ kind: 'sinc', order: 3, dataRateHertz: 10 }, 49); // 101.84…
 * ```
 */
export function rejectionDecibels(filter: NoiseFilter, frequencyHertz: number): number {
  return -20 * Math.log10(filterGain(filter, frequencyHertz));
}

/** Options of {@link mainsRejection}. */
export interface MainsRejectionOptions {
  /** The filter (any kind; the interesting one is sinc^k). */
  readonly filter: NoiseFilter;
  /** Nominal mains frequency in Hz (> 0), typically 50 or 60. */
  readonly mainsHertz: number;
  /** Half-width of the band checked around the nominal frequency in Hz (≥ 0). Default 1. */
  readonly deviationHertz?: number;
}

/** The rejection of an interfering tone at and around a nominal frequency (see {@link mainsRejection}). */
export interface MainsRejection {
  /** Attenuation at the nominal frequency in dB (`Infinity` at an exact null). */
  readonly nominalDecibels: number;
  /**
   * The smallest attenuation anywhere in [f − δ, f + δ], in dB: the guaranteed rejection
   * (`Infinity` only when δ is 0, or below the spacing of doubles at f, and f is an exact null).
   */
  readonly worstDecibels: number;
  /** Where in the band the smallest attenuation occurs, in Hz. */
  readonly worstFrequencyHertz: number;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** The most pieces (spans between the nulls of a sinc filter) {@link mainsRejection} searches. */
const MAX_BAND_PIECES = 100_000;

/** Maximum of a unimodal g on [a, b] by golden-section search (to 1e-12 relative in f), endpoints included. */
function maxOnPiece(g: (f: number) => number, a: number, b: number): [number, number] {
  let best: [number, number] = g(a) >= g(b) ? [a, g(a)] : [b, g(b)];
  let lo = a;
  let hi = b;
  let x1 = hi - GOLDEN * (hi - lo);
  let x2 = lo + GOLDEN * (hi - lo);
  let g1 = g(x1);
  let g2 = g(x2);
  while (hi - lo > 1e-12 * Math.max(Math.abs(hi), 1e-300)) {
    if (g1 < g2) {
      lo = x1;
      x1 = x2;
      g1 = g2;
      x2 = lo + GOLDEN * (hi - lo);
      g2 = g(x2);
    } else {
      hi = x2;
      x2 = x1;
      g2 = g1;
      x1 = hi - GOLDEN * (hi - lo);
      g1 = g(x1);
    }
  }
  for (const [x, v] of [
    [x1, g1],
    [x2, g2],
  ] as const) {
    if (v > best[1]) best = [x, v];
  }
  return best;
}

/**
 * The rejection of mains hum by a filter: at the nominal frequency and the worst case over a band
 * of ±δ around it (the mains frequency is allowed to wander, typically ±1 Hz).
 *
 * @remarks
 * Attenuation is −20·log10|H(f)| (see {@link filterGain}). The worst case is the maximum of |H|
 * over [f − δ, f + δ]. For a sinc^k filter the band is split at the nulls (multiples of f_ODR);
 * |H| is log-concave, hence unimodal, between consecutive nulls above the first (for the
 * continuous response: d²/dx² ln|sin πx/πx| = 1/x² − π²/sin²(πx) < 0 for x > 1; the discrete
 * response likewise below half the modulator rate), so each piece is searched by golden section
 * to 1e-12 relative in frequency, endpoints included. The other filters are monotone, so their
 * worst case is the lower band edge. A sinc^k filter whose f_ODR divides the mains frequency
 * (f_ODR = 10 Hz nulls both 50 Hz and 60 Hz) has an infinite nominal rejection but a finite worst
 * case, because the nulls are narrow.
 *
 * @param options - Filter, nominal mains frequency and band half-width.
 * @returns Nominal and worst-case attenuation in dB and where the worst case lies.
 * @throws {@link @bridgework/core!BridgeworkError} as {@link noiseBandwidth}; `not-positive` for
 *   the mains frequency; `negative` for δ; `out-of-range` when δ ≥ the mains frequency, for a
 *   mains frequency outside [1e-9, 1e12] Hz, or when the band spans more than 100 000 nulls of a
 *   sinc filter (the search is bounded); `unknown-option`, `missing-option`.
 * @example
 * ```ts
 * mainsRejection({ filter: { kind: 'sinc', order: 3, dataRateHertz: 10 }, mainsHertz: 50 });
 * // { nominalDecibels: Infinity, worstDecibels: 101.84…, worstFrequencyHertz: 49 }
 * ```
 */
export function mainsRejection(options: MainsRejectionOptions): MainsRejection {
  const o = checkOptions('options', options, {
    known: ['filter', 'mainsHertz', 'deviationHertz'],
    required: ['filter', 'mainsHertz'],
  });
  const filter = checkFilter('filter', o['filter']);
  const mains = checkHertz('mainsHertz', o['mainsHertz']);
  const delta =
    o['deviationHertz'] === undefined ? 1 : checkNonNegative('deviationHertz', o['deviationHertz']);
  if (!(delta < mains)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`deviationHertz\` must be less than \`mainsHertz\` (${mains}); got ${formatValue(delta)}`,
      { param: 'deviationHertz', value: delta, limit: [0, mains] },
    );
  }
  const g = (f: number): number => gainOf(filter, f);
  const lo = mains - delta;
  const hi = mains + delta;
  let worst: [number, number] = [lo, g(lo)];
  if (filter.kind === 'sinc') {
    const step = filter.dataRateHertz;
    const pieces = Math.floor(hi / step) - Math.floor(lo / step) + 1;
    if (pieces > MAX_BAND_PIECES) {
      throw new BridgeworkError(
        'out-of-range',
        `\`deviationHertz\` must span at most ${MAX_BAND_PIECES} nulls of the filter (one every ${formatValue(step)} Hz); got ${formatValue(delta)} (${pieces} pieces): narrow the band or raise filter.dataRateHertz`,
        { param: 'deviationHertz', value: delta, limit: MAX_BAND_PIECES * step },
      );
    }
    const cuts = [lo];
    for (let n = Math.floor(lo / step) + 1; n * step < hi; n++) cuts.push(n * step);
    cuts.push(hi);
    for (let i = 0; i + 1 < cuts.length; i++) {
      const piece = maxOnPiece(g, cuts[i] as number, cuts[i + 1] as number);
      if (piece[1] > worst[1]) worst = piece;
    }
  }
  return {
    nominalDecibels: -20 * Math.log10(g(mains)),
    worstDecibels: -20 * Math.log10(worst[1]),
    worstFrequencyHertz: worst[0],
  };
}
