import { defineCommand } from '../../args/optionTable.js';
import { convertArguments, convertOptions } from './convertOptions.js';

/** `bridgework convert`: converter codes to engineering units. */
export const convertCommand = defineCommand({
  name: 'convert',
  summary:
    'Convert recorded converter codes (CSV or raw) to engineering units as CSV, raw floats, Arrow or Parquet.',
  description:
    "Reads converter codes from a CSV file (one column per channel, header optional, RFC 4180 quoting; time and other columns passed through) or a raw recording (16-, 24- or 32-bit integers or floats of either byte order, channels interleaved frame by frame, with optional file and frame headers and a per-frame time stamp) and writes the quantity of every sample: as CSV, raw float32/float64, an Apache Arrow IPC file or stream, or Apache Parquet, one column per channel with the time or frame column; the columnar formats carry the units, channel names, bridgework version and the channel file's SHA-256 in their metadata. The file is streamed in blocks, so files larger than memory work; a progress bar is shown on a terminal.\n\n" +
    "Codes at or beyond the converter rails, or outside the range the map can invert, are never turned into plausible numbers: they are written as NaN (null in Arrow and Parquet), and a summary per channel is printed on standard error. Corrections from the data: --zero-window takes each channel's zero reading from a window of the recording; --temperature-from corrects strain channels block by block from a temperature channel. The output file is written atomically: an interrupted or failed run leaves no file behind.\n\n" +
    "A channel file's recording section states the layout of its channels' recordings once (format, channels in frame order, header sizes, time stamp, sample rate, CSV columns); options given here override it field by field, and --from replaces it.",
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
