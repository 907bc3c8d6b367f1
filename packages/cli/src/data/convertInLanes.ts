import {
  blockOutputBytes,
  createBlockRunner,
  createTemperatureLog,
  type BlockDone,
  type BlockJob,
  type LaneSetup,
} from './blockConversion.js';
import { createClipCounter } from './clipCounter.js';
import type { CodeSource, FrameBlock, RecordingBlock } from './codeSource.js';
import type { ConversionLanes, LaneResult } from './conversionLanes.js';
import type { TimeStamps } from './decodeFrames.js';
import type {
  BlockTemperature,
  ConversionResult,
  ConvertingChannel,
  FrameConverter,
  FrameOutput,
  RecordingWriter,
  RowText,
} from './pipelineTypes.js';

/** What {@link convertInLanes} needs. */
export interface ConvertInLanesOptions {
  /** The recording. */
  readonly source: CodeSource;
  /** Receives the output, in block order. */
  readonly writer: RecordingWriter;
  /** The worker threads. */
  readonly pool: ConversionLanes;
  /** One channel spec per lane. */
  readonly specs: readonly unknown[];
  /** The channels made from those specs in this thread (for blocks converted here). */
  readonly channels: readonly ConvertingChannel[];
  /** All channels at once, in this thread (`frames` mode). */
  readonly frameConverter: FrameConverter | undefined;
  /**
   * `main` (default): while the workers start (load the channel package, make the channels),
   * blocks are converted in this thread; `wait`: every block goes to a worker.
   */
  readonly whileStarting?: 'main' | 'wait';
  /**
   * `frames`: the writer takes interleaved values ({@link RecordingWriter.frames}); `rows`: it takes
   * CSV text ({@link RecordingWriter.rows}); `lanes`: it takes blocks of lanes (`writeBlock`).
   */
  readonly mode: LaneSetup['mode'];
  /** Per channel, the factor to the written unit. */
  readonly factors: readonly number[];
  /** The per-block temperature correction (not with `frames`). */
  readonly temperature: BlockTemperature | undefined;
  /** Called after each block is written (for a progress bar). */
  readonly onBlock:
    ((block: Pick<RecordingBlock, 'frames' | 'firstFrame' | 'bytesRead'>) => void) | undefined;
}

/** The memory of one block in flight (shared with the workers). */
interface Slot {
  readonly codes: SharedArrayBuffer;
  readonly out: SharedArrayBuffer;
  stamps: SharedArrayBuffer | undefined;
  /** Resolves when this slot's last block has been written (rejects if anything before failed). */
  busy: Promise<void>;
}

/**
 * The worker-thread path of `convertRecording`: each block's codes are copied into a free slot and
 * sent to a worker in turn (until the workers have started, converted in this thread by the same
 * block runner); results are taken in block order, their flagged-sample summaries and
 * temperatures merged in that order, and written in that order. At most `threads + 2` blocks are
 * in flight; a slot is refilled only once its previous block has been written.
 *
 * @param options - Source, writer, workers, setup and progress hook.
 * @returns Frames converted, flagged samples, temperature gaps and block temperatures.
 * @throws Whatever the source, a block's conversion (the same error one thread throws, first in
 *   block order) or the writer throws.
 */
