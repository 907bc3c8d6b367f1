/**
 * Conversion loops for channels without one Möbius function over every valid code (issue 19
 * item 4): the platinum RTD loop (createRtd's closed form above 0 °C, its polynomial start and
 * Newton step below) against the channel's exact scalar path, bit for bit, over every code of a
 * 24-bit converter, including blocks that fall back to the scalar path; the partial kernel of a map with a pole just beyond its valid codes
 * (a quarter bridge read at gain 1) against the exact map. In-place conversion keeps rail codes
 * rejected on both (issue 15 item 1).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createChannel, createInterleavedConverter, type ChannelSpec } from '@bridgework/channel';
import { channelInternals } from '../src/internal/makeChannel.js';
import { convertCallendarVanDusen } from '../src/convert/curveKernels.js';
import { RejectTally } from '../src/convert/kernel.js';
import { arm1Ref, cvdTemperature, D, ratioFromCodeRef, X } from './support/reference.js';
import { kilnPt100 } from './support/kilnChannels.js';

const RAIL_LOW = -(2 ** 23);
const RAIL_HIGH = 2 ** 23 - 1;

const pt100 = kilnPt100;
const quarterAtGain1: ChannelSpec = {
  name: 'deck girder at gain 1',
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
  excitation: { volts: 5 },
  amplifier: { gain: 1 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'strain' },
};

/** The exact scalar path the channel took per sample before the loop existed (NaN for a code it rejects). */
function scalarPath(ch: ReturnType<typeof createChannel>): (code: number) => number {
  const m = channelInternals(ch).mappingAt(undefined);
  const rc = m.resistanceCurve;
  if (rc === undefined) throw new Error('no resistance curve');
  return (code) => {
    if (!(code > m.lo && code < m.hi)) return Number.NaN;
    try {
      return rc.evaluate(code);
    } catch {
      return Number.NaN;
    }
  };
}

/** Index of the first sample where `got` and `want` differ (Object.is: NaN equals NaN), or −1. */
function firstDifference(got: ArrayLike<number>, want: (i: number) => number, n: number): number {
  for (let i = 0; i < n; i++) if (!Object.is(got[i], want(i))) return i;
  return -1;
}

