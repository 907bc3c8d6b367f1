import { BridgeworkError, checkFinite, checkInteger, checkOptions } from '@bridgework/core';
import { checkAxis, checkList, checkText, plotLimits } from '../internal/checkPlotOptions.js';
import { escapeHtml } from '../internal/escapeHtml.js';
import {
  axisAttributes,
  checkPlotId,
  axisTicks,
  axisTitle,
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

/** One curve of a line plot. */
export interface LineSeries {
  /** Name shown in the legend (and the `data-series` attribute). */
  readonly name: string;
  /** Abscissas, in the x axis's unit. */
  readonly x: ArrayLike<number>;
  /** Ordinates, in the y axis's unit; a NaN breaks the line (a gap). */
  readonly y: ArrayLike<number>;
  /** Draw dashed (a reference such as the linear fit). Default false. */
  readonly dashed?: boolean;
  /** Line colour (CSS). Default: the next colour of the palette. */
  readonly color?: string;
}

/** Options of {@link linePlot}. */
export interface LinePlotOptions {
  /** Identifier, unique within the page (letters, digits, `-`, `_`). */
  readonly id: string;
  /** Title drawn above the plot. */
  readonly title: string;
  /** The horizontal axis. */
  readonly x: PlotAxis;
  /** The vertical axis. */
  readonly y: PlotAxis;
  /** The curves (at least one). */
  readonly series: readonly LineSeries[];
  /** Width in CSS pixels (integer in [240, 2000]). Default 560. */
  readonly width?: number;
  /** Height in CSS pixels (integer in [160, 2000]). Default 340. */
  readonly height?: number;
}

/**
 * Draws a line plot with one or more series, a legend, a grid, and labelled axes with units, as
 * a self-contained SVG element.
 *
 * @remarks
 * Axes get "nice" ticks ({@link niceTicks}) covering the finite data (or the axis's fixed ends);
 * the y axis's tick labels set the left margin, so long labels never overlap the axis title.
 * NaN values break a curve into pieces (a clipped region shows as a gap, not as a line to zero).
 * Curves are clipped to the plot area. The markup carries what a test or a script needs:
 * `class="bw-plot bw-line-plot"`, `data-plot`, `data-series-count`, one
 * `<g class="bw-series" data-series="name">` per series, and `<g class="bw-axis"
 * data-axis="x|y" data-label data-unit>` with a `<text class="bw-axis-label">` per axis.
 *
 * @param options - Id, title, axes, series and size.
 * @returns The plot.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` (bad id), `too-few-points` (no series),
 * `invalid-shape` (x and y of different lengths), `not-integer`/`out-of-range` (size).
 * @example
 * ```ts
 * const plot = linePlot({
 *   id: 'output', title: 'Output against load',
 *   x: { label: 'Load', unit: 'kN' }, y: { label: 'Output', unit: 'mV/V' },
 *   series: [{ name: 'exact', x: [0, 50, 100], y: [0, 1.0, 2.0] }],
 * });
 * plot.seriesCount; // 1
 * ```
 */
export function linePlot(options: LinePlotOptions): SvgPlot {
  const o = checkOptions('options', options, {
    known: ['id', 'title', 'x', 'y', 'series', 'width', 'height'],
    required: ['id', 'title', 'x', 'y', 'series'],
  });
  const id = checkPlotId(o['id'] as string);
  checkText('title', o['title']);
  checkAxis('x', o['x']);
  checkAxis('y', o['y']);
  const width = checkInteger('width', options.width ?? 560, { min: 240, max: 2000 });
  const height = checkInteger('height', options.height ?? 340, { min: 160, max: 2000 });
  checkList('series', o['series'], 1, plotLimits.maxSeries);
  options.series.forEach((s, i) => {
    const so = checkOptions(`series[${i}]`, s, {
      known: ['name', 'x', 'y', 'dashed', 'color'],
      required: ['name', 'x', 'y'],
    });
    checkText(`series[${i}].name`, so['name']);
    if (so['color'] !== undefined) checkText(`series[${i}].color`, so['color']);
    if (so['dashed'] !== undefined && typeof so['dashed'] !== 'boolean')
      throw new BridgeworkError('wrong-type', `\`series[${i}].dashed\` must be true or false`, {
        param: `series[${i}].dashed`,
        value: so['dashed'],
      });
    const x = checkList<unknown>(`series[${i}].x`, so['x'], 0, plotLimits.maxPoints);
    const y = checkList<unknown>(`series[${i}].y`, so['y'], 0, plotLimits.maxPoints);
    if (y.length !== x.length) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`series[${i}].y\` must have the length of x (${x.length}); got ${y.length}`,
        {
          param: `series[${i}].y`,
          value: y.length,
          limit: x.length,
        },
      );
    }
    for (const [axis, list] of [
      ['x', x],
      ['y', y],
    ] as const) {
      for (let j = 0; j < list.length; j++) {
        // A non-finite number breaks the line (a gap); anything but a number is an error.
        const v = list[j];
        if (typeof v !== 'number') checkFinite(`series[${i}].${axis}[${j}]`, v);
      }
    }
  });
  const [x0, x1] = finiteRange(options.series.map((s) => s.x));
  const [y0, y1] = finiteRange(options.series.map((s) => s.y));
  const xt = axisTicks(options.x, x0, x1, 7);
  const yt = axisTicks(options.y, y0, y1, 6);
  const yLabels = yt.values.map((v) => formatTick(v, yt));
  const xLabels = xt.values.map((v) => formatTick(v, xt));

  const colored = options.series.map((s, i) => ({
    ...s,
    color: s.color ?? (palette[i % palette.length] as string),
  }));
  const key = legend(colored, 12, 44, width - 24);
  const top = 58 + (key.rows - 1) * LEGEND_ROW_HEIGHT;
  const bottom = 50;
  const left = Math.ceil(Math.max(...yLabels.map((l) => textWidth(l))) + 40);
  const right = Math.ceil(Math.max(16, textWidth(xLabels[xLabels.length - 1] ?? '') / 2 + 6));
  const w = width - left - right;
  const h = height - top - bottom;
  const sx = (v: number): number => left + ((v - xt.min) / (xt.max - xt.min)) * w;
  const sy = (v: number): number => top + h - ((v - yt.min) / (yt.max - yt.min)) * h;

  const grid: string[] = [];
  const xAxis: string[] = [];
  const yAxis: string[] = [];
  xt.values.forEach((v, i) => {
    const X = px(sx(v));
    grid.push(`<line x1="${X}" y1="${top}" x2="${X}" y2="${top + h}"/>`);
    xAxis.push(
      `<line x1="${X}" y1="${top + h}" x2="${X}" y2="${top + h + 5}" stroke="${look.axis}"/>`,
      `<text class="bw-tick" x="${X}" y="${top + h + 18}" text-anchor="middle" fill="${look.muted}">${escapeHtml(xLabels[i] as string)}</text>`,
    );
  });
  yt.values.forEach((v, i) => {
    const Y = px(sy(v));
    grid.push(`<line x1="${left}" y1="${Y}" x2="${left + w}" y2="${Y}"/>`);
    yAxis.push(
      `<line x1="${left - 5}" y1="${Y}" x2="${left}" y2="${Y}" stroke="${look.axis}"/>`,
      `<text class="bw-tick" x="${left - 8}" y="${Y}" dy="0.32em" text-anchor="end" fill="${look.muted}">${escapeHtml(yLabels[i] as string)}</text>`,
    );
  });
  const zeroLine =
    yt.min < 0 && yt.max > 0
      ? `<line class="bw-zero" x1="${left}" y1="${px(sy(0))}" x2="${left + w}" y2="${px(sy(0))}" stroke="${look.axis}" stroke-width="1"/>`
      : '';

  const series = colored.map((s) => {
    let d = '';
    let pen = false;
    for (let i = 0; i < s.x.length; i++) {
      const xv = s.x[i] as number;
      const yv = s.y[i] as number;
      if (!Number.isFinite(xv) || !Number.isFinite(yv)) {
        pen = false;
        continue;
      }
      d += `${pen ? 'L' : 'M'}${px(sx(xv))} ${px(sy(yv))}`;
      pen = true;
    }
    const dash = s.dashed === true ? ' stroke-dasharray="6 4"' : '';
    return (
      `<g class="bw-series" data-series="${escapeHtml(s.name)}"><path d="${d}" fill="none" stroke="${escapeHtml(s.color)}" ` +
      `stroke-width="2" stroke-linejoin="round" stroke-linecap="round"${dash}/></g>`
    );
  });

  const svg = [
    svgOpen('line-plot', id, options.title, width, height, colored.length),
    key.svg,
    `<defs><clipPath id="${id}-clip"><rect x="${left}" y="${top}" width="${w}" height="${h}"/></clipPath></defs>`,
    `<g class="bw-grid" stroke="${look.grid}" stroke-width="1">${grid.join('')}</g>`,
    zeroLine,
    `<g class="bw-axis bw-axis-x" ${axisAttributes('x', options.x)}>`,
    `<line x1="${left}" y1="${top + h}" x2="${left + w}" y2="${top + h}" stroke="${look.axis}"/>`,
    ...xAxis,
    `<text class="bw-axis-label" x="${px(left + w / 2)}" y="${height - 10}" text-anchor="middle">${escapeHtml(axisTitle(options.x))}</text></g>`,
    `<g class="bw-axis bw-axis-y" ${axisAttributes('y', options.y)}>`,
    `<line x1="${left}" y1="${top}" x2="${left}" y2="${top + h}" stroke="${look.axis}"/>`,
    ...yAxis,
    `<text class="bw-axis-label" transform="translate(14 ${px(top + h / 2)}) rotate(-90)" text-anchor="middle">${escapeHtml(axisTitle(options.y))}</text></g>`,
    `<g clip-path="url(#${id}-clip)">${series.join('')}</g>`,
    '</svg>',
  ].join('');
  return { svg, id, title: options.title, seriesCount: colored.length };
}
