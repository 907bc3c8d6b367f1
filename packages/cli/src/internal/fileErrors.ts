import { open, stat, type FileHandle } from 'node:fs/promises';
import { BridgeworkError } from '@bridgework/core';

/** A readable message for a failed file operation. */
export function describeFsError(e: unknown): string {
  switch ((e as NodeJS.ErrnoException).code) {
    case 'ENOENT':
      return 'no such file';
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'EISDIR':
      return 'it is a folder';
    default:
      return (e as Error).message;
  }
}

/** Stats an input file; throws `io-error` naming the file when it is missing or not a file. */
export async function statInput(file: string): Promise<number> {
  try {
    const s = await stat(file);
    if (!s.isFile())
      throw new BridgeworkError('io-error', `cannot read ${file}: not a file`, { param: file });
    return s.size;
  } catch (e) {
    if (e instanceof BridgeworkError) throw e;
    throw new BridgeworkError('io-error', `cannot read ${file}: ${describeFsError(e)}`, {
      param: file,
      cause: e,
    });
  }
}

/** Opens an input file for reading; throws `io-error` naming the file. */
export async function openInput(file: string): Promise<FileHandle> {
  try {
    return await open(file, 'r');
  } catch (e) {
    throw new BridgeworkError('io-error', `cannot read ${file}: ${describeFsError(e)}`, {
      param: file,
      cause: e,
    });
  }
}
