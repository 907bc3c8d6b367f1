import { requireOption } from '@bridgework/core';
import type { CliStream } from '../cliIo.js';
import { openAtomicFile } from '../files/atomicFile.js';
import type { InterleavedConverter } from './clipCounter.js';
import type { CodeSource } from './codeSource.js';
import { convertCodeStream, type ConversionResult } from './convertCodeStream.js';
import { createCsvWriter } from './createCsvWriter.js';
import { streamSink } from './outputSink.js';

/** Progress reporting used by {@link convertToCsv} (a {@link ProgressBar} fits). */
export interface ProgressSink {
  /** Bytes of input consumed so far. */
  update(done: number): void;
  /** The work is over (success or failure). */
  finish(): void;
}

/** Options of {@link convertToCsv}. */
export interface ConvertToCsvOptions {
  /** The opened code file. */
  readonly source: CodeSource;
  /** The block converter (the channel's interleaved converter). */
  readonly converter: InterleavedConverter;
  /** Output CSV file; `undefined` writes to `stdout`. */
  readonly output: string | undefined;
  /** Where to write when `output` is `undefined`. */
  readonly stdout?: CliStream;
  /** Replace an existing output file. Default false. */
  readonly force?: boolean;
  /** Output column names (one per channel), written as the first line. */
  readonly header?: readonly string[];
  /** Significant digits per value; default shortest round trip. */
  readonly digits?: number;
  /** Progress reporting, fed with the input bytes consumed. */
  readonly progress?: ProgressSink;
}

/**
 * Converts a code file to a CSV file of engineering values, streamed and atomic.
 *
 * @remarks
 * The output file is opened first (so an existing file without `force` fails before any work)
 * and written through a temporary file that replaces the target only when the whole input has
 * been converted (see {@link openAtomicFile}). Any error (a bad row deep in a CSV file, a full
 * disk) or an interrupt leaves no file at the output path. Memory stays at about one block
 * whatever the file size. Standard output has no such guarantee: a failed run may leave partial
 * text in a pipe.
 *
 * @param options - Source, converter, output, header, digits, progress.
 * @returns Frames converted and the clipped-sample summary.
 * @throws {@link @bridgework/core!BridgeworkError} `file-exists`, `io-error`, `parse-error`, `model-not-finite`,
 * `missing-option` (neither `output` nor `stdout`).
 * @example
 * ```ts
 * const source = await openCodeSource('hook.bin', { channels: 1 });
 * const result = await convertToCsv({ source, converter, output: 'hook.csv', header: ['hook (N)'] });
 * ```
 */
export async function convertToCsv(options: ConvertToCsvOptions): Promise<ConversionResult> {
  const { source } = options;
  const writerOptions = {
    ...(options.header === undefined ? {} : { header: options.header }),
    ...(options.digits === undefined ? {} : { digits: options.digits }),
  };
  const run = (sink: Parameters<typeof createCsvWriter>[0]): Promise<ConversionResult> =>
    convertCodeStream({
      source,
      converter: options.converter,
      writer: createCsvWriter(sink, source.channels, writerOptions),
      onBlock: (block) => options.progress?.update(block.bytesRead),
    });
  try {
    if (options.output === undefined) {
      return await run(streamSink(requireOption('stdout', options.stdout, 'when no output file is given')));
    }
    const file = await openAtomicFile(options.output, { force: options.force === true });
    try {
      const result = await run(file);
      await file.commit();
      return result;
    } finally {
      await file.abort();
    }
  } finally {
    options.progress?.finish();
  }
}
