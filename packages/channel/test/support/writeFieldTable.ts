/** Rewrites the field reference in docs/channel.md from the channel spec schema. */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import * as prettier from 'prettier';
import { withFieldTable } from './fieldTable.js';

const url = new URL('../../../../docs/channel.md', import.meta.url);
const path = fileURLToPath(url);
const options = (await prettier.resolveConfig(path)) ?? {};
writeFileSync(
  url,
  await prettier.format(withFieldTable(readFileSync(url, 'utf8')), { ...options, filepath: path }),
);
console.log('updated the field reference in docs/channel.md');
