import { createReadStream } from 'node:fs';
import { BridgeworkError } from '@bridgework/core';
import { checkBlock } from '../internal/checkBlock.js';
import { CsvRecordReader, CsvSyntaxError, type CsvRecord } from '../internal/csvRecords.js';
import { isNumberText, parseCodeText, parseNumberText } from '../internal/csvText.js';
import { describeFsError, openInput, statInput } from '../internal/fileErrors.js';
import type { CodeSource, RecordingBlock } from './codeSource.js';

/** A CSV column: its header name, or its number counted from 1. */
export type CsvColumn = string | number;

/** Options of {@link openCsvCodes}. */
export interface CsvCodeOptions {
  /** Frames (rows) per block (integer ≥ 1; at most 2^24 codes per block). Default 65 536. */
  readonly blockFrames?: number;
  /**
   * The columns that hold codes, in the order of the channels. Default: every column but the time
   * column and the kept columns.
   */
  readonly columns?: readonly CsvColumn[];
  /** A column of time in seconds (decimal numbers), kept as the time column. Default none. */
  readonly timeColumn?: CsvColumn;
  /**
   * Columns passed through to the output as text, or `'none'`. Default: every column that is
   * neither a code column nor the time column.
   */
  readonly keep?: readonly CsvColumn[] | 'none';
}

/** Longest first line searched for the header, in bytes. */
const HEAD_BYTES = 1 << 20;

function parseError(message: string, file: string): BridgeworkError {
  return new BridgeworkError('parse-error', message, { param: file });
}

/** The first record of the file (from its first MiB) and the delimiter it implies. */
async function firstRecord(
  file: string,
): Promise<{ record: CsvRecord; delimiter: string | undefined } | undefined> {
  const handle = await openInput(file);
  try {
    const bytes = new Uint8Array(HEAD_BYTES);
    const { bytesRead } = await handle.read(bytes, 0, bytes.length, 0);
    let text = new TextDecoder('utf-8').decode(bytes.subarray(0, bytesRead)).replace(/^\uFEFF/, '');
    if (bytesRead === bytes.length) text = text.slice(0, Math.max(0, text.lastIndexOf('\n') + 1));
    const firstLine = text.split('\n').find((l) => l.trim() !== '');
    if (firstLine === undefined) {
      if (bytesRead === bytes.length)
        throw parseError(`${file}:1: the first line is longer than 1 MiB`, file);
      return undefined;
    }
    const delimiter = detectDelimiter(firstLine);
    // Feed line by line until the first record is complete (it may span lines inside quotes).
    const reader = new CsvRecordReader(delimiter);
    for (const line of text.split(/(?<=\n)/)) {
      const record = reader.push(line)[0];
      if (record !== undefined) return { record, delimiter };
    }
    const record = bytesRead < bytes.length ? reader.end()[0] : undefined;
    return record === undefined ? undefined : { record, delimiter };
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw parseError(`${file}:${e.line}: ${e.message}`, file);
    throw e;
  } finally {
    await handle.close();
  }
}

/** The first of comma, tab and semicolon outside quotes in a line; `undefined` for none. */
function detectDelimiter(line: string): string | undefined {
  const unquoted = line.replace(/"(?:[^"]|"")*"?/g, '');
  for (const d of [',', '\t', ';']) if (unquoted.includes(d)) return d;
  return undefined;
}

/**
 * Opens a CSV recording of converter codes (one row per frame) for reading in fixed-size blocks.
 *
 * @remarks
 * - **Syntax**: RFC 4180 in every row: double-quoted fields may hold delimiters, line breaks and
 *   doubled quotes; CRLF or LF line ends; a UTF-8 byte-order mark is ignored; blank lines are
 *   skipped. The delimiter is the first of comma, tab and semicolon outside quotes in the first
 *   non-blank line (none: a single column).
 * - **Header (optional)**: the first record is a header when none of its fields is a number.
 * - **Code columns**: each selected field must be a decimal integer in [−2^31, 2^32 − 1], quoted or
 *   not (a code ≥ 2^31 is an unsigned 32-bit code and stays positive). Codes are held as doubles,
 *   which holds each of them exactly.
 * - **Time column** (optional): decimal numbers, read as seconds.
 * - **Kept columns**: passed through as text, exactly as written (quotes removed).
 * - **Errors** name the file, the line and the column: `codes.csv:17: column 3 (load): '12.5' is
 *   not an integer code`. They surface while reading, so the caller must discard partial output
 *   (an atomic output file does).
 *
 * The file is streamed: memory is one block of codes and kept text plus one 64 KiB chunk of text.
 *
 * @param file - The file path.
 * @param options - Block size, code columns, time column, kept columns.
 * @returns The opened source; read it with `blocks()`.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable file, with the
 * reason in words), `parse-error` (empty file, unknown column, a bad field or record while reading),
 * `invalid-option` (a column selected twice, or no code column left).
 * @example
 * ```ts
 * const source = await openCsvCodes('hook-log.csv', { columns: ['hook'], timeColumn: 'seconds' });
 * for await (const block of source.blocks()) console.log(block.codes[0]);
 * ```
 */
