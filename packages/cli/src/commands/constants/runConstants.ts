import type { CommandContext } from '../CommandContext.js';
import { notAvailableYet } from '../notAvailable.js';
import type { ConstantsArgs } from './constantsCommand.js';

/**
 * The body of `bridgework constants`.
 *
 * @remarks
 * Waiting for the channel package. Wiring: `loadChannelFile`, then per channel
 * `createChannel(spec).constants()` and the firmware emitters (C header or JSON, the JSON through
 * `reportJson` so it carries the caution); output through `emitText` (stdout or an atomic file).
 */
export function run(_args: ConstantsArgs, context: CommandContext): Promise<number> {
  return Promise.resolve(notAvailableYet(context, 'the channel and firmware packages for the constants'));
}
