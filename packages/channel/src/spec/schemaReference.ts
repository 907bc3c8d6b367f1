/**
 * The field reference (docs/channel-file.md, the command's help) and the JSON Schema of a spec,
 * made from the schema's node shapes and the fields' meanings (`fieldDocs.ts`). Validation does
 * not import this module, so an application that only validates and converts does not carry it.
 */
import { formatQuantity, unitSymbols } from '../units/quantity.js';
import { dimensionTable } from '../units/unitTable.js';
import {
  joinPath,
  limitsText,
  listLengthText,
  type AnyNode,
  type FieldRow,
  type NumberOptions,
} from './schema.js';

/** A field's meaning and, where its default depends on other fields, the default in words. */
export interface FieldDoc {
  /** One-line meaning. */
  readonly doc: string;
  /** The default as the field reference shows it (for defaults that depend on other fields). */
  readonly defaultText?: string;
}

/** Meanings by field path (`bridge.wiring`, `sensor<rtd>.r0Ohms`; the tagged union's at its own path, `sensor`). */
export type FieldDocs = Readonly<Record<string, FieldDoc>>;

function docOf(node: AnyNode, path: string, docs: FieldDocs): string {
  return (Object.hasOwn(docs, path) ? docs[path]?.doc : undefined) ?? node.doc ?? '';
}

function unitTextOf(o: NumberOptions): string {
  const rule = o.unit;
  return rule === undefined ? '' : 'dimension' in rule ? dimensionTable[rule.dimension].si : rule.describe;
}

/** The default as the field reference shows it, or undefined (`required` or `optional`). */
function defaultTextOf(node: AnyNode, path: string, docs: FieldDocs): string | undefined {
  const given = Object.hasOwn(docs, path) ? docs[path]?.defaultText : undefined;
  if (given !== undefined) return given;
  const shape = node.shape;
  switch (shape.form) {
    case 'number': {
      const o = shape.options;
      return (
        o.defaultText ??
        (o.default === undefined
          ? undefined
          : formatQuantity(o.default, o.default === 0 ? '' : unitTextOf(o), 17))
      );
    }
    case 'choice':
    case 'text':
      return (
        shape.options.defaultText ??
        (shape.options.default === undefined ? undefined : `'${shape.options.default}'`)
      );
    case 'boolean':
      return (
        shape.options.defaultText ??
        (shape.options.default === undefined ? undefined : String(shape.options.default))
      );
    case 'interval':
      return shape.options.defaultText;
    case 'number-list':
      return (
        shape.options.defaultText ??
        (shape.options.default === undefined ? undefined : `[${shape.options.default.join(', ')}]`)
      );
    case 'object':
      return node.presence === 'default' ? 'defaults of its fields' : undefined;
    default:
      return undefined;
  }
}

function row(node: AnyNode, path: string, docs: FieldDocs, type: string, unit = ''): FieldRow {
  return {
    path,
    type,
    unit,
    presence: defaultTextOf(node, path, docs) ?? (node.presence === 'required' ? 'required' : 'optional'),
    doc: docOf(node, path, docs),
  };
}

function numberType(o: NumberOptions): string {
  const limits = limitsText(o, unitTextOf(o));
  return `${o.integer === true ? 'integer' : 'number'}${o.limitText !== undefined ? ` (${o.limitText})` : limits === '' ? '' : ` (${limits})`}`;
}

/**
 * The rows of the field reference for a node and everything under it.
 *
 * @param node - The node.
 * @param path - Its path (`''` for the root, which has no row of its own).
 * @param docs - The fields' meanings by path (a node's own `doc` serves where the table has none).
 * @returns The rows, in schema order.
 */
export function fieldRows(node: AnyNode, path: string, docs: FieldDocs): FieldRow[] {
  const shape = node.shape;
  switch (shape.form) {
    case 'number':
      return [row(node, path, docs, numberType(shape.options), unitTextOf(shape.options))];
    case 'choice':
      return [row(node, path, docs, shape.values.map((v) => `'${v}'`).join(' \\| '))];
    case 'boolean':
      return [row(node, path, docs, 'boolean')];
    case 'text':
      return [row(node, path, docs, 'text')];
    case 'interval': {
      const o = shape.options;
      const unit = unitTextOf(o);
      const limits = limitsText(o, unit);
      return [row(node, path, docs, `[min, max]${limits === '' ? '' : ` (each ${limits})`}`, unit)];
    }
    case 'number-list':
      return [row(node, path, docs, `list of ${listLengthText(shape.options)} numbers`)];
    case 'object':
      return [
        ...(path === '' ? [] : [row(node, path, docs, 'object')]),
        ...Object.keys(shape.fields).flatMap((k) =>
          fieldRows(shape.fields[k] as AnyNode, joinPath(path, k), docs),
        ),
      ];
    case 'tagged': {
      const names = Object.keys(shape.variants);
      return [
        {
          path: joinPath(path, shape.tag),
          type: names.map((n) => `'${n}'`).join(' \\| '),
          unit: '',
          presence: 'required',
          doc: docOf(node, path, docs),
        },
        ...names.flatMap((n) => fieldRows(shape.variants[n] as AnyNode, `${path}<${n}>`, docs)),
      ];
    }
    case 'custom':
      return [row(node, path, docs, shape.type, shape.unit)];
  }
}

