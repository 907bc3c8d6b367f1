import { linePlot } from '../html/linePlot.js';
import type { ReportBlock, ReportSection } from '../html/renderHtmlReport.js';
import { wrapText } from '../internal/wrapText.js';
import { formatTable } from '../terminal/formatTable.js';
import type { TextStyle } from '../terminal/textStyle.js';
import type { GroupReport } from './groupReport.js';

const WIDTH = 100;
const indent = (text: string): string =>
  text
    .split('\n')
    .map((l) => (l === '' ? l : `  ${l}`))
    .join('\n');

/**
 * A group's report as text for the terminal: its title, its figures in words, its tables and
 * its checks (`pass`/`FAIL`), lines of at most about 100 columns.
 *
 * @param report - The group's report.
 * @param style - Colours.
 * @returns The text, without a trailing blank line.
 */
export function formatGroupText(report: GroupReport, style: TextStyle): string {
  const parts = [style.bold(report.title)];
  for (const p of report.paragraphs) parts.push(wrapText(p, WIDTH, '  ').join('\n'));
  for (const t of report.tables)
    parts.push(`  ${t.caption}\n${indent(formatTable(t.columns, t.rows)).trimEnd()}`);
  if (report.checks.length > 0)
    parts.push(
      report.checks
        .map((c) => `  ${c.ok ? style.green('pass') : style.red('FAIL')}  ${c.name}: ${c.detail}`)
        .join('\n'),
    );
  return parts.join('\n\n');
}

/**
 * A group's report as a section of the HTML report: the same paragraphs, tables and checks, and
 * for a multi-component group a plot of each component's load residual (% of its full scale)
 * against the point of the loading schedule.
 *
 * @param report - The group's report.
 * @returns The section.
 */
export function groupHtmlSection(report: GroupReport): ReportSection {
  const blocks: ReportBlock[] = report.paragraphs.map((text) => ({ kind: 'text', text }));
  if (report.checks.length > 0) blocks.push({ kind: 'checks', checks: report.checks });
  if (report.residuals !== undefined) {
    blocks.push({
      kind: 'plots',
      plots: [
        linePlot({
          id: `group-${report.name.replace(/[^A-Za-z0-9_-]/g, '_')}-residuals`,
          title: `${report.name}: load residual per component`,
          x: { label: 'point of the schedule' },
          y: { label: 'residual', unit: '% of full scale' },
          series: report.residuals.series.map((s) => ({
            name: s.name,
            x: s.fractions.map((_, i) => i + 1),
            y: s.fractions.map((f) => 100 * f),
          })),
          width: 720,
        }),
      ],
    });
  }
  for (const t of report.tables)
    blocks.push({ kind: 'table', caption: t.caption, columns: t.columns, rows: t.rows });
  return { title: report.title, blocks };
}
