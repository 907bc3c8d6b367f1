/** Test helpers: in-memory streams and a CliIo built from them. */
import type { CliIo, CliStream } from '../../src/cliIo.js';

/** A stream that collects what is written. */
export interface MemoryStream extends CliStream {
  readonly text: () => string;
  readonly chunks: string[];
}

export function memoryStream(options: { isTTY?: boolean; columns?: number } = {}): MemoryStream {
  const chunks: string[] = [];
  return {
    chunks,
    isTTY: options.isTTY ?? false,
    ...(options.columns === undefined ? {} : { columns: options.columns }),
    write(text: string) {
      chunks.push(text);
      return true;
    },
    text: () => chunks.join(''),
  };
}

export interface MemoryIo extends CliIo {
  readonly stdout: MemoryStream;
  readonly stderr: MemoryStream;
}

export function memoryIo(
  options: { stdoutTTY?: boolean; stderrTTY?: boolean; env?: Record<string, string | undefined> } = {},
): MemoryIo {
  return {
    stdout: memoryStream({ isTTY: options.stdoutTTY ?? false }),
    stderr: memoryStream({ isTTY: options.stderrTTY ?? false }),
    env: options.env ?? {},
  };
}
