import { barChart } from '../html/barChart.js';
import { linePlot } from '../html/linePlot.js';
import {
  renderHtmlReport,
  type ReportBlock,
  type ReportMeta,
  type ReportSection,
} from '../html/renderHtmlReport.js';
import { channelCurves } from './channelCurves.js';
import { channelInputs } from './channelInputs.js';
import type { ChannelDesign, DesignReport } from './designReport.js';
import { formatCode, formatNumber, formatPercent, formatProbability, formatStated } from './formatNumber.js';
import { plainTextStyle } from '../terminal/textStyle.js';
import { noiseSourceName } from './noiseSourceName.js';
import { summaryColumns, summaryRows } from './summaryTable.js';
import {
  allDust,
  budgetLineName,
  dustLimit,
  gaugePowerLabel,
  resolutionFormulas,
  shownFigure,
} from './reportWording.js';

/** Options of {@link designReportHtml}. */
export interface DesignReportHtmlOptions {
  /** Points per curve (integer in [11, 10001]). */
  readonly points: number;
  /** The tool and version (`'bridgework 0.1.0'`). */
  readonly generator: string;
  /** The date of the run as text (`'2026-03-14'`); omitted when undefined. */
  readonly date?: string;
  /** Sections placed after the channels' (the file's multi-bridge groups). */
  readonly extraSections?: readonly ReportSection[];
}

const quantityLabels: Readonly<Record<string, string>> = {
  strain: 'Strain',
  microstrain: 'Strain',
  stress: 'Stress',
  force: 'Force',
  mass: 'Mass',
  temperature: 'Temperature',
  ratio: 'Bridge ratio',
};

/** A phrase as a sentence: capital first letter, final full stop. */
const sentence = (text: string): string => `${text.charAt(0).toUpperCase()}${text.slice(1)}.`;

function scaled(values: ArrayLike<number>, factor: number): Float64Array {
  return Float64Array.from(values as ArrayLike<number>, (v) => v * factor);
}

function plots(c: ChannelDesign, points: number): ReportBlock[] {
  const { display, budget } = c;
  const name = c.loaded.name;
  const curves = channelCurves(c.loaded.channel, points);
  const x = scaled(curves.quantity, display.factor);
  const label = quantityLabels[budget.quantity] ?? budget.quantity;
  const quantityAxis = { label, unit: display.unit };
  const n = curves.quantity.length;
  const ends = [0, n - 1].map((i) => ({ q: x[i] as number, y: (curves.inputRatio[i] as number) * 1e3 }));
  const output = linePlot({
    id: `${name}-output`,
    title: `Converter input against ${label.toLowerCase()}`,
    x: quantityAxis,
    y: { label: 'Converter input', unit: 'mV/V' },
    series: [
      { name: 'exact map', x, y: scaled(curves.inputRatio, 1e3) },
      {
        name: 'terminal line',
        x: ends.map((e) => e.q),
        y: ends.map((e) => e.y),
        dashed: true,
        color: '#57606a',
      },
    ],
  });
  // A linear map's nonlinearity is rounding left by double arithmetic: no curve of it is drawn.
  const nonlinearity = allDust(c, curves.nonlinearity)
    ? undefined
    : linePlot({
        id: `${name}-nonlinearity`,
        title: 'Nonlinearity of a linear map',
        x: quantityAxis,
        y: { label: 'Exact map − terminal line', unit: display.unit },
        series: [{ name: 'nonlinearity error', x, y: scaled(curves.nonlinearity, display.factor) }],
      });
  const contributing = budget.lines.filter((l) => l.standardUncertainty !== undefined);
  const p = formatProbability(budget.combined.coverage);
  // Standard uncertainties only: the expanded uncertainty is another quantity (k·u_c), named in the title.
  const errorBudget = barChart({
    id: `${name}-budget`,
    title:
      `Error budget at ${formatStated(budget.at * display.factor)} ${display.unit} ` +
      `(expanded uncertainty ${formatNumber(budget.combined.expandedUncertainty * display.factor)} ${display.unit}, ${p})`,
    categories: [...contributing.map((l) => l.name), 'combined standard uncertainty'],
    value: { label: 'Standard uncertainty', unit: display.unit },
    series: [
      {
        name: 'u',
        values: [
          ...contributing.map((l) => (l.standardUncertainty as number) * display.factor),
          budget.combined.standardUncertainty * display.factor,
        ],
      },
    ],
    emphasize: [contributing.length],
  });
  const terms = budget.noise.terms.filter((t) => t.rms > 0);
  const noise = barChart({
    id: `${name}-noise`,
    title: 'Noise contributions',
    categories: [...terms.map((t) => noiseSourceName(t.source)), 'total (root-sum-square)'],
    value: { label: 'Noise referred to the output', unit: display.unit },
    series: [
      {
        name: 'rms',
        values: [...terms.map((t) => t.rms * display.factor), budget.noise.totalRms * display.factor],
      },
      {
        name: 'peak-to-peak',
        values: [
          ...terms.map((t) => t.peakToPeak * display.factor),
          budget.noise.totalPeakToPeak * display.factor,
        ],
      },
    ],
    emphasize: [terms.length],
  });
  if (nonlinearity === undefined) {
    return [
      { kind: 'plots', plots: [output, errorBudget, noise] },
      {
        kind: 'text',
        text:
          `The exact map is linear: it departs from the terminal line by less than ${formatNumber(dustLimit(c), 2)} ${display.unit} ` +
          '(10⁻¹² of the span, the rounding of double-precision arithmetic) anywhere on the span, so no nonlinearity curve is drawn.',
      },
    ];
  }
  return [{ kind: 'plots', plots: [output, nonlinearity, errorBudget, noise] }];
}

