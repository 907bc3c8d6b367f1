/**
 * The option table of `bridgework check-certificate` (apart from the command, so that its body
 * imports these types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import { channelFileArgument, channelOption, forceOption, jsonOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework check-certificate`. */
export const certificateArguments = [
  channelFileArgument,
  {
    name: 'certificate-file',
    required: true,
    description:
      'The test certificate: a CSV file with a header row naming the columns load and reading, and optionally test (load, creep or return), temperature (°C), direction (up or down), cycle (1, 2, …) and minutes (creep). See docs/test-day.md.',
  },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework check-certificate`. */
export const certificateOptions = [
  channelOption,
  {
    name: 'class',
    type: 'choice',
    placeholder: 'class',
    choices: ['A', 'B', 'C', 'D'],
    description: 'The OIML R 60 accuracy class to check against. Required.',
  },
  {
    name: 'intervals',
    type: 'integer',
    placeholder: 'n',
    min: 1,
    max: 10_000_000,
    description:
      'nLC: the number of load cell verification intervals over the measuring range (the class designation C3 means class C with 3000). Required.',
  },
  {
    name: 'apportionment',
    type: 'number',
    placeholder: 'pLC',
    min: 0.01,
    max: 1,
    default: 0.7,
    description:
      "pLC: the apportionment factor, the share of the instrument's error allowed to the load cell (OIML R 60; 0.7 when none is declared).",
  },
  {
    name: 'capacity',
    type: 'string',
    placeholder: 'quantity',
    defaultText: "the channel's sensor.capacity",
    description: "Emax: the load cell's maximum capacity, with a unit ('50 kN', '5 t').",
  },
  {
    name: 'min-load',
    type: 'string',
    placeholder: 'quantity',
    defaultText: 'the smallest load in the file',
    description: 'Dmin: the smallest load of the measuring range, with a unit.',
  },
  {
    name: 'max-load',
    type: 'string',
    placeholder: 'quantity',
    defaultText: 'the largest load in the file',
    description: 'Dmax: the largest load of the measuring range, with a unit (at most Emax).',
  },
  {
    name: 'capacity-per-vmin',
    type: 'number',
    placeholder: 'Y',
    min: 1,
    max: 1e9,
    description:
      'Y = Emax/vmin, when declared: gives the minimum verification interval vmin and with it the check of the zero (minimum dead load output) against temperature.',
  },
  {
    name: 'reading',
    type: 'choice',
    placeholder: 'unit',
    choices: ['mV/V', 'V/V', 'load'],
    default: 'mV/V',
    description:
      "What the reading column holds: the bridge output in mV/V or V/V (turned into load through the line of the reference temperature's loading readings), or an indication already in load (--load-unit).",
  },
  {
    name: 'load-unit',
    type: 'string',
    placeholder: 'unit',
    defaultText: "the channel's unit",
    description: "The unit of the load column (and of readings given as load): 'kN', 't', 'kg'.",
  },
  {
    name: 'reference-celsius',
    type: 'number',
    placeholder: 'celsius',
    unit: '°C',
    min: -100,
    max: 200,
    default: 20,
    description:
      'The reference temperature: its first loading run sets the line from reading to load, and the sensor characteristics written with --write.',
  },
  {
    name: 'write',
    type: 'boolean',
    description:
      "Write the certificate's characteristics (rated output, zero balance, the certificate's temperature, and with runs at two or more temperatures the zero and span temperature coefficients) into the channel's sensor section (comments and formatting kept; refused when the file changed since it was read). Only for a transducer channel and readings in mV/V or V/V.",
  },
  {
    name: 'html',
    type: 'string',
    placeholder: 'file',
    description:
      'Also write a self-contained HTML page with the plot of error against load at each temperature inside the ±mpe envelope.',
  },
  jsonOption,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework check-certificate`. */
export type CertificateArgs = ParsedArgs<typeof certificateOptions, typeof certificateArguments>;
