/**
 * Arrow and Parquet outputs of `bridgework convert`, read back with independent readers — the
 * apache-arrow IPC reader, and DuckDB's embedded engine for Parquet — and compared with the channel
 * package's own conversion bit for bit (null where it gives NaN), metadata included. Every input
 * layout converts to the same values as the int32 path.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { DuckDBInstance } from '@duckdb/node-api';
import { createChannel, type Channel } from '@bridgework/channel';
import { tableFromIPC } from 'apache-arrow';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sampleTypes } from '../src/data/recordingLayout.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { encodeRecording } from './support/encodeRecording.js';
import { exampleShown, examplePath, footbridgeNames, footbridgeSpecs } from './support/footbridge.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file, outPath } = useTestFiles('columnar');
const channels: Channel[] = footbridgeNames.map((n) => createChannel(footbridgeSpecs[n]));
const version = (
  JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string }
).version;
const sha256 = createHash('sha256').update(readFileSync(examplePath)).digest('hex');

/** 400 frames sweeping each channel's span, with rail codes in two channels. */
function recording(frames = 400): Int32Array {
  const codes = new Int32Array(frames * 3);
  for (let f = 0; f < frames; f++) {
    channels.forEach((c, j) => {
      const q = c.span.min + ((c.span.max - c.span.min) * f) / (frames - 1);
      codes[f * 3 + j] = c.codeFromQuantity(q);
    });
  }
  codes[5 * 3 + 0] = 2 ** 23 - 1;
  codes[300 * 3 + 2] = -(2 ** 23);
  return codes;
}
const codes = recording();
const frames = codes.length / 3;
/** The library's values, lane by lane. */
const expected = channels.map(
  (c, j) => c.convert(Int32Array.from({ length: frames }, (_, f) => codes[f * 3 + j] as number)).values,
);

async function convert(argv: string[]): Promise<void> {
  const io = memoryIo();
  const code = await runCli(['convert', exampleShown, ...argv], io);
  expect(io.stderr.text(), io.stderr.text()).toMatch(/clipped samples: 2 of 1200/);
  expect(code).toBe(exitCodes.ok);
}

/** Same value, bit for bit; NaN in the library is null in the file. */
function expectLane(got: readonly (number | null)[], want: Float64Array, name: string): void {
  expect(got.length).toBe(want.length);
  for (let f = 0; f < want.length; f++) {
    const w = want[f] as number;
    if (Number.isNaN(w)) expect(got[f], `${name} frame ${f}`).toBeNull();
    else expect(Object.is(got[f], w), `${name} frame ${f}: ${got[f]} vs ${w}`).toBe(true);
  }
}

let duck: Awaited<ReturnType<DuckDBInstance['connect']>>;
beforeAll(async () => {
  duck = await (await DuckDBInstance.create(':memory:')).connect();
});
afterAll(() => {
  duck.closeSync();
});

async function duckRows(sql: string): Promise<Record<string, unknown>[]> {
  return (await duck.runAndReadAll(sql)).getRowObjects() as Record<string, unknown>[];
}

