import {
  defineCommand,
  type OptionSpec,
  type ParsedArgs,
  type PositionalSpec,
} from '../../args/optionTable.js';
import { codeFileFormats } from '../../data/codeSource.js';
import { channelFileArgument, forceOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework convert`. */
export const convertArguments = [
  channelFileArgument,
  {
    name: 'codes-file',
    required: true,
    description: 'The recorded codes: .csv (CSV text) or any other extension (raw little-endian int32).',
  },
] as const satisfies readonly PositionalSpec[];

/** The option table of `bridgework convert`. */
export const convertOptions = [
  {
    name: 'out',
    short: 'o',
    type: 'string',
    placeholder: 'file',
    defaultText: 'standard output',
    description: 'Write the converted CSV to this file, atomically: it appears complete or not at all.',
  },
  forceOption,
  {
    name: 'from',
    type: 'choice',
    placeholder: 'format',
    choices: codeFileFormats,
    defaultText: 'csv for .csv and .txt files, else int32le',
    description: 'Format of the codes file.',
  },
  {
    name: 'channels',
    type: 'string',
    placeholder: 'names',
    defaultText: 'every channel, in file order',
    description:
      'Channels of the channel file that the data holds, comma-separated, in the order of the CSV columns or of the raw interleaving.',
  },
  {
    name: 'columns',
    type: 'string',
    placeholder: 'list',
    defaultText: 'every column',
    description:
      'CSV only: the columns holding codes, comma-separated header names or column numbers from 1.',
  },
  {
    name: 'block',
    type: 'integer',
    placeholder: 'frames',
    unit: 'frames',
    default: 65_536,
    min: 1,
    max: 16_777_216,
    description: 'Frames read and converted at a time; memory use is about 12 bytes per code of a block.',
  },
  {
    name: 'digits',
    type: 'integer',
    placeholder: 'n',
    unit: 'significant digits',
    min: 1,
    max: 17,
    defaultText: 'shortest exact round trip',
    description: 'Digits written per value.',
  },
  {
    name: 'fail-on-clip',
    type: 'boolean',
    description: 'Exit with code 2 when any sample is clipped; the output is still written.',
  },
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework convert`. */
export type ConvertArgs = ParsedArgs<typeof convertOptions, typeof convertArguments>;

/** `bridgework convert`: converter codes to engineering units. */
export const convertCommand = defineCommand({
  name: 'convert',
  summary: 'Convert recorded converter codes (CSV or raw int32) to engineering units in CSV.',
  description:
    'Reads converter codes from a CSV file (one column per channel, header optional) or a raw file of little-endian 32-bit integers (the channels interleaved frame by frame) and writes the quantity of every sample as CSV, one column per channel, headed with the channel names and units. The file is streamed in blocks, so files larger than memory work; a progress bar is shown on a terminal.\n\n' +
    'Codes at or beyond the converter rails, or outside the range the map can invert, are never turned into plausible numbers: they are written as NaN, and a summary of clipped samples per channel is printed on standard error. The output file is written atomically: an interrupted or failed run leaves no file behind.',
  positionals: convertArguments,
  options: convertOptions,
  examples: [
    {
      command: 'bridgework convert hopper.yaml codes.bin -o load.csv',
      description: 'Convert a raw recording of every channel of the file.',
    },
    {
      command: 'bridgework convert hook.yaml log.csv --columns hook_code --channels hook -o hook.csv',
      description: 'Convert one column of a logger CSV.',
    },
  ],
  load: () => import('./runConvert.js'),
});
