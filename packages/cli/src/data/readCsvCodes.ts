import { createReadStream } from 'node:fs';
import { BridgeworkError } from '@bridgework/core';
import { checkBlock } from '../internal/checkBlock.js';
import { isNumberText, parseInt32Text, splitCsvLine } from '../internal/csvText.js';
import { describeFsError, openInput, statInput } from '../internal/fileErrors.js';
import type { CodeBlock, CodeSource } from './codeSource.js';

/** Options of {@link openCsvCodes}. */
export interface CsvCodeOptions {
  /** Frames (rows) per block (integer ≥ 1; at most 2^24 codes per block). Default 65 536. */
  readonly blockFrames?: number;
  /**
   * The columns that hold codes, in the order of the channels: header names, or column numbers
   * counted from 1. Default: every column. Other columns (a time stamp, say) are skipped unread.
   */
  readonly columns?: readonly (string | number)[];
}

/** Longest line accepted, in characters (bounds memory on a file without line breaks). */
const MAX_LINE = 1 << 20;

function parseError(message: string, file: string): BridgeworkError {
  return new BridgeworkError('parse-error', message, { param: file });
}

/** Reads up to `MAX_LINE` bytes from the start of the file and returns the first non-blank line. */
async function firstLine(file: string): Promise<{ text: string; line: number } | undefined> {
  const handle = await openInput(file);
  try {
    const bytes = new Uint8Array(MAX_LINE + 4);
    const { bytesRead } = await handle.read(bytes, 0, bytes.length, 0);
    const text = new TextDecoder('utf-8').decode(bytes.subarray(0, bytesRead)).replace(/^\uFEFF/, '');
    const lines = text.split('\n');
    const complete = bytesRead < bytes.length ? lines : lines.slice(0, -1);
    for (let i = 0; i < complete.length; i++) {
      const line = (complete[i] as string).replace(/\r$/, '');
      if (line.trim() !== '') return { text: line, line: i + 1 };
    }
    if (bytesRead === bytes.length) throw parseError(`${file}:1: the first line is longer than 1 MiB`, file);
    return undefined;
  } finally {
    await handle.close();
  }
}

function detectDelimiter(line: string): string | undefined {
  for (const d of [',', '\t', ';']) if (line.includes(d)) return d;
  return undefined;
}

/**
 * Opens a CSV file of converter codes (one row per frame, one column per channel) for reading
 * in fixed-size blocks.
 *
 * @remarks
 * - **Delimiter**: the first of comma, tab and semicolon that appears in the first non-blank
 *   line; a line with none of them is a single column.
 * - **Header (optional)**: the first non-blank line is a header when none of its fields is a
 *   number (names may be double-quoted), data when it holds numbers; a line that mixes names
 *   and numbers is an error. A UTF-8 byte-order mark is ignored.
 * - **Rows**: every non-blank row must have as many fields as the first line; each selected
 *   field must be a decimal integer in [−2^31, 2^31 − 1] (a converter code); unselected
 *   columns are not parsed. Blank lines are skipped; CRLF line ends are accepted.
 * - **Errors** name the file, the line and the column: `codes.csv:17: column 3 (load): '12.5'
 *   is not a 32-bit integer code`. They surface while reading, so the caller must discard
 *   partial output (an atomic output file does).
 *
 * The file is streamed: memory is one block of codes plus one 64 KiB chunk of text.
 *
 * @param file - The file path.
 * @param options - Block size and selected columns.
 * @returns The opened source; read it with `blocks()`.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable file), `parse-error` (empty
 * file, mixed header, unknown column name or number, a bad field while reading),
 * `invalid-option` (a column selected twice).
 * @example
 * ```ts
 * const source = await openCsvCodes('hook-codes.csv', { columns: ['hook'] });
 * for await (const block of source.blocks()) console.log(block.codes[0]);
 * ```
 */
