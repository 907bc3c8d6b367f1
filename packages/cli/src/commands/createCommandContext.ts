import type { CliIo } from '../cliIo.js';
import { createProgressBar } from '../terminal/progressBar.js';
import { createTextStyle } from '../terminal/textStyle.js';
import type { CommandContext } from './CommandContext.js';

/**
 * Builds the {@link CommandContext} of one command run.
 *
 * @param command - The command word.
 * @param io - Streams and environment.
 * @returns The context.
 */
export function createCommandContext(command: string, io: CliIo): CommandContext {
  return {
    command,
    io,
    stdoutStyle: createTextStyle(io.stdout, io.env),
    stderrStyle: createTextStyle(io.stderr, io.env),
    progressBar: (options) => createProgressBar(io.stderr, options),
    warn: (message) => {
      io.stderr.write(`bridgework ${command}: ${message}\n`);
    },
  };
}
