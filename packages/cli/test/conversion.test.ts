import { existsSync, readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCommandLine } from '../src/args/parseCommandLine.js';
import { convertCommand, type ConvertArgs } from '../src/commands/convert/convertCommand.js';
import { createCommandContext } from '../src/commands/createCommandContext.js';
import { parseColumnList, runConversion } from '../src/commands/convert/runConversion.js';
import { createClipCounter, formatClipSummary } from '../src/data/clipCounter.js';
import { convertToCsv } from '../src/data/convertToCsv.js';
import { createCsvWriter } from '../src/data/createCsvWriter.js';
import { openCodeSource } from '../src/data/openCodeSource.js';
import { streamSink, type OutputSink } from '../src/data/outputSink.js';
import { caught } from './support/caught.js';
import { memoryIo, memoryStream } from './support/memoryIo.js';
import { passThroughConverter } from './support/passThroughConverter.js';
import { int32le, useTestFiles } from './support/files.js';

const { tmp, file, outPath } = useTestFiles('convert');
function collector(): OutputSink & { text: string } {
  const sink = {
    text: '',
    write(t: string | Uint8Array) {
      sink.text += typeof t === 'string' ? t : new TextDecoder().decode(t);
      return Promise.resolve();
    },
  };
  return sink;
}
const INT32_MIN = -2147483648;
const INT32_MAX = 2147483647;

