/**
 * Temporary files that must not survive the process, and the process's way to stop when it is
 * told to. While at least one file is pending, handlers for SIGINT, SIGTERM and SIGHUP remove
 * them synchronously and then let the signal take its default course (the process dies by that
 * signal, with the usual exit status); when none is pending the handlers are removed, so the
 * process's signal behaviour is untouched. A normal or `process.exit()` exit removes them too.
 * SIGKILL cannot be caught: then a temporary file may be left beside the output, but never a
 * partial file at the output path itself.
 *
 * A process started by a runner that does not pass signals on (pnpm ends its own process on
 * SIGTERM and leaves the command running) can also stop with its parent: see
 * {@link stopWithParent}.
 */
import { unlinkSync } from 'node:fs';

const pending = new Set<string>();
const signals = ['SIGINT', 'SIGTERM', 'SIGHUP'] as const;

function removeAll(): void {
  for (const path of pending) {
    try {
      unlinkSync(path);
    } catch {
      // already gone
    }
  }
  pending.clear();
}

/** Removes the pending files and ends the process by `signal` (its default action). */
function terminate(signal: NodeJS.Signals): never {
  removeAll();
  uninstall();
  process.kill(process.pid, signal);
  // The default action of SIGINT, SIGTERM and SIGHUP ends the process before this line.
  process.exit(128 + (signal === 'SIGINT' ? 2 : signal === 'SIGHUP' ? 1 : 15));
}

function onSignal(signal: NodeJS.Signals): void {
  terminate(signal);
}

function onExit(): void {
  removeAll();
}

function install(): void {
  for (const s of signals) process.on(s, onSignal);
  process.on('exit', onExit);
}

function uninstall(): void {
  for (const s of signals) process.off(s, onSignal);
  process.off('exit', onExit);
}

/** Registers a temporary file for removal on a signal or exit. */
export function addPendingTempFile(path: string): void {
  if (pending.size === 0) install();
  pending.add(path);
}

/** Forgets a temporary file (it was renamed into place or removed). */
export function removePendingTempFile(path: string): void {
  if (!pending.delete(path)) return;
  if (pending.size === 0) uninstall();
}

/** The temporary files currently pending (for tests). */
export function pendingTempFiles(): readonly string[] {
  return [...pending];
}

let parentPid: number | undefined;

/**
 * Ends the process as SIGTERM would (pending files removed, exit status 143) once its parent
 * has gone: checked every 100 ms, and before any output file is moved into place
 * ({@link stopIfOrphaned}).
 *
 * @remarks
 * For the repository's `pnpm bridgework` and `pnpm demo` scripts, which start the built command
 * with `exec` as pnpm's own child: pnpm ends itself on SIGTERM without passing the signal on, and
 * the command would otherwise go on and write its output seconds later. A command started any
 * other way (a shell, a build tool) is not affected: the bin calls this only when the
 * environment variable `BRIDGEWORK_STOP_WITH_PARENT` is `1`.
 */
export function stopWithParent(): void {
  parentPid = process.ppid;
  setInterval(stopIfOrphaned, 100).unref();
}

/** Ends the process (as SIGTERM) when {@link stopWithParent} is on and the parent has gone. */
export function stopIfOrphaned(): void {
  if (parentPid !== undefined && process.ppid !== parentPid) terminate('SIGTERM');
}
