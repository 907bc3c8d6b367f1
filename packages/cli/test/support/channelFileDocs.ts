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
import { groupsJsonSchema } from '../../src/groups/groupsJsonSchema.js';

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

type SchemaNode = Record<string, unknown>;

/** A JSON Schema fragment's type, in the words of the channel table. */
function schemaType(node: SchemaNode): string {
  if (node['const'] !== undefined) return `'${String(node['const'])}'`;
  if (Array.isArray(node['enum']))
    return (node['enum'] as unknown[]).map((v) => `'${String(v)}'`).join(' | ');
  const type = node['type'];
  if (Array.isArray(type)) {
    if (type.includes('array')) return 'number or text with a unit, or a list of them';
    return type.includes('string') ? 'number or text with a unit' : type.join(' or ');
  }
  if (type === 'array') {
    const items = (node['items'] ?? {}) as SchemaNode;
    if (items['type'] === 'array') return 'matrix of numbers (a list of rows)';
    const count =
      node['minItems'] !== undefined && node['maxItems'] !== undefined
        ? `${String(node['minItems'])} to ${String(node['maxItems'])} `
        : '';
    return `list of ${count}${items['type'] === 'number' ? 'numbers' : items['type'] === 'string' ? 'texts' : 'names or numbers'}`;
  }
  if (type === 'object') return node['properties'] === undefined ? 'mapping' : 'object';
  if (type === 'integer') {
    const range = [
      node['minimum'] === undefined ? undefined : `>= ${String(node['minimum'])}`,
      node['maximum'] === undefined ? undefined : `<= ${String(node['maximum'])}`,
    ].filter((x) => x !== undefined);
    return range.length === 0 ? 'integer' : `integer (${range.join(' and ')})`;
  }
  if (type === 'number') {
    const range = [
      node['exclusiveMinimum'] === undefined ? undefined : `> ${String(node['exclusiveMinimum'])}`,
      node['maximum'] === undefined ? undefined : `<= ${String(node['maximum'])}`,
    ].filter((x) => x !== undefined);
    return range.length === 0 ? 'number' : `number (${range.join(' and ')})`;
  }
  if (type === 'string') return 'text';
  if (type === 'boolean') return 'true or false';
  return 'value';
}

/** Rows of a group's fields: `path`, its kind(s), type, presence and meaning, depth first. */
function groupRows(node: SchemaNode, path: string, kind: string, required: boolean, rows: string[][]): void {
  const description = String(node['description'] ?? '');
  if (Array.isArray(node['oneOf'])) {
    for (const alt of node['oneOf'] as SchemaNode[]) {
      const form = alt['required'] === undefined ? '' : `<${(alt['required'] as string[]).join(', ')}>`;
      groupRows(alt, `${path}${form}`, kind, required, rows);
    }
    return;
  }
  if (path !== '') rows.push([path, kind, schemaType(node), required ? 'required' : 'optional', description]);
  const properties = node['properties'] as Record<string, SchemaNode> | undefined;
  const needed = (node['required'] ?? []) as string[];
  if (properties !== undefined) {
    for (const [key, child] of Object.entries(properties))
      groupRows(child, path === '' ? key : `${path}.${key}`, kind, needed.includes(key), rows);
  } else if (typeof node['additionalProperties'] === 'object' && node['type'] === 'object') {
    const child = node['additionalProperties'] as SchemaNode;
    if (child['properties'] !== undefined) groupRows(child, `${path}.<name>`, kind, true, rows);
  }
}

/**
 * The field reference of a group (`groups.<name>.…`), generated from the groups' JSON Schema:
 * one row per field, the kind of group it belongs to, and for the calibration each form
 * (`calibration<schedule>`: fitted when read; `calibration<terms, coefficients>`: stored).
 */
export function groupFieldTable(): string {
  const schema = groupsJsonSchema() as SchemaNode;
  const kinds = ((schema['additionalProperties'] as SchemaNode)['oneOf'] as SchemaNode[]).map((k) => ({
    node: k,
    kind: String(((k['properties'] as Record<string, SchemaNode>)['kind'] as SchemaNode)['const']),
  }));
  const rows: string[][] = [];
  for (const { node, kind } of kinds.reverse()) groupRows(node, '', kind, true, rows);
  return [
    '| field | group kind | type | presence | meaning |',
    '|---|---|---|---|---|',
    ...rows.map(
      (r) => `| \`${r[0]}\` | ${r[1]} | ${cell(r[2] as string)} | ${r[3]} | ${cell(r[4] as string)} |`,
    ),
  ].join('\n');
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
  const groups = `Every field of a group, with paths relative to the group (\`bridges\` is \`groups.<name>.bridges\` in a file; docs/multi-component.md explains them). A multi-component group's \`calibration\` takes one of two forms: \`calibration<schedule>\`, fitted to a loading schedule each time the file is read, or \`calibration<terms, coefficients>\`, coefficients stored in the file (by \`bridgework fit-group --write\`, or from a calibration made elsewhere).`;
  const spliced = `${current.slice(0, start + fieldsStart.length)}\n\n${channelFieldTable()}\n\n### Fields of a group\n\n${groups}\n\n${groupFieldTable()}\n\n${current.slice(end)}`;
  return prettierFormat(spliced, channelFileDocsPath);
}

/** The JSON Schema file's text. */
export async function regeneratedSchema(): Promise<string> {
  return prettierFormat(`${JSON.stringify(channelFileJsonSchema(), null, 2)}\n`, schemaPath);
}
