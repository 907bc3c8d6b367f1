/**
 * A small schema engine for specs written by people: each node validates a value (every problem
 * as data, in the user's terms and unit), applies its default, states its shape (what it is, its
 * limits, its unit) as data, and carries its TypeScript types, so that the spec's types are
 * derived from the schema (`InputOf`, `OutputOf`) and cannot drift from it.
 *
 * The JSON Schema and the rows of the field reference are made from the shapes by
 * `schemaReference.ts`, and the fields' meanings are in `fieldDocs.ts`: neither is imported by
 * validation, so an application that only validates and converts does not carry them. A required
 * field keeps its meaning here (`doc`), because the message for a missing one quotes it.
 *
 * Object nodes read only their own known keys: a key named like an object prototype member
 * (`constructor`, `__proto__`, `toString`) is an unknown field like any other.
 */
import { closestName, formatValue, type ErrorCode, type SpecIssue } from '@bridgework/core';
import { formatQuantity, readQuantity } from '../units/quantity.js';
import { dimensionTable, type Dimension } from '../units/unitTable.js';

/** A quantity written with its unit, such as `'350 Ω'` or `'20 t'` (see docs/channel-file.md). */
export type QuantityText = `${number}${string}`;

/**
 * How a field may be absent: never; freely (`undefined` in the result); with a default; or
 * `'derived'`: a default that depends on other fields, filled in by the enclosing object's
 * `finalize` (so the result always has it).
 */
export type Presence = 'required' | 'optional' | 'default' | 'derived';

/** A row of the field reference (docs/channel-file.md and the CLI's help). */
export interface FieldRow {
  /** Dotted path; `[]` marks list items, `<kind>` the fields of one sensor kind. */
  readonly path: string;
  /** The value's type in words (`number (> 0)`, `'quarter' \| 'half-bending'`). */
  readonly type: string;
  /** The unit of a plain number, or `''`; the units accepted are listed in docs/channel-file.md. */
  readonly unit: string;
  /** `required`, the default as text, or `optional`. */
  readonly presence: string;
  /** One-line meaning. */
  readonly doc: string;
}

/** Marks a value that failed (its issue is recorded). */
export const INVALID: unique symbol = Symbol('invalid');
/** The type of {@link INVALID}. */
export type Invalid = typeof INVALID;

/** State of one validation run. */
export interface ParseContext {
  /** Every problem found so far. */
  readonly issues: SpecIssue[];
  /** Prefix of every reported path (`channels.hanger`), or `''`. */
  readonly prefix: string;
  /** Values parsed so far, by path (without the prefix): later fields may depend on earlier ones. */
  readonly parsed: Map<string, unknown>;
  /** The units in which the user wrote each quantity, by path (without the prefix). */
  readonly writtenUnits: Map<string, string>;
}

/** Records an issue at `path` (without the prefix) and returns {@link INVALID}. */
export function report(
  ctx: ParseContext,
  path: string,
  code: ErrorCode,
  message: string,
  extra: Pick<SpecIssue, 'limit' | 'expected' | 'suggestion'> = {},
): Invalid {
  ctx.issues.push({ code, path: joinPath(ctx.prefix, path), message, ...extra });
  return INVALID;
}

/** `a.b` from `a` and `b` (either may be empty). */
export function joinPath(a: string, b: string): string {
  return a === '' ? b : b === '' ? a : `${a}.${b}`;
}

/** A node of a schema (see the module comment). `In` is what may be written, `Out` what validation returns. */
export interface SchemaNode<In, Out, P extends Presence = Presence> {
  /** Whether the field may be absent. */
  readonly presence: P;
  /**
   * One-line meaning, where the node carries it: a required field's (the message for a missing
   * one quotes it), or a field of a sensor kind made outside the package. The built-in fields'
   * other meanings are in `fieldDocs.ts`.
   */
  readonly doc?: string | undefined;
  /** The value of an absent field with a default. */
  readonly fallback: Out | undefined;
  /** What the node is, for the field reference and the JSON Schema (validation does not read it). */
  readonly shape: NodeShape;
  /** Validates `value` at `path`; returns the value or {@link INVALID} (its issues recorded). */
  parse(value: unknown, path: string, ctx: ParseContext): Out | Invalid;
  /** Phantom: the input type. */
  readonly ['~in']?: In;
}

