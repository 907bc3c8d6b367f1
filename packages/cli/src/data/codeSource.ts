import type { CodeLanes, TimeStamps } from './decodeFrames.js';
import type { SampleType, TimeStampType } from './recordingLayout.js';

/**
 * A block of a recording: `frames` frames, the codes of each channel in its own lane (channel `j`
 * at `codes[j * laneStride + f]` for frame `f`), with the time stamps and passed-through columns
 * of the same frames.
 */
export interface RecordingBlock {
  /** Number of frames in this block (≥ 1). */
  readonly frames: number;
  /** Index of this block's first frame in the recording (0-based). */
  readonly firstFrame: number;
  /** Bytes of the input consumed so far, including this block (for progress bars). */
  readonly bytesRead: number;
  /**
   * The codes, one lane per channel. The array is reused for the next block: it is valid until the
   * next block is requested, so copy what must outlive it.
   */
  readonly codes: CodeLanes;
  /** Distance between lanes in `codes` (the source's `blockFrames`). */
  readonly laneStride: number;
  /** The time stamp of each frame (the first `frames` entries), or `undefined`. Reused like `codes`. */
  readonly timeStamps: TimeStamps | undefined;
  /** CSV: the text of each passed-through column, `frames` entries each, or `undefined`. */
  readonly passThrough: readonly (readonly string[])[] | undefined;
}

/**
 * A block of a raw recording with its codes as stored, frame after frame (see
 * {@link CodeSource.frames}): the code of channel `j` in frame `f` at `codes[f × channels + j]`.
 */
export interface FrameBlock {
  /** Number of frames in this block (≥ 1). */
  readonly frames: number;
  /** Index of this block's first frame in the recording (0-based). */
  readonly firstFrame: number;
  /** Bytes of the input consumed so far, including this block (for progress bars). */
  readonly bytesRead: number;
  /**
   * The codes, `frames × channels` of them, frame-major. Valid until the next block is requested
   * (it may be a view of the bytes read).
   */
  readonly codes: Int32Array | Float64Array;
}

/** The code file formats: CSV text, or a raw layout's {@link SampleType}. */
export type CodeFileFormat = 'csv' | SampleType;

/** The time column of a recording. */
export interface TimeColumn {
  /** The column's name (`time` for a raw time stamp, the header name for CSV). */
  readonly name: string;
  /**
   * How it is held: a raw time stamp type (kept exactly as stored), or `'seconds'` (a CSV column of
   * decimal numbers read as seconds).
   */
  readonly type: TimeStampType | 'seconds';
  /** Seconds per tick of a raw time stamp, when stated. */
  readonly secondsPerTick?: number;
}

/**
 * An opened recording: its shape, and an iterator over fixed-size blocks of frames.
 *
 * @remarks
 * Memory is bounded by the block size whatever the file size: the blocks' arrays are allocated
 * once and refilled.
 */
export interface CodeSource {
  /** The file, as given. */
  readonly file: string;
  /** Its format. */
  readonly format: CodeFileFormat;
  /** Channels per frame (raw) or selected code columns (CSV). */
  readonly channels: number;
  /** Names of the selected code columns from the CSV header, or `undefined`. */
  readonly columnNames: readonly string[] | undefined;
  /** The time column, when the recording has one. */
  readonly timeColumn: TimeColumn | undefined;
  /** Names of the CSV columns passed through as text (other than the time column), in file order. */
  readonly passThroughNames: readonly string[];
  /** Frames per block: every block but the last has exactly this many. */
  readonly blockFrames: number;
  /** Size of the file in bytes. */
  readonly totalBytes: number;
  /** Number of frames in the file when known in advance (raw files), else `undefined`. */
  readonly totalFrames: number | undefined;
  /** Reads the file block by block; each call starts from the beginning of the file. */
  blocks(): AsyncGenerator<RecordingBlock, void, undefined>;
  /**
   * Raw recordings only: reads the file block by block with the codes left interleaved, frame
   * after frame, without the frame headers (time stamps are not read). Blocks hold the same frames
   * as those of `blocks()`; each call starts from the beginning of the file.
   */
  frames?(): AsyncGenerator<FrameBlock, void, undefined>;
}

/** Default frames per block: 65 536 frames. */
export const DEFAULT_BLOCK_FRAMES = 65_536;
