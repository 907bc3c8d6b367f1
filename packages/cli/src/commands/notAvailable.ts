import { exitCodes } from '../exitCodes.js';
import type { CommandContext } from './CommandContext.js';

/**
 * Ends a command whose engine is not built yet: one message on standard error, exit code 1.
 * Nothing is written and no number is printed.
 *
 * @param context - The command's context.
 * @param needs - What the command is waiting for (`'the channel package (@bridgework/channel)'`).
 * @returns {@link exitCodes}.badInput.
 */
export function notAvailableYet(context: CommandContext, needs: string): number {
  context.io.stderr.write(
    `bridgework ${context.command}: not available yet: this command needs ${needs}, which is not part of this build\n`,
  );
  return exitCodes.badInput;
}
