/**
 * The channel file's `recording` section: a recording's layout written once, so that `bridgework
 * convert` needs no layout options. Checked end to end: a recording encoded byte by byte in the
 * section's layout (test/support/encodeRecording, independent of the readers) converts with no
 * layout option to exactly what the same options on the command line give, and to the channel
 * package's own interleaved conversion bit for bit; options override the section field by field,
 * `--from` replaces it; every malformed section is refused with its field's path and position.
 */
import { readFileSync } from 'node:fs';
import { createChannel, createInterleavedConverter } from '@bridgework/channel';
import { tableFromIPC } from 'apache-arrow';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { encodeRecording } from './support/encodeRecording.js';
import { examplePath, footbridgeSpecs } from './support/footbridge.js';
import { int32le, useTestFiles } from './support/files.js';
import { schemaErrors } from './support/jsonSchemaSubset.js';
import { memoryIo } from './support/memoryIo.js';
import { schemaPath } from './support/channelFileDocs.js';

const { file, outPath } = useTestFiles('recording-section');
const exampleText = readFileSync(examplePath, 'utf8');

async function run(argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

/** The example channel file with a recording section appended (YAML text). */
const withSection = (section: string): string =>
  file('channels.yaml', `${exampleText}\nrecording:\n${section}`);

// Two of the example's three channels, temperature first: the section's order, not the file's.
const order = ['deck-temp', 'hanger-h3'] as const;
const channels = order.map((n) => createChannel(footbridgeSpecs[n]));
const frames = 121; // 121 × 18 bytes is not a whole number of 20-byte frames (see the override test)
const codes: number[] = [];
const stamps: bigint[] = [];
for (let f = 0; f < frames; f++) {
  channels.forEach((c) =>
    codes.push(c.codeFromQuantity(c.span.min + ((c.span.max - c.span.min) * f) / frames)),
  );
  stamps.push(1_700_000_000_000_000n + BigInt(f) * 20_000n);
}
codes[5 * 2 + 1] = 2 ** 23 - 1; // a rail code in the hanger at frame 5
const layout = {
  sample: 'int24be',
  channels: 2,
  fileHeaderBytes: 16,
  frameHeaderBytes: 12,
  frameTrailerBytes: 2,
  timeStamp: { type: 'uint64le', offsetBytes: 4 },
} as const;
const rawSection = [
  '  format: int24be',
  '  channels: [deck-temp, hanger-h3]',
  "  sampleRateHertz: '50 Hz'",
  '  fileHeaderBytes: 16',
  '  frameHeaderBytes: 12',
  '  frameTrailerBytes: 2',
  '  timeStamp: { type: uint64le, offsetBytes: 4, secondsPerTick: 1e-6 }',
  '',
].join('\n');
const explicitFlags = [
  '--from',
  'int24be',
  '--channels',
  'deck-temp,hanger-h3',
  '--sample-rate',
  '50',
  '--file-header',
  '16',
  '--frame-header',
  '12',
  '--frame-trailer',
  '2',
  '--time-stamp',
  'uint64le',
  '--time-stamp-at',
  '4',
  '--tick',
  '1e-6',
];

describe('the recording section of a channel file', () => {
  const input = file('rig.dat', encodeRecording(layout, codes, stamps));
  const expected = createInterleavedConverter(channels).convert(Int32Array.from(codes)).values;

  it('gives convert the whole layout: same output as the options, equal to the library bit for bit', async () => {
    const channelFile = withSection(rawSection);
    const fromSection = outPath('section.csv');
    const fromFlags = outPath('flags.csv');
    expect((await run(['convert', channelFile, input, '-o', fromSection])).code).toBe(exitCodes.ok);
    expect((await run(['convert', examplePath, input, '-o', fromFlags, ...explicitFlags])).code).toBe(
      exitCodes.ok,
    );
    const text = readFileSync(fromSection, 'utf8');
    expect(text).toBe(readFileSync(fromFlags, 'utf8'));
    const [head, ...lines] = text.trimEnd().split('\n');
    expect(head).toBe('time (ticks of 0.000001 s),deck-temp (°C),hanger-h3 (N)');
    expect(lines).toHaveLength(frames);
    lines.forEach((line, f) => {
      const [t, ...values] = line.split(',');
      expect(BigInt(t as string)).toBe(stamps[f]);
      values.forEach((v, j) => {
        const e = expected[f * 2 + j] as number;
        if (Number.isNaN(e)) expect(v, `frame ${f}`).toBe('NaN');
        else expect(Number(v), `frame ${f}, ${order[j]}`).toBe(e);
      });
    });
  });

  it('is overridden field by field by options, and replaced by --from', async () => {
    // A recording without trailers: the section's trailer is overridden on the command line.
    const noTrailer = file('rig2.dat', encodeRecording({ ...layout, frameTrailerBytes: 0 }, codes, stamps));
    const channelFile = withSection(rawSection);
    const out = outPath('override.csv');
    expect((await run(['convert', channelFile, noTrailer, '-o', out, '--frame-trailer', '0'])).code).toBe(
      exitCodes.ok,
    );
    const values = readFileSync(out, 'utf8')
      .trimEnd()
      .split('\n')
      .slice(1)
      .map((l) => l.split(',').slice(1));
    expect(values.map((r) => r.map(Number))).toEqual(
      Array.from({ length: frames }, (_, f) => [expected[2 * f], expected[2 * f + 1]]),
    );
    // Without the override the frame size is wrong and the recording is refused, not misread.
    const refused = await run(['convert', channelFile, noTrailer, '-o', outPath('refused.csv')]);
    expect(refused.code).toBe(exitCodes.badInput);
    // A tick or stamp offset without a stamp (the section's is not used with --from) is refused.
    const noStamp = await run(['convert', channelFile, noTrailer, '--from', 'int32le', '--tick', '1e-6']);
    expect(noStamp.code).toBe(exitCodes.badInput);
    expect(noStamp.stderr).toContain(
      '--tick describes a time stamp in the frame header, but the recording has none',
    );
    // --from describes another recording: the section is not used (all three channels, int32le).
    const all = ['hanger-h3', 'gusset-g2', 'deck-temp'].map((n) =>
      createChannel(footbridgeSpecs[n as 'hanger-h3']),
    );
    const plain = Int32Array.from({ length: 30 }, (_, i) => {
      const c = all[i % 3]!;
      return c.codeFromQuantity((c.span.min + c.span.max) / 2);
    });
    const plainFile = file('plain.bin', int32le([...plain]));
    const r = await run(['convert', channelFile, plainFile, '--from', 'int32le']);
    expect(r.code).toBe(exitCodes.ok);
    const rows = r.stdout.trimEnd().split('\n');
    expect(rows[0]).toBe('hanger-h3 (N),gusset-g2 (µε),deck-temp (°C)');
    const reference = createInterleavedConverter(all).convert(plain).values;
    expect(rows.slice(1).flatMap((l) => l.split(',').map(Number))).toEqual([...reference]);
  });

  it('records in the columnar metadata where the layout came from: section, options by name, or defaults', async () => {
    const channelFile = withSection(rawSection);
    const layoutFrom = async (file: string, data: string, ...extra: string[]) => {
      const out = outPath('layout.arrow');
      const r = await run(['convert', file, data, '-o', out, ...extra]);
      expect(r.code, r.stderr).toBe(exitCodes.ok);
      return tableFromIPC(readFileSync(out)).schema.metadata.get('bridgework.recording.layout-from');
    };
    expect(await layoutFrom(channelFile, input)).toMatch(/^the recording section of \d+-channels\.yaml$/);
    expect(await layoutFrom(channelFile, input, '--tick', '1e-3', '--sample-rate', '50')).toMatch(
      /^command line \(--tick, --sample-rate\) over the recording section of \d+-channels\.yaml$/,
    );
    expect(await layoutFrom(examplePath, input, ...explicitFlags)).toBe(
      'command line (--from, --channels, --file-header, --frame-header, --frame-trailer, --time-stamp, --time-stamp-at, --tick, --sample-rate)',
    );
    const plain = file('plain3.bin', int32le(Array.from({ length: 9 }, () => 0)));
    expect(await layoutFrom(examplePath, plain)).toBe('defaults (no layout option, no recording section)');
  });

  it('describes CSV recordings: code columns in channel order, time column, passed-through columns', async () => {
    const csv = file(
      'log.txt',
      'note,t,code_h,code_t\n' +
        Array.from({ length: 10 }, (_, f) => `"a, ${f}",${f / 10},${codes[2 * f + 1]},${codes[2 * f]}`).join(
          '\n',
        ) +
        '\n',
    );
    const channelFile = withSection(
      [
        '  format: csv',
        '  channels: [deck-temp, hanger-h3]',
        '  codeColumns: [code_t, 3]',
        '  timeColumn: t',
        '  keepColumns: none',
        '',
      ].join('\n'),
    );
    const r = await run(['convert', channelFile, csv]);
    expect(r.code, r.stderr).toBe(exitCodes.ok);
    const [head, ...lines] = r.stdout.trimEnd().split('\n');
    expect(head).toBe('t,deck-temp (°C),hanger-h3 (N)'); // the time column keeps its heading
    lines.forEach((line, f) => {
      const [t, temp, hanger] = line.split(',');
      expect(Number(t)).toBe(f / 10);
      expect(temp).toBe(String(expected[2 * f]));
      expect(hanger).toBe(String(expected[2 * f + 1]));
    });
  });

  it.each([
    [
      '  format: int24be\n  frameHeader: 8\n',
      'recording.frameHeader',
      'unknown field; expected one of format',
    ],
    // Two swapped digits are one typo (core's closestName), as near as one wrong digit: the earlier listed wins.
    ['  format: int42be\n', 'recording.format', "did you mean 'int24be'?"],
    ['  frameHeaderBytes: 8\n', 'recording.format', 'is required'],
    [
      '  format: int16le\n  channels: [deck-temp, hanger-h4]\n',
      'recording.channels[1]',
      "did you mean 'hanger-h3'?",
    ],
    ['  format: int16le\n  channels: [deck-temp, deck-temp]\n', 'recording.channels[1]', 'listed twice'],
    [
      '  format: int16le\n  frameHeaderBytes: 6\n  timeStamp: { type: uint64le }\n',
      'recording.timeStamp',
      'needs frameHeaderBytes of at least 8',
    ],
    ['  format: csv\n  frameHeaderBytes: 4\n', 'recording.frameHeaderBytes', 'applies to raw recordings'],
    ['  format: int32le\n  codeColumns: [a]\n', 'recording.codeColumns', 'applies to CSV recordings'],
    [
      '  format: csv\n  channels: [deck-temp]\n  codeColumns: [a, b]\n',
      'recording.codeColumns',
      'one code column per channel',
    ],
    ['  format: int32le\n  sampleRateHertz: -5\n', 'recording.sampleRateHertz', 'above 0 Hz'],
    ['  format: int32le\n  sampleRateHertz: 5 kg\n', 'recording.sampleRateHertz', ''],
    ['  format: int32le\n  fileHeaderBytes: 1.5\n', 'recording.fileHeaderBytes', 'whole number of bytes'],
  ])('refuses a malformed section (%#): %s', async (section, path, words) => {
    const channelFile = withSection(section);
    const r = await run(['convert', channelFile, file('x.bin', new Uint8Array(24))]);
    expect(r.code).toBe(exitCodes.badInput);
    // file:line:column: path: message
    expect(r.stderr).toMatch(new RegExp(`channels\\.yaml:\\d+:\\d+: ${path.replace(/[.[\]]/g, '\\$&')}: `));
    expect(r.stderr).toContain(words);
  });

  it('is in the editor schema: a section is accepted, an unknown field and a bad format flagged', () => {
    const schema = JSON.parse(readFileSync(schemaPath, 'utf8')) as Record<string, unknown>;
    const doc = parse(`${exampleText}\nrecording:\n${rawSection}`) as Record<string, unknown>;
    expect(schemaErrors(schema, doc)).toEqual([]);
    const typo = structuredClone(doc) as { recording: Record<string, unknown> };
    typo.recording['frameHeader'] = 8;
    expect(schemaErrors(schema, typo).length).toBeGreaterThan(0);
    const bad = structuredClone(doc) as { recording: Record<string, unknown> };
    bad.recording['format'] = 'int42be';
    expect(schemaErrors(schema, bad).length).toBeGreaterThan(0);
  });
});
