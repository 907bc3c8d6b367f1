/**
 * What the Parquet writer's two halves share: the writer's settings as plain data (they cross to
 * the encoder thread), the crate's writer properties made from them, and the messages between the
 * main thread and the encoder thread (see `createParquetWriter` and `parquetWorker.ts`).
 */
import type { WriterProperties } from 'parquet-wasm/node';
import type { SentError } from './laneMessages.js';
import type { ParquetCompression } from './outputFormats.js';

type ParquetWasm = typeof import('parquet-wasm/node');

/** The settings of one Parquet file. */
export interface ParquetSettings {
  /** Column-chunk compression. */
  readonly compression: ParquetCompression;
  /** Largest row group, in rows. */
  readonly rowGroupRows: number;
  /** The file's `created_by`. */
  readonly createdBy: string;
  /** Key/value metadata of the file. */
  readonly metadata: readonly (readonly [string, string])[];
}

/**
 * The crate's writer properties: plain encoding without dictionaries for the values (measured
 * data rarely repeats a double), page statistics on, the compression, row-group size, creator and
 * metadata of `settings`.
 *
 * @param pw - The loaded parquet-wasm module.
 * @param settings - The file's settings.
 * @returns The properties (a WebAssembly object, consumed by the writer).
 */
export function writerProperties(pw: ParquetWasm, settings: ParquetSettings): WriterProperties {
  const codec = {
    none: pw.Compression.UNCOMPRESSED,
    snappy: pw.Compression.SNAPPY,
    zstd: pw.Compression.ZSTD,
  }[settings.compression];
  return new pw.WriterPropertiesBuilder()
    .setCompression(codec)
    .setDictionaryEnabled(false)
    .setMaxRowGroupSize(settings.rowGroupRows)
    .setCreatedBy(settings.createdBy)
    .setKeyValueMetadata(new Map(settings.metadata))
    .build();
}

/** Main thread → encoder thread. */
export type ParquetRequest =
  | { readonly type: 'start'; readonly settings: ParquetSettings }
  /** One record batch as an Arrow IPC stream (its buffer transferred). */
  | { readonly type: 'batch'; readonly ipc: Uint8Array }
  /** No more batches: finish the file. */
  | { readonly type: 'end' }
  /** A chunk of the file's bytes has been written (the encoder may send another). */
  | { readonly type: 'written' };

/** Encoder thread → main thread. */
export type ParquetReply =
  /** A batch has been read into the encoder (the main thread may send another). */
  | { readonly type: 'taken' }
  /** The next bytes of the file, in order (the buffer transferred). */
  | { readonly type: 'bytes'; readonly bytes: Uint8Array }
  /** Every byte of the file has been sent. */
  | { readonly type: 'done' }
  | { readonly type: 'failed'; readonly error: SentError };
