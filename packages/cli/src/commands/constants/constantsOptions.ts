/**
 * The option table of `bridgework constants` (apart from the command, so that its body imports these
 * types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
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
      "Output format: a C99 header, JSON, or SQL (a SELECT that turns a table of codes into values in the user's engine: the exact map of a linear-fractional channel, equal to the library bit for bit; a nonlinear channel's verified float64 piecewise polynomial with its bound, --target-error setting it).",
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
    name: 'target-error',
    type: 'string',
    placeholder: 'value',
    defaultText: 'max(u_c/10, one output step) per channel',
    description:
      "The total error each function must meet against the channel's exact map, in the channel's output unit: one number for every channel, or name=value entries (deck-temp=0.01,gusset-g2=0.5). The cheapest form meeting it is chosen; if none does, the command fails naming the best bound reached and writes nothing. With --format sql it is the bound of a nonlinear channel's binary64 polynomial (a linear-fractional channel is written as its exact map).",
  },
  {
    name: 'output-step',
    type: 'string',
    placeholder: 'value',
    defaultText: 'output.firmwareResolution, else a power of ten from the target and the span',
    description:
      "The fixed-point function's output step in the channel's output unit (its output counts these steps): one number, or name=value entries.",
  },
  {
    name: 'test-program',
    type: 'string',
    placeholder: 'file',
    description:
      "Also write a small C99 program that checks the header's test vectors on the target (exact results and the stated total errors); it includes the header by the name of --out (or <prefix>_constants.h).",
  },
  {
    name: 'hardware-divide',
    type: 'boolean',
    description:
      'The target divides in hardware (a Cortex-M4F, for example): the linear-fractional (Moebius) form becomes a candidate for the float functions.',
  },
  {
    name: 'accumulator-bits',
    type: 'choice',
    placeholder: 'bits',
    choices: ['64', '32'],
    default: '64',
    description:
      'Accumulator of the affine fixed-point form: 64 (a 32 x 32 -> 64-bit multiply, native on Cortex-M3/M4/M7) or 32 (32-bit operations only, for cores without that multiply such as a Cortex-M0+). Piecewise fixed-point forms always use 32-bit arithmetic.',
  },
  {
    name: 'coefficient-bits',
    type: 'integer',
    placeholder: 'bits',
    default: 32,
    min: 8,
    max: 32,
    description: 'Width of the fixed-point coefficient words.',
  },
  {
    name: 'max-table-bytes',
    type: 'integer',
    placeholder: 'bytes',
    default: 4096,
    min: 16,
    max: 16777216,
    description:
      "The largest constant table one function may use (with --format sql, a nonlinear channel's polynomial coefficients).",
  },
  {
    name: 'verification',
    type: 'choice',
    placeholder: 'mode',
    choices: ['auto', 'exhaustive', 'sampled'],
    default: 'auto',
    description:
      "How each function's total error is established: every code of the span evaluated and compared with the exact map (exhaustive: proved), about 50 000 codes plus the analytic arithmetic bound (sampled: measured), or exhaustive up to 2^24 codes (auto).",
  },
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework constants`. */
export type ConstantsArgs = ParsedArgs<typeof constantsOptions, typeof constantsArguments>;
