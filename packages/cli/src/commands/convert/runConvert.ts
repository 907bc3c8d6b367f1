import type { CommandContext } from '../CommandContext.js';
import { notAvailableYet } from '../notAvailable.js';
import type { ConvertArgs } from './convertCommand.js';

/**
 * The body of `bridgework convert`.
 *
 * @remarks
 * Waiting for the channel package. Wiring: `loadChannelFile`, select the channels named by
 * `--channels`, build the channels' interleaved converter, then hand everything else to
 * {@link runConversion}, which already does the streaming, the atomic output, the progress bar,
 * the clipped-sample summary and the exit code.
 */
export function run(_args: ConvertArgs, context: CommandContext): Promise<number> {
  return Promise.resolve(
    notAvailableYet(context, 'the channel package (@bridgework/channel) for the code maps'),
  );
}
