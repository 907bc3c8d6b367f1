/**
 * JSON channel files are read without the yaml package (start-up of `bridgework convert`): the
 * strict syntax check, `JSON.parse`, and one scan for duplicate keys, positions and number
 * literals a double cannot hold. JSON is YAML 1.2, so the reference is the YAML reader of the
 * same module on the same text, through the yaml package: values, value issues (in order),
 * positions of every field and the positions and order of duplicate keys must be the same.
 */
import fc from 'fast-check';
import { isDeepStrictEqual } from 'node:util';
import { describe, expect, it } from 'vitest';
import { isBridgeworkError } from '@bridgework/core';
import { parseJsonChannelDocument } from '../src/channelFile/jsonChannelDocument.js';
import { parseChannelDocument } from '../src/channelFile/parseChannelDocument.js';

/** What `f` returns, or what it throws. */
function caught<T>(f: () => T): T | Error {
  try {
    return f();
  } catch (e) {
    return e as Error;
  }
}

/** Every field path of a value, with a few that are missing at each depth. */
function fieldPaths(v: unknown, path: string, out: string[]): string[] {
  out.push(path, `${path}.missing`, `${path}[0]`);
  if (Array.isArray(v)) v.forEach((x, i) => fieldPaths(x, `${path}[${i}]`, out));
  else if (typeof v === 'object' && v !== null)
    for (const [k, x] of Object.entries(v)) fieldPaths(x, path === '' ? k : `${path}.${k}`, out);
  return out;
}

/** Line:column pairs of a parse error's message, in order. */
const positions = (message: string): string[] =>
  [...message.matchAll(/:(\d+):(\d+):/g)].map((m) => `${m[1]}:${m[2]}`);

// Keys include names every JavaScript object carries, an escaped key equal to another one, and
// `channels` (under which reserved names are the loader's to judge).
const keys = ['a', 'b', 'channels', 'constructor', 'toString', '__proto__', 'x\\u0041', 'xA', 'sg1', '0'];
const numbers = [
  '1',
  '-0',
  '0.0e5',
  '1e999',
  '-1e999',
  '1e-400',
  '0.000',
  '12.5E+3',
  '-2.5e-3',
  '0e-999',
  '4.9e-324',
  '2e-324',
  '123456789012345678901234567890',
  '17976931348623157' + '0'.repeat(292),
];
// Spaces, tabs, line feeds and CR LF between tokens.
const space = fc.constantFrom('', ' ', '\n', '\r\n', '  \n\t ', ' \t');
// The file is a mapping, as every channel file is (YAML cannot read a scalar document that starts
// with a tab; a channel file is never one).
const jsonText: fc.Arbitrary<string> = fc.letrec((tie) => ({
  value: fc.oneof(
    { depthSize: 'small' },
    fc.constantFrom(...numbers),
    fc.constantFrom('true', 'false', 'null', '"s"', '"\\ud83d\\ude00"', '"a\\"b"'),
    tie('object'),
    tie('array'),
  ),
  object: fc
    .array(fc.tuple(space, fc.constantFrom(...keys), space, tie('value'), space), { maxLength: 4 })
    .map((ms) => `{${ms.map(([s1, k, s2, v, s3]) => `${s1}"${k}":${s2}${v}${s3}`).join(',')}}`),
  array: fc
    .array(fc.tuple(space, tie('value'), space), { maxLength: 3 })
    .map((xs) => `[${xs.map(([s1, v, s2]) => s1 + v + s2).join(',')}]`),
})).object as fc.Arbitrary<string>;

