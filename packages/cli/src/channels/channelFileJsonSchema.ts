import { channelSpecJsonSchema } from '@bridgework/channel';
import { channelNamePattern } from '../channelFile/loadChannelFile.js';
import { groupsJsonSchema } from '../groups/groupsJsonSchema.js';

/**
 * The JSON Schema (draft 2020-12) of a channel file, for editors: `project` metadata, a
 * `channels` mapping from channel name to channel spec, and the multi-bridge `groups`.
 *
 * @remarks
 * The channel part is the channel package's `channelSpecJsonSchema()` (generated from the schema
 * that validates specs, so the two cannot disagree), without its `name` field: in a file the
 * channel's name is its key, which must match {@link channelNamePattern}. Quantity fields accept
 * a number in SI or a text with a unit, with the SI unit under `x-unit`. Unknown fields are
 * rejected everywhere (`additionalProperties: false`), as the command rejects them.
 * `packages/cli/schema/channel-file.schema.json` is this object, written by
 * `pnpm --filter bridgework docs:cli` (a test keeps it current). A YAML file can name it in its
 * first line for editors that use the YAML language server:
 * `# yaml-language-server: $schema=<path>/channel-file.schema.json`.
 *
 * @returns A JSON-serialisable schema.
 */
export function channelFileJsonSchema(): Record<string, unknown> {
  const { $schema: _schema, title: _title, ...channel } = channelSpecJsonSchema();
  const properties = { ...(channel['properties'] as Record<string, unknown>) };
  delete properties['name'];
  const text = (description: string) => ({ type: 'string', description });
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    title: 'bridgework channel file',
    description:
      'One or more measurement channels for the bridgework command: project metadata and a mapping from channel name to channel spec. Quantities are SI numbers (°C for temperatures) or texts with a unit, such as "350 ohm".',
    type: 'object',
    additionalProperties: false,
    required: ['channels'],
    properties: {
      $schema: text('The JSON Schema of the file, for editors (ignored by the command)'),
      project: {
        type: 'object',
        description: 'Metadata for reports',
        additionalProperties: false,
        properties: {
          title: text('A title for reports'),
          description: text('Free text shown under the title'),
          reference: text('A job, drawing or test reference'),
        },
      },
      channels: {
        type: 'object',
        description: 'The channels: channel name → channel spec',
        minProperties: 1,
        propertyNames: { pattern: channelNamePattern.source },
        additionalProperties: { $ref: '#/$defs/channel' },
      },
      groups: groupsJsonSchema(),
    },
    $defs: { channel: { ...channel, properties } },
  };
}
