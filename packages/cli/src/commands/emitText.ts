import { streamSink } from '../data/outputSink.js';
import { writeFileAtomic } from '../files/atomicFile.js';
import type { CommandContext } from './CommandContext.js';

/** Options of {@link emitText}. */
export interface EmitTextOptions {
  /** The output file from `--out`; `undefined` or `'-'` means standard output. */
  readonly out: string | undefined;
  /** `--force`: replace an existing file. */
  readonly force: boolean;
}

/**
 * Writes a command's text result to standard output or, atomically, to the `--out` file
 * (never replacing an existing file without `--force`).
 *
 * @param context - The command context.
 * @param text - The result.
 * @param options - `out` and `force`.
 * @returns When the text is written.
 * @throws {@link @bridgework/core!BridgeworkError} `file-exists`, `io-error`.
 */
export async function emitText(
  context: CommandContext,
  text: string,
  options: EmitTextOptions,
): Promise<void> {
  if (options.out === undefined || options.out === '-') {
    await streamSink(context.io.stdout).write(text);
    return;
  }
  await writeFileAtomic(options.out, text, { force: options.force });
}
