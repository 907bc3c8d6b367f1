import { randomBytes } from 'node:crypto';
import { constants as fsConstants } from 'node:fs';
import { link, open, realpath, rename, stat, unlink, type FileHandle } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { BridgeworkError } from '@bridgework/core';
import { describeFsError, describeOutputError } from '../internal/fileErrors.js';
import { addPendingTempFile, removePendingTempFile, stopIfOrphaned } from '../internal/pendingTempFiles.js';

/** Options of {@link openAtomicFile} and {@link writeFileAtomic}. */
export interface AtomicFileOptions {
  /** Replace the file if it exists already. Default false: an existing file is an error. */
  readonly force?: boolean;
  /**
   * Permission bits of the new file (before the process's umask), e.g. those of a file being
   * replaced. Default 0o666.
   */
  readonly mode?: number;
  /**
   * Called by {@link AtomicFile.commit} after the data is flushed to disk and just before the file
   * is moved into place; an error it throws aborts the commit (the temporary file is removed and
   * the target is left as it was). Used to refuse replacing a file that changed meanwhile.
   */
  readonly beforeReplace?: () => void | Promise<void>;
}

/**
 * An output file being written: data goes to a temporary file beside it, which replaces the
 * target only on {@link AtomicFile.commit}.
 */
export interface AtomicFile {
  /** The absolute path of the output file. */
  readonly path: string;
  /**
   * The absolute path of the temporary file (same folder, hidden name); for a device or named
   * pipe written straight through, the path itself.
   */
  readonly tempPath: string;
  /** Appends text (UTF-8) or bytes. Wait for each call before the next. */
  write(data: string | Uint8Array): Promise<void>;
  /** Flushes to disk, closes and moves the file into place. */
  commit(): Promise<void>;
  /** Closes and removes the temporary file; the output path is left as it was. Safe to call twice. */
  abort(): Promise<void>;
}

function ioError(message: string, path: string, cause: unknown): BridgeworkError {
  return new BridgeworkError('io-error', message, { param: path, cause });
}

/**
 * The `file-exists` error for an output path that exists already.
 *
 * @param path - The path as the user gave it.
 * @returns The error (to throw).
 */
export function fileExistsError(path: string): BridgeworkError {
  return new BridgeworkError('file-exists', `${path} exists already; pass --force to replace it`, {
    param: path,
  });
}

async function exists(path: string): Promise<boolean> {
  try {
    await stat(path);
    return true;
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return false;
    throw ioError(`cannot check ${path}: ${describeFsError(e)}`, path, e);
  }
}

/**
 * Writes all of `data` (text as UTF-8) at the handle's position, however many calls that takes.
 *
 * @returns The number of bytes written.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error`, naming `path`.
 */
async function writeAll(handle: FileHandle, data: string | Uint8Array, path: string): Promise<number> {
  const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
  let offset = 0;
  try {
    while (offset < bytes.length) {
      const { bytesWritten } = await handle.write(bytes, offset, bytes.length - offset);
      offset += bytesWritten;
    }
  } catch (e) {
    throw ioError(`cannot write ${path}: ${describeFsError(e)}`, path, e);
  }
  return bytes.length;
}

/** Bytes written between the starts of two background flushes of an atomic file (32 MiB). */
const WRITE_BACK_BYTES = 32 << 20;

