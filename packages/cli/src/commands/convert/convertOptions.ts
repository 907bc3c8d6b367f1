/**
 * The option table of `bridgework convert` (apart from the command, so that its body imports these
 * types without an import cycle).
 */
import type { OptionSpec, ParsedArgs, PositionalSpec } from '../../args/optionTable.js';
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
    defaultText: "the channel file's recording section, else csv for .csv and .txt files, else int32le",
    description:
      "Format of the codes file: csv, or a raw recording of one stored code type: int16, uint16, int24 (packed 3 bytes), uint24, int32, uint32, float32 or float64, each le (little-endian) or be (big-endian). Given, it describes the recording alone: the channel file's recording section is not used.",
  },
  {
    name: 'channels',
    type: 'string',
    placeholder: 'names',
    defaultText: "the recording section's channels, else every channel, in file order",
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
    defaultText: "the channel file's recording section, else 0",
    description: 'Raw: bytes at the start of the file, before the first frame, skipped.',
  },
  {
    name: 'frame-header',
    type: 'integer',
    placeholder: 'bytes',
    unit: 'bytes',
    min: 0,
    max: 1_048_576,
    defaultText: "the channel file's recording section, else 0",
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
    defaultText: "the channel file's recording section, else 0",
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
    defaultText: "the channel file's recording section, else 0",
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
    name: 'parquet-encoder',
    type: 'choice',
    placeholder: 'where',
    choices: ['auto', 'this-thread', 'worker-thread'],
    default: 'auto',
    description:
      "Parquet: where the file is encoded and compressed. 'worker-thread' encodes in a second thread while this one converts (faster where a second core is free; about 60 MB more memory); 'auto' does so for inputs of 16 MiB and more on a machine of more than two processors. The values, pages and metadata are the same either way.",
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
    name: 'convert-threads',
    type: 'integer',
    placeholder: 'n',
    unit: 'threads',
    min: 0,
    max: 64,
    default: 0,
    description:
      'Worker threads that convert the blocks (and format CSV text) while this thread reads and writes (until they have started, this thread converts); 0 converts in this thread. The output is the same bit for bit either way; memory is threads + 2 blocks in flight. A channel kit of other sensor kinds converts in this thread.',
  },
  {
    name: 'digits',
    type: 'integer',
    placeholder: 'n',
    unit: 'significant digits',
    min: 1,
    max: 17,
    defaultText: 'shortest exact round trip',
    description:
      'CSV: significant digits per value: the exact value correctly rounded (ties to even), trailing zeros dropped; fewer digits make a smaller file. The default writes the shortest text that reads back as the same double.',
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