describe('platinum RTD loop (IEC 60751 inverse inline)', () => {
  const heavy = process.env['BRIDGEWORK_HEAVY'] === '1';

  it.each([
    ['°C', pt100],
    ['K', { ...pt100, output: { quantity: 'temperature', unit: 'K' } }],
    ['°F', { ...pt100, output: { quantity: 'temperature', unit: '°F' } }],
  ] as const)(
    'bit-identical to the exact scalar path across the 24-bit range (%s; every code with BRIDGEWORK_HEAVY=1)',
    (_, spec) => {
      const ch = createChannel(spec as ChannelSpec);
      expect(ch.map.form).toBe('resistance-curve');
      expect(channelInternals(ch).mappingAt(undefined).resistanceCurve?.kernel).toBeDefined();
      const scalar = scalarPath(ch);
      // Every code with BRIDGEWORK_HEAVY=1 (16.7 million scalar evaluations: 10–30 s); by default
      // every 16th code, and every code of the 2^16 around 0 °C, where the loop changes method.
      const step = heavy ? 1 : 16;
      const zeroCode = Math.round(
        ch.exactCodeFromQuantity(ch.unit === 'K' ? 273.15 : ch.unit === '°F' ? 32 : 0),
      );
      const list = Array.from({ length: Math.ceil(2 ** 24 / step) }, (_, i) => RAIL_LOW + i * step);
      if (!heavy) for (let x = zeroCode - 32_768; x < zeroCode + 32_768; x++) list.push(x);
      if (!heavy) list.push(RAIL_HIGH); // the last code of the heavy range is the rail itself
      const codes = Int32Array.from(list);
      const n = codes.length;
      const { values, status } = ch.convert(codes);
      expect(firstDifference(values, (i) => scalar(codes[i]!), n)).toBe(-1);
      // Rejections: the rails, and the codes past the curve's −200 … 850 °C at this gain.
      let nan = 0;
      for (let i = 0; i < n; i++) if (Number.isNaN(values[i]!)) nan++;
      expect(status.rejected).toBe(nan);
      expect([status.railLow, status.railHigh]).toEqual([1, 1]);
      expect(status.method).toBe('exact');
    },
    120_000,
  );

  it('agrees with a 40-digit Callendar–Van Dusen inversion (IEC 60751) within 1e-9 K', () => {
    // Independent of the package: the arm from the ratio by the bridge's bilinear solve, the
    // temperature by 40-digit bisection (support/reference.ts); IEC 60751 coefficients.
    const ch = createChannel(pt100);
    const [r0, a, b, c] = [X(100), X(3.9083e-3), X(-5.775e-7), X(-4.183e-12)];
    fc.assert(
      fc.property(fc.integer({ min: -1_600_000, max: 2_000_000 }), (code) => {
        const r = ratioFromCodeRef(code, 8, 24);
        const rl = X(0.4);
        const ohms = arm1Ref(r, X(100).plus(rl), X(100), X(100), new D(0)).minus(rl);
        if (ohms.lessThan(18.6) || ohms.greaterThan(390)) return; // outside −200 … 850 °C
        const want = cvdTemperature(ohms, r0, a, b, c).toNumber();
        const got = ch.convert(new Int32Array([code])).values[0]!;
        expect(got).toBeNear(want, { abs: 1e-9 }); // createRtd's stated round trip: 1e-9 K
      }),
      { numRuns: 200 },
    );
  });

  it('a block whose Newton step fails its bound, or whose start is wrong, is converted again sample by sample', () => {
    // The proved bound is the loop's own check: a start made useless (all zero), or a guard no
    // step can pass, must send those samples to the scalar path (the iteration), never out wrong.
    const ch = createChannel(pt100);
    const kernel = channelInternals(ch).mappingAt(undefined).resistanceCurve!.kernel!;
    const scalar = scalarPath(ch);
    const first = Math.floor(ch.validCodes.min) + 1;
    const last = Math.ceil(ch.validCodes.max) - 1;
    const codes = Int32Array.from({ length: 5000 }, (_, i) =>
      Math.round(first + ((last - first) * i) / 4999),
    );
    for (const broken of [
      { ...kernel, guard: Infinity },
      { ...kernel, start: new Float64Array(9) },
      { ...kernel, start: kernel.start.map((p, i) => (i === 0 ? p * (1 + 1e-5) : p)) },
    ]) {
      const out = new Float64Array(codes.length);
      const tally = new RejectTally(8, RAIL_LOW, RAIL_HIGH);
      convertCallendarVanDusen(codes, out, broken, tally, 0, 1, codes.length, 0, 1);
      expect(firstDifference(out, (i) => scalar(codes[i]!), codes.length)).toBe(-1);
      const strided = new Float64Array(2 * codes.length);
      convertCallendarVanDusen(codes, strided, broken, tally, 0, 1, codes.length, 0, 2);
      expect(firstDifference(strided, (i) => (i % 2 === 0 ? scalar(codes[i / 2]!) : 0), strided.length)).toBe(
        -1,
      );
    }
    // Below 0 °C at this gain: a third of the codes (the fallback above was exercised).
    let below = 0;
    for (const x of codes) if (scalar(x) < 0) below++;
    expect(below).toBeGreaterThan(1000);
  });

  it('in place, rails and beyond are NaN and counted, exactly as into a separate buffer', () => {
    const ch = createChannel(pt100);
    fc.assert(
      fc.property(
        fc.array(
          fc.oneof(
            fc.double({ min: -9e6, max: 9e6, noNaN: true }),
            fc.constantFrom(RAIL_LOW, RAIL_HIGH, 1e12, -1e12, Number.NaN, Infinity, 0),
          ),
          { maxLength: 400 },
        ),
        (list) => {
          const src = Float64Array.from(list);
          const separate = ch.convert(src, new Float64Array(src.length));
          const buf = src.slice();
          const inPlace = ch.convert(buf, buf);
          const scalar = scalarPath(ch);
          expect(firstDifference(buf, (i) => scalar(src[i]!), src.length)).toBe(-1);
          expect(firstDifference(separate.values, (i) => scalar(src[i]!), src.length)).toBe(-1);
          expect(inPlace.status).toEqual(separate.status);
        },
      ),
      { numRuns: 100 },
    );
  });
});

