/**
 * The option table of `bridgework report` (apart from the command, so that its body imports these
 * types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, jsonOption, outOption } from '../sharedOptions.js';
/** The positional arguments of `bridgework report`. */
export const reportArguments = [channelFileArgument] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework report`. */
export const reportOptions = [
  jsonOption,
  {
    name: 'html',
    type: 'string',
    placeholder: 'file',
    description: 'Also write a self-contained HTML report with plots to this file.',
  },
  outOption,
  forceOption,
  channelOption,
  {
    name: 'points',
    type: 'integer',
    placeholder: 'n',
    unit: 'points per curve',
    default: 201,
    min: 11,
    max: 10_001,
    description: 'Resolution of the curves in the HTML plots.',
  },
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework report`. */
export type ReportArgs = ParsedArgs<typeof reportOptions, typeof reportArguments>;
