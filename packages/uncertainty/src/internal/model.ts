/** Checks and helpers shared by everything that calls a user's model. */
import { BridgeworkError, checkOptions, closestName, formatValue, isBridgeworkError } from '@bridgework/core';

/** A model in the record form: the inputs by name. */
export type RecordModelFunction = (x: Readonly<Record<string, number>>) => unknown;

/** A checked model, in either form, bound to the input names of a run. */
export type ResolvedModel =
  | {
      readonly kind: 'record';
      readonly evaluate: RecordModelFunction;
    }
  | {
      readonly kind: 'positional';
      readonly evaluate: (x: Float64Array) => unknown;
      /** columns[i] of the run feeds x[i]: positions[i] is the index, in the inputs' order, of order[i]. */
      readonly positions: Int32Array;
      readonly gradient: ((x: Float64Array) => unknown) | undefined;
    };

/**
 * Checks a model given as a function (record form) or as `{ order, evaluate, gradient? }`
 * (positional form) against the input names, in the inputs' order.
 *
 * @throws `wrong-type` for anything else or a non-function `evaluate`/`gradient`;
 *   `unknown-option`/`missing-option` for the positional object's keys; `invalid-option` for a
 *   name in `order` that is not an input; `missing-option` for an input `order` lacks;
 *   `conflicting-options` for a name given twice.
 */
export function resolveModel(model: unknown, names: readonly string[], param = 'model'): ResolvedModel {
  if (typeof model === 'function') return { kind: 'record', evaluate: model as RecordModelFunction };
  if (typeof model !== 'object' || model === null || Array.isArray(model)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`${param}\` must be a function of the inputs by name, or { order, evaluate } taking them by position; got ${formatValue(model)}`,
      { param, value: model },
    );
  }
  const o = checkOptions(param, model, {
    known: ['order', 'evaluate', 'gradient'],
    required: ['order', 'evaluate'],
  });
  for (const key of ['evaluate', 'gradient'] as const) {
    if (o[key] !== undefined && typeof o[key] !== 'function') {
      throw new BridgeworkError(
        'wrong-type',
        `\`${param}.${key}\` must be a function; got ${formatValue(o[key])}`,
        {
          param: `${param}.${key}`,
          value: o[key],
        },
      );
    }
  }
  const order = o['order'];
  if (!Array.isArray(order)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`${param}.order\` must be an array of the input names; got ${formatValue(order)}`,
      { param: `${param}.order`, value: order },
    );
  }
  const positions = new Int32Array(names.length);
  const seen = new Set<string>();
  order.forEach((name: unknown, i) => {
    const at = typeof name === 'string' ? names.indexOf(name) : -1;
    if (at < 0) {
      const near = typeof name === 'string' ? closestName(name, names) : undefined;
      throw new BridgeworkError(
        'invalid-option',
        `\`${param}.order[${i}]\` must name an input; got ${formatValue(name)}${near === undefined ? ` (inputs: ${names.join(', ')})` : `; did you mean '${near}'?`}`,
        { param: `${param}.order[${i}]`, value: name, limit: names },
      );
    }
    if (seen.has(name as string)) {
      throw new BridgeworkError(
        'conflicting-options',
        `\`${param}.order[${i}]\` must not repeat '${String(name)}'`,
        { param: `${param}.order[${i}]`, value: name },
      );
    }
    seen.add(name as string);
    positions[i] = at;
  });
  const missing = names.find((name) => !seen.has(name));
  if (missing !== undefined) {
    throw new BridgeworkError(
      'missing-option',
      `\`${param}.order\` must name every input; '${missing}' is missing`,
      { param: `${param}.order`, value: order, limit: names },
    );
  }
  return {
    kind: 'positional',
    evaluate: o['evaluate'] as (x: Float64Array) => unknown,
    positions,
    gradient: o['gradient'] as ((x: Float64Array) => unknown) | undefined,
  };
}

/** A model's output as an array of numbers: a number gives one entry; an array or typed array its entries. */
export function toOutputs(raw: unknown): Float64Array | undefined {
  if (typeof raw === 'number') return Float64Array.of(raw);
  if (Array.isArray(raw))
    return raw.every((v) => typeof v === 'number') ? Float64Array.from(raw as number[]) : undefined;
  if (raw instanceof Float64Array || raw instanceof Float32Array) return Float64Array.from(raw);
  return undefined;
}

/** "(V = 4.999, I = 0.019661)": the inputs at a point, for error messages. */
export function describePoint(names: readonly string[], point: ArrayLike<number>): string {
  return names.map((n, i) => `${n} = ${String(point[i])}`).join(', ');
}

/**
 * The error to report when the model fails at a point: a BridgeworkError keeps its code, param,
 * value and limit, with `where` added to its message; anything else a model throws becomes
 * `model-failed`. The original is the `cause`.
 */
export function locateModelError(error: unknown, where: string): BridgeworkError {
  if (isBridgeworkError(error)) {
    return new BridgeworkError(error.code, `${error.message} ${where}`, {
      ...(error.param === undefined ? {} : { param: error.param }),
      ...(error.value === undefined ? {} : { value: error.value }),
      ...(error.limit === undefined ? {} : { limit: error.limit }),
      ...(error.issues.length === 0 ? {} : { issues: error.issues }),
      cause: error,
    });
  }
  const what = error instanceof Error ? `${error.name}: ${error.message}` : formatValue(error);
  return new BridgeworkError('model-failed', `\`model\` threw ${what} ${where}`, {
    param: 'model',
    cause: error,
  });
}
