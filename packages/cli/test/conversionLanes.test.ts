/**
 * `bridgework convert --convert-threads N`: the conversion in worker threads writes the same bytes
 * as one thread, for every output format, on a recording of many blocks (a partial last block)
 * with flagged samples (codes at the rails) in every channel, a block whose temperature channel has
 * no valid sample, the per-block temperature correction, zero readings from a window, display
 * units, time stamps and passed-through CSV columns; the standard-error summary (flagged samples
 * per channel with their first and last frames, temperature gaps) is the same text. An error in a
 * worker reaches the user as the same error; SIGINT leaves no output file.
 */
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync, truncateSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { createChannel, type Channel } from '@bridgework/channel';
import { BridgeworkError } from '@bridgework/core';
import { describe, expect, it } from 'vitest';
import { float32Overflow } from '../src/data/clipCounter.js';
import { startConversionLanes } from '../src/data/conversionLanes.js';
import { receiveError, sendError } from '../src/data/laneMessages.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { exampleShown, footbridgeNames, footbridgeSpecs, repoRoot } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file, outPath, tmp } = useTestFiles('lanes');

const channels: Channel[] = footbridgeNames.map((n) => createChannel(footbridgeSpecs[n]));
const RAIL_HIGH = 2 ** 23 - 1;
const RAIL_LOW = -(2 ** 23);
const FRAMES = 5300; // with --block 700: seven full blocks and a partial one
const BLOCK = 700;
const TEMPERATURE = 2; // deck-temp, the third channel

/**
 * Frames sweeping each channel's span (a different phase per channel), rail codes scattered in
 * every channel, and the temperature channel at its rail through the whole fourth block.
 */
function recording(): Int32Array {
  const codes = new Int32Array(FRAMES * 3);
  for (let f = 0; f < FRAMES; f++) {
    channels.forEach((c, j) => {
      const x = 0.5 + 0.45 * Math.sin(f / (97 + 31 * j) + j);
      codes[f * 3 + j] = c.codeFromQuantity(c.span.min + (c.span.max - c.span.min) * x);
      if ((f * 7 + j * 13) % 211 === 0) codes[f * 3 + j] = f % 2 === 0 ? RAIL_HIGH : RAIL_LOW;
    });
  }
  for (let f = 3 * BLOCK; f < 4 * BLOCK; f++) codes[f * 3 + TEMPERATURE] = RAIL_HIGH;
  return codes;
}

/** The recording as int32le frames, each behind a 4-byte frame header holding a uint32le stamp. */
function withStamps(codes: Int32Array): Uint8Array {
  const bytes = new Uint8Array(FRAMES * 16);
  const view = new DataView(bytes.buffer);
  for (let f = 0; f < FRAMES; f++) {
    view.setUint32(16 * f, 1_000_000 + 250 * f, true);
    for (let j = 0; j < 3; j++) view.setInt32(16 * f + 4 + 4 * j, codes[f * 3 + j] as number, true);
  }
  return bytes;
}

/** The recording as CSV text, with a kept text column. */
function asCsv(codes: Int32Array): string {
  const lines = ['time,operator,hanger,gusset,deck'];
  for (let f = 0; f < FRAMES; f++) {
    lines.push(`${f / 10},"crew ${f % 3}",${codes[3 * f]},${codes[3 * f + 1]},${codes[3 * f + 2]}`);
  }
  return `${lines.join('\n')}\n`;
}

const codes = recording();
const raw = file('rig.bin', new Uint8Array(codes.buffer));
const stamped = file('stamped.bin', withStamps(codes));
const csv = file('rig.csv', asCsv(codes));

/** Runs the command with `threads` conversion threads; the output's bytes and the summary. */
async function convert(
  input: string,
  to: string,
  extra: readonly string[],
  threads: number,
  fromStart = true,
): Promise<{ bytes: Buffer; stderr: string }> {
  // Every block to the workers (none converted on this thread while they start), unless `started`.
  const io = memoryIo({ env: { BRIDGEWORK_CONVERT_THREADS_FROM_START: fromStart ? '1' : undefined } });
  const out = outPath(`out-${threads}.${to}`);
  const code = await runCli(
    ['convert', exampleShown, input, '--block', String(BLOCK), '--to', to, '-o', out, ...extra],
    io,
  );
  const stderr = io.stderr.text().replace(out, '<out>');
  expect([exitCodes.ok], stderr).toContain(code);
  return { bytes: readFileSync(out), stderr };
}

