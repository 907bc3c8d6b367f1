import type { TimeColumn } from './codeSource.js';

/** One channel column of a converted recording. */
export interface ChannelColumn {
  /** The channel's name. */
  readonly name: string;
  /** The unit of the written values (`'N'`, `'kN'`, `'µε'`, `'°C'`...). */
  readonly unit: string;
  /** The channel's quantity (`'force'`, `'strain'`...). */
  readonly quantity: string;
}

/** What a converted recording holds, column by column, and what it says about itself. */
export interface RecordingColumns {
  /** The channel columns, in channel order. */
  readonly channels: readonly ChannelColumn[];
  /** The time column of the recording, if any. */
  readonly time: TimeColumn | undefined;
  /** CSV columns passed through as text, in file order. */
  readonly passThrough: readonly string[];
  /**
   * Key/value metadata of the whole file (bridgework version, channel-file hash, source, caution,
   * corrections); columnar outputs store it in their schema.
   */
  readonly metadata: Readonly<Record<string, string>>;
}

/** The time column's heading in CSV: `time (s)` for seconds, else the name with its ticks. */
export function timeHeading(time: TimeColumn): string {
  if (time.type === 'seconds') return time.name;
  return time.secondsPerTick === undefined
    ? `${time.name} (ticks)`
    : `${time.name} (ticks of ${time.secondsPerTick} s)`;
}
