import type { CommandContext } from '../CommandContext.js';
import { notAvailableYet } from '../notAvailable.js';
import type { UncertaintyArgs } from './uncertaintyCommand.js';

/**
 * The body of `bridgework uncertainty`.
 *
 * @remarks
 * Waiting for the channel and uncertainty packages. Wiring: `loadChannelFile`, then per channel
 * the budget's Monte Carlo (with `context.progressBar({ label, total: trials, unit: 'trials' })`),
 * printed with `formatTable` or `reportJson`, through `emitText`.
 */
export function run(_args: UncertaintyArgs, context: CommandContext): Promise<number> {
  return Promise.resolve(notAvailableYet(context, 'the channel and uncertainty packages for the simulation'));
}
