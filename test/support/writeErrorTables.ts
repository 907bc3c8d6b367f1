/** Rewrites the error-code tables of docs/errors.md and DEVELOPERS.md from the core package. */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import * as prettier from 'prettier';
import { withErrorTable } from './errorTable.js';

for (const file of ['docs/errors.md', 'DEVELOPERS.md']) {
  const url = new URL(`../../${file}`, import.meta.url);
  const path = fileURLToPath(url);
  const options = (await prettier.resolveConfig(path)) ?? {};
  writeFileSync(
    url,
    await prettier.format(withErrorTable(readFileSync(url, 'utf8')), { ...options, filepath: path }),
  );
  console.log(`updated the error-code table in ${file}`);
}
