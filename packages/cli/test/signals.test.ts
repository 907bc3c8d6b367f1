/**
 * Interrupting the command through the README's route (issue 15 item 18): `pnpm bridgework` runs
 * the built command with `exec`, as pnpm's own child, and the command stops with its parent. A
 * SIGTERM to pnpm (which ends itself without passing the signal on) or to the command itself
 * leaves neither the output file nor its temporary file, and no process behind.
 *
 * The run is a `convert` of a large (sparse) recording into a CSV file, so it is busy writing its
 * temporary file when the signal comes.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import {
  closeSync,
  existsSync,
  openSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  statSync,
  truncateSync,
  writeFileSync,
} from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { examplePath, repoRoot } from './support/footbridge.js';
import { useTempDir } from './support/tempDir.js';

const tmp = useTempDir('signals');

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function until<T>(what: string, probe: () => T | undefined, timeoutMs: number): Promise<T> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = probe();
    if (v !== undefined) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await sleep(50);
  }
}

/** The children of a process (Linux /proc), over all its threads (pnpm starts commands from any). */
function childrenOf(pid: number): number[] {
  try {
    return readdirSync(`/proc/${pid}/task`).flatMap((task) =>
      readFileSync(`/proc/${pid}/task/${task}/children`, 'utf8')
        .trim()
        .split(/\s+/)
        .filter((s) => s !== '')
        .map(Number),
    );
  } catch {
    return [];
  }
}

/** Ends whatever a failed test left running (by process id). */
function cleanUp(pids: readonly (number | undefined)[]): void {
  for (const pid of pids) {
    if (pid !== undefined && running(pid)) {
      try {
        process.kill(pid, 'SIGKILL');
      } catch {
        // gone meanwhile
      }
    }
  }
}

/** True while the process exists and is not a zombie. */
function running(pid: number): boolean {
  try {
    return readFileSync(`/proc/${pid}/stat`, 'utf8').replace(/^.*\) /, '')[0] !== 'Z';
  } catch {
    return false;
  }
}

function exited(child: ChildProcess): Promise<{ code: number | null; signal: NodeJS.Signals | null }> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null)
      resolve({ code: child.exitCode, signal: child.signalCode });
    else child.on('exit', (code, signal) => resolve({ code, signal }));
  });
}

/** Starts `pnpm bridgework convert` into `dir/out.csv` and waits until its temporary file grows. */
async function startConversion(dir: string) {
  const codes = join(dir, 'codes.bin');
  writeFileSync(codes, '');
  truncateSync(codes, 600 * 1024 * 1024); // 150 M zero codes, read from a sparse file
  const out = join(dir, 'out.csv');
  // Output to a file, as to a terminal: nothing breaks for the command when pnpm ends (a pipe
  // would, and the command would then stop for that reason instead).
  const log = join(dir, '..', `${dir.split('/').pop()}.log`);
  const fd = openSync(log, 'w');
  const pnpm = spawn('pnpm', ['bridgework', 'convert', examplePath, codes, '-o', out], {
    cwd: repoRoot,
    stdio: ['ignore', fd, fd],
    env: { ...process.env, NO_COLOR: '1' },
  });
  closeSync(fd);
  const stderr = () => (existsSync(log) ? readFileSync(log, 'utf8') : '');
  const temp = await until(
    `the temporary output file (output: ${stderr()})`,
    () => readdirSync(dir).find((f) => f.endsWith('.tmp') && statSync(join(dir, f)).size > 100_000),
    120_000,
  );
  const node = childrenOf(pnpm.pid as number).find((pid) =>
    readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('packages/cli/dist/bin.js'),
  );
  if (node === undefined) cleanUp([...childrenOf(pnpm.pid as number), pnpm.pid]);
  expect(node, 'the command runs as pnpm’s own child (exec)').toBeDefined();
  return { pnpm, node: node as number, out, temp: join(dir, temp) };
}

describe('SIGTERM through `pnpm bridgework`', () => {
  it(
    'to pnpm: the command stops too and leaves no output and no temporary file',
    { timeout: 180_000 },
    async () => {
      const dir = join(tmp(), 'pnpm');
      mkdirSync(dir);
      const run = await startConversion(dir);
      process.kill(run.pnpm.pid as number, 'SIGTERM');
      const pnpmExit = await exited(run.pnpm);
      expect(pnpmExit.code === 143 || pnpmExit.signal === 'SIGTERM').toBe(true);
      await until('the command to stop', () => (running(run.node) ? undefined : true), 10_000);
      await sleep(300);
      expect(existsSync(run.temp)).toBe(false);
      expect(existsSync(run.out)).toBe(false);
      expect(readdirSync(dir)).toEqual(['codes.bin']);
    },
  );

  it(
    'to the command: it stops by the signal and leaves no output and no temporary file',
    { timeout: 180_000 },
    async () => {
      const dir = join(tmp(), 'node');
      mkdirSync(dir);
      const run = await startConversion(dir);
      process.kill(run.node, 'SIGTERM');
      const pnpmExit = await exited(run.pnpm);
      expect(pnpmExit.code).not.toBe(0);
      await until('the command to stop', () => (running(run.node) ? undefined : true), 10_000);
      expect(existsSync(run.temp)).toBe(false);
      expect(existsSync(run.out)).toBe(false);
      expect(readdirSync(dir)).toEqual(['codes.bin']);
    },
  );
});

describe('BRIDGEWORK_STOP_WITH_PARENT', () => {
  /** The built command started by a shell that is then killed (SIGKILL: nothing is passed on). */
  async function orphanedRun(dir: string, stopWithParent: boolean) {
    mkdirSync(dir);
    const codes = join(dir, 'codes.bin');
    writeFileSync(codes, '');
    truncateSync(codes, 600 * 1024 * 1024);
    const out = join(dir, 'out.csv');
    const bin = join(repoRoot, 'packages/cli/dist/bin.js');
    const env = stopWithParent ? 'BRIDGEWORK_STOP_WITH_PARENT=1 ' : '';
    const shell = spawn(
      'sh',
      ['-c', `${env}node "${bin}" convert "${examplePath}" "${codes}" -o "${out}" & wait`],
      {
        stdio: 'ignore',
        env: { ...process.env, NO_COLOR: '1' },
      },
    );
    await until('the temporary output file', () => readdirSync(dir).find((f) => f.endsWith('.tmp')), 120_000);
    const node = childrenOf(shell.pid as number)[0];
    expect(node).toBeDefined();
    process.kill(shell.pid as number, 'SIGKILL');
    await exited(shell);
    return { node: node as number, out };
  }

  it('set: the command stops when its parent dies, leaving no files', { timeout: 180_000 }, async () => {
    const dir = join(tmp(), 'watched');
    const run = await orphanedRun(dir, true);
    try {
      await until('the orphaned command to stop', () => (running(run.node) ? undefined : true), 10_000);
      expect(readdirSync(dir)).toEqual(['codes.bin']);
    } finally {
      cleanUp([run.node]);
    }
  });

  it(
    'unset: the command goes on without its parent (as any command would)',
    { timeout: 180_000 },
    async () => {
      const dir = join(tmp(), 'unwatched');
      const run = await orphanedRun(dir, false);
      try {
        await sleep(1500);
        expect(running(run.node)).toBe(true);
      } finally {
        cleanUp([run.node]);
      }
    },
  );
});
