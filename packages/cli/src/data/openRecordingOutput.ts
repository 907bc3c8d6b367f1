import { BridgeworkError } from '@bridgework/core';
import type { CliStream } from '../cliIo.js';
import { openAtomicFile } from '../files/atomicFile.js';
import { createCsvWriter } from './createCsvWriter.js';
import { createRawWriter } from './createRawWriter.js';
import type { RecordingWriter } from './convertRecording.js';
import type { OutputFormat, ParquetCompression, RawOutputFormat } from './outputFormats.js';
import { streamSink, type OutputSink } from './outputSink.js';
import type { RecordingColumns } from './recordingColumns.js';

/** Options of {@link writeRecording}. */
export interface WriteRecordingOptions {
  /** The output format. */
  readonly format: OutputFormat;
  /** The output file; `undefined` writes to `stdout`. */
  readonly output: string | undefined;
  /** Where to write when `output` is `undefined`. */
  readonly stdout: CliStream;
  /** Replace an existing output file. Default false. */
  readonly force?: boolean;
  /** The columns and metadata. */
  readonly columns: RecordingColumns;
  /** Frames of the largest block. */
  readonly blockFrames: number;
  /** CSV: significant digits (default shortest round trip). */
  readonly digits?: number;
  /** Parquet: compression (default snappy). */
  readonly parquetCompression?: ParquetCompression;
  /** Parquet: encode in a worker thread (default false; the same bytes either way). */
  readonly parquetEncoderThread?: boolean;
}

/**
 * Opens the output of a conversion, makes the writer of its format, runs `work` with it, and puts
 * the file in place only when `work` succeeds.
 *
 * @remarks
 * A file output is opened first (so an existing file without `force` fails before any work) and
 * written through a temporary file that replaces the target only when the whole recording has been
 * converted (see {@link openAtomicFile}): any error or an interrupt leaves no file at the output
 * path. Standard output has no such guarantee (a failed run may leave partial output in a pipe),
 * and binary formats are refused on a terminal.
 *
 * @param options - Format, output, columns, block size and format options.
 * @param work - Converts the recording into the writer.
 * @returns What `work` returns.
 * @throws {@link @bridgework/core!BridgeworkError} `file-exists`, `io-error`, `invalid-option` (a
 * binary format on a terminal), and whatever `work` throws.
 */
export async function writeRecording<T>(
  options: WriteRecordingOptions,
  work: (writer: RecordingWriter) => Promise<T>,
): Promise<T> {
  const { format, columns, blockFrames } = options;
  const writerFor = async (sink: OutputSink): Promise<RecordingWriter> => {
    switch (format) {
      case 'csv':
        return createCsvWriter(sink, columns, options.digits === undefined ? {} : { digits: options.digits });
      case 'arrow':
      case 'arrows':
        // apache-arrow and parquet-wasm load only for the formats that need them.
        return (await import('./createArrowWriter.js')).createArrowWriter(
          sink,
          columns,
          blockFrames,
          format === 'arrow' ? 'file' : 'stream',
        );
      case 'parquet':
        return (await import('./createParquetWriter.js')).createParquetWriter(sink, columns, blockFrames, {
          ...(options.parquetCompression === undefined ? {} : { compression: options.parquetCompression }),
          encoderThread: options.parquetEncoderThread === true,
        });
      default:
        return createRawWriter(sink, format as RawOutputFormat, columns.channels.length, blockFrames);
    }
  };
  if (options.output === undefined) {
    if (format !== 'csv' && options.stdout.isTTY === true) {
      throw new BridgeworkError(
        'invalid-option',
        `${format} is a binary format and standard output is a terminal; write it to a file with -o, or pipe it`,
        { param: '--to', value: format },
      );
    }
    return work(await writerFor(streamSink(options.stdout, { binary: format !== 'csv' })));
  }
  const file = await openAtomicFile(options.output, { force: options.force === true });
  try {
    const result = await work(await writerFor(file));
    await file.commit();
    return result;
  } finally {
    await file.abort();
  }
}
