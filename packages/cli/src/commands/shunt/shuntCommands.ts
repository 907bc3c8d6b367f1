import { defineCommand } from '../../args/optionTable.js';
import { shuntApplyOptions, shuntArguments, shuntPlanOptions } from './shuntOptions.js';

/** `bridgework shunt-plan`: the shunt resistor for each channel and the step it should give. */
export const shuntPlanCommand = defineCommand({
  name: 'shunt-plan',
  summary: 'Before a test: the shunt resistor that simulates a chosen load or strain, and the step it gives.',
  description:
    "For each strain-gauge or transducer channel: the shunt resistor that, across the chosen arm (at the gauge or at the instrument end of the cable), makes the channel indicate the quantity given by --simulate, exact through the bridge network with its leads (the calibration package's solvers); the nearest E96 or E192 resistor; and for both, the bridge-ratio step, the converter step in codes and the quantity the channel indicates. These are the figures to check at set-up with `bridgework shunt-apply`.",
  positionals: shuntArguments,
  options: shuntPlanOptions,
  examples: [
    {
      command: "bridgework shunt-plan hook.yaml --simulate '-40 kN'",
      description: 'The shunt across arm 1 that simulates −40 kN on every channel.',
    },
    {
      command: 'bridgework shunt-plan hook.yaml --channel hook --shunt-ohms 86600 --json',
      description: 'What a given resistor does, as JSON.',
    },
  ],
  load: () => import('./runShuntPlan.js'),
});

/** `bridgework shunt-apply`: the span correction a measured shunt step calls for, written back. */
export const shuntApplyCommand = defineCommand({
  name: 'shunt-apply',
  summary: 'At set-up: compare a measured shunt step with the model and write the span correction.',
  description:
    'Takes the converter readings of one channel without and with the shunt (two codes, or a short recording), compares the measured step with the step the exact network predicts for that resistor, arm and placement, and reports the span error and the span factor k = expected / measured with its uncertainty (JCGM 100 law of propagation).\n\n' +
    "With --write the factor goes into the channel's spanCorrection section of the channel file, with the shunt, the steps and the date as provenance; every other command then converts with it (as if the gain were amplifier.gain / k). The file keeps its comments and formatting, is replaced atomically, and is not written when it changed since it was read. A step of the wrong sign or a span error past --plausible writes nothing and exits with 2.",
  positionals: shuntArguments,
  options: shuntApplyOptions,
  examples: [
    {
      command:
        'bridgework shunt-apply hook.yaml --channel hook --shunt-ohms 86600 --zero-code 1204.5 --shunted-code -341350.2 --write',
      description: 'Two mean readings; write the span correction.',
    },
    {
      command:
        'bridgework shunt-apply hook.yaml --channel hook --shunt-ohms 86600 --readings shunt-readings.csv',
      description: 'From a short recording, report only.',
    },
  ],
  load: () => import('./runShuntApply.js'),
});
