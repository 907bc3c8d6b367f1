import { BridgeworkError } from '@bridgework/core';
import { formatCommandHelp, formatProgramHelp } from '../../args/formatHelp.js';
import { exitCodes } from '../../exitCodes.js';
import { closestName } from '@bridgework/core';
import type { CommandContext } from '../CommandContext.js';
import { commands } from '../registry.js';
import type { HelpArgs } from './helpCommand.js';

/** The body of `bridgework help [command]`. */
export function run(args: HelpArgs, context: CommandContext): Promise<number> {
  const name = args.positionals.command;
  if (name === undefined) {
    context.io.stdout.write(formatProgramHelp(commands));
    return Promise.resolve(exitCodes.ok);
  }
  const spec = commands.find((c) => c.name === name);
  if (spec === undefined) {
    const near = closestName(
      name,
      commands.map((c) => c.name),
    );
    throw new BridgeworkError(
      'invalid-option',
      `unknown command '${name}'${near === undefined ? '' : `; did you mean '${near}'?`}`,
      { param: '<command>', value: name },
    );
  }
  context.io.stdout.write(formatCommandHelp(spec));
  return Promise.resolve(exitCodes.ok);
}