describe('Arrow IPC output, read back with the apache-arrow reader', () => {
  for (const form of ['arrow', 'arrows'] as const) {
    it(`${form}: frame column, one float64 column per channel, units and provenance in the schema`, async () => {
      const input = file('rec.bin', int32le([...codes]));
      const out = outPath(`rec.${form}`);
      await convert([input, '-o', out, '--block', '64', '--sample-rate', '10']);
      const table = tableFromIPC(readFileSync(out));
      expect(table.numRows).toBe(frames);
      expect(table.schema.fields.map((f) => [f.name, String(f.type)])).toEqual([
        ['frame', 'Int64'],
        ['hanger-h3', 'Float64'],
        ['gusset-g2', 'Float64'],
        ['deck-temp', 'Float64'],
      ]);
      expect(table.schema.fields.slice(1).map((f) => f.metadata.get('unit'))).toEqual(['N', 'µε', '°C']);
      const meta = table.schema.metadata;
      expect(meta.get('bridgework.version')).toBe(version);
      expect(meta.get('bridgework.channel-file.sha256')).toBe(sha256);
      expect(meta.get('bridgework.sample-rate-hertz')).toBe('10');
      expect(meta.get('bridgework.caution')).toMatch(/do not replace, qualified engineering judgement/);
      const frame = table.getChild('frame')!;
      expect(Array.from({ length: frames }, (_, f) => frame.get(f))).toEqual(
        Array.from({ length: frames }, (_, f) => BigInt(f)),
      );
      channels.forEach((c, j) => {
        const column = table.getChild(c.name)!;
        expectLane(
          Array.from({ length: frames }, (_, f) => column.get(f) as number | null),
          expected[j] as Float64Array,
          c.name,
        );
      });
    });
  }

  it('display units: values × the display factor, the unit in the column metadata', async () => {
    const input = file('rec.bin', int32le([...codes]));
    const out = outPath('display.arrow');
    await convert([input, '-o', out, '--unit', 'display']);
    const table = tableFromIPC(readFileSync(out));
    expect(table.schema.fields.slice(1).map((f) => f.metadata.get('unit'))).toEqual(['kN', 'µε', '°C']);
    const hanger = table.getChild('hanger-h3')!;
    const want = expected[0] as Float64Array;
    for (let f = 0; f < frames; f++) {
      const w = want[f] as number;
      if (Number.isNaN(w)) expect(hanger.get(f)).toBeNull();
      else expect(hanger.get(f)).toBe(w * 1e-3); // one multiplication, the same in the test
    }
  });
});

/** A Parquet file's bytes before its footer (magic, column chunks). */
function dataPages(bytes: Buffer): Buffer {
  const footer = bytes.readUInt32LE(bytes.length - 8);
  return bytes.subarray(0, bytes.length - 8 - footer);
}

/** A Parquet file's key/value metadata, sorted by key (DuckDB's reader). */
async function keyValues(path: string): Promise<Record<string, unknown>[]> {
  return duckRows(
    `SELECT decode(key) AS key, decode(value) AS value FROM parquet_kv_metadata('${path}') ORDER BY key`,
  );
}

