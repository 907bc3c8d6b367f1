import { Table, tableToIPC } from 'apache-arrow';
import { createBatchBuilder } from './arrowBatches.js';
import type { RecordingWriter } from './convertRecording.js';
import type { ParquetCompression } from './outputFormats.js';
import type { OutputSink } from './outputSink.js';
import type { RecordingColumns } from './recordingColumns.js';

/** Options of {@link createParquetWriter}. */
export interface ParquetWriterOptions {
  /** Column-chunk compression. Default `'snappy'`. */
  readonly compression?: ParquetCompression;
  /** Largest row group in bytes of values (a bound on the writer's memory). Default 8 MiB. */
  readonly rowGroupBytes?: number;
}

/**
 * Default bytes of values per row group: 8 MiB (about 116 000 rows of 8 channels and the time, the
 * order of DuckDB's own row groups). The writer's memory grows with it: measured peak resident size
 * about 100 MB above Node's at 8 MiB, about 200 MB at 32 MiB.
 */
export const DEFAULT_ROW_GROUP_BYTES = 8 << 20;

type ParquetWasm = typeof import('parquet-wasm/node');

/**
 * A writer of Apache Parquet: the columns and metadata of {@link recordingSchema} (the Arrow
 * schema is stored in the file too, so Arrow readers see each column's unit).
 *
 * @remarks
 * The file is written by parquet-wasm (the Rust `parquet` crate of the Apache Arrow project,
 * compiled to WebAssembly): each block becomes an Arrow record batch (apache-arrow), handed to the
 * crate's streaming writer, whose bytes are written to the sink as row groups complete. Row groups
 * hold at most `rowGroupBytes` of values (and at least one block), which bounds the memory the
 * writer holds; the block's own memory is free as soon as the batch is copied into WebAssembly
 * memory. Plain encoding without dictionaries for the values, page statistics on, key/value
 * metadata of the file from `columns.metadata`. Flagged samples are null.
 *
 * @param sink - Where the bytes go.
 * @param columns - The columns and metadata.
 * @param blockFrames - Frames of the largest block.
 * @param options - Compression and row-group size.
 * @returns The writer (the WebAssembly module is loaded on first use).
 * @example
 * ```ts
 * const writer = await createParquetWriter(file, columns, source.blockFrames);
 * ```
 */
export async function createParquetWriter(
  sink: OutputSink,
  columns: RecordingColumns,
  blockFrames: number,
  options: ParquetWriterOptions = {},
): Promise<RecordingWriter> {
  const pw: ParquetWasm = await import('parquet-wasm/node');
  const builder = createBatchBuilder(columns, blockFrames);
  const codec = {
    none: pw.Compression.UNCOMPRESSED,
    snappy: pw.Compression.SNAPPY,
    zstd: pw.Compression.ZSTD,
  }[options.compression ?? 'snappy'];
  const bytesPerRow = 8 * (columns.channels.length + 1) + 16 * columns.passThrough.length;
  const rowGroupRows = Math.max(
    blockFrames,
    Math.floor((options.rowGroupBytes ?? DEFAULT_ROW_GROUP_BYTES) / bytesPerRow),
  );
  const properties = new pw.WriterPropertiesBuilder()
    .setCompression(codec)
    .setDictionaryEnabled(false)
    .setMaxRowGroupSize(rowGroupRows)
    .setCreatedBy(
      columns.metadata['bridgework.version'] === undefined
        ? 'bridgework'
        : `bridgework ${columns.metadata['bridgework.version']}`,
    )
    .setKeyValueMetadata(new Map(Object.entries(columns.metadata)))
    .build();

  // Push (our blocks) to pull (the crate's input stream): a one-slot hand-over.
  const queue: unknown[] = [];
  let closed = false;
  let wakePull: (() => void) | undefined;
  let wakeWriter: (() => void) | undefined;
  let failure: unknown;
  const input = new ReadableStream(
    {
      async pull(controller) {
        while (queue.length === 0 && !closed) await new Promise<void>((r) => (wakePull = r));
        if (queue.length > 0) controller.enqueue(queue.shift());
        else controller.close();
        if (queue.length === 0) wakeWriter?.();
      },
    },
    { highWaterMark: 0 },
  );
  // The crate reads the first batch (for the schema) before it hands out its byte stream, so the
  // stream is awaited by the consumer, not here (the first batch comes with the first block).
  const done = (async () => {
    const output = await pw.transformParquetStream(input, properties);
    const reader = (output as ReadableStream<Uint8Array>).getReader();
    for (;;) {
      const { value, done: end } = await reader.read();
      if (end) return;
      await sink.write(value);
    }
  })().catch((e: unknown) => {
    failure = e;
    wakeWriter?.();
  });

  let written = false;
  const rethrow = (): void => {
    if (failure !== undefined) throw failure;
  };
  return {
    async writeBlock(block) {
      rethrow();
      written = true;
      const table = pw.Table.fromIPCStream(tableToIPC(new Table([builder.batch(block)]), 'stream'));
      for (const batch of table.recordBatches()) queue.push(batch);
      table.free();
      wakePull?.();
      while (queue.length > 0 && failure === undefined) await new Promise<void>((r) => (wakeWriter = r));
      rethrow();
    },
    async finish() {
      rethrow();
      if (!written) {
        // An empty recording: one empty batch carries the schema into the file.
        const empty = builder.batch({
          frames: 0,
          firstFrame: 0,
          values: new Float64Array(0),
          laneStride: 0,
          timeStamps: undefined,
          passThrough: columns.passThrough.map(() => []),
          rejected: columns.channels.map(() => 0),
        });
        const table = pw.Table.fromIPCStream(tableToIPC(new Table([empty]), 'stream'));
        for (const batch of table.recordBatches()) queue.push(batch);
        table.free();
      }
      closed = true;
      wakePull?.();
      await done;
      rethrow();
    },
  };
}
