/**
 * `pnpm bench`: runs every benchmark program in test/bench/*.bench.ts, each in its own Node
 * process (so one benchmark's JIT state cannot colour another's), and stops at the first failure.
 * Pass names to run a subset: `pnpm bench bridge`.
 */
import { execFileSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));
const wanted = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.startsWith(w)))
  .sort();
console.log(`bridgework benchmarks (Node ${process.version}; ratios are what matter on a shared machine)`);
for (const f of files) {
  console.log(`\n=== ${f}`);
  execFileSync(process.execPath, ['--import', 'tsx', '--conditions=@bridgework/source', `${here}${f}`], {
    stdio: 'inherit',
  });
}
