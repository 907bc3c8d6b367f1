import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { CodeSource } from '../src/data/codeSource.js';
import { codeFormatFromPath, openCodeSource } from '../src/data/openCodeSource.js';
import { openCsvCodes } from '../src/data/readCsvCodes.js';
import { openRawCodes } from '../src/data/readRawCodes.js';
import { sampleTypes, timeStampTypes, type SampleType } from '../src/data/recordingLayout.js';
import { CsvRecordReader } from '../src/internal/csvRecords.js';
import { parseCodeText } from '../src/internal/csvText.js';
import { caught } from './support/caught.js';
import { codeRange, encodeRecording } from './support/encodeRecording.js';
import { int32le, useTestFiles } from './support/files.js';

const { tmp, file } = useTestFiles('codes');

const openInt32Codes = (path: string, options: { channels: number; blockFrames?: number }) =>
  openRawCodes(path, { sample: 'int32le', ...options });

/**
 * Everything a source yields, copied (blocks are reused) and put back in frame-major order, with
 * the block sizes, time stamps and kept texts.
 */
async function drain(source: CodeSource): Promise<{
  codes: number[];
  frames: number[];
  first: number[];
  stamps: (number | bigint)[];
  kept: string[][];
}> {
  const codes: number[] = [];
  const frames: number[] = [];
  const first: number[] = [];
  const stamps: (number | bigint)[] = [];
  const kept: string[][] = [];
  for await (const b of source.blocks()) {
    expect(b.codes.length).toBe(b.laneStride * source.channels);
    for (let f = 0; f < b.frames; f++) {
      for (let j = 0; j < source.channels; j++) codes.push(b.codes[j * b.laneStride + f] as number);
      if (b.timeStamps !== undefined) stamps.push(b.timeStamps[f] as number | bigint);
      if (b.passThrough !== undefined) kept.push(b.passThrough.map((c) => c[f] as string));
    }
    frames.push(b.frames);
    first.push(b.firstFrame);
  }
  return { codes, frames, first, stamps, kept };
}

