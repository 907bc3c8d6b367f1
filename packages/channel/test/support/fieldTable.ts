import { channelSpecFields } from '@bridgework/channel';

export const FIELDS_START =
  '<!-- channel-fields:start (generated from the spec schema by `pnpm run docs:channel`) -->';
export const FIELDS_END = '<!-- channel-fields:end -->';

const cell = (s: string) => s.replace(/\|/g, '\\|').replace(/\\\\\|/g, '\\|');

/** The field reference of docs/channel.md, generated from the schema that validates specs. */
export function fieldTable(): string {
  const rows = channelSpecFields().map(
    (r) =>
      `| \`${r.path}\` | ${cell(r.type)} | ${r.unit === '' || r.unit === '1' ? '' : r.unit} | ${cell(r.presence)} | ${cell(r.doc)} |`,
  );
  return [
    FIELDS_START,
    '| field | type | unit | default | meaning |',
    '|---|---|---|---|---|',
    ...rows,
    FIELDS_END,
  ].join('\n');
}

/** The table rows between the markers, cell padding removed (prettier aligns columns). */
export function normalizedRows(markdown: string): string[] {
  const start = markdown.indexOf(FIELDS_START);
  const end = markdown.indexOf(FIELDS_END);
  if (start < 0 || end < start) return [];
  return markdown
    .slice(start + FIELDS_START.length, end)
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

/** Replaces the table between the markers. */
export function withFieldTable(markdown: string): string {
  const start = markdown.indexOf(FIELDS_START);
  const end = markdown.indexOf(FIELDS_END);
  if (start < 0 || end < start) throw new Error('channel field table markers not found');
  return markdown.slice(0, start) + fieldTable() + markdown.slice(end + FIELDS_END.length);
}