describe('partial Möbius kernel: a pole just beyond the valid codes', () => {
  it('takes the kernel, and the exact map for the codes next to the pole', () => {
    const ch = createChannel(quarterAtGain1);
    const m = channelInternals(ch).mappingAt(undefined);
    expect(m.kernel).toBeUndefined(); // no Möbius function holds at the pole's side
    const k = m.partialKernel!;
    expect(k).toBeDefined();
    expect(ch.method).toBe('kernel');
    expect(ch.map.form).toBe('exact'); // emitters still see the exact map
    // The kernel gives up only the codes next to the pole (δ = 1, 4, 16 … 4^k codes: here 1024).
    expect(m.hi - k.hi).toBeLessThan(5000);
    expect(k.lo).toBe(m.lo);
    // Every code from 20 000 below the upper end, and 30 001 spread codes, against the exact map.
    const last = Math.ceil(m.hi) - 1;
    const first = Math.floor(m.lo) + 1;
    const codes = Int32Array.from([
      ...Array.from({ length: 20_000 }, (_, i) => last - i),
      ...Array.from({ length: 30_001 }, (_, i) => Math.round(first + ((last - first) * i) / 30_000)),
    ]);
    const { values, status } = ch.convert(codes);
    expect(status.rejected).toBe(0);
    const typical = Math.abs(ch.quantityFromCode(Math.round(last - 0.05 * (last - first))));
    for (let i = 0; i < codes.length; i++) {
      const x = codes[i]!;
      const exact = ch.quantityFromCode(x);
      if (!(x > k.lo && x < k.hi))
        expect(values[i]).toBe(exact); // the exact map itself
      else if (!(Math.abs(values[i]! - exact) <= 1e-12 * Math.max(Math.abs(exact), typical)))
        expect(values[i]).toBeNear(exact, { rel: 1e-12 }); // KERNEL_TOLERANCE (reports the first failure)
    }
  });

  it('in place and interleaved equal the separate conversion, rails rejected', () => {
    const ch = createChannel(quarterAtGain1);
    const m = channelInternals(ch).mappingAt(undefined);
    const near = Math.ceil(m.hi) - 1;
    fc.assert(
      fc.property(
        fc.array(
          fc.oneof(
            fc.integer({ min: near - 3000, max: near }),
            fc.double({ min: -5e6, max: 5e6, noNaN: true }),
            fc.constantFrom(RAIL_LOW, RAIL_HIGH, 1e12, Number.NaN, near, near + 1),
          ),
          { minLength: 2, maxLength: 600 },
        ),
        (list) => {
          const even = list.length % 2 === 0 ? list : list.slice(1);
          const src = Float64Array.from(even);
          const separate = ch.convert(src, new Float64Array(src.length));
          for (let i = 0; i < src.length; i++) {
            const x = src[i]!;
            if (!(x > m.lo && x < m.hi)) expect(Number.isNaN(separate.values[i]!)).toBe(true);
            else if (!(x > m.partialKernel!.lo && x < m.partialKernel!.hi))
              expect(separate.values[i]).toBe(ch.quantityFromCode(x));
          }
          const buf = src.slice();
          const inPlace = ch.convert(buf, buf);
          expect(firstDifference(buf, (i) => separate.values[i]!, src.length)).toBe(-1);
          expect(inPlace.status).toEqual(separate.status);
          const pair = createInterleavedConverter([ch, ch]);
          const inter = pair.convert(src);
          expect(firstDifference(inter.values, (i) => separate.values[i]!, src.length)).toBe(-1);
          expect(inter.statuses.map((s) => s.rejected).reduce((a, b) => a + b)).toBe(
            separate.status.rejected,
          );
          const ints = Int32Array.from(
            even.map((x) =>
              Number.isFinite(x) ? Math.max(-(2 ** 31), Math.min(2 ** 31 - 1, Math.trunc(x))) : 0,
            ),
          );
          const viaInts = pair.convert(ints);
          expect(firstDifference(viaInts.values, (i) => ch.convert(ints).values[i]!, ints.length)).toBe(-1);
        },
      ),
      { numRuns: 80 },
    );
  });
});

