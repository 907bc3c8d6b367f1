/**
 * A real PostgreSQL server for tests, on a local socket (no TCP).
 *
 * - `.ci/run` starts a throwaway cluster and sets `BRIDGEWORK_PG_SOCKET` (its socket folder) and
 *   `BRIDGEWORK_PG_USER`: the tests use it.
 * - Otherwise, when Debian's PostgreSQL 15 server binaries are installed and the tests run as root,
 *   a throwaway cluster is made here (initdb and pg_ctl run as the `postgres` user; about 1–2 s) and
 *   stopped and removed at the end.
 * - Otherwise the tests that need it are skipped locally, and fail under `CI`.
 */
import { execFileSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';

const BIN = '/usr/lib/postgresql/15/bin';

export interface TestPostgres {
  readonly client: pg.Client;
  /** Closes the connection, and stops and removes a cluster made here. */
  stop(): Promise<void>;
}

/** Why no server can be had here, or `undefined` when one can. */
export function postgresUnavailable(): string | undefined {
  if (process.env['BRIDGEWORK_PG_SOCKET'] !== undefined) return undefined;
  if (!existsSync(join(BIN, 'initdb')))
    return `no PostgreSQL server binaries at ${BIN} (apt-get install postgresql)`;
  if (process.getuid?.() !== 0)
    return 'a throwaway cluster is made as root (initdb runs as the postgres user)';
  return undefined;
}

export async function startPostgres(): Promise<TestPostgres> {
  const given = process.env['BRIDGEWORK_PG_SOCKET'];
  let dir: string | undefined;
  let host = given;
  const user = process.env['BRIDGEWORK_PG_USER'] ?? 'bw';
  if (host === undefined) {
    dir = mkdtempSync(join(tmpdir(), 'bridgework-pg-'));
    chownSync(dir, Number(execFileSync('id', ['-u', 'postgres']).toString()), 0);
    const asPostgres = (cmd: string, args: string[]): void => {
      execFileSync('runuser', ['-u', 'postgres', '--', join(BIN, cmd), ...args], { stdio: 'pipe' });
    };
    asPostgres('initdb', ['-D', join(dir, 'data'), '-A', 'trust', '-U', user]);
    asPostgres('pg_ctl', [
      '-D',
      join(dir, 'data'),
      '-o',
      `-k ${dir} -c listen_addresses=''`,
      '-l',
      join(dir, 'log'),
      '-w',
      'start',
    ]);
    host = dir;
  }
  const client = new pg.Client({ host, user, database: 'postgres' });
  await client.connect();
  return {
    client,
    async stop() {
      await client.end();
      if (dir !== undefined) {
        execFileSync(
          'runuser',
          ['-u', 'postgres', '--', join(BIN, 'pg_ctl'), '-D', join(dir, 'data'), '-m', 'fast', '-w', 'stop'],
          {
            stdio: 'pipe',
          },
        );
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
