/**
 * The shapes the conversion pipeline works with: what it needs of a channel, what a writer takes,
 * and the per-block temperature correction. Apart from `convertRecording` so that the block
 * work it shares with the conversion worker threads imports them without an import cycle.
 */
import type { ClipSummary } from './clipCounter.js';
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
  /**
   * Queues the first `count` values of a buffer the caller owns (values converted elsewhere, in a
   * conversion worker thread), after the writes queued before.
   *
   * @returns Resolves when they are written (the buffer may then be reused; it may have been
   *   byte-swapped in place for the format's byte order).
   */
  writeValues(values: Float32Array | Float64Array, count: number): Promise<void>;
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
  /**
   * Writers of text rows (CSV without passed-through columns): the rows of a block may be
   * formatted elsewhere (in a conversion worker thread) by `formatCsvRows` with these settings and
   * handed over as bytes, in block order, instead of calling `writeBlock`.
   */
  readonly rows?: RowText;
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

/** The text rows a CSV writer takes already formatted (see {@link RecordingWriter.rows}). */
export interface RowText {
  /** Significant digits of each value, or `undefined` for the shortest round-trip text. */
  readonly digits: number | undefined;
  /**
   * Writes the bytes of whole rows (after the header, which the writer writes first).
   *
   * @param bytes - UTF-8 rows, each ending in `\n`; not changed by the caller until this resolves.
   * @returns Resolves when the bytes are written (their memory may then be reused).
   */
  write(bytes: Uint8Array): Promise<void>;
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
