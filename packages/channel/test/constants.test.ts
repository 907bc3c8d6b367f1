import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { emitCHeader } from '@bridgework/firmware';
import { channelConstants, createChannel, type ChannelSpec } from '@bridgework/channel';

function hasGcc(): boolean {
  try {
    execFileSync('gcc', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

describe('constants: the channel hands its map to the firmware package', () => {
  it('50 kg cell, 2 mV/V, gain 128, 24-bit ratiometric, 0.01 g → multiplier 1 250 000 000, shift 29', () => {
    // Derived (issue #8 check value): one V/V is gain·2^23 = 2^30 codes, so 50 kg is 0.002·2^30
    // codes and one code is 5e6/(0.002·2^30) = 1.25e9/2^29 hundredths of a gram exactly.
    const ch = createChannel({
      name: 'hopper cell',
      sensor: { kind: 'transducer', capacity: '50 kg', ratedOutputVoltsPerVolt: '2 mV/V' },
      bridge: { wiring: 'six-wire' },
      excitation: { volts: 5, remoteSense: true },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'mass', range: [0, 50], firmwareResolution: 1e-5 },
    });
    const c = channelConstants(ch);
    expect(c.fixed.multiplier).toBe(1_250_000_000);
    expect(c.fixed.shift).toBe(29);
    // The map is linear, so the minimax line is the map itself: no approximation error.
    expect(c.line.offset).toBeNear(0, { abs: 1e-9 });
    // Only the output rounding (½ LSB); the floor covers the double-precision reference map
    // (5·10⁶ LSB at capacity × a few 1e-16).
    expect(c.fixed.totalError?.maxAbsError).toBeNear(0.5, { abs: 1e-8 });
    expect(c.codeMin).toBe(0);
    expect(c.codeMax).toBe(Math.floor(0.002 * 2 ** 30));
  });

  it('a nonlinear quarter bridge: the float polynomial tracks the exact map; the fixed line states its error', () => {
    const ch = createChannel({
      name: 'deck girder',
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
      bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
      excitation: { volts: 5 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [-3000, 3000], firmwareResolution: 0.01 },
    });
    const c = channelConstants(ch, { verification: 'sampled' });
    // Quarter-bridge nonlinearity over ±3000 µε is about 0.3 %: the best line is off by a few µε.
    const lineError = c.fixed.totalError!.maxAbsError * 0.01;
    expect(lineError).toBeGreaterThan(0.5);
    expect(lineError).toBeLessThan(10);
    // A cubic through Chebyshev nodes follows the Möbius map to far below a count (float64).
    expect(c.float64.totalError!.maxAbsError).toBeLessThan(1e-3);
    // Spot checks of the polynomial against the exact map.
    for (const code of [c.codeMin, 0, 123_457, c.codeMax]) {
      expect(c.float64.evaluate(code)).toBeNear(ch.quantityFromCode(code), { abs: 1e-3 });
    }
  });

  it('the emitted C header of a channel compiles with gcc -std=c99 -Wall -Wextra -Wconversion -Werror -pedantic', () => {
    if (!hasGcc()) {
      if (process.env['CI'] !== undefined) throw new Error('gcc is required under CI');
      return;
    }
    const spec: ChannelSpec = {
      name: 'Hanger H3 */ "north"',
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.09 },
      bridge: { arrangement: 'full-poisson', wiring: 'six-wire', poissonRatio: 0.3 },
      excitation: { volts: 5, remoteSense: true },
      amplifier: { gain: 64 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [-1500, 1500] },
    };
    const c = channelConstants(createChannel(spec), { verification: 'sampled' });
    const header = emitCHeader({ channels: [c.firmwareChannel], prefix: 'bridge' });
    const dir = mkdtempSync(join(tmpdir(), 'bridgework-channel-'));
    writeFileSync(join(dir, 'channel.h'), header);
    writeFileSync(join(dir, 'main.c'), '#include "channel.h"\nint main(void) { return 0; }\n');
    execFileSync(
      'gcc',
      [
        '-std=c99',
        '-Wall',
        '-Wextra',
        '-Wconversion',
        '-Werror',
        '-pedantic',
        '-c',
        'main.c',
        '-o',
        'main.o',
      ],
      { cwd: dir },
    );
    expect(header).toContain('#ifndef');
  });

  it('rejects a range that covers fewer than two codes, and bad options', () => {
    const ch = createChannel({
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
      excitation: { volts: 5 },
      adc: { bits: 12, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [0, 1] },
    });
    expect(() => channelConstants(ch)).toThrowBridgeworkError('out-of-range', { param: 'output.range' });
    const ok = createChannel({
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
      excitation: { volts: 5 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [-100, 100] },
    });
    expect(() => channelConstants(ok, { polynomialDegree: 9 })).toThrowBridgeworkError('out-of-range', {
      param: 'polynomialDegree',
    });
    expect(() => channelConstants(ok, { outputResolution: 0 })).toThrowBridgeworkError('not-positive', {
      param: 'outputResolution',
    });
  });
});
