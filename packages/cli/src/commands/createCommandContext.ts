import type { ChannelFactory } from '../channels/loadChannels.js';
import type { CliIo } from '../cliIo.js';
import { createProgressBar } from '../terminal/progressBar.js';
import { createTextStyle } from '../terminal/textStyle.js';
import type { CommandContext, CommandHelp } from './CommandContext.js';

/**
 * Builds the {@link CommandContext} of one command run.
 *
 * @param command - The command word.
 * @param io - Streams and environment.
 * @param help - The program's help texts (for `help`).
 * @param channels - How channels are validated and made (default: the channel package's own,
 *   imported only by the commands that read channel files).
 * @returns The context.
 */
export function createCommandContext(
  command: string,
  io: CliIo,
  help: CommandHelp,
  channels?: ChannelFactory,
): CommandContext {
  return {
    command,
    io,
    help,
    ...(channels === undefined ? {} : { channels }),
    stdoutStyle: createTextStyle(io.stdout, io.env),
    stderrStyle: createTextStyle(io.stderr, io.env),
    progressBar: (options) => createProgressBar(io.stderr, options),
    warn: (message) => {
      io.stderr.write(`bridgework ${command}: ${message}\n`);
    },
  };
}