describe('createCsvWriter', () => {
  it('writes a header, rows of interleaved values, NaN for flagged samples', async () => {
    const sink = collector();
    const w = createCsvWriter(sink, 2, { header: ['hook (N)', 'trolley, aft (N)'] });
    await w.writeBlock(Float64Array.of(1.5, -2, NaN, 4e-7, 99, 100), 2); // the third frame is not written
    await w.writeBlock(Float64Array.of(-0, 3), 1);
    await w.finish();
    expect(sink.text).toBe('hook (N),"trolley, aft (N)"\n1.5,-2\nNaN,4e-7\n0,3\n');
    expect(w.rows).toBe(3);
  });

  it('writes the shortest text that reads back as the same double (property)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 50 }),
        async (xs) => {
          const sink = collector();
          const w = createCsvWriter(sink, 1);
          await w.writeBlock(Float64Array.from(xs), xs.length);
          const back = sink.text.trimEnd().split('\n').map(Number);
          expect(back).toEqual(xs.map((x) => (Object.is(x, -0) ? 0 : x)));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('rounds to the requested significant digits', async () => {
    const sink = collector();
    const w = createCsvWriter(sink, 3, { digits: 4, nanText: '' });
    await w.writeBlock(Float64Array.of(Math.PI, 123456.7, NaN), 1);
    expect(sink.text).toBe('3.142,123500,\n');
  });

  it('writes just the header for an empty input, and rejects bad shapes', async () => {
    const sink = collector();
    await createCsvWriter(sink, 1, { header: ['strain'] }).finish();
    expect(sink.text).toBe('strain\n');
    expect(() => createCsvWriter(sink, 2, { header: ['one'] })).toThrowBridgeworkError('invalid-shape', {
      param: 'header',
    });
    expect(() => createCsvWriter(sink, 0)).toThrowBridgeworkError('out-of-range', { param: 'channels' });
    expect(() => createCsvWriter(sink, 1, { digits: 18 })).toThrowBridgeworkError('out-of-range', {
      param: 'digits',
    });
    const w = createCsvWriter(sink, 2);
    expect(await caught(w.writeBlock(new Float64Array(3), 2))).toThrowBridgeworkError('out-of-range', {
      param: 'frames',
    });
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

describe('clip counter', () => {
  it('counts NaN samples per channel with first and last frame', () => {
    const c = createClipCounter(2);
    c.add(Float64Array.of(1, NaN, 2, 3), 2, 0, { clipped: 1 });
    c.add(Float64Array.of(NaN, NaN, 5, NaN), 2, 2, { clipped: 3 });
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
    expect(() => c.add(Float64Array.of(NaN, 1), 2, 0, { clipped: 0 })).toThrow(
      /reported 0 clipped samples .* but 1 are NaN/,
    );
    expect(() => c.add(Float64Array.of(Infinity), 1, 0, { clipped: 0 })).toThrowBridgeworkError(
      'model-not-finite',
      { param: 'out' },
    );
    expect(() => c.add(new Float64Array(1), 2, 0, { clipped: 0 })).toThrowBridgeworkError('invalid-shape', {
      param: 'out',
    });
  });
});

describe('convertToCsv (with the test-only pass-through converter)', () => {
  it('converts a raw interleaved file to CSV, flagging rail codes as NaN', async () => {
    const codes = [0, 1, INT32_MAX, -5, INT32_MIN, 7, 8, 9];
    const source = await openCodeSource(file('hook.bin', int32le(codes)), { channels: 2, blockFrames: 3 });
    const output = outPath('hook.csv');
    const result = await convertToCsv({
      source,
      converter: passThroughConverter([INT32_MIN, INT32_MAX]),
      output,
      header: ['hook (code)', 'trolley (code)'],
    });
    expect(readFileSync(output, 'utf8')).toBe('hook (code),trolley (code)\n0,1\nNaN,-5\nNaN,7\n8,9\n');
    expect(result.frames).toBe(4);
    expect(result.clip.perChannel.map((c) => c.clipped)).toEqual([2, 0]);
  });

  it('converts a CSV file and writes to a stream when no output file is given', async () => {
    const source = await openCodeSource(file('log.csv', 'time,code\n0,10\n1,-20\n'), { columns: ['code'] });
    const stdout = memoryStream();
    await convertToCsv({
      source,
      converter: passThroughConverter(),
      output: undefined,
      stdout,
      header: ['code'],
    });
    expect(stdout.text()).toBe('code\n10\n-20\n');
  });

  it('leaves no output file when the input fails mid-way', async () => {
    const rows = Array.from({ length: 5000 }, (_, i) => String(i));
    rows[4321] = 'oops';
    const source = await openCodeSource(file('bad.csv', `code\n${rows.join('\n')}\n`), { blockFrames: 100 });
    const output = outPath('never.csv');
    const before = readdirSync(tmp()).length;
    await expect(convertToCsv({ source, converter: passThroughConverter(), output })).rejects.toThrow(
      /:4323: column 1 \(code\): 'oops'/,
    );
    expect(existsSync(output)).toBe(false);
    expect(readdirSync(tmp()).length).toBe(before); // no temporary file either
  });

  it('refuses an existing output before reading anything, and reports progress', async () => {
    const source = await openCodeSource(file('c.bin', int32le([1, 2, 3, 4])), {
      channels: 1,
      blockFrames: 2,
    });
    const output = file('exists.csv', 'keep me');
    const progress: number[] = [];
    const sink = { update: (d: number) => progress.push(d), finish: () => progress.push(-1) };
    expect(
      await caught(convertToCsv({ source, converter: passThroughConverter(), output, progress: sink })),
    ).toThrowBridgeworkError('file-exists');
    expect(readFileSync(output, 'utf8')).toBe('keep me');
    expect(progress).toEqual([-1]);
    await convertToCsv({ source, converter: passThroughConverter(), output, force: true, progress: sink });
    expect(readFileSync(output, 'utf8')).toBe('1\n2\n3\n4\n');
    expect(progress).toEqual([-1, 8, 16, -1]);
  });
});

describe('runConversion (the body of convert once the channels are known)', () => {
  const parse = (...argv: string[]): ConvertArgs => {
    const r = parseCommandLine(convertCommand, argv);
    if (r.help) throw new Error('help');
    return r;
  };
  const channels = { columns: ['hook (code)'], converter: passThroughConverter([INT32_MAX]) };

  it('converts, prints the clipped-sample summary and returns 0', async () => {
    const io = memoryIo();
    const input = file('h.bin', int32le([5, INT32_MAX, 6]));
    const out = outPath('h.csv');
    const code = await runConversion(
      parse('hook.yaml', input, '-o', out),
      createCommandContext('convert', io),
      channels,
    );
    expect(code).toBe(0);
    expect(readFileSync(out, 'utf8')).toBe('hook (code)\n5\nNaN\n6\n');
    expect(io.stderr.text()).toBe(
      `clipped samples: 1 of 3 (33.3 %)\n  hook (code): 1, frame 1\nwrote 3 rows to ${out}\n`,
    );
    expect(io.stdout.text()).toBe('');
  });

  it('returns 2 with --fail-on-clip when samples were clipped (and still writes the file)', async () => {
    const io = memoryIo();
    const out = outPath('h2.csv');
    const args = parse('hook.yaml', file('h2.bin', int32le([INT32_MAX])), '-o', out, '--fail-on-clip');
    expect(await runConversion(args, createCommandContext('convert', io), channels)).toBe(2);
    expect(existsSync(out)).toBe(true);
    const clean = parse('hook.yaml', file('h3.bin', int32le([1])), '--fail-on-clip');
    expect(await runConversion(clean, createCommandContext('convert', memoryIo()), channels)).toBe(0);
  });

  it('checks that the data has one column per channel', async () => {
    const args = parse('hook.yaml', file('two.csv', 'a,b\n1,2\n'));
    expect(
      await caught(runConversion(args, createCommandContext('convert', memoryIo()), channels)),
    ).toThrowBridgeworkError('invalid-shape', { param: '<codes-file>' });
    const picked = parse('hook.yaml', file('two.csv', 'a,b\n1,2\n'), '--columns', 'b');
    const io = memoryIo();
    await runConversion(picked, createCommandContext('convert', io), channels);
    expect(io.stdout.text()).toBe('hook (code)\n2\n');
  });

  it('draws a progress bar only when standard error is a terminal, and colours the summary only there', async () => {
    const input = file(
      'p.bin',
      int32le(Array.from({ length: 1000 }, (_, i) => (i % 100 === 0 ? INT32_MAX : i))),
    );
    const tty = memoryIo({ stderrTTY: true });
    await runConversion(
      parse('h.yaml', input, '--block', '10', '-o', outPath('p.csv')),
      createCommandContext('convert', tty),
      channels,
    );
    expect(tty.stderr.chunks.filter((c) => c.startsWith('\rconverting [')).length).toBeGreaterThan(50);
    expect(tty.stderr.text()).toContain('\u001b[33mclipped samples: 10 of 1000 (1.0 %)');
    const noColor = memoryIo({ stderrTTY: true, env: { NO_COLOR: '1' } });
    await runConversion(
      parse('h.yaml', input, '-o', outPath('p.csv')),
      createCommandContext('convert', noColor),
      channels,
    );
    expect(noColor.stderr.text()).not.toMatch(/\u001b\[3/);
    const pipe = memoryIo();
    await runConversion(
      parse('h.yaml', input, '--block', '10', '-o', outPath('p.csv')),
      createCommandContext('convert', pipe),
      channels,
    );
    expect(pipe.stderr.text()).not.toContain('\r');
    expect(pipe.stderr.text()).not.toContain('\u001b');
  });

  it('parses --columns lists', () => {
    expect(parseColumnList('2, hook ,10')).toEqual([2, 'hook', 10]);
    expect(() => parseColumnList('a,,b')).toThrowBridgeworkError('invalid-option', { param: '--columns' });
  });
});
