/**
 * TEST ONLY: a validator for the subset of JSON Schema (draft 2020-12) that the channel-file
 * schema uses, written from the specification's definitions of each keyword, so the shipped
 * schema file can be checked against real files without a third-party validator. A keyword
 * outside the subset is an error (so a schema that grows cannot be half-checked silently).
 */
type Schema = Record<string, unknown>;

const annotations = new Set(['$schema', 'title', 'description', 'default', 'x-unit', '$defs']);
const handled = new Set([
  '$ref',
  'type',
  'properties',
  'additionalProperties',
  'required',
  'propertyNames',
  'minProperties',
  'enum',
  'const',
  'anyOf',
  'oneOf',
  'minimum',
  'maximum',
  'exclusiveMinimum',
  'exclusiveMaximum',
  'items',
  'minItems',
  'maxItems',
  'pattern',
]);

function typeOk(type: string, v: unknown): boolean {
  switch (type) {
    case 'object':
      return typeof v === 'object' && v !== null && !Array.isArray(v);
    case 'array':
      return Array.isArray(v);
    case 'string':
      return typeof v === 'string';
    case 'boolean':
      return typeof v === 'boolean';
    case 'number':
      return typeof v === 'number' && Number.isFinite(v);
    case 'integer':
      return typeof v === 'number' && Number.isInteger(v);
    default:
      throw new Error(`unsupported type ${type}`);
  }
}

/** Every place where `value` fails `schema`, as JSON-pointer-like paths with the keyword. */
export function schemaErrors(root: Schema, value: unknown): string[] {
  const defs = (root['$defs'] ?? {}) as Record<string, Schema>;
  const check = (schema: Schema, v: unknown, path: string): string[] => {
    const errors: string[] = [];
    visit(schema, v, path, errors);
    return errors;
  };
  const visit = (schema: Schema, v: unknown, path: string, errors: string[]): void => {
    for (const k of Object.keys(schema))
      if (!annotations.has(k) && !handled.has(k)) throw new Error(`unsupported keyword ${k} at ${path}`);
    const fail = (keyword: string): void => {
      errors.push(`${path || '/'}: ${keyword}`);
    };
    if (typeof schema['$ref'] === 'string') {
      const name = (schema['$ref'] as string).replace(/^#\/\$defs\//, '');
      visit(defs[name]!, v, path, errors);
    }
    // `type` is one name or a list of names (the value must be of one of them).
    const types = schema['type'] === undefined ? [] : ([schema['type']].flat() as string[]);
    if (types.length > 0 && !types.some((t) => typeOk(t, v))) {
      fail('type');
      return;
    }
    if (schema['const'] !== undefined && v !== schema['const']) fail('const');
    if (schema['enum'] !== undefined && !(schema['enum'] as unknown[]).includes(v)) fail('enum');
    if (typeof v === 'number') {
      if (typeof schema['minimum'] === 'number' && v < schema['minimum']) fail('minimum');
      if (typeof schema['maximum'] === 'number' && v > schema['maximum']) fail('maximum');
      if (typeof schema['exclusiveMinimum'] === 'number' && v <= schema['exclusiveMinimum'])
        fail('exclusiveMinimum');
      if (typeof schema['exclusiveMaximum'] === 'number' && v >= schema['exclusiveMaximum'])
        fail('exclusiveMaximum');
    }
    if (
      typeof v === 'string' &&
      typeof schema['pattern'] === 'string' &&
      !new RegExp(schema['pattern']).test(v)
    )
      fail('pattern');
    if (Array.isArray(v)) {
      if (typeof schema['minItems'] === 'number' && v.length < schema['minItems']) fail('minItems');
      if (typeof schema['maxItems'] === 'number' && v.length > schema['maxItems']) fail('maxItems');
      if (schema['items'] !== undefined)
        v.forEach((x, i) => visit(schema['items'] as Schema, x, `${path}/${i}`, errors));
    }
    if (typeof v === 'object' && v !== null && !Array.isArray(v)) {
      const record = v as Record<string, unknown>;
      const props = (schema['properties'] ?? {}) as Record<string, Schema>;
      for (const r of (schema['required'] ?? []) as string[]) if (!(r in record)) fail(`required ${r}`);
      if (typeof schema['minProperties'] === 'number' && Object.keys(record).length < schema['minProperties'])
        fail('minProperties');
      for (const [k, x] of Object.entries(record)) {
        if (
          schema['propertyNames'] !== undefined &&
          check(schema['propertyNames'] as Schema, k, path).length > 0
        )
          errors.push(`${path}/${k}: propertyNames`);
        if (k in props) visit(props[k]!, x, `${path}/${k}`, errors);
        else if (schema['additionalProperties'] === false) fail(`additionalProperties ${k}`);
        else if (typeof schema['additionalProperties'] === 'object')
          visit(schema['additionalProperties'] as Schema, x, `${path}/${k}`, errors);
      }
    }
    for (const key of ['anyOf', 'oneOf'] as const) {
      const options = schema[key] as Schema[] | undefined;
      if (options === undefined) continue;
      const passing = options.filter((o) => check(o, v, path).length === 0).length;
      if (key === 'anyOf' ? passing === 0 : passing !== 1) fail(key);
    }
  };
  return check(root, value, '');
}
