import { extname } from 'node:path';
import { requireOption } from '@bridgework/core';
import type { CodeFileFormat, CodeSource } from './codeSource.js';
import { openInt32Codes } from './readInt32Codes.js';
import { openCsvCodes } from './readCsvCodes.js';

/** Options of {@link openCodeSource}. */
export interface OpenCodeSourceOptions {
  /** The file format. Default: from the extension (see {@link codeFormatFromPath}). */
  readonly format?: CodeFileFormat;
  /** Raw files: interleaved channels per frame. Required for raw files; CSV files ignore it. */
  readonly channels?: number;
  /** CSV files: the code columns (names or 1-based numbers). Default every column. */
  readonly columns?: readonly (string | number)[];
  /** Frames per block. Default 65 536. */
  readonly blockFrames?: number;
}

/**
 * The code file format implied by a file name: `.csv` and `.txt` are CSV, anything else (`.bin`,
 * `.raw`, `.i32`, `.dat`...) raw little-endian int32.
 *
 * @param path - The file name.
 * @returns The format.
 * @example
 * ```ts
 * codeFormatFromPath('hook.CSV'); // 'csv'
 * codeFormatFromPath('hook.bin'); // 'int32le'
 * ```
 */
export function codeFormatFromPath(path: string): CodeFileFormat {
  const ext = extname(path).toLowerCase();
  return ext === '.csv' || ext === '.txt' ? 'csv' : 'int32le';
}

/**
 * Opens a code file of either format (see {@link openCsvCodes} and {@link openInt32Codes}).
 *
 * @param file - The file path.
 * @param options - Format, channel count (raw), columns (CSV) and block size.
 * @returns The opened source.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` when a raw file is opened without `channels`,
 * and everything the format's reader throws.
 */
export async function openCodeSource(file: string, options: OpenCodeSourceOptions = {}): Promise<CodeSource> {
  const format = options.format ?? codeFormatFromPath(file);
  const blockFrames = options.blockFrames === undefined ? {} : { blockFrames: options.blockFrames };
  if (format === 'csv') {
    return openCsvCodes(file, {
      ...blockFrames,
      ...(options.columns === undefined ? {} : { columns: options.columns }),
    });
  }
  return openInt32Codes(file, {
    channels: requireOption('channels', options.channels, 'for a raw int32 file'),
    ...blockFrames,
  });
}
