import { BridgeworkError, checkFinite, checkInteger } from '@bridgework/core';

/** Axis ticks chosen by {@link niceTicks}. */
export interface NiceTicks {
  /** Lower end of the axis (a multiple of `step`, at or below the data minimum, within about 1e-9 of a step). */
  readonly min: number;
  /** Upper end of the axis (a multiple of `step`, at or above the data maximum, within about 1e-9 of a step). */
  readonly max: number;
  /** Distance between ticks: 1, 2 or 5 times a power of ten. */
  readonly step: number;
  /** The tick values from `min` to `max`, each rounded to the decimals of `step`. */
  readonly values: readonly number[];
  /** Decimals needed to print every tick exactly (0 for steps ≥ 1). */
  readonly decimals: number;
}

/** The "nice" number nearest `x` (rounded) or at or above it: 1, 2, 5 or 10 times a power of ten. */
function nice(x: number, round: boolean): number {
  const exponent = Math.floor(Math.log10(x));
  // Number('1e-4') is the double nearest 10⁻⁴; 10 ** -4 may be an ulp off (0.00009999999999999999).
  const f = x / Number(`1e${exponent}`);
  let n: number;
  if (round) n = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  else n = f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10;
  return Number(`${n}e${exponent}`);
}

/**
 * Chooses axis ticks at "nice" values (1, 2 or 5 times a power of ten) that cover a data range.
 *
 * @remarks
 * Method: the loose-labelling algorithm of P. S. Heckbert, "Nice numbers for graph labels",
 * Graphics Gems (1990): the range is rounded up to a nice number, divided by `count − 1`, the
 * step rounded to the nearest nice number, and the ends moved out to multiples of the step (a
 * data end within 1e-9 of a step of a multiple counts as on it, so rounding noise such as
 * 0.3/0.1 = 2.9999999999999996 adds no tick). Tick
 * values are computed as integer multiples of the step and rounded to its decimals, so labels
 * print without floating-point noise (`0.30000000000000004`). A range of zero width is widened
 * to ±1 (at zero) or ±10 % of the value, so a constant series still gets an axis; a range narrower
 * than 1e-9 of its magnitude is widened to that, since its labels could not be told apart.
 *
 * @param lo - Smallest data value (finite).
 * @param hi - Largest data value (finite, ≥ `lo`).
 * @param count - Wanted number of ticks (integer in [2, 20]). Default 6; the result has between
 * about `count − 2` and `count + 3`.
 * @returns The ticks.
 * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`, `out-of-range` (`hi < lo`, `count`).
 * @example
 * ```ts
 * niceTicks(0.13, 9.7); // { min: 0, max: 10, step: 2, values: [0, 2, 4, 6, 8, 10], decimals: 0 }
 * niceTicks(-0.0031, 0.0042).values; // [-0.004, -0.002, 0, 0.002, 0.004, 0.006]
 * ```
 */
export function niceTicks(lo: number, hi: number, count = 6): NiceTicks {
  checkFinite('lo', lo);
  checkFinite('hi', hi);
  checkInteger('count', count, { min: 2, max: 20 });
  if (hi < lo) {
    throw new BridgeworkError('out-of-range', `\`hi\` must be >= lo (${lo}); got ${hi}`, {
      param: 'hi',
      value: hi,
      limit: lo,
    });
  }
  if (hi === lo) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  // A span below 1e-9 of the values' magnitude cannot be labelled in doubles (and k × step
  // would pass 2^53): widen it, centred, to that minimum.
  const minSpan = 1e-9 * Math.max(Math.abs(lo), Math.abs(hi));
  if (hi - lo < minSpan) {
    const mid = lo / 2 + hi / 2;
    lo = mid - minSpan / 2;
    hi = mid + minSpan / 2;
  }
  const range = nice(hi - lo, false);
  const step = nice(range / (count - 1), true);
  // A relative slack of 1e-9 keeps 0.3/0.1 = 2.9999999999999996 from adding a tick below 0.3.
  const first = Math.floor(lo / step + 1e-9);
  const last = Math.ceil(hi / step - 1e-9);
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const round = (k: number): number => Number((k * step).toFixed(Math.min(decimals, 100)));
  const values: number[] = [];
  for (let i = 0; i <= last - first; i++) values.push(round(first + i) + 0); // + 0 turns −0 into 0
  return { min: round(first) + 0, max: round(last) + 0, step, values, decimals };
}

/**
 * Formats a tick value for an axis: fixed decimals for ordinary ranges, exponent notation for
 * very large or very small ones, and a true minus sign (U+2212).
 *
 * @param value - The tick value.
 * @param ticks - The axis's ticks (for the decimals and the range).
 * @returns The label text.
 * @example
 * ```ts
 * formatTick(-0.5, niceTicks(-1, 1)); // '−0.5'
 * ```
 */
export function formatTick(value: number, ticks: NiceTicks): string {
  const largest = Math.max(Math.abs(ticks.min), Math.abs(ticks.max));
  let text: string;
  if (value === 0) text = '0';
  else if (largest >= 1e6 || ticks.step < 1e-4) {
    const digits = Math.max(0, Math.floor(Math.log10(largest)) - Math.floor(Math.log10(ticks.step)));
    text = value.toExponential(Math.min(digits, 15)).replace(/\.?0+e/, 'e');
  } else text = value.toFixed(ticks.decimals);
  return text.replace(/^-/, '\u2212');
}
