import type { Channel } from '@bridgework/channel';
import { BridgeworkError, checkInteger } from '@bridgework/core';

/** A channel's exact map sampled over its span, for plots. */
export interface ChannelCurves {
  /** Converter codes (fractional), evenly spaced from the span's lower to its upper end. */
  readonly codes: Float64Array;
  /** The exact quantity at each code, in the channel's unit. */
  readonly quantity: Float64Array;
  /** The converter's input at each code as a fraction of the excitation, V/V (code × LSB / excitation). */
  readonly inputRatio: Float64Array;
  /** Exact quantity minus the terminal line through the span's ends, channel unit. */
  readonly nonlinearity: Float64Array;
  /** The (fractional) codes of the span's ends. */
  readonly spanCodes: readonly [number, number];
}

/** The fractional code at which the exact map gives `q`: Newton's method from the nearest code. */
function codeOf(channel: Channel, q: number): number {
  const lo = channel.validCodes.min;
  const hi = channel.validCodes.max;
  const inside = (c: number): number => Math.min(Math.max(c, lo + 1e-3), hi - 1e-3);
  let c = inside(channel.codeFromQuantity(q));
  for (let i = 0; i < 8; i++) {
    const h = Math.min(0.5, (c - lo) / 2, (hi - c) / 2);
    const slope = (channel.quantityFromCode(c + h) - channel.quantityFromCode(c - h)) / (2 * h);
    const step = (channel.quantityFromCode(c) - q) / slope;
    c = inside(c - step);
    if (Math.abs(step) < 1e-9) break;
  }
  return c;
}

/**
 * Samples a channel's exact map over its span of interest: the quantity, the converter input in
 * V/V and the nonlinearity of the terminal line (the straight line through the span's ends).
 *
 * @remarks
 * The converter code is affine in the bridge ratio, so the codes are spaced evenly and each
 * quantity is the channel's exact `quantityFromCode` (fractional codes are accepted). The span's
 * ends are found by Newton's method on the exact map, to 1e-9 of a code; an end beyond the
 * channel's valid codes is moved just inside them. The nonlinearity is the same quantity as the
 * budget's "nonlinearity of a linear map" line, sampled at `points` points instead of 257.
 *
 * @param channel - The channel.
 * @param points - Number of points (integer in [11, 10001]).
 * @returns The curves.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer` or `out-of-range` for `points`;
 * `out-of-range` when the span covers less than one code.
 */
export function channelCurves(channel: Channel, points: number): ChannelCurves {
  const n = checkInteger('points', points, { min: 11, max: 10_001 });
  const c1 = codeOf(channel, channel.span.min);
  const c2 = codeOf(channel, channel.span.max);
  if (!(Math.abs(c2 - c1) >= 1)) {
    throw new BridgeworkError(
      'out-of-range',
      `channel '${channel.name}': the span covers less than one code`,
      {
        param: 'output.range',
      },
    );
  }
  const q1 = channel.quantityFromCode(c1);
  const q2 = channel.quantityFromCode(c2);
  const perCode = channel.adc.lsbVolts / channel.spec.excitation.volts;
  const codes = new Float64Array(n);
  const quantity = new Float64Array(n);
  const inputRatio = new Float64Array(n);
  const nonlinearity = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const c = i === n - 1 ? c2 : c1 + ((c2 - c1) * i) / (n - 1);
    const q = channel.quantityFromCode(c);
    codes[i] = c;
    quantity[i] = q;
    inputRatio[i] = c * perCode;
    nonlinearity[i] = q - (q1 + ((q2 - q1) * (c - c1)) / (c2 - c1));
  }
  return { codes, quantity, inputRatio, nonlinearity, spanCodes: [c1, c2] };
}
