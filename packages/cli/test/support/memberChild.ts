/**
 * Child process for the reduce-member memory test: writes a recording of `rows` rows of six gauges,
 * then runs `bridgework reduce-member` on it and prints `{ code, baselineRss, peakRss, rows }`.
 * Arguments: `<dir> <rows>`.
 */
import { closeSync, openSync, writeFileSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { runCli } from '../../src/runCli.js';
import { memoryIo } from './memoryIo.js';

const [dir, rowsText] = process.argv.slice(2) as [string, string];
const rows = Number(rowsText);
const input = join(dir, `gauges-${rows}.csv`);
const fd = openSync(input, 'w');
writeSync(fd, 'time (s),n (µε),s (µε),e (µε),w (µε),t1 (µε),t2 (µε)\n');
let chunk = '';
for (let i = 0; i < rows; i++) {
  chunk += `${i / 1000},${(i % 977) - 400},${(i % 613) - 250},${(i % 331) - 120},${(i % 97) - 40},${(i % 53) - 20},${(i % 71) - 30}\n`;
  if (chunk.length > 1 << 20) {
    writeSync(fd, chunk);
    chunk = '';
  }
}
writeSync(fd, chunk);
closeSync(fd);
const args = (file: string, out: string) => [
  'reduce-member',
  file,
  '--gauges',
  'n@+z,s@-z,e@+y,w@-y,t1@+y@45,t2@+y@-45',
  '--diameter',
  '88.9 mm',
  '--bore',
  '76.3 mm',
  '--modulus',
  '205 GPa',
  '--poisson',
  '0.29',
  '-o',
  out,
  '--force',
];
// A first run on a small file loads every module, so that the baseline holds them.
const small = join(dir, 'gauges-small.csv');
writeFileSync(small, 'n,s,e,w,t1,t2\n1,2,3,4,5,6\n');
await runCli(args(small, `${small}.out`), memoryIo());
if (typeof globalThis.gc === 'function') globalThis.gc();
const baselineRss = process.memoryUsage.rss();
let peakRss = baselineRss;
const timer = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage.rss())), 2);
const started = Date.now();
const code = await runCli(args(input, join(dir, `loads-${rows}.csv`)), memoryIo());
const seconds = (Date.now() - started) / 1000;
peakRss = Math.max(peakRss, process.memoryUsage.rss());
clearInterval(timer);
process.stdout.write(`${JSON.stringify({ code, baselineRss, peakRss, rows, seconds })}\n`);
