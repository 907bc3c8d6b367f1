import { createInterleavedConverter } from '@bridgework/channel';
import { loadChannels } from '../../channels/loadChannels.js';
import type { InterleavedConverter } from '../../data/clipCounter.js';
import { splitOptionList } from '../../internal/splitOptionList.js';
import type { CommandContext } from '../CommandContext.js';
import type { ConvertArgs } from './convertCommand.js';
import { runConversion } from './runConversion.js';

/**
 * Splits `--channels`: channel names, comma-separated.
 *
 * @param list - The option's text, e.g. `'hook,trolley'`.
 * @returns The names.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an empty entry.
 */
export function parseChannelList(list: string): string[] {
  return splitOptionList(list, '--channels');
}

/**
 * The body of `bridgework convert`: loads the channel file, builds the interleaved converter of
 * the selected channels (`createInterleavedConverter` of the channel package: each lane with its
 * channel's exact map, rail and out-of-range codes as NaN) and hands the streaming to
 * {@link runConversion}.
 *
 * @remarks
 * Column headings are the channel names with the channel's unit, e.g. `hanger-h3 (N)`; values are
 * in that unit (the channel's own, not a report's display unit).
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns The exit code of {@link runConversion}.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file or channel list, and
 * everything {@link runConversion} throws.
 */
export async function run(args: ConvertArgs, context: CommandContext): Promise<number> {
  const names = args.options.channels === undefined ? undefined : parseChannelList(args.options.channels);
  const loaded = await loadChannels(args.positionals.channelFile, names);
  const interleaved = createInterleavedConverter(loaded.channels.map((c) => c.channel));
  const converter: InterleavedConverter = (codes, _channels, out) => {
    // Locations are not needed: the clip counter finds the frames from the NaN samples.
    const { statuses } = interleaved.convert(codes, out, { maxLocations: 0 });
    let clipped = 0;
    for (const s of statuses) clipped += s.rejected;
    return { clipped };
  };
  return runConversion(args, context, {
    columns: loaded.channels.map((c) => `${c.name} (${c.channel.unit})`),
    converter,
  });
}
