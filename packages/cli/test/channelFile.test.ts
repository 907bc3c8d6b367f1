import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { SpecIssue } from '@bridgework/core';
import { formatIssues } from '../src/channelFile/formatIssues.js';
import {
  loadChannelFile,
  selectChannels,
  validateChannelDocument,
  type ChannelValidator,
} from '../src/channelFile/loadChannelFile.js';
import { parseChannelDocument, splitFieldPath } from '../src/channelFile/parseChannelDocument.js';
import { checkJsonSyntax } from '../src/internal/checkJsonSyntax.js';
import fc from 'fast-check';
import { readChannelDocument } from '../src/channelFile/readChannelDocument.js';
import { parseQuantity } from '@bridgework/channel';
import { caught } from './support/caught.js';
import { useTempDir } from './support/tempDir.js';

const tmp = useTempDir('channel-file');

/**
 * TEST ONLY: a tiny validator standing in for the channel package's schema, with just enough
 * rules (required fields, unknown fields, units through the channel package's `parseQuantity`) to
 * exercise the loader. It is not the channel spec.
 */
const fields: Record<string, string> = { gaugeOhms: 'Ω', excitationVolts: 'V' };
const validate: ChannelValidator<Record<string, number>> = (raw) => {
  const issues: SpecIssue[] = [];
  const value: Record<string, number> = {};
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw))
    return { issues: [{ path: '', message: 'must be a mapping' }] };
  const record = raw as Record<string, unknown>;
  for (const key of Object.keys(record))
    if (!(key in fields)) issues.push({ path: key, message: 'unknown field' });
  for (const [key, unit] of Object.entries(fields)) {
    const v = record[key];
    if (v === undefined) issues.push({ path: key, message: 'is required' });
    else if (typeof v === 'number') value[key] = v;
    else {
      try {
        value[key] = parseQuantity(String(v), unit);
      } catch (e) {
        issues.push({ path: key, message: (e as Error).message });
      }
    }
  }
  return issues.length === 0 ? { value, issues } : { issues };
};

const good = `# A two-channel file (invented scenario: a crane hook and its trolley)
project:
  title: Gantry crane, hook load
  reference: TEST-001
channels:
  hook:
    gaugeOhms: 350 ohm
    excitationVolts: 5 V
  trolley:
    gaugeOhms: 1 kohm
    excitationVolts: 10
`;

