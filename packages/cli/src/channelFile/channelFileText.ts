/**
 * The parts of reading a channel file's text that YAML and JSON share: the size limit, the
 * reserved key names, number literals a double cannot hold, positions and field paths. Loads no
 * parser, so a JSON file is read without the yaml package.
 */
import { BridgeworkError, type SpecIssue } from '@bridgework/core';
import { channelFileLimits } from './channelFileLimits.js';

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
   * Problems of single values that parsing found and that belong to a field (a number literal
   * beyond the range of a double, such as `1e400`): reported with the field's other problems.
   */
  readonly valueIssues: readonly SpecIssue[];
  /**
   * Where a field is written: `'channels.hook.bridge.ohmsPerLead'` or `'channels[0].adc'`. For a
   * field that is missing, the position of its deepest existing parent; `undefined` when not even
   * the first key exists.
   */
  locate(path: string): SourcePosition | undefined;
}

/** A `parse-error` of the file. */
export function parseError(message: string, file: string): BridgeworkError {
  return new BridgeworkError('parse-error', message, { param: file });
}

/**
 * The text without a leading byte-order mark, after checking the size limit.
 *
 * @throws {@link BridgeworkError} `parse-error` when the text is longer than a channel file may be.
 */
export function channelFileSource(text: string, file: string): string {
  if (text.length > channelFileLimits.maxBytes) {
    throw parseError(
      `${file} is larger than a channel file may be (${channelFileLimits.maxBytes} bytes, 1 MiB); split it into several files`,
      file,
    );
  }
  return text.replace(/^\uFEFF/, '');
}

/** Names that plain JavaScript objects carry already (`constructor`, `toString`, `__proto__`...). */
export const reservedNames: ReadonlySet<string> = new Set(Object.getOwnPropertyNames(Object.prototype));

/**
 * A key named like a member of every JavaScript object is no field of a channel file: an
 * unknown field wherever it stands (names of channels, directly under `channels`, are judged by
 * the loader).
 */
export function reservedKey(key: string, parent: string, path: string, issues: SpecIssue[]): void {
  if (!reservedNames.has(key) || parent === 'channels') return;
  issues.push({
    code: 'unknown-option',
    path,
    message: `unknown field: '${key}' is a name every JavaScript object carries, never a field of a channel file`,
  });
}

/** Is this literal a non-zero number written with more digits than a double can tell from 0? */
export function underflows(source: string, value: number): boolean {
  return (
    value === 0 &&
    /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/.test(source) &&
    /[1-9]/.test(source.replace(/[eE].*$/, ''))
  );
}

/**
 * The problem of a number literal that a double cannot hold (beyond ±1.8e308, or non-zero and
 * read as 0), as an issue of its field, or undefined.
 *
 * @param written - The literal as written.
 * @param value - The number it was read as.
 * @param path - The field's path.
 */
export function numberLiteralIssue(written: string, value: number, path: string): SpecIssue | undefined {
  if (!Number.isFinite(value) && !/^[-+]?\.(?:inf|Inf|INF|nan|NaN|NAN)$/.test(written)) {
    return {
      code: 'out-of-range',
      path,
      message: `the number ${written} is beyond the largest a double can hold (about 1.8e308)`,
      limit: '1.7976931348623157e308',
    };
  }
  if (underflows(written, value)) {
    return {
      code: 'out-of-range',
      path,
      message: `the number ${written} is too small for a double and would be read as 0 (the smallest is about 4.9e-324)`,
      limit: '4.9e-324',
    };
  }
  return undefined;
}

/** Turns a character offset into a 1-based line and column (lines end at `\n`). */
export function positionOf(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset).split('\n');
  return { line: before.length, column: (before[before.length - 1] as string).length + 1 };
}

/** Splits `a.b[2].c` into `['a', 'b', 2, 'c']`. */
export function splitFieldPath(path: string): (string | number)[] {
  const keys: (string | number)[] = [];
  for (const m of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g))
    keys.push(m[2] === undefined ? (m[1] as string) : Number(m[2]));
  return keys;
}
