import { BridgeworkError } from '@bridgework/core';
import { createClipCounter, type ClipCounter, type ClipSummary } from './clipCounter.js';
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

/**
 * Converts interleaved frames of every channel in one call: the channel package's
 * `InterleavedConverter` (from `createInterleavedConverter`) has this shape, and its values equal
 * each channel's own `convert` of its lane, bit for bit.
 */
export interface FrameConverter {
  /**
   * Converts `codes` (frame after frame, one code per channel) into `out`, NaN for each code that
   * cannot be converted.
   *
   * @param codes - The codes, a whole number of frames.
   * @param out - Receives the values (same length).
   * @param options - How many rejected positions to record (the pipeline asks for none).
   * @returns Per channel, how the conversion went.
   */
  convert(
    codes: Int32Array | Float64Array,
    out: Float64Array,
    options: { readonly maxLocations: number },
  ): { readonly statuses: readonly LaneConversion['status'][] };
}

/**
 * The interleaved output buffers of a writer that stores frames as they are in memory (the raw
 * formats): the pipeline fills them directly, with no lanes in between (see
 * {@link RecordingWriter.frames}).
 */
export interface FrameOutput {
  /** The buffers' value type: `float32` buffers receive each value rounded to float32. */
  readonly type: 'float32' | 'float64';
  /**
   * The next buffer to fill with up to `blockFrames × channels` values, frame-major; resolves once
   * that buffer's earlier write has finished (and rejects if a write failed).
   */
  next(): Promise<Float32Array | Float64Array>;
  /**
   * Queues the first `count` values of a buffer from `next` for writing, after the writes queued
   * before; the buffer is not touched by the caller again until `next` returns it.
   */
  write(buffer: Float32Array | Float64Array, count: number): void;
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
  /**
   * Writes a block; its arrays may be reused once the promise resolves. A writer that copies what
   * it needs resolves at once and writes in the background; one that writes the block's own
   * memory resolves when that is written.
   */
  writeBlock(block: ConvertedBlock): Promise<void>;
  /**
   * How many blocks the writer may hold at once (1 or 2; default 1). With 2, the pipeline converts
   * into two sets of arrays in turn and calls `writeBlock` again before the previous call has
   * resolved, waiting for a set's earlier call only before refilling it; the writer keeps its
   * writes in order.
   */
  readonly blocksInFlight?: number;
  /**
   * Writers of frames as they lie in memory (the raw formats): with a {@link FrameConverter}, a
   * source that reads frames, and no per-block temperature correction, the pipeline converts each
   * block of interleaved codes straight into these buffers and never calls `writeBlock`.
   */
  readonly frames?: FrameOutput;
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
  /**
   * All the channels at once, for interleaved frames: used when the writer takes frames (see
   * {@link RecordingWriter.frames}), the source reads them, and there is no `temperature`.
   */
  readonly frameConverter?: FrameConverter;
  /** Called after each block is converted (for a progress bar). */
  readonly onBlock?: (block: Pick<RecordingBlock, 'frames' | 'firstFrame' | 'bytesRead'>) => void;
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

/** Values converted at a time on the interleaved path (256 KiB of float64: within a core's cache). */
const SLICE_VALUES = 32_768;

/** Blocks' temperatures kept for the summary. */
const MAX_KEPT_TEMPERATURES = 10_000;

/**
 * Converts a recording block by block: read, convert each channel's lane, count clipped samples,
 * write.
 *
 * @remarks
 * The value arrays are allocated once and reused, so memory does not grow with the file. Each lane is converted by its channel's own `convert` (the channel
 * package's exact map, the same arithmetic whatever the input's layout). With `temperature`, the
 * temperature channel's lane is converted first, the mean of its valid values is the block's
 * temperature, and each corrected channel's lane is converted at that temperature (the channel
 * package's per-block temperature path: thermal output and gauge factor at that temperature). A
 * block whose temperature channel has no valid value cannot be corrected: its corrected lanes are
 * written as NaN and counted in `temperatureGaps` (never converted at a guessed temperature).
 * Each lane is scaled by its `factor` (the display unit) and checked by {@link createClipCounter}
 * right after its conversion, in one pass while it is still in the cache. The source reads the next
 * block while this one is converted, and writers that copy a block into their own buffers write it
 * in the background while the next is converted; a writer that holds the block's own memory
 * (`blocksInFlight: 2`) gets two sets of arrays in turn. Memory: one or two sets of
 * `blockFrames × channels` values, plus what the source and the writer hold.
 *
 * Interleaved path. With a `frameConverter`, a writer that takes frames (the raw formats) and no
 * `temperature`, the codes stay frame after frame as read (for int32le frames of codes only, the
 * bytes read are the codes): each slice of 32 768 values is converted by all channels at once and
 * taken into the writer's buffer in one pass that multiplies by the factor, rounds to float32 when
 * the output is float32, and counts non-finite values ({@link ClipCounter.addFrames}). The values
 * equal those of the lane path bit for bit (the frame converter equals each channel's own
 * `convert`); it saves the de-interleaving of the codes, the lanes and the interleaving of the
 * values. Memory: one slice of float64 values (float32 output), plus the source's two byte buffers
 * and the writer's two output buffers.
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
  if (
    options.frameConverter !== undefined &&
    writer.frames !== undefined &&
    source.frames !== undefined &&
    temperature === undefined
  ) {
    return convertFrames(source, options.frameConverter, writer, writer.frames, factors, options.onBlock);
  }
  const stride = source.blockFrames;
  // One set of arrays per block the writer may hold (see RecordingWriter.blocksInFlight).
  const sets = writer.blocksInFlight === 2 ? 2 : 1;
  const slots = Array.from({ length: sets }, () => ({
    values: new Float64Array(stride * n),
    rejected: new Array<number>(n).fill(0),
    stamps: undefined as TimeStamps | undefined,
    written: Promise.resolve(),
  }));
  const counter = createClipCounter(n);
  const corrected = new Set(temperature?.corrects ?? []);
  const blockTemperatures: number[] = [];
  let gapFrames = 0;
  let gapFirst: number | undefined;
  let gapLast: number | undefined;
  let frames = 0;
  let slotIndex = 0;
  for await (const block of source.blocks()) {
    const slot = slots[slotIndex] as (typeof slots)[number];
    slotIndex = (slotIndex + 1) % sets;
    await slot.written; // the writer is done with this set's arrays
    const { values, rejected } = slot;
    const count = block.frames;
    const lane = (j: number): [CodeLanes, Float64Array] => [
      block.codes.subarray(j * block.laneStride, j * block.laneStride + count),
      values.subarray(j * stride, j * stride + count),
    ];
    /** Converts lane j (at `at` °C when given), then scales and checks it while it is in the cache. */
    const convertLane = (j: number, at: number | undefined): void => {
      const [codes, out] = lane(j);
      const status = (channels[j] as ConvertingChannel).convert(
        codes,
        out,
        at === undefined ? { maxLocations: 0 } : { temperatureCelsius: at, maxLocations: 0 },
      ).status;
      rejected[j] = status.rejected;
      counter.addLane(j, out, count, block.firstFrame, status.rejected, factors[j] as number);
    };
    let blockTemperature: number | undefined;
    if (temperature !== undefined) {
      // The temperature lane first (in °C, before any display scaling of its own).
      const [codes, out] = lane(temperature.from);
      const status = (channels[temperature.from] as ConvertingChannel).convert(codes, out, {
        maxLocations: 0,
      }).status;
      let sum = 0;
      let valid = 0;
      for (let f = 0; f < count; f++) {
        const t = out[f] as number;
        if (t === t) {
          sum += t;
          valid++;
        }
      }
      rejected[temperature.from] = status.rejected;
      counter.addLane(
        temperature.from,
        out,
        count,
        block.firstFrame,
        status.rejected,
        factors[temperature.from] as number,
      );
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
      if (!corrected.has(j)) convertLane(j, undefined);
      else if (blockTemperature !== undefined) convertLane(j, blockTemperature);
      else {
        const out = values.subarray(j * stride, j * stride + count);
        out.fill(Number.NaN);
        rejected[j] = count;
        counter.addLane(j, out, count, block.firstFrame, count);
      }
    }
    counter.endBlock(count);
    // With two sets in flight the source's stamps are refilled before the writer is done: copy them.
    let timeStamps = block.timeStamps;
    if (sets === 2 && timeStamps !== undefined) {
      if (slot.stamps?.constructor !== timeStamps.constructor) {
        const Type = timeStamps.constructor as new (length: number) => TimeStamps;
        slot.stamps = new Type(stride);
      }
      (slot.stamps as Float64Array).set(timeStamps.subarray(0, count) as Float64Array);
      timeStamps = slot.stamps;
    }
    const written = writer.writeBlock({
      frames: count,
      firstFrame: block.firstFrame,
      values,
      laneStride: stride,
      timeStamps,
      passThrough: sets === 2 ? block.passThrough?.map((texts) => texts.slice(0, count)) : block.passThrough,
      rejected: sets === 2 ? [...rejected] : rejected,
    });
    if (sets === 1) await written;
    else {
      written.catch(() => undefined); // met when awaited (before this set is refilled, or below)
      slot.written = written;
    }
    frames += count;
    options.onBlock?.(block);
  }
  for (const slot of slots) await slot.written;
  await writer.finish();
  return {
    frames,
    clip: counter.summary(),
    temperatureGaps: { frames: gapFrames, firstFrame: gapFirst, lastFrame: gapLast },
    blockTemperatures,
  };
}

