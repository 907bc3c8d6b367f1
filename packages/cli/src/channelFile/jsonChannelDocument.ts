/**
 * A JSON channel file read without the yaml package: the strict syntax check, `JSON.parse` for
 * the values, and one scan of the text for what `JSON.parse` drops (duplicate keys, where each
 * field is written, number literals a double cannot hold).
 */
import type { SpecIssue } from '@bridgework/core';
import { checkJsonSyntax } from '../internal/checkJsonSyntax.js';
import { channelFileLimits } from './channelFileLimits.js';
import {
  channelFileSource,
  numberLiteralIssue,
  parseError,
  positionOf,
  reservedKey,
  splitFieldPath,
  type ChannelDocument,
  type SourcePosition,
} from './channelFileText.js';

/** A value of the file and where it starts; objects list their members in order, arrays their items. */
interface JsonNode {
  readonly offset: number;
  readonly members?: readonly {
    readonly key: string;
    readonly keyOffset: number;
    readonly value: JsonNode;
  }[];
  readonly items?: readonly JsonNode[];
}

/**
 * Scans text that has passed {@link checkJsonSyntax}: the tree of positions, the offsets of
 * duplicate keys (each listed once its value has been read, so a duplicate inside that value
 * comes first) and the problems of single values (in document order).
 */
function scan(text: string): { root: JsonNode; duplicates: number[]; issues: SpecIssue[] } {
  let i = 0;
  const duplicates: number[] = [];
  const issues: SpecIssue[] = [];
  const space = (): void => {
    for (;;) {
      const c = text.charCodeAt(i);
      if (c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d) i++;
      else return;
    }
  };
  const stringEnd = (start: number): number => {
    let j = start + 1;
    for (;;) {
      const c = text.charCodeAt(j);
      if (c === 0x22) return j + 1;
      j += c === 0x5c ? 2 : 1;
    }
  };
  const value = (path: string): JsonNode => {
    space();
    const offset = i;
    const c = text[i];
    if (c === '{') {
      i++;
      const members: { key: string; keyOffset: number; value: JsonNode }[] = [];
      const seen = new Set<string>();
      space();
      if (text[i] === '}') {
        i++;
        return { offset, members };
      }
      for (;;) {
        space();
        const keyOffset = i;
        i = stringEnd(i);
        const key = JSON.parse(text.slice(keyOffset, i)) as string;
        space();
        i++; // ':'
        const child = path === '' ? key : `${path}.${key}`;
        reservedKey(key, path, child, issues);
        members.push({ key, keyOffset, value: value(child) });
        // After the value, as the YAML reader did: a duplicate inside the value is listed first.
        if (seen.has(key)) duplicates.push(keyOffset);
        seen.add(key);
        space();
        if (text[i++] === '}') return { offset, members };
      }
    }
    if (c === '[') {
      i++;
      const items: JsonNode[] = [];
      space();
      if (text[i] === ']') {
        i++;
        return { offset, items };
      }
      for (;;) {
        items.push(value(`${path}[${items.length}]`));
        space();
        if (text[i++] === ']') return { offset, items };
      }
    }
    if (c === '"') {
      i = stringEnd(i);
      return { offset };
    }
    if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) {
      const m = /-?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
      m.lastIndex = i;
      const written = (m.exec(text) as RegExpExecArray)[0];
      i += written.length;
      const issue = numberLiteralIssue(written, Number(written), path);
      if (issue !== undefined) issues.push(issue);
      return { offset };
    }
    i += c === 'f' ? 5 : 4; // true, null, false
    return { offset };
  };
  const root = value('');
  return { root, duplicates, issues };
}

/** Where a field path is written: its key's offset, or its deepest existing parent's. */
function locator(text: string, root: JsonNode): (path: string) => SourcePosition | undefined {
  return (path) => {
    let node: JsonNode = root;
    let at: number | undefined;
    for (const key of splitFieldPath(path)) {
      if (node.members !== undefined) {
        const member: { readonly keyOffset: number; readonly value: JsonNode } | undefined =
          node.members.find((m) => m.key === String(key));
        if (member === undefined) break;
        at = member.keyOffset;
        node = member.value;
      } else if (node.items !== undefined && typeof key === 'number') {
        const item: JsonNode | undefined = node.items[key];
        if (item === undefined) break;
        at = item.offset;
        node = item;
      } else {
        break;
      }
    }
    return at === undefined ? undefined : positionOf(text, at);
  };
}

/**
 * Parses the text of a JSON channel file, as {@link parseChannelDocument} does for JSON.
 *
 * @remarks
 * The strict JSON grammar first (RFC 8259; the first error with its line and column), then
 * `JSON.parse` for the values, then one scan of the text for duplicate keys (every one, each with
 * its position: `rig.json:4:7: duplicate key in JSON`), for the position of every field, and for
 * number literals beyond the range of a double or non-zero ones read as 0 and keys named like
 * members of every JavaScript object (both listed in `valueIssues` with the field's path). The
 * limits of {@link channelFileLimits} hold (1 MiB of text, 32 levels of nesting).
 *
 * @param text - The file's text.
 * @param file - The file name, for messages.
 * @returns The document.
 * @throws {@link BridgeworkError} `parse-error`.
 */
export function parseJsonChannelDocument(text: string, file: string): ChannelDocument {
  const source = channelFileSource(text, file);
  const problem = checkJsonSyntax(source, channelFileLimits.maxDepth);
  if (problem !== undefined) {
    const p = positionOf(source, problem.offset);
    throw parseError(`${file}:${p.line}:${p.column}: malformed JSON: ${problem.message}`, file);
  }
  const data = JSON.parse(source) as unknown;
  const { root, duplicates, issues } = scan(source);
  if (duplicates.length > 0) {
    throw parseError(
      duplicates
        .map((offset) => {
          const p = positionOf(source, offset);
          return `${file}:${p.line}:${p.column}: duplicate key in JSON`;
        })
        .join('\n'),
      file,
    );
  }
  return { file, syntax: 'json', data, valueIssues: issues, locate: locator(source, root) };
}
