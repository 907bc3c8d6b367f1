/**
 * Prints the browser weight of each bridgework entry and of the import paths apps start from, as
 * a Markdown table for docs/performance.md: `pnpm size` (it builds first). The packages resolve to
 * their built dist/ (no source condition), exactly what the published tarballs hold; the consumer
 * test checks the conversion path's budget against the installed tarballs.
 */
import { fileURLToPath } from 'node:url';
import { bundleForBrowser, measuredPaths } from './support/bundle.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const kB = (bytes: number): string => (bytes / 1000).toFixed(1);

const rows: string[] = [];
for (const path of measuredPaths) {
  const b = await bundleForBrowser(path.contents, root);
  const largest = b.byPackage
    .filter((p) => p.name !== '(entry)')
    .slice(0, 3)
    .map((p) => `${p.name} ${kB(p.bytes)}`)
    .join(', ');
  rows.push(`| ${path.label} | ${kB(b.minifiedBytes)} | ${kB(b.gzippedBytes)} | ${largest} |`);
}
console.log('| import | minified (kB) | gzipped (kB) | largest parts, minified (kB) |');
console.log('| --- | --: | --: | --- |');
for (const row of rows) console.log(row);