describe('parseChannelDocument: syntax', () => {
  it('reads YAML and maps field paths to lines and columns', () => {
    const doc = parseChannelDocument(good, 'crane.yaml');
    expect(doc.syntax).toBe('yaml');
    expect(doc.data).toEqual({
      project: { title: 'Gantry crane, hook load', reference: 'TEST-001' },
      channels: {
        hook: { gaugeOhms: '350 ohm', excitationVolts: '5 V' },
        trolley: { gaugeOhms: '1 kohm', excitationVolts: 10 },
      },
    });
    expect(doc.locate('channels.hook.excitationVolts')).toEqual({ line: 8, column: 5 });
    expect(doc.locate('channels.trolley')).toEqual({ line: 9, column: 3 });
    // A missing field points at its deepest existing parent.
    expect(doc.locate('channels.trolley.amplifier.gain')).toEqual({ line: 9, column: 3 });
    expect(doc.locate('nothing.here')).toBeUndefined();
  });

  it('reads JSON strictly, with positions for fields', () => {
    const text =
      '{\n  "channels": {\n    "hook": { "gaugeOhms": "350 ohm", "excitationVolts": [5, 6] }\n  }\n}\n';
    const doc = parseChannelDocument(text, 'crane.json');
    expect(doc.syntax).toBe('json');
    expect(doc.locate('channels.hook.gaugeOhms')).toEqual({ line: 3, column: 15 });
    expect(doc.locate('channels.hook.excitationVolts[1]')).toEqual({ line: 3, column: 62 });
  });

  it.each([
    [
      'a: 1\nb: [1, 2\nc: 3\n',
      /^bad\.yaml:3:1: malformed YAML: Flow sequence in block collection must be sufficiently indented and end with a \]$/m,
    ],
    ['channels:\n  hook: 1\n  hook: 2\n', /^bad\.yaml:3:3: malformed YAML: Map keys must be unique$/m],
    [
      'a:\n  b: 1\n   c: 2\n',
      /^bad\.yaml:2:6: malformed YAML: Nested mappings are not allowed in compact mappings$/m,
    ],
    ['x: !include other.yaml\n', /^bad\.yaml:1:4: malformed YAML: Unresolved tag: !include$/m],
    ['a: "unterminated\n', /^bad\.yaml:2:1: malformed YAML: Missing closing "quote$/m],
    ['a:\n\t- 1\n', /^bad\.yaml:2:1: malformed YAML: /m],
  ])('malformed YAML %j is a parse-error with line and column', (text, message) => {
    expect(() => parseChannelDocument(text, 'bad.yaml')).toThrowBridgeworkError('parse-error', {
      param: 'bad.yaml',
    });
    expect(() => parseChannelDocument(text, 'bad.yaml')).toThrow(message);
  });

  it('lists every YAML error at once', () => {
    try {
      parseChannelDocument('a: [1\nb: 1\nb: 2\n', 'two.yaml');
      expect.unreachable();
    } catch (e) {
      expect((e as Error).message.split('\n').length).toBeGreaterThan(1);
    }
  });

  it.each([
    ['{"a": 1,}', 'bad.json:1:9: malformed JSON: expected a double-quoted key'],
    ['{\n  "a": 1\n  "b": 2\n}', "bad.json:3:3: malformed JSON: expected ',' or '}'"],
    [
      '{"a": NaN}',
      'bad.json:1:7: malformed JSON: expected a value (an object, array, string, number, true, false or null)',
    ],
    ['# comment\n{}', 'bad.json:1:1: malformed JSON: expected a value'],
    ['{"a": "x\ty"}', 'bad.json:1:9: malformed JSON: control character in a string'],
    ['{"a": 01}', "bad.json:1:8: malformed JSON: expected ',' or '}'"],
    ['{"a": 1} x', 'bad.json:1:10: malformed JSON: unexpected text after the end of the JSON value'],
    ['{"a": "open', 'bad.json:1:7: malformed JSON: unterminated string'],
    ['', 'bad.json:1:1: malformed JSON: unexpected end of the file; expected a value'],
  ])('malformed JSON %j is a parse-error with line and column', (text, message) => {
    expect(() => parseChannelDocument(text, 'bad.json')).toThrowBridgeworkError('parse-error');
    expect(() => parseChannelDocument(text, 'bad.json')).toThrow(message);
  });

  it('the JSON grammar check agrees with JSON.parse (V8 as the reference) on valid and broken texts', () => {
    const accepts = (t: string): boolean => {
      try {
        JSON.parse(t);
        return true;
      } catch {
        return false;
      }
    };
    const broken = fc
      .tuple(
        fc.json(),
        fc.nat(),
        fc.constantFrom('', ',', '}', ']', '"', ':', ' ', '\\', 'x', '0', '-', '.', 'e', '\n', '\t'),
      )
      .map(([t, k, c]) => {
        const at = k % (t.length + 1);
        return k % 2 === 0 ? t.slice(0, at) + c + t.slice(at) : t.slice(0, at) + t.slice(at + 1);
      });
    fc.assert(
      fc.property(fc.oneof(fc.json(), broken, fc.string()), (t) => {
        expect(checkJsonSyntax(t) === undefined, JSON.stringify(t)).toBe(accepts(t));
      }),
      { numRuns: 2000 },
    );
  });

  it('rejects duplicate keys in JSON (which JSON.parse would silently drop)', () => {
    expect(() => parseChannelDocument('{"channels": {"a": 1, "a": 2}}', 'dup.json')).toThrow(
      /^dup\.json:1:23: duplicate key in JSON$/,
    );
  });

  it('returns YAML special floats as they are (the schema must reject them)', () => {
    expect(parseChannelDocument('v: .nan\nw: -.inf\n', 'x.yaml').data).toEqual({ v: NaN, w: -Infinity });
  });

  it('bounds alias expansion (a "billion laughs" file is rejected)', () => {
    const lines = ['a: &a [x, x, x, x, x, x, x, x, x, x]'];
    for (let i = 1; i < 8; i++)
      lines.push(
        `${String.fromCharCode(97 + i)}: &${String.fromCharCode(97 + i)} [${Array(10)
          .fill(`*${String.fromCharCode(96 + i)}`)
          .join(', ')}]`,
      );
    expect(() => parseChannelDocument(`${lines.join('\n')}\n`, 'laughs.yaml')).toThrow();
  });

  it('splits field paths', () => {
    expect(splitFieldPath('channels.hook.adc.bits')).toEqual(['channels', 'hook', 'adc', 'bits']);
    expect(splitFieldPath('channels[2].leads[0]')).toEqual(['channels', 2, 'leads', 0]);
  });
});

