/**
 * The option table of `bridgework fit-thermistor` (apart from the command, so that its body
 * imports these types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, jsonOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework fit-thermistor`. */
export const thermistorArguments = [
  channelFileArgument,
  {
    name: 'points-file',
    required: true,
    description:
      'The calibration points: a CSV file with a header row naming the columns temperature and resistance (one row per point).',
  },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework fit-thermistor`. */
export const thermistorOptions = [
  channelOption,
  {
    name: 'model',
    type: 'choice',
    placeholder: 'model',
    choices: ['steinhart-hart', 'beta'],
    default: 'steinhart-hart',
    description:
      'steinhart-hart: 1/T = a + b·ln R + c·(ln R)³ (three or more points); beta: R = R0·exp(B·(1/T − 1/T0)) (two or more).',
  },
  {
    name: 'reference-celsius',
    type: 'number',
    placeholder: 'celsius',
    unit: '°C',
    min: -273,
    max: 1000,
    defaultText: "the channel's sensor.referenceCelsius",
    description: 'Beta model: the reference temperature t0 at which R0 is given.',
  },
  {
    name: 'temperature-unit',
    type: 'string',
    placeholder: 'unit',
    default: '°C',
    description: 'The unit of the temperature column: °C, K or °F.',
  },
  {
    name: 'resistance-unit',
    type: 'string',
    placeholder: 'unit',
    default: 'Ω',
    description: 'The unit of the resistance column: Ω, kΩ, MΩ.',
  },
  {
    name: 'max-residual',
    type: 'number',
    placeholder: 'kelvin',
    unit: 'K',
    min: 0,
    max: 100,
    default: 0.1,
    description:
      'The largest residual accepted (the model’s temperature at a point’s resistance minus the point’s temperature); above it the check fails (exit code 2) and nothing is written.',
  },
  {
    name: 'write',
    type: 'boolean',
    description:
      "Write the fitted model into the channel's sensor section (betaKelvin, referenceOhms and referenceCelsius, or steinhartHart; the other model's keys are removed), keeping the file's comments and formatting; refused when the file changed since it was read.",
  },
  {
    name: 'html',
    type: 'string',
    placeholder: 'file',
    description: 'Also write a self-contained HTML page with the plot of the residuals against temperature.',
  },
  jsonOption,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework fit-thermistor`. */
export type ThermistorArgs = ParsedArgs<typeof thermistorOptions, typeof thermistorArguments>;
