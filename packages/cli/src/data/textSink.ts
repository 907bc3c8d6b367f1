import type { CliStream } from '../cliIo.js';

/** Somewhere text goes, one awaited chunk at a time: an {@link AtomicFile} or standard output. */
export interface TextSink {
  /** Writes a chunk; resolves when the sink can take the next one. */
  write(text: string): Promise<void>;
}

/**
 * A {@link TextSink} over a stream such as `process.stdout`, honouring back-pressure: when the
 * stream's buffer is full (`write` returned `false`) the next chunk waits for `'drain'`.
 *
 * @param stream - The stream.
 * @returns The sink.
 * @example
 * ```ts
 * const sink = streamTextSink(process.stdout);
 * await sink.write('strain\n');
 * ```
 */
export function streamTextSink(stream: CliStream): TextSink {
  return {
    write(text) {
      const ok = stream.write(text);
      if (ok !== false || typeof stream.once !== 'function') return Promise.resolve();
      return new Promise((resolve) => {
        stream.once?.('drain', resolve);
      });
    },
  };
}
