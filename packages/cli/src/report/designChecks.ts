import type { ChannelBudget } from '@bridgework/channel';
import { formatNumber } from './formatNumber.js';

/** One design check of a channel, with the figures behind its verdict. */
export interface DesignCheckRow {
  /** The limit checked, as the chain package names it (`'input-common-mode-low'`). */
  readonly limit: string;
  /** What was checked, in words (`'input common mode, low limit'`). */
  readonly name: string;
  /** Whether the limit is met at every point of the span. */
  readonly ok: boolean;
  /** The node's voltage at the worst point, V (headroom checks only). */
  readonly nodeVolts?: number;
  /** The limit, V (headroom checks only). */
  readonly limitVolts?: number;
  /** Distance from the node to the limit, V, negative when violated (headroom checks only). */
  readonly marginVolts?: number;
  /** The figures (and, for a failed check, what clips) as one line of text. */
  readonly detail: string;
}

const names: Readonly<Record<string, string>> = {
  'input-common-mode-low': 'amplifier input common mode, low limit',
  'input-common-mode-high': 'amplifier input common mode, high limit',
  'input-differential': 'amplifier differential input range',
  'first-stage-low': 'amplifier first stage, low swing',
  'first-stage-high': 'amplifier first stage, high swing',
  'output-low': 'amplifier output, low swing',
  'output-high': 'amplifier output, high swing',
  'adc-low': 'converter low rail',
  'adc-high': 'converter high rail',
};

const volts = (v: number): string => `${formatNumber(v, 3)} V`;

/**
 * The headroom checks of a channel's front end (chain `checkHeadroom`, through the channel budget),
 * one row per limit, at the worst point of the span.
 *
 * @remarks
 * The converter's rails are always checked; the amplifier's limits only when the channel file
 * states them (`amplifier.limits`). A failed check carries the chain package's message (what
 * clips, where and by how much). Any other violated limit of the front end (self-heating) is
 * added as a failed row.
 *
 * @param budget - The channel's budget.
 * @returns The checks, in the chain package's order.
 */
export function designChecks(budget: ChannelBudget): DesignCheckRow[] {
  const issues = budget.frontEnd.issues;
  const margins = budget.frontEnd.value.headroom.margins;
  const rows: DesignCheckRow[] = margins.map((m) => {
    const issue = issues.find((i) => i.limit === m.limit);
    const figures = `${volts(m.nodeVolts)} against ${volts(m.limitVolts)}, margin ${volts(m.marginVolts)}`;
    return {
      limit: m.limit,
      name: names[m.limit] ?? m.limit,
      ok: m.ok,
      nodeVolts: m.nodeVolts,
      limitVolts: m.limitVolts,
      marginVolts: m.marginVolts,
      detail: issue === undefined ? figures : `${figures}: ${issue.message}`,
    };
  });
  // Limits that are not headroom margins (self-heating, when a limit is stated).
  for (const issue of issues) {
    if (margins.some((m) => m.limit === issue.limit)) continue;
    rows.push({ limit: issue.limit, name: issue.limit.replace(/-/g, ' '), ok: false, detail: issue.message });
  }
  return rows;
}