/**
 * Opens an output file for atomic writing.
 *
 * @remarks
 * The data is written to a temporary file in the same folder (`.<name>.<pid>-<random>.tmp`, so
 * the final rename never crosses file systems), flushed with `fsync` and then moved into place
 * (for a large output, flushes of what is written so far start every 32 MiB in the background, so
 * the disk writes while the data is made and the final flush is short):
 * - without `force`, by a hard link, which fails if the target appeared in the meantime, so an
 *   existing file is never replaced (on file systems without hard links, a check and a rename);
 * - with `force`, by `rename`, which replaces the target atomically.
 *
 * Readers therefore see either the old file (or none) or the complete new one, never a partial
 * file. The temporary file is removed on {@link AtomicFile.abort}, on SIGINT, SIGTERM and SIGHUP,
 * and on exit; only an uncatchable SIGKILL or a power cut can leave it behind (never the target).
 * The existence check is made here, before any work, so a long conversion fails at once rather
 * than at the end. A symbolic link is followed (the file it names is replaced; the link stays). A
 * character device or named pipe (`/dev/null`, a FIFO) is written straight through, with or
 * without `force`, never replaced; a block device is refused.
 *
 * @param path - The output file (relative paths against the process's working folder).
 * @param options - `force` to allow replacing an existing file.
 * @returns The open file.
 * @throws {@link @bridgework/core!BridgeworkError} `file-exists` when the file exists and `force` is not set;
 * `io-error` when the folder is missing, the path is a folder or a block device, or the file
 * cannot be created.
 * @example
 * ```ts
 * const file = await openAtomicFile('strain.csv');
 * try {
 *   await file.write('strain\n');
 *   await file.commit();
 * } finally {
 *   await file.abort(); // no-op after commit
 * }
 * ```
 */
export async function openAtomicFile(path: string, options: AtomicFileOptions = {}): Promise<AtomicFile> {
  let target = resolve(path);
  const force = options.force === true;
  try {
    const s = await stat(target); // through symbolic links
    if (s.isDirectory()) throw ioError(`cannot write ${path}: it is a folder`, path, undefined);
    if (s.isBlockDevice()) {
      throw ioError(
        `cannot write ${path}: it is a block device (a disk or partition), which an output would overwrite; write to a file on it instead`,
        path,
        undefined,
      );
    }
    // A terminal, /dev/null or a named pipe: written straight through; replacing it by a
    // regular file (the rename below) would destroy the device node or the pipe.
    if (s.isCharacterDevice() || s.isFIFO()) return openStraight(path, target);
    if (!force) throw fileExistsError(path);
    // A symbolic link stays a link: its file is the one replaced.
    target = await realpath(target);
  } catch (e) {
    if (e instanceof BridgeworkError) throw e;
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT')
      throw ioError(`cannot write ${path}: ${describeFsError(e)}`, path, e);
  }
  const tempPath = join(
    dirname(target),
    `.${basename(target)}.${process.pid}-${randomBytes(4).toString('hex')}.tmp`,
  );
  let handle: FileHandle;
  try {
    handle = await open(
      tempPath,
      fsConstants.O_WRONLY | fsConstants.O_CREAT | fsConstants.O_EXCL,
      options.mode ?? 0o666,
    );
  } catch (e) {
    throw ioError(`cannot write ${path}: ${await describeOutputError(e, target)}`, path, e);
  }
  addPendingTempFile(tempPath);
  let state: 'open' | 'committed' | 'aborted' = 'open';
  // Write-back started while writing: every WRITE_BACK_BYTES a flush of what is written so far
  // begins in the background (one at a time), so the disk works while the data is still being
  // made and the flush at commit finds little left to do. The durability is the same: commit
  // still flushes everything before the file is moved into place.
  let unflushed = 0;
  let flushing: Promise<void> | undefined;
  let flushError: unknown;
  const startWriteBack = (): void => {
    if (flushing !== undefined || unflushed < WRITE_BACK_BYTES) return;
    unflushed = 0;
    flushing = handle.datasync().then(
      () => {
        flushing = undefined;
      },
      (e: unknown) => {
        flushError ??= e;
        flushing = undefined;
      },
    );
  };

  const closeAndRemove = async (): Promise<void> => {
    await flushing;
    await handle.close().catch(() => undefined);
    await unlink(tempPath).catch(() => undefined);
    removePendingTempFile(tempPath);
  };

  return {
    path: target,
    tempPath,
    async write(data) {
      if (state !== 'open') throw new Error(`AtomicFile.write after ${state}`);
      if (flushError !== undefined)
        throw ioError(`cannot write ${path}: ${describeFsError(flushError)}`, path, flushError);
      unflushed += await writeAll(handle, data, path);
      startWriteBack();
    },
    async commit() {
      if (state !== 'open') throw new Error(`AtomicFile.commit after ${state}`);
      try {
        await flushing;
        if (flushError !== undefined) throw flushError;
        await handle.sync();
        await handle.close();
      } catch (e) {
        throw ioError(`cannot write ${path}: ${describeFsError(e)}`, path, e);
      }
      // A run whose parent has gone (see stopWithParent) ends here, before its output appears.
      stopIfOrphaned();
      try {
        await options.beforeReplace?.();
        if (force) {
          await rename(tempPath, target);
        } else {
          try {
            await link(tempPath, target);
            await unlink(tempPath);
          } catch (e) {
            const code = (e as NodeJS.ErrnoException).code;
            if (code === 'EEXIST') throw fileExistsError(path);
            if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP' && code !== 'EXDEV') throw e;
            // No hard links here: check, then rename (a small race remains on such file systems).
            if (await exists(target)) throw fileExistsError(path);
            await rename(tempPath, target);
          }
        }
        state = 'committed';
        removePendingTempFile(tempPath);
      } catch (e) {
        state = 'aborted';
        await unlink(tempPath).catch(() => undefined);
        removePendingTempFile(tempPath);
        if (e instanceof BridgeworkError) throw e;
        throw ioError(`cannot write ${path}: ${describeFsError(e)}`, path, e);
      }
    },
    async abort() {
      if (state !== 'open') return;
      state = 'aborted';
      await closeAndRemove();
    },
  };
}

