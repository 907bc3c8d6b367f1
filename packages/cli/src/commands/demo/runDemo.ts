import type { CommandContext } from '../CommandContext.js';
import { notAvailableYet } from '../notAvailable.js';
import type { DemoArgs } from './demoCommand.js';

/**
 * The body of `bridgework demo`.
 *
 * @remarks
 * Waiting for the report engine. Wiring: the report body on the example channel file, its HTML
 * and C header written with `writeFileAtomic` into `--dir` or a new `mkdtemp` folder, and the
 * paths printed.
 */
export function run(_args: DemoArgs, context: CommandContext): Promise<number> {
  return Promise.resolve(notAvailableYet(context, 'the design report (waiting for @bridgework/channel)'));
}