function channelSection(c: ChannelDesign, points: number): ReportSection {
  const { budget, display } = c;
  const u = display.unit;
  const s = (v: number): string => formatNumber(v * display.factor);
  const st = (v: number): string => formatStated(v * display.factor);
  const uc = budget.combined.standardUncertainty;
  const p = formatProbability(budget.combined.coverage);
  const blocks: ReportBlock[] = [
    { kind: 'text', text: sentence(c.description[0]) },
    { kind: 'text', text: sentence(c.description[1]) },
    {
      kind: 'text',
      text:
        `Span ${st(budget.span.min)} … ${st(budget.span.max)} ${u}. The budget is evaluated at ${st(budget.at)} ${u} ` +
        `(code ${formatCode(budget.code)}, converter input ${formatNumber(c.inputRatioAtPoint * 1e3, 5)} mV/V, ` +
        `${s(Math.abs(budget.quantityPerCode))} ${u} per code): combined standard uncertainty ${s(uc)} ${u}, ` +
        `expanded uncertainty ${s(budget.combined.expandedUncertainty)} ${u} (${p}, k = ${formatNumber(budget.combined.coverageFactor)}).`,
    },
    { kind: 'checks', checks: c.checks.map((k) => ({ name: k.name, ok: k.ok, detail: k.detail })) },
    ...plots(c, points),
    {
      kind: 'table',
      caption: `Error budget at ${st(budget.at)} ${u}`,
      columns: [
        { header: 'source' },
        { header: `effect (${u})`, align: 'right' },
        { header: `u (${u})`, align: 'right' },
        { header: 'share of u_c²', align: 'right' },
        { header: 'model' },
      ],
      rows: [
        ...budget.lines.map((l) => [
          budgetLineName(l),
          shownFigure(c, l.value),
          l.standardUncertainty === undefined ? '—' : shownFigure(c, l.standardUncertainty),
          l.standardUncertainty === undefined
            ? 'informative'
            : uc > 0
              ? formatPercent((l.standardUncertainty / uc) ** 2)
              : '—',
          l.model,
        ]),
        ['combined standard uncertainty u_c', '', s(uc), '', 'law of propagation of uncertainty (JCGM 100)'],
        [
          `expanded uncertainty U (${p})`,
          '',
          s(budget.combined.expandedUncertainty),
          '',
          `k = ${formatNumber(budget.combined.coverageFactor)}`,
        ],
      ],
    },
    {
      kind: 'table',
      caption: `Noise by source (noise bandwidth ${formatNumber(budget.noise.bandwidthHertz)} Hz)`,
      columns: [
        { header: 'source' },
        { header: `rms (${u})`, align: 'right' },
        { header: `peak-to-peak (${u})`, align: 'right' },
        { header: 'rms at the input (V)', align: 'right' },
        { header: 'share of power', align: 'right' },
      ],
      rows: [
        ...budget.noise.terms.map((t) => [
          noiseSourceName(t.source),
          s(t.rms),
          s(t.peakToPeak),
          formatNumber(t.rmsVolts),
          formatPercent(t.fractionOfPower),
        ]),
        ['total (root-sum-square)', s(budget.noise.totalRms), s(budget.noise.totalPeakToPeak), '', ''],
      ],
    },
    {
      kind: 'table',
      caption: 'Resolution',
      columns: [{ header: 'figure' }, { header: 'value', align: 'right' }, { header: 'unit' }],
      rows: [
        ['one converter code', s(budget.resolution.quantityPerCode), u],
        ['rms noise', s(budget.resolution.rms), u],
        ['noise-free resolution (peak-to-peak noise, 6.6 × rms)', s(budget.resolution.noiseFree), u],
        [
          'noise-free divisions over the span (span / peak-to-peak noise)',
          String(Math.floor(budget.resolution.noiseFreeCounts)),
          '',
        ],
        [
          `${resolutionFormulas.rms.name} = ${resolutionFormulas.rms.formula} (${resolutionFormulas.rms.alias})`,
          budget.resolution.effectiveBits.toFixed(2),
          'bit',
        ],
        [
          `${resolutionFormulas.peakToPeak.name} = ${resolutionFormulas.peakToPeak.formula} (${resolutionFormulas.peakToPeak.alias})`,
          budget.resolution.noiseFreeBits.toFixed(2),
          'bit',
        ],
        [gaugePowerLabel(c), formatNumber(budget.frontEnd.value.gaugeWatts * 1e3), 'mW'],
      ],
    },
    {
      kind: 'text',
      text: sentence(`the bits are over the converter's full scale: ${resolutionFormulas.where}`),
    },
    {
      kind: 'text',
      text: 'The inputs, as validated: every field in SI (°C for temperatures), marked as written in the channel file (with the text as written when it carried a unit) or as a default.',
    },
    { kind: 'inputs', groups: channelInputs(c.loaded.spec, c.loaded.raw, c.loaded.channel.unit) },
  ];
  return { title: `${c.loaded.name}: ${c.loaded.channel.quantity} (${u})`, blocks };
}

