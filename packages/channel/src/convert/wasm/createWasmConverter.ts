/**
 * The optional WebAssembly SIMD path of Möbius channels, loaded only on request: for applications
 * whose codes already live in WebAssembly memory (a data-acquisition driver compiled to
 * WebAssembly), converted there without a copy.
 */
import { BridgeworkError, checkInteger, checkObject, checkOptions } from '@bridgework/core';
import type { Channel } from '../../Channel.js';
import { channelInternals } from '../../internal/makeChannel.js';
import { checkConvertOptions } from '../../internal/convertOptions.js';
import {
  newTally,
  statusOf,
  throwIfRejected,
  type ConversionResult,
  type ConvertOptions,
} from '../ConversionStatus.js';
import { buffersOverlap, convertLinearFractional, type LinearFractionalKernel } from '../kernel.js';

/**
 * A WebAssembly memory, as the WebAssembly JavaScript API gives it (`WebAssembly.Memory`); only
 * what the converter uses is named here, so the types need no DOM or Node library.
 */
export interface WasmMemory {
  /** The memory's current buffer (replaced when the memory grows). */
  readonly buffer: ArrayBuffer;
  /** Grows the memory by `delta` pages of 64 KiB; returns the previous size in pages. */
  grow(delta: number): number;
}

/** Options of {@link createWasmConverter}. */
export interface WasmConverterOptions {
  /** The memory the codes and outputs live in (the application's own). Default: a new memory. */
  readonly memory?: WasmMemory;
  /** Pages of 64 KiB of a new memory (an integer in [1, 65536]). Default 1. */
  readonly pages?: number;
}

/** A channel's conversion in WebAssembly SIMD (see {@link createWasmConverter}). */
export interface WasmConverter {
  /** The memory the converter reads and writes. */
  readonly memory: WasmMemory;
  /**
   * Converts Int32 codes into quantities, both views of {@link WasmConverter.memory}, with the
   * results and status of `channel.convert` bit for bit.
   *
   * @param codes - An Int32Array on `memory.buffer`.
   * @param out - A Float64Array on `memory.buffer` of at least `codes.length`, sharing no memory
   *   with `codes`.
   * @param options - As for `channel.convert`.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` for views on other memory;
   *   `invalid-shape` for a short or overlapping `out`; as `channel.convert` for the options.
   */
  convert(codes: Int32Array, out: Float64Array, options?: ConvertOptions): ConversionResult;
}

/** The WebAssembly JavaScript API, as far as this module uses it (ES2022 has no types for it). */
interface WasmApi {
  Memory: new (descriptor: { initial: number }) => WasmMemory;
  instantiate(
    bytes: Uint8Array,
    imports: { env: { memory: WasmMemory } },
  ): Promise<{ instance: { exports: { mobius: MobiusExport } } }>;
}

/** The module's export: the or-ed range flags (negative when some code is outside [lowI, highI]). */
type MobiusExport = (
  codes: number,
  out: number,
  n: number,
  a: number,
  b: number,
  c: number,
  d: number,
  lowI: number,
  highI: number,
) => number;

/** Codes per call into the module; a chunk with a rejected code is converted again by the JS kernel. */
const CHUNK = 16_384;

/**
 * Creates a WebAssembly SIMD converter for a channel whose map is one Möbius function
 * (`channel.map.form === 'mobius'`), loading the module (512 bytes) on this call only.
 *
 * @remarks
 * The module evaluates (a·x + b)/(c·x + d) two samples per instruction in binary64, multiply, add,
 * multiply, add, divide, without fused operations, so its results are those of the JavaScript
 * kernel bit for bit; it folds the integer range test of the JavaScript kernel per call of 16 384
 * codes, and a chunk with a rejected code is converted again by the JavaScript kernel (NaN, counted
 * and located as `convert` does). It helps only when the codes already live in WebAssembly memory:
 * copying them in and the results out costs what it saves (docs/performance.md). The module's
 * source is `src/convert/wasm/mobius.wat` of this package; the test rebuilds it with `wat2wasm`
 * (WABT) and compares the bytes.
 *
 * @param channel - A channel made by `createChannel` with a Möbius map.
 * @param options - The memory, or the size of a new one.
 * @returns The converter.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a channel without a
 *   Möbius map (its `convert` is the path); `wrong-type` when the runtime has no WebAssembly or
 *   for a memory without a buffer; `unknown-option` for a key it does not know.
 * @example
 * ```ts
 * const wasm = await createWasmConverter(channel, { pages: 16 });
 * const codes = new Int32Array(wasm.memory.buffer, 0, 4096); // filled by the driver
 * const out = new Float64Array(wasm.memory.buffer, 16_384, 4096);
 * wasm.convert(codes, out).status.rejected; // 0
 * ```
 */
