import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { BridgeworkError, closestName, type SpecIssue } from '@bridgework/core';
import { parseQuantity } from '@bridgework/channel';
import { CsvRecordReader, CsvSyntaxError } from '../internal/csvRecords.js';
import { describeFsError } from '../internal/fileErrors.js';

/** The most rows a schedule or test file may hold. */
export const MAX_TABLE_ROWS = 100_000;

/** A column the table must or may have. */
export interface TableColumnSpec {
  /** The heading's name (before any `[unit]`). */
  readonly name: string;
  /** The unit its numbers are converted to; `undefined` for a text column. */
  readonly unit?: string;
  /** Whether the column must be present. */
  readonly required: boolean;
}

/** A table read from a CSV file: numbers converted to each column's unit. */
export interface GroupTable {
  /** Per column name, the converted numbers (or the texts for text columns), one per row. */
  readonly numbers: ReadonlyMap<string, readonly number[]>;
  /** Text columns. */
  readonly texts: ReadonlyMap<string, readonly string[]>;
  /** The line of each row in the file. */
  readonly lines: readonly number[];
  /** SHA-256 of the file's bytes (hexadecimal), to record which file a calibration came from. */
  readonly sha256: string;
}

/**
 * Reads a small CSV table (a loading schedule, an eccentricity test): a heading row of names,
 * each optionally with its unit in brackets (`Fx [kN]`, `b1 [mV/V]`), then one row per point.
 * Lines starting with `#` are comments. A number without a unit in the heading is taken in the
 * column's own unit. Every problem names the file, its line and the column.
 *
 * @param file - The path (resolved by the caller).
 * @param shownAs - The path as the user wrote it, for messages.
 * @param columns - The columns expected.
 * @returns The table, or the issues found (path is the file and line).
 */
export async function readGroupTable(
  file: string,
  shownAs: string,
  columns: readonly TableColumnSpec[],
): Promise<{ readonly table?: GroupTable; readonly issues: readonly SpecIssue[] }> {
  let text: string;
  let sha256: string;
  try {
    const bytes = await readFile(file);
    sha256 = createHash('sha256').update(bytes).digest('hex');
    text = bytes.toString('utf8');
  } catch (e) {
    throw new BridgeworkError('io-error', `cannot read ${shownAs}: ${describeFsError(e)}`, {
      param: shownAs,
    });
  }
  const issues: SpecIssue[] = [];
  const at = (line: number, column?: string): string =>
    `${shownAs}:${line}${column === undefined ? '' : ` (${column})`}`;
  const reader = new CsvRecordReader(',');
  let records;
  try {
    records = [...reader.push(text.replace(/^\uFEFF/, '')), ...reader.end()].filter(
      (r) => !(r.fields[0] ?? '').startsWith('#'),
    );
  } catch (e) {
    if (!(e instanceof CsvSyntaxError)) throw e;
    return { issues: [{ code: 'parse-error', path: at(e.line), message: e.message }] };
  }
  const head = records[0];
  if (head === undefined) {
    return {
      issues: [
        { code: 'parse-error', path: shownAs, message: 'is empty: expected a heading row of column names' },
      ],
    };
  }
  if (records.length - 1 > MAX_TABLE_ROWS) {
    return {
      issues: [
        {
          code: 'out-of-range',
          path: shownAs,
          message: `holds ${records.length - 1} rows`,
          limit: `${MAX_TABLE_ROWS} rows`,
          suggestion: 'average repeated readings per load point before fitting',
        },
      ],
    };
  }
  const known = columns.map((c) => c.name);
  const headings = head.fields.map((f) => {
    const m = /^(.*?)\s*(?:\[(.*)\])?$/.exec(f) as RegExpExecArray;
    return { name: (m[1] ?? '').trim(), unit: m[2]?.trim() };
  });
  headings.forEach((h, i) => {
    if (!known.includes(h.name)) {
      const near = closestName(h.name, known);
      issues.push({
        code: 'unknown-option',
        path: at(head.line, `column ${i + 1}`),
        message: `'${h.name}' is not a column of this table`,
        ...(near === undefined
          ? { expected: `columns ${known.join(', ')}` }
          : { suggestion: `did you mean '${near}'?` }),
      });
    } else if (headings.findIndex((x) => x.name === h.name) !== i) {
      issues.push({
        code: 'invalid-option',
        path: at(head.line, h.name),
        message: `column '${h.name}' is given twice`,
      });
    }
  });
  for (const c of columns) {
    if (c.required && !headings.some((h) => h.name === c.name))
      issues.push({
        code: 'missing-option',
        path: at(head.line),
        message: `has no column '${c.name}'`,
        expected: `a heading such as '${c.name}${c.unit === undefined ? '' : ` [${c.unit}]`}'`,
      });
  }
  if (issues.length > 0) return { issues };
  const rows = records.slice(1);
  if (rows.length === 0)
    return { issues: [{ code: 'too-few-points', path: shownAs, message: 'has a heading but no rows' }] };
  const numbers = new Map<string, number[]>();
  const texts = new Map<string, string[]>();
  headings.forEach((h, i) => {
    const spec = columns.find((c) => c.name === h.name) as TableColumnSpec;
    if (spec.unit === undefined) {
      texts.set(
        h.name,
        rows.map((r) => r.fields[i] ?? ''),
      );
      return;
    }
    const target = spec.unit;
    // The heading's unit must be one the column's unit converts from.
    if (h.unit !== undefined) {
      try {
        parseQuantity(`1 ${h.unit}`, target);
      } catch (e) {
        issues.push({
          code: 'invalid-option',
          path: at(head.line, h.name),
          message: `the unit '${h.unit}' does not convert to ${target}: ${(e as Error).message}`,
        });
        return;
      }
    }
    const values: number[] = [];
    for (const r of rows) {
      const cell = r.fields[i];
      if (r.fields.length !== headings.length) {
        issues.push({
          code: 'invalid-shape',
          path: at(r.line),
          message: `has ${r.fields.length} fields; the heading has ${headings.length}`,
        });
        return;
      }
      let v = NaN;
      if (cell !== undefined && /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(cell)) {
        try {
          v = h.unit === undefined ? Number(cell) : parseQuantity(`${cell} ${h.unit}`, target);
        } catch {
          v = NaN;
        }
      }
      if (!Number.isFinite(v) || Math.abs(v) > 1e100) {
        issues.push({
          code: 'parse-error',
          path: at(r.line, h.name),
          message: `'${cell ?? ''}' is not a finite number`,
          expected: 'a decimal number (the unit is in the heading)',
        });
        if (issues.length >= 20) return;
        continue;
      }
      values.push(v);
    }
    numbers.set(h.name, values);
  });
  if (issues.length > 0) return { issues };
  return { table: { numbers, texts, lines: rows.map((r) => r.line), sha256 }, issues };
}
