/**
 * Child process for the large-file tests. Modes:
 * - `stream <input> <output> <channels>`: converts with the streaming pipeline (test-only
 *   pass-through channels) and prints `{ baselineRss, peakRss, frames }` as JSON;
 * - `whole <input> <output> <channels>`: the control: reads the whole file into memory, converts it
 *   in one go and prints the same figures (shows that the measurement can see unbounded memory);
 * - `slow <input> <output> <channels>`: streams with a pause per block and prints `block <n>`
 *   after each, so that the parent can kill it mid-way.
 * An optional fifth argument names the output format (default csv).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { convertRecording } from '../../src/data/convertRecording.js';
import { openCodeSource } from '../../src/data/openCodeSource.js';
import { writeRecording } from '../../src/data/openRecordingOutput.js';
import type { OutputFormat } from '../../src/data/outputFormats.js';
import { passThroughChannel } from './passThroughConverter.js';

const [mode, input, output, channelText, formatText] = process.argv.slice(2) as [
  string,
  string,
  string,
  string,
  string | undefined,
];
const channels = Number(channelText);
const format = (formatText ?? 'csv') as OutputFormat;
let peakRss = 0;
const sample = (): void => {
  peakRss = Math.max(peakRss, process.memoryUsage.rss());
};

if (mode === 'whole') {
  const baselineRss = process.memoryUsage.rss();
  const bytes = readFileSync(input);
  const codes = new Int32Array(bytes.buffer, bytes.byteOffset, bytes.length / 4);
  const out = new Float64Array(codes.length);
  passThroughChannel().convert(codes, out, {});
  sample();
  writeFileSync(output, `${out.length}\n`);
  process.stdout.write(`${JSON.stringify({ baselineRss, peakRss, frames: codes.length / channels })}\n`);
} else {
  const source = await openCodeSource(input, { channels, format: 'int32le' });
  const slow = mode === 'slow';
  let blocks = 0;
  const lanes = Array.from({ length: channels }, (_, j) => {
    const c = passThroughChannel(`c${j + 1}`);
    return slow && j === 0
      ? {
          ...c,
          convert: (
            codes: Int32Array | Float64Array,
            out: Float64Array,
            o: { temperatureCelsius?: number },
          ) => {
            Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 25);
            return c.convert(codes, out, o);
          },
        }
      : c;
  });
  const baselineRss = process.memoryUsage.rss();
  const result = await writeRecording(
    {
      format,
      output,
      stdout: process.stdout,
      columns: {
        channels: lanes.map((c) => ({ name: c.name, unit: 'code', quantity: 'ratio' })),
        time: undefined,
        passThrough: [],
        metadata: {},
      },
      blockFrames: source.blockFrames,
    },
    (writer) =>
      convertRecording({
        source,
        channels: lanes,
        writer,
        onBlock: () => {
          sample();
          blocks++;
          if (slow) process.stdout.write(`block ${blocks}\n`);
        },
      }),
  );
  process.stdout.write(`${JSON.stringify({ baselineRss, peakRss, frames: result.frames })}\n`);
}
