import { BridgeworkError } from '@bridgework/core';
import { formatTick, niceTicks, type NiceTicks } from '../html/niceTicks.js';
import type { PlotAxis } from '../html/plotTypes.js';
import { escapeHtml } from './escapeHtml.js';

/**
 * Series colours: the Okabe–Ito palette (Okabe and Ito, "Color Universal Design", 2008), which
 * stays distinguishable with the common forms of colour blindness.
 */
export const palette = [
  '#0072B2',
  '#D55E00',
  '#009E73',
  '#CC79A7',
  '#E69F00',
  '#56B4E9',
  '#000000',
  '#F0E442',
];

/** Shared look: text and line colours, fonts. */
export const look = {
  font: "system-ui, -apple-system, 'Segoe UI', Roboto, 'DejaVu Sans', Arial, sans-serif",
  text: '#1f2328',
  muted: '#57606a',
  grid: '#e6e8eb',
  axis: '#8c959f',
  fontSize: 12,
} as const;

/** Estimated width in pixels of a text at the given font size (sans-serif averages ~0.58 em). */
export function textWidth(text: string, size: number = look.fontSize): number {
  return [...text].length * size * 0.58;
}

/** A coordinate with two decimals (enough for screens and print, and stable in snapshots). */
export function px(x: number): string {
  return (Math.round(x * 100) / 100).toString();
}

/** `Load (kN)` or `Load`. */
export function axisTitle(axis: PlotAxis): string {
  return axis.unit === undefined || axis.unit === '' ? axis.label : `${axis.label} (${axis.unit})`;
}

/** Ticks for an axis from its data range, honouring fixed ends. */
export function axisTicks(axis: PlotAxis, lo: number, hi: number, count: number): NiceTicks {
  const a = axis.min ?? lo;
  const b = axis.max ?? hi;
  const t = niceTicks(Math.min(a, b), Math.max(a, b), count);
  if (axis.min === undefined && axis.max === undefined) return t;
  const min = axis.min ?? t.min;
  const max = axis.max ?? t.max;
  return {
    ...t,
    min,
    max,
    values: t.values.filter((v) => v >= min - 1e-12 * t.step && v <= max + 1e-12 * t.step),
  };
}

/** The range of the finite values in some arrays, or [0, 1] when there are none. */
export function finiteRange(arrays: readonly ArrayLike<number>[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i] as number;
      if (Number.isFinite(v)) {
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}

/** The opening tag of a plot's `<svg>` with its data attributes, title and description. */
export function svgOpen(
  kind: string,
  id: string,
  title: string,
  width: number,
  height: number,
  series: number,
): string {
  const t = escapeHtml(title);
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" class="bw-plot bw-${kind}" data-plot="${escapeHtml(id)}" data-series-count="${series}" ` +
    `viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-labelledby="${escapeHtml(id)}-title" ` +
    `font-family="${escapeHtml(look.font)}" font-size="${look.fontSize}" fill="${look.text}">` +
    `<title id="${escapeHtml(id)}-title">${t}</title>` +
    `<text class="bw-plot-title" x="12" y="22" font-size="15" font-weight="600">${t}</text>`
  );
}

/** The height of one legend row, px. */
export const LEGEND_ROW_HEIGHT = 18;

/**
 * The legend under the title: one swatch and name per series, in rows that wrap within
 * `maxWidth` (a long legend once ran off the plot's right edge).
 *
 * @returns The markup and the number of rows it takes (the plot area starts below them).
 */
export function legend(
  items: readonly {
    readonly name: string;
    readonly color: string;
    readonly dashed?: boolean;
    readonly bar?: boolean;
  }[],
  x: number,
  y: number,
  maxWidth: number,
): { readonly svg: string; readonly rows: number } {
  let cx = x;
  let cy = y;
  let rows = 1;
  const parts = items.map((item, i) => {
    const swatchWidth = item.bar === true ? 20 : 28;
    if (i > 0 && cx + swatchWidth + textWidth(item.name) > x + maxWidth) {
      cx = x;
      cy += LEGEND_ROW_HEIGHT;
      rows++;
    }
    const swatch =
      item.bar === true
        ? `<rect x="${px(cx)}" y="${px(cy - 9)}" width="14" height="10" rx="1.5" fill="${item.color}"/>`
        : `<line x1="${px(cx)}" y1="${px(cy - 4)}" x2="${px(cx + 22)}" y2="${px(cy - 4)}" stroke="${item.color}" stroke-width="2.5"${item.dashed === true ? ' stroke-dasharray="6 4"' : ''}/>`;
    const textX = cx + swatchWidth;
    const g = `<g class="bw-legend-item" data-series="${escapeHtml(item.name)}">${swatch}<text x="${px(textX)}" y="${px(cy)}" fill="${look.muted}">${escapeHtml(item.name)}</text></g>`;
    cx = textX + textWidth(item.name) + 18;
    return g;
  });
  return { svg: `<g class="bw-legend">${parts.join('')}</g>`, rows };
}

/** Axis description for `data-*` attributes. */
export function axisAttributes(axisName: 'x' | 'y', axis: PlotAxis): string {
  return `data-axis="${axisName}" data-label="${escapeHtml(axis.label)}" data-unit="${escapeHtml(axis.unit ?? '')}"`;
}

export { formatTick };

const idPattern = /^[A-Za-z][A-Za-z0-9_-]*$/;

/** Checks a plot id (it becomes an XML id and a CSS-safe attribute). */
export function checkPlotId(id: string): string {
  if (typeof id !== 'string' || !idPattern.test(id)) {
    throw new BridgeworkError(
      'invalid-option',
      `\`id\` must start with a letter and hold only letters, digits, - and _; got '${String(id)}'`,
      { param: 'id', value: id },
    );
  }
  return id;
}
