import { BridgeworkError, checkFinite, checkInteger, checkOptions } from '@bridgework/core';
import { checkAxis, checkList, checkText, plotLimits } from '../internal/checkPlotOptions.js';
import { escapeHtml } from '../internal/escapeHtml.js';
import {
  axisAttributes,
  axisTicks,
  axisTitle,
  checkPlotId,
  finiteRange,
  formatTick,
  legend,
  LEGEND_ROW_HEIGHT,
  look,
  palette,
  px,
  svgOpen,
  textWidth,
} from '../internal/plotParts.js';
import type { PlotAxis, SvgPlot } from './plotTypes.js';

/** One series of a bar chart: a value per category. */
export interface BarSeries {
  /** Name shown in the legend (and the `data-series` attribute). */
  readonly name: string;
  /** One finite value per category, in the value axis's unit. */
  readonly values: readonly number[];
  /** Bar colour (CSS). Default: the next colour of the palette. */
  readonly color?: string;
}

/** Options of {@link barChart}. */
export interface BarChartOptions {
  /** Identifier, unique within the page (letters, digits, `-`, `_`). */
  readonly id: string;
  /** Title drawn above the chart. */
  readonly title: string;
  /** The categories, one row each (`'amplifier noise'`, `'lead desensitization'`). */
  readonly categories: readonly string[];
  /** The value axis (horizontal), with its label and unit. */
  readonly value: PlotAxis;
  /** One or more series; several series make grouped bars. */
  readonly series: readonly BarSeries[];
  /** Indices of categories to emphasise (a combined total, say): drawn with a bold label. */
  readonly emphasize?: readonly number[];
  /** Width in CSS pixels (integer in [320, 2000]). Default 560. */
  readonly width?: number;
}

function valueLabel(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  const text =
    a >= 1e5 || a < 1e-3
      ? v.toExponential(2)
      : v
          .toPrecision(3)
          .replace(/(\.\d*?)0+$/, '$1')
          .replace(/\.$/, '');
  return text.replace(/^-/, '\u2212');
}

/**
 * Draws a horizontal bar chart (one row per category, grouped bars for several series) with a
 * labelled value axis, as a self-contained SVG element: the shape for error budgets and noise
 * contributions, whose category names are long.
 *
 * @remarks
 * Bars start at zero (negative values extend left); the value axis gets "nice" ticks
 * ({@link niceTicks}) covering zero and every value, and each bar is labelled with its value to
 * three significant digits. Category labels that do not fit the left column (at most 42 % of the
 * width) are shortened with an ellipsis and keep their full text as a tooltip. The height follows
 * from the number of categories and series. The markup carries `class="bw-plot bw-bar-chart"`,
 * `data-plot`, `data-series-count`, one `<g class="bw-series" data-series>` per series (each bar a
 * `<rect class="bw-bar" data-category data-value>`), and `<g class="bw-axis" data-axis="x">`
 * with a `<text class="bw-axis-label">`.
 *
 * @param options - Id, title, categories, value axis, series.
 * @returns The chart.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` (bad id), `too-few-points` (no category or no
 * series), `invalid-shape` (a series without one value per category), `not-finite` (a value),
 * `not-integer`/`out-of-range` (width, emphasised index).
 * @example
 * ```ts
 * const chart = barChart({
 *   id: 'budget', title: 'Error budget', categories: ['noise', 'resolution', 'combined'],
 *   value: { label: 'Standard uncertainty', unit: 'µε' },
 *   series: [{ name: 'u', values: [0.42, 0.05, 0.61] }], emphasize: [2],
 * });
 * ```
 */