/** Any node. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyNode = SchemaNode<any, any, Presence>;
/** What may be written for a node. */
export type InOf<N> = N extends SchemaNode<infer I, unknown, Presence> ? I : never;
/** What validation returns for a node. */
export type OutOf<N> = N extends SchemaNode<unknown, infer O, Presence> ? O : never;
/** The fields of an object node. */
export type Fields = Readonly<Record<string, AnyNode>>;

type Expand<T> = T extends object ? { [K in keyof T]: T[K] } : T;
type RequiredIn<F extends Fields> = {
  [K in keyof F]: F[K]['presence'] extends 'required' ? K : never;
}[keyof F];
type OptionalOut<F extends Fields> = {
  [K in keyof F]: F[K]['presence'] extends 'optional' ? K : never;
}[keyof F];

/** What may be written for an object with these fields. */
export type ObjectIn<F extends Fields> = Expand<
  { readonly [K in RequiredIn<F>]: InOf<F[K]> } & {
    readonly [K in Exclude<keyof F, RequiredIn<F>>]?: InOf<F[K]>;
  }
>;
/** What validation returns for an object with these fields (defaults applied, so only optional fields may be absent). */
export type ObjectOut<F extends Fields> = Expand<
  { readonly [K in Exclude<keyof F, OptionalOut<F>>]: OutOf<F[K]> } & {
    readonly [K in OptionalOut<F>]?: OutOf<F[K]>;
  }
>;

/**
 * What a node is, as data: the form and the options it was made with. `schemaReference.ts` makes
 * the JSON Schema and the field reference from it.
 */
export type NodeShape =
  | { readonly form: 'number'; readonly options: NumberOptions }
  | { readonly form: 'choice'; readonly values: readonly string[]; readonly options: FieldOptions<string> }
  | { readonly form: 'boolean'; readonly options: FieldOptions<boolean> }
  | { readonly form: 'text'; readonly options: FieldOptions<string> & { readonly pattern?: RegExp } }
  | { readonly form: 'interval'; readonly options: NumberOptions }
  | { readonly form: 'number-list'; readonly options: NumberListOptions }
  | { readonly form: 'object'; readonly fields: Fields }
  | { readonly form: 'tagged'; readonly tag: string; readonly variants: Readonly<Record<string, AnyNode>> }
  | {
      /** A node with its own parser; its reference row and JSON Schema are given as data. */
      readonly form: 'custom';
      /** The type column of the field reference. */
      readonly type: string;
      /** The unit column. */
      readonly unit: string;
      /** Its JSON Schema, without the description. */
      readonly json: Readonly<Record<string, unknown>>;
    };

/** Options every field takes. */
export interface FieldOptions<T> {
  /**
   * One-line meaning. A required field states it here (the message for a missing one quotes
   * it); the built-in fields' other meanings are in `fieldDocs.ts`, which validation does not
   * import.
   */
  readonly doc?: string;
  /** The default (makes the field optional on input, present on output). */
  readonly default?: T;
  /** The field may be absent without a default (`undefined` on output). */
  readonly optional?: boolean;
  /** How the reference describes a default that depends on other fields (with `optional` or `derived`). */
  readonly defaultText?: string;
  /** The default depends on other fields; the enclosing object's `finalize` fills it in. */
  readonly derived?: boolean;
}

/** The presence that field options declare. */
export type PresenceOf<O> = O extends { readonly default: unknown }
  ? 'default'
  : O extends { readonly derived: true }
    ? 'derived'
    : O extends { readonly optional: true }
      ? 'optional'
      : 'required';

