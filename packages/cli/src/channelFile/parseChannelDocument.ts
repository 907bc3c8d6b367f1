import { BridgeworkError } from '@bridgework/core';
import { checkJsonSyntax } from '../internal/checkJsonSyntax.js';
import { isMap, isScalar, isSeq, LineCounter, parseDocument, type Document, type Node } from 'yaml';

/** A place in a text file: 1-based line and column. */
export interface SourcePosition {
  /** Line, from 1. */
  readonly line: number;
  /** Column, from 1. */
  readonly column: number;
}

/** The syntaxes a channel file may be written in. */
export type ChannelFileSyntax = 'yaml' | 'json';

/** A parsed channel file: its plain data and a map from field paths back to the text. */
export interface ChannelDocument {
  /** The file name, as given (used in every message). */
  readonly file: string;
  /** The syntax it was read as. */
  readonly syntax: ChannelFileSyntax;
  /** The content as plain JavaScript values (objects, arrays, strings, numbers, booleans, null). */
  readonly data: unknown;
  /**
   * Where a field is written: `'channels.hook.bridge.ohmsPerLead'` or `'channels[0].adc'`. For a
   * field that is missing, the position of its deepest existing parent; `undefined` when not even
   * the first key exists.
   */
  locate(path: string): SourcePosition | undefined;
}

/** Splits `a.b[2].c` into `['a', 'b', 2, 'c']`. */
export function splitFieldPath(path: string): (string | number)[] {
  const keys: (string | number)[] = [];
  for (const m of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g))
    keys.push(m[2] === undefined ? (m[1] as string) : Number(m[2]));
  return keys;
}

function parseError(message: string, file: string): BridgeworkError {
  return new BridgeworkError('parse-error', message, { param: file });
}

function firstLine(message: string): string {
  return (message.split('\n')[0] as string).replace(/ at line \d+, column \d+:?$/, '');
}

function locator(doc: Document, lines: LineCounter): (path: string) => SourcePosition | undefined {
  return (path) => {
    let node: unknown = doc.contents;
    let at: number | undefined;
    for (const key of splitFieldPath(path)) {
      if (isMap(node)) {
        const pair = node.items.find((p) => isScalar(p.key) && String(p.key.value) === String(key));
        if (pair === undefined) break;
        at = (pair.key as Node).range?.[0] ?? at;
        node = pair.value;
      } else if (isSeq(node) && typeof key === 'number') {
        const item = node.items[key] as Node | undefined;
        if (item === undefined) break;
        at = item.range?.[0] ?? at;
        node = item;
      } else {
        break;
      }
    }
    if (at === undefined) return undefined;
    const { line, col } = lines.linePos(at);
    return { line, column: col };
  };
}

/** Turns a character offset into a position. */
function positionOf(text: string, offset: number): SourcePosition {
  const before = text.slice(0, offset).split('\n');
  return { line: before.length, column: (before[before.length - 1] as string).length + 1 };
}

function parseJson(text: string, file: string): unknown {
  const problem = checkJsonSyntax(text);
  if (problem !== undefined) {
    const p = positionOf(text, problem.offset);
    throw parseError(`${file}:${p.line}:${p.column}: malformed JSON: ${problem.message}`, file);
  }
  return JSON.parse(text) as unknown;
}

/**
 * Parses the text of a channel file (YAML 1.2 or JSON) with a map of field paths to positions.
 *
 * @remarks
 * YAML is read with the `yaml` package's core schema: no custom tags (an unknown tag such as
 * `!include` is an error, not a string), duplicate keys are errors, no merge keys, no dates, and
 * aliases are limited (so a crafted file cannot expand without bound). Every syntax error is
 * reported with its line and column, all at once:
 * `hopper.yaml:7:5: malformed YAML: Map keys must be unique`.
 *
 * JSON is checked against the strict JSON grammar first (RFC 8259: no comments, no trailing
 * commas, no NaN; the first error is named with its line and column), then read again through the YAML parser (JSON is YAML 1.2) to find duplicate keys,
 * which `JSON.parse` would silently drop, and to map field paths to positions.
 *
 * Values are returned as they are written; YAML's `.nan` and `.inf` become NaN and Infinity and
 * must be rejected by the schema where a finite number is needed.
 *
 * @param text - The file's text.
 * @param file - The file name for messages.
 * @param syntax - `'yaml'` or `'json'`. Default: `'json'` for a `.json` name, else `'yaml'`.
 * @returns The parsed document.
 * @throws {@link @bridgework/core!BridgeworkError} `parse-error` listing every syntax error with its position.
 * @example
 * ```ts
 * const doc = parseChannelDocument('channels:\n  hook:\n    excitation: { volts: 5 V }\n', 'hook.yaml');
 * doc.locate('channels.hook.excitation'); // { line: 3, column: 5 }
 * ```
 */
export function parseChannelDocument(
  text: string,
  file: string,
  syntax?: ChannelFileSyntax,
): ChannelDocument {
  const kind = syntax ?? (/\.json$/i.test(file) ? 'json' : 'yaml');
  const source = text.replace(/^\uFEFF/, '');
  const json = kind === 'json' ? parseJson(source, file) : undefined;
  const lines = new LineCounter();
  const doc = parseDocument(source, {
    lineCounter: lines,
    prettyErrors: true,
    uniqueKeys: true,
    merge: false,
  });
  const problems = [...doc.errors, ...doc.warnings];
  if (kind === 'json') {
    const duplicates = doc.errors.filter((e) => e.code === 'DUPLICATE_KEY');
    if (duplicates.length > 0) {
      throw parseError(
        duplicates
          .map((e) => `${file}:${e.linePos?.[0].line}:${e.linePos?.[0].col}: duplicate key in JSON`)
          .join('\n'),
        file,
      );
    }
    const usable = doc.errors.length === 0;
    return { file, syntax: kind, data: json, locate: usable ? locator(doc, lines) : () => undefined };
  }
  if (problems.length > 0) {
    throw parseError(
      problems
        .map((e) => {
          const p = e.linePos?.[0];
          return `${file}${p === undefined ? '' : `:${p.line}:${p.col}`}: malformed YAML: ${firstLine(e.message)}`;
        })
        .join('\n'),
      file,
    );
  }
  return {
    file,
    syntax: kind,
    data: doc.toJS({ maxAliasCount: 100 }) as unknown,
    locate: locator(doc, lines),
  };
}
