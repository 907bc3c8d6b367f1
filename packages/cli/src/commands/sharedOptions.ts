/**
 * Option rows shared by several commands, so that the same option reads the same everywhere.
 */

/** `-o, --out <file>`: write the result to a file instead of standard output. */
export const outOption = {
  name: 'out',
  short: 'o',
  type: 'string',
  placeholder: 'file',
  defaultText: 'standard output',
  description: 'Write the result to this file, atomically: it appears complete or not at all.',
} as const;

/** `-f, --force`: allow replacing existing output files. */
export const forceOption = {
  name: 'force',
  short: 'f',
  type: 'boolean',
  description: 'Replace output files that exist already; without it, an existing file is an error.',
} as const;

/** `-c, --channel <name>`: select one channel of a multi-channel file. */
export const channelOption = {
  name: 'channel',
  short: 'c',
  type: 'string',
  placeholder: 'name',
  defaultText: 'every channel',
  description: 'Only this channel of the channel file.',
} as const;

/** `--json`: machine-readable output. */
export const jsonOption = {
  name: 'json',
  type: 'boolean',
  description: 'Print JSON for scripts instead of the text table; it carries the same safety caution.',
} as const;

/** The channel-file positional argument. */
export const channelFileArgument = {
  name: 'channel-file',
  required: true,
  description: 'The channel file (YAML or JSON) describing one or more channels.',
} as const;
