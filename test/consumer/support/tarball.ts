/**
 * Reads a packed .tgz without unpacking it to disk: a gzipped POSIX (ustar) archive of 512-byte
 * headers, each followed by its data padded to 512 bytes.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';

/** One file of a tarball. */
export interface TarEntry {
  /** Path inside the archive (`package/…`). */
  readonly path: string;
  /** Unix mode bits. */
  readonly mode: number;
  /** The file's bytes. */
  readonly data: Buffer;
}

const field = (block: Buffer, start: number, length: number): string =>
  block
    .subarray(start, start + length)
    .toString('utf8')
    .replace(/\0[\s\S]*$/, '');

/**
 * Lists the regular files of a .tgz.
 *
 * @param file - The tarball's path.
 * @returns Its files in archive order.
 */
export function readTarball(file: string): TarEntry[] {
  const tar = gunzipSync(readFileSync(file));
  const entries: TarEntry[] = [];
  for (let at = 0; at + 512 <= tar.length;) {
    const header = tar.subarray(at, at + 512);
    const name = field(header, 0, 100);
    if (name === '') break;
    const prefix = field(header, 345, 155);
    const size = parseInt(field(header, 124, 12).trim() || '0', 8);
    const type = field(header, 156, 1);
    if (type === '0' || type === '') {
      entries.push({
        path: prefix === '' ? name : `${prefix}/${name}`,
        mode: parseInt(field(header, 100, 8).trim() || '0', 8),
        data: tar.subarray(at + 512, at + 512 + size),
      });
    }
    at += 512 + Math.ceil(size / 512) * 512;
  }
  return entries;
}

/**
 * The package.json inside a packed tarball.
 *
 * @param file - The tarball's path.
 * @returns The manifest.
 * @throws Error when the tarball has none.
 */
export function readPackedManifest(file: string): Record<string, unknown> {
  const entry = readTarball(file).find((e) => e.path === 'package/package.json');
  if (entry === undefined) throw new Error(`${file} holds no package/package.json`);
  return JSON.parse(entry.data.toString('utf8')) as Record<string, unknown>;
}