describe('Parquet output, read back with DuckDB', () => {
  it('equals the library bit for bit (null for NaN), with the metadata in the file', async () => {
    const input = file('rec.bin', int32le([...codes]));
    const out = outPath('rec.parquet');
    await convert([input, '-o', out, '--block', '64']);
    const rows = await duckRows(`SELECT * FROM read_parquet('${out}') ORDER BY frame`);
    expect(rows).toHaveLength(frames);
    expect(Object.keys(rows[0] as object)).toEqual(['frame', 'hanger-h3', 'gusset-g2', 'deck-temp']);
    expect(rows.map((r) => r['frame'])).toEqual(Array.from({ length: frames }, (_, f) => BigInt(f)));
    channels.forEach((c, j) => {
      expectLane(
        rows.map((r) => r[c.name] as number | null),
        expected[j] as Float64Array,
        c.name,
      );
    });
    const kv = await duckRows(
      `SELECT decode(key) AS key, decode(value) AS value FROM parquet_kv_metadata('${out}')`,
    );
    const meta = new Map(kv.map((r) => [r['key'] as string, r['value'] as string]));
    expect(meta.get('bridgework.version')).toBe(version);
    expect(meta.get('bridgework.channel-file.sha256')).toBe(sha256);
    expect(JSON.parse(meta.get('bridgework.channels') as string)).toEqual([
      { name: 'hanger-h3', unit: 'N', quantity: 'force' },
      { name: 'gusset-g2', unit: 'µε', quantity: 'strain' },
      { name: 'deck-temp', unit: '°C', quantity: 'temperature' },
    ]);
    expect(meta.has('ARROW:schema')).toBe(true); // the Arrow schema, with each column's unit
  });

  it('the encoder thread writes the same column chunks byte for byte and the same metadata (several blocks; an empty recording)', async () => {
    const input = file('rec.bin', int32le([...codes]));
    const here = outPath('here.parquet');
    const there = outPath('there.parquet');
    await convert([input, '-o', here, '--block', '64', '--parquet-encoder', 'this-thread']);
    await convert([input, '-o', there, '--block', '64', '--parquet-encoder', 'worker-thread']);
    // The crate stores the key/value metadata in a hash map's order, which depends on the
    // WebAssembly instance's history (a fresh process writes the same bytes; the test process
    // has written Parquet before): the column chunks and footer must be the same, the metadata
    // the same as a set.
    expect(dataPages(readFileSync(there)).equals(dataPages(readFileSync(here)))).toBe(true); // exact
    expect(await keyValues(there)).toEqual(await keyValues(here));
    const layoutOf = (f: string): Promise<Record<string, unknown>[]> =>
      duckRows(
        `SELECT row_group_id, column_id, data_page_offset, total_compressed_size, stats_min, stats_max, stats_null_count FROM parquet_metadata('${f}') ORDER BY ALL`,
      );
    expect(await layoutOf(there)).toEqual(await layoutOf(here));
    const rows = await duckRows(`SELECT * FROM read_parquet('${there}') ORDER BY frame`);
    channels.forEach((c, j) => {
      expectLane(
        rows.map((r) => r[c.name] as number | null),
        expected[j] as Float64Array,
        c.name,
      );
    });
    const empty = file('empty.bin', new Uint8Array(0));
    const emptyHere = outPath('empty-here.parquet');
    const emptyThere = outPath('empty-there.parquet');
    for (const [where, out] of [
      ['this-thread', emptyHere],
      ['worker-thread', emptyThere],
    ] as const) {
      const io = memoryIo();
      expect(await runCli(['convert', exampleShown, empty, '-o', out, '--parquet-encoder', where], io)).toBe(
        exitCodes.ok,
      );
    }
    expect(dataPages(readFileSync(emptyThere)).equals(dataPages(readFileSync(emptyHere)))).toBe(true); // exact
    expect(await keyValues(emptyThere)).toEqual(await keyValues(emptyHere));
    expect(await duckRows(`SELECT count(*) AS n FROM read_parquet('${emptyThere}')`)).toEqual([{ n: 0n }]);
  });

  it('the encoder thread passes a failing write back to the conversion', async () => {
    const { createParquetWriter } = await import('../src/data/createParquetWriter.js');
    const full = new Error('no space left on the test sink');
    const columns = {
      channels: [{ name: 'a', unit: 'µε', quantity: 'strain' }],
      time: undefined,
      passThrough: [],
      metadata: {},
    };
    const writer = await createParquetWriter({ write: () => Promise.reject(full) }, columns, 1024, {
      encoderThread: true,
      rowGroupBytes: 1, // a row group per block: bytes come back while blocks are still going in
    });
    const run = async (): Promise<void> => {
      for (let b = 0; b < 8; b++) {
        await writer.writeBlock({
          frames: 1024,
          firstFrame: b * 1024,
          values: new Float64Array(1024).fill(b),
          laneStride: 1024,
          timeStamps: undefined,
          passThrough: undefined,
          rejected: [0],
        });
      }
      await writer.finish();
    };
    await expect(run()).rejects.toBe(full);
  });

  it('keeps 64-bit time stamps exactly as the time column', async () => {
    const stamps = Array.from({ length: frames }, (_, f) => 1_750_000_000_000_000n + BigInt(f) * 100_003n);
    const layout = {
      sample: 'int24be' as const,
      channels: 3,
      frameHeaderBytes: 8,
      timeStamp: { type: 'uint64le' as const },
    };
    const input = file('stamped.dat', encodeRecording(layout, [...codes], stamps));
    const out = outPath('stamped.parquet');
    await convert([
      input,
      '--from',
      'int24be',
      '--frame-header',
      '8',
      '--time-stamp',
      'uint64le',
      '--tick',
      '1e-9',
      '-o',
      out,
    ]);
    const rows = await duckRows(`SELECT time, "gusset-g2" FROM read_parquet('${out}')`);
    expect(rows.map((r) => r['time'])).toEqual(stamps);
    expectLane(
      rows.map((r) => r['gusset-g2'] as number | null),
      expected[1] as Float64Array,
      'gusset-g2',
    );
  });
});

