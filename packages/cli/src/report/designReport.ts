import { channelBudget, type ChannelBudget } from '@bridgework/channel';
import { inChannel, type LoadedChannel, type LoadedChannels } from '../channels/loadChannels.js';
import type { ProjectInfo } from '../channelFile/loadChannelFile.js';
import { designChecks, type DesignCheckRow } from './designChecks.js';
import { describeChannel } from './describeChannel.js';
import { displayUnit, type DisplayUnit } from './displayUnit.js';

/** The design report of one channel: its budget and what the report shows of it. */
export interface ChannelDesign {
  /** The channel as loaded from the file. */
  readonly loaded: LoadedChannel;
  /** The channel package's budget at the default point (the span's end of larger magnitude). */
  readonly budget: ChannelBudget;
  /** The unit the quantity is shown in for people. */
  readonly display: DisplayUnit;
  /** The hardware in words (two lines). */
  readonly description: readonly [string, string];
  /** The headroom checks. */
  readonly checks: readonly DesignCheckRow[];
  /** The converter input at the budget point as a fraction of the excitation, V/V. */
  readonly inputRatioAtPoint: number;
}

/** The design report of a channel file. */
export interface DesignReport {
  /** The channel file, as given. */
  readonly file: string;
  /** Its project metadata. */
  readonly project: ProjectInfo;
  /** One entry per selected channel. */
  readonly channels: readonly ChannelDesign[];
  /** True when every check of every channel passed. */
  readonly ok: boolean;
}

/**
 * Computes the design report of the channels of a file: each channel's budget (noise,
 * resolution, nonlinearity, leads, temperature, tolerances, combined and expanded uncertainty;
 * see `Channel.budget`) and its headroom checks. Every number comes from the channel package.
 *
 * @param loaded - The channel file and its selected channels.
 * @returns The report.
 */
export function designReport(loaded: LoadedChannels): DesignReport {
  const channels = loaded.channels.map((c): ChannelDesign => {
    const budget = inChannel(loaded, c, () => channelBudget(c.channel));
    return {
      loaded: c,
      budget,
      display: displayUnit(c.channel),
      description: describeChannel(c.channel, budget),
      checks: designChecks(budget),
      inputRatioAtPoint: c.channel.inputAt(budget.at).inputRatio,
    };
  });
  return {
    file: loaded.file.file,
    project: loaded.file.project,
    channels,
    ok: channels.every((c) => c.budget.ok),
  };
}
