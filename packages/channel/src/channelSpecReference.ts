import type { ChannelKit } from './channelKit.js';
import { defaultKit } from './internal/defaultKit.js';
import { builtInFieldDocs } from './spec/fieldDocs.js';
import type { FieldRow } from './spec/schema.js';
import { fieldJsonSchema, fieldRows } from './spec/schemaReference.js';

/**
 * The JSON Schema of a kit's spec (see {@link channelSpecJsonSchema}); a field of a kind made
 * outside the package is described by its own `doc`.
 *
 * @param kit - The kit.
 * @returns A JSON-serialisable schema object.
 */
export function kitSpecJsonSchema(kit: ChannelKit): Record<string, unknown> {
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    title: 'bridgework channel',
    ...fieldJsonSchema(kit.schema, '', builtInFieldDocs),
  };
}

/**
 * The field reference of a kit's spec (see {@link channelSpecFields}).
 *
 * @param kit - The kit.
 * @returns The rows, in schema order.
 */
export function kitSpecFields(kit: ChannelKit): FieldRow[] {
  return fieldRows(kit.schema, '', builtInFieldDocs);
}

/**
 * The JSON Schema (draft 2020-12) of a channel spec, for editors and file schemas.
 *
 * @remarks
 * Generated from the schema that validates specs. A quantity field accepts a number in its unit or
 * a text with a unit; its unit is recorded under the `x-unit` keyword.
 *
 * @returns A JSON-serialisable schema object.
 */
export function channelSpecJsonSchema(): Record<string, unknown> {
  return kitSpecJsonSchema(defaultKit);
}

/**
 * The field reference of a channel spec: one row per field with its type, unit, default and
 * meaning (docs/channel-file.md is generated from it).
 *
 * @returns The rows, in schema order.
 */
export function channelSpecFields(): FieldRow[] {
  return kitSpecFields(defaultKit);
}
