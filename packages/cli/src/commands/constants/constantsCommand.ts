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
    choices: ['c', 'json', 'sql'],
    default: 'c',
    description:
      "Output format: a C99 header, JSON, or SQL (a SELECT that turns a table of codes into values in the user's engine: the exact map of a linear-fractional channel, equal to the library bit for bit; a nonlinear channel's verified float64 polynomial with its bound).",
  },
  {
    name: 'dialect',
    type: 'choice',
    placeholder: 'engine',
    choices: ['duckdb', 'postgresql', 'spark', 'trino'],
    default: 'duckdb',
    description: 'SQL: the engine whose literal and identifier syntax to write.',
  },
  {
    name: 'table',
    type: 'string',
    placeholder: 'name',
    default: 'codes',
    description:
      'SQL: the table (or view, or schema.table) holding the codes, one column per channel named after it.',
  },
  outOption,
  forceOption,
  channelOption,
  {
    name: 'prefix',
    type: 'string',
    placeholder: 'name',
    default: 'bridgework',
    description:
      'Prefix of every emitted name: lower-case words of letters and digits joined by _, at most 24 characters (functions are <prefix>_<channel>_fixed, macros <PREFIX>_<CHANNEL>_...).',
  },
  {
    name: 'types',
    type: 'string',
    placeholder: 'list',
    defaultText: 'fixed,float32,float64',
    description:
      'The evaluators to write, comma-separated: fixed (integer arithmetic), float32, float64. A Cortex-M4F, whose FPU has no double precision, wants fixed,float32.',
  },
  {
    name: 'verification',
    type: 'choice',
    placeholder: 'mode',
    choices: ['auto', 'exhaustive', 'sampled'],
    default: 'auto',
    description:
      'How the error bounds are verified: every code of the span (exhaustive), an analytic bound checked on about 50 000 codes (sampled), or exhaustive up to 2^24 codes (auto).',
  },
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework constants`. */
export type ConstantsArgs = ParsedArgs<typeof constantsOptions, typeof constantsArguments>;

/** `bridgework constants`: firmware constants of each channel. */
export const constantsCommand = defineCommand({
  name: 'constants',
  summary: 'Firmware constants of each channel as a C header or JSON, or its map as SQL.',
  description:
    'Writes the code-to-quantity map of each channel for firmware over its span of interest: a fixed-point map (integer multiply, add and shift on the minimax line of the exact map) and float32 and float64 Chebyshev polynomials, each with its proved rounding bound and its error against the exact channel map, as a C99 header (default) or as JSON. One header holds every selected channel; identifiers are the prefix and the channel name, so several channels and several headers can live in one firmware. The header and the JSON carry the safety caution.',
  positionals: constantsArguments,
  options: constantsOptions,
  examples: [
    {
      command: 'bridgework constants hopper.yaml --prefix hopper -o hopper_constants.h',
      description: 'Write a C header for every channel.',
    },
    {
      command: 'bridgework constants hopper.yaml --types fixed,float32 -o hopper_m4f.h',
      description: 'Only the evaluators a Cortex-M4F runs fast.',
    },
    {
      command: 'bridgework constants hopper.yaml --format json',
      description: 'Print the constants as JSON.',
    },
    {
      command: 'bridgework constants rig.yaml --format sql --dialect trino --table lake.rig_codes -o rig.sql',
      description: "Each channel's map as SQL, for reprocessing an archive in the user's own engine.",
    },
  ],
  load: () => import('./runConstants.js'),
});
