/**
 * The optional WebAssembly SIMD path (issue 19 item 6): its module rebuilt from its source with
 * WABT's `wat2wasm` equals the bytes the package ships; its results and statuses equal
 * `channel.convert` bit for bit (rails, impossible codes, chunk edges); it refuses what it cannot
 * do in the user's terms.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createChannel, createWasmConverter, type ChannelSpec } from '@bridgework/channel';
import { mobiusWasmBytes } from '../src/convert/wasm/mobiusWasm.js';

const RAIL_LOW = -(2 ** 23);
const RAIL_HIGH = 2 ** 23 - 1;

const gusset: ChannelSpec = {
  name: 'gusset plate',
  sensor: {
    kind: 'strain-gauge',
    gaugeFactor: 2.11,
    gaugeOhms: 350,
    gaugeFactorTemperatureCoefficientPerKelvin: 1.0e-4,
  },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', cable: { awg: 26, lengthMeters: 22 } },
  excitation: { volts: 2.5 },
  amplifier: { gain: 64 },
  adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
  zero: { code: -18433 },
  environment: { temperatureCelsius: 15, rangeCelsius: [5, 25] },
  output: { quantity: 'strain', unit: 'µε', range: [-300, 1200] },
};

/** The error a promise rejects with, rethrown by a function (for toThrowBridgeworkError). */
async function rejection(promise: Promise<unknown>): Promise<() => never> {
  const error: unknown = await promise.then(
    () => new Error('resolved'),
    (e: unknown) => e,
  );
  return () => {
    throw error;
  };
}

/** Index of the first sample where `got` and `want` differ (Object.is: NaN equals NaN), or −1. */
function firstDifference(got: ArrayLike<number>, want: ArrayLike<number>, n: number): number {
  for (let i = 0; i < n; i++) if (!Object.is(got[i], want[i])) return i;
  return -1;
}

