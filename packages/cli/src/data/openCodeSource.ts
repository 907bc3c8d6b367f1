import { extname } from 'node:path';
import { requireOption } from '@bridgework/core';
import type { CodeFileFormat, CodeSource } from './codeSource.js';
import { openCsvCodes, type CsvColumn } from './readCsvCodes.js';
import { openRawCodes } from './readRawCodes.js';
import type { TimeStampLayout } from './recordingLayout.js';

/** Options of {@link openCodeSource}. */
export interface OpenCodeSourceOptions {
  /** The file format. Default: from the extension (see {@link codeFormatFromPath}). */
  readonly format?: CodeFileFormat;
  /** Raw files: channels per frame. Required for raw files; CSV files ignore it. */
  readonly channels?: number;
  /** Raw files: bytes skipped before the first frame. */
  readonly fileHeaderBytes?: number;
  /** Raw files: bytes at the start of each frame (may hold the time stamp). */
  readonly frameHeaderBytes?: number;
  /** Raw files: bytes skipped at the end of each frame. */
  readonly frameTrailerBytes?: number;
  /** Raw files: the time stamp in the frame header. */
  readonly timeStamp?: TimeStampLayout;
  /** CSV files: the code columns (names or 1-based numbers). Default every other column. */
  readonly columns?: readonly CsvColumn[];
  /** CSV files: the time column (seconds). */
  readonly timeColumn?: CsvColumn;
  /** CSV files: the columns passed through as text, or `'none'`. Default every other column. */
  readonly keep?: readonly CsvColumn[] | 'none';
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
  const ext = extname(String(path)).toLowerCase();
  return ext === '.csv' || ext === '.txt' ? 'csv' : 'int32le';
}

/**
 * Opens a recording of either kind (see {@link openCsvCodes} and {@link openRawCodes}).
 *
 * @param file - The file path.
 * @param options - Format, raw layout (raw), columns (CSV) and block size.
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
      ...(options.timeColumn === undefined ? {} : { timeColumn: options.timeColumn }),
      ...(options.keep === undefined ? {} : { keep: options.keep }),
    });
  }
  return openRawCodes(file, {
    sample: format,
    channels: requireOption('channels', options.channels, 'for a raw recording'),
    ...blockFrames,
    ...(options.fileHeaderBytes === undefined ? {} : { fileHeaderBytes: options.fileHeaderBytes }),
    ...(options.frameHeaderBytes === undefined ? {} : { frameHeaderBytes: options.frameHeaderBytes }),
    ...(options.frameTrailerBytes === undefined ? {} : { frameTrailerBytes: options.frameTrailerBytes }),
    ...(options.timeStamp === undefined ? {} : { timeStamp: options.timeStamp }),
  });
}