describe('raw little-endian int32 files', () => {
  it('decodes the extremes and signs (bytes written by hand)', async () => {
    // -1 = FF FF FF FF; INT32_MIN = 00 00 00 80; INT32_MAX = FF FF FF 7F; 0x01020304 = 04 03 02 01.
    const bytes = Uint8Array.of(0xff, 0xff, 0xff, 0xff, 0, 0, 0, 0x80, 0xff, 0xff, 0xff, 0x7f, 4, 3, 2, 1);
    const r = await drain(await openInt32Codes(file('hand.bin', bytes), { channels: 2 }));
    expect(r.codes).toEqual([-1, -2147483648, 2147483647, 0x01020304]);
  });

  it('reads interleaved frames in blocks, with a short last block', async () => {
    const values = Array.from({ length: 30 }, (_, i) => (i % 2 === 0 ? i * 1000 : -i * 7919));
    const source = await openInt32Codes(file('codes.bin', int32le(values)), { channels: 3, blockFrames: 4 });
    expect([source.channels, source.totalFrames, source.totalBytes, source.format]).toEqual([
      3,
      10,
      120,
      'int32le',
    ]);
    const r = await drain(source);
    expect(r.codes).toEqual(values);
    expect(r.frames).toEqual([4, 4, 2]);
    expect(r.first).toEqual([0, 4, 8]);
  });

  it('round-trips any int32 codes for any block size (property)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.integer({ min: -2147483648, max: 2147483647 }), { maxLength: 60 }),
        fc.integer({ min: 1, max: 4 }),
        fc.integer({ min: 1, max: 9 }),
        async (raw, channels, blockFrames) => {
          const values = raw.slice(0, raw.length - (raw.length % channels));
          const source = await openInt32Codes(file('p.bin', int32le(values)), { channels, blockFrames });
          expect((await drain(source)).codes).toEqual(values);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('an empty file is zero frames', async () => {
    const source = await openInt32Codes(file('empty.bin', new Uint8Array()), { channels: 2 });
    expect((await drain(source)).frames).toEqual([]);
  });

  it('rejects a size that is not a whole number of frames, before reading', async () => {
    const path = file('odd.bin', new Uint8Array(4 * 7 + 2));
    expect(await caught(openInt32Codes(path, { channels: 1 }))).toThrowBridgeworkError('parse-error', {
      param: path,
    });
    await expect(openInt32Codes(file('seven.bin', new Uint8Array(28)), { channels: 2 })).rejects.toThrow(
      /holds 28 bytes: after the file header of 0 bytes that is not a whole number of frames of 8 bytes \(0 header \+ 2 channels × 4 bytes int32le \+ 0 trailer\)/,
    );
  });

  it('rejects bad channel counts and block sizes, missing files and folders, with the reason in words', async () => {
    const path = file('ok.bin', new Uint8Array(8));
    expect(await caught(openInt32Codes(path, { channels: 0 }))).toThrowBridgeworkError('out-of-range', {
      param: 'layout.channels',
    });
    expect(await caught(openInt32Codes(path, { channels: 1.5 }))).toThrowBridgeworkError('not-integer', {
      param: 'layout.channels',
    });
    expect(await caught(openInt32Codes(path, { channels: 1, blockFrames: 0 }))).toThrowBridgeworkError(
      'out-of-range',
      { param: 'blockFrames' },
    );
    expect(await caught(openInt32Codes(path, { channels: 64, blockFrames: 2 ** 20 }))).toThrowBridgeworkError(
      'out-of-range',
      { param: 'blockFrames' },
    );
    expect(await caught(openInt32Codes(join(tmp(), 'missing.bin'), { channels: 1 }))).toThrowBridgeworkError(
      'io-error',
    );
    await expect(openInt32Codes(join(tmp(), 'missing.bin'), { channels: 1 })).rejects.toThrow(
      /cannot read .*missing\.bin: no such file/,
    );
    await expect(openInt32Codes(tmp(), { channels: 1 })).rejects.toThrow(/cannot read .*: it is a folder/);
    // Issue 15 item 17: a file used as a folder names the path and says so in words (not ENOTDIR).
    await expect(openInt32Codes(join(path, 'inner.bin'), { channels: 1 })).rejects.toThrow(
      /cannot read .*ok\.bin\/inner\.bin: a part of the path is a file, not a folder/,
    );
  });

  it('refuses a kernel file that reports no size but holds data (/proc)', async () => {
    await expect(openInt32Codes('/proc/self/status', { channels: 1 })).rejects.toThrow(
      /cannot read \/proc\/self\/status: it reports a size of 0 bytes but holds data/,
    );
  });
});

describe('raw recordings of every stored type and frame layout', () => {
  /** Codes that cover a type's range: both ends, zero, and values with every byte set. */
  function codesFor(sample: SampleType, count: number): number[] {
    const { min, max } = codeRange(sample);
    const out = [min, max, 0, min + 1, max - 1, Math.trunc(max / 3), Math.trunc(min / 7) - 5].filter(
      (c) => c >= min && c <= max,
    );
    for (let i = 0; out.length < count; i++) {
      const x = ((Math.imul(i + 1, 2654435761) >>> 0) / 2 ** 32) * (max - min) + min;
      out.push(sample.startsWith('float') && i % 3 === 0 ? x + 0.25 : Math.round(x));
    }
    return sample.startsWith('float32') ? out.map((c) => Math.fround(c)) : out;
  }

  it.each(sampleTypes)('%s: codes, time stamps and skipped bytes read back exactly', async (sample) => {
    const channels = 3;
    const codes = codesFor(sample, channels * 13).slice(0, channels * 13);
    const stamps = Array.from(
      { length: 13 },
      (_, f) => BigInt(f) * 1_000_000_007n + 1_700_000_000_000_000_000n,
    );
    const layout = {
      sample,
      channels,
      fileHeaderBytes: 5,
      frameHeaderBytes: 11,
      frameTrailerBytes: 2,
      timeStamp: { type: 'uint64be' as const, offsetBytes: 3 },
    };
    const path = file(`${sample}.bin`, encodeRecording(layout, codes, stamps));
    const source = await openRawCodes(path, { ...layout, blockFrames: 4 });
    expect(source.totalFrames).toBe(13);
    expect(source.timeColumn).toEqual({ name: 'time', type: 'uint64be' });
    const r = await drain(source);
    expect(r.codes).toEqual(codes);
    expect(r.stamps).toEqual(stamps);
    expect(r.frames).toEqual([4, 4, 4, 1]);
  });

  it('reads unsigned 32-bit codes at and above 2^31 as unsigned, never as negative codes', async () => {
    const codes = [2 ** 31, 2 ** 32 - 1, 2 ** 31 - 1, 0, 3_000_000_000];
    for (const sample of ['uint32le', 'uint32be'] as const) {
      const path = file('u32.bin', encodeRecording({ sample, channels: 1 }, codes));
      const r = await drain(await openRawCodes(path, { sample, channels: 1 }));
      expect(r.codes).toEqual(codes);
      expect(r.codes.every((c) => c >= 0)).toBe(true);
    }
  });

  it.each(timeStampTypes)('time stamps of type %s read back exactly', async (type) => {
    const values: (number | bigint)[] = type.startsWith('uint32')
      ? [0, 1, 2 ** 32 - 1, 123_456_789]
      : type.startsWith('int64')
        ? [-(2n ** 63n), 2n ** 63n - 1n, 0n, -5n]
        : type.startsWith('uint64')
          ? [0n, 2n ** 64n - 1n, 2n ** 63n, 9_007_199_254_740_993n]
          : [0, -1.5, 1e-300, 1.7e308];
    const layout = { sample: 'int16le' as const, channels: 1, frameHeaderBytes: 8, timeStamp: { type } };
    const codes = [1, -2, 3, -4];
    const r = await drain(await openRawCodes(file('ts.bin', encodeRecording(layout, codes, values)), layout));
    expect(r.stamps).toEqual(values);
    expect(r.codes).toEqual(codes);
  });

  it('round-trips codes with any frame layout and block size (property)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom<SampleType>('int24le', 'int24be', 'uint24le', 'uint24be', 'int16be', 'uint32be'),
        fc.integer({ min: 1, max: 4 }),
        fc.integer({ min: 0, max: 6 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 1, max: 7 }),
        fc.integer({ min: 0, max: 20 }),
        async (sample, channels, frameHeaderBytes, frameTrailerBytes, blockFrames, frames) => {
          const { min, max } = codeRange(sample);
          const codes = Array.from({ length: frames * channels }, (_, i) =>
            Math.round(min + ((max - min) * ((Math.imul(i + 7, 40503) >>> 0) % 65536)) / 65535),
          );
          const layout = { sample, channels, frameHeaderBytes, frameTrailerBytes };
          const path = file('p24.bin', encodeRecording(layout, codes));
          expect((await drain(await openRawCodes(path, { ...layout, blockFrames }))).codes).toEqual(codes);
        },
      ),
      { numRuns: 80 },
    );
  });

  it('rejects a time stamp outside the frame header, unknown layout keys and unknown types', async () => {
    const path = file('x.bin', new Uint8Array(16));
    const stampTooBig = openRawCodes(path, {
      sample: 'int32le',
      channels: 1,
      frameHeaderBytes: 4,
      timeStamp: { type: 'uint64le' },
    });
    expect(await caught(stampTooBig)).toThrowBridgeworkError('invalid-shape', {
      param: 'layout.frameHeaderBytes',
    });
    expect(
      await caught(openRawCodes(path, { sample: 'int32le', channels: 1, frameHeader: 4 } as never)),
    ).toThrowBridgeworkError('unknown-option', { param: 'layout.frameHeader' });
    expect(
      await caught(openRawCodes(path, { sample: 'int12le', channels: 1 } as never)),
    ).toThrowBridgeworkError('invalid-option', { param: 'layout.sample' });
  });
});

