import { defaultKit } from './internal/defaultKit.js';
import type { FieldRow } from './spec/schema.js';

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
  return defaultKit.channelSpecJsonSchema();
}

/**
 * The field reference of a channel spec: one row per field with its type, unit, default and
 * meaning (docs/channel-file.md is generated from it).
 *
 * @returns The rows, in schema order.
 */
export function channelSpecFields(): FieldRow[] {
  return defaultKit.channelSpecFields();
}
