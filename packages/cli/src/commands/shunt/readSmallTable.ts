/**
 * A small CSV table of a test day (shunt readings, calibration points): RFC 4180 records with a
 * header row, read whole (at most 16 MiB), each cell addressed by column name, every problem
 * reported with the file, line and column.
 */
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { BridgeworkError } from '@bridgework/core';
import { CsvRecordReader, CsvSyntaxError, type CsvRecord } from '../../internal/csvRecords.js';
import { parseNumberText } from '../../internal/csvText.js';
import { describeFsError } from '../../internal/fileErrors.js';

/** Largest table read, bytes. */
export const MAX_TABLE_BYTES = 16 * 1024 * 1024;

/** A table read by {@link readSmallTable}. */
export interface SmallTable {
  /** The file as given. */
  readonly file: string;
  /** SHA-256 of its bytes, hexadecimal. */
  readonly sha256: string;
  /** Column names of the header row (trimmed, lower case). */
  readonly columns: readonly string[];
  /** The data rows (blank lines and lines starting with # are skipped). */
  readonly rows: readonly CsvRecord[];
  /** The column's index, or −1. */
  column(name: string): number;
  /** A number cell, or a `parse-error` naming the file, line and column. */
  number(row: CsvRecord, column: number): number;
  /** A text cell (trimmed), `''` when absent. */
  text(row: CsvRecord, column: number): string;
}

function parseError(file: string, line: number, message: string): BridgeworkError {
  return new BridgeworkError('parse-error', `${file}:${line}: ${message}`, { param: file });
}

/**
 * Reads a small CSV table with a header row.
 *
 * @param file - The path.
 * @param required - Column names that must be present.
 * @returns The table.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable); `parse-error`
 *   (too large, not UTF-8, bad CSV, a missing column, no data rows).
 */
export async function readSmallTable(file: string, required: readonly string[]): Promise<SmallTable> {
  let bytes: Buffer;
  try {
    bytes = await readFile(file);
  } catch (e) {
    throw new BridgeworkError('io-error', `cannot read ${file}: ${describeFsError(e)}`, {
      param: file,
      cause: e,
    });
  }
  if (bytes.length > MAX_TABLE_BYTES) {
    throw new BridgeworkError('parse-error', `${file} is larger than ${MAX_TABLE_BYTES} bytes (16 MiB)`, {
      param: file,
    });
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes).replace(/^\uFEFF/, '');
  } catch (e) {
    throw new BridgeworkError('parse-error', `${file} is not UTF-8 text`, { param: file, cause: e });
  }
  const reader = new CsvRecordReader(',');
  let records: CsvRecord[];
  try {
    records = [...reader.push(text), ...reader.end()];
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw parseError(file, e.line, e.message);
    throw e;
  }
  records = records.filter(
    (r) => !(r.fields.every((f) => f.trim() === '') || (r.fields[0] ?? '').trim().startsWith('#')),
  );
  const header = records.shift();
  if (header === undefined) throw parseError(file, 1, 'no header row');
  const written = header.fields.map((f) => f.trim());
  const columns = written.map((f) => f.toLowerCase());
  for (const name of required) {
    if (!columns.includes(name)) {
      // A header with a unit ('temperature (°C)') is not matched: the unit would go unread.
      const withUnit = written.find((w) => w.toLowerCase().replace(/\s*\(.*\)\s*$/, '') === name);
      const hint =
        withUnit === undefined
          ? ''
          : `; write '${name}' without the unit in brackets ('${withUnit}'): units are not read from a header (the command's help says how to state them)`;
      throw parseError(
        file,
        header.line,
        `the header must name a column '${name}'; it names ${written.map((c) => `'${c}'`).join(', ')}${hint}`,
      );
    }
  }
  if (records.length === 0) throw parseError(file, header.line, 'no data rows after the header');
  return {
    file,
    sha256: createHash('sha256').update(bytes).digest('hex'),
    columns,
    rows: records,
    column: (name) => columns.indexOf(name),
    number(row, column) {
      const cell = (row.fields[column] ?? '').trim();
      const value = parseNumberText(cell);
      if (value === undefined) {
        throw parseError(
          file,
          row.line,
          `column '${columns[column]}' must hold a finite number; got '${cell}'`,
        );
      }
      return value;
    },
    text: (row, column) => (column < 0 ? '' : (row.fields[column] ?? '').trim()),
  };
}
