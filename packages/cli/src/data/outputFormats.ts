import { extname } from 'node:path';

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

/**
 * The output format implied by a file name: `.arrow`/`.feather`/`.ipc` Arrow file, `.arrows` Arrow
 * stream, `.parquet`/`.pq` Parquet, `.f32` and `.f64` raw little-endian floats, anything else (and
 * standard output) CSV.
 *
 * @param path - The output file, or `undefined` for standard output.
 * @returns The format.
 * @example
 * ```ts
 * outputFormatFromPath('deck.parquet'); // 'parquet'
 * ```
 */
export function outputFormatFromPath(path: string | undefined): OutputFormat {
  if (path === undefined) return 'csv';
  switch (extname(path).toLowerCase()) {
    case '.arrow':
    case '.feather':
    case '.ipc':
      return 'arrow';
    case '.arrows':
      return 'arrows';
    case '.parquet':
    case '.pq':
      return 'parquet';
    case '.f32':
      return 'float32le';
    case '.f64':
      return 'float64le';
    default:
      return 'csv';
  }
}
