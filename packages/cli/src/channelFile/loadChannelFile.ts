import { BridgeworkError, formatValue, type SpecIssue } from '@bridgework/core';
import { parseQuantity } from '@bridgework/channel';
import { closestName } from '@bridgework/core';
import { formatIssues } from './formatIssues.js';
import { reservedNames, type ChannelDocument } from './channelFileText.js';
import { readChannelDocument } from './readChannelDocument.js';
import { channelFileLimits } from './channelFileLimits.js';
import { validateRecordingSection, type RecordingSection } from './recordingSection.js';

/** What a channel validator returns: the typed spec when there are no issues. */
export interface ChannelValidation<T> {
  /** The validated spec (present when `issues` is empty). */
  readonly value?: T;
  /** Every problem found, with paths relative to the channel (`'sensor.gaugeOhms'`). */
  readonly issues: readonly SpecIssue[];
}

/**
 * Validates one channel's raw data (the channel package's `validateChannelSpec`), given the
 * channel's name (its key in the file). Quantities with units are read by the validator itself
 * (the channel package's unit table; `parseQuantity` of `@bridgework/channel` for a section of
 * its own).
 */
export type ChannelValidator<T> = (raw: unknown, name: string) => ChannelValidation<T>;

/** Optional project metadata at the top of a channel file. */
export interface ProjectInfo {
  /** A title for reports (`'Hopper scale, north silo'`). */
  readonly title?: string;
  /** Free text shown under the title. */
  readonly description?: string;
  /** A job, drawing or test reference. */
  readonly reference?: string;
}

/** One validated channel, with its name from the file. */
export interface NamedChannel<T> {
  /** The channel's name (its key under `channels`). */
  readonly name: string;
  /** The validated spec. */
  readonly spec: T;
}

/** A validated channel file. */
export interface ChannelFile<T> {
  /** The file name, as given. */
  readonly file: string;
  /** The project metadata (empty when the file has none). */
  readonly project: ProjectInfo;
  /** The channels, in file order. */
  readonly channels: readonly NamedChannel<T>[];
  /** The layout of the channels' recordings (the file's `recording` section), when it has one. */
  readonly recording?: RecordingSection;
}

/** Options of {@link loadChannelFile} and {@link validateChannelDocument}. */
export interface LoadChannelFileOptions<T> {
  /** Validates one channel (the channel package's schema). */
  readonly validateChannel: ChannelValidator<T>;
}

const topLevelKeys = ['$schema', 'project', 'channels', 'recording', 'groups'] as const;
const projectKeys = ['title', 'description', 'reference'] as const;
/** What a channel name (a key under `channels`) must match: a letter, then letters, digits, `_` and `-`, at most 63 in all. */
export const channelNamePattern = /^[A-Za-z][A-Za-z0-9_-]{0,62}$/;

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

/** Is `path` the field `at` or inside it? */
const within = (path: string, at: string): boolean =>
  path === at || path.startsWith(`${at}.`) || path.startsWith(`${at}[`);

function unknownKeys(record: Record<string, unknown>, known: readonly string[], prefix: string): SpecIssue[] {
  return Object.keys(record)
    .filter((k) => !known.includes(k))
    .map((k) => {
      const near = closestName(k, known);
      return {
        code: 'unknown-option' as const,
        path: `${prefix}${k}`,
        message: `unknown field${near === undefined ? `; expected one of ${known.join(', ')}` : `; did you mean '${near}'?`}`,
      };
    });
}

/**
 * Validates a parsed channel file: its layout (project metadata and a `channels` mapping) here,
 * each channel through `validateChannel`, and gathers every problem with its full field path.
 *
 * @remarks
 * Layout: the top level is a mapping with `channels` (required: a non-empty mapping from channel
 * name to channel spec), `project` (optional: `title`, `description`, `reference`, each a
 * string), `recording` (optional: the layout of the channels' recordings, see
 * {@link validateRecordingSection}), `groups` (optional: multi-bridge groups, validated by the
 * CLI's `validateGroups` once the channels are) and `$schema` (optional: a text naming the JSON
 * Schema for editors, otherwise ignored). Names start with a letter and hold letters, digits, `_` and `-` (at most 63), so they
 * can become C identifiers and CSV headings; names that every JavaScript object carries
 * (`constructor`, `toString`, `__proto__`...) are refused. Unknown fields are errors (typo
 * protection), with the closest known name suggested. A file with more than
 * `channelFileLimits.maxChannels` (1000) channels is refused before any channel is validated.
 * Issues from `validateChannel` keep every field (code, message, limit, expected, suggestion);
 * only their paths are prefixed with `channels.<name>.`. A number literal beyond a double's
 * range (the document's `valueIssues`) is reported for its field instead of what the validator
 * says about the resulting ±Infinity.
 *
 * @param document - The parsed file.
 * @param options - The channel validator.
 * @returns The validated file.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-spec` whose message lists every problem as
 * `file:line:column: field.path: message` (see {@link formatIssues}) and whose `issues` hold them.
 */
