/** Rewrites the unit reference in docs/channel.md from the channel package's unit table. */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import * as prettier from 'prettier';
import { withUnitTable } from './unitTableDocs.js';

const url = new URL('../../../../docs/channel.md', import.meta.url);
const path = fileURLToPath(url);
const options = (await prettier.resolveConfig(path)) ?? {};
writeFileSync(
  url,
  await prettier.format(withUnitTable(readFileSync(url, 'utf8')), { ...options, filepath: path }),
);
console.log('updated the unit reference in docs/channel.md');
