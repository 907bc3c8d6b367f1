/** Test helpers: files in a per-test-file temporary folder, and little-endian int32 bytes. */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { useTempDir } from './tempDir.js';

export function useTestFiles(prefix: string): {
  tmp: () => string;
  file: (name: string, content: string | Uint8Array) => string;
  outPath: (name: string) => string;
} {
  const tmp = useTempDir(prefix);
  let n = 0;
  return {
    tmp,
    file(name, content) {
      const path = join(tmp(), `${++n}-${name}`);
      writeFileSync(path, content);
      return path;
    },
    outPath: (name) => join(tmp(), `${++n}-${name}`),
  };
}

/** Little-endian int32 bytes, written independently of the readers with DataView. */
export function int32le(values: readonly number[]): Uint8Array {
  const bytes = new Uint8Array(values.length * 4);
  const view = new DataView(bytes.buffer);
  values.forEach((v, i) => view.setInt32(4 * i, v, true));
  return bytes;
}
