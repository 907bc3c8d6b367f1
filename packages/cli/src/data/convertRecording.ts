import { BridgeworkError } from '@bridgework/core';
import { createClipCounter, type ClipSummary } from './clipCounter.js';
import type { CodeSource, RecordingBlock } from './codeSource.js';
import type { CodeLanes, TimeStamps } from './decodeFrames.js';

/** What a lane's conversion reports. */
export interface LaneConversion {
  /** How the conversion went. */
  readonly status: {
    /** Samples written as NaN (codes at or beyond the rails, or out of the sensor's range). */
    readonly rejected: number;
  };
}

/**
 * What the conversion needs of a channel: its name and its batch conversion. The channel
 * package's `Channel` has this shape; its `convert` writes NaN for every code it cannot convert and
 * reports how many.
 */
export interface ConvertingChannel {
  /** The channel's name. */
  readonly name: string;
  /**
   * Converts a lane of codes into `out` (same length), NaN for each code that cannot be converted.
   *
   * @param codes - The codes.
   * @param out - Receives the values.
   * @param options - The gauge temperature of this block (°C), and how many rejected positions to
   *   record (the pipeline asks for none: it finds them itself).
   */
  convert(
    codes: CodeLanes,
    out: Float64Array,
    options: { readonly temperatureCelsius?: number; readonly maxLocations?: number },
  ): LaneConversion;
}

/** A block of converted values handed to a {@link RecordingWriter}. */
export interface ConvertedBlock {
  /** Frames in the block. */
  readonly frames: number;
  /** Index of the block's first frame in the recording. */
  readonly firstFrame: number;
  /** The values, one lane per channel (channel `j` at `values[j * laneStride + f]`). Reused. */
  readonly values: Float64Array;
  /** Distance between lanes. */
  readonly laneStride: number;
  /** The block's time stamps, as read. */
  readonly timeStamps: TimeStamps | undefined;
  /** The block's passed-through CSV texts. */
  readonly passThrough: readonly (readonly string[])[] | undefined;
  /** Per channel, the samples of this block written as NaN (flagged). */
  readonly rejected: readonly number[];
}

/** Where converted blocks go: a CSV, raw, Arrow or Parquet writer. */
export interface RecordingWriter {
  /** Writes a block; the arrays may be reused once the promise resolves. */
  writeBlock(block: ConvertedBlock): Promise<void>;
  /** Writes what remains (a header for an empty recording, a file footer). */
  finish(): Promise<void>;
}

/** The per-block temperature correction: which channel gives the temperature, which it corrects. */
export interface BlockTemperature {
  /** Index of the temperature channel (its values are °C). */
  readonly from: number;
  /** Indices of the channels converted at that temperature. */
  readonly corrects: readonly number[];
}

/** Blocks whose temperature channel had no valid sample. */
export interface TemperatureGaps {
  /** Frames without a temperature. */
  readonly frames: number;
  /** First frame of the first such block. */
  readonly firstFrame: number | undefined;
  /** Last frame of the last such block. */
  readonly lastFrame: number | undefined;
}

/** Options of {@link convertRecording}. */
export interface ConvertRecordingOptions {
  /** The recording. */
  readonly source: CodeSource;
  /** One channel per lane of the source, in order. */
  readonly channels: readonly ConvertingChannel[];
  /** Per channel, the factor from its unit to the written unit (default 1 each). */
  readonly factors?: readonly number[];
  /** Per-block temperature correction. */
  readonly temperature?: BlockTemperature;
  /** Receives the values. */
  readonly writer: RecordingWriter;
  /** Called after each block is written (for a progress bar). */
  readonly onBlock?: (block: RecordingBlock) => void;
}

/** The result of a conversion. */
export interface ConversionResult {
  /** Frames converted. */
  readonly frames: number;
  /** The clipped-sample summary (samples written as NaN per channel). */
  readonly clip: ClipSummary;
  /** Blocks converted without a temperature (their corrected channels written as NaN). */
  readonly temperatureGaps: TemperatureGaps;
  /** Per block of the temperature correction, the temperature used (°C), in block order; capped at 10 000. */
  readonly blockTemperatures: readonly number[];
}

/** Blocks' temperatures kept for the summary. */
const MAX_KEPT_TEMPERATURES = 10_000;

