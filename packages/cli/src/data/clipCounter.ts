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
  /**
   * Scales one channel's lane of a converted block by `factor` in place (the display unit), counts
   * its NaN samples and checks them against what the converter reported, in one pass. Call it for
   * every lane of a block, then {@link ClipCounter.endBlock}.
   *
   * @param channel - The channel (0-based).
   * @param lane - The lane's values (the first `frames` are read).
   * @param frames - Frames in the block.
   * @param firstFrame - Index of the block's first frame in the recording.
   * @param rejected - Samples of this lane that the converter reported as NaN.
   * @param factor - Multiplies every value (default 1: the lane is only read).
   */
  addLane(
    channel: number,
    lane: Float64Array,
    frames: number,
    firstFrame: number,
    rejected: number,
    factor?: number,
  ): void;
  /**
   * Takes a block of interleaved values (frame after frame, `channels` values each) into the
   * output buffer in one pass: each value times its channel's factor (the display unit), stored in
   * `target` (rounded to float32 when `target` is a `Float32Array`), counted when not finite; then
   * checks the counts against what the converter reported. Counts the block's frames (no
   * {@link ClipCounter.endBlock}).
   *
   * @param values - The converted values, `frames × channels`, frame-major.
   * @param target - Receives the scaled values (may be `values` itself, scaled in place).
   * @param frames - Frames in the block.
   * @param firstFrame - Index of the block's first frame in the recording.
   * @param rejected - Per channel, samples that the converter reported as NaN.
   * @param factors - Per channel, the factor (all 1: values are copied or only read).
   */
  addFrames(
    values: Float64Array,
    target: Float64Array | Float32Array,
    frames: number,
    firstFrame: number,
    rejected: readonly number[],
    factors: Float64Array,
  ): void;
  /**
   * Ends a block whose lanes went through {@link ClipCounter.addLane}.
   *
   * @param frames - Frames in the block.
   */
  endBlock(frames: number): void;
  /**
   * Takes in the summary of later frames, counted by another counter (a block converted in a
   * worker thread): counts add, a channel's first flagged frame stays the earliest and its last
   * becomes the later summary's. Summaries taken in frame order give the summary one counter would
   * have given over all the frames.
   *
   * @param later - A summary of frames that follow those counted so far (same channel count).
   */
  addSummary(later: ClipSummary): void;
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
 * defect, which must stop the conversion rather than reach an output file. The scan is one pass
 * per lane that tests `v − v !== 0` (true for NaN and ±∞ alone), made while the lane is still in
 * the cache right after its conversion (and fused with the display-unit scaling); only a lane with
 * flagged samples is scanned again to locate them.
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
  const addLane = (
    c: number,
    lane: Float64Array,
    blockFrames: number,
    firstFrame: number,
    rejected: number,
    factor = 1,
  ): void => {
    // One pass: scale, and count the values that are not finite (v − v is NaN for NaN and ±∞).
    let flagged = 0;
    if (factor !== 1) {
      for (let f = 0; f < blockFrames; f++) {
        const v = (lane[f] as number) * factor;
        lane[f] = v;
        if (v - v !== 0) flagged++;
      }
    } else {
      for (let f = 0; f < blockFrames; f++) {
        const v = lane[f] as number;
        if (v - v !== 0) flagged++;
      }
    }
    if (flagged > 0) {
      // Rare: locate the NaN samples, and stop at an infinite one.
      for (let f = 0; f < blockFrames; f++) {
        const v = lane[f] as number;
        if (v !== v) {
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
    }
    if (flagged !== rejected) {
      // A converter defect, not bad input: stop with a plain Error (reported as an internal error).
      throw new Error(
        `the converter reported ${rejected} clipped samples of channel ${c + 1} in frames ${firstFrame} to ${firstFrame + blockFrames - 1}, but ${flagged} are NaN`,
      );
    }
    counts[c] = (counts[c] as number) + flagged;
    total += flagged;
  };
  /** The rare path of addFrames: count per channel, locate, and stop at an infinite value. */
  const locateFrames = (
    values: Float64Array,
    target: Float64Array | Float32Array,
    blockFrames: number,
    firstFrame: number,
    rejected: readonly number[],
    factors: Float64Array,
  ): void => {
    const count = blockFrames * channels;
    for (let c = 0; c < channels; c++) {
      let flagged = 0;
      for (let i = c, f = 0; i < count; i += channels, f++) {
        const v = target[i] as number;
        if (v !== v) {
          flagged++;
          if (first[c] === undefined) first[c] = firstFrame + f;
          last[c] = firstFrame + f;
        } else if (v === Infinity || v === -Infinity) {
          const scaled = target === values ? v : (values[i] as number) * (factors[c] as number);
          if (target instanceof Float32Array && scaled - scaled === 0) {
            throw float32Overflow(c, firstFrame + f, scaled);
          }
          throw new BridgeworkError(
            'model-not-finite',
            `the converter returned ${v} for channel ${c + 1} at frame ${firstFrame + f}; flagged samples must be NaN`,
            { param: 'values', value: v },
          );
        }
      }
      if (flagged !== rejected[c]) {
        // A converter defect, not bad input: stop with a plain Error (reported as an internal error).
        throw new Error(
          `the converter reported ${rejected[c]} clipped samples of channel ${c + 1} in frames ${firstFrame} to ${firstFrame + blockFrames - 1}, but ${flagged} are NaN`,
        );
      }
      counts[c] = (counts[c] as number) + flagged;
      total += flagged;
    }
  };
  return {
    addFrames(values, target, blockFrames, firstFrame, rejected, factors) {
      const count = blockFrames * channels;
      if (values.length < count || target.length < count || factors.length < channels) {
        throw new BridgeworkError(
          'invalid-shape',
          `\`values\` and \`target\` must hold ${blockFrames} frames of ${channels} values, and \`factors\` one per channel; got ${values.length}, ${target.length} and ${factors.length}`,
          { param: 'values', value: Math.min(values.length, target.length), limit: count },
        );
      }
      let expected = 0;
      let unit = true;
      for (let c = 0; c < channels; c++) {
        expected += rejected[c] as number;
        if (factors[c] !== 1) unit = false;
      }
      const flagged =
        target instanceof Float32Array
          ? storeFloat32(values, target, count, channels, unit ? undefined : factors)
          : storeFloat64(values, target, count, channels, unit ? undefined : factors);
      if (flagged !== 0 || expected !== 0)
        locateFrames(values, target, blockFrames, firstFrame, rejected, factors);
      frames += blockFrames;
    },
    add(values, laneStride, blockFrames, firstFrame, rejected) {
      if (values.length < (channels - 1) * laneStride + blockFrames || laneStride < blockFrames) {
        throw new BridgeworkError(
          'invalid-shape',
          `\`values\` must hold ${channels} lanes of ${blockFrames} values ${laneStride} apart; got ${values.length} values`,
          { param: 'values', value: values.length, limit: (channels - 1) * laneStride + blockFrames },
        );
      }
      for (let c = 0; c < channels; c++) {
        addLane(
          c,
          values.subarray(c * laneStride, c * laneStride + blockFrames),
          blockFrames,
          firstFrame,
          rejected[c] as number,
        );
      }
      frames += blockFrames;
    },
    addLane,
    endBlock(blockFrames) {
      frames += blockFrames;
    },
    addSummary(later) {
      if (later.channels !== channels) {
        throw new BridgeworkError(
          'invalid-shape',
          `the summary is of ${later.channels} channels, the counter of ${channels}`,
          { param: 'later', value: later.channels, limit: channels },
        );
      }
      later.perChannel.forEach((c, i) => {
        if (c.clipped === 0) return;
        counts[i] = (counts[i] as number) + c.clipped;
        if (first[i] === undefined) first[i] = c.firstFrame;
        last[i] = c.lastFrame;
      });
      total += later.clipped;
      frames += later.frames;
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

/** The largest finite float32, (2 − 2⁻²³) × 2¹²⁷. */
export const FLOAT32_MAX = 3.4028234663852886e38;

/**
 * The refusal of a value that float32 cannot hold (it would be written as ±∞).
 *
 * @param channel - The channel (0-based).
 * @param frame - The frame (0-based).
 * @param value - The value (finite, beyond ±{@link FLOAT32_MAX} after rounding).
 * @returns A `BridgeworkError` `out-of-range` for `--to`.
 */
export function float32Overflow(channel: number, frame: number, value: number): BridgeworkError {
  return new BridgeworkError(
    'out-of-range',
    `channel ${channel + 1} at frame ${frame} is ${value}, beyond the largest float32 (${FLOAT32_MAX}); write float64 (--to float64le), or values in a larger unit`,
    { param: '--to', value, limit: FLOAT32_MAX },
  );
}

/**
 * `target[i] = fround(values[i] × factors[i mod channels])` for `i < count`; returns how many stored
 * values are not finite (NaN, or ±∞ from a float32 overflow).
 */
function storeFloat32(
  values: Float64Array,
  target: Float32Array,
  count: number,
  channels: number,
  factors: Float64Array | undefined,
): number {
  let flagged = 0;
  if (factors === undefined) {
    for (let i = 0; i < count; i++) {
      const s = Math.fround(values[i] as number);
      target[i] = s;
      if (s - s !== 0) flagged++;
    }
    return flagged;
  }
  for (let i = 0; i < count;) {
    for (let c = 0; c < channels; c++, i++) {
      const s = Math.fround((values[i] as number) * (factors[c] as number));
      target[i] = s;
      if (s - s !== 0) flagged++;
    }
  }
  return flagged;
}

/**
 * `target[i] = values[i] × factors[i mod channels]` for `i < count` (only read when `target` is
 * `values` and there are no factors); returns how many values are not finite.
 */
function storeFloat64(
  values: Float64Array,
  target: Float64Array,
  count: number,
  channels: number,
  factors: Float64Array | undefined,
): number {
  let flagged = 0;
  if (factors === undefined) {
    if (target === values) {
      for (let i = 0; i < count; i++) {
        const v = values[i] as number;
        if (v - v !== 0) flagged++;
      }
    } else {
      for (let i = 0; i < count; i++) {
        const v = values[i] as number;
        target[i] = v;
        if (v - v !== 0) flagged++;
      }
    }
    return flagged;
  }
  for (let i = 0; i < count;) {
    for (let c = 0; c < channels; c++, i++) {
      const v = (values[i] as number) * (factors[c] as number);
      target[i] = v;
      if (v - v !== 0) flagged++;
    }
  }
  return flagged;
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
