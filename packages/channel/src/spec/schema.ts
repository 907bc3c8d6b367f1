import { formatValue, type SpecIssue } from '@bridgework/core';

/**
 * Converts a quantity written with a unit (`"350 ohm"`, `"5 V"`) to a number in the SI unit the
 * field expects. Supplied by the caller (the CLI passes a mathjs-based one); without it, strings
 * are rejected. It throws an `Error` whose message says what was wrong.
 */
export type UnitConverter = (text: string, unit: string) => number;

/** State threaded through one validation run. */
interface Context {
  readonly issues: SpecIssue[];
  readonly convertUnit: UnitConverter | undefined;
}

/** A row of the field reference table (docs/channel.md, `--help` of the CLI). */
export interface FieldRow {
  /** Dotted path, `[]` for array items, `<kind>` for union members. */
  readonly path: string;
  /** Value type as text (`number`, `'quarter' | 'half-bending'`, ...). */
  readonly type: string;
  /** SI unit of a quantity, or '' for none. */
  readonly unit: string;
  /** 'required', the default written as text, or 'optional'. */
  readonly presence: string;
  /** One-line meaning. */
  readonly doc: string;
}

/** Marker for a value that failed validation (its issue has been recorded). */
export const INVALID: unique symbol = Symbol('invalid');

/** A node of the spec schema: validates, applies defaults, and describes itself. */
export interface SchemaNode<T> {
  /** One-line meaning of the field. */
  readonly doc: string;
  /** Whether the field may be absent. */
  readonly optional: boolean;
  /** The default, when one exists (applied when the field is absent). */
  readonly defaultText: string | undefined;
  /** Validates `value` at `path`, recording issues; returns the value or INVALID. */
  parse(value: unknown, path: string, ctx: Context): T | typeof INVALID;
  /** Whether an absent value has a default, and which. */
  fallback(): { readonly has: boolean; readonly value?: T };
  /** JSON Schema (draft 2020-12) of this node. */
  jsonSchema(): Record<string, unknown>;
  /** Rows of the field reference table. */
  rows(path: string): FieldRow[];
  /** The value type as text. */
  typeText(): string;
}

function issue(ctx: Context, path: string, message: string): typeof INVALID {
  ctx.issues.push({ path, message: `\`${path === '' ? 'spec' : path}\` ${message}` });
  return INVALID;
}

function row(path: string, node: SchemaNode<unknown>, unit = ''): FieldRow {
  const presence =
    node.defaultText !== undefined ? node.defaultText : node.optional ? 'optional' : 'required';
  return { path, type: node.typeText(), unit, presence, doc: node.doc };
}

interface Common<T> {
  /** One-line meaning. */
  readonly doc: string;
  /** Default applied when absent (makes the field optional). */
  readonly default?: T;
  /** The field may be absent (without a default). */
  readonly optional?: boolean;
}

function base<T>(
  c: Common<T>,
  defaultText: string | undefined,
): Pick<SchemaNode<T>, 'doc' | 'optional' | 'defaultText' | 'fallback'> {
  return {
    doc: c.doc,
    optional: c.optional === true || c.default !== undefined,
    defaultText,
    fallback: () => (c.default !== undefined ? { has: true, value: c.default } : { has: false }),
  };
}

/** Options of a numeric field. */
export interface NumberOptions extends Common<number> {
  /** SI unit ('ohm', 'V', 'm', ..., '1' for dimensionless); enables unit strings via the converter. */
  readonly unit?: string;
  /** Lower limit. */
  readonly min?: number;
  /** Upper limit. */
  readonly max?: number;
  /** Exclude `min` itself. */
  readonly minExclusive?: boolean;
  /** Exclude `max` itself. */
  readonly maxExclusive?: boolean;
  /** Must be an integer. */
  readonly integer?: boolean;
}

function describeLimits(o: NumberOptions): string {
  const parts: string[] = [];
  if (o.min !== undefined) parts.push(`${o.minExclusive === true ? '>' : '>='} ${o.min}`);
  if (o.max !== undefined) parts.push(`${o.maxExclusive === true ? '<' : '<='} ${o.max}`);
  return parts.join(' and ');
}

