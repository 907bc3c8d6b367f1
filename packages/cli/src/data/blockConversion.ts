/**
 * The work on one block of a recording, shared by the one-thread pipeline and the conversion
 * worker threads: whichever thread runs it, a block's values, flagged-sample counts and text are
 * made by these functions alone, so output is the same bit for bit.
 */
import { createClipCounter, type ClipCounter, type ClipSummary } from './clipCounter.js';
import { formatCsvRows, maxRowBytes } from './csvRows.js';
import type { CodeLanes, TimeStamps } from './decodeFrames.js';
import type {
  BlockTemperature,
  ConvertingChannel,
  FrameConverter,
  LaneConversion,
  TemperatureGaps,
} from './pipelineTypes.js';

/** Values converted at a time on the interleaved path (256 KiB of float64: within a core's cache). */
export const SLICE_VALUES = 32_768;

/** What the lane conversion of a recording needs besides the block. */
export interface LaneWork {
  /** One channel per lane. */
  readonly channels: readonly ConvertingChannel[];
  /** Per channel, the factor to the written unit. */
  readonly factors: readonly number[];
  /** The per-block temperature correction, if any. */
  readonly temperature: BlockTemperature | undefined;
  /** The channels it corrects (`temperature.corrects` as a set). */
  readonly corrected: ReadonlySet<number>;
}

/**
 * Converts one block lane by lane: with a temperature correction the temperature lane first (the
 * mean of its valid values is the block's temperature), then every other lane through its
 * channel's `convert` (a corrected lane at the block's temperature, or all NaN when the block has
 * none), each scaled and checked by the counter right after its conversion.
 *
 * @param work - Channels, factors and temperature correction.
 * @param codes - The codes, one lane per channel.
 * @param codeStride - Distance between code lanes.
 * @param count - Frames in the block.
 * @param firstFrame - Index of the block's first frame.
 * @param values - Receives the values, one lane per channel.
 * @param stride - Distance between value lanes.
 * @param rejected - Receives, per channel, the samples written as NaN.
 * @param counter - Counts the flagged samples (the block is ended in it).
 * @returns The block's temperature (°C); `NaN` when the temperature channel had no valid sample;
 *   `undefined` without a temperature correction.
 */
