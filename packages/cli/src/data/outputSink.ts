import type { CliStream } from '../cliIo.js';

/**
 * Somewhere output goes, one awaited chunk at a time: an {@link AtomicFile} or standard output.
 * A chunk of bytes may be reused by the caller as soon as the promise resolves, so a sink must
 * copy what it keeps.
 */
export interface OutputSink {
  /** Writes a chunk (text as UTF-8); resolves when the sink can take the next one. */
  write(chunk: string | Uint8Array): Promise<void>;
}

const utf8 = new TextDecoder('utf-8');

/**
 * An {@link OutputSink} over a stream such as `process.stdout`, honouring back-pressure: when the
 * stream's buffer is full (`write` returned `false`) the next chunk waits for `'drain'`. Bytes are
 * decoded as UTF-8 into a new string, so the caller's buffer is free as soon as `write` returns.
 *
 * @param stream - The stream.
 * @returns The sink.
 * @example
 * ```ts
 * const sink = streamSink(process.stdout);
 * await sink.write('strain\n');
 * ```
 */
export function streamSink(stream: CliStream): OutputSink {
  return {
    write(chunk) {
      const ok = stream.write(typeof chunk === 'string' ? chunk : utf8.decode(chunk));
      if (ok !== false || typeof stream.once !== 'function') return Promise.resolve();
      return new Promise((resolve) => {
        stream.once?.('drain', resolve);
      });
    },
  };
}
