import {
  defineCommand,
  type OptionSpec,
  type ParsedArgs,
  type PositionalSpec,
} from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework constants`. */
export const constantsArguments = [channelFileArgument] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework constants`. */
export const constantsOptions = [
  {
    name: 'format',
    type: 'choice',
    placeholder: 'format',
    choices: ['c', 'json'],
    default: 'c',
    description: 'Output format.',
  },
  outOption,
  forceOption,
  channelOption,
  {
    name: 'prefix',
    type: 'string',
    placeholder: 'name',
    defaultText: 'the channel name in upper case',
    description: 'Prefix of the C identifiers: letters, digits and underscores.',
  },
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework constants`. */
export type ConstantsArgs = ParsedArgs<typeof constantsOptions, typeof constantsArguments>;

/** `bridgework constants`: firmware constants of each channel. */
export const constantsCommand = defineCommand({
  name: 'constants',
  summary: 'Firmware constants of each channel as a C header or JSON.',
  description:
    'Writes the code-to-quantity map of each channel for firmware: float and fixed-point constants with their proved error bounds, as a C99 header (default) or as JSON. Identifiers are prefixed with the channel name so several channels can share one header.',
  positionals: constantsArguments,
  options: constantsOptions,
  examples: [
    { command: 'bridgework constants hopper.yaml -o hopper_channels.h', description: 'Write a C header.' },
    {
      command: 'bridgework constants hopper.yaml --format json',
      description: 'Print the constants as JSON.',
    },
  ],
  load: () => import('./runConstants.js'),
});
