import type { Channel } from '@bridgework/channel';

/** A channel's converter map between the bridge ratio and the (fractional) code. */
export interface CodeRatioMap {
  /** Codes per unit of bridge ratio (gain, converter and polarity together). */
  readonly codesPerRatio: number;
  /** The exact code of a bridge ratio. */
  codeOf(ratio: number): number;
  /** The bridge ratio of a code. */
  ratioOf(code: number): number;
}

/**
 * The converter's map between bridge ratio and code, which is affine (chain `createAdc`: the code
 * is the gain times the input over the step, polarity and offset applied), read from two of the
 * channel's operating points (`Channel.inputAt` at the span's ends).
 *
 * @param channel - The channel.
 * @returns The map.
 */
export function codeRatioMap(channel: Channel): CodeRatioMap {
  const a = channel.inputAt(channel.span.min);
  const b = channel.inputAt(channel.span.max);
  const codesPerRatio = (b.code - a.code) / (b.bridgeRatio - a.bridgeRatio);
  return {
    codesPerRatio,
    codeOf: (ratio) => a.code + (ratio - a.bridgeRatio) * codesPerRatio,
    ratioOf: (code) => a.bridgeRatio + (code - a.code) / codesPerRatio,
  };
}
