import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { ErrorCode } from '@bridgework/core';
import { createChannel, createInterleavedConverter, type ChannelSpec } from '@bridgework/channel';

const quarter: ChannelSpec = {
  name: 'deck girder',
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'strain', unit: 'µε' },
};
const rtd: ChannelSpec = {
  name: 'deck temperature',
  sensor: { kind: 'rtd' },
  bridge: { wiring: 'three-wire', ohmsPerLead: 0.4 },
  excitation: { volts: 1 },
  amplifier: { gain: 16 },
  adc: { bits: 24, referenceVolts: 1, ratiometric: true },
  output: { quantity: 'temperature' },
};
const RAIL_HIGH = 2 ** 23 - 1;

async function collect<T>(stream: ReadableStream<T>): Promise<T[]> {
  const reader = stream.getReader();
  const out: T[] = [];
  for (;;) {
    const { done, value } = await reader.read();
    if (done) return out;
    out.push(value);
  }
}
const RAIL_LOW = -(2 ** 23);

describe('convert: rails and impossible ratios become NaN, counted and located', () => {
  // Gain 1 lets the converter reach ratios the bridge cannot produce: a half-bending bridge is
  // linear up to ±1/2 (kernel path); an RTD's curve ends at −200 and 850 °C (exact path).
  const halfBending: ChannelSpec = {
    ...quarter,
    bridge: { arrangement: 'half-bending', wiring: 'three-wire', ohmsPerLead: 1.2 },
  };
  it.each([
    ['kernel', halfBending],
    ['exact', rtd],
  ] as const)('%s path: rails and out-of-range codes', (method, spec) => {
    const ch = createChannel({ ...spec, amplifier: { gain: 1 } });
    expect(ch.method).toBe(method);
    const beyond = Math.ceil(ch.validCodes.max) + 5;
    const codes = new Int32Array([0, RAIL_HIGH, 1000, RAIL_LOW, beyond, -2000, RAIL_HIGH]);
    const { values, status } = ch.convert(codes);
    expect(Array.from(values, (v) => Number.isNaN(v))).toEqual([false, true, false, true, true, false, true]);
    expect(status).toMatchObject({
      samples: 7,
      converted: 3,
      rejected: 4,
      railLow: 1,
      railHigh: 2,
      outOfRange: 1,
      method,
    });
    expect(Array.from(status.locations)).toEqual([1, 3, 4, 6]);
    for (const i of [0, 2, 5])
      expect(values[i]).toBeNear(ch.quantityFromCode(codes[i]!), { rel: 1e-12, abs: 1e-12 });
  });

  it('records at most maxLocations indices but counts every rejection', () => {
    const ch = createChannel(quarter);
    const codes = new Int32Array(5000).fill(RAIL_HIGH);
    const { status } = ch.convert(codes, undefined, { maxLocations: 10 });
    expect(status.rejected).toBe(5000);
    expect(Array.from(status.locations)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it("throws clipped under the 'throw' policy, with the first index", () => {
    const ch = createChannel(quarter);
    const codes = new Int32Array([1, 2, RAIL_LOW, 3]);
    expect(() => ch.convert(codes, undefined, { onInvalid: 'throw' })).toThrowBridgeworkError('clipped', {
      param: 'codes',
    });
    expect(ch.convert(new Int32Array([1, 2]), undefined, { onInvalid: 'throw' }).status.rejected).toBe(0);
  });

  it('accepts averaged (fractional) codes in a Float64Array, and writes into a given buffer', () => {
    const ch = createChannel(quarter);
    const codes = new Float64Array([0.5, 1234.25, -77.75]);
    const out = new Float64Array(5).fill(42);
    const r = ch.convert(codes, out);
    expect(r.values).toBe(out);
    codes.forEach((c, i) => expect(out[i]).toBeNear(ch.quantityFromCode(c), { rel: 1e-12, abs: 1e-12 }));
    expect(out[3]).toBe(42);
  });

  it('rejects bad buffers and options', () => {
    const ch = createChannel(quarter);
    expect(() => ch.convert([1, 2] as unknown as Int32Array)).toThrowBridgeworkError('wrong-type', {
      param: 'codes',
    });
    expect(() => ch.convert(new Int32Array(4), new Float64Array(3))).toThrowBridgeworkError('invalid-shape', {
      param: 'out',
    });
    expect(() => ch.convert(new Int32Array(4), undefined, { maxLocations: -1 })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'options.maxLocations' },
    );
    expect(() =>
      ch.convert(new Int32Array(4), undefined, { temperatureCelsius: Number.NaN }),
    ).toThrowBridgeworkError('not-finite', { param: 'options.temperatureCelsius' });
    // Issue 15 item 6: options are checked, never read loosely.
    const bad: [unknown, ErrorCode, string][] = [
      [{ onInvalid: 'Throw' }, 'invalid-option', 'options.onInvalid'],
      [{ onInvalid: true }, 'invalid-option', 'options.onInvalid'],
      [{ maxLocations: 1e308 }, 'out-of-range', 'options.maxLocations'],
      [{ maxLocations: 2 ** 31 - 1 }, 'out-of-range', 'options.maxLocations'],
      [{ maxLocation: 3 }, 'unknown-option', 'options.maxLocation'],
      [{ constructor: 3 }, 'unknown-option', 'options.constructor'],
      [null, 'wrong-type', 'options'],
      ['throw', 'wrong-type', 'options'],
    ];
    for (const [options, code, param] of bad) {
      expect(
        () => ch.convert(new Int32Array(4), undefined, options as never),
        String(options),
      ).toThrowBridgeworkError(code, { param });
      expect(() => ch.transformer(options as never), String(options)).toThrowBridgeworkError(code, { param });
    }
  });
});

describe('convert: per-block temperature', () => {
  it('equals a channel created at that temperature (the map is rebuilt for the block)', () => {
    const spec: ChannelSpec = {
      ...quarter,
      sensor: {
        kind: 'strain-gauge',
        gaugeFactor: 2.1,
        gaugeFactorTemperatureCoefficientPerKelvin: 1.2e-4,
        thermalOutput: { coefficientsMicrostrain: [-30, 2.1, -0.03], rangeCelsius: [-40, 120] },
      },
      environment: { temperatureCelsius: 20 },
    };
    const ch = createChannel(spec);
    fc.assert(
      fc.property(
        fc.integer({ min: -30, max: 90 }),
        fc.integer({ min: -3_000_000, max: 3_000_000 }),
        (t, code) => {
          const there = createChannel({
            ...spec,
            environment: { temperatureCelsius: t, zeroTemperatureCelsius: 20 },
          });
          const block = ch.convert(new Int32Array([code]), undefined, { temperatureCelsius: t }).values[0]!;
          expect(block).toBeNear(there.quantityFromCode(code), { rel: 1e-12, abs: 1e-9 });
        },
      ),
      { numRuns: 100 },
    );
  });
});

describe('interleaved buffers and streams equal the plain conversion', () => {
  const specs: ChannelSpec[] = [
    quarter,
    rtd,
    {
      ...quarter,
      name: 'hanger',
      bridge: { arrangement: 'full-poisson', wiring: 'four-wire', ohmsPerLead: 2, poissonRatio: 0.3 },
    },
  ];
  const channels = specs.map((s) => createChannel(s));

  it('interleaved conversion of N channels equals converting each lane alone, bit for bit', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.tuple(
            fc.integer({ min: RAIL_LOW, max: RAIL_HIGH }),
            fc.integer({ min: -400_000, max: 400_000 }),
            fc.integer({ min: RAIL_LOW, max: RAIL_HIGH }),
          ),
          {
            minLength: 1,
            maxLength: 700,
          },
        ),
        (frames) => {
          const buffer = Int32Array.from(frames.flat());
          const { values, statuses } = createInterleavedConverter(channels).convert(buffer);
          channels.forEach((ch, j) => {
            const lane = Int32Array.from(frames.map((f) => f[j]!));
            const alone = ch.convert(lane);
            const got = Float64Array.from(frames.map((_, k) => values[k * 3 + j]!));
            expect(Array.from(got)).toEqual(Array.from(alone.values));
            expect(statuses[j]!.rejected).toBe(alone.status.rejected);
            expect(Array.from(statuses[j]!.locations)).toEqual(
              Array.from(alone.status.locations, (k) => k * 3 + j),
            );
          });
        },
      ),
      { numRuns: 60 },
    );
  });

  it('an interleaved buffer of kernel channels takes the one-pass path and still matches', () => {
    const two = [channels[0]!, channels[2]!];
    const frames = 3000;
    const buffer = Int32Array.from({ length: frames * 2 }, (_, i) => ((i * 7919) % 6_000_000) - 3_000_000);
    buffer[11] = RAIL_HIGH;
    const { values, statuses } = createInterleavedConverter(two).convert(buffer);
    two.forEach((ch, j) => {
      const lane = Int32Array.from({ length: frames }, (_, k) => buffer[k * 2 + j]!);
      const alone = ch.convert(lane).values;
      for (let k = 0; k < frames; k++) expect(Object.is(values[k * 2 + j], alone[k])).toBe(true);
    });
    expect(statuses[1]!.railHigh).toBe(1);
    expect(Array.from(statuses[1]!.locations)).toEqual([11]);
  });

  it('rejects partial frames and empty channel lists', () => {
    expect(() => createInterleavedConverter(channels).convert(new Int32Array(4))).toThrowBridgeworkError(
      'invalid-shape',
      { param: 'codes' },
    );
    expect(() => createInterleavedConverter([])).toThrowBridgeworkError('invalid-shape', {
      param: 'channels',
    });
    expect(() =>
      createInterleavedConverter(channels).convert(new Int32Array(3), undefined, { maxLocations: 1.5 }),
    ).toThrowBridgeworkError('not-integer', { param: 'options.maxLocations' });
    expect(() => createInterleavedConverter([{} as never])).toThrowBridgeworkError('wrong-type', {
      param: 'channels[0]',
    });
    const inter = createInterleavedConverter(channels);
    expect(() =>
      inter.convert(new Int32Array(3), undefined, { temperaturesCelsius: 20 as never }),
    ).toThrowBridgeworkError('wrong-type', {
      param: 'options.temperaturesCelsius',
    });
    expect(() =>
      inter.convert(new Int32Array(3), undefined, { temperaturesCelsius: [20, 20, 20, 20] }),
    ).toThrowBridgeworkError('invalid-shape', {
      param: 'options.temperaturesCelsius',
    });
    expect(() =>
      inter.convert(new Int32Array(3), undefined, { temperaturesCelsius: [Number.NaN] }),
    ).toThrowBridgeworkError('not-finite', {
      param: 'options.temperaturesCelsius[0]',
    });
  });

  it('the transformers convert chunk by chunk exactly like convert, through a real TransformStream', async () => {
    const ch = channels[0]!;
    const chunks = [new Int32Array([1, 2, 3]), new Int32Array([RAIL_HIGH, 500_000]), new Int32Array(0)];
    const results = await collect(
      new ReadableStream<Int32Array>({
        start(controller) {
          for (const c of chunks) controller.enqueue(c);
          controller.close();
        },
      }).pipeThrough(new TransformStream(ch.transformer())),
    );
    expect(results).toHaveLength(3);
    results.forEach((r, i) =>
      expect(Array.from(r.values)).toEqual(Array.from(ch.convert(chunks[i]!).values)),
    );
    expect(results[1]!.status.railHigh).toBe(1);

    const inter = createInterleavedConverter(channels);
    const frame = new Int32Array([10, 20, 30, 40, 50, 60]);
    const out = await collect(
      new ReadableStream<Int32Array>({
        start(c) {
          c.enqueue(frame);
          c.close();
        },
      }).pipeThrough(new TransformStream(inter.transformer())),
    );
    expect(Array.from(out[0]!.values)).toEqual(Array.from(inter.convert(frame).values));
  });
});