describe('quadratic kernel: full-bending-poisson bridges', () => {
  const heavy = process.env['BRIDGEWORK_HEAVY'] === '1';
  const bending: ChannelSpec = {
    name: 'crane jib bending',
    sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
    bridge: { arrangement: 'full-bending-poisson', poissonRatio: 0.3 },
    excitation: { volts: 5 },
    amplifier: { gain: 128 },
    adc: { bits: 24, referenceVolts: 5, ratiometric: true },
    output: { quantity: 'strain' },
  };
  const corrected: ChannelSpec = {
    ...bending,
    name: 'crane jib bending, zeroed at 15 °C',
    sensor: {
      kind: 'strain-gauge',
      gaugeFactor: 2.11,
      gaugeOhms: 350,
      gaugeFactorTemperatureCoefficientPerKelvin: 1.0e-4,
    },
    amplifier: { gain: 16 },
    zero: { code: -18433 },
    environment: { temperatureCelsius: 15, rangeCelsius: [5, 25] },
    output: { quantity: 'strain', unit: 'µε' },
  };

  it.each([
    ['minimal, gain 128', bending],
    ['zero reading, GF temperature coefficient, µε, gain 16', corrected],
    ['gain 1 (strains up to the gauges’ limits)', { ...bending, amplifier: { gain: 1 } }],
  ] as const)(
    '%s: the kernel follows the exact map within 1e-12 of its largest value',
    (_, spec) => {
      const ch = createChannel(spec as ChannelSpec);
      const m = channelInternals(ch).mappingAt(undefined);
      expect(m.quadraticKernel).toBeDefined();
      expect(ch.method).toBe('kernel');
      expect(ch.map.form).toBe('exact'); // emitters still see the exact map
      const first = Math.floor(m.lo) + 1;
      const last = Math.ceil(m.hi) - 1;
      const n = heavy ? last - first + 1 : 60_001;
      const codes = Int32Array.from({ length: n }, (_, i) =>
        heavy ? first + i : Math.round(first + ((last - first) * i) / (n - 1)),
      );
      const { values, status } = ch.convert(codes);
      expect(status.rejected).toBe(0);
      let largest = 0;
      let worst = 0;
      let same = 0;
      for (let i = 0; i < n; i++) {
        const exact = ch.quantityFromCode(codes[i]!);
        largest = Math.max(largest, Math.abs(exact));
        worst = Math.max(worst, Math.abs(values[i]! - exact));
        if (Object.is(values[i], exact)) same++;
      }
      expect(worst).toBeNear(0, { abs: 1e-12 * largest }); // KERNEL_TOLERANCE of the largest value
      expect(same).toBeGreaterThan(0);
    },
    600_000,
  );

  it('in place equals the separate conversion; rails and impossible codes rejected', () => {
    const ch = createChannel({ ...bending, amplifier: { gain: 1 } });
    const ends = [Math.floor(ch.validCodes.min) + 1, Math.ceil(ch.validCodes.max) - 1];
    const largest = Math.max(...ends.map((x) => Math.abs(ch.quantityFromCode(x))));
    fc.assert(
      fc.property(
        fc.array(
          fc.oneof(
            fc.double({ min: -9e6, max: 9e6, noNaN: true }),
            fc.constantFrom(RAIL_LOW, RAIL_HIGH, 1e12, Number.NaN, -Infinity),
          ),
          { maxLength: 400 },
        ),
        (list) => {
          const src = Float64Array.from(list);
          const separate = ch.convert(src, new Float64Array(src.length));
          for (let i = 0; i < src.length; i++) {
            const x = src[i]!;
            let want: number;
            try {
              want = ch.quantityFromCode(x);
            } catch {
              want = Number.NaN;
            }
            if (Number.isNaN(want)) expect(Number.isNaN(separate.values[i]!)).toBe(true);
            else expect(separate.values[i]).toBeNear(want, { abs: 1e-12 * largest }); // KERNEL_TOLERANCE
          }
          const buf = src.slice();
          const inPlace = ch.convert(buf, buf);
          expect(firstDifference(buf, (i) => separate.values[i]!, src.length)).toBe(-1);
          expect(inPlace.status).toEqual(separate.status);
        },
      ),
      { numRuns: 80 },
    );
  });
});
