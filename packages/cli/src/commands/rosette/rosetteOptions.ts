/**
 * The option table of `bridgework reduce-rosette` (apart from the command, so that its body
 * imports these types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import {
  keepColumnsOptionRow,
  materialOptionRows,
  summaryJsonOptionRow,
} from '../recording/recordingOptions.js';
import { forceOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework reduce-rosette`. */
export const rosetteArguments = [
  {
    name: 'recording',
    required: true,
    description:
      'The recorded leg strains: a CSV file with a header row (for example the output of `bridgework convert`), one row per sample.',
  },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework reduce-rosette`. */
export const rosetteOptions = [
  {
    name: 'legs',
    type: 'string',
    placeholder: 'a,b,c',
    description:
      "The columns of legs a, b and c, in the order of the layout's angles: header names (with or without their ' (unit)') or column numbers from 1. Required.",
  },
  {
    name: 'layout',
    type: 'choice',
    placeholder: 'layout',
    choices: ['rectangular', 'delta', 'angles'],
    default: 'rectangular',
    description:
      'rectangular: legs at 0°, 45°, 90°; delta: 0°, 60°, 120°; angles: the directions given by --angles.',
  },
  {
    name: 'angles',
    type: 'string',
    placeholder: 'deg,deg,deg',
    description:
      'With --layout angles: the directions of legs a, b and c in degrees, counterclockwise from leg a’s reference x (e.g. 0,30,90).',
  },
  {
    name: 'strain-unit',
    type: 'string',
    placeholder: 'unit',
    defaultText: "the legs' header unit, else µε",
    description: 'The unit of the leg columns and of the strains written: µε, mε, m/m or %.',
  },
  {
    name: 'transverse',
    type: 'string',
    placeholder: 'Kt',
    description:
      "Correct each leg for the gauges' transverse sensitivity Kt (one value for all legs, or three: Ka,Kb,Kc, as fractions: 0.02). Without it the legs are taken as they are.",
  },
  {
    name: 'calibration-poisson',
    type: 'number',
    placeholder: 'ν0',
    min: -0.99,
    max: 0.5,
    default: 0.285,
    description: 'Poisson ratio ν0 of the beam on which the gauge factor and Kt were measured.',
  },
  ...materialOptionRows('specimen', '', '; with ν, the stresses are written'),

  {
    name: 'stress-unit',
    type: 'string',
    placeholder: 'unit',
    default: 'MPa',
    description: 'The unit of the stresses written: Pa, kPa, MPa, GPa, psi, ….',
  },
  keepColumnsOptionRow('the legs'),

  {
    name: 'keep-legs',
    type: 'boolean',
    description: 'Also write the legs as reduced (after the transverse-sensitivity correction).',
  },
  {
    name: 'max-condition',
    type: 'number',
    placeholder: 'κ',
    min: 1,
    max: 1000,
    default: 10,
    description:
      "The largest condition number of the layout taken as well conditioned (rectangular 3.87, delta 3.16); above it the layout amplifies the legs' errors that many times: the results are written and the check fails (exit code 2).",
  },
  {
    name: 'html',
    type: 'string',
    placeholder: 'file',
    description:
      "Also write a self-contained HTML page with Mohr's circle of strain (and of stress, with E and ν) for one row: --mohr-row, else the row with the largest von Mises stress (the largest shear strain without stresses).",
  },
  {
    name: 'mohr-row',
    type: 'integer',
    placeholder: 'n',
    min: 1,
    max: Number.MAX_SAFE_INTEGER,
    defaultText: 'the row with the largest von Mises stress (or shear strain)',
    description: 'The data row (from 1, after the header) drawn by --html.',
  },
  summaryJsonOptionRow,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework reduce-rosette`. */
export type RosetteArgs = ParsedArgs<typeof rosetteOptions, typeof rosetteArguments>;