describe('JSON channel files without the yaml package', () => {
  it('equal the YAML reader on the same text: values, value issues, positions, duplicate keys', () => {
    let duplicates = 0;
    let issues = 0;
    fc.assert(
      fc.property(space, jsonText, space, (s1, body, s2) => {
        const text = s1 + body + s2;
        const json = caught(() => parseJsonChannelDocument(text, 'rig.json'));
        const yaml = caught(() => parseChannelDocument(text, 'rig.yaml', 'yaml'));
        if (isBridgeworkError(json) || isBridgeworkError(yaml)) {
          // Only duplicate keys are errors here: the same keys, in the same order.
          expect(isBridgeworkError(json) && json.code === 'parse-error').toBe(true);
          expect(isBridgeworkError(yaml) && yaml.code === 'parse-error').toBe(true);
          const j = (json as Error).message;
          const y = (yaml as Error).message;
          expect(
            j.split('\n').every((l) => l.endsWith(': duplicate key in JSON')),
            j,
          ).toBe(true);
          expect(
            y.split('\n').every((l) => l.endsWith(': malformed YAML: Map keys must be unique')),
            y,
          ).toBe(true);
          expect(positions(j)).toEqual(positions(y));
          duplicates++;
          return;
        }
        const j = json as ReturnType<typeof parseJsonChannelDocument>;
        const y = yaml as ReturnType<typeof parseChannelDocument>;
        expect(j.syntax).toBe('json');
        expect(isDeepStrictEqual(j.data, JSON.parse(text))).toBe(true);
        expect(j.valueIssues).toEqual(y.valueIssues);
        if (j.valueIssues.length > 0) issues++;
        for (const p of fieldPaths(j.data, '', [])) expect(j.locate(p), p).toEqual(y.locate(p));
      }),
      { numRuns: 1500, seed: 20261205 },
    );
    // The generator reaches both branches often.
    expect(duplicates).toBeGreaterThan(50);
    expect(issues).toBeGreaterThan(150);
  });

  it('lists a duplicate inside a duplicated key’s value first, as the YAML reader does', () => {
    const text = '{\n "a": 1,\n "a": {\n  "b": 1,\n  "b": 2\n }\n}\n';
    expect(() => parseChannelDocument(text, 'rig.json')).toThrowBridgeworkError('parse-error', {
      param: 'rig.json',
    });
    expect((caught(() => parseChannelDocument(text, 'rig.json')) as Error).message).toBe(
      'rig.json:5:3: duplicate key in JSON\nrig.json:3:2: duplicate key in JSON',
    );
  });

  it('reads JSON indented with tabs with positions and every number check', () => {
    const text = '{\n\t"channels": {\n\t\t"hook": {\n\t\t\t"x": 1e-400,\n\t\t\t"y": -1e999\n\t\t}\n\t}\n}\n';
    const doc = parseChannelDocument(text, 'rig.json');
    const yaml = parseChannelDocument(text, 'rig.yaml', 'yaml');
    expect(doc.locate('channels.hook.x')).toEqual({ line: 4, column: 4 });
    expect(doc.locate('channels.hook.z')).toEqual({ line: 3, column: 3 });
    expect(yaml.locate('channels.hook.x')).toEqual({ line: 4, column: 4 });
    expect(doc.valueIssues.map((i) => [i.path, i.message])).toEqual([
      [
        'channels.hook.x',
        'the number 1e-400 is too small for a double and would be read as 0 (the smallest is about 4.9e-324)',
      ],
      ['channels.hook.y', 'the number -1e999 is beyond the largest a double can hold (about 1.8e308)'],
    ]);
    expect(doc.valueIssues).toEqual(yaml.valueIssues);
  });

  it('keeps the syntax check’s first error and the limits', () => {
    expect((caught(() => parseChannelDocument('{\n "a": 1,\n}', 'r.json')) as Error).message).toBe(
      'r.json:3:1: malformed JSON: expected a double-quoted key',
    );
    const deep = `${'['.repeat(33)}${']'.repeat(33)}`;
    expect((caught(() => parseChannelDocument(deep, 'r.json')) as Error).message).toBe(
      'r.json:1:33: malformed JSON: nested more than 32 levels deep',
    );
    expect(() => parseChannelDocument(' '.repeat(1_048_577), 'r.json')).toThrowBridgeworkError(
      'parse-error',
      { param: 'r.json' },
    );
    expect(parseChannelDocument('\uFEFF{"a": 1}', 'r.json').data).toEqual({ a: 1 });
  });
});
