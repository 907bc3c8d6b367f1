import { checkInteger } from '@bridgework/core';
import { quoteCsvField } from '../internal/csvText.js';
import type { RecordingWriter } from './convertRecording.js';
import { writeDigits, writeShortest } from './numberText.js';
import type { OutputSink } from './outputSink.js';
import { timeHeading, type RecordingColumns } from './recordingColumns.js';

/** Options of {@link createCsvWriter}. */
export interface CsvWriterOptions {
  /** Write the header line (column names with units). Default true. */
  readonly header?: boolean;
  /**
   * Significant digits of each value (integer in [1, 17]). Default: the shortest text that reads
   * back as exactly the same double (JavaScript's `String(x)`), so nothing is lost.
   */
  readonly digits?: number;
}

/** Size of the reused output buffer: 1 MiB. */
const BUFFER_BYTES = 1 << 20;
/** Longest text of one number plus its separator (`-1.2345678901234567e-308,` is 25 bytes). */
const MAX_CELL_BYTES = 32;

/**
 * A streamed CSV writer for converted recordings: one row per frame, columns time (when the
 * recording has one), the passed-through columns, then one per channel.
 *
 * @remarks
 * Values are formatted one by one straight into a reused 1 MiB byte buffer (see
 * {@link writeShortest} and {@link writeDigits}), which is handed to the sink (and awaited)
 * whenever it fills and at the end of each block: nothing grows with the block or the file. Lines
 * end with `\n`; the header holds the time column, the passed-through names and `name (unit)` for
 * each channel, quoted per RFC 4180 when needed, as are passed-through texts. NaN (a clipped or
 * out-of-range sample) is written as `NaN`; −0 as `0`. Time stamps are written exactly (64-bit
 * integers in full).
 *
 * @param sink - Where the bytes go.
 * @param columns - The columns.
 * @param options - Header and digits.
 * @returns The writer.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer` or `out-of-range` for `digits`.
 * @example
 * ```ts
 * const writer = createCsvWriter(streamSink(process.stdout), columns);
 * await writer.writeBlock(block); // hook (N),trolley (N)\n1.5,2\nNaN,4\n
 * ```
 */
export function createCsvWriter(
  sink: OutputSink,
  columns: RecordingColumns,
  options: CsvWriterOptions = {},
): RecordingWriter {
  const digits =
    options.digits === undefined ? undefined : checkInteger('digits', options.digits, { min: 1, max: 17 });
  const channels = columns.channels.length;
  const names = [
    ...(columns.time === undefined ? [] : [timeHeading(columns.time)]),
    ...columns.passThrough,
    ...columns.channels.map((c) => `${c.name} (${c.unit})`),
  ];
  const header = options.header === false ? undefined : `${names.map((h) => quoteCsvField(h)).join(',')}\n`;
  const buffer = Buffer.allocUnsafe(BUFFER_BYTES);
  const limit = BUFFER_BYTES - MAX_CELL_BYTES;
  let used = 0;
  let headerDone = header === undefined;

  const flush = async (): Promise<void> => {
    if (used === 0) return;
    const n = used;
    used = 0;
    await sink.write(buffer.subarray(0, n));
  };
  const writeText = async (text: string): Promise<void> => {
    const bytes = Buffer.byteLength(text, 'utf8');
    if (used + bytes > limit) await flush();
    if (bytes > limit) await sink.write(text);
    else used += buffer.write(text, used, 'utf8');
  };
  const writeHeader = async (): Promise<void> => {
    headerDone = true;
    await sink.write(header as string);
  };

  return {
    async writeBlock(block) {
      if (!headerDone) await writeHeader();
      const { values, laneStride, frames, timeStamps, passThrough } = block;
      for (let f = 0; f < frames; f++) {
        if (used > limit) await flush();
        if (timeStamps !== undefined) {
          const t = timeStamps[f] as number | bigint;
          if (typeof t === 'bigint') used += buffer.write(t.toString(), used, 'latin1');
          else used = writeShortest(t, buffer, used);
          buffer[used++] = 44;
        }
        if (passThrough !== undefined) {
          for (const column of passThrough) {
            await writeText(quoteCsvField(column[f] as string));
            buffer[used++] = 44;
          }
        }
        for (let c = 0; c < channels; c++) {
          if (used > limit) await flush();
          const v = values[c * laneStride + f] as number;
          used = digits === undefined ? writeShortest(v, buffer, used) : writeDigits(v, digits, buffer, used);
          buffer[used++] = c === channels - 1 ? 10 : 44; // '\n' or ','
        }
      }
      await flush();
    },
    async finish() {
      if (!headerDone) await writeHeader();
      await flush();
    },
  };
}
