import { errorCodeDescriptions, errorCodes } from '@bridgework/core';

export const ERROR_TABLE_START =
  '<!-- error-codes:start (generated from errorCodeDescriptions by `pnpm run docs:codes`) -->';
export const ERROR_TABLE_END = '<!-- error-codes:end -->';

/** The markdown table of every error code, as docs/errors.md and DEVELOPERS.md hold it. */
export function errorTable(): string {
  const rows = errorCodes.map((code) => `| \`${code}\` | ${errorCodeDescriptions[code]} |`);
  return [ERROR_TABLE_START, '| code | meaning |', '|---|---|', ...rows, ERROR_TABLE_END].join('\n');
}

/** Replaces the table between the markers in a markdown text. */
export function withErrorTable(markdown: string): string {
  const start = markdown.indexOf(ERROR_TABLE_START);
  const end = markdown.indexOf(ERROR_TABLE_END);
  if (start < 0 || end < start) throw new Error('error-code table markers not found');
  return markdown.slice(0, start) + errorTable() + markdown.slice(end + ERROR_TABLE_END.length);
}

/** The table rows between the markers, with cell padding removed (prettier aligns columns). */
export function normalizedTable(markdown: string): string[] {
  const start = markdown.indexOf(ERROR_TABLE_START);
  const end = markdown.indexOf(ERROR_TABLE_END);
  if (start < 0 || end < start) return [];
  return markdown
    .slice(start + ERROR_TABLE_START.length, end)
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line.startsWith('|') && !/^\|[\s:|-]+\|$/.test(line))
    .map((line) =>
      line
        .split('|')
        .map((cell) => cell.trim())
        .join('|'),
    );
}