export function validateChannelDocument<T>(
  document: ChannelDocument,
  options: LoadChannelFileOptions<T>,
): ChannelFile<T> {
  const issues: SpecIssue[] = [];
  const channels: NamedChannel<T>[] = [];
  const project: Record<string, string> = {};
  let recording: RecordingSection | undefined;
  const root = document.data;
  issues.push(...document.valueIssues.filter((v) => !within(v.path, 'channels')));
  if (!isRecord(root)) {
    issues.push({ path: '', message: `must be a mapping with a 'channels' field; got ${formatValue(root)}` });
  } else {
    issues.push(...unknownKeys(root, topLevelKeys, '').filter((i) => !reservedNames.has(i.path)));
    // `$schema` names the JSON Schema for editors; the command only checks that it is a text.
    if (root['$schema'] !== undefined && typeof root['$schema'] !== 'string')
      issues.push({ path: '$schema', message: `must be a text; got ${formatValue(root['$schema'])}` });
    if (root['project'] !== undefined) {
      const p = root['project'];
      if (!isRecord(p)) {
        issues.push({ path: 'project', message: `must be a mapping; got ${formatValue(p)}` });
      } else {
        issues.push(
          ...unknownKeys(p, projectKeys, 'project.').filter((i) => !reservedNames.has(i.path.slice(8))),
        );
        for (const k of projectKeys) {
          const v = p[k];
          if (v === undefined) continue;
          if (typeof v === 'string') project[k] = v;
          else issues.push({ path: `project.${k}`, message: `must be a text; got ${formatValue(v)}` });
        }
      }
    }
    const list = root['channels'];
    if (list === undefined) {
      issues.push({ path: 'channels', message: 'is required: a mapping from channel name to channel' });
    } else if (!isRecord(list) || Object.keys(list).length === 0) {
      issues.push({
        path: 'channels',
        message: `must be a non-empty mapping from channel name to channel; got ${formatValue(list)}`,
      });
    } else if (Object.keys(list).length > channelFileLimits.maxChannels) {
      throw new BridgeworkError(
        'invalid-spec',
        `${document.file} has ${Object.keys(list).length} channels; a channel file may hold at most ${channelFileLimits.maxChannels}: split it into several files`,
        {
          param: document.file,
          limit: channelFileLimits.maxChannels,
          issues: [
            {
              code: 'out-of-range',
              path: 'channels',
              message: `holds ${Object.keys(list).length} channels`,
              limit: `${channelFileLimits.maxChannels} channels`,
              suggestion: 'split the file into several files',
            },
          ],
        },
      );
    } else {
      for (const [name, raw] of Object.entries(list)) {
        if (reservedNames.has(name)) {
          issues.push({
            code: 'invalid-option',
            path: `channels.${name}`,
            message: `'${name}' cannot name a channel: it is a name every JavaScript object carries; choose another name`,
          });
          continue;
        }
        if (!channelNamePattern.test(name)) {
          issues.push({
            path: `channels.${name}`,
            message:
              'is not a valid channel name: start with a letter; use letters, digits, _ and - (at most 63)',
          });
          continue;
        }
        const prefix = `channels.${name}`;
        const ownIssues = document.valueIssues.filter((v) => within(v.path, prefix));
        const result = options.validateChannel(raw, name);
        issues.push(...ownIssues);
        for (const issue of result.issues) {
          const path = `${prefix}${issue.path === '' ? '' : `.${issue.path}`}`;
          // A number beyond a double's range is named by the parser; the schema would only see ±Infinity.
          if (ownIssues.some((v) => within(path, v.path))) continue;
          issues.push({ ...issue, path });
        }
        if (ownIssues.length === 0 && result.issues.length === 0 && result.value !== undefined)
          channels.push({ name, spec: result.value });
      }
    }
  }
  if (isRecord(root) && root['recording'] !== undefined) {
    const names = isRecord(root['channels']) ? Object.keys(root['channels']) : [];
    const section = validateRecordingSection(root['recording'], names, parseQuantity);
    issues.push(...section.issues);
    recording = section.value;
  }
  if (issues.length > 0) {
    const count = issues.length === 1 ? 'a problem' : `${issues.length} problems`;
    throw new BridgeworkError(
      'invalid-spec',
      `${document.file} has ${count}:\n${formatIssues(document.file, issues, document.locate).trimEnd()}`,
      { param: document.file, issues },
    );
  }
  return { file: document.file, project, channels, ...(recording === undefined ? {} : { recording }) };
}

/**
 * Reads, parses and validates a channel file (see {@link readChannelDocument} and
 * {@link validateChannelDocument}).
 *
 * @param file - The path of a YAML or JSON channel file.
 * @param options - The channel validator.
 * @returns The validated file.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error`, `parse-error` (malformed YAML or JSON, with line and
 * column) or `invalid-spec` (every problem, with its field path).
 * @example
 * ```ts
 * const file = await loadChannelFile('hopper.yaml', { validateChannel });
 * for (const { name, spec } of file.channels) console.log(name, spec);
 * ```
 */
export async function loadChannelFile<T>(
  file: string,
  options: LoadChannelFileOptions<T>,
): Promise<ChannelFile<T>> {
  return validateChannelDocument(await readChannelDocument(file), options);
}

/**
 * The channels named on the command line (`--channel`, `--channels a,b`), in the order given, or
 * every channel when no name is given.
 *
 * @param file - The validated file.
 * @param names - The names, or `undefined` for all.
 * @returns The selected channels.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a name that is not in the file (with the
 * closest one suggested) or a name given twice.
 */
export function selectChannels<T>(
  file: ChannelFile<T>,
  names: readonly string[] | undefined,
): readonly NamedChannel<T>[] {
  if (names === undefined) return file.channels;
  const known = file.channels.map((c) => c.name);
  return names.map((name, i) => {
    const c = file.channels.find((x) => x.name === name);
    if (c === undefined) {
      const near = closestName(name, known);
      throw new BridgeworkError(
        'invalid-option',
        `${file.file} has no channel '${name}'${near === undefined ? `; it has ${known.join(', ')}` : `; did you mean '${near}'?`}`,
        { param: 'channel', value: name, limit: known },
      );
    }
    if (names.indexOf(name) !== i) {
      throw new BridgeworkError('invalid-option', `channel '${name}' is named twice`, {
        param: 'channel',
        value: name,
      });
    }
    return c;
  });
}
