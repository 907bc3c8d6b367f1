import type { CommandContext } from '../CommandContext.js';
import { notAvailableYet } from '../notAvailable.js';
import type { ReportArgs } from './reportCommand.js';

/**
 * The body of `bridgework report`.
 *
 * @remarks
 * Waiting for the channel package. Wiring: `loadChannelFile(path, { validateChannel })` (the
 * channel schema's validator), then per channel `createChannel(spec).budget()`; the text table
 * with `formatTable`, JSON through `reportJson`, the page through `renderHtmlReport` with
 * `linePlot`/`barChart` sections; outputs through `emitText` and `writeFileAtomic`; exit
 * `exitCodes.failedCheck` when a check fails.
 */
export function run(_args: ReportArgs, context: CommandContext): Promise<number> {
  return Promise.resolve(
    notAvailableYet(context, 'the channel package (@bridgework/channel) for the budget'),
  );
}
