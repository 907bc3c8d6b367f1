import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  emitJson,
  FIRMWARE_GENERATOR_VERSION,
  type EmitOptions,
  type FixedPiecewiseMap,
  type FixedPointMap,
  type FloatMap,
} from '@bridgework/firmware';
import { designedChannels, testChannels } from './support/channels.js';

const channels = testChannels();
const text = emitJson({ channels, prefix: 'hopper' });
const json = JSON.parse(text) as {
  generator: string;
  caution: string;
  prefix: string;
  channels: Record<string, any>[];
};

describe('emitJson', () => {
  it('carries the generator, the caution and every channel with its name as given', () => {
    expect(json.generator).toBe(`@bridgework/firmware ${FIRMWARE_GENERATOR_VERSION}`);
    expect(json.caution).toMatch(/do not replace, qualified engineering judgement/);
    expect(json.channels.map((c) => c.name)).toEqual(channels.map((c) => c.name));
    expect(json.channels[1]!.name).toBe('Zelle "B" */ Wägung ??/ \\ µ'); // JSON escapes it; nothing to sanitise
    expect(json.channels[1]!.identifier).toBe('zelle_b_wagung_u');
    expect(text.endsWith('\n')).toBe(true);
  });

  it('holds the same constants as the maps, with functions named as in the header', () => {
    const weight = channels[0] as unknown as { fixed: FixedPointMap; float32: FloatMap; float64: FloatMap };
    const j = json.channels[0]!;
    expect(j.fixed.function).toBe('hopper_weight_fixed');
    expect(j.fixed.multiplier).toBe(weight!.fixed!.multiplier);
    expect(j.fixed.shift).toBe(weight!.fixed!.shift);
    expect(j.fixed.bias).toBe(weight!.fixed!.bias);
    expect(j.fixed.qFormat).toBe(weight!.fixed!.qFormat.text);
    expect(j.fixed.maxAbsError).toBe(weight!.fixed!.maxAbsError);
    // 64-bit figures are strings: they can pass 2^53.
    expect(j.fixed.accumulatorRange.max).toBe(String(weight!.fixed!.accumulatorRange.max));
    expect(j.float32.function).toBe('hopper_weight_f32');
    expect(j.float32.scale).toBe(weight!.float32!.kind === 'affine' ? weight!.float32!.scale : NaN);
    expect(j.float64.offset).toBe(weight!.float64!.offset);
  });

  it('gives each float constant its IEEE 754 bit pattern, checked through a DataView', () => {
    const view = new DataView(new ArrayBuffer(8));
    const j = json.channels[3]!;
    j.float32.coefficients.forEach((c: number, k: number) => {
      view.setFloat32(0, c);
      expect(j.float32.coefficientsHex[k]).toBe(`0x${view.getUint32(0).toString(16).padStart(8, '0')}`);
    });
    // −1.5e9 in binary32: sign 1, exponent 30 + 127 = 157, fraction 0.3969…: 0xceb2d05e.
    expect(j.float32.coefficientsHex[0]).toBe('0xceb2d05e');
    // 0.5 in binary64: 0x3fe0000000000000.
    expect(j.float64.offsetHex).toBe('0x3fe0000000000000');
  });

  it('is deterministic and rejects what the header emitter rejects', () => {
    expect(emitJson({ channels: testChannels(), prefix: 'hopper' })).toBe(text);
    expect(() => emitJson({ channels: [] } as unknown as EmitOptions)).toThrowBridgeworkError(
      'invalid-shape',
      {
        param: 'channels',
      },
    );
  });

  it('carries each designed function’s total error, cost, tables and the test vectors; null totals for hand-made maps', () => {
    const designed = designedChannels();
    const j = JSON.parse(emitJson({ channels: designed, prefix: 'plant' })) as {
      channels: Record<string, any>[];
    };
    const oven = j.channels[0]!;
    expect(oven.targetError).toBe(0.005);
    expect(oven.referenceError).toEqual(designed[0]!.reference);
    expect(oven.fixed.kind).toBe('piecewise-polynomial');
    expect(oven.fixed.totalError).toEqual(designed[0]!.totals!.fixed);
    expect(oven.fixed.cost.tableBytes).toBeGreaterThan(0);
    expect(oven.fixed.segments.map((s: { coefficients: number[] }) => s.coefficients)).toEqual(
      (designed[0]!.fixed as FixedPiecewiseMap).segments.map((s) => s.coefficients),
    );
    expect(oven.float32.polynomial.segmentBits).toBe(10);
    expect(oven.testVectors).toEqual(designed[0]!.testVectors);
    const strut = j.channels[1]!;
    expect(strut.float64.kind).toBe('mobius');
    expect(strut.fixed).toBeUndefined();
    // A map assembled by hand has no exact map, so no total error: null, never a number.
    expect(json.channels[0]!.fixed.totalError).toBeNull();
  });

  it('is in step with the package version', () => {
    const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as {
      version: string;
    };
    expect(FIRMWARE_GENERATOR_VERSION).toBe(pkg.version);
  });
});
