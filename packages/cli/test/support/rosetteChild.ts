/**
 * Child process for the rosette memory test: writes a recording of `rows` rows of three legs,
 * then runs `bridgework reduce-rosette` on it (or, in `whole` mode, the control: the same
 * reduction holding every output line in memory) and prints `{ baselineRss, peakRss, rows }`.
 * Arguments: `<mode> <dir> <rows>`.
 */
import { closeSync, openSync, writeSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { runCli } from '../../src/runCli.js';
import { memoryIo } from './memoryIo.js';

const [mode, dir, rowsText] = process.argv.slice(2) as [string, string, string];
const rows = Number(rowsText);
const input = join(dir, `legs-${rows}.csv`);
const fd = openSync(input, 'w');
writeSync(fd, 'time (s),a (µε),b (µε),c (µε)\n');
let chunk = '';
for (let i = 0; i < rows; i++) {
  chunk += `${i / 1000},${(i % 977) - 400},${(i % 613) - 250},${(i % 331) - 120}\n`;
  if (chunk.length > 1 << 20) {
    writeSync(fd, chunk);
    chunk = '';
  }
}
writeSync(fd, chunk);
closeSync(fd);
// A first run on a small file loads every module, so that the baseline holds them.
const small = join(dir, 'legs-small.csv');
writeFileSync(small, 'a,b,c\n1,2,3\n');
await runCli(
  [
    'reduce-rosette',
    small,
    '--legs',
    'a,b,c',
    '--modulus',
    '200 GPa',
    '--poisson',
    '0.3',
    '-o',
    `${small}.out`,
    '--force',
  ],
  memoryIo(),
);
if (typeof globalThis.gc === 'function') globalThis.gc();
const baselineRss = process.memoryUsage.rss();
let peakRss = baselineRss;
const timer = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage.rss())), 2);
const output = join(dir, `principal-${rows}.csv`);
const io = memoryIo();
const code = await runCli(
  [
    'reduce-rosette',
    input,
    '--legs',
    'a,b,c',
    '--modulus',
    '200 GPa',
    '--poisson',
    '0.3',
    '-o',
    output,
    '--force',
  ],
  io,
);
let held: string[] = [];
if (mode === 'whole') held = readFileSync(output, 'utf8').split('\n');
peakRss = Math.max(peakRss, process.memoryUsage.rss());
clearInterval(timer);
process.stdout.write(`${JSON.stringify({ code, baselineRss, peakRss, rows, held: held.length })}\n`);
