/**
 * The names of the recording and output formats, with no imports, so that the `convert` option
 * table (loaded at start-up for `--help`) can list them without loading any data module.
 */

/**
 * How one converter code is stored in a raw recording: signedness and width, then byte order.
 *
 * @remarks
 * `int…` are two's-complement, `uint…` unsigned (a code ≥ 2^31 of `uint32…` stays positive, it is
 * never wrapped to a negative code), `int24…`/`uint24…` are packed in 3 bytes, `float…` are IEEE
 * 754 codes (for example codes a logger has averaged). `le` is little-endian (least significant
 * byte first), `be` big-endian.
 */
export type SampleType =
  | 'int16le'
  | 'int16be'
  | 'uint16le'
  | 'uint16be'
  | 'int24le'
  | 'int24be'
  | 'uint24le'
  | 'uint24be'
  | 'int32le'
  | 'int32be'
  | 'uint32le'
  | 'uint32be'
  | 'float32le'
  | 'float32be'
  | 'float64le'
  | 'float64be';

/** Every {@link SampleType}, for option tables and checks. */
export const sampleTypes: readonly SampleType[] = Object.freeze([
  'int16le',
  'int16be',
  'uint16le',
  'uint16be',
  'int24le',
  'int24be',
  'uint24le',
  'uint24be',
  'int32le',
  'int32be',
  'uint32le',
  'uint32be',
  'float32le',
  'float32be',
  'float64le',
  'float64be',
]);

/** How a per-frame time stamp is stored: an unsigned or signed integer count of ticks, or a float. */
export type TimeStampType =
  'uint32le' | 'uint32be' | 'int64le' | 'int64be' | 'uint64le' | 'uint64be' | 'float64le' | 'float64be';

/** Every {@link TimeStampType}. */
export const timeStampTypes: readonly TimeStampType[] = Object.freeze([
  'uint32le',
  'uint32be',
  'int64le',
  'int64be',
  'uint64le',
  'uint64be',
  'float64le',
  'float64be',
]);

/** The raw output formats: IEEE 754 values, one per channel per frame, in a stated byte order. */
export type RawOutputFormat = 'float32le' | 'float32be' | 'float64le' | 'float64be';

/** Every {@link RawOutputFormat}. */
export const rawOutputFormats: readonly RawOutputFormat[] = Object.freeze([
  'float32le',
  'float32be',
  'float64le',
  'float64be',
]);

/** What `convert` writes: CSV, raw floats, an Arrow IPC file or stream, or Parquet. */
export type OutputFormat = 'csv' | RawOutputFormat | 'arrow' | 'arrows' | 'parquet';

/** Every {@link OutputFormat}. */
export const outputFormats: readonly OutputFormat[] = Object.freeze([
  'csv',
  ...rawOutputFormats,
  'arrow',
  'arrows',
  'parquet',
]);

/** Compression of Parquet column chunks. */
export type ParquetCompression = 'none' | 'snappy' | 'zstd';

/** Every {@link ParquetCompression}. */
export const parquetCompressions: readonly ParquetCompression[] = Object.freeze(['none', 'snappy', 'zstd']);