function numberJson(o: NumberOptions, description: string | undefined): Record<string, unknown> {
  const rule = o.unit;
  const n: Record<string, unknown> = { type: o.integer === true ? 'integer' : 'number' };
  if (o.min !== undefined) n[o.minExclusive === true ? 'exclusiveMinimum' : 'minimum'] = o.min;
  if (o.max !== undefined) n[o.maxExclusive === true ? 'exclusiveMaximum' : 'maximum'] = o.max;
  const meta = { description, ...(o.default === undefined ? {} : { default: o.default }) };
  if (rule === undefined) return { ...n, ...meta };
  const unitText = unitTextOf(o);
  const units = 'dimension' in rule ? unitSymbols(rule.dimension).filter((s) => s !== '') : [];
  return {
    ...meta,
    'x-unit': unitText,
    anyOf: [
      n,
      {
        type: 'string',
        pattern: '^\\s*[+\\-−]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+\\-−]?\\d+)?\\s*\\S*',
        description:
          units.length > 0 ? `a number and a unit: ${units.join(', ')}` : `a number and a unit (${unitText})`,
      },
    ],
  };
}

/**
 * The JSON Schema (draft 2020-12) of a node and everything under it.
 *
 * @param node - The node.
 * @param path - Its path, as {@link fieldRows} names it (for the meanings).
 * @param docs - The fields' meanings by path.
 * @returns The schema object.
 */
export function fieldJsonSchema(node: AnyNode, path: string, docs: FieldDocs): Record<string, unknown> {
  const shape = node.shape;
  const description = docOf(node, path, docs);
  switch (shape.form) {
    case 'number':
      return numberJson(shape.options, description);
    case 'choice':
      return {
        enum: [...shape.values],
        description,
        ...(shape.options.default === undefined ? {} : { default: shape.options.default }),
      };
    case 'boolean':
      return {
        type: 'boolean',
        description,
        ...(shape.options.default === undefined ? {} : { default: shape.options.default }),
      };
    case 'text':
      return {
        type: 'string',
        description,
        ...(shape.options.pattern ? { pattern: shape.options.pattern.source } : {}),
        ...(shape.options.default === undefined ? {} : { default: shape.options.default }),
      };
    case 'interval': {
      const o = shape.options;
      const item = numberJson(o, 'an end'); // an interval has no default
      return {
        description,
        ...(o.unit === undefined ? {} : { 'x-unit': unitTextOf(o) }),
        anyOf: [
          { type: 'array', items: item, minItems: 2, maxItems: 2 },
          {
            type: 'object',
            additionalProperties: false,
            required: ['min', 'max'],
            properties: { min: item, max: item },
          },
        ],
      };
    }
    case 'number-list':
      return {
        type: 'array',
        description,
        items: numberJson(shape.options.item, shape.options.item.doc),
        minItems: shape.options.minLength,
        maxItems: shape.options.maxLength,
      };
    case 'object': {
      const known = Object.keys(shape.fields);
      const required = known.filter((k) => (shape.fields[k] as AnyNode).presence === 'required');
      return {
        type: 'object',
        description,
        additionalProperties: false,
        properties: Object.fromEntries(
          known.map((k) => [k, fieldJsonSchema(shape.fields[k] as AnyNode, joinPath(path, k), docs)]),
        ),
        ...(required.length > 0 ? { required } : {}),
      };
    }
    case 'tagged':
      return {
        description,
        oneOf: Object.keys(shape.variants).map((n) => {
          const s = fieldJsonSchema(shape.variants[n] as AnyNode, `${path}<${n}>`, docs) as {
            properties?: Record<string, unknown>;
            required?: string[];
          };
          return {
            ...s,
            properties: { [shape.tag]: { const: n }, ...(s.properties ?? {}) },
            required: [shape.tag, ...(s.required ?? [])],
          };
        }),
      };
    case 'custom':
      return { description, ...shape.json };
  }
}
