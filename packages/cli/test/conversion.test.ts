/**
 * The conversion machinery apart from the channel package: the CSV and raw writers, the number
 * text, the clip counter, and the pipeline (blocks, per-block temperature, atomic output) with
 * test-only pass-through channels. The command with real channels is in convertCommand.test.ts.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseColumnList } from '../src/commands/convert/runConvert.js';
import { createClipCounter, formatClipSummary } from '../src/data/clipCounter.js';
import {
  convertRecording,
  type ConvertedBlock,
  type ConvertingChannel,
} from '../src/data/convertRecording.js';
import { createCsvWriter } from '../src/data/createCsvWriter.js';
import { createRawWriter } from '../src/data/createRawWriter.js';
import { writeDigits } from '../src/data/numberText.js';
import { openCodeSource } from '../src/data/openCodeSource.js';
import { writeRecording } from '../src/data/openRecordingOutput.js';
import { streamSink, type OutputSink } from '../src/data/outputSink.js';
import type { RecordingColumns } from '../src/data/recordingColumns.js';
import { parseTimeWindow } from '../src/data/timeWindow.js';
import { caught } from './support/caught.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryStream } from './support/memoryIo.js';
import { passThroughChannel } from './support/passThroughConverter.js';

const { tmp, file, outPath } = useTestFiles('convert');
function collector(): OutputSink & { text: string; bytes: number[] } {
  const sink = {
    text: '',
    bytes: [] as number[],
    write(t: string | Uint8Array) {
      if (typeof t === 'string') sink.text += t;
      else {
        sink.text += new TextDecoder().decode(t);
        sink.bytes.push(...t);
      }
      return Promise.resolve();
    },
  };
  return sink;
}
const INT32_MAX = 2147483647;

/** Columns for channels named `names`, unit `N`. */
function columnsOf(names: readonly string[], extra: Partial<RecordingColumns> = {}): RecordingColumns {
  return {
    channels: names.map((name) => ({ name, unit: 'N', quantity: 'force' })),
    time: undefined,
    passThrough: [],
    metadata: {},
    ...extra,
  };
}

/** A block of lanes from frame-major rows. */
function blockOf(rows: readonly (readonly number[])[], extra: Partial<ConvertedBlock> = {}): ConvertedBlock {
  const channels = rows[0]?.length ?? 1;
  const stride = rows.length + 1; // lanes need not be packed
  const values = new Float64Array(stride * channels);
  rows.forEach((r, f) => r.forEach((v, j) => (values[j * stride + f] = v)));
  return {
    frames: rows.length,
    firstFrame: 0,
    values,
    laneStride: stride,
    timeStamps: undefined,
    passThrough: undefined,
    rejected: Array.from({ length: channels }, (_, j) => rows.filter((r) => Number.isNaN(r[j])).length),
    ...extra,
  };
}

