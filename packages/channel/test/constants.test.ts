/**
 * channelConstants: the channel's glue to the firmware designer — the exact map is the channel's
 * own quantityFromCode, the codes are those of the span, the default target is
 * max(u_c/10, one output step), and the channel map's own stated error is in every bound.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { emitCHeader } from '@bridgework/firmware';
import {
  CHANNEL_MAP_RELATIVE_ACCURACY,
  channelBudget,
  channelConstants,
  createChannel,
  type ChannelSpec,
} from '@bridgework/channel';

const STRICT = ['-std=c99', '-Wall', '-Wextra', '-Wconversion', '-Werror', '-pedantic'];

/** Compiles a header with the strict flags (skips locally without gcc, fails under CI). */
function compiles(header: string, skip: () => void): void {
  if (spawnSync('gcc', ['--version']).status !== 0) {
    if (process.env['CI'] !== undefined) throw new Error('gcc is required under CI');
    skip();
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), 'bridgework-channel-'));
  try {
    writeFileSync(join(dir, 'constants.h'), header);
    writeFileSync(join(dir, 'main.c'), '#include "constants.h"\nint main(void) { return 0; }\n');
    const r = spawnSync('gcc', [...STRICT, '-c', 'main.c', '-o', 'main.o'], { cwd: dir, encoding: 'utf8' });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const cell: ChannelSpec = {
  name: 'hopper cell',
  sensor: { kind: 'transducer', capacity: 50, ratedOutputVoltsPerVolt: 0.002 },
  bridge: { wiring: 'six-wire' },
  excitation: { volts: 5, remoteSense: true },
  amplifier: { gain: 128, inputVoltageNoiseVoltsPerRootHz: 10e-9 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true, filter: { dataRateHertz: 10 } },
  output: { quantity: 'mass', range: [0, 50], firmwareResolution: 1e-5 },
};

describe('channelConstants: a linear load cell', () => {
  const ch = createChannel(cell);
  const c = channelConstants(ch, { verification: 'sampled' });

  it('chooses the affine form in every type: 50 kg cell, 2 mV/V, gain 128 → multiplier 1 250 000 000, shift 29', () => {
    // One V/V is gain·2^23 = 2^30 codes, so one code is 5e6/(0.002·2^30) = 1.25e9/2^29 hundredths
    // of a gram exactly (issue 8's check value).
    expect(c.fixed!.kind).toBe('affine');
    expect(c.float32!.kind).toBe('affine');
    expect(c.float64!.kind).toBe('affine');
    const fixed = c.fixed as { multiplier: number; shift: number };
    expect(fixed.multiplier).toBe(1_250_000_000);
    expect(fixed.shift).toBe(29);
    expect(c.outputResolution).toBe(1e-5); // output.firmwareResolution
  });

  it('sets the default target to max(u_c/10, one output step) from the channel’s budget', () => {
    const uc = channelBudget(ch).combined.standardUncertainty;
    expect(c.standardUncertainty).toBe(uc);
    expect(c.targetSource).toBe('default');
    expect(c.targetError).toBe(Math.max(uc / 10, 1e-5));
    for (const t of ['fixed', 'float32', 'float64'] as const)
      expect(c.totals[t]!.bound).toBeLessThanOrEqual(c.targetError);
  });

  it('covers the codes of the span and adds the channel map’s stated error to every bound', () => {
    expect(ch.quantityFromCode(c.codeMin)).toBeGreaterThanOrEqual(0);
    expect(ch.quantityFromCode(c.codeMin - 1)).toBeLessThan(0);
    expect(ch.quantityFromCode(c.codeMax)).toBeLessThanOrEqual(50);
    expect(ch.quantityFromCode(c.codeMax + 1)).toBeGreaterThan(50);
    const largest = Math.max(
      Math.abs(ch.quantityFromCode(c.codeMin)),
      Math.abs(ch.quantityFromCode(c.codeMax)),
    );
    expect(c.referenceError.bound).toBe(CHANNEL_MAP_RELATIVE_ACCURACY * largest);
    for (const t of ['fixed', 'float32', 'float64'] as const) {
      expect(c.totals[t]!.referenceError).toBe(c.referenceError.bound);
      expect(c.totals[t]!.proved).toBe(false); // sampled: measured
    }
  });
});

describe('channelConstants: nonlinear channels', () => {
  it('a quarter bridge over ±3000 µε: no line meets a tight target, a piecewise form does, proved over every code', () => {
    const ch = createChannel({
      name: 'deck girder',
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
      bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
      excitation: { volts: 5 },
      amplifier: { gain: 128 },
      adc: { bits: 20, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [-3000, 3000] },
    });
    // Quarter-bridge nonlinearity over ±3000 µε is about 0.3 %: the best line misses by µε.
    const loose = channelConstants(ch, { targetError: 20, types: ['float64'] });
    expect(loose.float64!.kind).toBe('affine');
    expect(loose.totals.float64!.approximation).toBeGreaterThan(1);
    const tight = channelConstants(ch, { targetError: 0.05 });
    for (const t of ['fixed', 'float32', 'float64'] as const) {
      expect(tight[t]!.kind).not.toBe('affine');
      expect(tight.totals[t]!.bound).toBeLessThanOrEqual(0.05);
      expect(tight.totals[t]!.proved).toBe(true);
      expect(tight.totals[t]!.codesChecked).toBe(tight.codeMax - tight.codeMin + 1);
    }
    // Spot checks of every function against the channel's exact map, within each stated bound.
    for (const code of [tight.codeMin, -12_345, 0, 77_777, tight.codeMax]) {
      expect(code >= tight.codeMin && code <= tight.codeMax).toBe(true);
      const q = ch.quantityFromCode(code);
      expect(tight.float64!.evaluate(code)).toBeNear(q, { abs: tight.totals.float64!.bound });
      expect(tight.float32!.evaluate(code)).toBeNear(q, { abs: tight.totals.float32!.bound });
      expect(tight.fixed!.evaluate(code) * tight.outputResolution).toBeNear(q, {
        abs: tight.totals.fixed!.bound * (1 + 1e-12),
      });
    }
  });

  it('a 32-bit ratiometric strain channel over 0 … 3000 µε (issue 15, item 2): a header that compiles', (ctx) => {
    const ch = createChannel({
      name: 'strain32',
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
      bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 0.2 },
      excitation: { volts: 5 },
      amplifier: { gain: 128 },
      adc: { bits: 32, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [0, 3000] },
    });
    // 4.3e8 codes: beyond 2^24, so the bounds are measured on samples, and the header says so.
    const c = channelConstants(ch, { verification: 'auto' });
    expect(c.codeMax - c.codeMin).toBeGreaterThan(2 ** 28);
    expect(c.totals.float32!.proved).toBe(false);
    const header = emitCHeader({ channels: [c.firmwareChannel], prefix: 'wide' });
    expect(header.replace(/\n \* /g, ' ')).toContain('measured, not proved');
    compiles(header, () => ctx.skip());
  });
});

