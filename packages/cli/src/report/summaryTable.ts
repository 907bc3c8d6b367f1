import type { TableColumn } from '../terminal/formatTable.js';
import type { TextStyle } from '../terminal/textStyle.js';
import type { DesignReport } from './designReport.js';
import { checksOutcome, countChecks } from './checkRows.js';
import { formatNumber, formatProbability, formatStated } from './formatNumber.js';

/** The columns of the summary table of a design report. */
export const summaryColumns: readonly TableColumn[] = [
  { header: 'channel' },
  { header: 'quantity' },
  { header: 'span' },
  { header: 'u_c', align: 'right' },
  { header: 'U', align: 'right' },
  { header: 'checks' },
];

/**
 * The summary of a design report, one row per channel: name, quantity and shown unit, span,
 * combined standard uncertainty, expanded uncertainty with its coverage probability, and the
 * design checks (`pass`, `n warnings`, `n failed`), in the shown unit.
 *
 * @param report - The design report.
 * @param style - Colours for the checks cell (plain for HTML).
 * @returns The rows.
 */
export function summaryRows(
  report: DesignReport,
  style: Pick<TextStyle, 'green' | 'red' | 'yellow'>,
): string[][] {
  return report.channels.map((c) => {
    const b = c.budget;
    const f = c.display.factor;
    const counts = countChecks(b.checks);
    const outcome = checksOutcome(counts);
    return [
      c.loaded.name,
      `${b.quantity} (${c.display.unit})`,
      `${formatStated(b.span.min * f)} … ${formatStated(b.span.max * f)}`,
      formatNumber(b.combined.standardUncertainty * f),
      `${formatNumber(b.combined.expandedUncertainty * f)} (${formatProbability(b.combined.coverage)})`,
      counts.fail > 0 ? style.red(outcome) : counts.warn > 0 ? style.yellow(outcome) : style.green(outcome),
    ];
  });
}
