import type { ChannelFactory } from '../channels/loadChannels.js';
import type { CliIo } from '../cliIo.js';
import { createProgressBar } from '../terminal/progressBar.js';
import { createTextStyle } from '../terminal/textStyle.js';
import type { CommandContext } from './CommandContext.js';

/**
 * Builds the {@link CommandContext} of one command run.
 *
 * @param command - The command word.
 * @param io - Streams and environment.
 * @param channels - How channels are validated and made (default: the channel package's own,
 *   imported only by the commands that read channel files).
 * @returns The context.
 */
export function createCommandContext(command: string, io: CliIo, channels?: ChannelFactory): CommandContext {
  return {
    command,
    io,
    ...(channels === undefined ? {} : { channels }),
    stdoutStyle: createTextStyle(io.stdout, io.env),
    stderrStyle: createTextStyle(io.stderr, io.env),
    progressBar: (options) => createProgressBar(io.stderr, options),
    warn: (message) => {
      io.stderr.write(`bridgework ${command}: ${message}\n`);
    },
  };
}
