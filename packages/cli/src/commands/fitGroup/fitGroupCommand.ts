import { defineCommand } from '../../args/optionTable.js';
import { fitGroupArguments, fitGroupOptions } from './fitGroupOptions.js';

/** `bridgework fit-group`: a multi-component group calibrated from a loading schedule, written back. */
export const fitGroupCommand = defineCommand({
  name: 'fit-group',
  summary:
    "Fit a multi-component group's calibration to a loading schedule and write it into the channel file.",
  description:
    "Fits the group's bridges' readings against the applied load components by least squares (one Householder QR of the schedule's design; the linear model, or with second-order interaction terms as AIAA R-091 describes, terms the schedule cannot determine left out with the reason), with the coefficients' covariance (the calibration package's fitMultiComponent), and reports what `report` shows of a group: the sensitivity and load matrices, cross-talk, second-order shares, the conditions, per component the standard uncertainty at zero and at full scale (GUM, and Monte Carlo through the exact inverse beside it) with the residuals and hysteresis.\n\n" +
    "With --write the coefficients go into the group's calibration section of the channel file — the terms, one row of coefficients per bridge with the reading unit, the fit's covariance ((AᵀA)⁻¹ over the terms and the readings' covariance, with its degrees of freedom), the schedule's SHA-256, its number of points and the date — replacing a schedule named there; report, convert and constants then use the stored coefficients. A schedule that cannot determine the calibration (a component never loaded) is refused with the reason and nothing is written.",
  positionals: fitGroupArguments,
  options: fitGroupOptions,
  examples: [
    {
      command: 'bridgework fit-group test-rig.yaml coupling-schedule.csv --group coupling',
      description: 'Fit the coupling and report it, without writing.',
    },
    {
      command:
        'bridgework fit-group test-rig.yaml coupling-schedule.csv --group coupling --interactions second-order --write',
      description: 'Fit with every second-order term and store the coefficients in the channel file.',
    },
  ],
  load: () => import('./runFitGroup.js'),
});