function summarySection(report: DesignReport): ReportSection {
  return {
    title: 'Summary',
    blocks: [
      {
        kind: 'text',
        text: report.ok
          ? 'Every design check of every channel passed.'
          : 'A design check failed: see the checks marked FAIL below.',
      },
      { kind: 'table', columns: summaryColumns, rows: summaryRows(report, plainTextStyle) },
    ],
  };
}

/**
 * The design report as a self-contained HTML page: a summary, then per channel its hardware in
 * words, the headroom checks, four plots (converter input against the quantity with the
 * terminal line, the nonlinearity of that line, the error budget bars, the noise contributions),
 * the budget with each line's model, the noise and resolution tables, and the channel's inputs.
 *
 * @remarks
 * The page is made by {@link renderHtmlReport} (inline CSS and SVG, no scripts, nothing fetched;
 * the safety caution at the top and in the footer) with {@link linePlot} and {@link barChart}.
 * The curves sample the exact map ({@link channelCurves}); every other number is the channel
 * package's budget, shown in the unit people read ({@link displayUnit}).
 *
 * @param report - The design report.
 * @param options - Curve points, generator and date.
 * @returns The HTML document.
 */
export function designReportHtml(report: DesignReport, options: DesignReportHtmlOptions): string {
  const meta: ReportMeta[] = [{ label: 'channel file', value: report.file }];
  if (report.project.reference !== undefined)
    meta.push({ label: 'reference', value: report.project.reference });
  meta.push({ label: 'channels', value: String(report.channels.length) });
  if (options.date !== undefined) meta.push({ label: 'date', value: options.date });
  return renderHtmlReport({
    title: `Design report: ${report.project.title ?? report.file}`,
    ...(report.project.description === undefined ? {} : { subtitle: report.project.description }),
    meta,
    generator: options.generator,
    sections: [
      summarySection(report),
      ...report.channels.map((c) => channelSection(c, options.points)),
      ...(options.extraSections ?? []),
    ],
  });
}
