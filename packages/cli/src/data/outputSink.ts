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
 * decoded as UTF-8 into a new string (or, with `binary`, copied into a new buffer, for streams
 * that take bytes such as `process.stdout`), so the caller's buffer is free as soon as `write`
 * returns.
 *
 * @param stream - The stream.
 * @param options - `binary`: pass bytes through unchanged (a binary format on a pipe).
 * @returns The sink.
 * @example
 * ```ts
 * const sink = streamSink(process.stdout);
 * await sink.write('strain\n');
 * ```
 */
export function streamSink(stream: CliStream, options: { readonly binary?: boolean } = {}): OutputSink {
  const binary = options.binary === true;
  return {
    write(chunk) {
      const data = typeof chunk === 'string' ? chunk : binary ? Buffer.from(chunk) : utf8.decode(chunk);
      const ok = (stream.write as (data: string | Uint8Array) => unknown)(data);
      if (ok !== false || typeof stream.once !== 'function') return Promise.resolve();
      return new Promise((resolve) => {
        stream.once?.('drain', resolve);
      });
    },
  };
}