function presenceOf<T>(o: FieldOptions<T>): Presence {
  return o.default !== undefined
    ? 'default'
    : o.derived === true
      ? 'derived'
      : o.optional === true
        ? 'optional'
        : 'required';
}

// ---------------------------------------------------------------------------------------------
// Numbers and quantities

/** How a number field reads units. */
export type UnitRule =
  | { readonly dimension: Dimension }
  /** Decided while validating, from fields parsed before (the output unit of `output.range`). */
  | {
      readonly dynamic: (
        ctx: ParseContext,
      ) => { readonly dimension: Dimension; readonly unit: string } | undefined;
      /** The unit column of the field reference. */
      readonly describe: string;
    };

/** Options of a number field. */
export interface NumberOptions extends FieldOptions<number> {
  /** The dimension (units accepted as text; plain numbers are in its unit). Default: a plain number. */
  readonly unit?: UnitRule;
  /** Lower limit (in the field's unit). */
  readonly min?: number;
  /** Upper limit. */
  readonly max?: number;
  /** Exclude `min`. */
  readonly minExclusive?: boolean;
  /** Exclude `max`. */
  readonly maxExclusive?: boolean;
  /** Must be an integer. */
  readonly integer?: boolean;
  /** Limit text when the limits are not constants (shown in the reference only). */
  readonly limitText?: string;
}

type NumberIn<O> = O extends { readonly unit: UnitRule } ? number | QuantityText : number;

/** The limits of a number field in words (`>= 0 and < 1`), in the given unit. */
export function limitsText(o: NumberOptions, unit: string): string {
  const parts: string[] = [];
  const show = (x: number) => formatQuantity(x, x === 0 ? '' : unit, 6);
  if (o.min !== undefined) parts.push(`${o.minExclusive === true ? '>' : '>='} ${show(o.min)}`);
  if (o.max !== undefined) parts.push(`${o.maxExclusive === true ? '<' : '<='} ${show(o.max)}`);
  return parts.join(' and ');
}

function limitCode(o: NumberOptions, low: boolean): ErrorCode {
  if (low && o.min === 0 && o.max === undefined) return o.minExclusive === true ? 'not-positive' : 'negative';
  return 'out-of-range';
}

/** The dimension and unit of a number field (a dynamic one needs the context). */
export function unitOf(
  rule: UnitRule | undefined,
  ctx: ParseContext | undefined,
): { dimension: Dimension; unit: string } | undefined {
  if (rule === undefined) return { dimension: 'dimensionless', unit: '' };
  if ('dimension' in rule) return { dimension: rule.dimension, unit: dimensionTable[rule.dimension].si };
  return ctx === undefined ? undefined : rule.dynamic(ctx);
}

/** Reads a number (or a quantity with a unit) and checks its limits; shared by number fields and pairs. */
export function parseNumber(
  o: NumberOptions,
  value: unknown,
  path: string,
  ctx: ParseContext,
): number | Invalid {
  const u = unitOf(o.unit, ctx);
  if (u === undefined) return INVALID; // the field deciding the unit is invalid and reported
  if (typeof value === 'string' && o.unit === undefined) {
    return report(
      ctx,
      path,
      'wrong-type',
      `must be ${o.integer === true ? 'an integer' : 'a number'}; got ${formatValue(value)}`,
    );
  }
  const r = readQuantity(value, u.dimension, { unit: u.unit, plainUnit: u.unit });
  if (!r.ok) {
    return report(ctx, path, r.problem.code, r.problem.message, { expected: r.problem.expected });
  }
  const x = r.value;
  if (typeof value === 'string') ctx.writtenUnits.set(path, r.writtenUnit);
  const shown = u.unit;
  if (o.integer === true && !Number.isInteger(x)) {
    return report(ctx, path, 'not-integer', `must be an integer; got ${formatValue(x)}`, {
      expected: 'an integer',
    });
  }
  const low = o.min !== undefined && (o.minExclusive === true ? !(x > o.min) : !(x >= o.min));
  const high = o.max !== undefined && (o.maxExclusive === true ? !(x < o.max) : !(x <= o.max));
  if (low || high) {
    const expected = limitsText(o, shown);
    const limit = low ? o.min! : o.max!;
    return report(
      ctx,
      path,
      limitCode(o, low),
      `must be ${expected}; got ${shown === '' ? String(x) : `${String(x)} ${shown}`}`,
      {
        expected,
        limit: formatQuantity(limit, limit === 0 ? '' : shown, 6),
      },
    );
  }
  return x;
}

