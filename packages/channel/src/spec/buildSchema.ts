/**
 * The channel schema for a list of sensor kinds, over the bridge package's arrangement table as
 * it is when the schema is built.
 */
import { arrangementTable, strainArrangements, type StrainArrangement } from '@bridgework/bridge';
import type { SensorKind } from '../kinds/SensorKind.js';
import { channelSchemaFor, type ChannelRules } from './channelSchema.js';
import { renamedSensorFields } from './renamedFields.js';
import { objectField, type Fields, type ObjectIn, type ObjectOut, type SchemaNode } from './schema.js';

/** Any sensor kind. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnySensorKind = SensorKind<any, string>;

/** The `sensor` variants of a list of kinds, keyed by name. */
export type VariantsOf<K extends readonly AnySensorKind[]> = {
  [X in K[number] as X['name']]: X extends SensorKind<infer F, string>
    ? SchemaNode<ObjectIn<F>, ObjectOut<F>, 'required'>
    : never;
};

/** The schema and the rules for a list of sensor kinds. */
export function buildChannelSchema<const K extends readonly AnySensorKind[]>(kinds: K) {
  const names = new Set<string>();
  for (const k of kinds) {
    if (names.has(k.name)) throw new Error(`two sensor kinds are named '${k.name}'`);
    names.add(k.name);
  }
  const variants = Object.fromEntries(
    kinds.map((k) => [
      k.name,
      objectField(k.fields as Fields, {
        ...(k.doc === undefined ? {} : { doc: k.doc }),
        ...(renamedSensorFields[k.name] === undefined ? {} : { renamed: renamedSensorFields[k.name] }),
      }),
    ]),
  ) as VariantsOf<K>;
  const rules: ChannelRules = {
    kinds: new Map(kinds.map((k) => [k.name, k as SensorKind])),
    arrangements: arrangementTable,
  };
  const schema = channelSchemaFor(variants, [...strainArrangements] as readonly StrainArrangement[], rules);
  return { schema, rules };
}
