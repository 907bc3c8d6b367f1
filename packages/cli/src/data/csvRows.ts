import type { TimeStamps } from './decodeFrames.js';
import { writeDigits, writeShortest } from './numberText.js';

/** Longest text of one number plus its separator (`-1.2345678901234567e-308,` is 25 bytes). */
export const MAX_CELL_BYTES = 32;

/**
 * The most bytes one CSV row of numbers can take: a time stamp (a 64-bit integer is at most 20
 * characters, a double's shortest text at most 25) and `channels` values, each with its separator.
 *
 * @param channels - Values per row.
 * @param timeStamps - Whether the row starts with a time stamp.
 * @returns The bound, in bytes.
 */
export function maxRowBytes(channels: number, timeStamps: boolean): number {
  return (channels + (timeStamps ? 1 : 0)) * MAX_CELL_BYTES;
}

/** Where {@link formatCsvRows} stopped. */
export interface RowsWritten {
  /** The next row to format (`to` when every row was formatted). */
  readonly row: number;
  /** The position after the last byte written. */
  readonly pos: number;
}

/**
 * Formats rows `from` to `to − 1` of a block of values as CSV text into `buffer`: for each frame
 * its time stamp (when given), then each channel's value, comma-separated, and `\n`. Stops before
 * a row when `pos` has passed `limit`, so that `limit` at most `buffer.length −`
 * {@link maxRowBytes} leaves room for any row.
 *
 * @remarks
 * The one formatting loop of the CSV output, run by the CSV writer and by the conversion worker
 * threads alike (the same bytes either way). Values are written by {@link writeShortest} (the
 * shortest round-trip text, `String(x)`'s) or {@link writeDigits}; time stamps exactly: 64-bit
 * integers in full, others as their shortest round-trip text.
 *
 * @param values - The values, one lane per channel (channel `j` at `values[j × laneStride + f]`).
 * @param laneStride - Distance between lanes.
 * @param channels - Channels (columns of values) per row.
 * @param timeStamps - The block's time stamps, or `undefined`.
 * @param digits - Significant digits, or `undefined` for the shortest round-trip text.
 * @param from - First row.
 * @param to - Row after the last.
 * @param buffer - Receives the text.
 * @param pos - Where to start writing.
 * @param limit - No row starts beyond this position.
 * @returns The next row and the position after the text.
 */
export function formatCsvRows(
  values: Float64Array,
  laneStride: number,
  channels: number,
  timeStamps: TimeStamps | undefined,
  digits: number | undefined,
  from: number,
  to: number,
  buffer: Uint8Array,
  pos: number,
  limit: number,
): RowsWritten {
  const last = channels - 1;
  let f = from;
  for (; f < to && pos <= limit; f++) {
    if (timeStamps !== undefined) {
      const t = timeStamps[f] as number | bigint;
      if (typeof t === 'bigint') {
        const text = t.toString();
        for (let k = 0; k < text.length; k++) buffer[pos++] = text.charCodeAt(k);
      } else pos = writeShortest(t, buffer, pos);
      buffer[pos++] = 44; // ','
    }
    let i = f;
    if (digits === undefined) {
      for (let c = 0; c < last; c++, i += laneStride) {
        pos = writeShortest(values[i] as number, buffer, pos);
        buffer[pos++] = 44;
      }
      pos = writeShortest(values[i] as number, buffer, pos);
    } else {
      for (let c = 0; c < last; c++, i += laneStride) {
        pos = writeDigits(values[i] as number, digits, buffer, pos);
        buffer[pos++] = 44;
      }
      pos = writeDigits(values[i] as number, digits, buffer, pos);
    }
    buffer[pos++] = 10; // '\n'
  }
  return { row: f, pos };
}
