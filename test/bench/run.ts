/**
 * `pnpm bench`: builds the packages, compiles the benchmark programs (test/bench/tsconfig.json,
 * into .bench-build/, resolving `@bridgework/*` to their built dist/ exactly as a published user
 * gets them), then runs each compiled program under plain `node` in its own process (so one
 * benchmark's JIT state cannot colour another's), stopping at the first failure. Never tsx: it
 * slows loops unevenly and skews ratios. Pass names to run a subset: `pnpm bench channel`;
 * `--short` runs each program's short mode (used by the suite's self-check test).
 */
import { execFileSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));
const args = process.argv.slice(2);
const flags = args.filter((a) => a.startsWith('--'));
const wanted = args.filter((a) => !a.startsWith('--'));
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.js'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.startsWith(w)))
  .sort();
if (files.length === 0) {
  console.error(`no benchmark matches ${wanted.join(', ')}`);
  process.exit(1);
}
console.log(
  `bridgework benchmarks on the built packages (plain node ${process.version}, load ${loadavg()
    .map((x) => x.toFixed(2))
    .join(' ')}); ratios measured in one run are what count on a shared machine`,
);
for (const f of files) {
  console.log(`\n=== ${f.replace(/\.js$/, '.ts')}`);
  execFileSync(process.execPath, ['--expose-gc', `${here}${f}`, ...flags], { stdio: 'inherit' });
}
