/** Test helper: a fresh temporary folder per test file, removed afterwards. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll } from 'vitest';

export function useTempDir(prefix: string): () => string {
  let dir: string | undefined;
  afterAll(() => {
    if (dir !== undefined) rmSync(dir, { recursive: true, force: true });
  });
  return () => {
    dir ??= mkdtempSync(join(tmpdir(), `bridgework-${prefix}-`));
    return dir;
  };
}
