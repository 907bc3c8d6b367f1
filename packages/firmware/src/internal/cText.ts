/**
 * Comment text shared by the C emitters: wrapped block comments, bounds, and the statements of
 * error and cost every function carries.
 */
import { firmwareCost, type FirmwareMap } from '../firmwareCost.js';
import type { TotalErrorBound } from '../totalError.js';
import type { Verification } from '../verification.js';
import { rationalFromNumber } from './exact.js';
import { boundString, shortString } from './decimal.js';
import { commentText } from './text.js';

export const INDENT = '    ';

/** The C type of a float evaluator: `float` for float32, `double` for float64. */
export function cFloatType(precision: 'float32' | 'float64'): 'float' | 'double' {
  return precision === 'float32' ? 'float' : 'double';
}

/** A bound rounded upward to 6 significant digits. */
export function bound(x: number): string {
  return boundString(rationalFromNumber(x));
}

/** A unit for comments (printable ASCII), or a note that none was given. */
export function unitText(unit: string): string {
  const u = commentText(unit, 24);
  return u === '' ? '(unit not stated)' : u;
}

/** Wraps comment text at about 96 columns, every line starting with ` * `. */
function commentLines(text: string): string[] {
  const words = text.split(' ');
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if (line !== '' && line.length + 1 + w.length > 92) {
      lines.push(` * ${line}`);
      line = w;
    } else {
      line = line === '' ? w : `${line} ${w}`;
    }
  }
  if (line !== '') lines.push(` * ${line}`);
  return lines;
}

/** A block comment of paragraphs. */
export function block(paragraphs: readonly string[]): string[] {
  // Every user text went through commentText; this guards the generator's own wording.
  if (paragraphs.some((p) => p.includes('/*') || p.includes('*/'))) throw new Error('comment text nests');
  const out = ['/*'];
  paragraphs.forEach((p, i) => {
    if (i > 0) out.push(' *');
    out.push(...commentLines(p));
  });
  out.push(' */');
  return out;
}

/**
 * The statement of a function's total error against the exact map: the only figure called the
 * error. `expression` names what is compared (e.g. `0.01 * output`).
 */
export function totalText(
  total: TotalErrorBound,
  unit: string,
  expression: string,
  partsWhat: string,
): string[] {
  const worst = `the largest difference found is ${shortString(total.againstReference)} ${unit} at code ${total.worstCode}`;
  const reference =
    total.referenceError > 0
      ? `, plus ${bound(total.referenceError)} ${unit} for the exact map's own error (${commentText(total.referenceErrorSource, 200)})`
      : `; the exact map's own error is not included (${commentText(total.referenceErrorSource, 200)})`;
  const how = total.proved
    ? `proved: every one of the ${total.codesChecked} codes was evaluated as this function computes it and compared with the exact map (${worst})${reference}.`
    : `measured, not proved: the approximation error on ${total.codesChecked} sampled codes plus the analytic arithmetic bound (${worst})${reference}.`;
  return [
    `TOTAL ERROR: |${expression} - exact map| <= ${bound(total.bound)} ${unit} over the whole code range, ${how} Target ${shortString(total.target)} ${unit}: met.`,
    `Parts of it (not the error): approximation (${partsWhat} against the exact map) <= ${bound(total.approximation)} ${unit}, measured over the same codes; arithmetic (rounding in this function's number format) <= ${bound(total.arithmetic)} ${unit}, analytic bound.`,
  ];
}

/** The statement for a map emitted without an exact map: its arithmetic error only. */
export function ownErrorText(
  maxAbs: number,
  analytic: number,
  v: Verification | undefined,
  unit: string,
  formula: string,
): string {
  const head = `No total error is stated: no exact map was given to the generator. Arithmetic error against this function's own formula (${formula}):`;
  if (v === undefined) return `${head} <= ${bound(analytic)} ${unit}, analytic bound.`;
  const worst = `largest at code ${v.worstCode}: ${shortString(v.worstError)} ${unit}`;
  return v.method === 'exhaustive'
    ? `${head} <= ${bound(maxAbs)} ${unit}, proved by evaluating all ${v.codesChecked} codes (${worst}); the analytic bound is ${bound(analytic)} ${unit}.`
    : `${head} <= ${bound(maxAbs)} ${unit}, the analytic bound, checked on ${v.codesChecked} sampled codes (${worst}).`;
}

/** The cost line of a function. */
export function costText(map: FirmwareMap): string {
  const c = firmwareCost(map);
  const parts = [
    [c.multiplies, 'multiply', 'multiplies'],
    [c.additions, 'addition', 'additions'],
    [c.shifts, 'shift or mask', 'shifts or masks'],
    [c.comparisons, 'comparison', 'comparisons'],
    [c.divisions, 'division', 'divisions'],
    [c.conversions, 'integer-to-float conversion', 'integer-to-float conversions'],
  ] as const;
  const ops = parts
    .filter(([n]) => n > 0)
    .map(([n, one, many]) => `${n} ${n === 1 ? one : many}`)
    .join(', ');
  return `Cost: ${c.tableBytes} bytes of constants; per conversion ${ops}${c.divisions === 0 ? ', no division' : ''}; arithmetic ${c.arithmetic}; library calls: ${c.libraryCalls}.`;
}
