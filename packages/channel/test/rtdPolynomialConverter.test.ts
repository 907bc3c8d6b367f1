/**
 * The opt-in RTD polynomial (`@bridgework/channel/rtd-polynomial`, issue 19 item 4): within 1 ulp
 * of the exact composition (of 1 in the unit below 1 in magnitude) over a 24-bit range, against a
 * double-double reference written in the test and itself checked against decimal.js at 40 digits;
 * the same rejections, counts and locations as `channel.convert`; the loop evaluates the checked
 * expression; a failed check leaves the exact loop, bit for bit; refusals in the user's terms.
 *
 * Why not "2 ulp of the scalar path": the channel's scalar path (and `channel.convert`, bit-identical
 * to it) is itself up to about 35 ulp from the exact composition between 10 and 100 °C (R/R0 − 1
 * cancels), so the polynomial is held to the exact value computed in higher precision instead, and
 * its distance from `channel.convert` is that path's own error plus 1 ulp.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createChannel, type Channel, type ChannelSpec } from '@bridgework/channel';
import { createRtdPolynomialConverter } from '@bridgework/channel/rtd-polynomial';
import { RejectTally } from '../src/convert/kernel.js';
import {
  convertRtdPolynomial,
  createRtdPolynomial,
  SEGMENT,
  segmentValue,
  STRIDE,
} from '../src/convert/rtdPolynomial.js';
import { instantiateRtdPolynomialWasm } from '../src/convert/wasm/rtdPolynomialLoop.js';
import { rtdPolynomialWasmBytes } from '../src/convert/wasm/rtdPolynomialWasm.js';
import { channelInternals } from '../src/internal/makeChannel.js';
import { rtdExact, ulp } from './support/doubleDouble.js';
import { cvdTemperature, X } from './support/reference.js';
import { kilnPt100 } from './support/kilnChannels.js';

const RAIL_LOW = -(2 ** 23);
const RAIL_HIGH = 2 ** 23 - 1;
const heavy = process.env['BRIDGEWORK_HEAVY'] === '1';

const pt100 = kilnPt100;
const inUnit = (unit: '°C' | 'K' | '°F'): ChannelSpec => ({
  ...pt100,
  output: { quantity: 'temperature', unit },
});

type CurveMap = Extract<Channel['map'], { form: 'resistance-curve' }>;
const curveOf = (ch: Channel) => {
  const map = ch.map as CurveMap;
  return {
    resistance: map.resistance,
    curve: map.curve as { r0Ohms: number; a: number; b: number; c: number },
  };
};

/** The channel's polynomial path, as the converter builds it (for the tests that reach inside). */
function pathOf(ch: Channel, loop: 'webassembly' | 'javascript' = 'javascript') {
  const kernel = channelInternals(ch).mappingAt(undefined).resistanceCurve!.kernel!;
  const { ra, rb, rc, rd, lo, hi, minOhms, maxOhms } = kernel;
  const wasm = loop === 'webassembly' ? instantiateRtdPolynomialWasm()! : undefined;
  return {
    kernel,
    polynomial: createRtdPolynomial(kernel, wasm?.table),
    wasm,
    convertible: (x: number) => {
      if (!(x > lo && x < hi)) return false;
      const ohms = (ra * x + rb) / (rc * x + rd);
      return ohms >= minOhms && ohms <= maxOhms;
    },
  };
}

/** The status without its method (the polynomial reports 'kernel', `channel.convert` 'exact'). */
const counts = (s: { locations: Int32Array; method: string }) => ({
  ...s,
  locations: Array.from(s.locations),
  method: undefined,
});