export async function convertInLanes(options: ConvertInLanesOptions): Promise<ConversionResult> {
  const { source, writer, pool, mode } = options;
  const n = source.channels;
  const stride = source.blockFrames;
  const setup: LaneSetup = {
    mode,
    channels: n,
    blockFrames: stride,
    factors: options.factors,
    temperature: options.temperature,
    output: writer.frames?.type ?? 'float64',
    digits: writer.rows?.digits,
  };
  // The workers start (load the channel package, make the channels) while this thread converts
  // the first blocks itself with the same block runner; from then on every block goes to them.
  let started = false;
  let failed: { error: unknown } | undefined;
  const ready = pool.setup(setup, options.specs).then(
    () => {
      started = true;
    },
    (error: unknown) => {
      failed = { error };
    },
  );
  if (options.whileStarting === 'wait') {
    await ready;
    if (failed !== undefined) throw failed.error;
  }
  let here: ((job: BlockJob) => BlockDone) | undefined;
  let dispatched = 0;
  const inFlight = pool.threads + 2;
  const slots: Slot[] = Array.from({ length: inFlight }, () => ({
    codes: new SharedArrayBuffer(stride * n * 8),
    out: new SharedArrayBuffer(blockOutputBytes(setup)),
    stamps: undefined,
    busy: Promise.resolve(),
  }));
  const counter = createClipCounter(n);
  const temperatures = createTemperatureLog();
  let frames = 0;
  let order: Promise<void> = Promise.resolve();
  let index = 0;

  /** Writes a block's result: interleaved values, CSV text, or a block of lanes. */
  const write = (
    result: LaneResult,
    out: SharedArrayBuffer,
    block: BlockMeta,
    stamps: TimeStamps | undefined,
  ): Promise<void> => {
    if (mode === 'frames') {
      const output = writer.frames as FrameOutput;
      const values =
        output.type === 'float32'
          ? new Float32Array(out, 0, result.length)
          : new Float64Array(out, 0, result.length);
      return output.writeValues(values, result.length);
    }
    if (mode === 'rows') return (writer.rows as RowText).write(new Uint8Array(out, 0, result.length));
    return writer.writeBlock({
      frames: block.frames,
      firstFrame: block.firstFrame,
      values: new Float64Array(out, 0, stride * n),
      laneStride: stride,
      timeStamps: stamps,
      passThrough: block.passThrough,
      rejected: result.rejected,
    });
  };

  const blocks: AsyncGenerator<FrameBlock | RecordingBlock> =
    mode === 'frames' ? (source.frames as NonNullable<CodeSource['frames']>)() : source.blocks();
  for await (const block of blocks) {
    const slot = slots[index % inFlight] as Slot;
    index++;
    await slot.busy; // its previous block is written
    const count = block.frames;
    // The codes: frame-major for `frames`, else lanes `stride` apart (up to the last lane's end).
    const length = mode === 'frames' ? count * n : (n - 1) * stride + count;
    const codes =
      block.codes instanceof Int32Array
        ? new Int32Array(slot.codes, 0, length)
        : new Float64Array(slot.codes, 0, length);
    codes.set(block.codes.subarray(0, length) as Int32Array & Float64Array);
    // Time stamps and passed-through texts are refilled by the source: copy them.
    let stamps: TimeStamps | undefined;
    const blockStamps = 'timeStamps' in block ? block.timeStamps : undefined;
    if (blockStamps !== undefined) {
      slot.stamps ??= new SharedArrayBuffer(stride * 8);
      const Stamps = blockStamps.constructor as new (
        buffer: SharedArrayBuffer,
        offset: number,
        length: number,
      ) => TimeStamps;
      stamps = new Stamps(slot.stamps, 0, count);
      (stamps as Float64Array).set(blockStamps.subarray(0, count) as Float64Array);
    }
    const meta: BlockMeta = {
      frames: count,
      firstFrame: block.firstFrame,
      bytesRead: block.bytesRead,
      passThrough:
        'passThrough' in block ? block.passThrough?.map((texts) => texts.slice(0, count)) : undefined,
    };
    // Text rows need the stamps in the worker; the other modes keep them here for the writer.
    const sent = mode === 'rows' ? stamps : undefined;
    if (failed !== undefined) throw failed.error;
    const job: BlockJob = {
      frames: count,
      firstFrame: block.firstFrame,
      codes,
      timeStamps: sent,
      out: slot.out,
    };
    let result: Promise<LaneResult>;
    if (started) result = pool.convert(dispatched++ % pool.threads, job);
    else {
      here ??= createBlockRunner(setup, options.channels, options.frameConverter);
      try {
        result = Promise.resolve(here(job));
      } catch (error) {
        result = Promise.reject(error);
      }
    }
    result.catch(() => undefined); // met in order, below
    order = order.then(async () => {
      const r = await result;
      counter.addSummary(r.clip);
      temperatures.add(r.temperature, meta.firstFrame, count);
      await write(r, slot.out, meta, mode === 'rows' ? undefined : stamps);
      frames += count;
      options.onBlock?.(meta);
    });
    order.catch(() => undefined); // met at the slot's next use, or below
    slot.busy = order;
  }
  await order;
  await writer.finish();
  void ready; // a worker still starting is stopped by the pool's close
  return {
    frames,
    clip: counter.summary(),
    temperatureGaps: temperatures.gaps(),
    blockTemperatures: temperatures.temperatures,
  };
}

/** What is kept of a block on this thread while a worker converts it. */
interface BlockMeta {
  readonly frames: number;
  readonly firstFrame: number;
  readonly bytesRead: number;
  readonly passThrough: readonly (readonly string[])[] | undefined;
}