/**
 * A Parquet file's contents, read back by parquet-wasm into Arrow: the schema metadata (sorted),
 * and per column its name, type, null count, validity and the bytes of its values.
 */
async function parquetContents(bytes: Uint8Array): Promise<unknown> {
  const pw = await import('parquet-wasm/node');
  const { tableFromIPC } = await import('apache-arrow');
  const wasmTable = pw.readParquet(bytes);
  const table = tableFromIPC(wasmTable.intoIPCStream());
  return {
    metadata: [...table.schema.metadata].sort(([a], [b]) => (a < b ? -1 : 1)),
    columns: table.schema.fields.map((field, i) => {
      const column = table.getChildAt(i);
      const values = column?.toArray() as ArrayLike<unknown> & { buffer?: ArrayBuffer };
      return {
        name: field.name,
        type: String(field.type),
        nulls: column?.nullCount,
        valid: Array.from({ length: column?.length ?? 0 }, (_, r) => column?.isValid(r)),
        values:
          values.buffer === undefined
            ? Array.from(values)
            : Buffer.from(
                new Uint8Array(
                  values.buffer as ArrayBuffer,
                  (values as Float64Array).byteOffset,
                  (values as Float64Array).byteLength,
                ),
              ).toString('base64'),
      };
    }),
  };
}

const corrections = ['--temperature-from', 'deck-temp', '--sample-rate', '10', '--zero-window', '20s..40s'];
const cases: [string, string, string, readonly string[]][] = [
  ['CSV, shortest round trip', raw, 'csv', []],
  ['CSV, 9 digits', raw, 'csv', ['--digits', '9']],
  ['CSV, 6 digits, display units', raw, 'csv', ['--digits', '6', '--unit', 'display']],
  ['CSV with corrections', raw, 'csv', corrections],
  ['CSV with time stamps', stamped, 'csv', ['--frame-header', '4', '--time-stamp', 'uint32le']],
  ['CSV from CSV with a kept column', csv, 'csv', ['--time-column', 'time', '--keep-columns', 'operator']],
  ['float32le', raw, 'float32le', []],
  ['float32le, display units', raw, 'float32le', ['--unit', 'display']],
  ['float32be with corrections', raw, 'float32be', corrections],
  ['float64le', raw, 'float64le', []],
  ['float64be', stamped, 'float64be', ['--frame-header', '4']],
  ['Arrow IPC', raw, 'arrow', []],
  [
    'Arrow IPC with corrections and time stamps',
    stamped,
    'arrow',
    ['--frame-header', '4', '--time-stamp', 'uint32le', ...corrections],
  ],
  ['Arrow IPC stream from CSV', csv, 'arrows', ['--time-column', 'time', '--keep-columns', 'operator']],
  ['Parquet', raw, 'parquet', []],
  ['Parquet with corrections', raw, 'parquet', corrections],
];

/** The cases of the default suite (one per path: text rows, lanes on this thread, frames, columnar); the rest with BRIDGEWORK_HEAVY=1. */
const quick = new Set([
  'CSV, 9 digits',
  'CSV with corrections',
  'CSV from CSV with a kept column',
  'float32le, display units',
  'Arrow IPC with corrections and time stamps',
  'Parquet with corrections',
]);
const heavy = process.env['BRIDGEWORK_HEAVY'] === '1';

describe('conversion in worker threads equals one thread, bit for bit', () => {
  it.each(cases.filter(([name]) => heavy || quick.has(name)))(
    '%s',
    { timeout: 60_000 },
    async (_name, input, to, extra) => {
      const one = await convert(input, to, [...extra, '--convert-threads', '0'], 0);
      // The recording has flagged samples in every channel, and (with corrections) a block without temperature.
      expect(one.stderr).toMatch(/clipped samples: \d+ of 15900/);
      for (const name of footbridgeNames)
        expect(one.stderr).toMatch(new RegExp(`${name} \\([^)]*\\): \\d+, frames`));
      if (extra.includes('--temperature-from')) {
        expect(one.stderr).toContain(`no valid temperature in ${BLOCK} frames (frames 2100 to 2799)`);
      }
      for (const threads of [2]) {
        const many = await convert(input, to, [...extra, '--convert-threads', String(threads)], threads);
        expect(many.stderr, `${threads} threads: summary`).toBe(one.stderr);
        if (to === 'parquet') {
          // The Parquet writer orders its key-value metadata by a hash map: compare the contents.
          expect(await parquetContents(many.bytes), `${threads} threads: parquet`).toEqual(
            await parquetContents(one.bytes),
          );
        } else expect(many.bytes.equals(one.bytes), `${threads} threads: ${to} bytes`).toBe(true);
      }
    },
  );
});

