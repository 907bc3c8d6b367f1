import { defineCommand } from '../../args/optionTable.js';
import { certificateArguments, certificateOptions } from './certificateOptions.js';

/** `bridgework check-certificate`: a load-cell certificate against an OIML R 60 accuracy class. */
export const checkCertificateCommand = defineCommand({
  name: 'check-certificate',
  summary: "Check a load cell's test certificate against an OIML R 60 accuracy class.",
  description:
    "Reads a certificate's readings (loads at one or more temperatures, loading and unloading, repeated cycles; a creep record; the return to the minimum load) and checks them against the maximum permissible errors of the chosen OIML R 60 class and nLC: the load cell error at every reading, the repeatability, the creep over 30 minutes and between 20 and 30 minutes, the minimum dead load output return, and with Y the zero's change with temperature. Each check is reported with its limit, its margin and pass or fail.\n\n" +
    "With --write, the certificate's rated output, zero balance and (from runs at two or more temperatures) temperature coefficients go into the channel's sensor section, which the budget uses. A failed check exits with 2 and writes nothing.",
  positionals: certificateArguments,
  options: certificateOptions,
  examples: [
    {
      command:
        'bridgework check-certificate winch.yaml rope-certificate.csv -c rope --class C --intervals 3000',
      description: 'Check the rope load cell against class C3.',
    },
    {
      command:
        'bridgework check-certificate winch.yaml rope-certificate.csv -c rope --class C --intervals 3000 --html rope-certificate.html --write',
      description: 'With the error plot, and the sensor characteristics written into the channel file.',
    },
  ],
  load: () => import('./runCheckCertificate.js'),
});