/**
 * Converts a recording block by block: read, convert each channel's lane, count clipped samples,
 * write.
 *
 * @remarks
 * One `Float64Array` of `blockFrames × channels` values is allocated and reused, so memory does
 * not grow with the file. Each lane is converted by its channel's own `convert` (the channel
 * package's exact map, the same arithmetic whatever the input's layout). With `temperature`, the
 * temperature channel's lane is converted first, the mean of its valid values is the block's
 * temperature, and each corrected channel's lane is converted at that temperature (the channel
 * package's per-block temperature path: thermal output and gauge factor at that temperature). A
 * block whose temperature channel has no valid value cannot be corrected: its corrected lanes are
 * written as NaN and counted in `temperatureGaps` (never converted at a guessed temperature).
 * Values are multiplied by `factors` (the display unit) after conversion. Each block is written
 * (and the writer awaited) before the next is read; the values are checked by
 * {@link createClipCounter}.
 *
 * @param options - Source, channels, factors, temperature correction, writer and progress hook.
 * @returns Frames converted, clipped samples, temperature gaps and block temperatures.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` (channel count differs from the
 * source's), and whatever the source, the channels and the writer throw; nothing is retried.
 * @example
 * ```ts
 * const result = await convertRecording({ source, channels, writer });
 * console.log(formatClipSummary(result.clip));
 * ```
 */
export async function convertRecording(options: ConvertRecordingOptions): Promise<ConversionResult> {
  const { source, channels, writer, temperature } = options;
  const n = source.channels;
  if (channels.length !== n) {
    throw new BridgeworkError(
      'invalid-shape',
      `the recording has ${n} code column${n === 1 ? '' : 's'} per frame, but ${channels.length} channel${channels.length === 1 ? ' is' : 's are'} given`,
      { param: 'channels', value: channels.length, limit: n },
    );
  }
  const factors = options.factors ?? channels.map(() => 1);
  const stride = source.blockFrames;
  const values = new Float64Array(stride * n);
  const counter = createClipCounter(n);
  const rejected = new Array<number>(n).fill(0);
  const corrected = new Set(temperature?.corrects ?? []);
  const blockTemperatures: number[] = [];
  let gapFrames = 0;
  let gapFirst: number | undefined;
  let gapLast: number | undefined;
  let frames = 0;
  for await (const block of source.blocks()) {
    const count = block.frames;
    const lane = (j: number): [CodeLanes, Float64Array] => [
      block.codes.subarray(j * block.laneStride, j * block.laneStride + count),
      values.subarray(j * stride, j * stride + count),
    ];
    let blockTemperature: number | undefined;
    if (temperature !== undefined) {
      const [codes, out] = lane(temperature.from);
      rejected[temperature.from] = channels[temperature.from]!.convert(codes, out, {
        maxLocations: 0,
      }).status.rejected;
      let sum = 0;
      let valid = 0;
      for (let f = 0; f < count; f++) {
        const t = out[f] as number;
        if (t === t) {
          sum += t;
          valid++;
        }
      }
      if (valid > 0) {
        blockTemperature = sum / valid;
        if (blockTemperatures.length < MAX_KEPT_TEMPERATURES) blockTemperatures.push(blockTemperature);
      } else {
        gapFrames += count;
        gapFirst ??= block.firstFrame;
        gapLast = block.firstFrame + count - 1;
        if (blockTemperatures.length < MAX_KEPT_TEMPERATURES) blockTemperatures.push(Number.NaN);
      }
    }
    for (let j = 0; j < n; j++) {
      if (temperature !== undefined && j === temperature.from) continue;
      const [codes, out] = lane(j);
      if (corrected.has(j) && blockTemperature === undefined) {
        out.fill(Number.NaN);
        rejected[j] = count;
        continue;
      }
      const at = corrected.has(j) ? { temperatureCelsius: blockTemperature as number } : {};
      rejected[j] = channels[j]!.convert(codes, out, { ...at, maxLocations: 0 }).status.rejected;
    }
    for (let j = 0; j < n; j++) {
      const factor = factors[j] as number;
      if (factor === 1) continue;
      const base = j * stride;
      for (let f = 0; f < count; f++) values[base + f] = (values[base + f] as number) * factor;
    }
    counter.add(values, stride, count, block.firstFrame, rejected);
    await writer.writeBlock({
      frames: count,
      firstFrame: block.firstFrame,
      values,
      laneStride: stride,
      timeStamps: block.timeStamps,
      passThrough: block.passThrough,
      rejected,
    });
    frames += count;
    options.onBlock?.(block);
  }
  await writer.finish();
  return {
    frames,
    clip: counter.summary(),
    temperatureGaps: { frames: gapFrames, firstFrame: gapFirst, lastFrame: gapLast },
    blockTemperatures,
  };
}
