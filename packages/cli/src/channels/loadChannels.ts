import { createChannel, validateChannelSpec, type Channel, type ValidChannelSpec } from '@bridgework/channel';
import { BridgeworkError, isBridgeworkError, type SpecIssue } from '@bridgework/core';
import {
  selectChannels,
  validateChannelDocument,
  type ChannelValidation,
  type ChannelFile,
} from '../channelFile/loadChannelFile.js';
import { formatIssues } from '../channelFile/formatIssues.js';
import type { ChannelDocument } from '../channelFile/parseChannelDocument.js';
import { readChannelDocument } from '../channelFile/readChannelDocument.js';

/**
 * How the entries of a channel file become channels: the channel package's `validateChannelSpec`
 * and `createChannel`, or a kit of the same two functions over other sensor kinds (the channel
 * package's `createChannelKit`). The command reads nothing of a channel but what the `Channel`
 * and its budget tell, so any kit's channels report, convert and run Monte Carlo alike.
 */
export interface ChannelFactory {
  /** Validates one spec once; issues are data, never thrown. */
  validateChannelSpec(spec: unknown): {
    readonly ok: boolean;
    readonly value: unknown;
    readonly issues: readonly SpecIssue[];
  };
  /** Makes the channel of a validated spec (without checking it again). */
  createChannel(spec: unknown): Channel;
}

/** The channel package's own factory: its built-in sensor kinds. */
const builtInChannels: ChannelFactory = { validateChannelSpec, createChannel };

/** One channel of a file, ready to use. */
export interface LoadedChannel {
  /** The channel's name (its key in the file). */
  readonly name: string;
  /** The validated spec, defaults applied, with `name` set to the key (`Channel.spec`). */
  readonly spec: ValidChannelSpec;
  /** The entry exactly as written in the file (for "from the file" notes in reports). */
  readonly raw: unknown;
  /** The channel, made by `createChannel`. */
  readonly channel: Channel;
}

/** A channel file with its selected channels made. */
export interface LoadedChannels {
  /** The validated file. */
  readonly file: ChannelFile<unknown>;
  /** The parsed document (its raw data and positions). */
  readonly document: ChannelDocument;
  /** The selected channels, in the order asked for (or file order). */
  readonly channels: readonly LoadedChannel[];
}

/**
 * The validator of one entry of a file's `channels` mapping: the factory's `validateChannelSpec`,
 * once, with the channel's name (its key in the file) set, so a `name` field inside the entry is
 * a problem of the file. Issues are passed on as they are (the loader prefixes their paths).
 *
 * @param channels - The factory (default: the channel package's own).
 * @returns The validator.
 */
export function fileEntryValidator(
  channels: ChannelFactory = builtInChannels,
): (raw: unknown, name: string) => ChannelValidation<unknown> {
  return (raw, name) => {
    const hasName = typeof raw === 'object' && raw !== null && Object.hasOwn(raw, 'name');
    if (hasName)
      return {
        issues: [
          {
            code: 'unknown-option',
            path: 'name',
            message: "is not a field of a channel in a file: the channel's name is its key",
          },
        ],
      };
    const entry = typeof raw === 'object' && raw !== null && !Array.isArray(raw) ? { ...raw, name } : raw;
    const result = channels.validateChannelSpec(entry);
    return result.ok && result.issues.length === 0
      ? { value: result.value, issues: [] }
      : { issues: result.issues };
  };
}

/**
 * The error of a channel step (making it, its budget, its constants) with the file, the channel
 * and the position: the error's issues, when it has them, with their paths inside the file;
 * otherwise its message as it is, under the channel's path.
 */
function channelError(document: ChannelDocument, name: string, e: BridgeworkError): BridgeworkError {
  const prefix = `channels.${name}`;
  const issues: SpecIssue[] =
    e.issues.length > 0
      ? e.issues.map((i) => ({ ...i, path: i.path === '' ? prefix : `${prefix}.${i.path}` }))
      : [{ code: e.code, path: prefix, message: e.message }];
  const count = issues.length === 1 ? 'a problem' : `${issues.length} problems`;
  return new BridgeworkError(
    e.code,
    `${document.file} has ${count}:\n${formatIssues(document.file, issues, document.locate).trimEnd()}`,
    {
      param: issues.length === 1 ? (issues[0] as SpecIssue).path : prefix,
      ...(e.value === undefined ? {} : { value: e.value }),
      ...(e.limit === undefined ? {} : { limit: e.limit }),
      issues,
      cause: e,
    },
  );
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
 * @param names - The channels to make, or `undefined` for all of them; or a function of the
 *   validated file that returns them (to take them from the file's `recording` section).
 * @param factory - How entries are validated and made (default: the channel package's own).
 * @returns The file and the channels.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error`, `parse-error`, `invalid-spec` (every
 * problem, `file:line:column: channels.<name>.<field>: message`), `invalid-option` for an unknown
 * channel name.
 */
export async function loadChannels(
  path: string,
  names?: readonly string[] | ((file: ChannelFile<unknown>) => readonly string[] | undefined),
  factory: ChannelFactory = builtInChannels,
): Promise<LoadedChannels> {
  const document = await readChannelDocument(path);
  const file = validateChannelDocument(document, { validateChannel: fileEntryValidator(factory) });
  const rawChannels = (document.data as { channels: Record<string, unknown> }).channels;
  const channels = selectChannels(file, typeof names === 'function' ? names(file) : names).map(
    ({ name, spec }) => {
      let channel: Channel;
      try {
        channel = factory.createChannel(spec);
      } catch (e) {
        if (!isBridgeworkError(e)) throw e;
        throw channelError(document, name, e);
      }
      return { name, spec: channel.spec, raw: rawChannels[name], channel };
    },
  );
  return { file, document, channels };
}

/**
 * Runs one step of a command on one channel (its budget, constants or curves) and, when the
 * channel package rejects it, reports the problem with the file, the channel and its position:
 * `hook.yaml:7:5: channels.hook.output.range: …`.
 *
 * @remarks
 * Some problems of a channel show only when it is used, not when it is made. The error keeps its
 * code (so the exit code is that of bad input) and its message text; its issues, when it has
 * them, are placed in the file by their paths.
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
    throw channelError(loaded.document, channel.name, e);
  }
}
