import { dimensionTable, dimensions } from '@bridgework/channel';

export const UNITS_START =
  '<!-- channel-units:start (generated from the unit table by `pnpm run docs:channel`) -->';
export const UNITS_END = '<!-- channel-units:end -->';

const cell = (s: string) => s.replace(/\|/g, '\\|');

/** The unit reference of docs/channel.md, generated from the channel package's unit table. */
export function unitTableMarkdown(): string {
  const rows = dimensions.map((d) => {
    const x = dimensionTable[d];
    const units = x.units.map((u) =>
      [u.symbol === '' ? '(plain number)' : `\`${u.symbol}\``, ...u.aliases.map((a) => `\`${a}\``)].join(' '),
    );
    return `| ${d} | ${x.si === '' ? '(plain number)' : `\`${x.si}\``} | ${cell(units.join(', '))} |`;
  });
  return [
    UNITS_START,
    '| dimension | the channel computes in | units accepted (symbol, then other spellings) |',
    '|---|---|---|',
    ...rows,
    UNITS_END,
  ].join('\n');
}

/** The table rows between the markers, cell padding removed (prettier aligns columns). */
export function normalizedRows(markdown: string): string[] {
  const start = markdown.indexOf(UNITS_START);
  const end = markdown.indexOf(UNITS_END);
  if (start < 0 || end < start) return [];
  return markdown
    .slice(start + UNITS_START.length, end)
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l.startsWith('|') && !/^\|[\s:|-]+\|$/.test(l))
    .map((l) =>
      l
        .split(/(?<!\\)\|/)
        .map((c) => c.trim())
        .join('|'),
    );
}

/** Replaces the table between the markers (or appends it with its markers). */
export function withUnitTable(markdown: string): string {
  const start = markdown.indexOf(UNITS_START);
  const end = markdown.indexOf(UNITS_END);
  if (start < 0 || end < start) throw new Error('channel unit table markers not found');
  return markdown.slice(0, start) + unitTableMarkdown() + markdown.slice(end + UNITS_END.length);
}
