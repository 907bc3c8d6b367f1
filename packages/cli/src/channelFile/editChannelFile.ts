/**
 * Writing back into a channel file: set one section from a plain object and keep everything else
 * exactly as the user wrote it (comments, blank lines, quoting, indentation, key order), then
 * replace the file atomically, and only if nobody changed it since it was read.
 */
import { createHash } from 'node:crypto';
import { readFile, realpath, stat } from 'node:fs/promises';
import { isDeepStrictEqual } from 'node:util';
import { BridgeworkError, formatValue } from '@bridgework/core';
import {
  Document,
  isCollection,
  isMap,
  isScalar,
  parseDocument,
  visit,
  type Node,
  type Pair,
  type YAMLMap,
} from 'yaml';
import { writeFileAtomic } from '../files/atomicFile.js';
import { describeFsError } from '../internal/fileErrors.js';
import { fileEntryValidator } from '../channels/loadChannels.js';
import { channelFileLimits } from './channelFileLimits.js';
import { validateChannelDocument } from './loadChannelFile.js';
import { parseChannelDocument, reservedNames, type ChannelFileSyntax } from './parseChannelDocument.js';

/** Options of {@link ChannelFileEditor.set}. */
export interface SetSectionOptions {
  /**
   * One or more lines of comment written above the key (without `#`), for example who wrote the
   * section and when. Only for a key that is created or replaced in a YAML file.
   */
  readonly comment?: string;
}

/** Options of {@link ChannelFileEditor.save}. */
export interface SaveChannelFileOptions {
  /**
   * Validate the edited file as a channel file before writing (every channel through the channel
   * package's schema). Default true: a write-back never leaves a file the other commands refuse.
   */
  readonly validate?: boolean;
}

/**
 * A channel file opened for editing (see {@link openChannelFileEditor}).
 *
 * @remarks
 * Edits are made to the text, one section at a time, and checked by parsing the result: the
 * edited file must read back as the old content with exactly the edited sections changed. Nothing
 * touches the disk until {@link ChannelFileEditor.save}.
 */
export interface ChannelFileEditor {
  /** The path as given. */
  readonly file: string;
  /** YAML or JSON (by the file's extension, as the readers decide). */
  readonly syntax: ChannelFileSyntax;
  /** The content as read (plain data); edits do not change it. */
  readonly original: unknown;
  /** The content with the edits so far (plain data). */
  data(): unknown;
  /**
   * Sets the value at a path of keys from the top of the file, keeping everything else.
   *
   * @remarks
   * The value (plain data: objects, arrays, strings, finite numbers, booleans) replaces what is
   * at the path, or is added as the last key of its parent mapping; missing parents are created.
   * In YAML the section is written in block style with the file's own indentation and line
   * endings, lists of numbers in flow style (`[1, 2, 3]`); every byte outside the section is kept.
   *
   * @param path - Keys from the top, e.g. `['channels', 'hook', 'spanCorrection']` (at least one).
   * @param value - The new value.
   * @param options - A comment to write above the key.
   * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a bad path (empty, a key
   *   that is not a text, a parent that is not a mapping), `not-finite` for a NaN or ±Infinity in
   *   the value, `wrong-type` for a value that is not plain data.
   */
  set(path: readonly string[], value: unknown, options?: SetSectionOptions): void;
  /**
   * Removes the key at a path (nothing happens when it is absent).
   *
   * @param path - Keys from the top (at least two: the top-level `channels` stays).
   */
  remove(path: readonly string[]): void;
  /** The edited text, exactly as {@link ChannelFileEditor.save} would write it. */
  text(): string;
  /**
   * Writes the edited text atomically over the file (its permission bits kept, a symbolic link
   * followed), refusing when the file changed since it was read.
   *
   * @param options - Validation.
   * @throws {@link @bridgework/core!BridgeworkError} `io-error` when the file changed since it was read
   *   (nothing is written) or cannot be written; `invalid-spec` when the edited file would not be a
   *   valid channel file.
   */
  save(options?: SaveChannelFileOptions): Promise<void>;
}

