import { BridgeworkError, checkInteger } from '@bridgework/core';

/** Clipped samples of one channel. */
export interface ChannelClipCount {
  /** Number of clipped samples. */
  readonly clipped: number;
  /** Frame index (0-based) of the first clipped sample, or `undefined`. */
  readonly firstFrame: number | undefined;
  /** Frame index (0-based) of the last clipped sample, or `undefined`. */
  readonly lastFrame: number | undefined;
}

/** The clipped-sample summary of a conversion. */
export interface ClipSummary {
  /** Frames converted. */
  readonly frames: number;
  /** Channels per frame. */
  readonly channels: number;
  /** Clipped samples in all channels. */
  readonly clipped: number;
  /** Per channel, in channel order. */
  readonly perChannel: readonly ChannelClipCount[];
}

/** Accumulates a {@link ClipSummary} block by block (see {@link createClipCounter}). */
export interface ClipCounter {
  /**
   * Counts the NaN samples of one converted block per channel and checks them against what the
   * converter reported.
   *
   * @param values - The converted block, one lane per channel (channel `j` at `j × laneStride`).
   * @param laneStride - Distance between lanes.
   * @param frames - Frames in the block.
   * @param firstFrame - Index of the block's first frame in the recording.
   * @param rejected - Samples of each channel that the converter reported as NaN.
   */
  add(
    values: Float64Array,
    laneStride: number,
    frames: number,
    firstFrame: number,
    rejected: readonly number[],
  ): void;
  /** The summary so far. */
  summary(): ClipSummary;
}

/**
 * A counter of clipped samples, the hook behind the conversion summary.
 *
 * @remarks
 * The counter does not trust the converter's figures alone: it scans each converted block, counts
 * NaN samples per channel (with the first and last frame of each), and throws if a count differs
 * from what the converter reported or if a sample is ±Infinity — either would be a converter
 * defect, which must stop the conversion rather than reach an output file.
 *
 * @param channels - Channels per frame (integer in [1, 4096]).
 * @returns The counter.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer` / `out-of-range` for `channels`; from `add`,
 * `invalid-shape` when the block is too short and `model-not-finite` for ±Infinity; a plain `Error`
 * (a converter defect) when the converter's count disagrees with the NaN samples found.
 * @example
 * ```ts
 * const counter = createClipCounter(2);
 * counter.add(Float64Array.of(1, 3, NaN, 4), 2, 2, 0, [0, 1]); // lanes [1, 3] and [NaN, 4]
 * counter.summary(); // { frames: 2, channels: 2, clipped: 1, perChannel: [{ clipped: 0, ... }, { clipped: 1, firstFrame: 0, lastFrame: 0 }] }
 * ```
 */
export function createClipCounter(channels: number): ClipCounter {
  checkInteger('channels', channels, { min: 1, max: 4096 });
  const counts = new Array<number>(channels).fill(0);
  const first = new Array<number | undefined>(channels).fill(undefined);
  const last = new Array<number | undefined>(channels).fill(undefined);
  let frames = 0;
  let total = 0;
  return {
    add(values, laneStride, blockFrames, firstFrame, rejected) {
      if (values.length < (channels - 1) * laneStride + blockFrames || laneStride < blockFrames) {
        throw new BridgeworkError(
          'invalid-shape',
          `\`values\` must hold ${channels} lanes of ${blockFrames} values ${laneStride} apart; got ${values.length} values`,
          { param: 'values', value: values.length, limit: (channels - 1) * laneStride + blockFrames },
        );
      }
      let found = 0;
      for (let c = 0; c < channels; c++) {
        const base = c * laneStride;
        let inLane = 0;
        for (let f = 0; f < blockFrames; f++) {
          const v = values[base + f] as number;
          if (v !== v) {
            inLane++;
            if (first[c] === undefined) first[c] = firstFrame + f;
            last[c] = firstFrame + f;
          } else if (v === Infinity || v === -Infinity) {
            throw new BridgeworkError(
              'model-not-finite',
              `the converter returned ${v} for channel ${c + 1} at frame ${firstFrame + f}; flagged samples must be NaN`,
              { param: 'values', value: v },
            );
          }
        }
        if (inLane !== rejected[c]) {
          // A converter defect, not bad input: stop with a plain Error (reported as an internal error).
          throw new Error(
            `the converter reported ${rejected[c]} clipped samples of channel ${c + 1} in frames ${firstFrame} to ${firstFrame + blockFrames - 1}, but ${inLane} are NaN`,
          );
        }
        counts[c] = (counts[c] as number) + inLane;
        found += inLane;
      }
      frames += blockFrames;
      total += found;
    },
    summary() {
      return {
        frames,
        channels,
        clipped: total,
        perChannel: counts.map((clipped, c) => ({ clipped, firstFrame: first[c], lastFrame: last[c] })),
      };
    },
  };
}

/**
 * The clipped-sample summary as text for standard error.
 *
 * @param summary - The summary.
 * @param names - Channel names in channel order (default `channel 1`, `channel 2`...).
 * @returns One line for a clean conversion, else a line per channel with clipped samples.
 * @example
 * ```ts
 * formatClipSummary(summary, ['hook']);
 * // 'clipped samples: 3 of 1000 (0.3 %)\n  hook: 3, frames 17 to 412\n'
 * ```
 */
export function formatClipSummary(summary: ClipSummary, names?: readonly string[]): string {
  const samples = summary.frames * summary.channels;
  if (summary.clipped === 0) return `clipped samples: none of ${samples}\n`;
  const percent = (100 * summary.clipped) / samples;
  const lines = [
    `clipped samples: ${summary.clipped} of ${samples} (${percent < 0.1 ? percent.toPrecision(2) : percent.toFixed(1)} %)`,
  ];
  summary.perChannel.forEach((c, i) => {
    if (c.clipped === 0) return;
    const name = names?.[i] ?? `channel ${i + 1}`;
    const where =
      c.firstFrame === c.lastFrame ? `frame ${c.firstFrame}` : `frames ${c.firstFrame} to ${c.lastFrame}`;
    lines.push(`  ${name}: ${c.clipped}, ${where}`);
  });
  return `${lines.join('\n')}\n`;
}
