/**
 * Rewrites the generated documentation of the command: the command reference in docs/cli.md
 * (from the option tables), the field reference in docs/channel-file.md and the JSON Schema
 * packages/cli/schema/channel-file.schema.json (from the channel schema):
 * `pnpm --filter bridgework docs:cli`.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import {
  channelFileDocsPath,
  regeneratedChannelFileDocs,
  regeneratedSchema,
  schemaPath,
} from './channelFileDocs.js';
import { docsPath, regeneratedDocs } from './cliDocs.js';

writeFileSync(docsPath, await regeneratedDocs());
console.log(`wrote ${docsPath}`);
writeFileSync(channelFileDocsPath, await regeneratedChannelFileDocs());
console.log(`wrote ${channelFileDocsPath}`);
mkdirSync(dirname(schemaPath), { recursive: true });
writeFileSync(schemaPath, await regeneratedSchema());
console.log(`wrote ${schemaPath}`);
