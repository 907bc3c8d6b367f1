import { defineCommand } from '../../args/optionTable.js';
import { constantsArguments, constantsOptions } from './constantsOptions.js';

/** `bridgework constants`: firmware constants of each channel. */
export const constantsCommand = defineCommand({
  name: 'constants',
  summary:
    'Firmware constants of each channel as a C header or JSON, each function within a stated total error; or its map as SQL.',
  description:
    "Writes the code-to-quantity map of each channel for firmware over its span of interest: a fixed-point function (integer arithmetic only), a float32 and a float64 function, each the cheapest form (affine, piecewise polynomial with segments found by a shift, or linear-fractional where the target divides in hardware) whose total error against the channel's exact map meets the target, verified over every code of the span. The header states each function's total error (proved or measured), its parts, its table size and operation count, and carries test vectors; --test-program writes a C program that checks them on the target. A target that no form meets is an error, and nothing is written. One header holds every selected channel; identifiers are the prefix and the channel name. The header and the JSON carry the safety caution.",
  positionals: constantsArguments,
  options: constantsOptions,
  examples: [
    {
      command: 'bridgework constants hopper.yaml --prefix hopper -o hopper_constants.h',
      description: 'Write a C header for every channel.',
    },
    {
      command: 'bridgework constants hopper.yaml --types fixed,float32 -o hopper_m4f.h',
      description: 'Only the evaluators a Cortex-M4F runs fast.',
    },
    {
      command: 'bridgework constants bath.yaml --target-error 0.01 -o bath.h --test-program bath_test.c',
      description: 'Functions within 0.01 of the exact map, and a program that checks the test vectors.',
    },
    {
      command: 'bridgework constants hopper.yaml --format json',
      description: 'Print the constants as JSON.',
    },
    {
      command: 'bridgework constants rig.yaml --format sql --dialect trino --table lake.rig_codes -o rig.sql',
      description: "Each channel's map as SQL, for reprocessing an archive in the user's own engine.",
    },
  ],
  load: () => import('./runConstants.js'),
});
