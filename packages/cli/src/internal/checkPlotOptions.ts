import { BridgeworkError, checkFinite, checkOptions, formatValue } from '@bridgework/core';
import type { PlotAxis } from '../html/plotTypes.js';

/**
 * The limits of the plot functions, so that no input can make them run long or build a huge page:
 * a report's plots have a few series of at most a few thousand points and a few dozen bars.
 */
export const plotLimits = {
  /** Series per plot (the palette's colours). */
  maxSeries: 8,
  /** Categories (rows) of a bar chart. */
  maxCategories: 200,
  /** Points per series of a line plot. */
  maxPoints: 100_001,
  /** Characters of a title, label, unit, series or category name. */
  maxText: 500,
} as const;

/** A text of at most `plotLimits.maxText` characters. */
export function checkText(param: string, value: unknown): string {
  if (typeof value !== 'string') {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be a text; got ${formatValue(value)}`, {
      param,
      value,
    });
  }
  if (value.length > plotLimits.maxText) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must be at most ${plotLimits.maxText} characters; got ${value.length}`,
      { param, value: value.length, limit: plotLimits.maxText },
    );
  }
  return value;
}

/** A list (an array or a typed array) of `min`…`max` entries. */
export function checkList<T>(param: string, value: unknown, min: number, max: number): ArrayLike<T> {
  const isList = Array.isArray(value) || (ArrayBuffer.isView(value) && !(value instanceof DataView));
  if (!isList) {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be a list; got ${formatValue(value)}`, {
      param,
      value,
    });
  }
  const n = (value as ArrayLike<T>).length;
  if (n < min || n > max) {
    throw new BridgeworkError(
      n < min ? 'too-few-points' : 'out-of-range',
      `\`${param}\` must hold ${min === max ? min : `${min} to ${max}`} entries; got ${n}`,
      { param, value: n, limit: [min, max] },
    );
  }
  return value as ArrayLike<T>;
}

/** An axis: `label` (required), `unit`, and finite `min`/`max` with min < max when both are given. */
export function checkAxis(param: string, value: unknown): PlotAxis {
  const o = checkOptions(param, value, { known: ['label', 'unit', 'min', 'max'], required: ['label'] });
  checkText(`${param}.label`, o['label']);
  if (o['unit'] !== undefined) checkText(`${param}.unit`, o['unit']);
  const min = o['min'] === undefined ? undefined : checkFinite(`${param}.min`, o['min']);
  const max = o['max'] === undefined ? undefined : checkFinite(`${param}.max`, o['max']);
  if (min !== undefined && max !== undefined && !(min < max)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}.max\` must be > ${param}.min (${min}); got ${max}`,
      {
        param: `${param}.max`,
        value: max,
        limit: min,
      },
    );
  }
  return o as unknown as PlotAxis;
}
