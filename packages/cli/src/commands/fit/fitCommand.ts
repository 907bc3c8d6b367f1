import { defineCommand } from '../../args/optionTable.js';
import { fitArguments, fitOptions } from './fitOptions.js';

/** `bridgework fit-calibration`: a calibration against reference loads, written back. */
export const fitCalibrationCommand = defineCommand({
  name: 'fit-calibration',
  summary: "Fit a channel's calibration against reference loads and write it into the channel file.",
  description:
    "Fits the bridge ratio against the applied load by least squares (degree 1 to 3, with the coefficients' covariance: the calibration package's fitPolynomial) from a points file, and reports for each point the residual and the error of the calibrated channel (the load it would indicate minus the load applied) with the fit's standard uncertainty there, and over the span: the nonlinearity, hysteresis and repeatability of the readings (the load-cell error terms of OIML R 60) and the largest uncertainty of the fit.\n\n" +
    "With --write the fit goes into the channel's calibration section of the channel file, with the points file's SHA-256, the number of points and the date; the channel then converts through the inverse of the fit over the reference loads' span (and 5 % beyond each end). A fit that is not monotone over that span has no inverse: it is refused and nothing is written (exit code 2).",
  positionals: fitArguments,
  options: fitOptions,
  examples: [
    {
      command: 'bridgework fit-calibration winch.yaml rope-points.csv --channel rope',
      description: 'A straight line through the points, reported only.',
    },
    {
      command: 'bridgework fit-calibration winch.yaml rope-points.csv --channel rope --degree 2 --write',
      description: 'A quadratic fit, written into the channel file.',
    },
  ],
  load: () => import('./runFitCalibration.js'),
});
