import { defineCommand } from '../../args/optionTable.js';
import { rosetteArguments, rosetteOptions } from './rosetteOptions.js';

/** `bridgework reduce-rosette`: rosette recordings to principal strains and stresses, row by row. */
export const reduceRosetteCommand = defineCommand({
  name: 'reduce-rosette',
  summary: 'Reduce recorded rosette legs to principal strains, their direction and stresses, row by row.',
  description:
    "Streams a CSV recording of a strain rosette's three legs (any layout: rectangular, delta, or three given directions) and writes, for every row, the principal strains ε1 and ε2, the maximum shear strain and the direction of ε1 from leg a; with Young's modulus and Poisson's ratio (options or a channel file), the plane-stress principal stresses, the maximum in-plane shear stress, von Mises and Tresca. The legs can first be corrected for the gauges' transverse sensitivity. The other columns (a time stamp, for example) pass through unchanged; memory does not grow with the file.\n\n" +
    "The summary on standard error (or as JSON on standard output with --json) gives the rows reduced, the rows that could not be (written as NaN, with the reason and the first line), and the layout's condition number: above --max-condition the layout is ill-conditioned and the command exits with 2 after writing the results.",
  positionals: rosetteArguments,
  options: rosetteOptions,
  examples: [
    {
      command:
        'bridgework reduce-rosette web-rosette.csv --legs ra,rb,rc --modulus "205 GPa" --poisson 0.29 -o web-principal.csv',
      description: 'A rectangular rosette in µε, with stresses in MPa.',
    },
    {
      command:
        'bridgework reduce-rosette web-rosette.csv --legs 2,3,4 --layout delta --transverse 0.012 --channel-file bridge.yaml -c web',
      description: 'A delta rosette corrected for transverse sensitivity, E and ν from a channel.',
    },
  ],
  load: () => import('./runReduceRosette.js'),
});