describe('channelConstants: options and refusals', () => {
  const ch = createChannel({ ...cell, output: { quantity: 'mass', range: [0, 50] } });

  it('refuses a target no form meets, naming the best bound reached; a coarse step for a fine target', () => {
    expect(() =>
      channelConstants(ch, { targetError: 1e-9, types: ['float32'], verification: 'sampled' }),
    ).toThrowBridgeworkError('out-of-range', { param: 'targetError' });
    expect(() =>
      channelConstants(ch, {
        targetError: 1e-4,
        outputResolution: 1e-3,
        types: ['fixed'],
        verification: 'sampled',
      }),
    ).toThrowBridgeworkError('out-of-range', { param: 'targetError' });
    // The message names the channel's option, not the designer's.
    expect(() =>
      channelConstants(ch, {
        targetError: 1e-4,
        outputResolution: 1e-3,
        types: ['fixed'],
        verification: 'sampled',
      }),
    ).toThrow(/a finer `outputResolution`/);
    // Without a step given, the step follows the target: a power of ten not above it.
    const fine = channelConstants(ch, { targetError: 3e-4, types: ['fixed'], verification: 'sampled' });
    expect(fine.outputResolution).toBe(1e-4);
    expect(fine.totals.fixed!.bound).toBeLessThanOrEqual(3e-4);
  });

  it.each([
    ['options.targetErorr', { targetErorr: 1 }, 'unknown-option'],
    ['targetError', { targetError: -1 }, 'not-positive'],
    ['outputResolution', { outputResolution: 0 }, 'not-positive'],
    ['types[1]', { types: ['fixed', 'double'] }, 'invalid-option'],
    ['maxDegree', { maxDegree: 9 }, 'out-of-range'],
  ] as const)('%s: %o → %s', (param, patch, code) => {
    expect(() => channelConstants(ch, { verification: 'sampled', ...patch } as never)).toThrowBridgeworkError(
      code,
      { param },
    );
  });

  it('refuses an output step that cannot resolve the span or overflows the int32 outputs, naming it (issue 15 fuzz: was "scale")', () => {
    for (const step of [1e308, 51, 1e-308, 50 / 2 ** 32]) {
      expect(() => channelConstants(ch, { outputResolution: step }), String(step)).toThrowBridgeworkError(
        'out-of-range',
        { param: 'outputResolution' },
      );
    }
    // The same limits for the spec's output.firmwareResolution, named as the field.
    const fine = createChannel({
      ...cell,
      output: { quantity: 'mass', range: [0, 50], firmwareResolution: 1e-12 },
    });
    expect(() => channelConstants(fine)).toThrowBridgeworkError('out-of-range', {
      param: 'output.firmwareResolution',
    });
    // The ends themselves are accepted: the span's magnitude, and that of the largest output / 2^31.
    expect(
      channelConstants(ch, { outputResolution: 50, targetError: 100, types: ['fixed'] }).outputResolution,
    ).toBe(50);
  });

  it('refuses a span of fewer than two codes', () => {
    const narrow = createChannel({
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
      excitation: { volts: 5 },
      adc: { bits: 12, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [0, 1] },
    });
    expect(() => channelConstants(narrow)).toThrowBridgeworkError('out-of-range', { param: 'output.range' });
  });
});
