/**
 * CLI start-up: the wall time of `node packages/cli/dist/bin.js --help`, spawned again and again,
 * against `node -e 0` (the floor: starting Node itself). Target: `bridgework --help` under 0.3 s.
 * The bin is built first (`tsc -b packages/cli`, incremental), since published users run dist/.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { compare, report, sinkValue } from './harness.js';

// Compiled into .bench-build/test/bench/: the repository is three folders up.
const root = fileURLToPath(new URL('../../../', import.meta.url));
const bin = `${root}packages/cli/dist/bin.js`;
const targetSeconds = 0.3;

execFileSync(process.execPath, [`${root}node_modules/typescript/bin/tsc`, '-b', 'packages/cli'], {
  cwd: root,
  stdio: 'inherit',
});

function spawnOnce(args: readonly string[]): number {
  const r = spawnSync(process.execPath, args, {
    cwd: root,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
  });
  if (r.status !== 0) throw new Error(`node ${args.join(' ')} exited with ${r.status}: ${r.stderr}`);
  return r.stdout.length;
}

const results = compare(
  [
    { name: 'node -e 0 (baseline)', opsPerCall: 1, run: () => spawnOnce(['-e', '0']) },
    { name: 'bridgework --help (dist)', opsPerCall: 1, run: () => spawnOnce([bin, '--help']) },
    { name: 'bridgework convert --help', opsPerCall: 1, run: () => spawnOnce([bin, 'convert', '--help']) },
  ],
  { rounds: 15, minMillisPerRound: 300, warmupCalls: 3 },
);
report('cli: start-up wall time per spawn (ns/op = ns per process)', results);

const help = results[1]!;
const base = results[0]!;
const seconds = help.nsPerOp / 1e9;
console.log(
  `\n  bridgework --help: ${(seconds * 1000).toFixed(1)} ms (median), ${((help.nsPerOp - base.nsPerOp) / 1e6).toFixed(1)} ms above node -e 0 ` +
    `(${help.ratioToBaseline.toFixed(2)}×); target < ${targetSeconds * 1000} ms: ${seconds < targetSeconds ? 'met' : 'NOT MET'}`,
);
console.log(`  (sink ${sinkValue()})`);
if (seconds >= targetSeconds) process.exitCode = 1;
