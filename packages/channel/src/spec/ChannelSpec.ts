/**
 * The channel spec's types, derived from the schema of the built-in sensor kinds (so a field
 * cannot exist in one and not the other).
 */
import type { builtInSensorKinds } from '../kinds/registry.js';
import type { buildChannelSchema } from './buildSchema.js';
import type { InOf, OutOf } from './schema.js';

type DefaultSchema = ReturnType<typeof buildChannelSchema<typeof builtInSensorKinds>>['schema'];

/**
 * A channel spec as written (in a channel file or in code): sensor, bridge and cable,
 * excitation, amplifier, converter, zero, polarity, environment, tolerances, output.
 *
 * @remarks
 * Derived from the schema that validates specs; the field reference with every default and unit
 * is docs/channel-file.md. Quantities are numbers in the field's unit (SI; °C for temperatures)
 * or texts with a unit (`'350 Ω'`, `'20 t'`, `'2 mV/V'`).
 */
export type ChannelSpec = InOf<DefaultSchema>;

declare const validBrand: unique symbol;

/**
 * A spec that passed {@link validateChannelSpec}: every default applied (derived ones too), every
 * quantity a number in the field's unit, deeply frozen. {@link createChannel} takes it without
 * checking it again.
 */
export type ValidChannelSpec = OutOf<DefaultSchema> & {
  /** Marks a value that came from validation (a type-level brand; there is no such property at run time). */
  readonly [validBrand]: true;
};
