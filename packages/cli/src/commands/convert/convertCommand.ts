import {
  defineCommand,
  type OptionSpec,
  type ParsedArgs,
  type PositionalSpec,
} from '../../args/optionTable.js';
import { outputFormats, parquetCompressions, sampleTypes, timeStampTypes } from '../../data/formatLists.js';
import { channelFileArgument, forceOption } from '../sharedOptions.js';

/** The positional arguments of `bridgework convert`. */
export const convertArguments = [
  channelFileArgument,
  {
    name: 'codes-file',
    required: true,
    description:
      'The recorded codes: .csv or .txt (CSV text), any other extension a raw recording (see --from).',
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
    description: 'Write the converted data to this file, atomically: it appears complete or not at all.',
  },
  forceOption,
  {
    name: 'to',
    type: 'choice',
    placeholder: 'format',
    choices: outputFormats,
    defaultText: 'from the output file name (.csv, .arrow, .arrows, .parquet, .f32, .f64), else csv',
    description:
      'Output format: CSV; raw IEEE 754 values (float32 or float64, little- or big-endian, channels interleaved); Apache Arrow IPC file (arrow) or stream (arrows); Apache Parquet.',
  },
  {
    name: 'from',
    type: 'choice',
    placeholder: 'format',
    choices: ['csv', ...sampleTypes],
    defaultText: 'csv for .csv and .txt files, else int32le',
    description:
      'Format of the codes file: csv, or a raw recording of one stored code type: int16, uint16, int24 (packed 3 bytes), uint24, int32, uint32, float32 or float64, each le (little-endian) or be (big-endian).',
  },
  {
    name: 'channels',
    type: 'string',
    placeholder: 'names',
    defaultText: 'every channel, in file order',
    description:
      'Channels of the channel file that the data holds, comma-separated, in the order of the CSV code columns or of the raw interleaving.',
  },
  {
    name: 'file-header',
    type: 'integer',
    placeholder: 'bytes',
    unit: 'bytes',
    min: 0,
    max: 1_048_576,
    default: 0,
    description: 'Raw: bytes at the start of the file, before the first frame, skipped.',
  },
  {
    name: 'frame-header',
    type: 'integer',
    placeholder: 'bytes',
    unit: 'bytes',
    min: 0,
    max: 1_048_576,
    default: 0,
    description:
      'Raw: bytes at the start of every frame, before the codes; skipped, except a time stamp in them.',
  },
  {
    name: 'frame-trailer',
    type: 'integer',
    placeholder: 'bytes',
    unit: 'bytes',
    min: 0,
    max: 1_048_576,
    default: 0,
    description: 'Raw: bytes at the end of every frame, after the codes (a checksum, say), skipped.',
  },
  {
    name: 'time-stamp',
    type: 'choice',
    placeholder: 'type',
    choices: timeStampTypes,
    description:
      'Raw: each frame header holds a time stamp of this type (at --time-stamp-at); it is kept as the time column, exactly as stored.',
  },
  {
    name: 'time-stamp-at',
    type: 'integer',
    placeholder: 'byte',
    unit: 'bytes',
    min: 0,
    max: 1_048_576,
    default: 0,
    description: 'Raw: offset of the time stamp from the start of the frame.',
  },
  {
    name: 'tick',
    type: 'number',
    placeholder: 'seconds',
    unit: 's',
    min: 0,
    description:
      'Raw: seconds per tick of the time stamp (1e-6 for a microsecond counter); needed for time windows.',
  },
  {
    name: 'sample-rate',
    type: 'number',
    placeholder: 'hertz',
    unit: 'Hz',
    min: 0,
    description:
      'Frames per second of the recording; places frames in time for --zero-window (instead of the time column) and is stored in the output metadata.',
  },
  {
    name: 'columns',
    type: 'string',
    placeholder: 'list',
    defaultText: 'every column but the time and kept columns',
    description: 'CSV: the columns holding codes, comma-separated header names or column numbers from 1.',
  },
  {
    name: 'time-column',
    type: 'string',
    placeholder: 'column',
    description: 'CSV: a column of time in seconds (name or number), kept as the time column.',
  },
  {
    name: 'keep-columns',
    type: 'string',
    placeholder: 'list',
    defaultText: 'every column that is neither a code nor the time column',
    description: "CSV: columns passed through to the output as text, comma-separated, or 'none'.",
  },
  {
    name: 'unit',
    type: 'choice',
    placeholder: 'unit',
    choices: ['channel', 'display'],
    default: 'channel',
    description:
      "Values in the channel's own unit (N, m/m, Pa, kg) or in the unit a report shows (kN, µε, MPa, t); the unit is in the CSV heading and the columnar metadata.",
  },
  {
    name: 'zero-window',
    type: 'string',
    placeholder: 'window',
    description:
      'Re-zero from the data: the mean code of each zeroed channel over this window (10s: the first 10 seconds; 120s..130s: a range) becomes its zero reading, the two-reading method of the exact map.',
  },
  {
    name: 'zero-channels',
    type: 'string',
    placeholder: 'names',
    defaultText: 'every channel but temperature channels',
    description: 'The channels --zero-window re-zeroes, comma-separated.',
  },
  {
    name: 'temperature-from',
    type: 'string',
    placeholder: 'name',
    description:
      "A temperature channel of the same recording: each block's mean temperature corrects the thermal output and gauge factor of the strain channels (their map is rebuilt at that temperature per block).",
  },
  {
    name: 'temperature-corrects',
    type: 'string',
    placeholder: 'names',
    defaultText: 'every strain-gauge channel',
    description: 'The channels --temperature-from corrects, comma-separated.',
  },
  {
    name: 'parquet-compression',
    type: 'choice',
    placeholder: 'codec',
    choices: parquetCompressions,
    default: 'snappy',
    description: 'Parquet: compression of the column chunks.',
  },
  {
    name: 'block',
    type: 'integer',
    placeholder: 'frames',
    unit: 'frames',
    default: 65_536,
    min: 1,
    max: 16_777_216,
    description:
      'Frames read and converted at a time (the temperature correction uses one temperature per block); memory is a few blocks.',
  },
  {
    name: 'digits',
    type: 'integer',
    placeholder: 'n',
    unit: 'significant digits',
    min: 1,
    max: 17,
    defaultText: 'shortest exact round trip',
    description: 'CSV: digits written per value (fewer digits write faster).',
  },
  {
    name: 'groups',
    type: 'string',
    placeholder: 'list',
    description:
      "Also write the components of these groups of the channel file (comma-separated group names, or 'all'): a multi-component group's loads through its calibration's inverse, a platform's summed indication; columns named group.component.",
  },
  {
    name: 'drop-bridges',
    type: 'boolean',
    description: "With --groups, write the groups' components instead of their bridges' quantities.",
  },
  {
    name: 'fail-on-clip',
    type: 'boolean',
    description: 'Exit with code 2 when any sample is written as NaN; the output is still written.',
  },
] as const satisfies readonly OptionSpec[];

