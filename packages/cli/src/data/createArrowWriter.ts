import { RecordBatchFileWriter, RecordBatchStreamWriter } from 'apache-arrow';
import { createBatchBuilder } from './arrowBatches.js';
import type { RecordingWriter } from './convertRecording.js';
import type { OutputSink } from './outputSink.js';
import type { RecordingColumns } from './recordingColumns.js';

/** The two Arrow IPC forms: the random-access file (`.arrow`) and the stream (`.arrows`, pipes). */
export type ArrowIpcForm = 'file' | 'stream';

/**
 * The byte sink the Arrow writer serializes into: it collects the chunks of one batch
 * synchronously, so the caller can write them out (and wait) before the block's memory is reused.
 * It stands in for the writer's own queue, which has the same `write`/`close`/`abort` surface.
 */
class ChunkCollector {
  chunks: Uint8Array[] = [];
  closed = false;
  write(chunk: Uint8Array): void {
    this.chunks.push(chunk);
  }
  close(): void {
    this.closed = true;
  }
  abort(): void {
    this.closed = true;
  }
  take(): Uint8Array[] {
    const c = this.chunks;
    this.chunks = [];
    return c;
  }
}

/**
 * A writer of Apache Arrow IPC: the schema of {@link recordingSchema} (time or frame column,
 * passed-through columns, one float64 column per channel with its unit; the recording's metadata
 * in the schema), one record batch per block.
 *
 * @remarks
 * Serialization is apache-arrow's own `RecordBatchFileWriter` (or `RecordBatchStreamWriter`); the
 * batches are views of the block's memory, and the bytes of each batch are written to the sink and
 * awaited before the next block is converted, so memory is one block whatever the file size.
 * Flagged samples are null (their slot holds NaN).
 *
 * @param sink - Where the bytes go.
 * @param columns - The columns and metadata.
 * @param blockFrames - Frames of the largest block.
 * @param form - `'file'` (default) or `'stream'`.
 * @returns The writer.
 * @example
 * ```ts
 * const writer = createArrowWriter(file, columns, source.blockFrames);
 * ```
 */
export function createArrowWriter(
  sink: OutputSink,
  columns: RecordingColumns,
  blockFrames: number,
  form: ArrowIpcForm = 'file',
): RecordingWriter {
  const builder = createBatchBuilder(columns, blockFrames);
  const writer = form === 'file' ? new RecordBatchFileWriter() : new RecordBatchStreamWriter();
  const collector = new ChunkCollector();
  // Replace the writer's byte queue by the collector (see ChunkCollector). The writer keeps the
  // sink it has when it starts (its `reset` leaves an identical sink in place).
  (writer as unknown as { _sink: ChunkCollector })._sink = collector;
  let started = false;
  const drain = async (): Promise<void> => {
    for (const chunk of collector.take()) await sink.write(chunk);
  };
  return {
    async writeBlock(block) {
      started = true;
      writer.write(builder.batch(block));
      await drain();
    },
    async finish() {
      if (!started) writer.reset(undefined, builder.schema);
      writer.finish();
      await drain();
    },
  };
}
