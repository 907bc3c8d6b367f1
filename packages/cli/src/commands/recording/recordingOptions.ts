/**
 * Option rows shared by the commands that reduce a recording row by row (`reduce-rosette`,
 * `reduce-member`), so that the same option reads the same in both.
 */

/**
 * `--modulus`, `--poisson`, `--channel-file` and `-c, --channel`: the material of the part the
 * gauges sit on, from options or a channel file.
 *
 * @param part - What the gauges sit on, for the help text (`'specimen'`, `'member'`).
 * @param poissonUse - What ν is for, in the help text (after the part).
 * @param modulusUse - What E is for, in the help text (after its example).
 */
export function materialOptionRows(part: string, poissonUse: string, modulusUse = '') {
  return [
    {
      name: 'modulus',
      type: 'string',
      placeholder: 'quantity',
      defaultText: "the channel's output.modulusPascals",
      description: `Young's modulus E of the ${part} with a unit ('200 GPa')${modulusUse}.`,
    },
    {
      name: 'poisson',
      type: 'number',
      placeholder: 'ν',
      min: -0.99,
      max: 0.5,
      defaultText: "the channel's bridge.poissonRatio",
      description: `Poisson ratio ν of the ${part}${poissonUse}.`,
    },
    {
      name: 'channel-file',
      type: 'string',
      placeholder: 'file',
      description:
        'A channel file to take E (output.modulusPascals) and ν (bridge.poissonRatio) from, with --channel.',
    },
    {
      name: 'channel',
      short: 'c',
      type: 'string',
      placeholder: 'name',
      defaultText: "the channel file's only channel",
      description: `The channel of --channel-file whose ${part} E and ν apply.`,
    },
  ] as const;
}

/**
 * `--keep-columns`: the columns passed through.
 *
 * @param inputs - The input columns not passed through by default (`'the legs'`).
 */
export function keepColumnsOptionRow(inputs: string) {
  return {
    name: 'keep-columns',
    type: 'string',
    placeholder: 'list',
    defaultText: `every column but ${inputs}`,
    description:
      'The columns passed through to the output, before the results (names or numbers from 1, comma-separated; an empty list keeps none).',
  } as const;
}

/**
 * `--json` of a row-by-row reduction: the summary as JSON on standard output (the rows then go to
 * `--out`).
 */
export const summaryJsonOptionRow = {
  name: 'json',
  type: 'boolean',
  description:
    'Print the summary as JSON on standard output instead of text on standard error (the rows then need --out); it carries the same safety caution.',
} as const;
