/**
 * `bridgework convert` end to end, the built command under plain node, against copying the same
 * bytes: a raw recording of 10⁸ int32 codes in 8 channels (400 MB; `--short`: 10⁶) converted to
 * float32, float64, Arrow IPC and Parquet, timed against `cp` and a Node stream copy of the input
 * in the same run (rounds in rotating order; the ratio of speeds is taken per round and its median
 * reported). CSV is measured on a tenth of the codes, in values of output per second, with the
 * shortest round-trip digits and with fewer digits. Peak memory (max RSS) of each conversion is
 * printed, and the CPU time (user + system, from GNU time where /usr/bin/time exists) of every run,
 * which on a shared machine measures the work where wall time also measures the queue. `--codes=N`
 * and `--rounds=N` change the size and the rounds; `--threads=N` (default 1; 0 to leave them out)
 * adds the conversions with `--convert-threads N`. Targets (issue 17): raw → float32/float64/Arrow at ≥ 50 % of the copy's speed; CSV at
 * ≥ 20 million values/s.
 */
import { spawnSync } from 'node:child_process';
import {
  closeSync,
  existsSync,
  mkdtempSync,
  openSync,
  readFileSync,
  rmSync,
  statSync,
  writeSync,
} from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../../../', import.meta.url)); // .bench-build/test/bench → repo
// The package's executable (its bin: the bundled command), as an installed copy runs it.
const bin = join(
  root,
  'packages/cli',
  (
    JSON.parse(readFileSync(join(root, 'packages/cli/package.json'), 'utf8')) as {
      bin: Record<string, string>;
    }
  ).bin['bridgework'] as string,
);
const short = process.argv.includes('--short');
const channels = 8;
const flag = (name: string): number | undefined => {
  const a = process.argv.find((x) => x.startsWith(`--${name}=`));
  return a === undefined ? undefined : Number(a.slice(name.length + 3));
};
const totalCodes = flag('codes') ?? (short ? 1_000_000 : 100_000_000);
const csvCodes = totalCodes / 10;
const rounds = flag('rounds') ?? (short ? 1 : 3);
// Worker threads of the threaded cases (`--threads=N`; 0 leaves them out).
const threads = flag('threads') ?? 1;

const dir = mkdtempSync(join(tmpdir(), 'bridgework-convert-bench-'));
process.on('exit', () => rmSync(dir, { recursive: true, force: true }));

// Eight quarter-bridge strain channels on a 24-bit ratiometric converter (an invented rig).
const spec = (gaugeFactor: number) => ({
  sensor: { kind: 'strain-gauge', gaugeFactor, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 0.5 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true, filter: { order: 3, dataRateHertz: 1000 } },
  output: { quantity: 'strain', unit: 'µε' },
});
const channelFile = join(dir, 'rig.json');
writeFile(
  channelFile,
  JSON.stringify({
    channels: Object.fromEntries(
      Array.from({ length: channels }, (_, j) => [`sg${j + 1}`, spec(2 + j / 100)]),
    ),
  }),
);

function writeFile(path: string, text: string): void {
  const fd = openSync(path, 'w');
  writeSync(fd, text);
  closeSync(fd);
}

/** A recording: each channel a slow sine of ±2 million codes with noise, int32 little-endian. */
function makeRecording(path: string, codes: number): void {
  const fd = openSync(path, 'w');
  const chunk = new Int32Array(1 << 20);
  let state = 12345;
  for (let start = 0; start < codes; start += chunk.length) {
    const n = Math.min(chunk.length, codes - start);
    for (let k = 0; k < n; k++) {
      const i = start + k;
      const frame = Math.floor(i / channels);
      state = (Math.imul(state, 1103515245) + 12345) | 0;
      chunk[k] = Math.round(2e6 * Math.sin(frame / 5000 + (i % channels))) + (state >> 20);
    }
    writeSync(fd, new Uint8Array(chunk.buffer, 0, n * 4));
  }
  closeSync(fd);
}

const input = join(dir, 'rig.bin');
const csvInput = join(dir, 'rig-small.bin');
makeRecording(input, totalCodes);
makeRecording(csvInput, csvCodes);
const tinyInput = join(dir, 'rig-one-frame.bin');
makeRecording(tinyInput, channels);
const inputBytes = statSync(input).size;