/** A finite number, optionally with a unit, limits and integrality. */
export function numberField(o: NumberOptions): SchemaNode<number> {
  const node: SchemaNode<number> = {
    ...base(o, o.default === undefined ? undefined : String(o.default)),
    parse(value, path, ctx) {
      let x = value;
      if (typeof x === 'string' && o.unit !== undefined) {
        if (ctx.convertUnit === undefined)
          return issue(ctx, path, `must be a number in ${o.unit}; got ${formatValue(x)}`);
        try {
          x = ctx.convertUnit(x, o.unit);
        } catch (e) {
          return issue(ctx, path, `must be a quantity in ${o.unit}: ${(e as Error).message}`);
        }
      }
      if (typeof x !== 'number') {
        return issue(
          ctx,
          path,
          `must be ${o.integer === true ? 'an integer' : 'a number'}${o.unit && o.unit !== '1' ? ` in ${o.unit}` : ''}; got ${formatValue(x)}`,
        );
      }
      if (!Number.isFinite(x)) return issue(ctx, path, `must be a finite number; got ${formatValue(x)}`);
      if (o.integer === true && !Number.isInteger(x))
        return issue(ctx, path, `must be an integer; got ${formatValue(x)}`);
      const low = o.min !== undefined && (o.minExclusive === true ? x <= o.min : x < o.min);
      const high = o.max !== undefined && (o.maxExclusive === true ? x >= o.max : x > o.max);
      if (low || high) return issue(ctx, path, `must be ${describeLimits(o)}; got ${formatValue(x)}`);
      return x;
    },
    jsonSchema() {
      const n: Record<string, unknown> = {
        type: o.integer === true ? 'integer' : 'number',
        description: o.doc,
      };
      if (o.min !== undefined) n[o.minExclusive === true ? 'exclusiveMinimum' : 'minimum'] = o.min;
      if (o.max !== undefined) n[o.maxExclusive === true ? 'exclusiveMaximum' : 'maximum'] = o.max;
      if (o.default !== undefined) n['default'] = o.default;
      if (o.unit === undefined) return n;
      return {
        description: o.doc,
        'x-unit': o.unit,
        anyOf: [
          n,
          { type: 'string', description: `a quantity with a unit convertible to ${o.unit}, e.g. "350 ohm"` },
        ],
      };
    },
    rows: (path) => [row(path, node, o.unit ?? '')],
    typeText: () =>
      (o.integer === true ? 'integer' : 'number') + (describeLimits(o) ? ` (${describeLimits(o)})` : ''),
  };
  return node;
}

/** One of a fixed list of strings. */
export function choiceField<const T extends string>(values: readonly T[], o: Common<T>): SchemaNode<T> {
  const node: SchemaNode<T> = {
    ...base(o, o.default === undefined ? undefined : `'${o.default}'`),
    parse(value, path, ctx) {
      if (typeof value === 'string' && (values as readonly string[]).includes(value)) return value as T;
      return issue(
        ctx,
        path,
        `must be one of ${values.map((v) => `'${v}'`).join(', ')}; got ${formatValue(value)}`,
      );
    },
    jsonSchema: () => ({
      enum: [...values],
      description: o.doc,
      ...(o.default === undefined ? {} : { default: o.default }),
    }),
    rows: (path) => [row(path, node)],
    typeText: () => values.map((v) => `'${v}'`).join(' \\| '),
  };
  return node;
}

/** A boolean. */
export function booleanField(o: Common<boolean>): SchemaNode<boolean> {
  const node: SchemaNode<boolean> = {
    ...base(o, o.default === undefined ? undefined : String(o.default)),
    parse(value, path, ctx) {
      if (typeof value === 'boolean') return value;
      return issue(ctx, path, `must be true or false; got ${formatValue(value)}`);
    },
    jsonSchema: () => ({
      type: 'boolean',
      description: o.doc,
      ...(o.default === undefined ? {} : { default: o.default }),
    }),
    rows: (path) => [row(path, node)],
    typeText: () => 'boolean',
  };
  return node;
}

