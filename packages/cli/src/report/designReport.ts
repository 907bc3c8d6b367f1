import { channelBudget, type ChannelBudget, type ChannelInput, type DisplayUnit } from '@bridgework/channel';
import { inChannel, type LoadedChannel, type LoadedChannels } from '../channels/loadChannels.js';
import type { ProjectInfo } from '../channelFile/loadChannelFile.js';
import { describeChannel } from './describeChannel.js';

/** The design report of one channel: its budget and what the report shows of it. */
export interface ChannelDesign {
  /** The channel as loaded from the file. */
  readonly loaded: LoadedChannel;
  /** The channel package's budget at the default point (the span's end of larger magnitude), with its design checks. */
  readonly budget: ChannelBudget;
  /** The unit the quantity is shown in for people (`Channel.display`). */
  readonly display: DisplayUnit;
  /** The hardware in words (two lines: the channel's own description with its wiring; the front end). */
  readonly description: readonly [string, string];
  /** What the converter sees at the budget point (`Channel.inputAt`). */
  readonly point: ChannelInput;
}

/** The design report of a channel file. */
export interface DesignReport {
  /** The channel file, as given. */
  readonly file: string;
  /** Its project metadata. */
  readonly project: ProjectInfo;
  /** One entry per selected channel. */
  readonly channels: readonly ChannelDesign[];
  /** True when no design check of any channel failed (warnings allowed). */
  readonly ok: boolean;
}

/**
 * Computes the design report of the channels of a file: each channel's budget (noise,
 * resolution, nonlinearity, leads, temperature, tolerances, combined and expanded uncertainty)
 * and its design checks (`channelBudget` of the channel package). Every number comes from the
 * channel package; the report only chooses what to show.
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
      display: c.channel.display,
      description: describeChannel(c.channel, budget),
      point: inChannel(loaded, c, () => c.channel.inputAt(budget.at)),
    };
  });
  return {
    file: loaded.file.file,
    project: loaded.file.project,
    channels,
    ok: channels.every((c) => c.budget.ok),
  };
}
