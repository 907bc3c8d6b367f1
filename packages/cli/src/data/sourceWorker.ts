import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/**
 * Starts a worker thread on a TypeScript module (the tests run the sources). Node 20 does not apply
 * `--import` loaders to workers, so a tiny bootstrap registers tsx's ESM hooks first, with the
 * `@bridgework/source` condition. The compiled package starts its workers from the `.js` module
 * next to the caller instead (a `Worker` on `new URL('./name.js', import.meta.url)`, which the
 * bundler finds by that pattern).
 *
 * @param target - The worker's `.ts` module.
 * @returns The worker.
 */
export function startSourceWorker(target: URL): Worker {
  const tsx = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const api = pathToFileURL(join(tsx, 'dist', 'esm', 'api', 'index.mjs')).href;
  const code = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(target.href)}); });`;
  return new Worker(code, { eval: true, execArgv: ['--conditions=@bridgework/source'] });
}
