/**
 * The channels the emitter tests generate headers for (invented: a hopper scale with a fine and a
 * coarse weighing channel, a tare trim and a temperature-compensation curve), and a C driver
 * program that prints every evaluator's result for codes read from stdin.
 */
import {
  designFirmwareConstants,
  fixedPointMap,
  floatMap,
  type FirmwareChannel,
  type FirmwareFixedMap,
  type FirmwareFloatMap,
} from '@bridgework/firmware';

/** A 20-bit converter: small enough for exhaustive verification in milliseconds. */
export const RANGE_20 = { codeMin: -(2 ** 19), codeMax: 2 ** 19 - 1 } as const;

// 30 kg cell, 1.9876 mV/V, gain 128, 20-bit bipolar: 128·2^19 = 2^26 codes per V/V.
const scale = '30/133385.5780864'; // kg per code = 30 / (0.0019876 · 2^26)

export function testChannels(): FirmwareChannel[] {
  const weight: FirmwareChannel = {
    name: 'Weight',
    fixed: fixedPointMap({ scale, offset: '-2.75', outputUnit: '0.001', ...RANGE_20, quantityUnit: 'kg' }),
    float32: floatMap({
      kind: 'affine',
      scale,
      offset: '-2.75',
      precision: 'float32',
      ...RANGE_20,
      quantityUnit: 'kg',
    }),
    float64: floatMap({
      kind: 'affine',
      scale,
      offset: '-2.75',
      precision: 'float64',
      ...RANGE_20,
      quantityUnit: 'kg',
    }),
  };
  // A name built to break things: a comment end, quotes, a backslash, a trigraph, non-ASCII letters.
  const coarse: FirmwareChannel = {
    name: 'Zelle "B" */ Wägung ??/ \\ µ',
    fixed: fixedPointMap({
      scale,
      offset: '1234.5',
      outputUnit: '0.1',
      ...RANGE_20,
      quantityUnit: 'kg',
      coefficientBits: 16,
      accumulatorBits: 32,
      rounding: 'half-away',
    }),
  };
  const trim: FirmwareChannel = {
    name: 'tare trim',
    fixed: fixedPointMap({
      scale: '-0.375',
      outputUnit: '1',
      codeMin: -4096,
      codeMax: 4095,
      rounding: 'floor',
      quantityUnit: 'count',
    }),
    float32: floatMap({
      kind: 'polynomial',
      coefficients: ['-0.375'],
      precision: 'float32',
      codeMin: -4096,
      codeMax: 4095,
      quantityUnit: 'count',
    }),
  };
  const curve: FirmwareChannel = {
    name: 'Temperature curve',
    fixed: fixedPointMap({
      scale: '1500000000',
      outputUnit: '1',
      codeMin: -1,
      codeMax: 1,
      quantityUnit: 'mK',
    }),
    float32: floatMap({
      kind: 'polynomial',
      coefficients: ['-1500000000', '1500000000', '-2e-3', '3e-6'],
      offset: '0.5',
      precision: 'float32',
      codeMin: -1,
      codeMax: 1,
      quantityUnit: 'mK',
    }),
    float64: floatMap({
      kind: 'polynomial',
      coefficients: ['-1500000000', '1500000000', '-2e-3', '3e-6'],
      offset: '0.5',
      precision: 'float64',
      codeMin: -1,
      codeMax: 1,
      quantityUnit: 'mK',
    }),
  };
  return [weight, coarse, trim, curve];
}

interface Driven {
  readonly identifier: string;
  readonly fixed?: FirmwareFixedMap | undefined;
  readonly float32?: FirmwareFloatMap | undefined;
  readonly float64?: FirmwareFloatMap | undefined;
}

/**
 * A C program that reads "channel code" pairs and prints, per line, `out` for a code outside the
 * range, or the fixed output and the float results' bit patterns in hex.
 */
export function driverProgram(prefix: string, channels: readonly Driven[]): string {
  const cases = channels.map((ch, i) => {
    const p = `${prefix}_${ch.identifier}`;
    const parts: string[] = [];
    if (ch.fixed !== undefined) parts.push(`printf(" %" PRId32, ${p}_fixed(c));`);
    if (ch.float32 !== undefined) parts.push(`printf(" %08" PRIx32, bits32(${p}_f32(c)));`);
    if (ch.float64 !== undefined) parts.push(`printf(" %016" PRIx64, bits64(${p}_f64(c)));`);
    return [
      `        case ${i}:`,
      `            if (!${p}_in_range(c)) { puts("out"); break; }`,
      ...parts.map((s) => `            ${s}`),
      "            putchar('\\n');",
      '            break;',
    ].join('\n');
  });
  return `#include <inttypes.h>
#include <stdio.h>
#include <string.h>
#include "constants.h"

static uint32_t bits32(float x) { uint32_t u; memcpy(&u, &x, sizeof u); return u; }
static uint64_t bits64(double x) { uint64_t u; memcpy(&u, &x, sizeof u); return u; }

int main(void)
{
    int channel;
    long code;
    while (scanf("%d %ld", &channel, &code) == 2) {
        const int32_t c = (int32_t)code;
        switch (channel) {
${cases.join('\n')}
        default:
            return 1;
        }
    }
    return 0;
}
`;
}

const view = new DataView(new ArrayBuffer(8));

/** The line the driver prints for a code, computed in TypeScript. */
export function expectedLine(ch: Driven, code: number, codeMin: number, codeMax: number): string {
  if (code < codeMin || code > codeMax) return 'out';
  const parts: string[] = [];
  if (ch.fixed !== undefined) parts.push(String(ch.fixed.evaluate(code)));
  if (ch.float32 !== undefined) {
    view.setFloat32(0, ch.float32.evaluate(code));
    parts.push(view.getUint32(0).toString(16).padStart(8, '0'));
  }
  if (ch.float64 !== undefined) {
    view.setFloat64(0, ch.float64.evaluate(code));
    parts.push(view.getBigUint64(0).toString(16).padStart(16, '0'));
  }
  return ` ${parts.join(' ')}`;
}

/**
 * Two channels designed against exact maps (invented): a platinum-resistance-like curve over 12
 * bits, and a quarter-bridge-like linear-fractional map read by a target that divides in hardware.
 * Small, so the reviewed snapshot of their header stays readable.
 */
export function designedChannels(): FirmwareChannel[] {
  const rtdLike = designFirmwareConstants({
    name: 'Oven temperature',
    exact: (c) => 250 * (c / 4096) + 12 * (c / 4096) ** 2 - 3 * (c / 4096) ** 3,
    referenceError: { bound: 1e-12, source: 'three binary64 operations on values below 300 (test)' },
    codeMin: 0,
    codeMax: 4095,
    quantityUnit: '°C',
    targetError: 0.005,
    outputUnit: '0.001',
    maxTableBytes: 256,
  });
  const bridgeLike = designFirmwareConstants({
    name: 'Strut strain',
    exact: (c) => (2000 * (c / 2048)) / (1 + 0.08 * (c / 2048)),
    codeMin: -2048,
    codeMax: 2047,
    quantityUnit: 'µε',
    // So tight that the linear-fractional form, exact in shape, is the cheapest float64 function.
    targetError: 1e-6,
    types: ['float64'],
    hardwareDivide: true,
  });
  return [rtdLike, bridgeLike];
}
