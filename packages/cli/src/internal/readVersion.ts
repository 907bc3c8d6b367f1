import { readFile } from 'node:fs/promises';
import { packageFile } from './packageFile.js';

/** The package version, read from the package's package.json. */
export async function readVersion(): Promise<string> {
  const text = await readFile(packageFile('package.json'), 'utf8');
  return (JSON.parse(text) as { version: string }).version;
}