describe('CSV code files', () => {
  it('reads a header and several columns, selected by name or number, in the order given', async () => {
    const path = file('log.csv', 'time,hook,trolley\n0.00,100,-5\n0.01,101,-6\n0.02,102,-7\n');
    const byName = await openCsvCodes(path, { columns: ['trolley', 'hook'] });
    expect(byName.columnNames).toEqual(['trolley', 'hook']);
    expect((await drain(byName)).codes).toEqual([-5, 100, -6, 101, -7, 102]);
    const byNumber = await openCsvCodes(path, { columns: [2] });
    expect((await drain(byNumber)).codes).toEqual([100, 101, 102]);
  });

  it('reads a file without header, with CRLF, a BOM, blank lines and spaces', async () => {
    const path = file('plain.csv', '\uFEFF 12 , -3\r\n\r\n13,-4\r\n  \n14 ,-5');
    const source = await openCsvCodes(path);
    expect(source.columnNames).toBeUndefined();
    expect(source.channels).toBe(2);
    expect((await drain(source)).codes).toEqual([12, -3, 13, -4, 14, -5]);
  });

  it('detects tab and semicolon delimiters, and single-column files', async () => {
    expect((await drain(await openCsvCodes(file('t.csv', 'a\tb\n1\t2\n')))).codes).toEqual([1, 2]);
    expect((await drain(await openCsvCodes(file('s.csv', 'a;b\n1;2\n')))).codes).toEqual([1, 2]);
    expect((await drain(await openCsvCodes(file('one.csv', 'code\n7\n-8\n')))).codes).toEqual([7, -8]);
  });

  it('reads quoted header names', async () => {
    const source = await openCsvCodes(file('q.csv', '"hook, north","say ""hi"""\n1,2\n'));
    expect(source.columnNames).toEqual(['hook, north', 'say "hi"']);
  });

  it('streams files larger than one read chunk, with lines split across chunks', async () => {
    const rows = Array.from({ length: 40_000 }, (_, i) => [i, 3 - i * 3, 2147483647 - i]);
    const path = file('big.csv', `a,b,c\n${rows.map((r) => r.join(',')).join('\n')}\n`);
    const source = await openCsvCodes(path, { blockFrames: 4096 });
    const r = await drain(source);
    const expected = rows.flat();
    expect(r.codes.length).toBe(expected.length);
    expect(r.codes.filter((c, i) => c !== expected[i]).length).toBe(0); // (a plain loop: toEqual is slow here)
    expect(r.frames.slice(0, 9)).toEqual(Array(9).fill(4096));
    expect(r.frames.reduce((a, b) => a + b)).toBe(40_000);
  });

  it('names file, line and column for a bad code (and accepts the 32-bit extremes, signed and unsigned)', async () => {
    const path = file('bad.csv', 'hook,load\n1,2\n3,-2147483648\n4,4294967295\n5,12.5\n');
    await expect(drain(await openCsvCodes(path))).rejects.toThrow(
      `${path}:5: column 2 (load): '12.5' is not an integer code (a whole number from −2^31 to 2^32 − 1)`,
    );
    await expect(drain(await openCsvCodes(file('big.csv', '4294967296\n')))).rejects.toThrow(
      /'4294967296' is not an integer code/,
    );
    expect((await drain(await openCsvCodes(file('u.csv', '2147483648\n4294967295\n')))).codes).toEqual([
      2 ** 31,
      2 ** 32 - 1,
    ]);
    await expect(drain(await openCsvCodes(file('w.csv', '1,2\n3\n')))).rejects.toThrow(
      /:2: expected 2 fields, got 1/,
    );
  });

  it('passes unselected columns through as text, and keeps a time column in seconds', async () => {
    const source = await openCsvCodes(file('skip.csv', 'time,code,note\n0.001,5,start\n0.002,6,"a, b"\n'), {
      columns: ['code'],
    });
    expect(source.passThroughNames).toEqual(['time', 'note']);
    const r = await drain(source);
    expect(r.codes).toEqual([5, 6]);
    expect(r.kept).toEqual([
      ['0.001', 'start'],
      ['0.002', 'a, b'],
    ]);
    const timed = await openCsvCodes(file('t.csv', 'time,code,note\n0.001,5,x\n1e-3,6,y\n'), {
      timeColumn: 'time',
      keep: 'none',
    });
    expect(timed.timeColumn).toEqual({ name: 'time', type: 'seconds' });
    expect(timed.channels).toBe(2); // 'code' and 'note'; but note holds no codes:
    await expect(drain(timed)).rejects.toThrow(/:2: column 3 \(note\): 'x' is not an integer code/);
    const r2 = await drain(
      await openCsvCodes(file('t2.csv', 'time,code,note\n0.001,5,x\n1e-3,6,y\n'), {
        timeColumn: 1,
        columns: [2],
      }),
    );
    expect(r2.stamps).toEqual([0.001, 0.001]);
    expect(r2.kept).toEqual([['x'], ['y']]);
    await expect(
      drain(await openCsvCodes(file('t3.csv', 't,c\n0,1\nlater,2\n'), { timeColumn: 't' })),
    ).rejects.toThrow(/:3: column 1 \(t\): 'later' is not a time in seconds/);
  });

  it('follows RFC 4180 in data rows: quoted codes, delimiters, quotes and line breaks inside quotes', async () => {
    // Issue 15 item 20: `2,"a, b",200` was "expected 3 fields, got 4", and a quoted "100" was rejected.
    const text =
      'id,note,code\r\n2,"a, b",200\r\n3,"say ""hi""","100"\r\n4,"two\r\nlines",-7\r\n5, "x" ,8\r\n';
    const r = await drain(await openCsvCodes(file('rfc.csv', text), { columns: ['code'] }));
    expect(r.codes).toEqual([200, 100, -7, 8]);
    expect(r.kept).toEqual([
      ['2', 'a, b'],
      ['3', 'say "hi"'],
      ['4', 'two\r\nlines'],
      ['5', 'x'],
    ]);
    await expect(drain(await openCsvCodes(file('open.csv', 'a,b\n1,"2\n')))).rejects.toThrow(
      /:2: a quoted field is not closed before the end of the file/,
    );
    await expect(drain(await openCsvCodes(file('after.csv', 'a,b\n1,"2"x\n')))).rejects.toThrow(
      /:2: text after a closing quote/,
    );
    await expect(drain(await openCsvCodes(file('inner.csv', 'a,b\n1,2"3\n')))).rejects.toThrow(
      /:2: a quote inside an unquoted field/,
    );
  });

  it('splits records the same whatever the chunking of the text (property)', () => {
    const rows = [
      ['1', 'a,b', 'x"y'],
      ['2', 'line\nbreak', ''],
      ['3', ' pad ', 'z'],
    ];
    const quote = (f: string): string => `"${f.replace(/"/g, '""')}"`;
    const text = rows.map((r) => r.map((f, k) => (k === 0 ? f : quote(f))).join(',')).join('\r\n');
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: text.length }), { maxLength: 6 }), (cuts) => {
        const points = [...new Set(cuts)].sort((a, b) => a - b);
        const reader = new CsvRecordReader(',');
        const got: string[][] = [];
        let from = 0;
        for (const p of [...points, text.length]) {
          got.push(...reader.push(text.slice(from, p)).map((r) => r.fields));
          from = p;
        }
        got.push(...reader.end().map((r) => r.fields));
        expect(got).toEqual(rows);
      }),
    );
  });

  it('rejects an empty file, unknown or repeated columns', async () => {
    const empty = file('e.csv', '\n\n');
    expect(await caught(openCsvCodes(empty))).toThrowBridgeworkError('parse-error', { param: empty });
    await expect(drain(await openCsvCodes(file('m.csv', 'hook,12\n1,2\n')))).rejects.toThrow(
      /:1: column 1: 'hook' is not an integer code/,
    );
    await expect(openCsvCodes(file('u.csv', 'a,b\n1,2\n'), { columns: ['c'] })).rejects.toThrow(
      /there is no column 'c' \(codes\); the header names 'a', 'b'/,
    );
    await expect(openCsvCodes(file('n.csv', '1,2\n'), { columns: ['a'] })).rejects.toThrow(
      /has no header line/,
    );
    await expect(openCsvCodes(file('k.csv', '1,2\n'), { columns: [3] })).rejects.toThrow(
      /there is no column 3 \(codes\); the file has 2 columns/,
    );
    expect(
      await caught(openCsvCodes(file('d.csv', 'a,b\n1,2\n'), { columns: ['a', 1] })),
    ).toThrowBridgeworkError('invalid-option', { param: 'columns' });
  });

  it('rejects text that is not UTF-8', async () => {
    const path = file('latin1.csv', Uint8Array.of(0x61, 0x0a, 0x31, 0xe9, 0x0a));
    await expect(drain(await openCsvCodes(path))).rejects.toThrow(/not valid UTF-8/);
  });
});

