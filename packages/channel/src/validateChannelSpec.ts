import type { SpecIssue } from '@bridgework/core';
import type { ChannelSpec } from './spec/ChannelSpec.js';
import { channelSchema } from './spec/channelSchema.js';
import { validate, type FieldRow, type UnitConverter } from './spec/schema.js';

/** Options of {@link validateChannelSpec}. */
export interface ValidateChannelSpecOptions {
  /** Accept quantities written with units, converted by this function (the CLI passes a mathjs-based one). */
  readonly convertUnit?: UnitConverter;
  /** Prefix for every field path (e.g. `channels.hanger-3`). Default: none. */
  readonly path?: string;
}

/** The outcome of {@link validateChannelSpec}: the spec with defaults applied, or every problem. */
export type ChannelSpecValidation = ValidSpec | InvalidSpec;

/** A spec that passed validation. */
export interface ValidSpec {
  /** Always true. */
  readonly ok: true;
  /** The spec with every default applied. */
  readonly value: ChannelSpec;
  /** Always empty. */
  readonly issues: readonly SpecIssue[];
}

/** A spec with problems. */
export interface InvalidSpec {
  /** Always false. */
  readonly ok: false;
  /** Always undefined. */
  readonly value: undefined;
  /** Every problem, with its field path. */
  readonly issues: readonly SpecIssue[];
}

/**
 * Validates a channel spec: every problem with its field path, all at once.
 *
 * @remarks
 * Unknown fields are problems (typo protection); numbers must be finite and inside their
 * documented ranges; cross-field rules (a Poisson arrangement needs `bridge.poissonRatio`, a
 * wiring must suit the arrangement, `ohmsPerLead` and `cable` exclude each other...) are checked
 * too. Messages follow the house grammar, e.g. "`bridge.ohmsPerLead` must be >= 0; got -1".
 * Never throws for a bad spec.
 *
 * @param spec - The candidate spec (any value).
 * @param options - A unit converter for quantities written as text; a path prefix.
 * @returns `{ ok: true, value }` with defaults applied, or `{ ok: false, issues }`.
 * @example
 * ```ts
 * validateChannelSpec({ sensor: { kind: 'rtd' }, excitation: { volts: 0 }, adc: { bits: 24, referenceVolts: 2.5 }, output: { quantity: 'temperature' } }).issues;
 * // [{ path: 'excitation.volts', message: '`excitation.volts` must be > 0; got 0' }]
 * ```
 */
export function validateChannelSpec(
  spec: unknown,
  options: ValidateChannelSpecOptions = {},
): ChannelSpecValidation {
  return validate(channelSchema, spec, {
    ...(options.convertUnit === undefined ? {} : { convertUnit: options.convertUnit }),
    ...(options.path === undefined ? {} : { path: options.path }),
  });
}

/**
 * The JSON Schema (draft 2020-12) of a channel spec, for editors and the CLI's file schema.
 *
 * @remarks
 * Generated from the same schema that validates specs. A quantity field accepts a number in its
 * SI unit or a text with a unit; its SI unit is recorded under the `x-unit` keyword.
 *
 * @returns A JSON-serialisable schema object.
 */
export function channelSpecJsonSchema(): Record<string, unknown> {
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    title: 'bridgework channel',
    ...channelSchema.jsonSchema(),
  };
}

/**
 * The field reference of a channel spec: one row per field with its type, unit, default and
 * meaning (docs/channel.md is generated from it).
 *
 * @returns The rows, in schema order.
 */
export function channelSpecFields(): FieldRow[] {
  return channelSchema.rows('');
}