describe('validateChannelDocument', () => {
  it('returns the validated channels with their names, in file order', () => {
    const f = validateChannelDocument(parseChannelDocument(good, 'crane.yaml'), {
      validateChannel: validate,
    });
    expect(f.project).toEqual({ title: 'Gantry crane, hook load', reference: 'TEST-001' });
    expect(f.channels).toEqual([
      { name: 'hook', spec: { gaugeOhms: 350, excitationVolts: 5 } },
      { name: 'trolley', spec: { gaugeOhms: 1000, excitationVolts: 10 } },
    ]);
  });

  it('reports every problem at once as file:line:column: path: message', () => {
    const text = `projects:
  title: typo above
channels:
  hook:
    gaugeOhms: 5 m
    excitationVolt: 5 V
  9lives:
    gaugeOhms: 350
`;
    const doc = parseChannelDocument(text, 'bad.yaml');
    let error: unknown;
    try {
      validateChannelDocument(doc, { validateChannel: validate });
    } catch (e) {
      error = e;
    }
    expect(() => {
      throw error;
    }).toThrowBridgeworkError('invalid-spec', { param: 'bad.yaml' });
    expect((error as Error).message).toBe(
      [
        'bad.yaml has 5 problems:',
        "bad.yaml:1:1: projects: unknown field; did you mean 'project'?",
        'bad.yaml:6:5: channels.hook.excitationVolt: unknown field',
        "bad.yaml:5:5: channels.hook.gaugeOhms: '5 m' is a length; expected a resistance, such as '350 Ω'",
        'bad.yaml:4:3: channels.hook.excitationVolts: is required',
        'bad.yaml:7:3: channels.9lives: is not a valid channel name: start with a letter; use letters, digits, _ and - (at most 63)',
      ].join('\n'),
    );
    expect((error as { issues: SpecIssue[] }).issues.map((i) => i.path)).toEqual([
      'projects',
      'channels.hook.excitationVolt',
      'channels.hook.gaugeOhms',
      'channels.hook.excitationVolts',
      'channels.9lives',
    ]);
  });

  it.each([
    ['- 1\n', "must be a mapping with a 'channels' field; got an array of length 1"],
    ['project: {}\n', 'channels: is required: a mapping from channel name to channel'],
    ['channels: {}\n', 'channels: must be a non-empty mapping from channel name to channel; got an object'],
    ['channels: [a, b]\n', 'channels: must be a non-empty mapping'],
    ['project: x\nchannels: {a: {gaugeOhms: 1, excitationVolts: 1}}\n', 'project: must be a mapping'],
    [
      'project: {title: 5}\nchannels: {a: {gaugeOhms: 1, excitationVolts: 1}}\n',
      'project.title: must be a text; got 5',
    ],
    [
      'project: {author: me}\nchannels: {a: {gaugeOhms: 1, excitationVolts: 1}}\n',
      'project.author: unknown field; expected one of title, description, reference',
    ],
  ])('layout error in %j', (text, message) => {
    expect(() =>
      validateChannelDocument(parseChannelDocument(text, 'f.yaml'), { validateChannel: validate }),
    ).toThrow(message);
  });
});

describe('formatIssues', () => {
  it('prints file: path: message, with the position when known', () => {
    const issues = [
      { path: 'channels.a.gaugeOhms', message: 'must be > 0; got -350' },
      { path: '', message: 'must be a mapping' },
    ];
    expect(formatIssues('f.yaml', issues)).toBe(
      'f.yaml: channels.a.gaugeOhms: must be > 0; got -350\nf.yaml: must be a mapping\n',
    );
    expect(formatIssues('f.yaml', issues, (p) => (p === '' ? undefined : { line: 4, column: 7 }))).toBe(
      'f.yaml:4:7: channels.a.gaugeOhms: must be > 0; got -350\nf.yaml: must be a mapping\n',
    );
  });
});

describe('reading files', () => {
  it('loads a YAML file and a JSON file', async () => {
    const yaml = join(tmp(), 'crane.yaml');
    writeFileSync(yaml, good);
    expect((await loadChannelFile(yaml, { validateChannel: validate })).channels).toHaveLength(2);
    const json = join(tmp(), 'crane.json');
    writeFileSync(json, JSON.stringify({ channels: { hook: { gaugeOhms: '350 ohm', excitationVolts: 5 } } }));
    expect((await loadChannelFile(json, { validateChannel: validate })).channels[0]?.spec).toEqual({
      gaugeOhms: 350,
      excitationVolts: 5,
    });
  });

  it('reports a missing file and a file that is not UTF-8 text', async () => {
    expect(await caught(readChannelDocument(join(tmp(), 'nope.yaml')))).toThrowBridgeworkError('io-error');
    await expect(readChannelDocument(join(tmp(), 'nope.yaml'))).rejects.toThrow(
      /cannot read .*nope\.yaml: no such file/,
    );
    const latin1 = join(tmp(), 'latin1.yaml');
    writeFileSync(latin1, Uint8Array.of(0x61, 0x3a, 0x20, 0xb5, 0x0a));
    expect(await caught(readChannelDocument(latin1))).toThrowBridgeworkError('parse-error');
  });

  it('selects channels by name, with suggestions for typos', () => {
    const f = validateChannelDocument(parseChannelDocument(good, 'crane.yaml'), {
      validateChannel: validate,
    });
    expect(selectChannels(f, undefined).map((c) => c.name)).toEqual(['hook', 'trolley']);
    expect(selectChannels(f, ['trolley']).map((c) => c.name)).toEqual(['trolley']);
    expect(() => selectChannels(f, ['trolly'])).toThrow(
      "crane.yaml has no channel 'trolly'; did you mean 'trolley'?",
    );
    expect(() => selectChannels(f, ['zzz'])).toThrow("crane.yaml has no channel 'zzz'; it has hook, trolley");
    expect(() => selectChannels(f, ['hook', 'hook'])).toThrowBridgeworkError('invalid-option', {
      param: 'channel',
    });
  });
});