export async function createWasmConverter(
  channel: Channel,
  options: WasmConverterOptions = {},
): Promise<WasmConverter> {
  const o = checkOptions('options', options, { known: ['memory', 'pages'] });
  const internals = channelInternals(channel);
  const api = (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;
  if (api === undefined) {
    throw new BridgeworkError('wrong-type', 'this runtime has no WebAssembly: use `channel.convert`', {
      param: 'WebAssembly',
    });
  }
  if (internals.mappingAt(undefined).kernel === undefined) {
    throw new BridgeworkError(
      'invalid-option',
      `channel '${channel.name}' has no single Möbius map (map.form '${channel.map.form}'): convert it with \`channel.convert\``,
      { param: 'channel', value: channel.map.form },
    );
  }
  let memory: WasmMemory;
  if (o['memory'] !== undefined) {
    const m = checkObject('options.memory', o['memory']) as Partial<WasmMemory>;
    if (!(m.buffer instanceof ArrayBuffer) || typeof m.grow !== 'function') {
      throw new BridgeworkError('wrong-type', '`options.memory` must be a WebAssembly.Memory', {
        param: 'options.memory',
      });
    }
    memory = m as WasmMemory;
  } else {
    const pages =
      o['pages'] === undefined ? 1 : checkInteger('options.pages', o['pages'], { min: 1, max: 65536 });
    memory = new api.Memory({ initial: pages });
  }
  const { mobiusWasmBytes } = await import('./mobiusWasm.js');
  const { instance } = await api.instantiate(mobiusWasmBytes(), { env: { memory } });
  const mobius = instance.exports.mobius;

  function convert(codes: Int32Array, out: Float64Array, convertOptions?: ConvertOptions): ConversionResult {
    const opts = checkConvertOptions(convertOptions);
    if (!(codes instanceof Int32Array) || codes.buffer !== memory.buffer) {
      throw new BridgeworkError('wrong-type', "`codes` must be an Int32Array on the converter's memory", {
        param: 'codes',
      });
    }
    if (!(out instanceof Float64Array) || out.buffer !== memory.buffer) {
      throw new BridgeworkError('wrong-type', "`out` must be a Float64Array on the converter's memory", {
        param: 'out',
      });
    }
    if (out.length < codes.length || buffersOverlap(codes, out)) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`out\` must hold at least ${codes.length} values and share no memory with \`codes\``,
        { param: 'out', limit: codes.length },
      );
    }
    const maxLocations = opts['maxLocations'] === undefined ? 1024 : (opts['maxLocations'] as number);
    const m = internals.mappingAt(opts['temperatureCelsius'] as number | undefined);
    const k: LinearFractionalKernel | undefined = m.kernel;
    if (k === undefined) {
      throw new BridgeworkError(
        'invalid-option',
        `channel '${channel.name}' has no single Möbius map at this temperature: convert it with \`channel.convert\``,
        { param: 'options.temperatureCelsius', value: opts['temperatureCelsius'] },
      );
    }
    const tally = newTally(maxLocations, m.model.adc.codeMin, m.model.adc.codeMax);
    const n = codes.length;
    if (k.lo >= -(2 ** 30) && k.hi <= 2 ** 30) {
      const lowI = Math.floor(k.lo) + 1;
      const highI = Math.ceil(k.hi) - 1;
      for (let s = 0; s < n; s += CHUNK) {
        const count = n - s > CHUNK ? CHUNK : n - s;
        const flags = mobius(
          codes.byteOffset + 4 * s,
          out.byteOffset + 8 * s,
          count,
          k.a,
          k.b,
          k.c,
          k.d,
          lowI,
          highI,
        );
        if (flags < 0) convertLinearFractional(codes, out, k, tally, s, 1, count, s, 1);
      }
    } else convertLinearFractional(codes, out, k, tally, 0, 1, n, 0, 1);
    const status = statusOf(tally, n, 'kernel');
    if (opts['onInvalid'] === 'throw') throwIfRejected(status, channel.name);
    return { values: out, status };
  }

  return Object.freeze({ memory, convert });
}
