import { BridgeworkError } from '@bridgework/core';
import { visibleWidth } from './textStyle.js';

/** One column of a text table. */
export interface TableColumn {
  /** Heading text. */
  readonly header: string;
  /** Alignment of the cells: numbers read best right-aligned. Default `'left'`. */
  readonly align?: 'left' | 'right';
}

/**
 * Lays out a text table for the terminal: a heading row, a rule, then the rows, with columns
 * separated by two spaces.
 *
 * @remarks
 * Widths are measured in terminal columns, ignoring colour codes, so cells may carry colour codes and characters
 * such as µ, ε or Ω. Missing cells are empty; extra cells are an error.
 *
 * @param columns - The columns.
 * @param rows - The cells, row by row.
 * @returns The table, one line per row, each ending with a newline.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` when a row has more cells than there are columns.
 * @example
 * ```ts
 * formatTable([{ header: 'source' }, { header: 'µε', align: 'right' }], [['noise', '0.42']]);
 * // 'source  µε\n──────  ────\nnoise   0.42\n'
 * ```
 */
export function formatTable(columns: readonly TableColumn[], rows: readonly (readonly string[])[]): string {
  rows.forEach((row, i) => {
    if (row.length > columns.length) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`rows[${i}]\` must have at most ${columns.length} cells; got ${row.length}`,
        { param: `rows[${i}]`, value: row.length, limit: columns.length },
      );
    }
  });
  const widths = columns.map((c, j) =>
    Math.max(visibleWidth(c.header), ...rows.map((r) => visibleWidth(r[j] ?? ''))),
  );
  const cell = (text: string, j: number): string => {
    const pad = ' '.repeat((widths[j] as number) - visibleWidth(text));
    return columns[j]?.align === 'right' ? pad + text : text + pad;
  };
  const line = (cells: readonly string[]): string =>
    columns
      .map((_, j) => cell(cells[j] ?? '', j))
      .join('  ')
      .trimEnd();
  const out = [
    line(columns.map((c) => c.header)),
    widths.map((w) => '─'.repeat(w)).join('  '),
    ...rows.map(line),
  ];
  return `${out.join('\n')}\n`;
}
