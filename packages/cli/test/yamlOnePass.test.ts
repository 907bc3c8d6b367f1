/**
 * A YAML channel file is parsed once (start-up): the syntax tree the depth limit is checked on is
 * the one the document is composed from. The reference is the yaml package's own
 * `parseDocument` on the same text with the same options: the same values, and the same errors
 * and warnings at the same positions, in the same order.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { LineCounter, parseDocument } from 'yaml';
import { parseChannelDocument } from '../src/channelFile/parseChannelDocument.js';

const demo = readFileSync(new URL('../demo/footbridge-monitoring.yaml', import.meta.url), 'utf8');

/** What yaml's parseDocument gives for the text: the message parseChannelDocument would throw, or the values. */
function reference(text: string): { message: string } | { data: unknown } {
  const lines = new LineCounter();
  const doc = parseDocument(text, {
    lineCounter: lines,
    prettyErrors: false,
    uniqueKeys: true,
    merge: false,
  });
  const problems = [...doc.errors, ...doc.warnings];
  if (problems.length === 0) return { data: doc.toJS() };
  return {
    message: problems
      .map((e) => {
        const { line, col } = lines.linePos(e.pos[0]);
        const first = (e.message.split('\n')[0] as string).replace(/ at line \d+, column \d+:?$/, '');
        return `f.yaml:${line}:${col}: malformed YAML: ${first}`;
      })
      .join('\n'),
  };
}

function actual(text: string): { message: string } | { data: unknown } {
  try {
    return { data: parseChannelDocument(text, 'f.yaml').data };
  } catch (e) {
    return { message: (e as Error).message };
  }
}

describe('YAML channel files: one parse', () => {
  it.each([
    ['the demo file', demo],
    ['two documents', 'channels: {}\n---\nchannels: {}\n'],
    ['a duplicate key', 'channels:\n  a: 1\n  a: 2\n'],
    ['a tab as indentation', 'channels:\n\ta: 1\n'],
    ['an unterminated flow mapping', 'channels: { a: 1\n'],
    ['a bad indentation and a stray key', 'channels:\n  a:\n    b: 1\n   c: 2\nd\n'],
    ['an unknown tag', 'channels: !include other.yaml\n'],
    ['aliases within the limits', 'shared: &s { volts: 5 }\nchannels:\n  a: { excitation: *s }\n'],
  ])('%s: what yaml’s parseDocument gives', (_name, text) => {
    expect(actual(text)).toEqual(reference(text));
  });
});