/** A finite number, optionally a quantity with a unit, with limits. */
export function numberField<const O extends NumberOptions>(
  o: O,
): SchemaNode<NumberIn<O>, number, PresenceOf<O>> {
  return {
    presence: presenceOf(o) as PresenceOf<O>,
    doc: o.doc,
    fallback: o.default,
    shape: { form: 'number', options: o },
    parse: (value, path, ctx) => parseNumber(o, value, path, ctx),
  };
}

// ---------------------------------------------------------------------------------------------
// Choices, booleans, texts

/** One of a list of strings. */
export function choiceField<const T extends string, const O extends FieldOptions<T>>(
  values: readonly T[],
  o: O,
): SchemaNode<T, T, PresenceOf<O>> {
  const list = () => values.map((v) => `'${v}'`).join(', ');
  return {
    presence: presenceOf(o) as PresenceOf<O>,
    doc: o.doc,
    fallback: o.default,
    shape: { form: 'choice', values, options: o },
    parse(value, path, ctx) {
      if (typeof value === 'string' && (values as readonly string[]).includes(value)) return value as T;
      const near = typeof value === 'string' && value.length >= 3 ? closestName(value, values) : undefined;
      return report(
        ctx,
        path,
        'invalid-option',
        `must be one of ${list()}; got ${formatValue(value)}${near === undefined ? '' : `; did you mean '${near}'?`}`,
        {
          expected: `one of ${list()}`,
          ...(near === undefined ? {} : { suggestion: `write '${near}'` }),
        },
      );
    },
  };
}

/** `true` or `false`. */
export function booleanField<const O extends FieldOptions<boolean>>(
  o: O,
): SchemaNode<boolean, boolean, PresenceOf<O>> {
  return {
    presence: presenceOf(o) as PresenceOf<O>,
    doc: o.doc,
    fallback: o.default,
    shape: { form: 'boolean', options: o },
    parse: (value, path, ctx) =>
      typeof value === 'boolean'
        ? value
        : report(ctx, path, 'wrong-type', `must be true or false; got ${formatValue(value)}`, {
            expected: 'true or false',
          }),
  };
}

/** A text, optionally matching a pattern. */
export function textField<
  const O extends FieldOptions<string> & { readonly pattern?: RegExp; readonly maxLength?: number },
>(o: O): SchemaNode<string, string, PresenceOf<O>> {
  const maxLength = o.maxLength ?? 200;
  return {
    presence: presenceOf(o) as PresenceOf<O>,
    doc: o.doc,
    fallback: o.default,
    shape: { form: 'text', options: o },
    parse(value, path, ctx) {
      if (typeof value !== 'string')
        return report(ctx, path, 'wrong-type', `must be a text; got ${formatValue(value)}`, {
          expected: 'a text',
        });
      if (value.length > maxLength) {
        return report(
          ctx,
          path,
          'out-of-range',
          `must be at most ${maxLength} characters long; got ${value.length}`,
          { limit: String(maxLength) },
        );
      }
      if (o.pattern !== undefined && !o.pattern.test(value)) {
        return report(
          ctx,
          path,
          'invalid-option',
          `must match ${String(o.pattern)}; got ${formatValue(value)}`,
        );
      }
      return value;
    },
  };
}

// ---------------------------------------------------------------------------------------------
// Lists and intervals