/**
 * An output that is a character device or a named pipe (`/dev/null`, a terminal, a FIFO another
 * program reads): written straight to it, nothing temporary, nothing flushed or renamed (a device
 * or pipe has no file to replace, and `fsync` does not apply to it). Opening a pipe waits for its
 * reader, as any writer of a pipe does. `commit` closes it; `abort` closes it too (what was written
 * has gone to the reader).
 */
async function openStraight(path: string, target: string): Promise<AtomicFile> {
  let handle: FileHandle;
  try {
    handle = await open(target, fsConstants.O_WRONLY);
  } catch (e) {
    throw ioError(`cannot write ${path}: ${await describeOutputError(e, target)}`, path, e);
  }
  let state: 'open' | 'committed' | 'aborted' = 'open';
  return {
    path: target,
    tempPath: target,
    async write(data) {
      if (state !== 'open') throw new Error(`AtomicFile.write after ${state}`);
      await writeAll(handle, data, path);
    },
    async commit() {
      if (state !== 'open') throw new Error(`AtomicFile.commit after ${state}`);
      state = 'committed';
      try {
        await handle.close();
      } catch (e) {
        throw ioError(`cannot write ${path}: ${describeFsError(e)}`, path, e);
      }
    },
    async abort() {
      if (state !== 'open') return;
      state = 'aborted';
      await handle.close().catch(() => undefined);
    },
  };
}

/**
 * Writes a whole output file atomically (see {@link openAtomicFile}).
 *
 * @param path - The output file.
 * @param data - Its content (text is written as UTF-8).
 * @param options - `force` to allow replacing an existing file.
 * @returns When the file is in place.
 * @throws {@link @bridgework/core!BridgeworkError} `file-exists` or `io-error`.
 * @example
 * ```ts
 * await writeFileAtomic('hopper.h', header, { force: true });
 * ```
 */
export async function writeFileAtomic(
  path: string,
  data: string | Uint8Array,
  options: AtomicFileOptions = {},
): Promise<void> {
  const file = await openAtomicFile(path, options);
  try {
    await file.write(data);
    await file.commit();
  } finally {
    await file.abort();
  }
}