export function convertLaneBlock(
  work: LaneWork,
  codes: CodeLanes,
  codeStride: number,
  count: number,
  firstFrame: number,
  values: Float64Array,
  stride: number,
  rejected: number[],
  counter: ClipCounter,
): number | undefined {
  const { channels, factors, temperature, corrected } = work;
  const n = channels.length;
  const lane = (j: number): [CodeLanes, Float64Array] => [
    codes.subarray(j * codeStride, j * codeStride + count),
    values.subarray(j * stride, j * stride + count),
  ];
  /** Converts lane j (at `at` °C when given), then scales and checks it while it is in the cache. */
  const convertLane = (j: number, at: number | undefined): void => {
    const [laneCodes, out] = lane(j);
    const status = (channels[j] as ConvertingChannel).convert(
      laneCodes,
      out,
      at === undefined ? { maxLocations: 0 } : { temperatureCelsius: at, maxLocations: 0 },
    ).status;
    rejected[j] = status.rejected;
    counter.addLane(j, out, count, firstFrame, status.rejected, factors[j] as number);
  };
  let blockTemperature: number | undefined;
  if (temperature !== undefined) {
    // The temperature lane first (in °C, before any display scaling of its own).
    const [laneCodes, out] = lane(temperature.from);
    const status = (channels[temperature.from] as ConvertingChannel).convert(laneCodes, out, {
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
      firstFrame,
      status.rejected,
      factors[temperature.from] as number,
    );
    blockTemperature = valid > 0 ? sum / valid : Number.NaN;
  }
  for (let j = 0; j < n; j++) {
    if (temperature !== undefined && j === temperature.from) continue;
    if (!corrected.has(j)) convertLane(j, undefined);
    else if (blockTemperature === blockTemperature) convertLane(j, blockTemperature);
    else {
      const out = values.subarray(j * stride, j * stride + count);
      out.fill(Number.NaN);
      rejected[j] = count;
      counter.addLane(j, out, count, firstFrame, count);
    }
  }
  counter.endBlock(count);
  return blockTemperature;
}

/**
 * Converts one block of interleaved codes (frame after frame) into a writer's output buffer, slice
 * by slice: each slice is converted by all channels at once and taken into `target` in one pass
 * (display factor, float32 rounding when `target` is float32, flagged-sample count; see
 * {@link ClipCounter.addFrames}).
 *
 * @param converter - All the channels at once.
 * @param codes - The block's codes, `frames × channels`, frame-major.
 * @param frames - Frames in the block.
 * @param firstFrame - Index of the block's first frame.
 * @param channels - Channels per frame.
 * @param target - Receives the values, frame-major.
 * @param scratch - Float64 values of one slice (float32 targets), else `undefined` (float64
 *   targets are converted into directly and scaled in place).
 * @param factors - Per channel, the factor to the written unit.
 * @param rejected - Scratch for the per-channel counts.
 * @param counter - Counts the flagged samples.
 */
export function convertFrameBlock(
  converter: FrameConverter,
  codes: Int32Array | Float64Array,
  frames: number,
  firstFrame: number,
  channels: number,
  target: Float32Array | Float64Array,
  scratch: Float64Array | undefined,
  factors: Float64Array,
  rejected: number[],
  counter: ClipCounter,
): void {
  const n = channels;
  // Slices small enough that the converted values are still in the cache when they are taken
  // into the output buffer.
  const sliceFrames = Math.max(1, Math.floor(SLICE_VALUES / n));
  const options = { maxLocations: 0 };
  for (let f = 0; f < frames; f += sliceFrames) {
    const sliceCount = Math.min(sliceFrames, frames - f);
    const from = f * n;
    const to = from + sliceCount * n;
    const into = target.subarray(from, to);
    const values = scratch === undefined ? (into as Float64Array) : scratch.subarray(0, to - from);
    const { statuses } = converter.convert(codes.subarray(from, to), values, options);
    for (let j = 0; j < n; j++) rejected[j] = (statuses[j] as LaneConversion['status']).rejected;
    counter.addFrames(values, into, sliceCount, firstFrame + f, rejected, factors);
  }
}

/** Blocks' temperatures kept for the summary. */
const MAX_KEPT_TEMPERATURES = 10_000;

/** The record of each block's temperature, kept in block order (see {@link createTemperatureLog}). */
export interface TemperatureLog {
  /**
   * Records a block's temperature.
   *
   * @param temperature - From {@link convertLaneBlock}: °C, `NaN` for a block without one, or
   *   `undefined` (no temperature correction: nothing is recorded).
   * @param firstFrame - The block's first frame.
   * @param frames - Frames in the block.
   */
  add(temperature: number | undefined, firstFrame: number, frames: number): void;
  /** The blocks without a temperature. */
  gaps(): TemperatureGaps;
  /** Per block, its temperature (NaN without one), in block order; at most 10 000. */
  readonly temperatures: readonly number[];
}

/**
 * A record of the blocks' temperatures and of the blocks that had none.
 *
 * @returns The log.
 */
export function createTemperatureLog(): TemperatureLog {
  const temperatures: number[] = [];
  let frames = 0;
  let first: number | undefined;
  let last: number | undefined;
  return {
    temperatures,
    add(temperature, firstFrame, count) {
      if (temperature === undefined) return;
      if (temperatures.length < MAX_KEPT_TEMPERATURES) temperatures.push(temperature);
      if (temperature !== temperature) {
        frames += count;
        first ??= firstFrame;
        last = firstFrame + count - 1;
      }
    },
    gaps: () => ({ frames, firstFrame: first, lastFrame: last }),
  };
}

/** How a conversion lane works on each block (the same for every block of a run). */
export interface LaneSetup {
  /**
   * `frames`: interleaved codes into interleaved float32/float64 output (the raw formats);
   * `lanes`: code lanes into value lanes (for a writer on the main thread); `rows`: code lanes
   * into CSV text.
   */
  readonly mode: 'frames' | 'lanes' | 'rows';
  /** Channels per frame. */
  readonly channels: number;
  /** Frames of the largest block (the lane stride of codes and values). */
  readonly blockFrames: number;
  /** Per channel, the factor to the written unit. */
  readonly factors: readonly number[];
  /** The per-block temperature correction (`lanes` and `rows` only). */
  readonly temperature: BlockTemperature | undefined;
  /** `frames`: the output's value type. */
  readonly output: 'float32' | 'float64';
  /** `rows`: significant digits, or `undefined` for the shortest round-trip text. */
  readonly digits: number | undefined;
}

/** One block to convert: its place in the recording, its codes and the buffer for its output. */
export interface BlockJob {
  /** Frames in the block. */
  readonly frames: number;
  /** Index of its first frame. */
  readonly firstFrame: number;
  /** The codes: frame-major (`frames` mode) or lanes `blockFrames` apart. */
  readonly codes: Int32Array | Float64Array;
  /** `rows`: the block's time stamps, or `undefined`. */
  readonly timeStamps: TimeStamps | undefined;
  /**
   * Receives the output: values (`frames`, `lanes`) or text (`rows`), at least
   * {@link blockOutputBytes} long. Shared memory between threads (never transferred: a detached
   * buffer would slow every typed-array access of the thread that detached it).
   */
  readonly out: ArrayBufferLike;
}

/** What a block's conversion gives back. */
export interface BlockDone {
  /** The job's output buffer. */
  readonly out: ArrayBufferLike;
  /** `rows`: bytes of text in `out`; else values in it. */
  readonly length: number;
  /** Per channel, samples written as NaN. */
  readonly rejected: number[];
  /** The block's flagged samples. */
  readonly clip: ClipSummary;
  /** The block's temperature (see {@link convertLaneBlock}). */
  readonly temperature: number | undefined;
}

/**
 * The bytes a block's output may take: its values for `frames` and `lanes`; for `rows` the longest
 * text its rows can have ({@link maxRowBytes} per row, with a time stamp: 32 bytes per value, of
 * which a strain channel's shortest text uses about 20).
 *
 * @param setup - The lane setup.
 * @returns Bytes.
 */
export function blockOutputBytes(setup: LaneSetup): number {
  const values = setup.blockFrames * setup.channels;
  if (setup.mode === 'rows') return setup.blockFrames * maxRowBytes(setup.channels, true);
  return values * (setup.mode === 'frames' && setup.output === 'float32' ? 4 : 8);
}

/**
 * Makes the function that converts one block of a run, in whichever thread runs it: the frame
 * converter's interleaved path (`frames`), the lane path (`lanes`), or the lane path followed by
 * {@link formatCsvRows} (`rows`). Each block is counted by a counter of its own, whose summary is
 * merged in block order by the main thread ({@link ClipCounter.addSummary}).
 *
 * @param setup - The lane setup.
 * @param channels - One channel per lane (made in the running thread).
 * @param converter - All channels at once (`frames` mode).
 * @returns The block runner.
 */
export function createBlockRunner(
  setup: LaneSetup,
  channels: readonly ConvertingChannel[],
  converter: FrameConverter | undefined,
): (job: BlockJob) => BlockDone {
  const n = setup.channels;
  const stride = setup.blockFrames;
  const work: LaneWork = {
    channels,
    factors: setup.factors,
    temperature: setup.temperature,
    corrected: new Set(setup.temperature?.corrects ?? []),
  };
  const factors = Float64Array.from(setup.factors);
  const scratch =
    setup.mode === 'frames' && setup.output === 'float32'
      ? new Float64Array(Math.max(1, Math.floor(SLICE_VALUES / n)) * n)
      : undefined;
  const lanes = setup.mode === 'rows' ? new Float64Array(stride * n) : undefined;
  return (job) => {
    const counter = createClipCounter(n);
    const rejected = new Array<number>(n).fill(0);
    if (setup.mode === 'frames') {
      const target =
        setup.output === 'float32'
          ? new Float32Array(job.out, 0, job.frames * n)
          : new Float64Array(job.out, 0, job.frames * n);
      convertFrameBlock(
        converter as FrameConverter,
        job.codes,
        job.frames,
        job.firstFrame,
        n,
        target,
        scratch,
        factors,
        rejected,
        counter,
      );
      return {
        out: job.out,
        length: job.frames * n,
        rejected,
        clip: counter.summary(),
        temperature: undefined,
      };
    }
    const values = lanes ?? new Float64Array(job.out, 0, stride * n);
    const temperature = convertLaneBlock(
      work,
      job.codes,
      stride,
      job.frames,
      job.firstFrame,
      values,
      stride,
      rejected,
      counter,
    );
    if (setup.mode === 'lanes') {
      return { out: job.out, length: job.frames * n, rejected, clip: counter.summary(), temperature };
    }
    // Rows: the buffer holds the longest text a block's rows can take.
    const out = new Uint8Array(job.out);
    const done = formatCsvRows(
      values,
      stride,
      n,
      job.timeStamps,
      setup.digits,
      0,
      job.frames,
      out,
      0,
      out.length - maxRowBytes(n, job.timeStamps !== undefined),
    );
    if (done.row !== job.frames) throw new Error("a block's CSV text did not fit its buffer");
    return { out: job.out, length: done.pos, rejected, clip: counter.summary(), temperature };
  };
}
