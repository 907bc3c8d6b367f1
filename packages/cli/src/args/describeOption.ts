import type { OptionSpec } from './optionTable.js';

/**
 * How an option is written in help text: `-o, --out <file>` or `    --json`.
 *
 * @param o - The option's table row.
 * @returns The synopsis (short alias first, then the long name and its placeholder).
 */
export function optionSynopsis(o: OptionSpec): string {
  const short = o.short === undefined ? '    ' : `-${o.short}, `;
  return `${short}--${o.name}${o.type === 'boolean' ? '' : ` <${o.placeholder ?? 'value'}>`}`;
}

/**
 * The description of an option followed by its unit, choices and default, as shown in help and
 * docs: `Frames per block (frames; default 65536).`
 *
 * @param o - The option's table row.
 * @returns The full description.
 */
export function optionDescription(o: OptionSpec): string {
  const notes: string[] = [];
  if (o.type === 'choice' && o.choices !== undefined) notes.push(`one of ${o.choices.join(', ')}`);
  if (o.unit !== undefined) notes.push(o.unit);
  const range = rangeText(o);
  if (range !== undefined) notes.push(range);
  const def = o.defaultText ?? (o.default === undefined ? undefined : String(o.default));
  if (def !== undefined) notes.push(`default ${def}`);
  if (notes.length === 0) return o.description;
  const base = o.description.replace(/\.$/, '');
  return `${base} (${notes.join('; ')}).`;
}

function rangeText(o: OptionSpec): string | undefined {
  if (o.min === undefined && o.max === undefined) return undefined;
  if (o.max === undefined) return `≥ ${o.min}`;
  if (o.min === undefined) return `≤ ${o.max}`;
  return `${o.min} to ${o.max}`;
}
