/**
 * Start-up of the `bridgework` command: the built command under plain node, one process per run,
 * against `node -e 0` (starting Node itself). Cases: `--version`, `--help`, `convert` of one frame
 * of an 8-channel raw recording with a JSON and with a YAML channel file (what every conversion
 * pays before its first block: loading the command, reading and checking the channel file, making
 * the channels), `report` of the same 8 channels and `demo`. Each run's wall time, CPU time (user +
 * system of the process, all its threads) and peak memory are taken; rounds run every case once in
 * a rotating order and medians are reported, with each case's ratio to `node -e 0` taken per
 * round. On a shared machine the CPU column is the one to read.
 *
 * `--against=<bin.js>` runs a second build's command (e.g. an older checkout's
 * packages/cli/dist/bin.js) in the same rounds and prints this build's median CPU and wall time
 * over that one's, case by case. `--rounds=N` (default 15; `--short`: 2).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
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
const flag = (name: string): string | undefined =>
  process.argv.find((x) => x.startsWith(`--${name}=`))?.slice(name.length + 3);
const rounds = Number(flag('rounds') ?? (short ? 2 : 15));
const against = flag('against');

const dir = mkdtempSync(join(tmpdir(), 'bridgework-startup-bench-'));
process.on('exit', () => rmSync(dir, { recursive: true, force: true }));

// Eight quarter-bridge strain channels on a 24-bit ratiometric converter (the rig of
// convert.bench.ts), as JSON and as YAML.
const spec = (gaugeFactor: number) => ({
  sensor: { kind: 'strain-gauge', gaugeFactor, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 0.5 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true, filter: { order: 3, dataRateHertz: 1000 } },
  output: { quantity: 'strain', unit: 'µε' },
});
const channels = Object.fromEntries(Array.from({ length: 8 }, (_, j) => [`sg${j + 1}`, spec(2 + j / 100)]));
const jsonFile = join(dir, 'rig.json');
writeFileSync(jsonFile, JSON.stringify({ channels }, null, 2));
const yamlFile = join(dir, 'rig.yaml');
const yamlLines = ['channels:'];
for (const [name, s] of Object.entries(channels)) {
  yamlLines.push(`  ${name}:`);
  for (const [part, fields] of Object.entries(s)) yamlLines.push(`    ${part}: ${JSON.stringify(fields)}`);
}
writeFileSync(yamlFile, `${yamlLines.join('\n')}\n`);
const frame = join(dir, 'one-frame.bin');
writeFileSync(frame, new Uint8Array(new Int32Array([1, -2, 3, -4, 5, -6, 7, -8]).buffer));
const out = join(dir, 'out.f32');
const demoDir = join(dir, 'demo');

// Written by the child at exit: its CPU time (µs, every thread) and peak memory (KiB).
const usage = join(dir, 'usage.json');
const probe = [
  '--import',
  `data:text/javascript,process.on('exit',()=>{const c=process.cpuUsage();process.getBuiltinModule('node:fs').writeFileSync(${JSON.stringify(usage)},JSON.stringify({cpu:c.user+c.system,rss:process.resourceUsage().maxRSS}))})`,
];

interface Case {
  readonly name: string;
  readonly args: (bin: string) => readonly string[];
}
const cases: Case[] = [
  { name: 'node -e 0 (floor)', args: () => ['-e', '0'] },
  { name: 'bridgework --version', args: (b) => [b, '--version'] },
  { name: 'bridgework --help', args: (b) => [b, '--help'] },
  {
    name: 'convert one frame (JSON)',
    args: (b) => [b, 'convert', jsonFile, frame, '--from', 'int32le', '--to', 'float32le', '-o', out, '-f'],
  },
  {
    name: 'convert one frame (YAML)',
    args: (b) => [b, 'convert', yamlFile, frame, '--from', 'int32le', '--to', 'float32le', '-o', out, '-f'],
  },
  { name: 'report (8 channels)', args: (b) => [b, 'report', jsonFile] },
  { name: 'demo', args: (b) => [b, 'demo', '--dir', demoDir, '-f'] },
];

interface Run {
  readonly wall: number; // s
  readonly cpu: number; // s
  readonly rss: number; // MiB
}
function runOnce(args: readonly string[]): Run {
  rmSync(usage, { force: true });
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, [...probe, ...args], {
    cwd: dir,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
  });
  const wall = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`node ${args.join(' ')} exited with ${r.status}: ${r.stderr}`);
  const u = JSON.parse(readFileSync(usage, 'utf8')) as { cpu: number; rss: number };
  return { wall, cpu: u.cpu / 1e6, rss: u.rss / 1024 };
}

const median = (xs: readonly number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
};

const builds =
  against === undefined
    ? [{ label: '', bin }]
    : [
        { label: '', bin },
        { label: ' [against]', bin: against },
      ];
const jobs = cases.flatMap((c) =>
  builds.filter((b) => b.label === '' || !c.name.startsWith('node ')).map((b) => ({ ...c, build: b })),
);
const runs = new Map<string, Run[]>(jobs.map((j) => [j.name + j.build.label, []]));
const floorRatios = new Map<string, number[]>(jobs.map((j) => [j.name + j.build.label, []]));
const pairRatios = new Map<string, { cpu: number[]; wall: number[] }>(
  cases.map((c) => [c.name, { cpu: [], wall: [] }]),
);

console.log(
  `bridgework start-up: ${rounds} rounds, one process per run (node ${process.version}, load ${loadavg()
    .map((x) => x.toFixed(2))
    .join(' ')})`,
);
for (const j of jobs) runOnce(j.args(j.build.bin)); // warm the page cache
for (let round = 0; round < rounds; round++) {
  const order = jobs.map((_, i) => jobs[(i + round) % jobs.length] as (typeof jobs)[number]);
  const got = new Map<string, Run>();
  for (const j of order) {
    const r = runOnce(j.args(j.build.bin));
    got.set(j.name + j.build.label, r);
    runs.get(j.name + j.build.label)?.push(r);
  }
  const floor = got.get(cases[0]!.name) as Run;
  for (const [k, r] of got) floorRatios.get(k)?.push(r.cpu / floor.cpu);
  if (against !== undefined) {
    for (const c of cases.slice(1)) {
      const a = got.get(c.name) as Run;
      const b = got.get(`${c.name} [against]`) as Run;
      pairRatios.get(c.name)?.cpu.push(a.cpu / b.cpu);
      pairRatios.get(c.name)?.wall.push(a.wall / b.wall);
    }
  }
}

const rows = jobs.map((j) => {
  const k = j.name + j.build.label;
  const rs = runs.get(k) as Run[];
  return [
    k,
    median(rs.map((r) => r.wall)).toFixed(3),
    median(rs.map((r) => r.cpu)).toFixed(3),
    median(floorRatios.get(k) as number[]).toFixed(2),
    median(rs.map((r) => r.rss)).toFixed(0),
  ];
});
const head = ['case', 'median wall s', 'median CPU s', 'CPU vs node -e 0', 'max RSS MiB'];
const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] as string).length)));
const line = (cells: readonly string[]) =>
  `| ${cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join(' | ')} |`;
console.log(line(head));
console.log(`| ${widths.map((w, i) => (i === 0 ? '-'.repeat(w) : `${'-'.repeat(w - 1)}:`)).join(' | ')} |`);
for (const r of rows) console.log(line(r));
if (against !== undefined) {
  console.log(`\nthis build / ${against}, median of the per-round ratios:`);
  for (const c of cases.slice(1)) {
    const p = pairRatios.get(c.name) as { cpu: number[]; wall: number[] };
    console.log(`  ${c.name.padEnd(26)} CPU ${median(p.cpu).toFixed(2)}  wall ${median(p.wall).toFixed(2)}`);
  }
}