describe('WebAssembly SIMD kernel', () => {
  it('the shipped module is its source assembled by wat2wasm (WABT), byte for byte', () => {
    // `.ci/run` installs Debian's wabt; without it this check cannot run and fails.
    const source = fileURLToPath(new URL('../src/convert/wasm/mobius.wat', import.meta.url));
    const dir = mkdtempSync(join(tmpdir(), 'bridgework-wasm-'));
    try {
      const target = join(dir, 'mobius.wasm');
      execFileSync('wat2wasm', [source, '-o', target]);
      expect(Buffer.from(mobiusWasmBytes()).equals(readFileSync(target))).toBe(true);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('equals channel.convert bit for bit, statuses included, across rails, chunks and odd lengths', async () => {
    const ch = createChannel(gusset);
    const wasm = await createWasmConverter(ch, { pages: 16 });
    const lo = Math.floor(ch.validCodes.min) + 1;
    const hi = Math.ceil(ch.validCodes.max) - 1;
    await fc.assert(
      fc.asyncProperty(
        fc.array(
          fc.oneof(
            { weight: 8, arbitrary: fc.integer({ min: lo, max: hi }) },
            { weight: 1, arbitrary: fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }) },
            { weight: 1, arbitrary: fc.constantFrom(RAIL_LOW, RAIL_HIGH, lo - 1, hi + 1, lo, hi, 0) },
          ),
          { maxLength: 40_000 },
        ),
        fc.integer({ min: 0, max: 3 }),
        async (list, shift) => {
          const n = list.length;
          const codes = new Int32Array(wasm.memory.buffer, 4 * shift, n);
          codes.set(list);
          const out = new Float64Array(
            wasm.memory.buffer,
            8 * (Math.ceil((4 * shift + 4 * n) / 8) + shift),
            n,
          );
          const got = wasm.convert(codes, out, { maxLocations: 16 });
          const want = ch.convert(Int32Array.from(list), undefined, { maxLocations: 16 });
          expect(firstDifference(got.values, want.values, n)).toBe(-1);
          expect(got.status).toEqual(want.status);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('rejections at the edges of the 16 384-code chunks, in place of a JS revisit of each chunk', async () => {
    const ch = createChannel(gusset);
    const wasm = await createWasmConverter(ch, { pages: 16 });
    const n = 50_001;
    const codes = new Int32Array(wasm.memory.buffer, 0, n);
    for (let i = 0; i < n; i++) codes[i] = ((i * 7919) % 200_001) - 100_000;
    for (const i of [0, 16_383, 16_384, 32_767, 32_768, 49_152, n - 1])
      codes[i] = i % 2 === 0 ? RAIL_LOW : RAIL_HIGH;
    const out = new Float64Array(wasm.memory.buffer, 4 * n + 4, n);
    const got = wasm.convert(codes, out);
    const want = ch.convert(codes.slice());
    expect(firstDifference(got.values, want.values, n)).toBe(-1);
    expect(got.status).toEqual(want.status);
    expect(got.status.rejected).toBe(7);
  });

  it('every code of the gusset’s 24-bit range, bit for bit (2^24 codes)', async () => {
    const ch = createChannel(gusset);
    const n = 2 ** 24;
    const wasm = await createWasmConverter(ch, { pages: Math.ceil((12 * n) / 65536) + 1 });
    const codes = new Int32Array(wasm.memory.buffer, 0, n);
    for (let i = 0; i < n; i++) codes[i] = RAIL_LOW + i;
    const out = new Float64Array(wasm.memory.buffer, 4 * n, n);
    const got = wasm.convert(codes, out);
    const want = ch.convert(codes.slice());
    expect(firstDifference(got.values, want.values, n)).toBe(-1);
    expect(got.status).toEqual(want.status);
  }, 120_000);

  it('refuses channels without a Möbius map, views on other memory, short or overlapping outputs', async () => {
    const rtd = createChannel({
      name: 'kiln',
      sensor: { kind: 'rtd', r0Ohms: 100 },
      bridge: { wiring: 'three-wire', ohmsPerLead: 0.4 },
      excitation: { volts: 1 },
      amplifier: { gain: 8 },
      adc: { bits: 24, referenceVolts: 1, ratiometric: true },
      output: { quantity: 'temperature' },
    });
    expect(await rejection(createWasmConverter(rtd))).toThrowBridgeworkError('invalid-option', {
      param: 'channel',
    });
    const ch = createChannel(gusset);
    expect(await rejection(createWasmConverter(ch, { page: 2 } as never))).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'options.page',
      },
    );
    expect(await rejection(createWasmConverter(ch, { memory: {} as never }))).toThrowBridgeworkError(
      'wrong-type',
      {
        param: 'options.memory',
      },
    );
    const wasm = await createWasmConverter(ch);
    const inside = new Int32Array(wasm.memory.buffer, 0, 8);
    expect(() =>
      wasm.convert(new Int32Array(8), new Float64Array(wasm.memory.buffer, 64, 8)),
    ).toThrowBridgeworkError('wrong-type', { param: 'codes' });
    expect(() => wasm.convert(inside, new Float64Array(8))).toThrowBridgeworkError('wrong-type', {
      param: 'out',
    });
    expect(() => wasm.convert(inside, new Float64Array(wasm.memory.buffer, 64, 4))).toThrowBridgeworkError(
      'invalid-shape',
      { param: 'out' },
    );
    expect(() => wasm.convert(inside, new Float64Array(wasm.memory.buffer, 0, 8))).toThrowBridgeworkError(
      'invalid-shape',
      { param: 'out' },
    );
    inside.fill(RAIL_HIGH);
    expect(() =>
      wasm.convert(inside, new Float64Array(wasm.memory.buffer, 64, 8), { onInvalid: 'throw' }),
    ).toThrowBridgeworkError('clipped', { param: 'codes' });
  });
});
