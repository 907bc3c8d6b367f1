/**
 * The generated part of docs/cli.md: the command reference, made from the option tables and
 * formatted by prettier exactly as `pnpm format` would, so the check below and the writer agree.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { format, resolveConfig } from 'prettier';
import { formatCliReference } from '../../src/args/formatCliReference.js';
import { commands } from '../../src/commands/registry.js';

export const docsPath = fileURLToPath(new URL('../../../../docs/cli.md', import.meta.url));
export const startMarker =
  '<!-- cli-reference:start (generated from the option tables by `pnpm --filter bridgework docs:cli`; do not edit) -->';
export const endMarker = '<!-- cli-reference:end -->';

/** docs/cli.md with its reference section replaced by the one generated from the tables. */
export async function regeneratedDocs(): Promise<string> {
  const current = readFileSync(docsPath, 'utf8');
  const start = current.indexOf(startMarker);
  const end = current.indexOf(endMarker);
  if (start < 0 || end < start) throw new Error(`${docsPath}: the cli-reference markers are missing`);
  const spliced = `${current.slice(0, start + startMarker.length)}\n\n${formatCliReference(commands)}\n${current.slice(end)}`;
  const config = (await resolveConfig(docsPath)) ?? {};
  return format(spliced, { ...config, filepath: docsPath });
}
