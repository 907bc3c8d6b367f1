/**
 * Runs a program asynchronously (the local registry answers npm from this same process, so a
 * blocking spawn would deadlock), with a clean environment: nothing of the workspace's package
 * manager leaks into npm or node through `npm_*`/`pnpm_*` variables or NODE_OPTIONS.
 */
import { spawn } from 'node:child_process';

/** What a finished program gave. */
export interface RunResult {
  /** Exit status (null when killed by a signal). */
  readonly status: number | null;
  /** Standard output. */
  readonly stdout: string;
  /** Standard error. */
  readonly stderr: string;
}

/** Options of {@link run}. */
export interface RunOptions {
  /** Working directory. */
  readonly cwd: string;
  /** Extra environment variables. */
  readonly env?: Readonly<Record<string, string>>;
  /** Time limit in milliseconds (default 120 000); the program is killed past it. */
  readonly timeoutMs?: number;
}

/** The process environment without the package managers' and test runner's own variables. */
export function cleanEnv(extra: Readonly<Record<string, string>> = {}): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {};
  for (const [key, value] of Object.entries(process.env)) {
    if (/^(npm_|pnpm_|PNPM_|VITEST|NODE_OPTIONS$|NODE_PATH$|TS_NODE|TSX)/.test(key)) continue;
    env[key] = value;
  }
  return { ...env, NO_COLOR: '1', FORCE_COLOR: '0', ...extra };
}

/**
 * Runs `command args` and collects its output.
 *
 * @param command - The executable.
 * @param args - Its arguments.
 * @param options - Directory, environment, time limit.
 * @returns Status and output.
 */
export function run(command: string, args: readonly string[], options: RunOptions): Promise<RunResult> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { cwd: options.cwd, env: cleanEnv(options.env), stdio: 'pipe' });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (stdout += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (stderr += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), options.timeoutMs ?? 120_000);
    child.on('error', (e) => {
      clearTimeout(timer);
      reject(e);
    });
    child.on('close', (status) => {
      clearTimeout(timer);
      resolve({ status, stdout, stderr });
    });
  });
}

/**
 * Runs `command args` and fails with its output unless it exits 0.
 *
 * @param command - The executable.
 * @param args - Its arguments.
 * @param options - Directory, environment, time limit.
 * @returns Status and output.
 */
export async function runOk(
  command: string,
  args: readonly string[],
  options: RunOptions,
): Promise<RunResult> {
  const r = await run(command, args, options);
  if (r.status !== 0) {
    throw new Error(
      `${command} ${args.join(' ')} (in ${options.cwd}) exited ${r.status}\n${r.stdout}\n${r.stderr}`.trim(),
    );
  }
  return r;
}