describe('every input layout converts to the values of the int32 path, bit for bit', () => {
  // Codes of the example channels (24-bit converters) fit every stored type but 16-bit ones, which
  // get codes of their own; float types hold them exactly.
  it.each(sampleTypes.filter((s) => !s.includes('16')))('%s', async (sample) => {
    const layout = { sample, channels: 3, fileHeaderBytes: 3, frameHeaderBytes: 2, frameTrailerBytes: 1 };
    const unsigned = sample.startsWith('uint');
    // Unsigned types cannot hold the negative codes: shift by 2^23 (an offset-binary recording) and
    // compare against the int32 path of the same shifted codes.
    const stored = unsigned ? Array.from(codes, (c) => c + 2 ** 23) : [...codes];
    const input = file(`${sample}.dat`, encodeRecording(layout, stored));
    const int32 = file('ref.bin', int32le(stored));
    const args = ['--from', sample, '--file-header', '3', '--frame-header', '2', '--frame-trailer', '1'];
    const out = outPath(`${sample}.arrow`);
    const ref = outPath('ref.arrow');
    const io = memoryIo();
    expect(await runCli(['convert', exampleShown, input, ...args, '-o', out], io)).toBe(exitCodes.ok);
    expect(await runCli(['convert', exampleShown, int32, '-o', ref], memoryIo())).toBe(exitCodes.ok);
    const a = tableFromIPC(readFileSync(out));
    const b = tableFromIPC(readFileSync(ref));
    for (const c of channels) {
      const x = a.getChild(c.name)!;
      const y = b.getChild(c.name)!;
      for (let f = 0; f < frames; f++)
        expect(Object.is(x.get(f), y.get(f)), `${sample} ${c.name} ${f}`).toBe(true);
    }
  });

  it('unsigned 32-bit codes at and above 2^31 convert as unsigned (beyond the high rail), never as negative', async () => {
    const stored = [2 ** 31, 2 ** 32 - 1, 1000, 0, 0, 0, 3_000_000_000, 7, 7];
    const input = file('u32.dat', encodeRecording({ sample: 'uint32le', channels: 3 }, stored));
    const out = outPath('u32.csv');
    const io = memoryIo();
    expect(await runCli(['convert', exampleShown, input, '--from', 'uint32le', '-o', out], io)).toBe(
      exitCodes.ok,
    );
    // As unsigned they lie above the 24-bit converters' high rail: flagged at the high rail. Read
    // wrapped to int32 they would be -2147483648 and -1: the low rail and a valid code near zero.
    const rows = readFileSync(out, 'utf8')
      .trim()
      .split('\n')
      .slice(1)
      .map((l) => l.split(','));
    expect(rows[0]).toEqual(['NaN', 'NaN', String(channels[2]!.quantityFromCode(1000))]);
    expect(rows[2]?.[0]).toBe('NaN');
    expect(channels[1]!.convert(Float64Array.of(2 ** 32 - 1)).status.railHigh).toBe(1);
    expect(io.stderr.text()).toMatch(/clipped samples: 3 of 9/);
  });
});

describe('Arrow batches: the frame column', () => {
  it('counts frames across 2^32 (the low word wraps, the high word carries), by BigInt', async () => {
    const { createBatchBuilder } = await import('../src/data/arrowBatches.js');
    const columns = {
      channels: [{ name: 'a', unit: 'µε', quantity: 'strain' }],
      time: undefined,
      passThrough: [],
      metadata: {},
    };
    const builder = createBatchBuilder(columns, 4);
    const frames = (firstFrame: number): bigint[] => [
      ...(builder
        .batch({
          frames: 4,
          firstFrame,
          values: new Float64Array(4),
          laneStride: 4,
          timeStamps: undefined,
          passThrough: undefined,
          rejected: [0],
        })
        .getChildAt(0)!
        .toArray() as BigInt64Array),
    ];
    const expected = (first: number): bigint[] => [0n, 1n, 2n, 3n].map((k) => BigInt(first) + k);
    for (const first of [0, 2 ** 32 - 4, 2 ** 32 - 2, 2 ** 32, 2 ** 40 + 5, 2 ** 53 - 4])
      expect(frames(first)).toEqual(expected(first)); // exact
  });
});