it('with the default start (blocks converted here until the workers are ready), the same bytes', async () => {
  const one = await convert(raw, 'csv', ['--convert-threads', '0'], 0);
  const many = await convert(raw, 'csv', ['--convert-threads', '2'], 2, false);
  expect(many.stderr).toBe(one.stderr);
  expect(many.bytes.equals(one.bytes)).toBe(true);
}, 60_000);

describe('errors in a worker thread', () => {
  it('cross to the main thread as the same BridgeworkError (code, message, param, value, limit)', () => {
    const original = float32Overflow(1, 4321, 4e38);
    const back = receiveError(sendError(original));
    expect(back).toBeInstanceOf(BridgeworkError);
    expect(back).toMatchObject({
      code: original.code,
      message: original.message,
      param: original.param,
      value: original.value,
      limit: original.limit,
    });
    const plain = receiveError(sendError(new Error('the converter reported 3 clipped samples')));
    expect(plain).not.toBeInstanceOf(BridgeworkError);
    expect(plain.message).toBe('the converter reported 3 clipped samples');
  });

  it("a channel a worker cannot make fails the run with the channel package's own error", async () => {
    const bad = { ...footbridgeSpecs['hanger-h3'], excitation: { volts: -5 } };
    let expected: unknown;
    try {
      createChannel(bad);
    } catch (e) {
      expected = e;
    }
    expect(expected).toBeInstanceOf(BridgeworkError);
    const lanes = startConversionLanes(1);
    try {
      const setup = lanes.setup(
        {
          mode: 'lanes',
          channels: 1,
          blockFrames: 16,
          factors: [1],
          temperature: undefined,
          output: 'float64',
          digits: undefined,
        },
        [bad],
      );
      const error: unknown = await setup.then(
        () => undefined,
        (e: unknown) => e,
      );
      expect(error).toBeInstanceOf(BridgeworkError);
      const want = expected as BridgeworkError;
      expect(error).toMatchObject({ code: want.code, message: want.message, param: want.param });
    } finally {
      await lanes.close();
    }
  }, 60_000);
});

describe('interrupting a threaded conversion', () => {
  const bin = join(repoRoot, 'packages/cli/dist/bin.js');
  it.skipIf(!existsSync(bin))(
    'SIGINT leaves no output file and no temporary file, and the process (with its threads) ends',
    { timeout: 60_000 },
    async () => {
      // 2 × 10⁷ frames of three channels, mostly a hole in the file (zero codes convert quickly).
      const big = join(tmp(), 'big.bin');
      writeFileSync(big, '');
      truncateSync(big, 3 * 4 * 20_000_000);
      const out = join(tmp(), 'big-out.csv');
      const child = spawn(
        process.execPath,
        [bin, 'convert', exampleShown, big, '-o', out, '--convert-threads', '2'],
        {
          cwd: repoRoot,
          stdio: 'ignore',
        },
      );
      const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
        child.on('exit', (code, signal) => resolve({ code, signal })),
      );
      // Wait until its temporary file beside the output has grown past a megabyte.
      const temporary = (): string | undefined =>
        readdirSync(dirname(out)).find((f) => f.startsWith('.big-out.csv.') && f.endsWith('.tmp'));
      const end = Date.now() + 45_000;
      for (;;) {
        const t = temporary();
        if (t !== undefined && statSync(join(dirname(out), t)).size > 1 << 20) break;
        if (Date.now() > end || child.exitCode !== null)
          throw new Error('the conversion did not start writing');
        await new Promise((r) => setTimeout(r, 50));
      }
      child.kill('SIGINT');
      const { code, signal } = await exited;
      expect(signal === 'SIGINT' || code === 130, `exit ${code} ${signal}`).toBe(true);
      expect(existsSync(out)).toBe(false);
      expect(temporary()).toBeUndefined();
    },
  );
});
