/**
 * Child process for the large-file tests. Modes:
 * - `stream <input> <output> <channels>`: converts with the streaming pipeline (test-only
 *   pass-through converter) and prints `{ baselineRss, peakRss, frames }` as JSON;
 * - `whole <input> <output> <channels>`: the control: reads the whole file into memory, converts it
 *   in one go and prints the same figures (shows that the measurement can see unbounded memory);
 * - `slow <input> <output> <channels>`: streams with a pause per block and prints `block <n>`
 *   after each, so that the parent can kill it mid-way.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { convertToCsv } from '../../src/data/convertToCsv.js';
import { openCodeSource } from '../../src/data/openCodeSource.js';
import { passThroughConverter } from './passThroughConverter.js';

const [mode, input, output, channelText] = process.argv.slice(2) as [string, string, string, string];
const channels = Number(channelText);
const converter = passThroughConverter();
let peakRss = 0;
const sample = (): void => {
  peakRss = Math.max(peakRss, process.memoryUsage.rss());
};

if (mode === 'whole') {
  const baselineRss = process.memoryUsage.rss();
  const bytes = readFileSync(input);
  const codes = new Int32Array(bytes.buffer, bytes.byteOffset, bytes.length / 4);
  const out = new Float64Array(codes.length);
  converter(codes, channels, out);
  sample();
  writeFileSync(output, `${out.length}\n`);
  process.stdout.write(`${JSON.stringify({ baselineRss, peakRss, frames: codes.length / channels })}\n`);
} else {
  const source = await openCodeSource(input, { channels, format: 'int32le' });
  const slow = mode === 'slow';
  let blocks = 0;
  const baselineRss = process.memoryUsage.rss();
  const result = await convertToCsv({
    source,
    converter: slow
      ? (codes, ch, out) => {
          Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 25);
          return converter(codes, ch, out);
        }
      : converter,
    output,
    progress: {
      update: () => {
        sample();
        blocks++;
        if (slow) process.stdout.write(`block ${blocks}\n`);
      },
      finish: () => undefined,
    },
  });
  process.stdout.write(`${JSON.stringify({ baselineRss, peakRss, frames: result.frames })}\n`);
}
