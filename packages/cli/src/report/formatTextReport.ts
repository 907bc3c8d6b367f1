import { SAFETY_CAUTION } from '../caution.js';
import { wrapText } from '../internal/wrapText.js';
import { formatTable } from '../terminal/formatTable.js';
import type { TextStyle } from '../terminal/textStyle.js';
import type { ChannelDesign, DesignReport } from './designReport.js';
import { formatCode, formatNumber, formatPercent, formatProbability, formatStated } from './formatNumber.js';
import { noiseSourceName } from './noiseSourceName.js';
import { summaryColumns, summaryRows } from './summaryTable.js';
import { budgetLineName, gaugePowerLabel, resolutionFormulas, shownFigure } from './reportWording.js';

const WIDTH = 100;

const indent = (text: string, by = '  '): string =>
  text
    .split('\n')
    .map((l) => (l === '' ? l : by + l))
    .join('\n');

/** A stated value (span end, budget point) in the display unit. */
function stated(c: ChannelDesign, value: number): string {
  return formatStated(value * c.display.factor);
}

/** `value` in the display unit, 3 significant digits. */
function shown(c: ChannelDesign, value: number): string {
  return formatNumber(value * c.display.factor);
}

function budgetTable(c: ChannelDesign): string {
  const { budget, display } = c;
  const uc = budget.combined.standardUncertainty;
  const rows = budget.lines.map((l) => [
    budgetLineName(l),
    shownFigure(c, l.value),
    l.standardUncertainty === undefined ? '—' : shownFigure(c, l.standardUncertainty),
    l.standardUncertainty === undefined
      ? 'informative'
      : uc > 0
        ? formatPercent((l.standardUncertainty / uc) ** 2)
        : '—',
  ]);
  const p = budget.combined.coverage;
  rows.push(
    ['combined standard uncertainty u_c', '', shown(c, uc), ''],
    [
      `expanded uncertainty U (${formatProbability(p)}, k = ${formatNumber(budget.combined.coverageFactor, 3)})`,
      '',
      shown(c, budget.combined.expandedUncertainty),
      '',
    ],
  );
  return formatTable(
    [
      { header: `budget at ${stated(c, budget.at)} ${display.unit}` },
      { header: `effect (${display.unit})`, align: 'right' },
      { header: `u (${display.unit})`, align: 'right' },
      { header: 'share of u_c²', align: 'right' },
    ],
    rows,
  );
}

function noiseTable(c: ChannelDesign): string {
  const { noise } = c.budget;
  const unit = c.display.unit;
  const rows = noise.terms
    .filter((t) => t.rms > 0)
    .map((t) => [
      noiseSourceName(t.source),
      shown(c, t.rms),
      shown(c, t.peakToPeak),
      formatPercent(t.fractionOfPower),
    ]);
  rows.push(['total (root-sum-square)', shown(c, noise.totalRms), shown(c, noise.totalPeakToPeak), '']);
  const table = formatTable(
    [
      { header: 'noise source' },
      { header: `rms (${unit})`, align: 'right' },
      { header: `peak-to-peak (${unit})`, align: 'right' },
      { header: 'share of power', align: 'right' },
    ],
    rows,
  );
  return `${table}noise bandwidth ${formatNumber(noise.bandwidthHertz, 3)} Hz (the converter's filter); peak-to-peak = 6.6 × rms\n`;
}

function resolutionText(c: ChannelDesign): string {
  const r = c.budget.resolution;
  const u = c.display.unit;
  const text =
    `resolution: one code is ${shown(c, r.quantityPerCode)} ${u}; noise ${shown(c, r.rms)} ${u} rms, ` +
    `${shown(c, r.noiseFree)} ${u} peak-to-peak (noise-free resolution); ${Math.floor(r.noiseFreeCounts)} noise-free ` +
    `divisions over the span (span / peak-to-peak noise)`;
  const { rms, peakToPeak, where } = resolutionFormulas;
  const bits =
    `resolution over the converter's full scale (${where}): ` +
    `${rms.name} ${r.effectiveBits.toFixed(1)} bits = ${rms.formula} (${rms.alias}); ` +
    `${peakToPeak.name} ${r.noiseFreeBits.toFixed(1)} bits = ${peakToPeak.formula} (${peakToPeak.alias})`;
  return [text, bits].map((t) => `${wrapText(t, WIDTH - 2).join('\n  ')}\n`).join('');
}

