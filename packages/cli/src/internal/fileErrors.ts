import { open, stat, type FileHandle } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { BridgeworkError } from '@bridgework/core';

/**
 * The reason a file operation failed, in words: what the system said (`ENOENT`, `ENOTDIR`...)
 * turned into what it means for the path the user gave.
 *
 * @param e - The error of the failed operation.
 * @returns The reason, e.g. `'a part of the path is a file, not a folder'`.
 */
export function describeFsError(e: unknown): string {
  switch ((e as NodeJS.ErrnoException).code) {
    case 'ENOENT':
      return 'no such file';
    case 'ENOTDIR':
      return 'a part of the path is a file, not a folder';
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'EISDIR':
      return 'it is a folder';
    case 'EROFS':
      return 'the file system is read-only';
    case 'ENOSPC':
      return 'the disk is full';
    case 'EDQUOT':
      return 'the disk quota is used up';
    case 'ENAMETOOLONG':
      return 'the name is too long';
    case 'ELOOP':
      return 'the path goes round a loop of symbolic links';
    case 'EMFILE':
    case 'ENFILE':
      return 'too many files are open';
    case 'EBUSY':
    case 'ETXTBSY':
      return 'the file is busy';
    case 'EIO':
      return 'the device reported an input/output error';
    case 'EXDEV':
      return 'the file would have to move across file systems';
    case 'EINVAL':
      return 'the file system does not allow this';
    default: {
      const code = (e as NodeJS.ErrnoException).code;
      const message = e instanceof Error ? e.message : String(e);
      return code === undefined
        ? message
        : `${message.replace(/^[A-Z]+: /, '').replace(/, \w+ '.*'$/, '')} (${code})`;
    }
  }
}

/**
 * The reason an output file could not be created, in words. `ENOENT` means the folder is missing
 * — or, when the folder exists (`/proc`, `/sys`), that it does not allow new files.
 *
 * @param e - The error.
 * @param path - The output path.
 * @returns The reason.
 */
export async function describeOutputError(e: unknown, path: string): Promise<string> {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') {
    const folder = dirname(resolve(path));
    try {
      const s = await stat(folder);
      if (s.isDirectory())
        return `the folder ${folder} does not allow new files (a kernel or virtual file system?)`;
    } catch (f) {
      if ((f as NodeJS.ErrnoException).code === 'ENOTDIR') return describeFsError(f);
    }
    return `the folder ${folder} does not exist`;
  }
  return describeFsError(e);
}

/** Stats an input file; throws `io-error` naming the file and the reason when it cannot be read. */
export async function statInput(file: string): Promise<number> {
  try {
    const s = await stat(file);
    if (s.isDirectory())
      throw new BridgeworkError('io-error', `cannot read ${file}: it is a folder`, { param: file });
    if (!s.isFile())
      throw new BridgeworkError(
        'io-error',
        `cannot read ${file}: not a regular file (a device, pipe or socket)`,
        {
          param: file,
        },
      );
    if (s.size === 0 && (await holdsData(file))) {
      throw new BridgeworkError(
        'io-error',
        `cannot read ${file}: it reports a size of 0 bytes but holds data (a kernel file under /proc or /sys?); copy it to a regular file first`,
        { param: file },
      );
    }
    return s.size;
  } catch (e) {
    if (e instanceof BridgeworkError) throw e;
    throw new BridgeworkError('io-error', `cannot read ${file}: ${describeFsError(e)}`, {
      param: file,
      cause: e,
    });
  }
}

async function holdsData(file: string): Promise<boolean> {
  const handle = await open(file, 'r');
  try {
    const { bytesRead } = await handle.read(new Uint8Array(1), 0, 1, 0);
    return bytesRead > 0;
  } finally {
    await handle.close();
  }
}

/** Opens an input file for reading; throws `io-error` naming the file and the reason. */
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

/**
 * Refuses an output file that is one of the inputs (the same file on disk, by device and inode,
 * whatever the path, link or symbolic link), since writing it would destroy the input.
 *
 * @param output - The output path.
 * @param inputs - The input paths.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` (param `--out`) naming both.
 */
export async function refuseOutputOverInputs(output: string, inputs: readonly string[]): Promise<void> {
  let out;
  try {
    out = await stat(output);
  } catch {
    return; // no file there yet (or not reachable: opening the output reports it)
  }
  for (const input of inputs) {
    let s;
    try {
      s = await stat(input);
    } catch {
      continue;
    }
    if (s.dev === out.dev && s.ino === out.ino) {
      throw new BridgeworkError(
        'invalid-option',
        `the output ${output} is the input ${input} (the same file); writing it would destroy the input, so choose another output file`,
        { param: '--out', value: output },
      );
    }
  }
}