/** A closed interval `{ min, max }` (the spec's form of a range). */
export interface SpecInterval {
  /** Lower end. */
  readonly min: number;
  /** Upper end. */
  readonly max: number;
}

/** What may be written for an interval: `[min, max]` or `{ min, max }`. */
export type IntervalIn<T> = readonly [T, T] | { readonly min: T; readonly max: T };

/** An interval written `[min, max]` or `{ min, max }`, each end a number of the given kind; min < max (or ≤ with `allowEqual`). */
export function intervalField<
  const O extends Omit<NumberOptions, 'default'> & { readonly allowEqual?: boolean },
>(o: O): SchemaNode<IntervalIn<NumberIn<O>>, SpecInterval, PresenceOf<O>> {
  const rule = o.unit;
  return {
    presence: presenceOf(o) as PresenceOf<O>,
    doc: o.doc,
    fallback: undefined,
    shape: { form: 'interval', options: o },
    parse(value, path, ctx) {
      let ends: [unknown, unknown] | undefined;
      let names: [string, string] = ['[0]', '[1]'];
      if (Array.isArray(value)) {
        if (value.length === 2) ends = [value[0], value[1]];
      } else if (typeof value === 'object' && value !== null) {
        const keys = Object.keys(value);
        if (keys.length === 2 && keys.includes('min') && keys.includes('max')) {
          ends = [(value as Record<string, unknown>)['min'], (value as Record<string, unknown>)['max']];
          names = ['.min', '.max'];
        }
      }
      if (ends === undefined) {
        return report(
          ctx,
          path,
          'invalid-shape',
          `must be a range [min, max] (or { min, max }); got ${formatValue(value)}`,
          {
            expected: '[min, max]',
          },
        );
      }
      const a = parseNumber(o, ends[0], `${path}${names[0]}`, ctx);
      const b = parseNumber(o, ends[1], `${path}${names[1]}`, ctx);
      if (a === INVALID || b === INVALID) return INVALID;
      const u = unitOf(rule, ctx)?.unit ?? '';
      if (o.allowEqual === true ? !(a <= b) : !(a < b)) {
        return report(
          ctx,
          path,
          'out-of-range',
          `must have min ${o.allowEqual === true ? '<=' : '<'} max; got [${String(a)}, ${String(b)}]${u === '' ? '' : ` ${u}`}`,
          {
            expected: `min ${o.allowEqual === true ? '<=' : '<'} max`,
            suggestion: 'swap the two ends',
          },
        );
      }
      return { min: a, max: b };
    },
  };
}

/** Options of a list of numbers. */
export interface NumberListOptions extends FieldOptions<readonly number[]> {
  /** Fewest numbers. */
  readonly minLength: number;
  /** Most numbers. */
  readonly maxLength: number;
  /** Each number's options (its `doc` is the items' description in the JSON Schema). */
  readonly item: NumberOptions;
}

/** The length of a list field in words (`4`, `1 to 5`). */
export function listLengthText(o: NumberListOptions): string {
  return o.minLength === o.maxLength ? `${o.minLength}` : `${o.minLength} to ${o.maxLength}`;
}

/** A list of numbers of bounded length (polynomial coefficients). */
export function numberListField<const O extends NumberListOptions>(
  o: O,
): SchemaNode<readonly number[], readonly number[], PresenceOf<O>> {
  const length = listLengthText(o);
  return {
    presence: presenceOf(o) as PresenceOf<O>,
    doc: o.doc,
    fallback: o.default,
    shape: { form: 'number-list', options: o },
    parse(value, path, ctx) {
      if (!Array.isArray(value) || value.length < o.minLength || value.length > o.maxLength) {
        return report(
          ctx,
          path,
          'invalid-shape',
          `must be a list of ${length} numbers; got ${formatValue(value)}`,
          {
            expected: `a list of ${length} numbers`,
          },
        );
      }
      const out: number[] = [];
      let ok = true;
      value.forEach((v: unknown, i) => {
        const x = parseNumber(o.item, v, `${path}[${i}]`, ctx);
        if (x === INVALID) ok = false;
        else out.push(x);
      });
      return ok ? out : INVALID;
    },
  };
}

