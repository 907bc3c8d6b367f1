import { checkInteger, checkLength } from '@bridgework/core';
import { quoteCsvField } from '../internal/csvText.js';
import type { TextSink } from './textSink.js';

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

/**
 * A streamed CSV writer for converted values.
 *
 * @remarks
 * Each block becomes one text chunk (about 10–25 bytes per value), written to the sink before
 * the next block is converted, so memory stays bounded by the block size. Lines end with `\n`;
 * header names are quoted per RFC 4180 when they need it. NaN (a clipped or out-of-range sample)
 * is written as `nanText`; −0 is written as `0`.
 *
 * @param sink - Where the text goes.
 * @param channels - Values per row (integer in [1, 4096]).
 * @param options - Header, digits and NaN text.
 * @returns The writer.
 * @throws {@link BridgeworkError} `not-integer` or `out-of-range` (channels, digits), `invalid-shape`
 * (a header with the wrong number of names).
 * @example
 * ```ts
 * const writer = createCsvWriter(streamTextSink(process.stdout), 2, { header: ['hook (N)', 'trolley (N)'] });
 * await writer.writeBlock(Float64Array.of(1.5, 2, NaN, 4), 2); // hook (N),trolley (N)\n1.5,2\nNaN,4\n
 * ```
 */
export function createCsvWriter(sink: TextSink, channels: number, options: CsvWriterOptions = {}): CsvWriter {
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
  const format =
    digits === undefined
      ? (v: number): string => (v !== v ? nanText : String(v))
      : (v: number): string => (v !== v ? nanText : String(Number(v.toPrecision(digits))));
  let rows = 0;
  let headerDone = header === undefined;
  return {
    get rows() {
      return rows;
    },
    async writeBlock(values, frames) {
      checkInteger('frames', frames, { min: 0, max: Math.floor(values.length / channels) });
      let text = '';
      if (!headerDone) {
        text = header as string;
        headerDone = true;
      }
      const lines = new Array<string>(frames);
      if (channels === 1) {
        for (let f = 0; f < frames; f++) lines[f] = format(values[f] as number);
      } else {
        const cells = new Array<string>(channels);
        for (let f = 0; f < frames; f++) {
          const base = f * channels;
          for (let c = 0; c < channels; c++) cells[c] = format(values[base + c] as number);
          lines[f] = cells.join(',');
        }
      }
      if (frames > 0) text += `${lines.join('\n')}\n`;
      rows += frames;
      if (text.length > 0) await sink.write(text);
    },
    async finish() {
      if (!headerDone) {
        headerDone = true;
        await sink.write(header as string);
      }
    },
  };
}
