/**
 * The option tables of `bridgework shunt-plan` and `bridgework shunt-apply` (apart from the
 * commands, so that their bodies import these types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, jsonOption, outOption } from '../sharedOptions.js';

/** `--arm`: the bridge arm the shunt is across. */
const armOption = {
  name: 'arm',
  type: 'integer',
  placeholder: 'n',
  default: 1,
  min: 1,
  max: 4,
  description:
    'The bridge arm the shunt is across (ring numbering of docs/conventions.md: E+ → R1 → S− → R2 → E− → R3 → S+ → R4). A shunt across arm 1 or 3 lowers the bridge output, across arm 2 or 4 raises it.',
} as const;

/** `--placement`: where the shunt is connected. */
const placementOption = {
  name: 'placement',
  type: 'choice',
  placeholder: 'where',
  choices: ['gauge', 'instrument'],
  default: 'gauge',
  description:
    "Where the shunt is connected: across the gauge itself, or across the arm's terminals at the instrument end of the cable (then it also spans the arm's leads; strain-gauge bridges only).",
} as const;

/** The positional arguments of both shunt commands. */
export const shuntArguments = [channelFileArgument] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework shunt-plan`. */
export const shuntPlanOptions = [
  channelOption,
  armOption,
  placementOption,
  {
    name: 'simulate',
    type: 'string',
    placeholder: 'quantity',
    defaultText: "80 % of the span's larger end, in the direction the arm moves the channel",
    description:
      "The quantity the shunt should simulate, in the channel's quantity with a unit ('-40 kN', '-1000 µε', '0.8 mV/V'); a plain number is in the channel's unit.",
  },
  {
    name: 'shunt-ohms',
    type: 'number',
    placeholder: 'ohms',
    unit: 'Ω',
    min: 1e-3,
    max: 1e12,
    description: 'Evaluate this resistor instead of designing one for --simulate.',
  },
  {
    name: 'series',
    type: 'choice',
    placeholder: 'series',
    choices: ['E96', 'E192'],
    default: 'E96',
    description: 'The preferred-value series (IEC 60063) to pick the resistor from.',
  },
  {
    name: 'html',
    type: 'string',
    placeholder: 'file',
    description:
      'Also write a self-contained HTML page: per channel the plan and a plot of what the channel indicates against the shunt resistor (half to twice the exact shunt), the exact and the preferred resistor marked.',
  },
  jsonOption,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework shunt-plan`. */
export type ShuntPlanArgs = ParsedArgs<typeof shuntPlanOptions, typeof shuntArguments>;

/** The option table of `bridgework shunt-apply`. */
export const shuntApplyOptions = [
  channelOption,
  {
    name: 'shunt-ohms',
    type: 'number',
    placeholder: 'ohms',
    unit: 'Ω',
    min: 1e-3,
    max: 1e12,
    description: 'The shunt resistor that was connected (its measured or marked value). Required.',
  },
  armOption,
  placementOption,
  {
    name: 'zero-code',
    type: 'number',
    placeholder: 'code',
    description: 'The converter reading without the shunt (a mean of codes may be fractional).',
  },
  {
    name: 'shunted-code',
    type: 'number',
    placeholder: 'code',
    description: 'The converter reading with the shunt connected.',
  },
  {
    name: 'readings',
    type: 'string',
    placeholder: 'file',
    description:
      'A short recording instead of --zero-code and --shunted-code: a CSV file with a header row naming the columns state and code, state being without or with (one row per reading). Means, and their Type A uncertainties, are taken per state.',
  },
  {
    name: 'shunt-tolerance',
    type: 'number',
    placeholder: 'percent',
    unit: '%',
    min: 0,
    max: 10,
    default: 0,
    description:
      "The shunt resistor's tolerance in per cent (rectangular limits, u = a/√3); it enters the span factor's uncertainty.",
  },
  {
    name: 'plausible',
    type: 'number',
    placeholder: 'percent',
    unit: '%',
    min: 0.01,
    max: 50,
    default: 5,
    description:
      'The largest span error that is taken for a gain error; a larger one means a wrong shunt, arm, placement or cable model, and nothing is written (exit code 2).',
  },
  {
    name: 'write',
    type: 'boolean',
    description:
      "Write the span correction into the channel's spanCorrection section of the channel file (comments and formatting kept; refused when the file changed since it was read). Without it, only the report is printed.",
  },
  {
    name: 'date',
    type: 'string',
    placeholder: 'date',
    defaultText: 'today (UTC; SOURCE_DATE_EPOCH when set)',
    description: 'The date recorded in the section (ISO 8601).',
  },
  {
    name: 'html',
    type: 'string',
    placeholder: 'file',
    description:
      'Also write a self-contained HTML page: the expected and measured steps, the span check, and a plot of the readings without and with the shunt against the level the model expects.',
  },
  jsonOption,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework shunt-apply`. */
export type ShuntApplyArgs = ParsedArgs<typeof shuntApplyOptions, typeof shuntArguments>;
