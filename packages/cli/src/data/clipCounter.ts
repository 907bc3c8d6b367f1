import { BridgeworkError, checkInteger } from '@bridgework/core';

/** What a block converter reports about one call. */
export interface ConverterStatus {
  /**
   * Samples of this call that were flagged and written as NaN: codes at or beyond the converter
   * rails, or codes whose value lies outside the map's domain. Never turned into plausible numbers.
   */
  readonly clipped: number;
}

/**
 * The contract of an interleaved block converter, which the channel package's converter meets.
 *
 * @remarks
 * `codes` holds `frames × channels` converter codes, frame-major (`codes[f * channels + c]`);
 * the converter writes the quantity of each code to `out` at the same index (`out.length ===
 * codes.length`), NaN for every flagged sample, and returns how many it flagged. It must not keep
 * references to either array: both are reused for the next block.
 */
export type InterleavedConverter = (
  codes: Int32Array,
  channels: number,
  out: Float64Array,
) => ConverterStatus;

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
   * Counts the NaN samples of one converted block per channel and checks them against the
   * converter's own count.
   *
   * @param out - The converted block (`frames × channels` values).
   * @param frames - Frames in the block.
   * @param firstFrame - Index of the block's first frame in the file.
   * @param status - What the converter reported for this block.
   */
  add(out: Float64Array, frames: number, firstFrame: number, status: ConverterStatus): void;
  /** The summary so far. */
  summary(): ClipSummary;
}

/**
 * A counter of clipped samples, the hook behind the conversion summary.
 *
 * @remarks
 * The counter does not trust the converter's figure alone: it scans each converted block, counts
 * NaN samples per channel (with the first and last frame of each), and throws if that count differs
 * from the converter's `status.clipped` or if a sample is ±Infinity — either would be a converter
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
 * counter.add(Float64Array.of(1, NaN, 3, 4), 2, 0, { clipped: 1 });
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
    add(out, blockFrames, firstFrame, status) {
      if (out.length < blockFrames * channels) {
        throw new BridgeworkError(
          'invalid-shape',
          `\`out\` must hold ${blockFrames * channels} values; got ${out.length}`,
          { param: 'out', value: out.length, limit: blockFrames * channels },
        );
      }
      let found = 0;
      for (let f = 0; f < blockFrames; f++) {
        const base = f * channels;
        for (let c = 0; c < channels; c++) {
          const v = out[base + c] as number;
          if (v !== v) {
            found++;
            counts[c] = (counts[c] as number) + 1;
            if (first[c] === undefined) first[c] = firstFrame + f;
            last[c] = firstFrame + f;
          } else if (v === Infinity || v === -Infinity) {
            throw new BridgeworkError(
              'model-not-finite',
              `the converter returned ${v} for channel ${c + 1} at frame ${firstFrame + f}; flagged samples must be NaN`,
              { param: 'out', value: v },
            );
          }
        }
      }
      if (found !== status.clipped) {
        // A converter defect, not bad input: stop with a plain Error (reported as an internal error).
        throw new Error(
          `the converter reported ${status.clipped} clipped samples in frames ${firstFrame} to ${firstFrame + blockFrames - 1}, but ${found} are NaN`,
        );
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
