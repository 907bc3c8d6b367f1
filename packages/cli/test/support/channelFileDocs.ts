/**
 * The generated parts of the channel-file documentation: the field reference of
 * docs/channel-file.md (from the channel package's `channelSpecFields()`) and the JSON Schema
 * file packages/cli/schema/channel-file.schema.json (from `channelFileJsonSchema()`), both
 * formatted by prettier exactly as `pnpm format` would.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { channelSpecFields } from '@bridgework/channel';
import { format, resolveConfig } from 'prettier';
import { channelFileJsonSchema } from '../../src/channels/channelFileJsonSchema.js';

export const channelFileDocsPath = fileURLToPath(
  new URL('../../../../docs/channel-file.md', import.meta.url),
);
export const schemaPath = fileURLToPath(new URL('../../schema/channel-file.schema.json', import.meta.url));
export const fieldsStart =
  '<!-- channel-file-fields:start (generated from the channel schema by `pnpm --filter bridgework docs:cli`; do not edit) -->';
export const fieldsEnd = '<!-- channel-file-fields:end -->';

const cell = (s: string): string => s.replace(/\\\|/g, '|').replace(/\|/g, '\\|');

/** The field reference: one row per field of a channel, paths relative to the channel. */
export function channelFieldTable(): string {
  const rows = channelSpecFields()
    .filter((r) => r.path !== 'name')
    .map(
      (r) =>
        `| \`${r.path}\` | ${cell(r.type)} | ${r.unit === '' ? '' : `\`${r.unit}\``} | ${cell(r.presence)} | ${cell(r.doc)} |`,
    );
  return ['| field | type | unit | default | meaning |', '|---|---|---|---|---|', ...rows].join('\n');
}

async function prettierFormat(text: string, path: string): Promise<string> {
  const config = (await resolveConfig(path)) ?? {};
  return format(text, { ...config, filepath: path });
}

/** docs/channel-file.md with its field reference replaced by the generated one. */
export async function regeneratedChannelFileDocs(): Promise<string> {
  const current = readFileSync(channelFileDocsPath, 'utf8');
  const start = current.indexOf(fieldsStart);
  const end = current.indexOf(fieldsEnd);
  if (start < 0 || end < start)
    throw new Error(`${channelFileDocsPath}: the field-reference markers are missing`);
  const spliced = `${current.slice(0, start + fieldsStart.length)}\n\n${channelFieldTable()}\n\n${current.slice(end)}`;
  return prettierFormat(spliced, channelFileDocsPath);
}

/** The JSON Schema file's text. */
export async function regeneratedSchema(): Promise<string> {
  return prettierFormat(`${JSON.stringify(channelFileJsonSchema(), null, 2)}\n`, schemaPath);
}
