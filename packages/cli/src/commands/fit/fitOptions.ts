/**
 * The option table of `bridgework fit-calibration` (apart from the command, so that its body
 * imports these types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, jsonOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework fit-calibration`. */
export const fitArguments = [
  channelFileArgument,
  {
    name: 'points-file',
    required: true,
    description:
      'The calibration points: a CSV file with a header row naming the columns load and reading, and optionally direction (up or down) and cycle (1, 2, …).',
  },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework fit-calibration`. */
export const fitOptions = [
  channelOption,
  {
    name: 'degree',
    type: 'integer',
    placeholder: 'n',
    default: 1,
    min: 1,
    max: 3,
    description: 'Degree of the polynomial fitted to reading against load (1 to 3).',
  },
  {
    name: 'reading',
    type: 'choice',
    placeholder: 'unit',
    choices: ['codes', 'mV/V', 'V/V'],
    default: 'codes',
    description:
      "What the reading column holds: converter codes of this channel (turned into bridge ratios by the channel's converter model, with its span correction), or the bridge ratio in mV/V or V/V from a reference instrument.",
  },
  {
    name: 'load-unit',
    type: 'string',
    placeholder: 'unit',
    defaultText: "the channel's unit",
    description: "The unit of the load column (a unit of the channel's quantity: 'kN', 't', 'µε').",
  },
  {
    name: 'write',
    type: 'boolean',
    description:
      "Write the fit into the channel's calibration section of the channel file (comments and formatting kept; refused when the file changed since it was read); the channel then converts through it.",
  },
  {
    name: 'date',
    type: 'string',
    placeholder: 'date',
    defaultText: 'today (UTC; SOURCE_DATE_EPOCH when set)',
    description: 'The date recorded in the section (ISO 8601).',
  },
  jsonOption,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework fit-calibration`. */
export type FitArgs = ParsedArgs<typeof fitOptions, typeof fitArguments>;
