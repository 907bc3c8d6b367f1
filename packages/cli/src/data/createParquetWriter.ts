import { Worker } from 'node:worker_threads';
import { Table, tableToIPC, type RecordBatch } from 'apache-arrow';
import { createBatchBuilder } from './arrowBatches.js';
import type { RecordingWriter } from './convertRecording.js';
import { receiveError } from './laneMessages.js';
import type { ParquetCompression } from './outputFormats.js';
import type { OutputSink } from './outputSink.js';
import {
  encodeParquet,
  type ParquetReply,
  type ParquetRequest,
  type ParquetSettings,
} from './parquetSettings.js';
import type { RecordingColumns } from './recordingColumns.js';
import { startSourceWorker } from './sourceWorker.js';

/** Options of {@link createParquetWriter}. */
export interface ParquetWriterOptions {
  /** Column-chunk compression. Default `'snappy'`. */
  readonly compression?: ParquetCompression;
  /** Largest row group in bytes of values (a bound on the writer's memory). Default 8 MiB. */
  readonly rowGroupBytes?: number;
  /**
   * Encode in a worker thread (the main thread goes on converting the next blocks while the
   * previous ones are encoded and compressed). Default `false`. The same column chunks and metadata.
   */
  readonly encoderThread?: boolean;
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
 * With `encoderThread`, the crate runs in a worker thread (`parquetWorker.ts`): each block's batch
 * crosses as Arrow IPC bytes (transferred, not copied), at most two batches wait there, and the
 * file's bytes come back in order, at most two chunks unwritten, so memory stays bounded whatever
 * the disk's speed. The column chunks are the same bytes as in one thread (the same crate, settings
 * and batches); only the order of the key/value metadata may differ, as it may between any two
 * files the crate writes in one process (it keeps them in a hash map).
 * The thread does not keep the process alive when the conversion fails elsewhere.
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
  const builder = createBatchBuilder(columns, blockFrames);
  const bytesPerRow = 8 * (columns.channels.length + 1) + 16 * columns.passThrough.length;
  const settings: ParquetSettings = {
    compression: options.compression ?? 'snappy',
    rowGroupRows: Math.max(
      blockFrames,
      Math.floor((options.rowGroupBytes ?? DEFAULT_ROW_GROUP_BYTES) / bytesPerRow),
    ),
    createdBy:
      columns.metadata['bridgework.version'] === undefined
        ? 'bridgework'
        : `bridgework ${columns.metadata['bridgework.version']}`,
    metadata: Object.entries(columns.metadata),
  };
  const encoder =
    options.encoderThread === true ? encoderThread(sink, settings) : await inThisThread(sink, settings);

  let written = false;
  return {
    async writeBlock(block) {
      written = true;
      await encoder.batch(ipcOf(builder.batch(block)));
    },
    async finish() {
      if (!written) {
        // An empty recording: one empty batch carries the schema into the file.
        await encoder.batch(
          ipcOf(
            builder.batch({
              frames: 0,
              firstFrame: 0,
              values: new Float64Array(0),
              laneStride: 0,
              timeStamps: undefined,
              passThrough: columns.passThrough.map(() => []),
              rejected: columns.channels.map(() => 0),
            }),
          ),
        );
      }
      await encoder.end();
    },
  };
}

/** A record batch as an Arrow IPC stream: a copy, so the block's arrays are free at once. */
function ipcOf(batch: RecordBatch): Uint8Array {
  return tableToIPC(new Table([batch]), 'stream');
}

/** One of the two ways the crate is run: takes batches (as IPC bytes) in order, then ends the file. */
interface Encoder {
  /** Takes a batch's IPC bytes (the encoder thread takes over their buffer). */
  batch(ipc: Uint8Array): Promise<void>;
  /** Ends the file; resolves when every byte is written to the sink. */
  end(): Promise<void>;
}

/** The crate in this thread: push (our batches) to pull (its input stream) by a one-slot hand-over. */
async function inThisThread(sink: OutputSink, settings: ParquetSettings): Promise<Encoder> {
  const pw: ParquetWasm = await import('parquet-wasm/node');
  const queue: Uint8Array[] = [];
  let closed = false;
  let wakePull: (() => void) | undefined;
  let wakeWriter: (() => void) | undefined;
  let failure: unknown;
  const done = encodeParquet(
    pw,
    settings,
    async () => {
      while (queue.length === 0 && !closed) await new Promise<void>((r) => (wakePull = r));
      const ipc = queue.shift();
      wakeWriter?.();
      return ipc;
    },
    (bytes) => sink.write(bytes),
  ).catch((e: unknown) => {
    failure = e;
    wakeWriter?.();
  });
  const rethrow = (): void => {
    if (failure !== undefined) throw failure;
  };
  return {
    async batch(ipc) {
      rethrow();
      queue.push(ipc);
      wakePull?.();
      while (queue.length > 0 && failure === undefined) await new Promise<void>((r) => (wakeWriter = r));
      rethrow();
    },
    async end() {
      rethrow();
      closed = true;
      wakePull?.();
      await done;
      rethrow();
    },
  };
}

const here = import.meta.url;

/** The encoder thread: dist/data/parquetWorker.js, or the TypeScript module from the sources. */
function startEncoderWorker(): Worker {
  if (!here.endsWith('.ts')) return new Worker(new URL('./parquetWorker.js', here));
  return startSourceWorker(new URL('./parquetWorker.ts', here));
}

/** The crate in a worker thread (see {@link createParquetWriter}). */
function encoderThread(sink: OutputSink, settings: ParquetSettings): Encoder {
  const worker = startEncoderWorker();
  // Unreferenced except while this thread waits for it: a conversion that fails elsewhere
  // ends the process without waiting for the encoder.
  worker.unref();
  const post = (request: ParquetRequest, transfer: ArrayBuffer[] = []): void => {
    worker.postMessage(request, transfer);
  };
  let sent = 0;
  let taken = 0;
  let finished = false;
  let failure: unknown;
  let wake: (() => void) | undefined;
  let writing: Promise<void> = Promise.resolve();
  const fail = (error: unknown): void => {
    failure ??= error;
    wake?.();
  };
  worker.on('message', (reply: ParquetReply) => {
    switch (reply.type) {
      case 'taken':
        taken++;
        wake?.();
        break;
      case 'bytes':
        writing = writing
          .then(() => (failure === undefined ? sink.write(reply.bytes) : undefined))
          .then(() => post({ type: 'written' }), fail);
        break;
      case 'done':
        finished = true;
        wake?.();
        break;
      case 'failed':
        fail(receiveError(reply.error));
        break;
    }
  });
  worker.on('error', fail);
  worker.on('exit', (code) => {
    if (!finished)
      fail(new Error(`the Parquet encoder thread stopped (exit code ${code}) before the file was complete`));
  });
  post({ type: 'start', settings });
  const rethrow = (): void => {
    if (failure !== undefined) {
      void worker.terminate();
      throw failure;
    }
  };
  /** Waits (the thread referenced meanwhile) until `ready()` or a failure. */
  const until = async (ready: () => boolean): Promise<void> => {
    worker.ref();
    try {
      while (!ready() && failure === undefined) await new Promise<void>((r) => (wake = r));
    } finally {
      worker.unref();
    }
    rethrow();
  };
  return {
    async batch(ipc) {
      rethrow();
      post({ type: 'batch', ipc }, [ipc.buffer as ArrayBuffer]);
      sent++;
      await until(() => sent - taken <= 1);
    },
    async end() {
      rethrow();
      post({ type: 'end' });
      await until(() => finished);
      await writing;
      rethrow();
      await worker.terminate();
    },
  };
}
