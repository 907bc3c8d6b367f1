import { extname } from 'node:path';
import type { OutputFormat } from './formatLists.js';

export {
  outputFormats,
  parquetCompressions,
  rawOutputFormats,
  type OutputFormat,
  type ParquetCompression,
  type RawOutputFormat,
} from './formatLists.js';

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
