/**
 * `bridgework convert` end to end with the example file's three channels: raw int32 and CSV
 * recordings made with the channel package's own forward maps (codeFromQuantity), converted by
 * the command and compared value by value with the channel package's interleaved converter
 * (bit for bit) and with each channel's exact map (within the conversion kernel's bound).
 */
import { readFileSync } from 'node:fs';
import { channelBudget, createChannel, createInterleavedConverter, type Channel } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { exampleShown, footbridgeNames, footbridgeSpecs } from './support/footbridge.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file, outPath } = useTestFiles('convert');

const channels: Channel[] = footbridgeNames.map((n) => createChannel(footbridgeSpecs[n]));
const RAIL_HIGH = 2 ** 23 - 1;
const RAIL_LOW = -(2 ** 23);

/** 300 frames sweeping each channel's span, with one rail code in each of two channels. */
function recording(): Int32Array {
  const frames = 300;
  const codes = new Int32Array(frames * 3);
  for (let f = 0; f < frames; f++) {
    channels.forEach((c, j) => {
      const q = c.span.min + ((c.span.max - c.span.min) * f) / (frames - 1);
      codes[f * 3 + j] = c.codeFromQuantity(q);
    });
  }
  codes[7 * 3 + 0] = RAIL_HIGH; // hanger at frame 7
  codes[200 * 3 + 2] = RAIL_LOW; // deck-temp at frame 200
  return codes;
}

