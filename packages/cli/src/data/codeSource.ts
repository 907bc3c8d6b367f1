/**
 * A block of converter codes read from a file: `frames` frames of `channels` interleaved codes,
 * frame-major (`codes[frame * channels + channel]`).
 */
export interface CodeBlock {
  /**
   * The codes, exactly `frames × channels` long. The array is reused for the next block: it is
   * valid until the next block is requested, so copy what must outlive it.
   */
  readonly codes: Int32Array;
  /** Number of frames in this block (≥ 1). */
  readonly frames: number;
  /** Index of this block's first frame in the file (0-based). */
  readonly firstFrame: number;
  /** Bytes of the input consumed so far, including this block (for progress bars). */
  readonly bytesRead: number;
}

/** The formats of code files: CSV text, or raw little-endian 32-bit two's-complement integers. */
export type CodeFileFormat = 'csv' | 'int32le';

/** The code file formats, for option tables. */
export const codeFileFormats: readonly CodeFileFormat[] = Object.freeze(['csv', 'int32le']);

/**
 * An opened code file: its shape, and an iterator over fixed-size blocks of codes.
 *
 * @remarks
 * Memory is bounded by the block size whatever the file size: one `Int32Array` of
 * `blockFrames × channels` codes (plus, for raw files on a big-endian host, a byte buffer of the
 * same size) is allocated and refilled.
 */
export interface CodeSource {
  /** The file, as given. */
  readonly file: string;
  /** Its format. */
  readonly format: CodeFileFormat;
  /** Interleaved channels per frame (raw) or selected code columns (CSV). */
  readonly channels: number;
  /** Names of the selected columns from the CSV header, or `undefined` (raw, or CSV without a header). */
  readonly columnNames: readonly string[] | undefined;
  /** Frames per block: every block but the last has exactly this many. */
  readonly blockFrames: number;
  /** Size of the file in bytes. */
  readonly totalBytes: number;
  /** Number of frames in the file when known in advance (raw files), else `undefined`. */
  readonly totalFrames: number | undefined;
  /** Reads the file block by block; each call starts from the beginning of the file. */
  blocks(): AsyncGenerator<CodeBlock, void, undefined>;
}

/** Default frames per block: 65 536 frames (256 KiB of codes per channel). */
export const DEFAULT_BLOCK_FRAMES = 65_536;
