/**
 * The channel file's documentation and editor schema: both generated from the channel package's
 * schema and kept current; the shipped JSON Schema accepts the example file and flags what the
 * command flags (unknown fields, a `name` field in a channel, a bad channel name, a bad choice).
 */
import { readFileSync } from 'node:fs';
import { channelSpecJsonSchema } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { channelFileJsonSchema } from '../src/channels/channelFileJsonSchema.js';
import {
  channelFileDocsPath,
  regeneratedChannelFileDocs,
  regeneratedSchema,
  schemaPath,
} from './support/channelFileDocs.js';
import { examplePath } from './support/footbridge.js';
import { schemaErrors } from './support/jsonSchemaSubset.js';

const schema = JSON.parse(readFileSync(schemaPath, 'utf8')) as Record<string, unknown>;
const example = parse(readFileSync(examplePath, 'utf8')) as {
  channels: Record<string, Record<string, Record<string, unknown>>>;
};
const copy = () => structuredClone(example);

describe('generated channel-file documentation', () => {
  it('packages/cli/schema/channel-file.schema.json is current', async () => {
    expect(readFileSync(schemaPath, 'utf8'), 'run pnpm --filter bridgework docs:cli').toBe(
      await regeneratedSchema(),
    );
  });

  it('docs/channel-file.md holds the field reference as generated', async () => {
    expect(readFileSync(channelFileDocsPath, 'utf8'), 'run pnpm --filter bridgework docs:cli').toBe(
      await regeneratedChannelFileDocs(),
    );
  });

  it('the channel part is the channel package’s schema, less the name (a channel’s name is its key)', () => {
    const defs = channelFileJsonSchema()['$defs'] as { channel: { properties: Record<string, unknown> } };
    const spec = channelSpecJsonSchema() as { properties: Record<string, unknown> };
    const { name: _name, ...rest } = spec.properties;
    expect(defs.channel.properties).toEqual(rest);
  });

  it('states the safety caution in the documentation', () => {
    expect(readFileSync(channelFileDocsPath, 'utf8')).toMatch(
      /support, and do not replace,\s+qualified engineering judgement/,
    );
  });
});

describe('the JSON Schema of a channel file', () => {
  it('accepts the example file (quantities as numbers or texts with units)', () => {
    expect(schemaErrors(schema, example)).toEqual([]);
    const numbers = copy();
    numbers.channels['hanger-h3']!['sensor']!['gaugeOhms'] = 350;
    expect(schemaErrors(schema, numbers)).toEqual([]);
  });

  it('flags an unknown field, a name field, a bad channel name and a bad choice', () => {
    const typo = copy();
    typo.channels['deck-temp']!['excitation'] = { volt: '1 V' };
    expect(schemaErrors(schema, typo)).toEqual([
      '/channels/deck-temp/excitation: required volts',
      '/channels/deck-temp/excitation: additionalProperties volt',
    ]);
    const named = copy();
    (named.channels['deck-temp'] as Record<string, unknown>)['name'] = 'deck';
    expect(schemaErrors(schema, named)).toEqual(['/channels/deck-temp: additionalProperties name']);
    const spaced = copy();
    spaced.channels['deck temp'] = spaced.channels['deck-temp']!;
    expect(schemaErrors(schema, spaced)).toEqual(['/channels/deck temp: propertyNames']);
    const choice = copy();
    (choice.channels['gusset-g2'] as Record<string, unknown>)['polarity'] = 'reversed';
    expect(schemaErrors(schema, choice)).toEqual(['/channels/gusset-g2/polarity: enum']);
  });

  it('flags a missing channels mapping, an empty one, and a negative resistance written as a number', () => {
    expect(schemaErrors(schema, { project: { title: 'x' } })).toEqual(['/: required channels']);
    expect(schemaErrors(schema, { channels: {} })).toEqual(['/channels: minProperties']);
    const negative = copy();
    negative.channels['hanger-h3']!['sensor']!['gaugeOhms'] = -350;
    // The sensor is a oneOf of the three kinds; none of them accepts it now.
    expect(schemaErrors(schema, negative)).toEqual(['/channels/hanger-h3/sensor: oneOf']);
  });

  it('accepts a $schema text at the top, as the command does', () => {
    expect(schemaErrors(schema, { $schema: 'channel-file.schema.json', ...example })).toEqual([]);
  });
});
