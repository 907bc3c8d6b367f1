/** Checks and helpers shared by everything that calls a user's model. */
import { BridgeworkError, formatValue } from '@bridgework/core';

/** Checks that `model` is a function. */
export function checkModel(model: unknown): (x: Readonly<Record<string, number>>) => unknown {
  if (typeof model !== 'function') {
    throw new BridgeworkError('wrong-type', `\`model\` must be a function; got ${formatValue(model)}`, {
      param: 'model',
      value: model,
    });
  }
  return model as (x: Readonly<Record<string, number>>) => unknown;
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