interface Case {
  readonly name: string;
  readonly values: number; // values of output per run
  readonly bytes: number; // input bytes per run
  readonly argv: readonly string[];
  readonly program?: string;
}
const out = join(dir, 'out');
const rss = join(dir, 'rss.txt');
const convert = (from: string, to: string, extra: readonly string[] = []): readonly string[] => [
  '--import',
  `data:text/javascript,process.on('exit',()=>process.getBuiltinModule('node:fs').writeFileSync(${JSON.stringify(rss)},String(process.resourceUsage().maxRSS)))`,
  bin,
  'convert',
  channelFile,
  from,
  '--to',
  to,
  '-o',
  out,
  '--force',
  ...extra,
];
const cases: Case[] = [
  { name: 'cp (baseline)', values: totalCodes, bytes: inputBytes, program: 'cp', argv: [input, out] },
  {
    // The conversion's output is flushed to disk before it is renamed into place (fsync): this copy
    // does the same, so the two compare the same durability.
    name: 'cp + fsync of the copy',
    values: totalCodes,
    bytes: inputBytes,
    program: 'sh',
    argv: ['-c', `cp '${input}' '${out}' && sync '${out}'`],
  },
  {
    name: 'node stream copy',
    values: totalCodes,
    bytes: inputBytes,
    argv: [
      '-e',
      `require('node:stream').pipeline(require('node:fs').createReadStream(${JSON.stringify(input)}),require('node:fs').createWriteStream(${JSON.stringify(out)}),(e)=>{if(e)throw e})`,
    ],
  },
  {
    // Start-up: loading node and the command, reading the channel file, one frame: what every run pays.
    name: 'convert, one frame (start-up)',
    values: channels,
    bytes: channels * 4,
    argv: convert(tinyInput, 'float32le'),
  },
  { name: 'convert → float32le', values: totalCodes, bytes: inputBytes, argv: convert(input, 'float32le') },
  { name: 'convert → float64le', values: totalCodes, bytes: inputBytes, argv: convert(input, 'float64le') },
  { name: 'convert → arrow', values: totalCodes, bytes: inputBytes, argv: convert(input, 'arrow') },
  {
    name: 'convert → parquet (none)',
    values: totalCodes,
    bytes: inputBytes,
    argv: convert(input, 'parquet', ['--parquet-compression', 'none', '--parquet-encoder', 'this-thread']),
  },
  {
    name: 'convert → parquet (snappy)',
    values: totalCodes,
    bytes: inputBytes,
    argv: convert(input, 'parquet', ['--parquet-encoder', 'this-thread']),
  },
  {
    // The column chunks encoded and compressed in a worker thread while this one converts.
    name: 'convert → parquet (snappy), encoder thread',
    values: totalCodes,
    bytes: inputBytes,
    argv: convert(input, 'parquet', ['--parquet-encoder', 'worker-thread']),
  },
  { name: 'convert → csv (shortest)', values: csvCodes, bytes: csvCodes * 4, argv: convert(csvInput, 'csv') },
  {
    name: 'convert → csv --digits 9',
    values: csvCodes,
    bytes: csvCodes * 4,
    argv: convert(csvInput, 'csv', ['--digits', '9']),
  },
  {
    name: 'convert → csv --digits 6',
    values: csvCodes,
    bytes: csvCodes * 4,
    argv: convert(csvInput, 'csv', ['--digits', '6']),
  },
];
if (threads > 0) {
  // The same conversions with the blocks converted (and CSV formatted) in worker threads.
  const t = ['--convert-threads', String(threads)];
  const threaded = (name: string, c: Case): Case => ({ ...c, name: `${name} (${threads} thr)` });
  cases.push(
    threaded('→ float32le', {
      name: '',
      values: totalCodes,
      bytes: inputBytes,
      argv: convert(input, 'float32le', t),
    }),
    threaded('→ float64le', {
      name: '',
      values: totalCodes,
      bytes: inputBytes,
      argv: convert(input, 'float64le', t),
    }),
    threaded('→ arrow', {
      name: '',
      values: totalCodes,
      bytes: inputBytes,
      argv: convert(input, 'arrow', t),
    }),
    threaded('→ parquet (snappy)', {
      name: '',
      values: totalCodes,
      bytes: inputBytes,
      argv: convert(input, 'parquet', t),
    }),
    threaded('→ csv (shortest)', {
      name: '',
      values: csvCodes,
      bytes: csvCodes * 4,
      argv: convert(csvInput, 'csv', t),
    }),
    threaded('→ csv --digits 9', {
      name: '',
      values: csvCodes,
      bytes: csvCodes * 4,
      argv: convert(csvInput, 'csv', ['--digits', '9', ...t]),
    }),
    threaded('→ csv --digits 6', {
      name: '',
      values: csvCodes,
      bytes: csvCodes * 4,
      argv: convert(csvInput, 'csv', ['--digits', '6', ...t]),
    }),
  );
}

