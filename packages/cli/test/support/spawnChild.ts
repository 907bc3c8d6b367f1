/** Test helper: run a TypeScript child program from source and wait for a line it prints. */
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const repoRoot = fileURLToPath(new URL('../../../../', import.meta.url));

export function spawnTs(
  script: string,
  args: readonly string[],
  nodeArgs: readonly string[] = [],
): ChildProcess {
  return spawn(
    process.execPath,
    [...nodeArgs, '--import', 'tsx', '--conditions=@bridgework/source', script, ...args],
    {
      cwd: repoRoot,
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
}

/** Resolves with the first stdout line matching `pattern`; rejects if the child exits first. */
export function waitForLine(child: ChildProcess, pattern: RegExp): Promise<RegExpExecArray> {
  return new Promise((resolve, reject) => {
    let out = '';
    let err = '';
    child.stderr?.on('data', (d: Buffer) => (err += d.toString()));
    child.stdout?.on('data', (d: Buffer) => {
      out += d.toString();
      for (const line of out.split('\n')) {
        const m = pattern.exec(line);
        if (m !== null) resolve(m);
      }
    });
    child.on('exit', (code, signal) =>
      reject(new Error(`child exited (${code ?? signal}) before ${pattern}: ${err}`)),
    );
  });
}

/** Resolves with the exit code and signal of a child. */
export function exited(child: ChildProcess): Promise<{ code: number | null; signal: NodeJS.Signals | null }> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null)
      resolve({ code: child.exitCode, signal: child.signalCode });
    else child.on('exit', (code, signal) => resolve({ code, signal }));
  });
}
