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
function writerProperties(pw: ParquetWasm, settings: ParquetSettings): WriterProperties {
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

/**
 * Runs the crate's streaming writer over a sequence of record batches: each comes as an Arrow IPC
 * stream from `next` (`undefined` ends the file), is read into WebAssembly memory when the crate
 * pulls it, and the file's bytes go to `write` in order as row groups complete. The one loop both
 * the main thread and the encoder thread run, so their files are the same.
 *
 * @param pw - The loaded parquet-wasm module.
 * @param settings - The file's settings.
 * @param next - The next batch as IPC bytes, or `undefined` when there are no more.
 * @param write - Takes the next bytes of the file; the crate waits for it.
 * @returns Resolves when the whole file has been written.
 */
export async function encodeParquet(
  pw: ParquetWasm,
  settings: ParquetSettings,
  next: () => Promise<Uint8Array | undefined>,
  write: (bytes: Uint8Array) => Promise<void>,
): Promise<void> {
  const properties = writerProperties(pw, settings);
  const input = new ReadableStream(
    {
      async pull(controller) {
        const ipc = await next();
        if (ipc === undefined) {
          controller.close();
          return;
        }
        const table = pw.Table.fromIPCStream(ipc);
        for (const batch of table.recordBatches()) controller.enqueue(batch);
        table.free();
      },
    },
    { highWaterMark: 0 },
  );
  // The crate reads the first batch (for the schema) before it hands out its byte stream.
  const output = (await pw.transformParquetStream(input, properties)) as ReadableStream<Uint8Array>;
  const reader = output.getReader();
  for (;;) {
    const { value, done } = await reader.read();
    if (done) return;
    await write(value);
  }
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
  /** A batch has been taken by the encoder (the main thread may send another). */
  | { readonly type: 'taken' }
  /** The next bytes of the file, in order (the buffer transferred). */
  | { readonly type: 'bytes'; readonly bytes: Uint8Array }
  /** Every byte of the file has been sent. */
  | { readonly type: 'done' }
  | { readonly type: 'failed'; readonly error: SentError };
