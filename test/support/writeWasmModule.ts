/**
 * `pnpm run build:wasm`: assembles packages/channel/src/convert/wasm/mobius.wat with WABT's
 * `wat2wasm` (Debian package `wabt`) and writes the bytes into mobiusWasm.ts beside it, as hex. The
 * test (packages/channel/test/wasmKernel.test.ts) assembles the source again and compares.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const dir = fileURLToPath(new URL('../../packages/channel/src/convert/wasm/', import.meta.url));
const scratch = mkdtempSync(join(tmpdir(), 'bridgework-wasm-'));
try {
  const target = join(scratch, 'mobius.wasm');
  execFileSync('wat2wasm', [join(dir, 'mobius.wat'), '-o', target]);
  const version = execFileSync('wat2wasm', ['--version']).toString().trim();
  const hex = readFileSync(target).toString('hex');
  const lines = hex.match(/.{1,96}/g) ?? [];
  writeFileSync(
    join(dir, 'mobiusWasm.ts'),
    `/**
 * The bytes of ./mobius.wat assembled by WABT's wat2wasm ${version}, as hex: written by
 * \`pnpm run build:wasm\`, never by hand (the test assembles the source again and compares).
 */
const HEX =
${lines.map((l) => `  '${l}'`).join(' +\n')};

/** The WebAssembly module of the Möbius kernel (a new copy per call). */
export function mobiusWasmBytes(): Uint8Array {
  const bytes = new Uint8Array(HEX.length / 2);
  for (let i = 0; i < bytes.length; i++) bytes[i] = parseInt(HEX.slice(2 * i, 2 * i + 2), 16);
  return bytes;
}
`,
  );
  console.log(`mobiusWasm.ts: ${hex.length / 2} bytes (${version})`);
} finally {
  rmSync(scratch, { recursive: true, force: true });
}
