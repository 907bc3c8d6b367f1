/**
 * The WebAssembly loop of the RTD polynomial (./rtdPolynomial.wat, bytes in ./rtdPolynomialWasm.ts):
 * the expression of `segmentValue` operation for operation in binary64, so its results are the
 * JavaScript loop's bit for bit; it runs without the bounds checks a JavaScript typed-array access
 * carries. Compiled synchronously (the module is 350 bytes, under every engine's limit for a
 * synchronous compile), once per converter; undefined where the runtime has no WebAssembly.
 */
import { rtdPolynomialWasmBytes } from './rtdPolynomialWasm.js';

/** Codes per call into the module. */
export const WASM_CHUNK = 16_384;
/** Block of codes per mark (the module's block). */
export const WASM_BLOCK = 256;
/** The table: at most 1024 slots of 64 bytes (createRtdPolynomial), at byte 0. */
const TABLE_BYTES = 65_536;
const CODES_AT = TABLE_BYTES;
const OUT_AT = CODES_AT + 4 * WASM_CHUNK;
const MARKS_AT = OUT_AT + 8 * WASM_CHUNK;
const PAGES = Math.ceil((MARKS_AT + WASM_CHUNK / WASM_BLOCK) / 65_536);

/** The WebAssembly JavaScript API, as far as this module uses it (ES2022 has no types for it). */
interface WasmApi {
  Memory: new (descriptor: { initial: number; maximum: number }) => { readonly buffer: ArrayBuffer };
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: object) => { readonly exports: Record<string, unknown> };
}

/** The module's export (see ./rtdPolynomial.wat): the number of marked blocks. */
type PolyExport = (
  codes: number,
  out: number,
  n: number,
  table: number,
  marks: number,
  base: number,
  shift: number,
  offsetMask: number,
  half: number,
  slotMask: number,
  lowI: number,
  highI: number,
) => number;

/** One instance of the module with its memory: the polynomial's table and the staging buffers. */
export interface RtdPolynomialWasm {
  /** The table's storage (8192 doubles: 1024 slots), a view on the module's memory. */
  readonly table: Float64Array;
  /** Staging of a chunk of codes. */
  readonly codes: Int32Array;
  /** Staging of a chunk of values. */
  readonly values: Float64Array;
  /** One mark per block of 256 codes of the last chunk (1: convert again sample by sample). */
  readonly marks: Uint8Array;
  /** Converts the first `n` staged codes into the staged values; returns the number of marked blocks. */
  run(
    n: number,
    base: number,
    shift: number,
    offsetMask: number,
    half: number,
    slotMask: number,
    lowI: number,
    highI: number,
  ): number;
}

/** A new instance, or undefined where the runtime has no WebAssembly (or refuses to compile it). */
export function instantiateRtdPolynomialWasm(): RtdPolynomialWasm | undefined {
  const api = (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;
  if (api === undefined) return undefined;
  let poly: PolyExport;
  let buffer: ArrayBuffer;
  try {
    const memory = new api.Memory({ initial: PAGES, maximum: PAGES });
    const instance = new api.Instance(new api.Module(rtdPolynomialWasmBytes()), { env: { memory } });
    poly = instance.exports['poly'] as PolyExport;
    buffer = memory.buffer;
  } catch {
    // A content security policy without 'wasm-unsafe-eval' refuses the compile: the JavaScript loop serves.
    return undefined;
  }
  return {
    table: new Float64Array(buffer, 0, TABLE_BYTES / 8),
    codes: new Int32Array(buffer, CODES_AT, WASM_CHUNK),
    values: new Float64Array(buffer, OUT_AT, WASM_CHUNK),
    marks: new Uint8Array(buffer, MARKS_AT, WASM_CHUNK / WASM_BLOCK),
    run: (n, base, shift, offsetMask, half, slotMask, lowI, highI) =>
      poly(CODES_AT, OUT_AT, n, 0, MARKS_AT, base, shift, offsetMask, half, slotMask, lowI, highI),
  };
}
