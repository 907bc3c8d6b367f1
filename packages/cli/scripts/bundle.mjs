/**
 * Bundles the `bridgework` executable (run by `pnpm build` and before every pack): tsc's
 * dist/bin.js and everything it reaches in this package and the @bridgework/* packages, into
 * dist/bundle/ — bridgework.js (the package's bin), one file per part loaded on demand (each
 * command's body, the output writers) and the Monte Carlo worker. Node then resolves, reads and
 * compiles a few dozen files instead of some three hundred, and no module a command does not use
 * is evaluated; that is most of the command's start-up. The npm dependencies (yaml, apache-arrow,
 * parquet-wasm, decimal.js) stay outside, imported from node_modules as before.
 *
 * Every file of the bundle sits two folders below the package, as each module of dist/internal/
 * does, so the paths the command finds from its own location (the package.json, the demo's
 * channel file, the schema, the worker next to it) are the same in both. dist/bundle/inputs.json
 * records the SHA-256 of every input, so a test can tell a bundle older than dist/.
 */
import { build } from 'esbuild';
import { createHash } from 'node:crypto';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const cli = fileURLToPath(new URL('..', import.meta.url));
const manifest = JSON.parse(readFileSync(`${cli}package.json`, 'utf8'));
const external = Object.keys(manifest.dependencies).filter((d) => !d.startsWith('@bridgework/'));

rmSync(`${cli}dist/bundle`, { recursive: true, force: true });
const result = await build({
  absWorkingDir: cli,
  entryPoints: {
    bridgework: 'dist/bin.js',
    monteCarloWorker: 'dist/commands/uncertainty/monteCarloWorker.js',
  },
  outdir: 'dist/bundle',
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
const inputs = Object.fromEntries(
  Object.keys(result.metafile.inputs)
    .sort()
    .map((f) => [
      f,
      createHash('sha256')
        .update(readFileSync(`${cli}${f}`))
        .digest('hex'),
    ]),
);
writeFileSync(`${cli}dist/bundle/inputs.json`, `${JSON.stringify({ inputs }, null, 2)}\n`);
