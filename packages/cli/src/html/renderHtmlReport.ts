import { SAFETY_CAUTION } from '../caution.js';
import { escapeHtml } from '../internal/escapeHtml.js';
import type { TableColumn } from '../terminal/formatTable.js';
import { reportCss } from './reportCss.js';
import type { SvgPlot } from './plotTypes.js';

/** A paragraph of text. */
export interface TextBlock {
  /** The block kind. */
  readonly kind: 'text';
  /** The text (escaped on output). */
  readonly text: string;
}

/** A table of values. */
export interface TableBlock {
  /** The block kind. */
  readonly kind: 'table';
  /** A caption above the table. */
  readonly caption?: string;
  /** The columns (right-aligned columns use tabular figures). */
  readonly columns: readonly TableColumn[];
  /** The cells, row by row (escaped on output). */
  readonly rows: readonly (readonly string[])[];
}

/** One or more plots, laid out in a responsive grid. */
export interface PlotsBlock {
  /** The block kind. */
  readonly kind: 'plots';
  /** The plots, made by {@link linePlot} and {@link barChart}. */
  readonly plots: readonly SvgPlot[];
}

/** The outcome of one design check. */
export interface ReportCheck {
  /** What was checked (`'amplifier headroom'`). */
  readonly name: string;
  /** Whether it passed. */
  readonly ok: boolean;
  /** The figures behind the verdict (`'peak input 3.1 mV of 19.5 mV'`). */
  readonly detail: string;
}

/** A list of design checks with pass/fail marks. */
export interface ChecksBlock {
  /** The block kind. */
  readonly kind: 'checks';
  /** The checks. */
  readonly checks: readonly ReportCheck[];
}

/** One input of a channel, as written in (or defaulted from) the channel file. */
export interface InputRow {
  /** The field path or name (`'sensor.gaugeOhms'`). */
  readonly name: string;
  /** The value as text. */
  readonly value: string;
  /** The unit, if any. */
  readonly unit?: string;
  /** A note (`'default'`, `'from the file'`). */
  readonly note?: string;
}

/** A titled group of inputs (sensor, bridge, amplifier...). */
export interface InputGroup {
  /** The group's title. */
  readonly title: string;
  /** Its inputs. */
  readonly rows: readonly InputRow[];
}

/** The inputs a result was computed from, as tables. */
export interface InputsBlock {
  /** The block kind. */
  readonly kind: 'inputs';
  /** The groups. */
  readonly groups: readonly InputGroup[];
}

/** The content blocks of a report section. */
export type ReportBlock = TextBlock | TableBlock | PlotsBlock | ChecksBlock | InputsBlock;

/** A titled section of the report (one channel, say). */
export interface ReportSection {
  /** The heading. */
  readonly title: string;
  /** The content, in order. */
  readonly blocks: readonly ReportBlock[];
}

/** A label and value in the report's header (file, reference, date). */
export interface ReportMeta {
  /** The label. */
  readonly label: string;
  /** The value. */
  readonly value: string;
}

/** Options of {@link renderHtmlReport}. */
export interface HtmlReportOptions {
  /** The page title and main heading. */
  readonly title: string;
  /** A line under the title. */
  readonly subtitle?: string;
  /** Header facts: channel file, project reference, date of the run. */
  readonly meta?: readonly ReportMeta[];
  /** The sections. */
  readonly sections: readonly ReportSection[];
  /** The tool and version, for the footer (`'bridgework 0.1.0'`). */
  readonly generator: string;
}

function table(
  columns: readonly TableColumn[],
  rows: readonly (readonly string[])[],
  caption?: string,
): string {
  const cls = (c: TableColumn | undefined): string => (c?.align === 'right' ? ' class="num"' : '');
  const head = columns.map((c) => `<th${cls(c)}>${escapeHtml(c.header)}</th>`).join('');
  // Each cell carries its column's heading, so a narrow screen can show a wide table row by row.
  const body = rows
    .map(
      (r) =>
        `<tr>${columns.map((c, j) => `<td${cls(c)} data-label="${escapeHtml(c.header)}">${escapeHtml(r[j] ?? '')}</td>`).join('')}</tr>`,
    )
    .join('\n');
  const cap = caption === undefined ? '' : `<caption>${escapeHtml(caption)}</caption>`;
  const stack = columns.length >= 4 ? ' class="stack"' : '';
  return `<div class="table-wrap"><table${stack}>${cap}<thead><tr>${head}</tr></thead>\n<tbody>\n${body}\n</tbody></table></div>`;
}

