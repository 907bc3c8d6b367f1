import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { CodeSource } from '../src/data/codeSource.js';
import { codeFormatFromPath, openCodeSource } from '../src/data/openCodeSource.js';
import { openCsvCodes } from '../src/data/readCsvCodes.js';
import { decodeInt32LittleEndian, openInt32Codes } from '../src/data/readInt32Codes.js';
import { parseInt32Text, splitCsvLine } from '../src/internal/csvText.js';
import { caught } from './support/caught.js';
import { int32le, useTestFiles } from './support/files.js';

const { tmp, file } = useTestFiles('codes');

/** Everything a source yields, copied (blocks are reused), with the block sizes. */
async function drain(source: CodeSource): Promise<{ codes: number[]; frames: number[]; first: number[] }> {
  const codes: number[] = [];
  const frames: number[] = [];
  const first: number[] = [];
  for await (const b of source.blocks()) {
    expect(b.codes.length).toBe(b.frames * source.channels);
    codes.push(...b.codes);
    frames.push(b.frames);
    first.push(b.firstFrame);
  }
  return { codes, frames, first };
}

describe('raw little-endian int32 files', () => {
  it('decodes the extremes and signs like DataView (bytes written by hand)', () => {
    // -1 = FF FF FF FF; INT32_MIN = 00 00 00 80; INT32_MAX = FF FF FF 7F; 0x01020304 = 04 03 02 01.
    const bytes = Uint8Array.of(0xff, 0xff, 0xff, 0xff, 0, 0, 0, 0x80, 0xff, 0xff, 0xff, 0x7f, 4, 3, 2, 1);
    const out = new Int32Array(4);
    decodeInt32LittleEndian(bytes, out, 4);
    expect([...out]).toEqual([-1, -2147483648, 2147483647, 0x01020304]);
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
      /holds 28 bytes, which is not a whole number of frames of 2 channels × 4 bytes \(8 bytes per frame\)/,
    );
  });

  it('rejects bad channel counts and block sizes, and missing files', async () => {
    const path = file('ok.bin', new Uint8Array(8));
    expect(await caught(openInt32Codes(path, { channels: 0 }))).toThrowBridgeworkError('out-of-range', {
      param: 'channels',
    });
    expect(await caught(openInt32Codes(path, { channels: 1.5 }))).toThrowBridgeworkError('not-integer', {
      param: 'channels',
    });
    expect(await caught(openInt32Codes(path, { channels: 1, blockFrames: 0 }))).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'blockFrames',
      },
    );
    expect(await caught(openInt32Codes(path, { channels: 64, blockFrames: 2 ** 20 }))).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'blockFrames',
      },
    );
    expect(await caught(openInt32Codes(join(tmp(), 'missing.bin'), { channels: 1 }))).toThrowBridgeworkError(
      'io-error',
    );
    await expect(openInt32Codes(join(tmp(), 'missing.bin'), { channels: 1 })).rejects.toThrow(
      /cannot read .*missing\.bin: no such file/,
    );
    expect(await caught(openInt32Codes(tmp(), { channels: 1 }))).toThrowBridgeworkError('io-error');
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

  it('names file, line and column for a bad code (and accepts the int32 extremes)', async () => {
    const path = file('bad.csv', 'hook,load\n1,2\n3,-2147483648\n5,12.5\n');
    const source = await openCsvCodes(path);
    await expect(drain(source)).rejects.toThrow(
      `${path}:4: column 2 (load): '12.5' is not a 32-bit integer code`,
    );
    await expect(drain(await openCsvCodes(file('big.csv', '2147483648\n')))).rejects.toThrow(
      /'2147483648' is not a 32-bit integer code/,
    );
    await expect(drain(await openCsvCodes(file('w.csv', '1,2\n3\n')))).rejects.toThrow(
      /:2: expected 2 fields, got 1/,
    );
  });

  it('skips unselected columns unread', async () => {
    const source = await openCsvCodes(file('skip.csv', 'time,code\n0.001,5\nn/a,6\n'), { columns: ['code'] });
    expect((await drain(source)).codes).toEqual([5, 6]);
  });

  it('rejects an empty file, a mixed first line, unknown or repeated columns', async () => {
    const empty = file('e.csv', '\n\n');
    expect(await caught(openCsvCodes(empty))).toThrowBridgeworkError('parse-error', { param: empty });
    await expect(openCsvCodes(file('m.csv', 'hook,12\n1,2\n'))).rejects.toThrow(
      /:1: the first line mixes names and numbers/,
    );
    await expect(openCsvCodes(file('u.csv', 'a,b\n1,2\n'), { columns: ['c'] })).rejects.toThrow(
      /there is no column 'c'; the header names 'a', 'b'/,
    );
    await expect(openCsvCodes(file('n.csv', '1,2\n'), { columns: ['a'] })).rejects.toThrow(
      /has no header line/,
    );
    await expect(openCsvCodes(file('k.csv', '1,2\n'), { columns: [3] })).rejects.toThrow(
      /there is no column 3; the file has 2 columns/,
    );
    expect(
      await caught(openCsvCodes(file('d.csv', 'a,b\n1,2\n'), { columns: ['a', 1] })),
    ).toThrowBridgeworkError('invalid-option', {
      param: 'columns',
    });
  });

  it('rejects text that is not UTF-8', async () => {
    const path = file('latin1.csv', Uint8Array.of(0x61, 0x0a, 0x31, 0xe9, 0x0a));
    await expect(drain(await openCsvCodes(path))).rejects.toThrow(/not valid UTF-8/);
  });
});

describe('helpers', () => {
  it('parseInt32Text accepts exactly the decimal int32 range', () => {
    expect(parseInt32Text(' -2147483648 ')).toBe(-2147483648);
    expect(parseInt32Text('+2147483647')).toBe(2147483647);
    expect(parseInt32Text('-0')).toBe(0);
    for (const bad of ['', '-', '2147483648', '-2147483649', '1e3', '0x10', '1.0', '1 2', '١٢'])
      expect(parseInt32Text(bad), bad).toBeUndefined();
    fc.assert(
      fc.property(fc.integer({ min: -2147483648, max: 2147483647 }), (v) => {
        expect(parseInt32Text(String(v))).toBe(v);
      }),
    );
  });

  it('splitCsvLine splits plain and quoted fields', () => {
    expect(splitCsvLine('a, "b,c" ,d', ',')).toEqual(['a', 'b,c', 'd']);
    expect(splitCsvLine('x', undefined)).toEqual(['x']);
    expect(splitCsvLine('1,,2', ',')).toEqual(['1', '', '2']);
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
