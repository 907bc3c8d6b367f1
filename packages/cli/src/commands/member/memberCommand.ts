import { defineCommand } from '../../args/optionTable.js';
import { memberArguments, memberOptions } from './memberOptions.js';

/** `bridgework reduce-member`: a member's gauge recordings to axial force, bending moments and torque, row by row. */
export const reduceMemberCommand = defineCommand({
  name: 'reduce-member',
  summary:
    "Reduce a member's recorded gauge strains to axial force, bending moments about two axes and torque, row by row.",
  description:
    "Streams a CSV recording of the gauges around one cross-section of a bar, tube or rectangular member (each gauge's column, its place on the section and its direction) and writes, for every row, the section resultants: axial force N, bending moments My and Mz and torque T, by least squares through the mechanics package's createMemberReduction (σx = N/A + My·z/Iy − Mz·y/Iz; τ = T·r/J or T/Wt; each gauge at its angle by the strain transformation). With more gauges than resultants the largest residual of each row is written too: a gauge that disagrees with the rest (damaged, misplaced, drifting) shows there. The other columns (a time stamp, for example) pass through unchanged; memory does not grow with the file.\n\n" +
    "The summary on standard error (or as JSON with --json) gives the rows reduced, the rows that could not be (written as NaN, with the reason and the first line), the layout's condition number and the largest residual with its gauge and line: above --max-condition or --max-residual the results are written and the command exits with 2. With --html, a page draws the resultants over the whole recording.",
  positionals: memberArguments,
  options: memberOptions,
  examples: [
    {
      command:
        'bridgework reduce-member mast-gauges.csv --gauges "n@+z,s@-z,e@+y,w@-y,t1@+y@45,t2@+y@-45" --diameter "88.9 mm" --bore "76.3 mm" --modulus "205 GPa" --poisson 0.29 -o mast-loads.csv',
      description: 'Four axial gauges and a ±45° pair on a tube: N, My, Mz and T per row, in kN and kN·m.',
    },
    {
      command:
        'bridgework reduce-member chord.csv --gauges "1@+z,2@-z,3@+y,4@-y" --width "80 mm" --depth "120 mm" --wall "6 mm" --channel-file truss.yaml -c chord-n --max-residual "20 µε"',
      description: 'A rectangular hollow chord: N, My, Mz, with a check on the gauges’ agreement.',
    },
  ],
  load: () => import('./runReduceMember.js'),
});
