import { createChannel, type Channel, type ChannelSpec } from '@bridgework/channel';
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';
import { selectChannels, validateChannelDocument, type ChannelFile } from '../channelFile/loadChannelFile.js';
import type { ChannelDocument } from '../channelFile/parseChannelDocument.js';
import { readChannelDocument } from '../channelFile/readChannelDocument.js';
import { validateChannelEntry } from './validateChannelEntry.js';

/** One channel of a file, ready to use. */
export interface LoadedChannel {
  /** The channel's name (its key in the file). */
  readonly name: string;
  /** The validated spec, defaults applied, with `name` set to the key. */
  readonly spec: ChannelSpec;
  /** The entry exactly as written in the file (for "from the file" notes in reports). */
  readonly raw: unknown;
  /** The channel, made by `createChannel`. */
  readonly channel: Channel;
}

/** A channel file with its selected channels made. */
export interface LoadedChannels {
  /** The validated file. */
  readonly file: ChannelFile<ChannelSpec>;
  /** The parsed document (its raw data and positions). */
  readonly document: ChannelDocument;
  /** The selected channels, in the order asked for (or file order). */
  readonly channels: readonly LoadedChannel[];
}

/**
 * Reads and validates a channel file and makes the channels named on the command line.
 *
 * @remarks
 * Validation reports every problem of the file at once (see {@link validateChannelDocument});
 * only then are the channels made. A problem that only making the channel can find (a span that
 * the converter cannot reach, say) is reported with the file and the channel's path too.
 *
 * @param path - The channel file.
 * @param names - The channels to make, or `undefined` for all of them.
 * @returns The file and the channels.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error`, `parse-error`, `invalid-spec` (every
 * problem, `file:line:column: channels.<name>.<field>: message`), `invalid-option` for an unknown
 * channel name.
 */
export async function loadChannels(path: string, names?: readonly string[]): Promise<LoadedChannels> {
  const document = await readChannelDocument(path);
  const file = validateChannelDocument(document, { validateChannel: validateChannelEntry });
  const rawChannels = (document.data as { channels: Record<string, unknown> }).channels;
  const channels = selectChannels(file, names).map(({ name, spec }) => {
    const named: ChannelSpec = { ...spec, name };
    let channel: Channel;
    try {
      channel = createChannel(named);
    } catch (e) {
      if (!isBridgeworkError(e)) throw e;
      const message = e.message.replace(`channel '${name}': `, '');
      const where = document.locate(`channels.${name}`);
      const at = where === undefined ? path : `${path}:${where.line}:${where.column}`;
      throw new BridgeworkError(
        'invalid-spec',
        `${path} has a problem:\n${at}: channels.${name}: ${message}`,
        {
          param: path,
          issues: [{ path: `channels.${name}`, message }],
          cause: e,
        },
      );
    }
    return { name, spec: named, raw: rawChannels[name], channel };
  });
  return { file, document, channels };
}

/**
 * Runs one step of a command on one channel (its budget, constants or curves) and, when the
 * channel package rejects it, reports the problem with the file, the channel and its position:
 * `hook.yaml:7:5: channels.hook.output.range: …`.
 *
 * @remarks
 * Some problems of a channel show only when it is used, not when it is made: an `output.range`
 * beyond the converter's full scale, for example, has no budget point. The error keeps its code
 * (so the exit code is that of bad input); the budget point is named for what it is, the end of
 * the span of larger magnitude.
 *
 * @param loaded - The channel file.
 * @param channel - The channel.
 * @param step - The step.
 * @returns What the step returns.
 * @throws {@link @bridgework/core!BridgeworkError} the step's error, with the file and channel in
 * its message.
 */
export function inChannel<T>(loaded: LoadedChannels, channel: LoadedChannel, step: () => T): T {
  try {
    return step();
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    const span = e.param === 'at' || e.param === 'output.range';
    const path = `channels.${channel.name}${span ? '.output.range' : ''}`;
    const where = loaded.document.locate(path);
    const at = where === undefined ? loaded.file.file : `${loaded.file.file}:${where.line}:${where.column}`;
    const message = e.message
      .replace(`channel '${channel.name}': `, '')
      .replace(/^`at` must map/, 'the budget point (the end of the span of larger magnitude) must map')
      .replace(/^`output\.range` must/, 'must');
    throw new BridgeworkError(e.code, `${at}: ${path}: ${message}`, {
      param: path,
      ...(e.value === undefined ? {} : { value: e.value }),
      ...(e.limit === undefined ? {} : { limit: e.limit }),
      cause: e,
    });
  }
}
