import { checkInteger } from '@bridgework/core';
import { quoteCsvField } from '../internal/csvText.js';
import { formatCsvRows, maxRowBytes } from './csvRows.js';
import { writeShortest } from './numberText.js';
import type { RecordingWriter } from './pipelineTypes.js';
import { createWriteQueue, type OutputSink } from './outputSink.js';
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

/** Size of each of the two output buffers: 1 MiB. */
const BUFFER_BYTES = 1 << 20;

/**
 * A streamed CSV writer for converted recordings: one row per frame, columns time (when the
 * recording has one), the passed-through columns, then one per channel.
 *
 * @remarks
 * Values are formatted one by one straight into a 1 MiB byte buffer (see {@link formatCsvRows}),
 * which is queued for writing whenever it fills and at the end of each block, while formatting
 * goes on in a second buffer: nothing grows with the block or the file. Rows formatted elsewhere
 * by the same function (in the conversion worker threads) are taken as bytes (`rows`). Lines
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
  // Two buffers: one is filled while the other is written.
  const queue = createWriteQueue(sink);
  const buffers = [Buffer.allocUnsafe(BUFFER_BYTES), Buffer.allocUnsafe(BUFFER_BYTES)];
  const written: Promise<void>[] = [Promise.resolve(), Promise.resolve()];
  let slot = 0;
  let buffer = buffers[0] as Buffer;
  // No row starts past `limit`: any row of numbers fits after it.
  const limit = BUFFER_BYTES - maxRowBytes(channels, columns.time !== undefined);
  let used = 0;
  let headerDone = header === undefined;

  const flush = async (): Promise<void> => {
    if (used === 0) return;
    written[slot] = queue.write(buffer.subarray(0, used));
    used = 0;
    slot ^= 1;
    await written[slot];
    buffer = buffers[slot] as Buffer;
  };
  const writeText = async (text: string): Promise<void> => {
    const bytes = Buffer.byteLength(text, 'utf8');
    if (used + bytes > limit) await flush();
    if (bytes > limit) await queue.write(text);
    else used += buffer.write(text, used, 'utf8');
  };
  const writeHeader = async (): Promise<void> => {
    headerDone = true;
    await queue.write(header as string);
  };

  return {
    async writeBlock(block) {
      if (!headerDone) await writeHeader();
      const { values, laneStride, frames, timeStamps, passThrough } = block;
      if (passThrough === undefined) {
        // Rows of numbers alone: as many rows as fit, then the buffer is queued and refilled.
        for (let f = 0; f < frames;) {
          const done = formatCsvRows(
            values,
            laneStride,
            channels,
            timeStamps,
            digits,
            f,
            frames,
            buffer,
            used,
            limit,
          );
          f = done.row;
          used = done.pos;
          if (f < frames) await flush();
        }
        await flush();
        return;
      }
      for (let f = 0; f < frames; f++) {
        if (used > limit) await flush();
        if (timeStamps !== undefined) {
          const t = timeStamps[f] as number | bigint;
          if (typeof t === 'bigint') used += buffer.write(t.toString(), used, 'latin1');
          else used = writeShortest(t, buffer, used);
          buffer[used++] = 44;
        }
        for (const column of passThrough) {
          await writeText(quoteCsvField(column[f] as string));
          buffer[used++] = 44;
        }
        if (used > limit) await flush();
        used = formatCsvRows(
          values,
          laneStride,
          channels,
          undefined,
          digits,
          f,
          f + 1,
          buffer,
          used,
          limit,
        ).pos;
      }
      await flush();
    },
    rows: {
      digits,
      async write(bytes) {
        if (!headerDone) await writeHeader();
        await flush();
        await queue.write(bytes);
      },
    },
    async finish() {
      if (!headerDone) await writeHeader();
      await flush();
      await queue.flush();
    },
  };
}