export async function openCsvCodes(file: string, options: CsvCodeOptions = {}): Promise<CodeSource> {
  const totalBytes = await statInput(file);
  const first = await firstLine(file);
  if (first === undefined) throw parseError(`${file} is empty: it holds neither a header nor codes`, file);
  const delimiter = detectDelimiter(first.text);
  const fields = splitCsvLine(first.text, delimiter);
  const numeric = fields.map(isNumberText);
  const hasHeader = numeric.every((n) => !n);
  if (!hasHeader && numeric.some((n) => !n)) {
    throw parseError(
      `${file}:${first.line}: the first line mixes names and numbers; a header line holds only column names`,
      file,
    );
  }
  const width = fields.length;
  const header = hasHeader ? fields : undefined;

  const selected: number[] = (options.columns ?? fields.map((_, i) => i + 1)).map((c) => {
    if (typeof c === 'number') {
      if (!Number.isInteger(c) || c < 1 || c > width) {
        throw parseError(
          `${file}: there is no column ${c}; the file has ${width} column${width === 1 ? '' : 's'}`,
          file,
        );
      }
      return c - 1;
    }
    if (header === undefined) {
      throw parseError(
        `${file}: column '${c}' is named, but the file has no header line; give column numbers`,
        file,
      );
    }
    const i = header.indexOf(c);
    if (i < 0) {
      throw parseError(
        `${file}: there is no column '${c}'; the header names ${header.map((h) => `'${h}'`).join(', ')}`,
        file,
      );
    }
    return i;
  });
  const dup = selected.find((c, k) => selected.indexOf(c) !== k);
  if (dup !== undefined) {
    throw new BridgeworkError('invalid-option', `column ${dup + 1} is selected more than once`, {
      param: 'columns',
      value: dup + 1,
    });
  }
  const channels = selected.length;
  const blockFrames = checkBlock(channels, options.blockFrames);
  const describeColumn = (c: number): string =>
    header === undefined ? `column ${c + 1}` : `column ${c + 1} (${header[c] as string})`;

  return {
    file,
    format: 'csv',
    channels,
    columnNames: header === undefined ? undefined : selected.map((c) => header[c] as string),
    blockFrames,
    totalBytes,
    totalFrames: undefined,
    async *blocks() {
      const codes = new Int32Array(blockFrames * channels);
      const stream = createReadStream(file, { highWaterMark: 1 << 16 });
      const decoder = new TextDecoder('utf-8', { fatal: true });
      let rest = '';
      let lineNo = 0;
      let bytes = 0;
      let filled = 0;
      let frame = 0;
      let start = true;
      const take = (raw: string): void => {
        lineNo++;
        const line = raw.endsWith('\r') ? raw.slice(0, -1) : raw;
        if (lineNo === first.line && hasHeader) return;
        if (line.trim() === '') return;
        const parts = delimiter === undefined ? [line] : line.split(delimiter);
        if (parts.length !== width) {
          throw parseError(
            `${file}:${lineNo}: expected ${width} field${width === 1 ? '' : 's'}, got ${parts.length}`,
            file,
          );
        }
        const base = filled * channels;
        for (let k = 0; k < channels; k++) {
          const c = selected[k] as number;
          const text = parts[c] as string;
          const v = parseInt32Text(text);
          if (v === undefined) {
            throw parseError(
              `${file}:${lineNo}: ${describeColumn(c)}: '${text.trim()}' is not a 32-bit integer code`,
              file,
            );
          }
          codes[base + k] = v;
        }
        filled++;
      };
      const block = (): CodeBlock => ({
        codes: filled === blockFrames ? codes : codes.subarray(0, filled * channels),
        frames: filled,
        firstFrame: frame,
        bytesRead: bytes,
      });
      try {
        for await (const chunk of stream as AsyncIterable<Buffer>) {
          bytes += chunk.length;
          let text: string;
          try {
            text = rest + decoder.decode(chunk, { stream: true });
          } catch (e) {
            throw parseError(`${file}:${lineNo + 1}: the file is not valid UTF-8 text`, file);
          }
          if (start) {
            text = text.replace(/^\uFEFF/, '');
            start = false;
          }
          let from = 0;
          for (;;) {
            const nl = text.indexOf('\n', from);
            if (nl < 0) break;
            take(text.slice(from, nl));
            from = nl + 1;
            if (filled === blockFrames) {
              yield block();
              frame += filled;
              filled = 0;
            }
          }
          rest = text.slice(from);
          if (rest.length > MAX_LINE)
            throw parseError(`${file}:${lineNo + 1}: the line is longer than 1 MiB`, file);
        }
        rest += decoder.decode();
        if (rest.length > 0) take(rest);
        if (filled > 0) yield block();
      } catch (e) {
        if (e instanceof BridgeworkError) throw e;
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