const sha256 = (bytes: Uint8Array): string => createHash('sha256').update(bytes).digest('hex');

function pathError(path: readonly string[], message: string): BridgeworkError {
  return new BridgeworkError('invalid-option', `cannot edit ${path.join('.') || 'the file'}: ${message}`, {
    param: 'path',
    value: path,
  });
}

/** Checks that a value is plain data that YAML and JSON both write exactly. */
function checkPlain(value: unknown, where: string): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) {
      throw new BridgeworkError('not-finite', `\`${where}\` must be a finite number; got ${value}`, {
        param: where,
        value,
      });
    }
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => checkPlain(v, `${where}[${i}]`));
  } else if (typeof value === 'object' && value !== null) {
    const proto = Object.getPrototypeOf(value) as unknown;
    if (proto !== Object.prototype && proto !== null) {
      throw new BridgeworkError('wrong-type', `\`${where}\` must be plain data; got ${formatValue(value)}`, {
        param: where,
      });
    }
    for (const [k, v] of Object.entries(value)) {
      if (reservedNames.has(k)) {
        throw new BridgeworkError('invalid-option', `\`${where}.${k}\` is not a usable key`, {
          param: `${where}.${k}`,
        });
      }
      checkPlain(v, `${where}.${k}`);
    }
  } else if (typeof value !== 'string' && typeof value !== 'boolean') {
    throw new BridgeworkError(
      'wrong-type',
      `\`${where}\` must be plain data (object, array, text, number, boolean); got ${formatValue(value)}`,
      { param: where },
    );
  }
}

/** The plain data with `value` at `path` (copies along the path only). */
function withValue(data: unknown, path: readonly string[], value: unknown): unknown {
  if (path.length === 0) return value;
  const [head, ...rest] = path as [string, ...string[]];
  const record = (typeof data === 'object' && data !== null && !Array.isArray(data) ? data : {}) as Record<
    string,
    unknown
  >;
  const copy: Record<string, unknown> = { ...record };
  if (rest.length === 0 && value === undefined) delete copy[head];
  else copy[head] = withValue(record[head], rest, value);
  return copy;
}

/** The 1-based column of an offset in a text. */
function columnOf(text: string, offset: number): number {
  return offset - (text.lastIndexOf('\n', offset - 1) + 1);
}

/** Is the node a block collection (written on its own lines)? */
function isBlock(node: unknown): boolean {
  return isCollection(node) && !(node as { flow?: boolean }).flow;
}