async function run(argv: string[], options: { stderrTTY?: boolean } = {}) {
  const io = memoryIo(options);
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

function parseCsv(text: string): { header: string[]; rows: number[][] } {
  const [head, ...lines] = text.trimEnd().split('\n');
  return { header: (head as string).split(','), rows: lines.map((l) => l.split(',').map(Number)) };
}

/** The largest quantity magnitude over a channel's valid codes (its maps are monotone). */
function largest(channel: Channel): number {
  const { min, max } = channel.validCodes;
  return Math.max(
    Math.abs(channel.quantityFromCode(Math.floor(min) + 1)),
    Math.abs(channel.quantityFromCode(Math.ceil(max) - 1)),
  );
}

describe('bridgework convert on the example file', () => {
  const codes = recording();
  const expected = createInterleavedConverter(channels).convert(codes).values;

  it('converts a raw int32 recording to CSV with unit headings, equal to the library, NaN at the rails', async () => {
    const input = file('recording.bin', int32le([...codes]));
    const out = outPath('recording.csv');
    const r = await run(['convert', exampleShown, input, '-o', out, '--block', '64']);
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(
      'clipped samples: 2 of 900 (0.2 %)\n  hanger-h3 (N): 1, frame 7\n  deck-temp (°C): 1, frame 200\nwrote 300 rows to ' +
        `${out}\n`,
    );
    const { header, rows } = parseCsv(readFileSync(out, 'utf8'));
    expect(header).toEqual(['hanger-h3 (N)', 'gusset-g2 (µε)', 'deck-temp (°C)']);
    expect(rows).toHaveLength(300);
    rows.forEach((row, f) =>
      row.forEach((v, j) => {
        const k = f * 3 + j;
        // The shortest text that reads back as the same double: the library's value exactly.
        if (Number.isNaN(expected[k])) expect(v, `frame ${f}, channel ${j}`).toBeNaN();
        else expect(v, `frame ${f}, channel ${j}`).toBe(expected[k]);
      }),
    );
    // Against each channel's exact map: the kernel's acceptance bound is 1e-12 of the largest quantity.
    channels.forEach((c, j) => {
      for (const f of [0, 150, 299]) {
        expect(rows[f]![j]!).toBeNear(c.quantityFromCode(codes[f * 3 + j]!), { abs: 1e-12 * largest(c) });
      }
    });
    // The sweep's ends come back as the span's ends to within a code (the codes were rounded).
    expect(rows[0]![1]!).toBeNear(-300, { abs: channelBudget(channels[1]!).resolution.quantityPerCode });
    expect(rows[299]![2]!).toBeNear(60, { abs: channelBudget(channels[2]!).resolution.quantityPerCode });
  });

  it('exits 2 with --fail-on-clip, and still writes the file', async () => {
    const input = file('clipped.bin', int32le([...codes]));
    const out = outPath('clipped.csv');
    const r = await run(['convert', exampleShown, input, '-o', out, '--fail-on-clip']);
    expect(r.code).toBe(exitCodes.failedCheck);
    expect(readFileSync(out, 'utf8').split('\n')).toHaveLength(302);
  });

  it('converts chosen columns of a logger CSV for chosen channels, in the order given', async () => {
    const lines = ['time_s,hanger,gusset,deck'];
    for (let f = 0; f < 50; f++)
      lines.push(`${(f * 0.1).toFixed(1)},${codes[f * 3]},${codes[f * 3 + 1]},${codes[f * 3 + 2]}`);
    const input = file('logger.csv', `${lines.join('\n')}\n`);
    const r = await run([
      'convert',
      exampleShown,
      input,
      '--columns',
      'deck,2',
      '--channels',
      'deck-temp,hanger-h3',
    ]);
    expect(r.code).toBe(exitCodes.ok);
    // The other columns pass through (issue 17: time stamps were dropped), as written.
    const { header, rows } = parseCsv(r.stdout);
    expect(header).toEqual(['time_s', 'gusset', 'deck-temp (°C)', 'hanger-h3 (N)']);
    const alone = createInterleavedConverter([channels[2]!, channels[0]!]);
    const pairs = Int32Array.from(
      { length: 100 },
      (_, i) => codes[Math.floor(i / 2) * 3 + (i % 2 === 0 ? 2 : 0)]!,
    );
    const values = alone.convert(pairs).values;
    rows.forEach((row, f) => {
      expect(row[0]).toBe(Number((f * 0.1).toFixed(1)));
      expect(row[1]).toBe(codes[f * 3 + 1]);
      expect(row[2]).toBe(values[2 * f]);
      if (f === 7) expect(row[3]).toBeNaN();
      else expect(row[3]).toBe(values[2 * f + 1]);
    });
    expect(r.stdout.split('\n')[1]).toBe(`0.0,${codes[1]},${values[0]},${values[1]}`);
    expect(r.stderr).toBe('clipped samples: 1 of 100 (1.0 %)\n  hanger-h3 (N): 1, frame 7\n');
    const bare = await run([
      'convert',
      exampleShown,
      input,
      '--columns',
      'deck,2',
      '--channels',
      'deck-temp,hanger-h3',
      '--keep-columns',
      'none',
    ]);
    expect(parseCsv(bare.stdout).header).toEqual(['deck-temp (°C)', 'hanger-h3 (N)']);
  });

  it('draws a progress bar only on a terminal', async () => {
    const input = file('progress.bin', int32le([...codes]));
    const tty = await run(['convert', exampleShown, input, '-o', outPath('tty.csv'), '--block', '16'], {
      stderrTTY: true,
    });
    expect(tty.stderr).toMatch(/\rconverting \[[█░]+\] +\d+\.\d %/);
    const pipe = await run(['convert', exampleShown, input, '-o', outPath('pipe.csv'), '--block', '16']);
    expect(pipe.stderr).not.toContain('converting');
  });

  it('refuses a file whose columns do not match the channels', async () => {
    const input = file('two.csv', 'a,b\n1,2\n');
    const r = await run(['convert', exampleShown, input]);
    expect(r).toEqual({
      code: exitCodes.badInput,
      stdout: '',
      stderr: `bridgework convert: ${input} has 2 code columns, but 3 channels are selected; choose them with --columns and --channels\n`,
    });
    const raw = await run(['convert', exampleShown, file('odd.bin', int32le([1, 2, 3, 4]))]);
    expect(raw.code).toBe(exitCodes.badInput);
    expect(raw.stderr).toMatch(/^bridgework convert: .+odd\.bin/);
    expect(raw.stdout).toBe('');
  });
});