// CPU time (user + system) of each run, from GNU time when the machine has it: on a machine shared
// with other work, wall time measures the queue as much as the program; CPU time measures its work.
const gnuTime = existsSync('/usr/bin/time') ? '/usr/bin/time' : undefined;
const cpuFile = join(dir, 'cpu.txt');

function runOnce(c: Case): { seconds: number; cpu: number; rssKiB: number; outBytes: number } {
  rmSync(out, { force: true });
  rmSync(rss, { force: true });
  const program = c.program ?? process.execPath;
  const t0 = performance.now();
  const r =
    gnuTime === undefined
      ? spawnSync(program, c.argv, { encoding: 'utf8' })
      : spawnSync(gnuTime, ['-f', '%U %S', '-o', cpuFile, program, ...c.argv], { encoding: 'utf8' });
  const seconds = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`${c.name} failed (${r.status}): ${r.stderr}`);
  const cpu =
    gnuTime === undefined
      ? Number.NaN
      : readFileSync(cpuFile, 'utf8')
          .trim()
          .split(/\s+/)
          .slice(-2)
          .reduce((a, x) => a + Number(x), 0);
  let rssKiB: number;
  try {
    rssKiB = Number(spawnSync('cat', [rss], { encoding: 'utf8' }).stdout) || 0;
  } catch {
    rssKiB = 0;
  }
  const outBytes = statSync(out).size;
  rmSync(out, { force: true });
  return { seconds, cpu, rssKiB, outBytes };
}

const times = cases.map(() => [] as number[]);
const cpus = cases.map(() => [] as number[]);
const peaks = cases.map(() => 0);
const sizes = cases.map(() => 0);
for (const c of cases.slice(0, 3)) runOnce(c); // warm the page cache and the file system
for (let r = 0; r < rounds; r++) {
  for (let k = 0; k < cases.length; k++) {
    const i = (k + r) % cases.length;
    const m = runOnce(cases[i] as Case);
    (times[i] as number[]).push(m.seconds);
    (cpus[i] as number[]).push(m.cpu);
    peaks[i] = Math.max(peaks[i] as number, m.rssKiB);
    sizes[i] = m.outBytes;
  }
}

const median = (xs: readonly number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 === 1
    ? (s[(s.length - 1) / 2] as number)
    : ((s[s.length / 2 - 1] as number) + (s[s.length / 2] as number)) / 2;
};
const cp = times[0] as number[];
const cpSync = times[1] as number[];
const nodeCopy = times[2] as number[];
const nodeCopyCpu = cpus[2] as number[];
console.log(
  `convert: ${totalCodes.toExponential(0)} codes in ${channels} channels (${(inputBytes / 1e6).toFixed(0)} MB int32le), CSV on ${csvCodes.toExponential(0)}; ${rounds} rounds; load ${loadavg()
    .map((x) => x.toFixed(2))
    .join(' ')}`,
);
console.log(
  'case                            median s   input MB/s   M values/s   speed vs cp  vs cp+fsync  vs node copy  by CPU   out MB  max RSS MiB   CPU s  M values/CPU s',
);
cases.forEach((c, i) => {
  const t = times[i] as number[];
  const s = median(t);
  const ratio = c.bytes === inputBytes ? median(t.map((x, r) => (cp[r] as number) / x)) : Number.NaN;
  const synced = c.bytes === inputBytes ? median(t.map((x, r) => (cpSync[r] as number) / x)) : Number.NaN;
  // Against the Node stream copy: by wall time, and by CPU time (what the run costs, not its wait).
  const node = c.bytes === inputBytes ? median(t.map((x, r) => (nodeCopy[r] as number) / x)) : Number.NaN;
  const nodeCpu =
    c.bytes === inputBytes
      ? median((cpus[i] as number[]).map((x, r) => (nodeCopyCpu[r] as number) / x))
      : Number.NaN;
  const show = (x: number): string => (Number.isNaN(x) ? '—' : x.toFixed(2));
  console.log(
    `${c.name.padEnd(32)}${s.toFixed(3).padStart(8)}${(c.bytes / s / 1e6).toFixed(0).padStart(13)}${(c.values / s / 1e6).toFixed(1).padStart(13)}${show(ratio).padStart(14)}${show(synced).padStart(13)}${show(node).padStart(14)}${show(nodeCpu).padStart(8)}${((sizes[i] as number) / 1e6).toFixed(0).padStart(9)}${(peaks[i] ? ((peaks[i] as number) / 1024).toFixed(0) : '—').padStart(14)}${median(
      cpus[i] as number[],
    )
      .toFixed(2)
      .padStart(8)}${(c.values / median(cpus[i] as number[]) / 1e6).toFixed(1).padStart(16)}`,
  );
});
