import { BridgeworkError } from '@bridgework/core';
import {
  convertFrameBlock,
  convertLaneBlock,
  createTemperatureLog,
  SLICE_VALUES,
  type LaneWork,
} from './blockConversion.js';
import { createClipCounter } from './clipCounter.js';
import type { CodeSource, RecordingBlock } from './codeSource.js';
import type { ConversionLanes } from './conversionLanes.js';
import { convertInLanes } from './convertInLanes.js';
import type { TimeStamps } from './decodeFrames.js';
import type {
  BlockTemperature,
  ConversionResult,
  ConvertingChannel,
  FrameConverter,
  FrameOutput,
  RecordingWriter,
} from './pipelineTypes.js';

export type {
  BlockTemperature,
  ConversionResult,
  ConvertedBlock,
  ConvertingChannel,
  FrameConverter,
  FrameOutput,
  LaneConversion,
  RecordingWriter,
  RowText,
  TemperatureGaps,
} from './pipelineTypes.js';

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
  /**
   * Worker threads to convert the blocks in, with the channels' specs (`Channel.spec` of the
   * built-in channel package, in lane order) from which each worker makes the same channels.
   * Without it every block is converted in this thread.
   */
  readonly lanes?: {
    readonly pool: ConversionLanes;
    readonly specs: readonly unknown[];
    /**
     * `main` (default): blocks are converted in this thread until the workers have started;
     * `wait`: every block goes to a worker.
     */
    readonly whileStarting?: 'main' | 'wait';
  };
  /** Called after each block is converted (for a progress bar). */
  readonly onBlock?: (block: Pick<RecordingBlock, 'frames' | 'firstFrame' | 'bytesRead'>) => void;
}

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
 * Worker threads (`lanes`). Each block's codes are sent to a worker in turn (round robin), which
 * converts it with the same block functions as this thread (`createBlockRunner`: the interleaved
 * path into float32/float64 values, the lane path into lanes, or the lane path and the CSV rows'
 * text for a CSV writer without passed-through columns); the results are written in block order,
 * and the blocks' flagged-sample summaries and temperatures are merged in that order, so the output
 * and the summary are those of one thread, bit for bit. The per-block temperature correction is
 * block-local (each block's own temperature lane) and runs in the workers; zero readings from a
 * window are in the channels' specs. Memory: `threads + 2` blocks in flight, each its codes
 * (`blockFrames × channels × 8` bytes at most) and its output (values, or room for the text: 32
 * bytes per value and per time stamp),
 * plus what the source and the writer hold.
 *
 * @param options - Source, channels, factors, temperature correction, writer, worker threads and
 *   progress hook.
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
  const framesPath =
    options.frameConverter !== undefined &&
    writer.frames !== undefined &&
    source.frames !== undefined &&
    temperature === undefined;
  if (options.lanes !== undefined) {
    const rows = writer.rows !== undefined && source.passThroughNames.length === 0;
    return convertInLanes({
      source,
      writer,
      pool: options.lanes.pool,
      specs: options.lanes.specs,
      channels,
      frameConverter: framesPath ? options.frameConverter : undefined,
      ...(options.lanes.whileStarting === undefined ? {} : { whileStarting: options.lanes.whileStarting }),
      mode: framesPath ? 'frames' : rows ? 'rows' : 'lanes',
      factors,
      temperature,
      onBlock: options.onBlock,
    });
  }
  if (framesPath) {
    return convertFrames(
      source,
      options.frameConverter as FrameConverter,
      writer,
      writer.frames as FrameOutput,
      factors,
      options.onBlock,
    );
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
  const work: LaneWork = { channels, factors, temperature, corrected: new Set(temperature?.corrects ?? []) };
  const temperatures = createTemperatureLog();
  let frames = 0;
  let slotIndex = 0;
  for await (const block of source.blocks()) {
    const slot = slots[slotIndex] as (typeof slots)[number];
    slotIndex = (slotIndex + 1) % sets;
    await slot.written; // the writer is done with this set's arrays
    const { values, rejected } = slot;
    const count = block.frames;
    const blockTemperature = convertLaneBlock(
      work,
      block.codes,
      block.laneStride,
      count,
      block.firstFrame,
      values,
      stride,
      rejected,
      counter,
    );
    temperatures.add(blockTemperature, block.firstFrame, count);
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
    temperatureGaps: temperatures.gaps(),
    blockTemperatures: temperatures.temperatures,
  };
}

/**
 * The interleaved path of {@link convertRecording}: each block of codes, frame after frame as read,
 * is converted by the frame converter and taken into the writer's own buffer in one pass (display
 * factor, float32 rounding, NaN count; see {@link convertFrameBlock}). float64 buffers are
 * converted into directly and scaled in place; float32 buffers are filled from one slice of
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
  const sliceFrames = Math.max(1, Math.floor(SLICE_VALUES / n));
  const scratch = output.type === 'float32' ? new Float64Array(sliceFrames * n) : undefined;
  const rejected = new Array<number>(n).fill(0);
  let frames = 0;
  for await (const block of (source.frames as NonNullable<CodeSource['frames']>)()) {
    const target = await output.next();
    convertFrameBlock(
      converter,
      block.codes,
      block.frames,
      block.firstFrame,
      n,
      target,
      scratch,
      factors,
      rejected,
      counter,
    );
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