/** A free text. */
export function textField(o: Common<string> & { readonly pattern?: RegExp }): SchemaNode<string> {
  const node: SchemaNode<string> = {
    ...base(o, o.default === undefined ? undefined : `'${o.default}'`),
    parse(value, path, ctx) {
      if (typeof value !== 'string') return issue(ctx, path, `must be a text; got ${formatValue(value)}`);
      if (o.pattern !== undefined && !o.pattern.test(value)) {
        return issue(ctx, path, `must match ${String(o.pattern)}; got ${formatValue(value)}`);
      }
      return value;
    },
    jsonSchema: () => ({
      type: 'string',
      description: o.doc,
      ...(o.pattern ? { pattern: o.pattern.source } : {}),
    }),
    rows: (path) => [row(path, node)],
    typeText: () => 'text',
  };
  return node;
}

/** A list of numbers with a unit and a length range (polynomial coefficients, a temperature range). */
export function numberListField(
  item: SchemaNode<number>,
  o: Common<readonly number[]> & { readonly minLength: number; readonly maxLength: number },
): SchemaNode<readonly number[]> {
  const node: SchemaNode<readonly number[]> = {
    ...base(o, o.default === undefined ? undefined : `[${o.default.join(', ')}]`),
    parse(value, path, ctx) {
      if (!Array.isArray(value) || value.length < o.minLength || value.length > o.maxLength) {
        const len = o.minLength === o.maxLength ? `${o.minLength}` : `${o.minLength} to ${o.maxLength}`;
        return issue(ctx, path, `must be a list of ${len} numbers; got ${formatValue(value)}`);
      }
      const out: number[] = [];
      let ok = true;
      value.forEach((v: unknown, i) => {
        const x = item.parse(v, `${path}[${i}]`, ctx);
        if (x === INVALID) ok = false;
        else out.push(x);
      });
      return ok ? out : INVALID;
    },
    jsonSchema: () => ({
      type: 'array',
      description: o.doc,
      items: item.jsonSchema(),
      minItems: o.minLength,
      maxItems: o.maxLength,
    }),
    rows: (path) => [row(path, node, item.rows('x')[0]?.unit ?? '')],
    typeText: () =>
      `list of ${o.minLength === o.maxLength ? o.minLength : `${o.minLength}–${o.maxLength}`} numbers`,
  };
  return node;
}

/** Field map of an object node. */
export type Fields = Readonly<Record<string, SchemaNode<unknown>>>;

/** A record with known fields; unknown fields are problems (typo protection). */
export function objectField<T>(
  fields: Fields,
  o: Common<T> & {
    readonly check?: (value: T, path: string, report: (p: string, m: string) => void) => void;
  },
): SchemaNode<T> {
  const node: SchemaNode<T> = {
    ...base(o, undefined),
    fallback: () => {
      // An absent optional object takes the defaults of its fields when all of them have one.
      if (o.optional !== true) return { has: false };
      const value: Record<string, unknown> = {};
      for (const [k, f] of Object.entries(fields)) {
        const fb = f.fallback();
        if (fb.has) value[k] = fb.value;
        else if (!f.optional) return { has: false };
      }
      return { has: true, value: value as T };
    },
    parse(value, path, ctx) {
      if (typeof value !== 'object' || value === null || Array.isArray(value)) {
        return issue(ctx, path, `must be an object; got ${formatValue(value)}`);
      }
      const input = value as Record<string, unknown>;
      const out: Record<string, unknown> = {};
      let ok = true;
      for (const key of Object.keys(input)) {
        if (!(key in fields)) {
          issue(ctx, join(path, key), `is not a known field (known: ${Object.keys(fields).join(', ')})`);
          ok = false;
        }
      }
      for (const [key, f] of Object.entries(fields)) {
        const p = join(path, key);
        if (input[key] === undefined) {
          const fb = f.fallback();
          if (fb.has) out[key] = fb.value;
          else if (!f.optional) {
            issue(ctx, p, `is required (${f.doc})`);
            ok = false;
          }
          continue;
        }
        const x = f.parse(input[key], p, ctx);
        if (x === INVALID) ok = false;
        else out[key] = x;
      }
      if (!ok) return INVALID;
      if (o.check !== undefined) {
        const before = ctx.issues.length;
        o.check(out as T, path, (p, m) => issue(ctx, p, m));
        if (ctx.issues.length > before) return INVALID;
      }
      return out as T;
    },
    jsonSchema() {
      const required = Object.entries(fields)
        .filter(([, f]) => !f.optional)
        .map(([k]) => k);
      return {
        type: 'object',
        description: o.doc,
        additionalProperties: false,
        properties: Object.fromEntries(Object.entries(fields).map(([k, f]) => [k, f.jsonSchema()])),
        ...(required.length > 0 ? { required } : {}),
      };
    },
    rows: (path) => [
      ...(path === '' ? [] : [row(path, node)]),
      ...Object.entries(fields).flatMap(([k, f]) => f.rows(join(path, k))),
    ],
    typeText: () => 'object',
  };
  return node;
}