describe('helpers', () => {
  it('parseCodeText accepts exactly the decimal integers from −2^31 to 2^32 − 1', () => {
    expect(parseCodeText(' -2147483648 ')).toBe(-2147483648);
    expect(parseCodeText('+2147483647')).toBe(2147483647);
    expect(parseCodeText('4294967295')).toBe(4294967295);
    expect(parseCodeText('-0')).toBe(0);
    for (const bad of ['', '-', '4294967296', '-2147483649', '1e3', '0x10', '1.0', '1 2', '١٢'])
      expect(parseCodeText(bad), bad).toBeUndefined();
    fc.assert(
      fc.property(fc.integer({ min: -2147483648, max: 2147483647 }), (v) => {
        expect(parseCodeText(String(v))).toBe(v);
      }),
    );
  });

  it('chooses the format from the extension', async () => {
    expect(['a.csv', 'A.CSV', 'b.txt', 'c.bin', 'd.raw', 'e'].map(codeFormatFromPath)).toEqual([
      'csv',
      'csv',
      'csv',
      'int32le',
      'int32le',
      'int32le',
    ]);
    const raw = file('r.dat', int32le([1, 2]));
    expect(await caught(openCodeSource(raw))).toThrowBridgeworkError('missing-option', { param: 'channels' });
    expect((await drain(await openCodeSource(raw, { channels: 2 }))).codes).toEqual([1, 2]);
    expect((await openCodeSource(file('f.bin', '1,2\n'), { format: 'csv' })).channels).toBe(2);
  });
});