export function barChart(options: BarChartOptions): SvgPlot {
  const o = checkOptions('options', options, {
    known: ['id', 'title', 'categories', 'value', 'series', 'emphasize', 'width'],
    required: ['id', 'title', 'categories', 'value', 'series'],
  });
  const id = checkPlotId(o['id'] as string);
  checkText('title', o['title']);
  checkAxis('value', o['value']);
  const width = checkInteger('width', options.width ?? 560, { min: 320, max: 2000 });
  const given = checkList<unknown>('categories', o['categories'], 1, plotLimits.maxCategories);
  for (let j = 0; j < given.length; j++) checkText(`categories[${j}]`, given[j]);
  const { categories } = options;
  checkList('series', o['series'], 1, plotLimits.maxSeries);
  options.series.forEach((s, i) => {
    const so = checkOptions(`series[${i}]`, s, {
      known: ['name', 'values', 'color'],
      required: ['name', 'values'],
    });
    checkText(`series[${i}].name`, so['name']);
    if (so['color'] !== undefined) checkText(`series[${i}].color`, so['color']);
    const values = checkList<unknown>(`series[${i}].values`, so['values'], 0, plotLimits.maxCategories);
    if (values.length !== categories.length) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`series[${i}].values\` must hold one value per category (${categories.length}); got ${values.length}`,
        { param: `series[${i}].values`, value: values.length, limit: categories.length },
      );
    }
    for (let j = 0; j < values.length; j++) checkFinite(`series[${i}].values[${j}]`, values[j]);
  });
  if (o['emphasize'] !== undefined) checkList('emphasize', o['emphasize'], 0, plotLimits.maxCategories);
  const emphasized = new Set(
    (options.emphasize ?? []).map((k, i) =>
      checkInteger(`emphasize[${i}]`, k, { min: 0, max: categories.length - 1 }),
    ),
  );
  const all = options.series.flatMap((s) => Array.from(s.values));
  const [lo, hi] = finiteRange([all, [0]]);
  const ticks = axisTicks(options.value, lo, hi, 6);
  const tickLabels = ticks.values.map((v) => formatTick(v, ticks));

  const nSeries = options.series.length;
  const barHeight = nSeries === 1 ? 18 : 12;
  const rowHeight = nSeries * barHeight + 12;
  const colored = options.series.map((s, i) => ({
    ...s,
    color: s.color ?? (palette[i % palette.length] as string),
  }));
  const key =
    nSeries > 1
      ? legend(
          colored.map((s) => ({ ...s, bar: true })),
          12,
          44,
          width - 24,
        )
      : undefined;
  const top = key === undefined ? 40 : 58 + (key.rows - 1) * LEGEND_ROW_HEIGHT;
  const bottom = 50;
  const maxLabel = Math.floor(width * 0.42);
  // Emphasised labels are bold, about a tenth wider than regular text.
  const labelWidth = (text: string, j: number): number => textWidth(text) * (emphasized.has(j) ? 1.1 : 1);
  // Text widths are proportional to the number of characters, so the cut is computed, not searched.
  const labels = categories.map((c, j) => {
    if (labelWidth(c, j) <= maxLabel - 12) return c;
    const chars = [...c];
    const fit = Math.max(1, Math.floor(((maxLabel - 12) / labelWidth(c, j)) * chars.length) - 1);
    return `${chars.slice(0, fit).join('').trimEnd()}…`;
  });
  const left = Math.ceil(
    Math.min(maxLabel, labels.reduce((m, l, j) => Math.max(m, labelWidth(l, j)), 0) + 16),
  );
  const valueRoom = all.reduce((m, v) => Math.max(m, textWidth(valueLabel(v))), 0) + 10;
  const right = Math.ceil(Math.max(18, valueRoom));
  const w = width - left - right;
  const h = categories.length * rowHeight;
  const height = top + h + bottom;
  const sx = (v: number): number => left + ((v - ticks.min) / (ticks.max - ticks.min)) * w;
  const zero = sx(0);

  const grid = ticks.values.map(
    (v) => `<line x1="${px(sx(v))}" y1="${top}" x2="${px(sx(v))}" y2="${top + h}"/>`,
  );
  const axis = ticks.values.map(
    (v, i) =>
      `<line x1="${px(sx(v))}" y1="${top + h}" x2="${px(sx(v))}" y2="${top + h + 5}" stroke="${look.axis}"/>` +
      `<text class="bw-tick" x="${px(sx(v))}" y="${top + h + 18}" text-anchor="middle" fill="${look.muted}">${escapeHtml(tickLabels[i] as string)}</text>`,
  );
  const categoryLabels = labels.map((l, j) => {
    const y = top + j * rowHeight + rowHeight / 2;
    const weight = emphasized.has(j) ? ' font-weight="600"' : '';
    const tip = l === categories[j] ? '' : `<title>${escapeHtml(categories[j] as string)}</title>`;
    return `<text class="bw-category" x="${left - 10}" y="${px(y)}" dy="0.32em" text-anchor="end"${weight}>${tip}${escapeHtml(l)}</text>`;
  });
  const bands = categories.map((_, j) =>
    j % 2 === 1
      ? `<rect x="${left}" y="${top + j * rowHeight}" width="${w}" height="${rowHeight}" fill="#f6f8fa"/>`
      : '',
  );
  const series = colored.map((s, i) => {
    const bars = s.values.map((v, j) => {
      const y = top + j * rowHeight + 6 + i * barHeight;
      const x = Math.min(sx(v), zero);
      const bw = Math.abs(sx(v) - zero);
      const label = valueLabel(v);
      const lx = v < 0 ? x - 4 : x + bw + 4;
      return (
        `<rect class="bw-bar" data-category="${escapeHtml(categories[j] as string)}" data-value="${v}" x="${px(x)}" y="${px(y)}" ` +
        `width="${px(Math.max(bw, 0.5))}" height="${barHeight - 3}" rx="1.5" fill="${escapeHtml(s.color)}"/>` +
        `<text class="bw-value" x="${px(lx)}" y="${px(y + (barHeight - 3) / 2)}" dy="0.32em" text-anchor="${v < 0 ? 'end' : 'start'}" ` +
        `font-size="11" fill="${look.muted}">${escapeHtml(label)}</text>`
      );
    });
    return `<g class="bw-series" data-series="${escapeHtml(s.name)}">${bars.join('')}</g>`;
  });

  const svg = [
    svgOpen('bar-chart', id, options.title, width, height, colored.length),
    key?.svg ?? '',
    bands.join(''),
    `<g class="bw-grid" stroke="${look.grid}" stroke-width="1">${grid.join('')}</g>`,
    `<g class="bw-categories">${categoryLabels.join('')}</g>`,
    series.join(''),
    `<line class="bw-zero" x1="${px(zero)}" y1="${top}" x2="${px(zero)}" y2="${top + h}" stroke="${look.axis}"/>`,
    `<g class="bw-axis bw-axis-x" ${axisAttributes('x', options.value)}>`,
    `<line x1="${left}" y1="${top + h}" x2="${left + w}" y2="${top + h}" stroke="${look.axis}"/>`,
    ...axis,
    `<text class="bw-axis-label" x="${px(left + w / 2)}" y="${height - 10}" text-anchor="middle">${escapeHtml(axisTitle(options.value))}</text></g>`,
    '</svg>',
  ].join('');
  return { svg, id, title: options.title, seriesCount: colored.length };
}