/** The parsed arguments of `bridgework convert`. */
export type ConvertArgs = ParsedArgs<typeof convertOptions, typeof convertArguments>;

/** `bridgework convert`: converter codes to engineering units. */
export const convertCommand = defineCommand({
  name: 'convert',
  summary:
    'Convert recorded converter codes (CSV or raw) to engineering units as CSV, raw floats, Arrow or Parquet.',
  description:
    "Reads converter codes from a CSV file (one column per channel, header optional, RFC 4180 quoting; time and other columns passed through) or a raw recording (16-, 24- or 32-bit integers or floats of either byte order, channels interleaved frame by frame, with optional file and frame headers and a per-frame time stamp) and writes the quantity of every sample: as CSV, raw float32/float64, an Apache Arrow IPC file or stream, or Apache Parquet, one column per channel with the time or frame column; the columnar formats carry the units, channel names, bridgework version and the channel file's SHA-256 in their metadata. The file is streamed in blocks, so files larger than memory work; a progress bar is shown on a terminal.\n\n" +
    "Codes at or beyond the converter rails, or outside the range the map can invert, are never turned into plausible numbers: they are written as NaN (null in Arrow and Parquet), and a summary per channel is printed on standard error. Corrections from the data: --zero-window takes each channel's zero reading from a window of the recording; --temperature-from corrects strain channels block by block from a temperature channel. The output file is written atomically: an interrupted or failed run leaves no file behind.",
  positionals: convertArguments,
  options: convertOptions,
  examples: [
    {
      command: 'bridgework convert hopper.yaml codes.bin -o load.csv',
      description: 'Convert a raw int32 recording of every channel of the file.',
    },
    {
      command:
        'bridgework convert rig.yaml rig.dat --from int24be --frame-header 8 --time-stamp uint64le --tick 1e-6 -o rig.parquet',
      description:
        'A logger layout: 8-byte frame headers holding a microsecond stamp, 24-bit big-endian codes.',
    },
    {
      command: 'bridgework convert hook.yaml log.csv --columns hook_code --channels hook -o hook.csv',
      description: 'Convert one column of a logger CSV, passing the other columns through.',
    },
    {
      command: 'bridgework convert rig.yaml coupling.csv --groups coupling --drop-bridges -o loads.csv',
      description: "Write a six-component coupling's forces and moments instead of its six bridge readings.",
    },
    {
      command:
        'bridgework convert bridge.yaml deck.bin --sample-rate 100 --zero-window 30s --temperature-from deck-rtd -o deck.arrow',
      description: 'Re-zero from the first 30 s and correct the strain channels from the deck RTD.',
    },
  ],
  load: () => import('./runConvert.js'),
});
