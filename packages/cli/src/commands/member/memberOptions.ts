/**
 * The option table of `bridgework reduce-member` (apart from the command, so that its body
 * imports these types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
import {
  keepColumnsOptionRow,
  materialOptionRows,
  summaryJsonOptionRow,
} from '../recording/recordingOptions.js';
import { forceOption, outOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework reduce-member`. */
export const memberArguments = [
  {
    name: 'recording',
    required: true,
    description:
      'The recorded gauge strains of one cross-section: a CSV file with a header row (for example the output of `bridgework convert`), one row per sample.',
  },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework reduce-member`. */
export const memberOptions = [
  {
    name: 'gauges',
    type: 'string',
    placeholder: 'list',
    description:
      "The gauges, comma-separated, each COLUMN@WHERE or COLUMN@WHERE@ANGLE. COLUMN is a header name (with or without its ' (unit)') or a column number from 1. WHERE is +y, -y, +z or -z (the surface on that axis: a face centre of a rectangle, a point of a circle), an angle around a circular section from +y toward +z (90°), or the coordinates Y:Z from the centroid with their unit (12mm:-30mm). ANGLE is the grid direction in degrees from the member axis toward the circumferential direction (default 0; ±45 for torsion, 90 across the axis). Required.",
  },
  {
    name: 'diameter',
    type: 'string',
    placeholder: 'length',
    description: "Outside diameter of a round bar or tube, with its unit ('88.9 mm').",
  },
  {
    name: 'bore',
    type: 'string',
    placeholder: 'length',
    defaultText: '0 (a solid bar)',
    description: "Bore of a tube, with its unit ('76.3 mm'); with --diameter.",
  },
  {
    name: 'width',
    type: 'string',
    placeholder: 'length',
    description: "Width b of a rectangular section along y, with its unit ('80 mm'); with --depth.",
  },
  {
    name: 'depth',
    type: 'string',
    placeholder: 'length',
    description: "Depth h of a rectangular section along z, with its unit ('120 mm'); with --width.",
  },
  {
    name: 'wall',
    type: 'string',
    placeholder: 'length',
    defaultText: 'a solid rectangle',
    description:
      "Wall thickness of a rectangular hollow section, with its unit ('6 mm'); with --width and --depth.",
  },
  {
    name: 'torsion-modulus',
    type: 'string',
    placeholder: 'volume',
    defaultText: "for a circle its J/r; for a hollow rectangle Bredt's 2·Am·t",
    description:
      "Torsion modulus Wt of the section with its unit ('95 cm³'): the shear stress at the angled gauges is T/Wt. Needed for torsion on a solid rectangle.",
  },
  {
    name: 'resultants',
    type: 'string',
    placeholder: 'list',
    defaultText: 'axial,bending-y,bending-z (and torsion with an angled gauge)',
    description:
      'The section resultants to solve for, comma-separated: axial, bending-y (the moment about y: stress varies with z), bending-z, torsion.',
  },
  ...materialOptionRows('member', ' (for gauges across or at an angle to the axis, and G)'),

  {
    name: 'strain-unit',
    type: 'string',
    placeholder: 'unit',
    defaultText: "the first gauge's header unit, else µε",
    description: 'The unit of the gauge columns and of the residuals written: µε, mε, m/m or %.',
  },
  {
    name: 'force-unit',
    type: 'string',
    placeholder: 'unit',
    default: 'kN',
    description: 'The unit of the axial force written: N, kN, MN, lbf, kip, ….',
  },
  {
    name: 'moment-unit',
    type: 'string',
    placeholder: 'unit',
    default: 'kN·m',
    description: 'The unit of the moments and the torque written: N·m, kN·m, N·mm, lbf·ft, ….',
  },
  keepColumnsOptionRow('the gauges'),

  {
    name: 'max-condition',
    type: 'number',
    placeholder: 'κ',
    min: 1,
    max: 1000,
    default: 10,
    description:
      "The largest condition number of the gauge layout taken as well conditioned (1 for four axial gauges at 90° around a round section solving N, My and Mz); above it the layout amplifies the gauges' errors that many times: the results are written and the check fails (exit code 2).",
  },
  {
    name: 'max-residual',
    type: 'string',
    placeholder: 'strain',
    description:
      "With more gauges than resultants: the largest residual (a gauge's strain minus what the solved resultants give there) taken as consistent, with its unit ('25 µε'); a row above it fails the check (exit code 2) and the summary names its gauge.",
  },
  {
    name: 'html',
    type: 'string',
    placeholder: 'file',
    description:
      'Also write a self-contained HTML page with the axial force, moments and torque over the whole recording (each stroke the smallest and largest value of the rows it covers, so no peak is lost) and the gauges as read.',
  },
  summaryJsonOptionRow,
  outOption,
  forceOption,
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework reduce-member`. */
export type MemberArgs = ParsedArgs<typeof memberOptions, typeof memberArguments>;
