import { createChannel, validateChannelSpec, type Channel, type ChannelSpec } from '@bridgework/channel';
import { BridgeworkError, isBridgeworkError, type SpecIssue } from '@bridgework/core';
import {
  selectChannels,
  validateChannelDocument,
  type ChannelValidation,
  type ChannelFile,
  type QuantityParser,
} from '../channelFile/loadChannelFile.js';
import { formatIssues } from '../channelFile/formatIssues.js';
import type { ChannelDocument } from '../channelFile/parseChannelDocument.js';
import { readChannelDocument } from '../channelFile/readChannelDocument.js';

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
 * Validates one entry of a file's `channels` mapping with the channel package's
 * `validateChannelSpec`, once: its issues are passed on as they are (the loader prefixes their
 * paths). The channel's name is its key in the file, so a `name` field inside the entry is a
 * problem of the file.
 */
export function validateFileEntry(
  raw: unknown,
  parseQuantity: QuantityParser,
): ChannelValidation<ChannelSpec> {
  const hasName = typeof raw === 'object' && raw !== null && Object.hasOwn(raw, 'name');
  const nameIssue: SpecIssue[] = hasName
    ? [
        {
          code: 'unknown-option',
          path: 'name',
          message: "is not a field of a channel in a file: the channel's name is its key",
        },
      ]
    : [];
  const entry = hasName ? Object.fromEntries(Object.entries(raw).filter(([k]) => k !== 'name')) : raw;
  // The channel package reads quantities written with units itself (its unit table).
  void parseQuantity;
  const result = validateChannelSpec(entry);
  const issues = [...nameIssue, ...result.issues];
  return issues.length === 0 && result.ok ? { value: result.value, issues } : { issues };
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
 * @param names - The channels to make, or `undefined` for all of them.
 * @returns The file and the channels.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error`, `parse-error`, `invalid-spec` (every
 * problem, `file:line:column: channels.<name>.<field>: message`), `invalid-option` for an unknown
 * channel name.
 */
export async function loadChannels(path: string, names?: readonly string[]): Promise<LoadedChannels> {
  const document = await readChannelDocument(path);
  const file = validateChannelDocument(document, { validateChannel: validateFileEntry });
  const rawChannels = (document.data as { channels: Record<string, unknown> }).channels;
  const channels = selectChannels(file, names).map(({ name, spec }) => {
    const named: ChannelSpec = { ...spec, name };
    let channel: Channel;
    try {
      channel = createChannel(named);
    } catch (e) {
      if (!isBridgeworkError(e)) throw e;
      throw channelError(document, name, e);
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
