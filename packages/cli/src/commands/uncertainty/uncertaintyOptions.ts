/**
 * The option table of `bridgework uncertainty` (apart from the command, so that its body imports these
 * types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, jsonOption, outOption } from '../sharedOptions.js';
/** The positional arguments of `bridgework uncertainty`. */
export const uncertaintyArguments = [channelFileArgument] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework uncertainty`. */
export const uncertaintyOptions = [
  {
    name: 'trials',
    type: 'integer',
    placeholder: 'n',
    unit: 'trials',
    default: 1_000_000,
    min: 1_000,
    max: 50_000_000,
    description:
      'Monte Carlo trials per channel. The default is the 10⁶ that JCGM 101 (7.2.2) suggests for a 95 % interval correct to one or two significant digits. A run holds about 10 bytes per trial (10 MB for 10⁶). Measured here (built packages, Node 20, shared 2-core machine): 10⁶ trials of a demo channel take 0.13–0.49 s of processor time, 0.6–2.1 s of wall time under heavy load.',
  },
  {
    name: 'seed',
    type: 'integer',
    placeholder: 'n',
    default: 1,
    min: 0,
    max: Number.MAX_SAFE_INTEGER,
    description:
      'Seed of the random streams: the same seed and trials give the same result on every machine.',
  },
  {
    name: 'coverage',
    type: 'number',
    placeholder: 'p',
    unit: 'probability',
    defaultText: "each channel's tolerances.coverageProbability (0.95 unless stated)",
    min: 0.5,
    max: 0.9999,
    description:
      "Coverage probability of the intervals, for the Monte Carlo and the GUM alike (the budget's coverageProbability).",
  },
  channelOption,
  jsonOption,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework uncertainty`. */
export type UncertaintyArgs = ParsedArgs<typeof uncertaintyOptions, typeof uncertaintyArguments>;