/** A union of object variants told apart by a tag field (`kind`). */
export function taggedField<T>(
  tag: string,
  variants: Readonly<Record<string, SchemaNode<unknown>>>,
  o: Common<T>,
): SchemaNode<T> {
  const names = Object.keys(variants);
  const node: SchemaNode<T> = {
    ...base(o, undefined),
    parse(value, path, ctx) {
      if (typeof value !== 'object' || value === null || Array.isArray(value)) {
        return issue(ctx, path, `must be an object; got ${formatValue(value)}`);
      }
      const kind = (value as Record<string, unknown>)[tag];
      const variant = typeof kind === 'string' ? variants[kind] : undefined;
      if (variant === undefined) {
        return issue(
          ctx,
          join(path, tag),
          `must be one of ${names.map((n) => `'${n}'`).join(', ')}; got ${formatValue(kind)}`,
        );
      }
      const { [tag]: _tag, ...rest } = value as Record<string, unknown>;
      const parsed = variant.parse(rest, path, ctx);
      return parsed === INVALID ? INVALID : ({ [tag]: kind, ...(parsed as object) } as T);
    },
    jsonSchema: () => ({
      description: o.doc,
      oneOf: names.map((n) => {
        const s = variants[n]!.jsonSchema() as { properties?: Record<string, unknown>; required?: string[] };
        return {
          ...s,
          properties: { [tag]: { const: n }, ...(s.properties ?? {}) },
          required: [tag, ...(s.required ?? [])],
        };
      }),
    }),
    rows: (path) => [
      {
        path: join(path, tag),
        type: names.map((n) => `'${n}'`).join(' \\| '),
        unit: '',
        presence: 'required',
        doc: o.doc,
      },
      ...names.flatMap((n) =>
        variants[n]!.rows(path).map((r) => ({ ...r, path: r.path.replace(path, `${path}<${n}>`) })),
      ),
    ],
    typeText: () => 'object',
  };
  return node;
}

function join(path: string, key: string): string {
  return path === '' ? key : `${path}.${key}`;
}

/** Validates `value` against `schema`: the value with defaults applied, or every problem found. */
export function validate<T>(
  schema: SchemaNode<T>,
  value: unknown,
  options: { readonly convertUnit?: UnitConverter; readonly path?: string } = {},
):
  | { readonly ok: true; readonly value: T; readonly issues: readonly SpecIssue[] }
  | { readonly ok: false; readonly value: undefined; readonly issues: readonly SpecIssue[] } {
  const ctx: Context = { issues: [], convertUnit: options.convertUnit };
  const parsed = schema.parse(value, options.path ?? '', ctx);
  if (parsed === INVALID || ctx.issues.length > 0) return { ok: false, value: undefined, issues: ctx.issues };
  return { ok: true, value: parsed, issues: [] };
}
