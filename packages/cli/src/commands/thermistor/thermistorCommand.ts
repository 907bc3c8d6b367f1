import { defineCommand } from '../../args/optionTable.js';
import { thermistorArguments, thermistorOptions } from './thermistorOptions.js';

/** `bridgework fit-thermistor`: a thermistor's model from calibration points, written back. */
export const fitThermistorCommand = defineCommand({
  name: 'fit-thermistor',
  summary: "Fit a thermistor channel's beta or Steinhart–Hart model to (temperature, resistance) points.",
  description:
    "Fits the Steinhart–Hart coefficients (three points: the curve through them; more: weighted least squares, residuals in kelvin) or the beta model (least squares of ln R against 1/T − 1/T0) to calibration points, with the compensation package's fitThermistor, and reports each point's residual: the model's temperature at the point's resistance minus the point's temperature.\n\n" +
    "With --write the model goes into the thermistor channel's sensor section (the other model's keys removed), keeping the file's comments and formatting. A residual past --max-residual fails the check: exit code 2, nothing written.",
  positionals: thermistorArguments,
  options: thermistorOptions,
  examples: [
    {
      command: 'bridgework fit-thermistor winch.yaml bath-points.csv -c oil',
      description: 'Steinhart–Hart through the points, reported only.',
    },
    {
      command:
        'bridgework fit-thermistor winch.yaml bath-points.csv -c oil --model beta --reference-celsius 25 --write',
      description: 'A beta model referred to 25 °C, written into the channel file.',
    },
  ],
  load: () => import('./runFitThermistor.js'),
});