/** The indentation step of a YAML text: the first increase of indentation between key lines, or 2. */
function indentUnit(text: string): number {
  let previous = -1;
  for (const line of text.split('\n')) {
    if (!/^\s*[^\s#-][^:]*:(\s|$)/.test(line)) continue;
    const indent = line.length - line.trimStart().length;
    if (previous >= 0 && indent > previous) return Math.min(8, indent - previous);
    previous = indent;
  }
  return 2;
}

/** The `key: value` block of a section, in block style, indented by `column` spaces, ending with a newline. */
function renderBlock(
  key: string,
  value: unknown,
  column: number,
  unit: number,
  comment: string | undefined,
): string {
  const doc = new Document({ [key]: value });
  visit(doc, {
    Seq(_, node) {
      if (node.items.every((i) => isScalar(i))) node.flow = true;
    },
    Scalar(_, node) {
      // Texts that some YAML readers take for dates or numbers are quoted.
      if (typeof node.value === 'string' && /^\d{4}-\d\d-\d\d|^[-+.\d]/.test(node.value))
        node.type = 'QUOTE_SINGLE';
    },
  });
  const body = doc.toString({ indent: unit, lineWidth: 0, flowCollectionPadding: false });
  const pad = ' '.repeat(column);
  const comments =
    comment === undefined
      ? ''
      : comment
          .split('\n')
          .map((l) => `${pad}#${l === '' ? '' : ` ${l}`}\n`)
          .join('');
  const lines = body.replace(/\n$/, '').split('\n');
  return `${comments}${lines.map((l) => (l === '' ? l : pad + l)).join('\n')}\n`;
}

function parseYaml(text: string): Document.Parsed {
  return parseDocument(text, { uniqueKeys: true, merge: false, prettyErrors: false });
}

/** Applies one edit to a YAML text by replacing or inserting the section's text only. */
function editYaml(
  text: string,
  path: readonly string[],
  value: unknown,
  comment: string | undefined,
  eol: string,
): string {
  const doc = parseYaml(text);
  if (doc.errors.length > 0) throw pathError(path, `the file does not parse: ${doc.errors[0]?.message}`);
  // The deepest existing mapping along the path, and the column of the key that holds it.
  let parent: unknown = doc.contents;
  let parentKeyColumn: number | undefined;
  let depth = 0;
  for (; depth < path.length - 1; depth++) {
    if (!isMap(parent)) break;
    const pair = (parent as YAMLMap).items.find((p) => isScalar(p.key) && p.key.value === path[depth]);
    if (pair === undefined || !isMap(pair.value)) {
      if (pair !== undefined && pair.value !== null && !(isScalar(pair.value) && pair.value.value === null))
        throw pathError(path, `${path.slice(0, depth + 1).join('.')} is not a mapping`);
      break;
    }
    parentKeyColumn = columnOf(text, (pair.key as Node).range?.[0] ?? 0);
    parent = pair.value;
  }
  if (!isMap(parent)) {
    if (doc.contents === null)
      return `${text}${renderBlock(path[0] as string, withValue({}, path.slice(1), value), 0, 2, comment)}`;
    throw pathError(path, 'the file is not a mapping of keys');
  }
  const map = parent as YAMLMap;
  const key = path[depth] as string;
  const rest = path.slice(depth + 1);
  // What goes at `key`: the value itself, or the missing mappings that lead to it.
  const newValue = rest.length === 0 ? value : withValue({}, rest, value);
  const pair = map.items.find((p) => isScalar(p.key) && p.key.value === key) as Pair<Node, Node> | undefined;
  if (map.flow === true) {
    // A flow mapping `{ … }` is edited through the document model, and only its own text is
    // replaced by the edited mapping written in flow style (the rest of the file is kept byte for
    // byte; a whole-document rewrite would respace every other flow collection).
    const d = parseYaml(text);
    if (newValue === undefined) d.deleteIn(path.slice(0, depth + 1));
    else d.setIn(path.slice(0, depth + 1), newValue);
    const edited = (depth === 0 ? d.contents : d.getIn(path.slice(0, depth), true)) as YAMLMap;
    visit(edited, {
      Collection(_, node) {
        node.flow = true;
      },
    });
    const alone = new Document(null);
    alone.contents = edited;
    const body = alone
      .toString({ lineWidth: 0, flowCollectionPadding: true })
      .replace(/\n$/, '')
      // The house style of flow lists: `[a, b]` (mappings keep their `{ a: 1 }` padding).
      .replace(/\[ /g, '[')
      .replace(/ \]/g, ']');
    const [start, end] = map.range as [number, number, number];
    return text.slice(0, start) + body + text.slice(end);
  }
  // The indentation step here: this mapping's keys against the key that holds it, else the file's.
  const keyColumn =
    map.items[0]?.key === undefined ? undefined : columnOf(text, (map.items[0].key as Node).range?.[0] ?? 0);
  const unit =
    keyColumn !== undefined && parentKeyColumn !== undefined && keyColumn > parentKeyColumn
      ? Math.min(8, keyColumn - parentKeyColumn)
      : indentUnit(text);
  if (pair !== undefined) {
    const keyStart = (pair.key as Node).range?.[0] as number;
    const column = columnOf(text, keyStart);
    const valueNode = pair.value as Node | null;
    const block = isBlock(valueNode);
    const end = valueNode?.range?.[1] ?? (pair.key as Node).range?.[1] ?? keyStart;
    const lineStart = text.lastIndexOf('\n', keyStart - 1) + 1;
    const ownLine = text.slice(lineStart, keyStart).trim() === '';
    if (newValue === undefined) {
      // Remove the pair's lines (with a comment on its last line).
      const lineEnd = text.indexOf('\n', block ? end - 1 : end);
      return (
        text.slice(0, ownLine ? lineStart : keyStart) + text.slice(lineEnd < 0 ? text.length : lineEnd + 1)
      );
    }
    let rendered = renderBlock(key, newValue, column, unit, ownLine ? comment : undefined);
    // A block value's text ends after its last line's break; a scalar's or flow value's at its
    // last character (a comment after it stays on the section's last line).
    if (!block || !text.slice(0, end).endsWith('\n')) rendered = rendered.replace(/\n$/, '');
    const start = ownLine ? lineStart : keyStart;
    if (!ownLine) rendered = rendered.slice(column);
    return text.slice(0, start) + rendered.replace(/\n/g, eol) + text.slice(end);
  }
  if (newValue === undefined) return text;
  // A new key: after the mapping's last entry, at the column of its keys.
  const first = map.items[0]?.key as Node | undefined;
  const column =
    first?.range === undefined || first.range === null
      ? map === doc.contents
        ? 0
        : columnOf(text, (map.range as [number, number, number])[0])
      : columnOf(text, first.range[0]);
  let at = (map.range as [number, number, number])[1];
  const last = map.items[map.items.length - 1];
  const lastValue = last?.value as Node | null | undefined;
  if (lastValue !== undefined && lastValue !== null && !isBlock(lastValue)) {
    // After the line of the last scalar value (and any comment on it).
    const lineEnd = text.indexOf('\n', lastValue.range?.[1] ?? at);
    at = lineEnd < 0 ? text.length : lineEnd + 1;
  }
  const block = renderBlock(key, newValue, column, unit, comment).replace(/\n/g, eol);
  const before = text.slice(0, at);
  const sep = before === '' || before.endsWith('\n') ? '' : eol;
  return before + sep + block + text.slice(at);
}

/**
 * Opens a channel file for editing: reads it (at most the channel-file size limit), remembers a
 * fingerprint of its bytes, and parses it.
 *
 * @remarks
 * A YAML file is edited as text: a section that is set replaces exactly the text of the old
 * section (or is added at the end of its parent mapping) and every other byte is kept: comments,
 * blank lines, quoting, flow or block style, indentation, line endings. Only a parent written as a
 * flow mapping (`hook: { … }`) is rewritten through the `yaml` package's document model (comments
 * kept, that mapping reformatted). A JSON file (which has no comments) is rewritten with its own
 * indentation and key order. After every edit the text is parsed again and must give the intended
 * content exactly, so a splice can never change anything else unseen.
 *
 * {@link ChannelFileEditor.save} writes through the atomic-file helper: a temporary file beside the
 * target, flushed to disk, checked, then renamed over it, so a reader (or a crash, or a kill)
 * sees the old file or the new one, never a mix. Just before the rename the file is read again and
 * compared with the fingerprint taken when it was opened: if an editor or another run changed it
 * meanwhile, nothing is written (`io-error`). The remaining window (between that check and the
 * rename, microseconds) is inherent to files without locks.
 *
 * @param path - The channel file (YAML, or JSON by extension).
 * @returns The editor.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable), `parse-error`
 *   (larger than 1 MiB, not UTF-8, malformed).
 * @example
 * ```ts
 * const editor = await openChannelFileEditor('hook.yaml');
 * editor.set(['channels', 'hook', 'spanCorrection'], { factor: 1.0021, date: '2025-06-03' });
 * await editor.save();
 * ```
 */
export async function openChannelFileEditor(path: string): Promise<ChannelFileEditor> {
  let target: string;
  let bytes: Buffer;
  let mode: number;
  try {
    target = await realpath(path);
    const s = await stat(target);
    if (s.size > channelFileLimits.maxBytes) {
      throw new BridgeworkError(
        'parse-error',
        `${path} is larger than a channel file may be (${channelFileLimits.maxBytes} bytes, 1 MiB)`,
        { param: path },
      );
    }
    mode = s.mode & 0o7777;
    bytes = await readFile(target);
  } catch (e) {
    if (e instanceof BridgeworkError) throw e;
    throw new BridgeworkError('io-error', `cannot read ${path}: ${describeFsError(e)}`, {
      param: path,
      cause: e,
    });
  }
  const fingerprint = sha256(bytes);
  let source: string;
  try {
    source = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch (e) {
    throw new BridgeworkError('parse-error', `${path} is not UTF-8 text`, { param: path, cause: e });
  }
  const parsed = parseChannelDocument(source, path);
  const syntax = parsed.syntax;
  const original = parsed.data;
  const eol = source.includes('\r\n') ? '\r\n' : '\n';
  let text = source;
  let data: unknown = original;

  const apply = (keys: readonly string[], value: unknown, comment: string | undefined): void => {
    if (keys.length === 0 || keys.some((k) => typeof k !== 'string' || k === '' || reservedNames.has(k)))
      throw pathError(keys, 'the path must be one or more non-empty keys');
    if (value !== undefined) checkPlain(value, keys.join('.'));
    const want = withValue(data, keys, value);
    let next: string;
    if (syntax === 'json') {
      const indent = /\n([ \t]+)"/.exec(text)?.[1] ?? '  ';
      next = `${JSON.stringify(want, null, indent)}\n`.replace(/\n/g, eol);
    } else {
      next = editYaml(text, keys, value, comment, eol);
    }
    const check = parseChannelDocument(next, path, syntax);
    if (!isDeepStrictEqual(check.data, want)) {
      // A defect of this module, never of the user's file: refuse rather than write it.
      throw new Error(`editing ${keys.join('.')} of ${path} did not give the intended content`);
    }
    text = next;
    data = want;
  };

  return {
    file: path,
    syntax,
    original,
    data: () => data,
    set(keys, value, options = {}) {
      if (value === undefined) throw pathError(keys, 'the value must not be undefined (use remove)');
      apply(keys, value, options.comment);
    },
    remove(keys) {
      if (keys.length < 2) throw pathError(keys, 'only a key inside a section can be removed');
      apply(keys, undefined, undefined);
    },
    text: () => text,
    async save(options = {}) {
      if (options.validate !== false) {
        validateChannelDocument(parseChannelDocument(text, path, syntax), {
          validateChannel: fileEntryValidator(),
        });
      }
      await writeFileAtomic(target, text, {
        force: true,
        mode,
        async beforeReplace() {
          let now: Buffer;
          try {
            now = await readFile(target);
          } catch (e) {
            throw new BridgeworkError(
              'io-error',
              `${path} cannot be read again before it is replaced (${describeFsError(e)}); nothing was written`,
              { param: path, cause: e },
            );
          }
          if (sha256(now) !== fingerprint) {
            throw new BridgeworkError(
              'io-error',
              `${path} changed since it was read (by an editor or another run); nothing was written: run the command again`,
              { param: path },
            );
          }
        },
      });
    },
  };
}

/**
 * Sets one section of one channel: `channels.<channel>.<section…>` (see
 * {@link ChannelFileEditor.set}).
 *
 * @param editor - The open file.
 * @param channel - The channel's name (its key under `channels`).
 * @param section - The section's key, or keys for a nested one (`['sensor']`, `['spanCorrection']`).
 * @param value - The section's content (plain data).
 * @param options - A comment above it.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` when the file has no such channel,
 *   and the errors of {@link ChannelFileEditor.set}.
 */
export function setChannelSection(
  editor: ChannelFileEditor,
  channel: string,
  section: string | readonly string[],
  value: unknown,
  options?: SetSectionOptions,
): void {
  const channels = (editor.data() as { channels?: Record<string, unknown> } | null)?.channels;
  if (typeof channels !== 'object' || channels === null || !Object.hasOwn(channels, channel)) {
    throw new BridgeworkError('invalid-option', `${editor.file} has no channel '${channel}'`, {
      param: 'channel',
      value: channel,
    });
  }
  editor.set(['channels', channel, ...(typeof section === 'string' ? [section] : section)], value, options);
}
