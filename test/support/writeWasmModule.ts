/**
 * `pnpm run build:wasm`: assembles the WebAssembly sources of packages/channel/src/convert/wasm/
 * (mobius.wat, rtdPolynomial.wat) with WABT's `wat2wasm` (Debian package `wabt`) and writes each
 * module's bytes into the TypeScript file beside it (mobiusWasm.ts, rtdPolynomialWasm.ts), as hex.
 * The tests (packages/channel/test/wasmKernel.test.ts, rtdPolynomialConverter.test.ts) assemble the
 * sources again and compare.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const dir = fileURLToPath(new URL('../../packages/channel/src/convert/wasm/', import.meta.url));
/** Each source, its function's name and what the function returns the bytes of. */
const modules = [
  { name: 'mobius', exported: 'mobiusWasmBytes', what: 'the Möbius kernel' },
  { name: 'rtdPolynomial', exported: 'rtdPolynomialWasmBytes', what: 'the RTD polynomial loop' },
] as const;
const scratch = mkdtempSync(join(tmpdir(), 'bridgework-wasm-'));
try {
  const version = execFileSync('wat2wasm', ['--version']).toString().trim();
  for (const m of modules) {
    const target = join(scratch, `${m.name}.wasm`);
    execFileSync('wat2wasm', [join(dir, `${m.name}.wat`), '-o', target]);
    const hex = readFileSync(target).toString('hex');
    const lines = hex.match(/.{1,96}/g) ?? [];
    writeFileSync(
      join(dir, `${m.name}Wasm.ts`),
      `/**
 * The bytes of ./${m.name}.wat assembled by WABT's wat2wasm ${version}, as hex: written by
 * \`pnpm run build:wasm\`, never by hand (the test assembles the source again and compares).
 */
const HEX =
${lines.map((l) => `  '${l}'`).join(' +\n')};

/** The WebAssembly module of ${m.what} (a new copy per call). */
export function ${m.exported}(): Uint8Array {
  const bytes = new Uint8Array(HEX.length / 2);
  for (let i = 0; i < bytes.length; i++) bytes[i] = parseInt(HEX.slice(2 * i, 2 * i + 2), 16);
  return bytes;
}
`,
    );
    console.log(`${m.name}Wasm.ts: ${hex.length / 2} bytes (${version})`);
  }
} finally {
  rmSync(scratch, { recursive: true, force: true });
}
