/**
 * One source for the spec (issue 13 item 2), checked as a property: the schema's defaults, the
 * JSON Schema generated from it and the TypeScript type agree. The JSON Schema is compiled by ajv
 * (draft 2020-12, strict mode, the one extension keyword `x-unit` declared), an implementation
 * outside the project; for random choices of fields written out with the JSON Schema's `default`
 * (fast-check), the validator gives the same spec as with those fields left out, and ajv accepts
 * both; an unknown key anywhere is refused by both. The base specs are typed `ChannelSpec`, so
 * the type takes them too (checked by the compiler).
 */
import ajv2020 from 'ajv/dist/2020.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { channelSpecJsonSchema, validateChannelSpec, type ChannelSpec } from '@bridgework/channel';

/** The smallest spec of each sensor kind (every other field by its default). */
const bases: Readonly<Record<string, ChannelSpec>> = {
  'strain-gauge': {
    sensor: { kind: 'strain-gauge', gaugeFactor: 2 },
    excitation: { volts: 5 },
    adc: { bits: 24, referenceVolts: 5, ratiometric: true },
    output: { quantity: 'strain' },
  },
  transducer: {
    sensor: { kind: 'transducer', capacity: 10000, ratedOutputVoltsPerVolt: 0.002 },
    excitation: { volts: '5 V' },
    adc: { bits: 24, referenceVolts: '5 V', ratiometric: true },
    output: { quantity: 'force' },
  },
  rtd: {
    sensor: { kind: 'rtd' },
    excitation: { volts: '1 V' },
    adc: { bits: 24, referenceVolts: '1 V' },
    output: { quantity: 'temperature' },
  },
  thermistor: {
    sensor: { kind: 'thermistor', referenceOhms: '10 kΩ', betaKelvin: 3950 },
    excitation: { volts: '1 V' },
    adc: { bits: 24, referenceVolts: '1 V' },
    output: { quantity: 'temperature' },
  },
};

type JsonSchema = {
  readonly properties?: Readonly<Record<string, JsonSchema>>;
  readonly oneOf?: readonly JsonSchema[];
  readonly anyOf?: readonly JsonSchema[];
  readonly const?: unknown;
  readonly default?: unknown;
  readonly required?: readonly string[];
};

const schema = channelSpecJsonSchema() as JsonSchema;

/** The object schema of a property (itself, or the object among its `anyOf`). */
function objectOf(s: JsonSchema): JsonSchema | undefined {
  if (s.properties !== undefined) return s;
  return s.anyOf?.find((a) => a.properties !== undefined);
}

/**
 * Every field of a spec of this kind with a `default` in the JSON Schema: its path and value. An
 * optional section with required fields of its own (`calibration`, `zero`) is not entered unless
 * the base spec has it: writing one of its defaults would create the section without them; a field
 * the base spec gives is left as it is.
 */
function defaultsFor(kind: string): { path: readonly string[]; value: unknown }[] {
  const found: { path: readonly string[]; value: unknown }[] = [];
  const base = bases[kind] as unknown as Record<string, unknown>;
  const present = (path: readonly string[]) =>
    path.reduce<unknown>((o, k) => (o as Record<string, unknown> | undefined)?.[k], base) !== undefined;
  const walk = (s: JsonSchema, path: readonly string[]) => {
    for (const [key, child] of Object.entries(s.properties ?? {})) {
      const here = [...path, key];
      if (key === 'sensor') {
        const variant = child.oneOf?.find((v) => v.properties?.['kind']?.const === kind);
        if (variant !== undefined) walk(variant, here);
        continue;
      }
      if (child.default !== undefined && !present(here)) found.push({ path: here, value: child.default });
      const object = objectOf(child);
      if (object !== undefined && ((object.required ?? []).length === 0 || present(here))) walk(object, here);
    }
  };
  walk(schema, []);
  return found;
}

/** A deep copy of `spec` with `value` at `path` (objects made on the way). */
function withField(spec: unknown, path: readonly string[], value: unknown): Record<string, unknown> {
  const copy = structuredClone(spec) as Record<string, unknown>;
  let at = copy;
  for (const key of path.slice(0, -1)) {
    if (typeof at[key] !== 'object' || at[key] === null) at[key] = {};
    at = at[key] as Record<string, unknown>;
  }
  at[path[path.length - 1] as string] = value;
  return copy;
}

// ajv is CommonJS: under Node's ESM interop its class is the default export's `default`.
const Ajv2020 = ajv2020.default;
const ajv = new Ajv2020({ strict: true, allErrors: true });
ajv.addKeyword({ keyword: 'x-unit', schemaType: 'string' });
const validateJson = ajv.compile(schema);

describe('the spec schema, its JSON Schema and its type agree', () => {
  it('the JSON Schema compiles under ajv strict mode (draft 2020-12) and carries defaults', () => {
    for (const kind of Object.keys(bases)) expect(defaultsFor(kind).length).toBeGreaterThan(15);
    for (const [kind, base] of Object.entries(bases)) {
      expect(validateJson(base), `${kind}: ${ajv.errorsText(validateJson.errors)}`).toBe(true);
      expect(validateChannelSpec(base).issues).toEqual([]);
    }
  });

  it('writing any fields out with the JSON Schema’s default changes nothing the validator gives (fast-check)', () => {
    const cases = fc.constantFrom(...Object.keys(bases)).chain((kind) =>
      fc.record({
        kind: fc.constant(kind),
        chosen: fc.subarray(defaultsFor(kind), { minLength: 1 }),
      }),
    );
    fc.assert(
      fc.property(cases, ({ kind, chosen }) => {
        const base = bases[kind] as ChannelSpec;
        let spec: Record<string, unknown> = structuredClone(base) as Record<string, unknown>;
        for (const { path, value } of chosen) spec = withField(spec, path, value);
        expect(validateJson(spec), ajv.errorsText(validateJson.errors)).toBe(true);
        const written = validateChannelSpec(spec);
        expect(written.issues).toEqual([]);
        expect(written.value).toEqual(validateChannelSpec(base).value);
      }),
      { numRuns: 300, seed: 13 },
    );
  });

  it('an unknown key at any object of a spec is refused by both (fast-check)', () => {
    const cases = fc.record({
      kind: fc.constantFrom(...Object.keys(bases)),
      key: fc.constantFrom('colour', 'constructor', 'toString', 'gaugeFactr', 'x'),
      depth: fc.nat(3),
    });
    fc.assert(
      fc.property(cases, ({ kind, key, depth }) => {
        const base = bases[kind] as ChannelSpec;
        const objects = [[], ['sensor'], ['excitation'], ['adc'], ['output']] as const;
        const path = [...(objects[depth % objects.length] as readonly string[]), key];
        const spec = withField(base, path, 1);
        expect(validateJson(spec)).toBe(false);
        const issues = validateChannelSpec(spec).issues;
        expect(issues.map((i) => i.path)).toContain(path.join('.'));
      }),
      { numRuns: 100, seed: 13 },
    );
  });
});
