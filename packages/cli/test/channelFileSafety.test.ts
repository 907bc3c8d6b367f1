/**
 * Channel-file safety at parse (issue 13 item 8): crafted files are refused at once with a
 * position and in words, never with "internal error", a stack overflow or a hang, through the
 * parser and through the real command.
 */
import { readFileSync, truncateSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { channelFileLimits } from '../src/channelFile/channelFileLimits.js';
import { parseChannelDocument } from '../src/channelFile/parseChannelDocument.js';
import { readChannelDocument } from '../src/channelFile/readChannelDocument.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { caught } from './support/caught.js';
import { examplePath } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file, tmp } = useTestFiles('safety');
const example = readFileSync(examplePath, 'utf8');

async function report(path: string) {
  const io = memoryIo();
  const code = await runCli(['report', path], io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

function parseFails(text: string, name: string): string {
  try {
    parseChannelDocument(text, name);
  } catch (e) {
    expect(e).toBeInstanceOf(Error);
    expect(() => {
      throw e;
    }).toThrowBridgeworkError('parse-error');
    return (e as Error).message;
  }
  throw new Error(`${name} was accepted`);
}

/** Nine levels of aliases of aliases, each ten times the last: 10⁹ nodes if expanded. */
function billionLaughs(): string {
  const lines = ['a: &a [x, x, x, x, x, x, x, x, x, x]'];
  for (let i = 1; i < 9; i++) {
    const name = String.fromCharCode(97 + i);
    const prev = String.fromCharCode(96 + i);
    lines.push(`${name}: &${name} [${Array(10).fill(`*${prev}`).join(', ')}]`);
  }
  lines.push('channels: *i');
  return `${lines.join('\n')}\n`;
}

describe('channel-file safety at parse', () => {
  it('a "billion laughs" file is refused with the position of the alias that passes the limit', async () => {
    const message = parseFails(billionLaughs(), 'laughs.yaml');
    expect(message).toMatch(
      /^laughs\.yaml:\d+:\d+: malformed YAML: aliases copy more than 10000 nodes in all/,
    );
    const r = await report(file('laughs.yaml', billionLaughs()));
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(/malformed YAML: aliases copy more than 10000 nodes/);
    expect(r.stderr).not.toMatch(/internal error/);
  });

  it('shares a block between channels through an anchor and aliases', () => {
    const text = [
      'shared: &gauge { kind: strain-gauge, gaugeFactor: 2.1 }',
      'channels:',
      ...Array.from({ length: 200 }, (_, i) => `  c${i}: { sensor: *gauge }`),
    ].join('\n');
    const doc = parseChannelDocument(text, 'shared.yaml');
    const data = doc.data as { channels: Record<string, { sensor: { gaugeFactor: number } }> };
    expect(Object.keys(data.channels)).toHaveLength(200);
    expect(data.channels['c199']?.sensor.gaugeFactor).toBe(2.1);
  });

  it('an alias without an anchor before it is an error with its position', async () => {
    expect(parseFails('channels:\n  a: *nope\n', 'undefined.yaml')).toMatch(
      /^undefined\.yaml:2:6: malformed YAML: the alias \*nope has no anchor &nope before it|^undefined\.yaml:2:\d+: malformed YAML: .*nope/,
    );
    const r = await report(file('undefined.yaml', 'channels:\n  a: *nope\n'));
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(/undefined\.yaml:2:\d+: malformed YAML: .*nope/);
    expect(r.stderr).not.toMatch(/internal error/);
  });

  it('an alias inside the node it names is an error', () => {
    expect(parseFails('channels: &c { a: *c }\n', 'loop.yaml')).toMatch(
      /^loop\.yaml:1:\d+: malformed YAML: /,
    );
  });

  it.each([
    ['YAML flow lists', 'deep.yaml', `channels: ${'['.repeat(20_000)}${']'.repeat(20_000)}\n`],
    ['YAML flow mappings', 'deep.yaml', `channels: ${'{a: '.repeat(10_000)}1${'}'.repeat(10_000)}\n`],
    [
      'YAML block mappings',
      'deep.yaml',
      Array.from({ length: 1000 }, (_, i) => `${' '.repeat(i)}k:`).join('\n') + `\n${' '.repeat(1000)}v: 1\n`,
    ],
    ['YAML block lists', 'deep.yaml', `channels:\n  ${'- '.repeat(20_000)}x\n`],
    ['JSON', 'deep.json', `{"channels": ${'['.repeat(20_000)}${']'.repeat(20_000)}}`],
  ])('deep nesting (%s) is refused with a position, without a stack overflow', async (_what, name, text) => {
    const message = parseFails(text, name);
    expect(message).toMatch(
      new RegExp(
        `^${name.replace('.', '\\.')}:\\d+:\\d+: malformed (YAML|JSON): nested more than 32 levels deep$`,
      ),
    );
    const r = await report(file(name, text));
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(/nested more than 32 levels deep/);
    expect(r.stderr).not.toMatch(/internal error|call stack/i);
  });

  it('accepts nesting up to the limit', () => {
    const d = channelFileLimits.maxDepth;
    const text = `${'['.repeat(d)}${']'.repeat(d)}`;
    expect(parseChannelDocument(`v: ${text.slice(1, -1)}\n`, 'ok.yaml').data).toBeDefined();
    expect(() => parseChannelDocument(`v: ${text}\n`, 'over.yaml')).toThrow(/nested more than 32/);
  });

  it('a file larger than 1 MiB is refused before it is read', async () => {
    const path = join(tmp(), 'huge.yaml');
    writeFileSync(path, '');
    truncateSync(path, 8 * 1024 ** 3); // a sparse 8 GiB file: reading it would take minutes
    const e = await caught(readChannelDocument(path));
    expect(e).toThrowBridgeworkError('parse-error');
    const r = await report(path);
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toBe(
      `bridgework report: ${path} is larger than a channel file may be (1048576 bytes, 1 MiB); split it into several files\n`,
    );
    // Exactly at the limit is read (and then judged on its content).
    const edge = file('edge.yaml', `# ${'x'.repeat(channelFileLimits.maxBytes - 3)}\n`);
    const r2 = await report(edge);
    expect(r2.stderr).not.toMatch(/larger than/);
  });

  it(`a file with more than ${channelFileLimits.maxChannels} channels is refused before any channel is checked`, async () => {
    const text = `channels:\n${Array.from({ length: 1001 }, (_, i) => `  c${i}: {}`).join('\n')}\n`;
    const r = await report(file('many.yaml', text));
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toMatch(
      /has 1001 channels; a channel file may hold at most 1000: split it into several files\n$/,
    );
  });

  it.each([
    ['JSON', 'big.json', (t: string) => t],
    ['YAML', 'big.yaml', (t: string) => t],
  ])(
    'a number beyond a double (%s 1e400) is a problem of its field, not malformed text',
    async (_what, name) => {
      const text = name.endsWith('.json')
        ? '{"channels": {"a": {"sensor": {"kind": "rtd"}, "excitation": {"volts": 1e400}, "adc": {"bits": 24, "referenceVolts": -1e-400}, "output": {"quantity": "temperature"}}}}'
        : 'channels:\n  a:\n    sensor: { kind: rtd }\n    excitation: { volts: 1e400 }\n    adc: { bits: 24, referenceVolts: -1e-400 }\n    output: { quantity: temperature }\n';
      const doc = parseChannelDocument(text, name);
      expect(doc.valueIssues.map((i) => i.path)).toEqual([
        'channels.a.excitation.volts',
        'channels.a.adc.referenceVolts',
      ]);
      const r = await report(file(name, text));
      expect(r.code).toBe(exitCodes.badInput);
      expect(r.stderr).not.toMatch(/malformed/);
      expect(r.stderr).toMatch(
        /: channels\.a\.excitation\.volts: the number 1e400 is beyond the largest a double can hold \(about 1\.8e308\)/,
      );
      expect(r.stderr).toMatch(
        /: channels\.a\.adc\.referenceVolts: the number -1e-400 is too small for a double/,
      );
      // Reported once, not again as "must be finite" by the schema.
      expect(r.stderr).not.toMatch(/volts: .*Infinity/);
    },
  );

  it('YAML .inf stays a value for the schema to judge (it is written on purpose)', () => {
    expect(parseChannelDocument('v: .inf\n', 'x.yaml').valueIssues).toEqual([]);
  });

  it.each(['constructor', 'toString', '__proto__', 'hasOwnProperty', 'valueOf', '__defineGetter__'])(
    'a key named %s is an unknown field at the top level, in project and in a channel',
    async (key) => {
      for (const [where, text] of [
        ['top', example.replace('project:', `${key}: 1\nproject:`)],
        ['project', example.replace('project:\n', `project:\n  ${key}: x\n`)],
        ['channel', example.replace('tolerances:', `${key}:`)],
      ] as const) {
        const r = await report(file(`proto-${where}.yaml`, text));
        expect(r.code, `${key} in ${where}: ${r.stderr}`).toBe(exitCodes.badInput);
        expect(r.stderr).not.toMatch(/internal error/);
        const path = {
          top: `: ${key}: unknown field`,
          project: `: project.${key}: unknown field`,
          channel: `: channels.hanger-h3.${key}: unknown field`,
        }[where];
        expect(r.stderr).toContain(path);
      }
    },
  );

  it.each(['constructor', 'toString', 'valueOf'])(
    'a channel named %s is refused with the reason',
    async (key) => {
      const r = await report(file('proto-name.yaml', example.replace('  deck-temp:\n', `  ${key}:\n`)));
      expect(r.code).toBe(exitCodes.badInput);
      expect(r.stderr).toMatch(new RegExp(`: channels\\.${key}: '${key}' cannot name a channel`));
    },
  );

  it('docs/channel-file.md states the limits the parser keeps', () => {
    const docs = readFileSync(new URL('../../../docs/channel-file.md', import.meta.url), 'utf8');
    const table = docs.slice(docs.indexOf('### Limits of a file'));
    const row = (what: string) => new RegExp(`\\| ${what}\\s*\\| ([^|]+?)\\s*\\|`).exec(table)?.[1];
    expect(channelFileLimits.maxBytes).toBe(1024 * 1024);
    expect(row('size of the file')).toBe('1 MiB');
    expect(row('channels under `channels`')).toBe(String(channelFileLimits.maxChannels));
    expect(row('nesting of mappings and lists')).toBe(`${channelFileLimits.maxDepth} levels`);
    expect(row('nodes copied by aliases \\(`\\*a`\\)')).toBe(
      `${channelFileLimits.maxAliasNodes.toLocaleString('en-US').replace(',', ' ')} in all`,
    );
  });
});