function checksText(c: ChannelDesign, style: TextStyle): string {
  const lines = ['checks (front end at the ends of the span):'];
  for (const k of c.checks) {
    const mark = k.ok ? style.green('pass') : style.red(style.bold('FAIL'));
    lines.push(`  ${mark}  ${k.name}: ${k.detail}`);
  }
  lines.push(`${gaugePowerLabel(c)}: ${formatNumber(c.budget.frontEnd.value.gaugeWatts * 1e3, 3)} mW`);
  return `${lines.join('\n')}\n`;
}

function channelText(c: ChannelDesign, style: TextStyle): string {
  const { budget, display } = c;
  const unit = display.unit;
  const quantity = c.loaded.channel.quantity;
  const head = `${style.bold(c.loaded.name)}: ${quantity}${unit === c.loaded.channel.unit ? ` (${unit})` : `, shown in ${unit}`}`;
  const point =
    `span ${stated(c, budget.span.min)} … ${stated(c, budget.span.max)} ${unit}; budget at ${stated(c, budget.at)} ${unit}: ` +
    `code ${formatCode(budget.code)}, converter input ${formatNumber(c.inputRatioAtPoint * 1e3, 5)} mV/V, ` +
    `${shown(c, Math.abs(budget.quantityPerCode))} ${unit} per code`;
  const about = [...c.description, point].flatMap((l) => wrapText(l, WIDTH - 2));
  return [
    head,
    indent(about.join('\n')),
    '',
    indent(budgetTable(c)),
    indent(noiseTable(c)),
    indent(resolutionText(c)),
    indent(checksText(c, style)),
  ].join('\n');
}

/**
 * The design report as text for a terminal (or a log): a header, then per channel its hardware
 * in words, the budget table in the shown unit (effect at the budget point, standard uncertainty,
 * share of the combined variance), combined and expanded uncertainty, noise by source,
 * resolution and the headroom checks; then a summary of all channels and the safety caution.
 *
 * @remarks
 * Quantities are shown in the unit people read (µε, kN, mV/V; see {@link displayUnit}); the
 * models behind each line are in the JSON and HTML reports. Lines are at most about 100 columns.
 * The text holds no date, so the same file gives the same report. Figures below 10⁻¹² of the
 * span's width (numerical dust, `DUST_FRACTION`) are shown as `< limit`.
 *
 * @param report - The design report.
 * @param style - Colours (plain when writing to a file or pipe).
 * @param groups - The file's multi-bridge groups as text sections (placed after the channels), and
 *   whether their checks passed.
 * @returns The report, ending with the caution and a newline.
 */
export function formatTextReport(
  report: DesignReport,
  style: TextStyle,
  groups: { readonly sections: readonly string[]; readonly ok: boolean } = { sections: [], ok: true },
): string {
  const title = report.project.title ?? report.file;
  const head = [style.bold(`Design report: ${title}`), `  channel file: ${report.file}`];
  if (report.project.reference !== undefined) head.push(`  reference: ${report.project.reference}`);
  if (report.project.description !== undefined)
    head.push(...wrapText(report.project.description, WIDTH, '  '));
  const parts = [head.join('\n'), ...report.channels.map((c) => channelText(c, style)), ...groups.sections];
  parts.push(`${style.bold('Summary')}\n${indent(formatTable(summaryColumns, summaryRows(report, style)))}`);
  parts.push(
    report.ok && groups.ok
      ? 'Every check passed.'
      : style.red('A design check failed: see the FAIL lines above (exit code 2).'),
  );
  return `${parts.join('\n\n').replace(/\n{3,}/g, '\n\n')}\n\n${wrapText(SAFETY_CAUTION, WIDTH).join('\n')}\n`;
}
