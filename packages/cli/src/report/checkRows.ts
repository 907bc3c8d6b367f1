import { formatQuantity, type ChannelDesignCheck } from '@bridgework/channel';

/** A figure as the checks show it, with a true minus sign, its unit held to it by a no-break space. */
const figure = (value: number, unit: string): string =>
  formatQuantity(value, unit, 3).replace(/-/g, '−').replace(/ /g, '\u00a0');

/** Whether a check's figure and threshold are shares (fractions of a whole, shown in percent). */
function isShare(check: ChannelDesignCheck): boolean {
  return check.unit === '' && !check.id.startsWith('plausible:');
}

/**
 * The threshold a design check was held to, in words with its unit (`'threshold 100 codes'`,
 * `'threshold 10 %'`), or `''` when the check has no numeric threshold (a limit of the front end
 * stated only as a message, or the count of non-finite figures, which must be none).
 *
 * @remarks
 * Shares (the span's share of the converter's range, the uncertainty and the noise against the
 * span) are fractions in the channel package and shown here in percent; every other threshold is
 * shown in the check's own unit.
 *
 * @param check - A check of `ChannelBudget.checks`.
 * @returns The text.
 */
export function thresholdText(check: ChannelDesignCheck): string {
  // The finite-figures check counts figures against none, the sensor-calibration check asks for a
  // tolerance above 0: their messages say so in words.
  if (!Number.isFinite(check.limit) || check.id === 'finite' || check.id === 'sensor-calibration') return '';
  return isShare(check)
    ? `threshold ${figure(check.limit * 100, '%')}`
    : `threshold ${figure(check.limit, check.unit)}`;
}

/** How a report marks a check's status (`WARN` and `FAIL` in capitals, so they stand out). */
export function statusMark(check: Pick<ChannelDesignCheck, 'status'>): 'pass' | 'WARN' | 'FAIL' {
  return check.status === 'pass' ? 'pass' : check.status === 'warn' ? 'WARN' : 'FAIL';
}

/**
 * A check's verdict in one line: the channel package's message (with the figure, and for a
 * warning or failure what to change), then the threshold it was held to, unless the message
 * states it already.
 *
 * @param check - A check of `ChannelBudget.checks`.
 * @returns `name: message (threshold …)`.
 */
export function checkDetail(check: ChannelDesignCheck): string {
  const threshold = thresholdText(check);
  // A message that states its threshold already (the front end's limits, a failed share) keeps it once.
  const stated = isShare(check)
    ? formatQuantity(check.limit * 100, '%')
    : formatQuantity(check.limit, check.unit);
  // The channel package writes a true minus sign and a no-break space before a unit; compare in that form.
  const plain = (t: string) => t.replace(/-/g, '−').replace(/\u00a0/g, ' ');
  return threshold === '' || plain(check.message).includes(plain(stated))
    ? check.message
    : `${check.message} (${threshold})`;
}

/** The counts of a channel's checks by status. */
export interface CheckCounts {
  /** Checks that passed. */
  readonly pass: number;
  /** Warnings: a reviewer would question the design. */
  readonly warn: number;
  /** Failures: the channel cannot be trusted as designed. */
  readonly fail: number;
}

/**
 * Counts checks by status.
 *
 * @param checks - The checks.
 * @returns The counts.
 */
export function countChecks(checks: readonly ChannelDesignCheck[]): CheckCounts {
  let pass = 0;
  let warn = 0;
  let fail = 0;
  for (const c of checks) {
    if (c.status === 'fail') fail++;
    else if (c.status === 'warn') warn++;
    else pass++;
  }
  return { pass, warn, fail };
}

/**
 * The outcome of checks in a few words (`'pass'`, `'2 warnings'`, `'1 failed, 1 warning'`).
 *
 * @param counts - The counts.
 * @returns The text.
 */
export function checksOutcome(counts: CheckCounts): string {
  const parts: string[] = [];
  if (counts.fail > 0) parts.push(`${counts.fail} failed`);
  if (counts.warn > 0) parts.push(`${counts.warn} warning${counts.warn === 1 ? '' : 's'}`);
  return parts.length === 0 ? 'pass' : parts.join(', ');
}

/**
 * Whether a check is one of the plausible-input checks (`plausible:<field>`): the text report
 * folds those that pass into one line.
 */
export function isPlausibleInputCheck(check: ChannelDesignCheck): boolean {
  return check.id.startsWith('plausible:');
}

/** One row of a report's list of design checks. */
export interface CheckRow {
  /** What was checked. */
  readonly name: string;
  /** Its verdict. */
  readonly status: ChannelDesignCheck['status'];
  /** The figures behind it ({@link checkDetail}). */
  readonly detail: string;
}

/**
 * A channel's design checks as the reports list them: each check on its own row, except the
 * plausible-input checks that pass, which share one row naming their fields (they say only that
 * each input lies in its usual range); a plausible-input warning keeps its own row.
 *
 * @param checks - `ChannelBudget.checks`.
 * @returns The rows, in the checks' order, the shared row last.
 */
export function checkRows(checks: readonly ChannelDesignCheck[]): CheckRow[] {
  const folded = checks.filter((k) => isPlausibleInputCheck(k) && k.status === 'pass');
  const rows: CheckRow[] = checks
    .filter((k) => !folded.includes(k))
    .map((k) => ({ name: k.name, status: k.status, detail: checkDetail(k) }));
  if (folded.length > 0)
    rows.push({
      name: 'inputs in their usual ranges',
      status: 'pass',
      detail: folded.map((k) => k.path ?? k.id).join(', '),
    });
  return rows;
}
