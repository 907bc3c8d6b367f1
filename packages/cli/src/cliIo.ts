/**
 * A text stream the command writes to: `process.stdout` and `process.stderr` satisfy it, and so
 * does a test's in-memory collector.
 */
export interface CliStream {
  /**
   * Writes text. A Node stream returns `false` when its buffer is full; writers that stream large
   * outputs then wait for `'drain'` (see {@link CliStream.once}).
   */
  write(text: string): unknown;
  /** True when the stream is an interactive terminal (colours and progress bars only then). */
  readonly isTTY?: boolean;
  /** Width of the terminal in columns, when known. */
  readonly columns?: number;
  /** Registers a one-shot listener (Node streams); used to wait for `'drain'`. */
  once?(event: 'drain', listener: () => void): unknown;
}

/**
 * Everything the command touches outside its arguments and files: its two output streams and the
 * environment. Passing fakes lets tests run the command in-process. File paths are taken as
 * given (relative to the process's working folder) and shown as given in messages.
 */
export interface CliIo {
  /** Results: reports, JSON, converted data when no output file is given. */
  readonly stdout: CliStream;
  /** Messages: errors, warnings, progress bars, summaries. */
  readonly stderr: CliStream;
  /** Environment variables (`NO_COLOR`, `TERM`, `BRIDGEWORK_DEBUG`...). */
  readonly env: Readonly<Record<string, string | undefined>>;
}

/**
 * The real process: `process.stdout`, `process.stderr` and `process.env`.
 *
 * @returns The process's {@link CliIo}.
 * @example
 * ```ts
 * process.exitCode = await runCli(process.argv.slice(2), nodeIo());
 * ```
 */
export function nodeIo(): CliIo {
  return { stdout: process.stdout, stderr: process.stderr, env: process.env };
}
