/**
 * Bundles the `bridgework` executable (run by `pnpm build` and before every pack): tsc's
 * dist/bin.js and everything it reaches in this package and the @bridgework/* packages, into
 * dist/bundle/ — bridgework.js (the package's bin), one file per part loaded on demand (each
 * command's body, the output writers) and each worker thread's module (Monte Carlo,
 * conversion). Node then resolves, reads and compiles a few dozen files instead of some three
 * hundred, and no module a command does not use is evaluated; that is most of the command's
 * start-up. This package's own npm dependencies (yaml, apache-arrow, parquet-wasm) stay outside,
 * imported from node_modules as before; decimal.js, a dependency of the firmware package, is
 * bundled with its licence comment.
 *
 * Every file of the bundle sits two folders below the package, as each module of dist/internal/
 * does, so the paths the command finds from its own location (the package.json, the demo's
 * channel file, the schema, the worker next to it) are the same in both. dist/bundle/inputs.json
 * records the SHA-256 of every input, so a test can tell a bundle older than dist/.
 *
 * `--if-stale` (prepack) leaves a bundle alone when every input it was made from is unchanged, so
 * packing after `pnpm build` only reads it (packs may run while tests run the bundle). A new
 * bundle is written into a fresh folder and put in place by renaming.
 */
import { build } from 'esbuild';
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const cli = fileURLToPath(new URL('..', import.meta.url));
const manifest = JSON.parse(readFileSync(`${cli}package.json`, 'utf8'));
const external = Object.keys(manifest.dependencies).filter((d) => !d.startsWith('@bridgework/'));
const sha256 = (f) =>
  createHash('sha256')
    .update(readFileSync(`${cli}${f}`))
    .digest('hex');

/** Whether dist/bundle was made from the files now in dist/ (every input's hash unchanged). */
function current() {
  try {
    const { inputs } = JSON.parse(readFileSync(`${cli}dist/bundle/inputs.json`, 'utf8'));
    return Object.entries(inputs).every(([f, hash]) => sha256(f) === hash);
  } catch {
    return false;
  }
}

/**
 * The worker threads' modules: each is started from a module next to it
 * (`new Worker(new URL('./name.js', import.meta.url))`), so each becomes an entry of its own,
 * written beside the others in dist/bundle/ where that URL then points.
 */
function workerEntries() {
  const entries = {};
  const visit = (folder) => {
    for (const e of readdirSync(folder, { withFileTypes: true })) {
      const path = join(folder, e.name);
      if (e.isDirectory() && !e.name.startsWith('bundle')) visit(path);
      else if (e.isFile() && e.name.endsWith('.js')) {
        for (const m of readFileSync(path, 'utf8').matchAll(/new Worker\(new URL\('\.\/([\w-]+)\.js',/g)) {
          const worker = relative(cli, join(dirname(path), `${m[1]}.js`));
          if (entries[m[1]] !== undefined && entries[m[1]] !== worker)
            throw new Error(`two worker modules are named ${m[1]}.js: ${entries[m[1]]}, ${worker}`);
          entries[m[1]] = worker;
        }
      }
    }
  };
  visit(`${cli}dist`);
  return entries;
}

if (!(process.argv.includes('--if-stale') && current())) {
  const out = `dist/bundle-${process.pid}`;
  rmSync(`${cli}${out}`, { recursive: true, force: true });
  const result = await build({
    absWorkingDir: cli,
    entryPoints: { bridgework: 'dist/bin.js', ...workerEntries() },
    outdir: out,
    chunkNames: '[name]-[hash]',
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    external: external.flatMap((d) => [d, `${d}/*`]),
    metafile: true,
    logLevel: 'warning',
  });
  const files = Object.keys(result.metafile.inputs).sort();
  const inputs = Object.fromEntries(files.map((f) => [f, sha256(f)]));
  writeFileSync(`${cli}${out}/inputs.json`, `${JSON.stringify({ inputs }, null, 2)}\n`);
  const old = `${cli}dist/bundle-old-${process.pid}`;
  if (existsSync(`${cli}dist/bundle`)) renameSync(`${cli}dist/bundle`, old);
  renameSync(`${cli}${out}`, `${cli}dist/bundle`);
  rmSync(old, { recursive: true, force: true });
}
