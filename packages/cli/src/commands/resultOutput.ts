import { streamSink } from '../data/outputSink.js';
import { openAtomicFile, type AtomicFile } from '../files/atomicFile.js';
import { plainTextStyle, type TextStyle } from '../terminal/textStyle.js';
import { stopIfOrphaned } from '../internal/pendingTempFiles.js';
import type { CommandContext } from './CommandContext.js';

/** Where a command's result goes: standard output, or an output file written atomically. */
export interface ResultOutput {
  /** The output file, or `undefined` for standard output. */
  readonly path: string | undefined;
  /** Colours for the result: the terminal's for standard output, none for a file. */
  readonly style: TextStyle;
  /** Writes the result: to standard output at once, or to the file's temporary copy. */
  write(text: string): Promise<void>;
  /**
   * Moves the file into place and says so on standard error (`wrote <what> to <path>`); nothing
   * for standard output.
   */
  commit(what: string): Promise<void>;
  /** Removes the temporary copy unless committed; safe to call twice. */
  abort(): Promise<void>;
}

/**
 * Opens the result output of a command: standard output when `out` is `undefined` or `'-'`, else
 * the file, opened now (so an existing file without `--force` stops the command before its work)
 * and committed by {@link ResultOutput.commit}.
 *
 * @param context - The command context.
 * @param out - The `--out` option.
 * @param force - The `--force` option.
 * @returns The output.
 * @throws {@link @bridgework/core!BridgeworkError} `file-exists`, `io-error`.
 */
export async function openResultOutput(
  context: CommandContext,
  out: string | undefined,
  force: boolean,
): Promise<ResultOutput> {
  if (out === undefined || out === '-') {
    const sink = streamSink(context.io.stdout);
    return {
      path: undefined,
      style: context.stdoutStyle,
      write: (text) => {
        stopIfOrphaned();
        return sink.write(text);
      },
      commit: () => Promise.resolve(),
      abort: () => Promise.resolve(),
    };
  }
  const file: AtomicFile = await openAtomicFile(out, { force });
  return {
    path: out,
    style: plainTextStyle,
    write: (text) => file.write(text),
    async commit(what) {
      await file.commit();
      context.io.stderr.write(`wrote ${what} to ${out}\n`);
    },
    abort: () => file.abort(),
  };
}
