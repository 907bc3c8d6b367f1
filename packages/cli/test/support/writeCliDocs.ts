/** Rewrites the command reference in docs/cli.md from the option tables: `pnpm --filter bridgework docs:cli`. */
import { writeFileSync } from 'node:fs';
import { docsPath, regeneratedDocs } from './cliDocs.js';

writeFileSync(docsPath, await regeneratedDocs());
console.log(`wrote ${docsPath}`);
