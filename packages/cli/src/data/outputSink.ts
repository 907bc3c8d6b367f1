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

/**
 * Writes queued in order, one at a time, while the caller goes on working (see
 * {@link createWriteQueue}).
 */
export interface WriteQueue {
  /**
   * Queues a chunk behind the writes already queued.
   *
   * @param chunk - Bytes (not to be changed until the promise resolves) or text.
   * @returns Resolves when the chunk is written, so its memory may be reused; rejects if this or
   *   an earlier write failed.
   */
  write(chunk: string | Uint8Array): Promise<void>;
  /** Resolves when every queued chunk is written; rejects with the first failure. */
  flush(): Promise<void>;
}

/**
 * A queue of writes to a sink, so that a writer can fill its next buffer while the last one is
 * being written (double buffering).
 *
 * @remarks
 * Chunks reach the sink in the order queued, each after the previous one's write has resolved (an
 * {@link OutputSink} takes one write at a time). After a failure no later chunk is written and
 * every later promise rejects with that failure. A promise the caller has not awaited yet never
 * counts as an unhandled rejection: the caller meets the failure at its next `write` it awaits, or
 * at `flush`.
 *
 * @param sink - Where the chunks go.
 * @returns The queue.
 * @example
 * ```ts
 * const queue = createWriteQueue(file);
 * const written = queue.write(bufferA); // fill bufferB meanwhile
 * await written; // bufferA is free again
 * await queue.flush();
 * ```
 */
export function createWriteQueue(sink: OutputSink): WriteQueue {
  let tail: Promise<void> = Promise.resolve();
  let failed = false;
  let failure: unknown;
  return {
    write(chunk) {
      const written = tail.then(() => {
        if (failed) throw failure;
        return sink.write(chunk);
      });
      tail = written.catch((e: unknown) => {
        if (!failed) {
          failed = true;
          failure = e;
        }
      });
      return written;
    },
    async flush() {
      await tail;
      if (failed) throw failure;
    },
  };
}