function block(b: ReportBlock): string {
  switch (b.kind) {
    case 'text':
      return `<p>${escapeHtml(b.text)}</p>`;
    case 'table':
      return table(b.columns, b.rows, b.caption);
    case 'plots':
      return `<div class="plots">${b.plots.map((p) => `<figure id="${escapeHtml(p.id)}">${p.svg}</figure>`).join('\n')}</div>`;
    case 'checks':
      return `<ul class="checks">${b.checks
        .map(
          (c) =>
            `<li class="${c.ok ? 'pass' : 'fail'}"><span class="badge">${c.ok ? 'pass' : 'fail'}</span> <strong>${escapeHtml(c.name)}</strong> <span class="detail">${escapeHtml(c.detail)}</span></li>`,
        )
        .join('')}</ul>`;
    case 'inputs':
      return `<div class="inputs">${b.groups
        .map(
          (g) =>
            `<div class="input-group"><h3>${escapeHtml(g.title)}</h3>${table(
              [
                { header: 'input' },
                { header: 'value', align: 'right' },
                { header: 'unit' },
                { header: 'note' },
              ],
              g.rows.map((r) => [r.name, r.value, r.unit ?? '', r.note ?? '']),
            )}</div>`,
        )
        .join('\n')}</div>`;
  }
}

function slug(text: string, i: number): string {
  return `s${i + 1}-${text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')}`;
}

/**
 * Renders a self-contained HTML report page: inline CSS, inline SVG plots, no scripts and no
 * external resources (fonts, images, style sheets), so it can be mailed, archived and opened
 * offline, and prints cleanly on A4 or Letter.
 *
 * @remarks
 * Layout: title and header facts, the safety caution (at the top, where it is read, and again in
 * the footer), a table of contents when there are several sections, then each section with its
 * blocks: paragraphs, tables, plot grids, pass/fail checks and input tables. Every text is
 * HTML-escaped; plots are embedded as made by {@link linePlot} and {@link barChart}. The page
 * takes no date or random value of its own, so the same inputs give the same bytes (pass the
 * run's date in `meta`).
 *
 * @param options - Title, header facts, sections, generator.
 * @returns The HTML document.
 * @example
 * ```ts
 * const html = renderHtmlReport({
 *   title: 'Hopper scale: design report', generator: 'bridgework 0.1.0',
 *   sections: [{ title: 'north-cell', blocks: [{ kind: 'plots', plots: [plot] }] }],
 * });
 * await writeFileAtomic('hopper.html', html);
 * ```
 */
export function renderHtmlReport(options: HtmlReportOptions): string {
  const meta = (options.meta ?? [])
    .map((m) => `<div><dt>${escapeHtml(m.label)}</dt><dd>${escapeHtml(m.value)}</dd></div>`)
    .join('');
  const toc =
    options.sections.length > 1
      ? `<nav aria-label="Contents"><ol>${options.sections
          .map((s, i) => `<li><a href="#${slug(s.title, i)}">${escapeHtml(s.title)}</a></li>`)
          .join('')}</ol></nav>`
      : '';
  const sections = options.sections
    .map(
      (s, i) =>
        // The heading and the first block stay together on a printed page.
        `<section id="${slug(s.title, i)}">\n<div class="keep"><h2>${escapeHtml(s.title)}</h2>\n${s.blocks
          .slice(0, 1)
          .map(block)
          .join('\n')}</div>\n${s.blocks.slice(1).map(block).join('\n')}\n</section>`,
    )
    .join('\n');
  const caution = escapeHtml(SAFETY_CAUTION);
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="${escapeHtml(options.generator)}">
<title>${escapeHtml(options.title)}</title>
<style>
${reportCss}
</style>
</head>
<body>
<header>
<h1>${escapeHtml(options.title)}</h1>
${options.subtitle === undefined ? '' : `<p class="subtitle">${escapeHtml(options.subtitle)}</p>`}
${meta === '' ? '' : `<dl class="meta">${meta}</dl>`}
<aside class="caution" role="note"><strong>Caution.</strong> ${caution}</aside>
</header>
${toc}
<main>
${sections}
</main>
<footer>
<p>${caution}</p>
<p>Generated by ${escapeHtml(options.generator)}.</p>
</footer>
</body>
</html>
`;
}
