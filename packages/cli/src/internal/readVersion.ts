import { readFile } from 'node:fs/promises';

/** The package version, read from package.json (one folder above both src/ and dist/). */
export async function readVersion(): Promise<string> {
  const text = await readFile(new URL('../../package.json', import.meta.url), 'utf8');
  return (JSON.parse(text) as { version: string }).version;
}