describe('the RTD polynomial converter (@bridgework/channel/rtd-polynomial)', () => {
  it.each(['°C', 'K', '°F'] as const)(
    'within 1 ulp of the exact composition across the 24-bit range, rejections as channel.convert (%s; every code with BRIDGEWORK_HEAVY=1)',
    (unit) => {
      const ch = createChannel(inUnit(unit));
      const fast = createRtdPolynomialConverter(ch);
      const { resistance, curve } = curveOf(ch);
      // Every code with BRIDGEWORK_HEAVY=1 (16.7 million double-double references: about a
      // minute); by default every 16th code, and every code of the 2^16 around 0 °C.
      const step = heavy ? 1 : 16;
      const zeroCode = Math.round(ch.exactCodeFromQuantity(unit === 'K' ? 273.15 : unit === '°F' ? 32 : 0));
      const list = Array.from({ length: Math.ceil(2 ** 24 / step) }, (_, i) => RAIL_LOW + i * step);
      if (!heavy) for (let x = zeroCode - 32_768; x < zeroCode + 32_768; x++) list.push(x);
      if (!heavy) list.push(RAIL_HIGH);
      const codes = Int32Array.from(list);
      const n = codes.length;
      const exactPath = ch.convert(codes);
      const { values, status } = fast.convert(codes);
      let worst = 0;
      let differ = 0;
      for (let i = 0; i < n; i++) {
        const v = values[i]!;
        const s = exactPath.values[i]!;
        // A code channel.convert rejects is rejected here, and no other.
        if (Number.isNaN(s) || Number.isNaN(v)) {
          if (!Object.is(v, s)) expect([codes[i], v]).toEqual([codes[i], s]);
          continue;
        }
        if (v !== s) differ++;
        const [th, tl] = rtdExact(codes[i]!, resistance, curve, unit);
        const err = Math.abs(v - th - tl) / ulp(Math.max(Math.abs(th), 1));
        if (!(err <= 1) && v !== s) expect([codes[i], v, err]).toEqual([codes[i], th, 1]);
        if (v !== s) worst = Math.max(worst, err);
      }
      expect(worst).toBeLessThanOrEqual(1);
      expect(counts(status)).toEqual(counts(exactPath.status));
      expect(status.method).toBe('kernel');
      expect([status.railLow, status.railHigh]).toEqual([1, 1]);
      // Not vacuous: nearly every segment passed its check and serves, and the polynomial's values
      // are not simply the exact loop's (a large share differ from them in the last bits).
      const seg = fast.segments();
      expect(seg.total).toBe(1024);
      expect(seg.checked + seg.exact).toBe(seg.total);
      expect(seg.checked).toBeGreaterThan(0.99 * seg.total);
      expect(differ).toBeGreaterThan(0.3 * n);
    },
    heavy ? 900_000 : 120_000,
  );

  it('the double-double reference agrees with decimal.js at 40 digits (IEC 60751 inverse by bisection)', () => {
    for (const unit of ['°C', '°F'] as const) {
      const ch = createChannel(inUnit(unit));
      const { resistance, curve } = curveOf(ch);
      const { a, b, c, d } = resistance;
      for (let i = 0; i <= 40; i++) {
        const x = Math.round(-8_300_000 + (16_600_000 * i) / 40) + (i % 7);
        const ohms = X(a)
          .times(x)
          .plus(X(b))
          .div(X(c).times(x).plus(X(d)));
        let t = cvdTemperature(ohms, X(curve.r0Ohms), X(curve.a), X(curve.b), X(curve.c));
        if (unit === '°F') t = t.times(9).div(5).plus(32);
        const [th, tl] = rtdExact(x, resistance, curve, unit);
        // 1e-28 of the value's scale: far below the 1e-16 the bound above needs.
        expect(t.minus(X(th)).minus(X(tl)).abs().toNumber()).toBeNear(0, {
          abs: 1e-28 * Math.max(1, Math.abs(th)),
        });
      }
    }
  });

  it.each(['javascript', 'webassembly'] as const)(
    'the %s loop evaluates exactly the checked expression (segmentValue), sample for sample',
    (loop) => {
      const ch = createChannel(pt100);
      const path = pathOf(ch, loop);
      const p = path.polynomial!;
      const codes = Int32Array.from({ length: 20_000 }, (_, i) => -8_300_000 + i * 829 + (i % 13));
      const out = new Float64Array(codes.length);
      convertRtdPolynomial(codes, out, path, new RejectTally(8, RAIL_LOW, RAIL_HIGH), codes.length);
      let served = 0;
      for (let i = 0; i < codes.length; i++) {
        const x = codes[i]!;
        const s = (x - p.base) >>> p.shift;
        if (p.states[s] !== SEGMENT.CHECKED) continue;
        served++;
        const want = segmentValue(p.table, s * STRIDE, ((x - p.base) & p.offsetMask) - p.half);
        if (!Object.is(out[i], want)) expect([x, out[i]]).toEqual([x, want]);
      }
      expect(served).toBeGreaterThan(19_000);
    },
  );

  it('the WebAssembly module shipped is its source assembled by wat2wasm (WABT), byte for byte', () => {
    // `.ci/run` installs Debian's wabt; without it this check cannot run and fails.
    const source = fileURLToPath(new URL('../src/convert/wasm/rtdPolynomial.wat', import.meta.url));
    const dir = mkdtempSync(join(tmpdir(), 'bridgework-wasm-'));
    try {
      const target = join(dir, 'rtdPolynomial.wasm');
      execFileSync('wat2wasm', [source, '-o', target]);
      expect(Buffer.from(rtdPolynomialWasmBytes()).equals(readFileSync(target))).toBe(true);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('the WebAssembly and JavaScript loops agree bit for bit, statuses included, across rails, impossible codes and chunk edges', () => {
    const ch = createChannel({ ...pt100, amplifier: { gain: 1 } }); // codes past 850 °C inside the rails
    const wasm = createRtdPolynomialConverter(ch);
    const js = createRtdPolynomialConverter(ch, { loop: 'javascript' });
    expect([wasm.loop, js.loop]).toEqual(['webassembly', 'javascript']);
    const lo = Math.floor(ch.validCodes.min) + 1;
    const hi = Math.ceil(ch.validCodes.max) - 1;
    fc.assert(
      fc.property(
        fc.array(
          fc.oneof(
            { weight: 12, arbitrary: fc.integer({ min: lo, max: hi }) },
            { weight: 1, arbitrary: fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }) },
            { weight: 1, arbitrary: fc.constantFrom(RAIL_LOW, RAIL_HIGH, lo - 1, hi + 1, lo, hi, 0) },
          ),
          { maxLength: 40_000 },
        ),
        (list) => {
          const codes = Int32Array.from(list);
          const a = wasm.convert(codes, undefined, { maxLocations: 64 });
          const b = js.convert(codes, undefined, { maxLocations: 64 });
          for (let i = 0; i < codes.length; i++)
            if (!Object.is(a.values[i], b.values[i]))
              expect([codes[i], a.values[i]]).toEqual([codes[i], b.values[i]]);
          expect(counts(a.status)).toEqual(counts(b.status));
          expect(counts(a.status)).toEqual(counts(ch.convert(codes, undefined, { maxLocations: 64 }).status));
        },
      ),
      { numRuns: 25 },
    );
    // Rejections at the edges of the 16 384-code chunks and of the 256-code blocks.
    const n = 50_001;
    const codes = Int32Array.from({ length: n }, (_, i) => lo + ((i * 7919) % (hi - lo)));
    for (const i of [0, 255, 256, 16_383, 16_384, 32_767, 32_768, 49_152, n - 1])
      codes[i] = i % 2 === 0 ? RAIL_LOW : RAIL_HIGH;
    const a = wasm.convert(codes);
    const b = js.convert(codes);
    for (let i = 0; i < n; i++)
      if (!Object.is(a.values[i], b.values[i])) expect([i, a.values[i]]).toEqual([i, b.values[i]]);
    expect(counts(a.status)).toEqual(counts(b.status));
    expect(a.status.railLow + a.status.railHigh).toBe(9);
  });

  it('a polynomial whose check fails leaves every code to the exact loop, bit for bit with channel.convert', () => {
    // The check is the proof: a reference that disagrees with the fit at every third code must
    // fail every segment, and then every value is the exact loop's.
    const ch = createChannel(pt100);
    const path = pathOf(ch);
    const fresh = path.polynomial!;
    const broken = {
      ...fresh,
      exactPair(x: number, start: number, pair: Float64Array) {
        fresh.exactPair(x, start, pair);
        if (Number.isInteger(x) && Math.abs(x) % 3 === 1) pair[0] = pair[0]! * (1 + 1e-13);
      },
    };
    const codes = Int32Array.from({ length: 6000 }, (_, i) => -8_000_000 + i * 2731);
    const out = new Float64Array(codes.length);
    convertRtdPolynomial(
      codes,
      out,
      { ...path, polynomial: broken },
      new RejectTally(8, RAIL_LOW, RAIL_HIGH),
      codes.length,
    );
    const want = ch.convert(codes).values;
    for (let i = 0; i < codes.length; i++)
      if (!Object.is(out[i], want[i])) expect([i, out[i]]).toEqual([i, want[i]]);
    expect(broken.counts.checked).toBe(0);
    expect(broken.counts.exact).toBeGreaterThan(900);
  });

  it('Float64 codes (averaged, in place): integers as the Int32 path gives them, fractional codes as channel.convert, same statuses', () => {
    const ch = createChannel(pt100);
    const fast = createRtdPolynomialConverter(ch);
    const code = fc.oneof(
      fc.integer({ min: RAIL_LOW - 2, max: RAIL_HIGH + 2 }),
      fc.double({ min: RAIL_LOW - 2, max: RAIL_HIGH + 2, noNaN: true }),
    );
    fc.assert(
      fc.property(fc.array(code, { minLength: 1, maxLength: 300 }), (list) => {
        const src = Float64Array.from(list);
        const separate = fast.convert(src, new Float64Array(src.length));
        const buf = src.slice();
        const inPlace = fast.convert(buf, buf);
        const reference = ch.convert(src);
        for (let i = 0; i < src.length; i++) {
          const x = src[i]!;
          const want =
            Number.isInteger(x) && x > RAIL_LOW && x < RAIL_HIGH
              ? fast.convert(new Int32Array([x])).values[0]!
              : reference.values[i]!;
          expect([x, buf[i]]).toEqual([x, want]);
          expect([x, separate.values[i]]).toEqual([x, want]);
          // Fractional codes and rejections are the exact loop's own.
          if (!Number.isInteger(x) || Number.isNaN(want)) expect([x, want]).toEqual([x, reference.values[i]]);
        }
        expect(counts(inPlace.status)).toEqual(counts(reference.status));
        expect(counts(separate.status)).toEqual(counts(reference.status));
      }),
      { numRuns: 60 },
    );
  });

  it('codes past the curve (at gain 1, beyond −200 … 850 °C) are rejected and located as channel.convert does', () => {
    const ch = createChannel({ ...pt100, amplifier: { gain: 1 } });
    const fast = createRtdPolynomialConverter(ch, { checkAllSegments: true });
    const seg = fast.segments();
    expect(seg.checked + seg.exact).toBe(seg.total);
    const codes = Int32Array.from({ length: 50_000 }, (_, i) => RAIL_LOW + i * 335 + (i % 5));
    const a = ch.convert(codes, undefined, { maxLocations: 100_000 });
    const b = fast.convert(codes, undefined, { maxLocations: 100_000 });
    expect(a.status.outOfRange).toBeGreaterThan(1000);
    expect(counts(b.status)).toEqual(counts(a.status));
    for (let i = 0; i < codes.length; i++)
      expect(Number.isNaN(b.values[i]!), `code ${codes[i]}`).toBe(Number.isNaN(a.values[i]!));
    expect(() => fast.convert(codes, undefined, { onInvalid: 'throw' })).toThrowBridgeworkError('clipped', {
      param: 'codes',
    });
  });

  it('refuses what it cannot do, in the user’s terms', () => {
    const gauge = createChannel({
      name: 'deck girder',
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
      bridge: { arrangement: 'quarter', wiring: 'three-wire' },
      excitation: { volts: 5 },
      amplifier: { gain: 64 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'strain' },
    });
    expect(() => createRtdPolynomialConverter(gauge)).toThrowBridgeworkError('invalid-option', {
      param: 'channel',
    });
    expect(() => createRtdPolynomialConverter({} as Channel)).toThrowBridgeworkError('wrong-type', {
      param: 'channel',
    });
    const ch = createChannel(pt100);
    expect(() => createRtdPolynomialConverter(ch, { checkAll: true } as never)).toThrowBridgeworkError(
      'unknown-option',
      { param: 'options.checkAll' },
    );
    expect(() =>
      createRtdPolynomialConverter(ch, { checkAllSegments: 'yes' } as never),
    ).toThrowBridgeworkError('wrong-type', { param: 'options.checkAllSegments' });
    expect(() => createRtdPolynomialConverter(ch, { loop: 'wasm' } as never)).toThrowBridgeworkError(
      'invalid-option',
      { param: 'options.loop' },
    );
    // A runtime without WebAssembly: the JavaScript loop serves by default, and asking for the
    // module is refused in the user's terms.
    const g = globalThis as { WebAssembly?: unknown };
    const saved = g.WebAssembly;
    try {
      delete g.WebAssembly;
      expect(createRtdPolynomialConverter(ch).loop).toBe('javascript');
      expect(() => createRtdPolynomialConverter(ch, { loop: 'webassembly' })).toThrowBridgeworkError(
        'wrong-type',
        { param: 'options.loop' },
      );
    } finally {
      g.WebAssembly = saved;
    }
    const fast = createRtdPolynomialConverter(ch);
    // As channel.convert: a short out, an Int32 out sharing memory, a sensor temperature for an RTD.
    expect(() => fast.convert(new Int32Array(4), new Float64Array(3))).toThrowBridgeworkError(
      'invalid-shape',
      {
        param: 'out',
      },
    );
    expect(() =>
      fast.convert(new Int32Array(4), undefined, { temperatureCelsius: 40 }),
    ).toThrowBridgeworkError('invalid-option', { param: 'options.temperatureCelsius' });
    expect(() => fast.convert([1, 2] as never)).toThrowBridgeworkError('wrong-type', { param: 'codes' });
  });
});
