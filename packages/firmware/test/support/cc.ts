/**
 * C compilers for the firmware tests: find them, and compile and run generated headers.
 *
 * Policy (DEVELOPERS.md, CI): a missing compiler skips the test locally but fails it when `CI` is
 * set, so CI can never pass without compiling.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** The strict flags of the issue: every warning is an error, ISO C99, no extensions. */
export const STRICT_FLAGS = ['-std=c99', '-Wall', '-Wextra', '-Wconversion', '-Werror', '-pedantic'];

/** Cortex-M4F with its single-precision FPU, hard-float ABI. */
export const CORTEX_M4F_FLAGS = ['-mcpu=cortex-m4', '-mthumb', '-mfpu=fpv4-sp-d16', '-mfloat-abi=hard'];

/** Whether an executable is on the PATH. */
export function hasCompiler(name: string): boolean {
  return spawnSync(name, ['--version'], { encoding: 'utf8' }).status === 0;
}

/**
 * Skips (locally) or fails (under CI) when the compiler is missing; returns true when it is there.
 */
export function needCompiler(name: string, skip: () => void): boolean {
  if (hasCompiler(name)) return true;
  if (process.env['CI'] !== undefined) {
    throw new Error(`${name} is required under CI (install it through APT_PACKAGES in .ci/run)`);
  }
  skip();
  return false;
}

/** A scratch directory, removed by the returned function. */
export function scratch(): { dir: string; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'bridgework-firmware-'));
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Writes files into dir. */
export function writeFiles(dir: string, files: Record<string, string>): void {
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
}

/** Runs a compiler; throws with its diagnostics on failure. */
export function compile(compiler: string, args: readonly string[], cwd: string): void {
  const r = spawnSync(compiler, args, { cwd, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`${compiler} ${args.join(' ')} failed:\n${r.stderr}${r.stdout}`);
}

/** Runs a program with text on stdin and returns its stdout. */
export function run(program: string, input: string, cwd: string): string {
  return execFileSync(program, [], { cwd, input, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
}
