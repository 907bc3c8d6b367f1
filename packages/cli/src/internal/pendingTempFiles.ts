/**
 * Temporary files that must not survive the process. While at least one is pending, handlers for
 * SIGINT, SIGTERM and SIGHUP remove them synchronously and then let the signal take its default
 * course (the process dies by that signal, with the usual exit status); when none is pending the
 * handlers are removed, so the process's signal behaviour is untouched. A normal or
 * `process.exit()` exit removes them too. SIGKILL cannot be caught: then a temporary file may be
 * left beside the output, but never a partial file at the output path itself.
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

function onSignal(signal: NodeJS.Signals): void {
  removeAll();
  uninstall();
  process.kill(process.pid, signal);
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
