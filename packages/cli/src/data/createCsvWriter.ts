import { checkInteger, checkLength } from '@bridgework/core';
import { quoteCsvField } from '../internal/csvText.js';
import type { OutputSink } from './outputSink.js';

/** Options of {@link createCsvWriter}. */
export interface CsvWriterOptions {
  /** Column names written as the first line (one per channel). Default: no header line. */
  readonly header?: readonly string[];
  /**
   * Significant digits of each value (integer in [1, 17]). Default: the shortest text that reads
   * back as exactly the same double (JavaScript's `String(x)`), so nothing is lost.
   */
  readonly digits?: number;
  /** Text written for a flagged sample (NaN). Default `'NaN'`. */
  readonly nanText?: string;
}

/** Writes blocks of interleaved values as CSV rows. */
export interface CsvWriter {
  /** Number of data rows written so far. */
  readonly rows: number;
  /**
   * Writes `frames` rows of `channels` values each from `values` (frame-major). The header, when
   * there is one, goes out before the first row.
   */
  writeBlock(values: Float64Array, frames: number): Promise<void>;
  /** Writes the header if no row was written (so an empty input still gives a header). */
  finish(): Promise<void>;
}

/** Size of the reused output buffer: 1 MiB. */
const BUFFER_BYTES = 1 << 20;
/** Longest text of one value plus its separator (`-1.2345678901234567e-308,` is 25 bytes). */
const MAX_CELL_BYTES = 32;

/**
 * A streamed CSV writer for converted values.
 *
 * @remarks
 * Values are formatted one by one into a reused 1 MiB byte buffer, which is handed to the sink
 * (and awaited) whenever it fills and at the end of each block. Nothing grows with the block or
 * the file: no array of cell strings, no joined block text; the only allocations are the short
 * number strings, which die young. Lines end with `\n`; header names are UTF-8 and quoted per
 * RFC 4180 when they need it. NaN (a clipped or out-of-range sample) is written as `nanText`;
 * −0 is written as `0`.
 *
 * @param sink - Where the bytes go.
 * @param channels - Values per row (integer in [1, 4096]).
 * @param options - Header, digits and NaN text.
 * @returns The writer.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer` or `out-of-range` (channels, digits, frames),
 * `invalid-shape` (a header with the wrong number of names).
 * @example
 * ```ts
 * const writer = createCsvWriter(streamSink(process.stdout), 2, { header: ['hook (N)', 'trolley (N)'] });
 * await writer.writeBlock(Float64Array.of(1.5, 2, NaN, 4), 2); // hook (N),trolley (N)\n1.5,2\nNaN,4\n
 * ```
 */
export function createCsvWriter(
  sink: OutputSink,
  channels: number,
  options: CsvWriterOptions = {},
): CsvWriter {
  checkInteger('channels', channels, { min: 1, max: 4096 });
  const digits =
    options.digits === undefined ? undefined : checkInteger('digits', options.digits, { min: 1, max: 17 });
  const header =
    options.header === undefined
      ? undefined
      : `${checkLength<string>('header', options.header, channels)
          .map((h) => quoteCsvField(h))
          .join(',')}\n`;
  const nanText = options.nanText ?? 'NaN';
  const nanAscii = /^[\x20-\x7e]*$/.test(nanText) && nanText.length < MAX_CELL_BYTES;
  const format =
    digits === undefined
      ? (v: number): string => (v !== v ? nanText : String(v))
      : (v: number): string => (v !== v ? nanText : String(Number(v.toPrecision(digits))));
  const buffer = Buffer.allocUnsafe(BUFFER_BYTES);
  const limit = BUFFER_BYTES - MAX_CELL_BYTES;
  let used = 0;
  let rows = 0;
  let headerDone = header === undefined;

  const flush = async (): Promise<void> => {
    if (used === 0) return;
    const n = used;
    used = 0;
    await sink.write(buffer.subarray(0, n));
  };
  const writeHeader = async (): Promise<void> => {
    headerDone = true;
    await sink.write(header as string);
  };

  return {
    get rows() {
      return rows;
    },
    async writeBlock(values, frames) {
      checkInteger('frames', frames, { min: 0, max: Math.floor(values.length / channels) });
      if (!headerDone) await writeHeader();
      let i = 0;
      for (let f = 0; f < frames; f++) {
        for (let c = 0; c < channels; c++) {
          if (used > limit) await flush();
          const v = values[i++] as number;
          if (v !== v && !nanAscii) {
            await flush();
            await sink.write(nanText);
          } else {
            used += buffer.write(format(v), used, 'latin1');
          }
          buffer[used++] = c === channels - 1 ? 10 : 44; // '\n' or ','
        }
      }
      rows += frames;
      await flush();
    },
    async finish() {
      if (!headerDone) await writeHeader();
      await flush();
    },
  };
}