describe('createCsvWriter', () => {
  it('writes a header with units, rows of lanes, NaN for flagged samples, −0 as 0', async () => {
    const sink = collector();
    const w = createCsvWriter(sink, columnsOf(['hook', 'trolley, aft']));
    await w.writeBlock(
      blockOf([
        [1.5, -2],
        [NaN, 4e-7],
      ]),
    );
    await w.writeBlock(blockOf([[-0, 3]]));
    await w.finish();
    expect(sink.text).toBe('hook (N),"trolley, aft (N)"\n1.5,-2\nNaN,4e-7\n0,3\n');
  });

  it('writes the time column exactly (64-bit stamps in full) and passed-through text quoted per RFC 4180', async () => {
    const sink = collector();
    const columns = columnsOf(['hook'], {
      time: { name: 'time', type: 'uint64le', secondsPerTick: 1e-6 },
      passThrough: ['note'],
    });
    const w = createCsvWriter(sink, columns);
    await w.writeBlock(
      blockOf([[1], [2]], {
        timeStamps: BigUint64Array.of(18446744073709551615n, 9007199254740993n),
        passThrough: [['a, "b"', 'plain']],
      }),
    );
    expect(sink.text).toBe(
      'time (ticks of 0.000001 s),note,hook (N)\n18446744073709551615,"a, ""b""",1\n9007199254740993,plain,2\n',
    );
  });

  it('writes the shortest text that reads back as the same double (property)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 50 }),
        async (xs) => {
          const sink = collector();
          const w = createCsvWriter(sink, columnsOf(['x']), { header: false });
          await w.writeBlock(blockOf(xs.map((x) => [x])));
          const back = sink.text.trimEnd().split('\n').map(Number);
          expect(back).toEqual(xs.map((x) => (Object.is(x, -0) ? 0 : x)));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('rounds to the requested significant digits', async () => {
    const sink = collector();
    const w = createCsvWriter(sink, columnsOf(['a', 'b', 'c']), { digits: 4, header: false });
    await w.writeBlock(blockOf([[Math.PI, 123456.7, NaN]]));
    expect(sink.text).toBe('3.142,123500,NaN\n');
  });

  it('writes just the header for an empty input, and rejects bad digits', async () => {
    const sink = collector();
    await createCsvWriter(sink, columnsOf(['strain'])).finish();
    expect(sink.text).toBe('strain (N)\n');
    expect(() => createCsvWriter(sink, columnsOf(['x']), { digits: 18 })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'digits',
      },
    );
  });
});

describe('writeDigits', () => {
  const text = (v: number, d: number): string => {
    const buf = new Uint8Array(40);
    return new TextDecoder().decode(buf.subarray(0, writeDigits(v, d, buf, 0)));
  };

  it('equals the language’s correctly rounded toPrecision, written shortest, for any double and digits (property)', () => {
    // Reference: ECMAScript Number.prototype.toPrecision (exact decimal rounding) and Number::toString.
    fc.assert(
      fc.property(
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.integer({ min: 1, max: 17 }),
        (v, d) => {
          expect(text(v, d)).toBe(String(Number(v.toPrecision(d))));
        },
      ),
      { numRuns: 20_000 },
    );
  });

  it('handles ties, carries, powers of ten and the notation thresholds', () => {
    const cases: [number, number][] = [
      [0.5, 1],
      [1.5, 1],
      [2.5, 1],
      [9.5, 1],
      [99.95, 3],
      [0.125, 2],
      [1e21, 3],
      [9.999999e20, 3],
      [1e-7, 2],
      [1.23e-6, 3],
      [-0.000001, 1],
      [123456789012345, 15],
      [0.1 + 0.2, 15],
      [5e-324, 3],
      [1.7976931348623157e308, 5],
      [1000, 2],
      [1e22, 1],
      [1e-22, 4],
      [4.35, 2],
      [-2.675, 3],
    ];
    for (const [v, d] of cases) expect(text(v, d), `${v} to ${d}`).toBe(String(Number(v.toPrecision(d))));
  });
});

describe('createRawWriter', () => {
  it('interleaves lanes into frames, in each value type and byte order (checked with DataView)', async () => {
    const rows = [
      [1.5, -2, Math.PI],
      [NaN, 1e-300, 3e38],
    ];
    for (const format of ['float32le', 'float32be', 'float64le', 'float64be'] as const) {
      const sink = collector();
      await createRawWriter(sink, format, 3, 8).writeBlock(blockOf(rows));
      const bytes = Uint8Array.from(sink.bytes);
      const view = new DataView(bytes.buffer);
      const size = format.startsWith('float64') ? 8 : 4;
      const little = format.endsWith('le');
      expect(bytes.length).toBe(6 * size);
      rows.flat().forEach((v, i) => {
        const got = size === 8 ? view.getFloat64(i * 8, little) : view.getFloat32(i * 4, little);
        const want = size === 8 ? v : Math.fround(v); // float32: round to nearest, ties to even
        if (Number.isNaN(want)) expect(got).toBeNaN();
        else expect(got).toBe(want);
      });
    }
  });
});

describe('clip counter', () => {
  it('counts NaN samples per lane with first and last frame', () => {
    const c = createClipCounter(2);
    c.add(Float64Array.of(1, 2, 0, NaN, 3, 0), 3, 2, 0, [0, 1]); // lanes [1, 2] and [NaN, 3]
    c.add(Float64Array.of(NaN, 5, NaN, NaN), 2, 2, 2, [1, 2]);
    expect(c.summary()).toEqual({
      frames: 4,
      channels: 2,
      clipped: 4,
      perChannel: [
        { clipped: 1, firstFrame: 2, lastFrame: 2 },
        { clipped: 3, firstFrame: 0, lastFrame: 3 },
      ],
    });
    expect(formatClipSummary(c.summary(), ['hook', 'trolley'])).toBe(
      'clipped samples: 4 of 8 (50.0 %)\n  hook: 1, frame 2\n  trolley: 3, frames 0 to 3\n',
    );
    expect(formatClipSummary(createClipCounter(1).summary())).toBe('clipped samples: none of 0\n');
  });

  it('stops on a converter whose count disagrees with its output, or that returns ±Infinity', () => {
    const c = createClipCounter(1);
    expect(() => c.add(Float64Array.of(NaN, 1), 2, 2, 0, [0])).toThrow(
      /reported 0 clipped samples of channel 1 .* but 1 are NaN/,
    );
    expect(() => c.add(Float64Array.of(Infinity), 1, 1, 0, [0])).toThrowBridgeworkError('model-not-finite', {
      param: 'values',
    });
    expect(() => c.add(new Float64Array(1), 2, 2, 0, [0])).toThrowBridgeworkError('invalid-shape', {
      param: 'values',
    });
  });
});

describe('convertRecording (with test-only pass-through channels)', () => {
  it('converts a raw interleaved file to CSV, flagging rail codes as NaN', async () => {
    const codes = [0, 1, INT32_MAX, -5, -2147483648, 7, 8, 9];
    const source = await openCodeSource(file('hook.bin', int32le(codes)), { channels: 2, blockFrames: 3 });
    const output = outPath('hook.csv');
    const channels = [passThroughChannel('hook', [INT32_MAX, -2147483648]), passThroughChannel('trolley')];
    const result = await writeRecording(
      {
        format: 'csv',
        output,
        stdout: memoryStream(),
        columns: columnsOf(['hook', 'trolley']),
        blockFrames: 3,
      },
      (writer) => convertRecording({ source, channels, writer }),
    );
    expect(readFileSync(output, 'utf8')).toBe('hook (N),trolley (N)\n0,1\nNaN,-5\nNaN,7\n8,9\n');
    expect(result.frames).toBe(4);
    expect(result.clip.perChannel.map((c) => c.clipped)).toEqual([2, 0]);
  });

  it('writes to a stream when no output file is given', async () => {
    const source = await openCodeSource(file('log.csv', 'time,code\n0,10\n1,-20\n'), { columns: ['code'] });
    const stdout = memoryStream();
    await writeRecording(
      {
        format: 'csv',
        output: undefined,
        stdout,
        columns: columnsOf(['code'], { passThrough: source.passThroughNames }),
        blockFrames: source.blockFrames,
      },
      (writer) => convertRecording({ source, channels: [passThroughChannel()], writer }),
    );
    expect(stdout.text()).toBe('time,code (N)\n0,10\n1,-20\n');
  });

  it('refuses binary formats on a terminal', async () => {
    const tty = { ...memoryStream(), isTTY: true };
    expect(
      await caught(
        writeRecording(
          { format: 'parquet', output: undefined, stdout: tty, columns: columnsOf(['x']), blockFrames: 4 },
          async () => undefined,
        ),
      ),
    ).toThrowBridgeworkError('invalid-option', { param: '--to' });
  });

  it('leaves no output file (and no temporary file) when the input fails mid-way', async () => {
    const rows = Array.from({ length: 5000 }, (_, i) => String(i));
    rows[4321] = 'oops';
    const source = await openCodeSource(file('bad.csv', `code\n${rows.join('\n')}\n`), { blockFrames: 100 });
    const output = outPath('never.csv');
    const before = readdirSync(tmp()).length;
    await expect(
      writeRecording(
        { format: 'csv', output, stdout: memoryStream(), columns: columnsOf(['code']), blockFrames: 100 },
        (writer) => convertRecording({ source, channels: [passThroughChannel()], writer }),
      ),
    ).rejects.toThrow(/:4323: column 1 \(code\): 'oops'/);
    expect(existsSync(output)).toBe(false);
    expect(readdirSync(tmp()).length).toBe(before);
  });

  it('refuses an existing output before reading anything; with force replaces it, reporting progress', async () => {
    const source = await openCodeSource(file('c.bin', int32le([1, 2, 3, 4])), {
      channels: 1,
      blockFrames: 2,
    });
    const output = file('exists.csv', 'keep me');
    const progress: number[] = [];
    const run = (force: boolean) =>
      writeRecording(
        { format: 'csv', output, force, stdout: memoryStream(), columns: columnsOf(['c']), blockFrames: 2 },
        (writer) =>
          convertRecording({
            source,
            channels: [passThroughChannel()],
            writer,
            onBlock: (b) => progress.push(b.bytesRead),
          }),
      );
    expect(await caught(run(false))).toThrowBridgeworkError('file-exists');
    expect(readFileSync(output, 'utf8')).toBe('keep me');
    expect(progress).toEqual([]);
    await run(true);
    expect(readFileSync(output, 'utf8')).toBe('c (N)\n1\n2\n3\n4\n');
    expect(progress).toEqual([8, 16]);
  });

  it('converts corrected lanes at each block’s mean temperature, and flags blocks without one', async () => {
    // Lane 0 is the "temperature" (its codes are its values); lane 1 is corrected, lane 2 is not.
    const frames = [
      [20, 1, 1],
      [22, 2, 2],
      [NaN, 3, 3], // a flagged temperature sample is left out of the mean
      [30, 4, 4],
      [NaN, 5, 5], // a block of only flagged temperatures: no temperature
      [NaN, 6, 6],
    ];
    const rail = 999;
    const codes = frames.flat().map((v) => (Number.isNaN(v) ? rail : v));
    const source = await openCodeSource(file('t.bin', int32le(codes)), { channels: 3, blockFrames: 2 });
    const temperature = passThroughChannel('temp', [rail]);
    const strain = passThroughChannel('strain');
    const other = passThroughChannel('other');
    const sink = collector();
    const result = await convertRecording({
      source,
      channels: [temperature, strain, other],
      temperature: { from: 0, corrects: [1] },
      writer: createCsvWriter(sink, columnsOf(['temp', 'strain', 'other']), { header: false }),
    });
    // Hand computation: block means (20 + 22)/2 = 21, (30)/1 = 30, none.
    expect(strain.temperatures).toEqual([21, 30]);
    expect(other.temperatures).toEqual([undefined, undefined, undefined]);
    expect(result.blockTemperatures).toEqual([21, 30, NaN]);
    expect(result.temperatureGaps).toEqual({ frames: 2, firstFrame: 4, lastFrame: 5 });
    expect(sink.text).toBe('20,1,1\n22,2,2\nNaN,3,3\n30,4,4\nNaN,NaN,5\nNaN,NaN,6\n');
  });

  it('multiplies by the display factors, and checks the channel count', async () => {
    const source = await openCodeSource(file('f.bin', int32le([1000, 3])), { channels: 2 });
    const sink = collector();
    await convertRecording({
      source,
      channels: [passThroughChannel('a'), passThroughChannel('b')],
      factors: [1e-3, 1e6],
      writer: createCsvWriter(sink, columnsOf(['a', 'b']), { header: false }),
    });
    expect(sink.text).toBe('1,3000000\n');
    const one: ConvertingChannel[] = [passThroughChannel()];
    expect(
      await caught(
        convertRecording({ source, channels: one, writer: createCsvWriter(sink, columnsOf(['a'])) }),
      ),
    ).toThrowBridgeworkError('invalid-shape', { param: 'channels' });
  });

  it('waits for drain when a stream is full', async () => {
    const events: string[] = [];
    let drain: (() => void) | undefined;
    const stream = {
      write: (t: string) => {
        events.push(`write ${t.trim()}`);
        return false;
      },
      once: (_e: 'drain', l: () => void) => {
        drain = l;
      },
    };
    const pending = streamSink(stream)
      .write('a\n')
      .then(() => events.push('resolved'));
    await Promise.resolve();
    expect(events).toEqual(['write a']);
    drain?.();
    await pending;
    expect(events).toEqual(['write a', 'resolved']);
  });
});

describe('option helpers', () => {
  it('parses --columns lists', () => {
    expect(parseColumnList('2, hook ,10')).toEqual([2, 'hook', 10]);
    expect(() => parseColumnList('a,,b')).toThrowBridgeworkError('invalid-option', { param: '--columns' });
  });

  it('parses time windows in seconds, ms, min and h', () => {
    expect(parseTimeWindow('10', '--zero-window')).toEqual({ startSeconds: 0, endSeconds: 10 });
    expect(parseTimeWindow('2min..3min', '--zero-window')).toEqual({ startSeconds: 120, endSeconds: 180 });
    expect(parseTimeWindow('500ms', '--zero-window')).toEqual({ startSeconds: 0, endSeconds: 0.5 });
    expect(parseTimeWindow('1h..1.5h', '--zero-window')).toEqual({ startSeconds: 3600, endSeconds: 5400 });
    for (const bad of ['', 'ten', '5..2', '1..2..3', '-1', '3 days'])
      expect(() => parseTimeWindow(bad, '--zero-window'), bad).toThrowBridgeworkError('invalid-option', {
        param: '--zero-window',
      });
  });
});
