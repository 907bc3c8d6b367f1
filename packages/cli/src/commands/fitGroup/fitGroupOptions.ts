/**
 * The option table of `bridgework fit-group` (apart from the command, so that its body imports
 * these types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { channelFileArgument, forceOption, jsonOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework fit-group`. */
export const fitGroupArguments = [
  channelFileArgument,
  {
    name: 'schedule-file',
    required: true,
    description:
      "The loading schedule: a CSV file with a column per load component and per bridge of the group (each heading may carry its unit in brackets, such as 'Fx [kN]' or 'b1 [mV/V]'), and optionally direction (ascending or descending) and run (0, 1, …).",
  },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework fit-group`. */
export const fitGroupOptions = [
  {
    name: 'group',
    short: 'g',
    type: 'string',
    placeholder: 'name',
    defaultText: 'the only multi-component group of the file',
    description: 'The multi-component group to calibrate.',
  },
  {
    name: 'interactions',
    type: 'choice',
    placeholder: 'terms',
    // The calibration package's interactionTermChoices, written out: option tables load at start-up,
    // which imports nothing but node built-ins and @bridgework/core (a test keeps the two equal).
    choices: ['none', 'squares', 'products', 'second-order'],
    defaultText: "the group's own choice, else none",
    description:
      'The second-order terms the model may hold (AIAA R-091): none (the linear model), squares, products or second-order (both); terms the schedule cannot determine are left out and reported.',
  },
  {
    name: 'write',
    type: 'boolean',
    description:
      "Write the fitted coefficients into the group's calibration section of the channel file (terms, one row per bridge, the fit's covariance, the schedule's SHA-256, its number of points and the date; comments and formatting kept; refused when the file changed since it was read); every later command then uses them without the schedule.",
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

/** The parsed arguments of `bridgework fit-group`. */
export type FitGroupArgs = ParsedArgs<typeof fitGroupOptions, typeof fitGroupArguments>;