// ---------------------------------------------------------------------------------------------
// Objects and tagged unions

/** A rule that involves several fields; it reports against the field the user can change. */
export type CrossCheck<T> = (value: T, path: string, ctx: ParseContext) => void;

/** Options of an object field. */
export interface ObjectOptions<T> {
  /** One-line meaning (see {@link FieldOptions.doc}). */
  readonly doc?: string;
  /**
   * `'required'`; `'optional'` (absent stays absent); or `'default'`: an absent object takes the
   * defaults of its fields (each must have one or be optional).
   */
  readonly presence?: Presence;
  /** Fills in the fields whose presence is `'derived'`, once every field is valid (before `check`). */
  readonly finalize?: (value: T, path: string, ctx: ParseContext) => T;
  /** Rules across the fields, run when every field is valid. */
  readonly check?: CrossCheck<T>;
  /**
   * Keys this object no longer has, each with where its value is written now (a field path from
   * the channel, such as `'adc.filter.dataRateHertz'`, or a short instruction): an unknown-field
   * issue for such a key says so instead of guessing the closest name.
   */
  readonly renamed?: Readonly<Record<string, string>>;
}

function isPlainRecord(value: unknown): value is Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return false;
  const proto = Object.getPrototypeOf(value) as unknown;
  return proto === Object.prototype || proto === null;
}

/** Reads an own field, never an inherited one. */
export function ownField(record: Record<string, unknown>, key: string): unknown {
  return Object.hasOwn(record, key) ? record[key] : undefined;
}

/** A record with known fields; any other key is a problem (typo protection). */
export function objectField<F extends Fields, const P extends Presence = 'required'>(
  fields: F,
  o: ObjectOptions<ObjectOut<F>> & { readonly presence?: P },
): SchemaNode<ObjectIn<F>, ObjectOut<F>, P> {
  const known = Object.keys(fields);
  const presence = (o.presence ?? 'required') as P;
  let fallback: ObjectOut<F> | undefined;
  if (presence === 'default') {
    const value: Record<string, unknown> = {};
    for (const [k, f] of Object.entries(fields)) {
      if (f.presence === 'default') value[k] = f.fallback;
      else if (f.presence === 'required')
        throw new Error(`schema: field '${k}' of a defaulted object needs a default`);
    }
    fallback = value as ObjectOut<F>;
  }
  return {
    presence,
    doc: o.doc,
    fallback,
    shape: { form: 'object', fields },
    parse(value, path, ctx) {
      if (!isPlainRecord(value)) {
        return report(
          ctx,
          path,
          'wrong-type',
          `must be a set of fields (${known.join(', ')}); got ${formatValue(value)}`,
          {
            expected: 'a set of fields',
          },
        );
      }
      let ok = true;
      for (const key of Object.keys(value)) {
        if (!Object.hasOwn(fields, key)) {
          const moved = o.renamed !== undefined && Object.hasOwn(o.renamed, key) ? o.renamed[key] : undefined;
          const near = moved === undefined ? closestName(key, known) : undefined;
          report(
            ctx,
            joinPath(path, key),
            'unknown-option',
            moved !== undefined
              ? `unknown field: renamed; write it as ${moved}`
              : near === undefined
                ? `unknown field; expected one of ${known.join(', ')}`
                : `unknown field; did you mean '${near}'?`,
            moved !== undefined
              ? { suggestion: `write it as ${moved}` }
              : {
                  expected: `one of ${known.join(', ')}`,
                  ...(near === undefined ? {} : { suggestion: `write '${near}'` }),
                },
          );
          ok = false;
        }
      }
      const out: Record<string, unknown> = {};
      for (const key of known) {
        const f = fields[key] as AnyNode;
        const p = joinPath(path, key);
        const given = ownField(value, key);
        if (given === undefined || given === null) {
          const what = f.doc === undefined ? '' : ` (${f.doc})`;
          if (given === null && f.presence === 'required') {
            report(ctx, p, 'missing-option', `is required${what}; got null`);
            ok = false;
          } else if (f.presence === 'default') out[key] = f.fallback;
          else if (f.presence === 'required') {
            report(
              ctx,
              p,
              'missing-option',
              `is required${what}`,
              f.doc === undefined ? {} : { expected: f.doc },
            );
            ok = false;
          }
          if (out[key] !== undefined) ctx.parsed.set(p, out[key]);
          continue;
        }
        const x = f.parse(given, p, ctx);
        if (x === INVALID) ok = false;
        else {
          out[key] = x;
          ctx.parsed.set(p, x);
        }
      }
      if (!ok) return INVALID;
      const before = ctx.issues.length;
      const done =
        o.finalize === undefined ? (out as ObjectOut<F>) : o.finalize(out as ObjectOut<F>, path, ctx);
      if (ctx.issues.length > before) return INVALID;
      if (o.check !== undefined) {
        o.check(done, path, ctx);
        if (ctx.issues.length > before) return INVALID;
      }
      return done;
    },
  };
}