export async function openCsvCodes(file: string, options: CsvCodeOptions = {}): Promise<CodeSource> {
  const totalBytes = await statInput(file);
  const first = await firstRecord(file);
  if (first === undefined) throw parseError(`${file} is empty: it holds neither a header nor codes`, file);
  const { delimiter } = first;
  const fields = first.record.fields;
  const hasHeader = fields.every((f) => !isNumberText(f));
  const width = fields.length;
  const header = hasHeader ? fields : undefined;
  const plural = width === 1 ? '' : 's';

  const indexOf = (c: CsvColumn, what: string): number => {
    if (typeof c === 'number') {
      if (!Number.isInteger(c) || c < 1 || c > width) {
        throw parseError(
          `${file}: there is no column ${c} (${what}); the file has ${width} column${plural}`,
          file,
        );
      }
      return c - 1;
    }
    if (header === undefined) {
      throw parseError(
        `${file}: column '${c}' (${what}) is named, but the file has no header line; give column numbers`,
        file,
      );
    }
    const i = header.indexOf(c);
    if (i < 0) {
      throw parseError(
        `${file}: there is no column '${c}' (${what}); the header names ${header.map((h) => `'${h}'`).join(', ')}`,
        file,
      );
    }
    return i;
  };
  const time = options.timeColumn === undefined ? undefined : indexOf(options.timeColumn, 'time');
  const keepOption = options.keep === 'none' ? [] : options.keep?.map((c) => indexOf(c, 'kept'));
  const selected =
    options.columns === undefined
      ? fields.map((_, i) => i).filter((i) => i !== time && !(keepOption ?? []).includes(i))
      : options.columns.map((c) => indexOf(c, 'codes'));
  const kept = keepOption ?? fields.map((_, i) => i).filter((i) => i !== time && !selected.includes(i));
  const used = [...selected, ...kept, ...(time === undefined ? [] : [time])];
  const dup = used.find((c, k) => used.indexOf(c) !== k);
  if (dup !== undefined) {
    throw new BridgeworkError(
      'invalid-option',
      `column ${dup + 1} is selected for two uses (codes, time, kept)`,
      {
        param: 'columns',
        value: dup + 1,
      },
    );
  }
  if (selected.length === 0) {
    throw new BridgeworkError('invalid-option', `${file}: no column is left to hold codes`, {
      param: 'columns',
    });
  }
  const channels = selected.length;
  const blockFrames = checkBlock(channels, options.blockFrames);
  const name = (c: number): string => (header === undefined ? `column ${c + 1}` : (header[c] as string));
  const describeColumn = (c: number): string =>
    header === undefined ? `column ${c + 1}` : `column ${c + 1} (${header[c] as string})`;

  return {
    file,
    format: 'csv',
    channels,
    columnNames: header === undefined ? undefined : selected.map((c) => header[c] as string),
    timeColumn: time === undefined ? undefined : { name: name(time), type: 'seconds' },
    passThroughNames: kept.map(name),
    blockFrames,
    totalBytes,
    totalFrames: undefined,
    async *blocks() {
      const codes = new Float64Array(blockFrames * channels);
      const stamps = time === undefined ? undefined : new Float64Array(blockFrames);
      const texts = kept.map(() => new Array<string>(blockFrames).fill(''));
      const stream = createReadStream(file, { highWaterMark: 1 << 16 });
      const decoder = new TextDecoder('utf-8', { fatal: true });
      const reader = new CsvRecordReader(delimiter);
      let bytes = 0;
      let filled = 0;
      let frame = 0;
      let start = true;
      let headerSkipped = !hasHeader;
      const take = (record: CsvRecord): void => {
        if (!headerSkipped) {
          headerSkipped = true;
          return;
        }
        const parts = record.fields;
        if (parts.length !== width) {
          throw parseError(
            `${file}:${record.line}: expected ${width} field${plural}, got ${parts.length}`,
            file,
          );
        }
        for (let k = 0; k < channels; k++) {
          const c = selected[k] as number;
          const text = parts[c] as string;
          const v = parseCodeText(text);
          if (v === undefined) {
            throw parseError(
              `${file}:${record.line}: ${describeColumn(c)}: '${text}' is not an integer code (a whole number from −2^31 to 2^32 − 1)`,
              file,
            );
          }
          codes[k * blockFrames + filled] = v;
        }
        if (stamps !== undefined) {
          const text = parts[time as number] as string;
          const v = parseNumberText(text);
          if (v === undefined) {
            throw parseError(
              `${file}:${record.line}: ${describeColumn(time as number)}: '${text}' is not a time in seconds (a decimal number)`,
              file,
            );
          }
          stamps[filled] = v;
        }
        for (let k = 0; k < kept.length; k++)
          (texts[k] as string[])[filled] = parts[kept[k] as number] as string;
        filled++;
      };
      const block = (): RecordingBlock => ({
        frames: filled,
        firstFrame: frame,
        bytesRead: bytes,
        codes,
        laneStride: blockFrames,
        timeStamps: stamps,
        passThrough: kept.length === 0 ? undefined : texts,
      });
      try {
        for await (const chunk of stream as AsyncIterable<Buffer>) {
          bytes += chunk.length;
          let text: string;
          try {
            text = decoder.decode(chunk, { stream: true });
          } catch {
            throw parseError(`${file}:${reader.nextLine}: the file is not valid UTF-8 text`, file);
          }
          if (start) {
            text = text.replace(/^\uFEFF/, '');
            start = false;
          }
          for (const record of reader.push(text)) {
            take(record);
            if (filled === blockFrames) {
              yield block();
              frame += filled;
              filled = 0;
            }
          }
        }
        for (const record of [...reader.push(decoder.decode()), ...reader.end()]) {
          take(record);
          if (filled === blockFrames) {
            yield block();
            frame += filled;
            filled = 0;
          }
        }
        if (filled > 0) yield block();
      } catch (e) {
        if (e instanceof BridgeworkError) throw e;
        if (e instanceof CsvSyntaxError) throw parseError(`${file}:${e.line}: ${e.message}`, file);
        throw new BridgeworkError('io-error', `cannot read ${file}: ${describeFsError(e)}`, {
          param: file,
          cause: e,
        });
      } finally {
        stream.destroy();
      }
    },
  };
}
