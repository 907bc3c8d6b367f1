import { BridgeworkError } from '@bridgework/core';
import { exitCodes } from '../../exitCodes.js';
import { closestName } from '@bridgework/core';
import type { CommandContext } from '../CommandContext.js';
import type { HelpArgs } from './helpOptions.js';

/** The body of `bridgework help [command]`. */
export function run(args: HelpArgs, context: CommandContext): Promise<number> {
  const { help } = context;
  const name = args.positionals.command;
  if (name === undefined) {
    context.io.stdout.write(help.program());
    return Promise.resolve(exitCodes.ok);
  }
  const text = help.command(name);
  if (text === undefined) {
    const near = closestName(name, help.names);
    throw new BridgeworkError(
      'invalid-option',
      `unknown command '${name}'${near === undefined ? '' : `; did you mean '${near}'?`}`,
      { param: '<command>', value: name },
    );
  }
  context.io.stdout.write(text);
  return Promise.resolve(exitCodes.ok);
}