/** A union of objects told apart by a tag field (`kind`). */
export function taggedField<const V extends Readonly<Record<string, SchemaNode<object, object, Presence>>>>(
  tag: string,
  variants: V,
  o: { readonly doc?: string },
): SchemaNode<
  { [K in keyof V]: Expand<{ readonly kind: K } & InOf<V[K]>> }[keyof V],
  { [K in keyof V]: Expand<{ readonly kind: K } & OutOf<V[K]>> }[keyof V],
  'required'
> {
  const names = Object.keys(variants);
  const list = names.map((n) => `'${n}'`).join(', ');
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const node: SchemaNode<any, any, 'required'> = {
    presence: 'required',
    doc: o.doc,
    fallback: undefined,
    shape: { form: 'tagged', tag, variants },
    parse(value, path, ctx) {
      if (!isPlainRecord(value)) {
        return report(
          ctx,
          path,
          'wrong-type',
          `must be a set of fields with \`${tag}\` (one of ${list}); got ${formatValue(value)}`,
        );
      }
      const kind = ownField(value, tag);
      const variant = typeof kind === 'string' && Object.hasOwn(variants, kind) ? variants[kind] : undefined;
      if (variant === undefined) {
        if (kind === undefined)
          return report(ctx, joinPath(path, tag), 'missing-option', `is required (one of ${list})`, {
            expected: `one of ${list}`,
          });
        const near = typeof kind === 'string' ? closestName(kind, names) : undefined;
        return report(
          ctx,
          joinPath(path, tag),
          'invalid-option',
          `must be one of ${list}; got ${formatValue(kind)}${near === undefined ? '' : `; did you mean '${near}'?`}`,
          {
            expected: `one of ${list}`,
            ...(near === undefined ? {} : { suggestion: `write '${near}'` }),
          },
        );
      }
      ctx.parsed.set(joinPath(path, tag), kind);
      const rest: Record<string, unknown> = {};
      for (const key of Object.keys(value)) if (key !== tag) rest[key] = value[key];
      const parsed = variant.parse(rest, path, ctx);
      return parsed === INVALID ? INVALID : { [tag]: kind, ...parsed };
    },
  };
  return node;
}

/** Validates a value against a schema: the value with defaults applied, or every problem found. */
export function runSchema<N extends AnyNode>(
  schema: N,
  value: unknown,
  prefix = '',
): { readonly value: OutOf<N> | undefined; readonly ctx: ParseContext } {
  const ctx: ParseContext = { issues: [], prefix, parsed: new Map(), writtenUnits: new Map() };
  const out = schema.parse(value, '', ctx);
  return { value: out === INVALID || ctx.issues.length > 0 ? undefined : (out as OutOf<N>), ctx };
}