/**
 * The interleaved path of {@link convertRecording}: each block of codes, frame after frame as read,
 * is converted by the frame converter and taken into the writer's own buffer in one pass (display
 * factor, float32 rounding, NaN count; see {@link ClipCounter.addFrames}). float64 buffers are
 * converted into directly and scaled in place; float32 buffers are filled from one block of
 * float64 values.
 */
async function convertFrames(
  source: CodeSource,
  converter: FrameConverter,
  writer: RecordingWriter,
  output: FrameOutput,
  factorList: readonly number[],
  onBlock: ConvertRecordingOptions['onBlock'],
): Promise<ConversionResult> {
  const n = source.channels;
  const factors = Float64Array.from(factorList);
  const counter = createClipCounter(n);
  // Slices of a block small enough that the converted values are still in the cache when they are
  // taken into the output buffer.
  const sliceFrames = Math.max(1, Math.floor(SLICE_VALUES / n));
  const scratch = output.type === 'float32' ? new Float64Array(sliceFrames * n) : undefined;
  const rejected = new Array<number>(n).fill(0);
  const options = { maxLocations: 0 };
  let frames = 0;
  for await (const block of (source.frames as NonNullable<CodeSource['frames']>)()) {
    const target = await output.next();
    for (let f = 0; f < block.frames; f += sliceFrames) {
      const sliceCount = Math.min(sliceFrames, block.frames - f);
      const from = f * n;
      const to = from + sliceCount * n;
      const into = target.subarray(from, to);
      const values = scratch === undefined ? (into as Float64Array) : scratch.subarray(0, to - from);
      const { statuses } = converter.convert(block.codes.subarray(from, to), values, options);
      for (let j = 0; j < n; j++) rejected[j] = (statuses[j] as LaneConversion['status']).rejected;
      counter.addFrames(values, into, sliceCount, block.firstFrame + f, rejected, factors);
    }
    output.write(target, block.frames * n);
    frames += block.frames;
    onBlock?.(block);
  }
  await writer.finish();
  return {
    frames,
    clip: counter.summary(),
    temperatureGaps: { frames: 0, firstFrame: undefined, lastFrame: undefined },
    blockTemperatures: [],
  };
}
