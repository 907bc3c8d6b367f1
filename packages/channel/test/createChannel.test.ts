import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { createAdc, type RatiometricAdc } from '@bridgework/chain';
import { BridgeworkError } from '@bridgework/core';
import { correctTemperatureEffects, createRtd, wireOhms } from '@bridgework/compensation';
import {
  CHANNEL_MAP_RELATIVE_ACCURACY,
  createChannel,
  validateChannelSpec,
  type ChannelSpec,
} from '@bridgework/channel';
import { solveBridgeNetwork } from '../../../test/support/nodal.js';
import { D, X, arm1Ref, cvdTemperature, ratioFromCodeRef } from './support/reference.js';

/** The minimal spec of issue #9, exactly as written there. */
const minimal: ChannelSpec = {
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'strain' },
};

const code24 = fc.integer({ min: -(2 ** 23) + 1, max: 2 ** 23 - 2 });

function caught(fn: () => unknown): BridgeworkError {
  try {
    fn();
  } catch (e) {
    if (e instanceof BridgeworkError) return e;
    throw e;
  }
  throw new Error('nothing was thrown');
}

describe('createChannel: the minimal spec', () => {
  it('is accepted exactly as written, everything else defaulted', () => {
    const ch = createChannel(minimal);
    expect(ch.name).toBe('channel');
    expect(ch.quantity).toBe('strain');
    expect(ch.unit).toBe('m/m');
    expect(ch.method).toBe('kernel');
    expect(ch.adc.bits).toBe(24);
    expect(ch.spec.adc.bipolar).toBe(true);
    expect(ch.spec.adc.filter).toEqual({ kind: 'sinc', order: 3, dataRateHertz: 10 });
    expect(ch.spec.bridge.completionOhms).toBe(350);
    expect(ch.spec.excitation.remoteSense).toBe(false);
    expect(ch.spec.environment.rangeCelsius).toEqual({ min: 20, max: 20 });
    expect(ch.spec.polarity).toBe('normal');
    expect(ch.validCodes).toEqual({ min: -(2 ** 23), max: 2 ** 23 - 1 });
  });

  it('equals the hand composition of chain + bridge + compensation calls (no formula of its own)', () => {
    // Ratiometric coding: ratio = code/(gain·2^(bits−1)) (chain); strain from the bridge (bridge);
    // the gauge-factor/temperature correction (compensation), here at the zeroing temperature.
    const adc = createAdc({ bits: 24, referenceVolts: 5, gain: 128, ratiometric: true }) as RatiometricAdc;
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 2.1,
      gaugeOhms: 350,
      leads: { ohmsPerLead: 1.2, wiring: 'three-wire' },
    });
    const ch = createChannel(minimal);
    fc.assert(
      fc.property(code24, (code) => {
        const byHand = correctTemperatureEffects({
          indicatedStrain: bridge.strainFromRatio(adc.ratioFromCode(code)),
          gaugeFactorSetting: 2.1,
          zeroCelsius: 20,
          temperatureCelsius: 20,
          gaugeFactor: 2.1,
          gaugeFactorTemperatureCoefficientPerKelvin: 0,
          gaugeFactorReferenceCelsius: 24,
        });
        expect(ch.quantityFromCode(code)).toBe(byHand);
        expect(ch.convert(new Int32Array([code])).values[0]).toBeNear(byHand, { rel: 1e-12, abs: 1e-18 });
      }),
      { numRuns: 500 },
    );
  });

  it('matches a 40-digit first-principles reference (decimal.js) over the whole code range', () => {
    // Three-wire quarter bridge: R1 = Rg(1 + GF·ε) + RL, R2 = Rc + RL, R3 = R4 = Rc, Rs = 0.
    const ch = createChannel(minimal);
    const rl = X(1.2);
    const rg = new D(350);
    fc.assert(
      fc.property(code24, (code) => {
        const r = ratioFromCodeRef(code, 128, 24);
        const r1 = arm1Ref(r, rg.plus(rl), rg, rg, new D(0));
        const strain = r1
          .minus(rl)
          .minus(rg)
          .div(rg.times(X(2.1)))
          .toNumber();
        const out = ch.convert(new Int32Array([code])).values[0] as number;
        // Absolute floor 1e-18 m/m: near zero strain the double ratio code/2^30 is exact, the
        // map's rounding is a few ulps of the span.
        expect(out).toBeNear(strain, { rel: 1e-12, abs: 1e-18 });
        expect(ch.quantityFromCode(code)).toBeNear(strain, { rel: 1e-13, abs: 1e-18 });
      }),
      { numRuns: 2000 },
    );
  });
});

describe('createChannel: exact maps for every sensor kind (40-digit references)', () => {
  it('two-wire quarter bridge on a cable, absolute reference with source resistance, in µε', () => {
    const spec: ChannelSpec = {
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.05, gaugeOhms: 120 },
      bridge: { arrangement: 'quarter', wiring: 'two-wire', cable: { awg: 26, lengthMeters: 15 } },
      excitation: { volts: 2.5, sourceOhms: 4.7 },
      amplifier: { gain: 64 },
      adc: { bits: 24, referenceVolts: 2.5 },
      environment: { temperatureCelsius: 35 },
      output: { quantity: 'strain', unit: 'µε' },
    };
    const ch = createChannel(spec);
    // Lead resistance from compensation (AWG 26 at 35 °C, checked there against IEC 60028).
    const rl = X(wireOhms({ awg: 26, lengthMeters: 15, temperatureCelsius: 35 }));
    const lsb = X(2.5).div(X(64).times(new D(2).pow(23)));
    fc.assert(
      fc.property(code24, (code) => {
        const r = X(code).times(lsb).div(X(2.5)); // Vout/EMF
        const rg = new D(120);
        const r1 = arm1Ref(r, rg, rg, rg, X(4.7));
        const ue = r1
          .minus(rl.times(2))
          .minus(rg)
          .div(rg.times(X(2.05)))
          .times(1e6);
        if (!r1.minus(rl.times(2)).greaterThan(0)) return; // no positive gauge: rejected (tested elsewhere)
        // Near zero strain the figure is a difference of ~121 Ω arms: one ulp of the arm (1.4e-14 Ω)
        // is 5.8e-11 µε, so the absolute term allows 17 such ulps (code 4499367 is off by 4.2e-12 µε).
        expect(ch.quantityFromCode(code)).toBeNear(ue.toNumber(), { rel: 1e-12, abs: 1e-9 });
      }),
      { numRuns: 1000 },
    );
  });

  it('RTD (Pt100) in a three-wire quarter bridge: temperature via IEC 60751, solved at 40 digits', () => {
    const spec: ChannelSpec = {
      sensor: { kind: 'rtd', r0Ohms: 100 },
      bridge: { wiring: 'three-wire', ohmsPerLead: 0.8, completionOhms: 100 },
      excitation: { volts: 1 },
      amplifier: { gain: 8 },
      adc: { bits: 24, referenceVolts: 1, ratiometric: true },
      output: { quantity: 'temperature' },
    };
    const ch = createChannel(spec);
    expect(ch.method).toBe('exact');
    const [r0, a, b, c] = [X(100), X(3.9083e-3), X(-5.775e-7), X(-4.183e-12)];
    // Codes spanning about −190 … 800 °C for this bridge and gain.
    fc.assert(
      fc.property(fc.integer({ min: -1_600_000, max: 2_000_000 }), (code) => {
        const r = ratioFromCodeRef(code, 8, 24);
        const rl = X(0.8);
        const arm = arm1Ref(r, X(100).plus(rl), X(100), X(100), new D(0));
        const ohms = arm.minus(rl);
        if (ohms.lessThan(18.6) || ohms.greaterThan(390)) return; // outside −200…850 °C
        const t = cvdTemperature(ohms, r0, a, b, c).toNumber();
        expect(ch.quantityFromCode(code)).toBeNear(t, { abs: 1e-9 }); // compensation's RTD inverse: ≤ 1e-9 K
      }),
      { numRuns: 300 },
    );
    // And the channel agrees with the compensation package's RTD at a known point (IEC 60751, Table 1:
    // 138.51 Ω at 100 °C, from memory): the code for 100 °C converts back to 100 °C within half a step.
    const rtd = createRtd();
    expect(rtd.ohmsAt(100)).toBeNear(138.51, { abs: 0.005 });
    expect(ch.quantityFromCode(ch.codeFromQuantity(100))).toBeNear(100, { abs: 2e-4 });
  });

  it('load cell on a four-wire cable: certificate scaling with the lead span factor', () => {
    const spec: ChannelSpec = {
      name: 'hopper cell 2',
      sensor: {
        kind: 'transducer',
        capacity: 5000,
        ratedOutputVoltsPerVolt: 2e-3,
        zeroBalanceVoltsPerVolt: 1.5e-5,
        inputOhms: 400,
        outputOhms: 350,
      },
      bridge: { wiring: 'four-wire', ohmsPerLead: 2.2 },
      excitation: { volts: 10 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 10, ratiometric: true },
      output: { quantity: 'force' },
    };
    const ch = createChannel(spec);
    fc.assert(
      fc.property(code24, (code) => {
        // load = capacity·(r/span − zero)/RO with span = Rin/(Rin + 2RL) (common practice).
        const span = X(400).div(X(400).plus(X(2.2).times(2)));
        const r = ratioFromCodeRef(code, 128, 24);
        const load = X(5000)
          .times(r.div(span).minus(X(1.5e-5)))
          .div(X(2e-3));
        expect(ch.quantityFromCode(code)).toBeNear(load.toNumber(), { rel: 1e-13, abs: 1e-10 });
      }),
      { numRuns: 500 },
    );
  });

  it('a strain gauge with a zero reading and a gauge-factor temperature coefficient', () => {
    const spec: ChannelSpec = {
      sensor: {
        kind: 'strain-gauge',
        gaugeFactor: 2.1,
        gaugeFactorTemperatureCoefficientPerKelvin: 9e-5,
        gaugeFactorReferenceCelsius: 24,
      },
      bridge: { arrangement: 'half-bending', wiring: 'three-wire', ohmsPerLead: 0.5 },
      excitation: { volts: 5 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      zero: { code: 2345 },
      environment: { temperatureCelsius: 60, zeroTemperatureCelsius: 20 },
      output: { quantity: 'strain' },
    };
    const ch = createChannel(spec);
    // By hand with the component packages: bridge two-reading method, then the temperature correction.
    const bridge = createStrainBridge({
      arrangement: 'half-bending',
      gaugeFactor: 2.1,
      leads: { ohmsPerLead: 0.5, wiring: 'three-wire' },
    });
    const cpr = 128 * 2 ** 23;
    fc.assert(
      fc.property(fc.integer({ min: -4_000_000, max: 4_000_000 }), (code) => {
        const indicated = bridge.strainFromRatio(code / cpr, { zeroRatio: 2345 / cpr });
        const byHand = correctTemperatureEffects({
          indicatedStrain: indicated,
          gaugeFactorSetting: 2.1,
          zeroCelsius: 20,
          temperatureCelsius: 60,
          gaugeFactor: 2.1,
          gaugeFactorTemperatureCoefficientPerKelvin: 9e-5,
          gaugeFactorReferenceCelsius: 24,
        });
        expect(ch.quantityFromCode(code)).toBe(byHand);
        expect(ch.convert(new Int32Array([code])).values[0]).toBeNear(byHand, { rel: 1e-12, abs: 1e-18 });
      }),
      { numRuns: 500 },
    );
    // The zero code reads exactly zero strain.
    expect(ch.quantityFromCode(2345)).toBe(0);
  });
});

describe('createChannel: round trips for every sensor kind and arrangement', () => {
  const arrangements = [
    ['quarter', 'three-wire'],
    ['quarter', 'two-wire'],
    ['half-bending', 'three-wire'],
    ['half-poisson', 'three-wire'],
    ['half-opposite', 'two-wire'],
    ['full-bending', 'four-wire'],
    ['full-poisson', 'six-wire'],
    ['full-shear', 'four-wire'],
    ['full-bending-poisson', 'four-wire'],
  ] as const;
  const specs: [string, ChannelSpec][] = [
    ...arrangements.map(([arrangement, wiring]): [string, ChannelSpec] => [
      `${arrangement} (${wiring})`,
      {
        sensor: { kind: 'strain-gauge', gaugeFactor: 2.12, transverseSensitivity: 0.012 },
        bridge: { arrangement, wiring, ohmsPerLead: 0.9, poissonRatio: 0.3 },
        excitation: { volts: 5, ...(wiring === 'six-wire' ? { remoteSense: true } : {}) },
        amplifier: { gain: 64 },
        adc: { bits: 24, referenceVolts: 5, ratiometric: true },
        polarity: 'inverted',
        output: { quantity: 'strain', unit: 'µε' },
      },
    ]),
    [
      'transducer (mass)',
      {
        sensor: { kind: 'transducer', capacity: 50, ratedOutputVoltsPerVolt: 2e-3 },
        excitation: { volts: 5 },
        amplifier: { gain: 128 },
        adc: { bits: 24, referenceVolts: 2.5 },
        output: { quantity: 'mass' },
      },
    ],
    [
      'rtd (temperature)',
      {
        sensor: { kind: 'rtd', r0Ohms: 1000 },
        bridge: { wiring: 'two-wire', ohmsPerLead: 0.3 },
        excitation: { volts: 2.5 },
        amplifier: { gain: 4 },
        adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
        output: { quantity: 'temperature' },
      },
    ],
  ];

  it.each(specs)(
    '%s: codeFromQuantity(quantityFromCode(code)) is the code, over the full range',
    (_name, spec) => {
      const ch = createChannel(spec);
      const lo = Math.floor(ch.validCodes.min) + 1;
      const hi = Math.ceil(ch.validCodes.max) - 1;
      fc.assert(
        fc.property(fc.integer({ min: lo, max: hi }), (code) => {
          const q = ch.quantityFromCode(code);
          expect(Number.isFinite(q)).toBe(true);
          expect(ch.codeFromQuantity(q)).toBe(code);
        }),
        { numRuns: 300 },
      );
      // Both ends of the valid range too.
      for (const code of [lo, hi]) expect(ch.codeFromQuantity(ch.quantityFromCode(code))).toBe(code);
    },
  );

  it.each(specs)('%s: the batch converter equals the scalar exact map', (_name, spec) => {
    const ch = createChannel(spec);
    const lo = Math.floor(ch.validCodes.min) + 1;
    const hi = Math.ceil(ch.validCodes.max) - 1;
    const codes = Int32Array.from({ length: 2001 }, (_, i) => Math.round(lo + ((hi - lo) * i) / 2000));
    const { values, status } = ch.convert(codes);
    expect(status.rejected).toBe(0);
    let scale = 0;
    codes.forEach((c) => (scale = Math.max(scale, Math.abs(ch.quantityFromCode(c)))));
    codes.forEach((c, i) => {
      // The kernel's stated agreement: 1e-12 of the largest quantity.
      expect(values[i]).toBeNear(ch.quantityFromCode(c), { abs: 1e-12 * scale });
    });
  });
});

describe('createChannel: invalid specs list every problem by field path', () => {
  it('collects unknown fields, bad numbers, bad choices and cross-field problems at once', () => {
    const e = caught(() =>
      createChannel({
        sensor: { kind: 'strain-gauge', gaugeFactor: -2, gaugeOhm: 350 },
        bridge: { arrangement: 'full-poisson', wiring: 'three-wire', ohmsPerLead: -1 },
        excitation: { volts: 0 },
        amplifier: { gain: Number.NaN },
        adc: { bits: 24.5, referenceVolts: 5, filter: { order: 9 } },
        output: { quantity: 'temperature' },
      } as unknown as ChannelSpec),
    );
    expect(e.code).toBe('invalid-spec');
    const paths = e.issues.map((i) => i.path).sort();
    expect(paths).toEqual(
      [
        'adc.bits',
        'adc.filter.order',
        'amplifier.gain',
        'bridge.ohmsPerLead',
        'excitation.volts',
        'sensor.gaugeFactor',
        'sensor.gaugeOhm',
      ].sort(),
    );
    expect(e.issues.find((i) => i.path === 'excitation.volts')).toEqual({
      code: 'not-positive',
      path: 'excitation.volts',
      message: 'must be > 0; got 0 V',
      expected: '> 0',
      limit: '0',
    });
    expect(e.issues.find((i) => i.path === 'sensor.gaugeOhm')?.message).toBe(
      "unknown field; did you mean 'gaugeOhms'?",
    );
    expect(e.message).toContain('7 problems');
  });

  it('reports cross-field rules once the fields themselves are valid', () => {
    const e = caught(() =>
      createChannel({
        ...minimal,
        bridge: {
          arrangement: 'full-poisson',
          wiring: 'three-wire',
          ohmsPerLead: 1,
          cable: { awg: 24, diameterMeters: 5e-4, lengthMeters: 10 },
        },
        excitation: { volts: 5, remoteSense: true },
        zero: { code: 2 ** 23 },
        output: { quantity: 'force' },
      }),
    );
    const paths = e.issues.map((i) => i.path);
    expect(paths).toEqual(
      expect.arrayContaining([
        'bridge.poissonRatio',
        'bridge.wiring',
        'bridge.cable',
        'excitation.remoteSense',
        'output.modulusPascals',
        'output.areaSquareMeters',
        'zero.code',
      ]),
    );
  });

  it('rejects a ratiometric converter whose reference is not the excitation', () => {
    const e = caught(() =>
      createChannel({ ...minimal, adc: { bits: 24, referenceVolts: 2.5, ratiometric: true } }),
    );
    expect(e.issues.map((i) => i.path)).toEqual(['adc.referenceVolts']);
  });

  it('rejects a quantity that does not suit the sensor, and a missing required block', () => {
    expect(caught(() => createChannel({ ...minimal, output: { quantity: 'mass' } })).issues[0]?.path).toBe(
      'output.quantity',
    );
    const { adc: _adc, ...noAdc } = minimal;
    expect(caught(() => createChannel(noAdc as ChannelSpec)).issues[0]?.path).toBe('adc');
    expect(caught(() => createChannel(null as unknown as ChannelSpec)).issues[0]).toMatchObject({
      code: 'wrong-type',
      path: '',
    });
  });
});

describe('createChannel: codes that cannot be converted', () => {
  it('quantityFromCode throws clipped at the rails and ratio-out-of-range beyond the sensor', () => {
    const ch = createChannel(minimal);
    expect(() => ch.quantityFromCode(2 ** 23 - 1)).toThrowBridgeworkError('clipped', { param: 'code' });
    expect(() => ch.quantityFromCode(-(2 ** 23))).toThrowBridgeworkError('clipped', { param: 'code' });
    expect(() => ch.quantityFromCode(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'code' });
    // A gain of 1: the converter reaches ratios the quarter bridge cannot produce (|r| → 1/2).
    const wide = createChannel({ ...minimal, amplifier: { gain: 1 } });
    expect(wide.validCodes.max).toBeLessThan(2 ** 23 - 1);
    expect(() => wide.quantityFromCode(2 ** 23 - 10)).toThrowBridgeworkError('ratio-out-of-range', {
      param: 'code',
    });
  });

  it('codeFromQuantity clips to the rails, and rejects quantities the sensor cannot reach', () => {
    const ch = createChannel(minimal);
    expect(ch.codeFromQuantity(0.5)).toBe(2 ** 23 - 1);
    expect(ch.codeFromQuantity(-0.3)).toBe(-(2 ** 23));
    expect(() => ch.codeFromQuantity(-1)).toThrowBridgeworkError('out-of-range');
    expect(() => ch.codeFromQuantity(Infinity)).toThrowBridgeworkError('not-finite', { param: 'quantity' });
  });
});

describe('a ratiometric converter and excitation.sourceOhms (issue 15: the source resistance was ignored silently)', () => {
  it('refuses a source resistance with a ratiometric converter, at excitation.sourceOhms, saying why', () => {
    const spec: ChannelSpec = { ...minimal, excitation: { volts: 5, sourceOhms: 10 } };
    const e = caught(() => createChannel(spec));
    expect(e.code).toBe('invalid-spec');
    expect(e.issues).toHaveLength(1);
    const issue = e.issues[0]!;
    expect(issue).toMatchObject({ path: 'excitation.sourceOhms', code: 'conflicting-options', limit: '0 Ω' });
    expect(issue.message).toMatch(/reference is taken at the excitation terminals/);
    expect(issue.message).toMatch(/changes the bridge voltage, not the ratio/);
    expect(issue.message).toMatch(/got 10 Ω/);
    expect(issue.suggestion).toMatch(/excitation\.volts/);
    expect(issue.suggestion).toMatch(/adc\.ratiometric to false/);
    // The same through the validator, as data.
    const v = validateChannelSpec(spec);
    expect(v.ok).toBe(false);
    expect(v.ok ? [] : v.issues.map((i) => i.path)).toEqual(['excitation.sourceOhms']);
    // An absolute reference sees the source resistance and models it (exact test above).
    expect(() =>
      createChannel({ ...spec, adc: { bits: 24, referenceVolts: 2.5, ratiometric: false } }),
    ).not.toThrow();
  });

  it('why: in a nodal solve the ratio at the terminals is independent of the source resistance, the bridge voltage is not', () => {
    // Quarter bridge at +1000 µε (GF 2.1, 350 Ω), EMF 5 V behind Rs; independent 40-digit nodal solve.
    const rg = 350 * (1 + 2.1 * 1e-3);
    const arms = [rg, 350, 350, 350] as const;
    const at = (sourceOhms: number) =>
      solveBridgeNetwork({ armsOhms: arms, excitationVolts: 5, sourceOhms, meterOhms: Infinity });
    const stiff = at(0);
    const soft = at(25);
    // The ratio a converter referenced to the terminals reads: unchanged.
    expect(soft.outputVolts / soft.bridgeVolts).toBeNear(stiff.outputVolts / stiff.bridgeVolts, {
      rel: 1e-14,
    });
    // The bridge voltage: E·Rin/(Rin + Rs), Rin = (R1 + R2)(R3 + R4)/(R1 + R2 + R3 + R4). // circuit theory
    const rin = ((rg + 350) * 700) / (rg + 350 + 700);
    expect(soft.bridgeVolts).toBeNear((5 * rin) / (rin + 25), { rel: 1e-14 });
    expect(soft.bridgeVolts).toBeLessThan(stiff.bridgeVolts * 0.94);
    // What the refusal asks for: the terminal voltage as excitation.volts, sourceOhms 0. Its map
    // agrees with the nodal ratio at the terminals.
    const ch = createChannel({
      ...minimal,
      bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 0 },
      excitation: { volts: soft.bridgeVolts },
      adc: { bits: 24, referenceVolts: soft.bridgeVolts, ratiometric: true },
    });
    const ratio = soft.outputVolts / soft.bridgeVolts;
    // Sign convention of docs/conventions.md: ratio = (V(S+) − V(S−))/E; a stretched R1 gives a positive ratio.
    const code = ratio * 128 * 2 ** 23;
    expect(ch.quantityFromCode(code)).toBeNear(1e-3, { rel: 1e-12 });
  });

  it('accepts a source resistance with remote sense (six-wire): the sensed excitation regulates it out, the map is unchanged', () => {
    const base: ChannelSpec = {
      sensor: { kind: 'transducer', capacity: '20 t', ratedOutputVoltsPerVolt: '2 mV/V' },
      bridge: { wiring: 'six-wire' },
      excitation: { volts: 5 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 5, ratiometric: true },
      output: { quantity: 'mass', unit: 't' },
    };
    const a = createChannel(base);
    const b = createChannel({ ...base, excitation: { volts: 5, sourceOhms: 10 } });
    for (const code of [-4_000_000, -1, 0, 1, 1_234_567, 8_388_606]) {
      expect(b.quantityFromCode(code)).toBe(a.quantityFromCode(code));
    }
  });
});

describe("quantityFromCode's stated accuracy, exactly as docs/channel.md states it (issue 15)", () => {
  // docs/channel.md, "Accuracy and verification": at every code of the span, |error| ≤ 1e-13 × the
  // span's largest |value| against 40-digit references. Not relative to each value: at code 1 the
  // value is a small difference of large ones.
  const BOUND = 1e-13;
  const largestRead = (ch: ReturnType<typeof createChannel>) =>
    Math.max(Math.abs(ch.span.min), Math.abs(ch.span.max));
  const codes = (lo: number, hi: number) =>
    fc
      .sample(fc.integer({ min: lo, max: hi }), { numRuns: 1500, seed: 15 })
      .concat([-3, -1, 0, 1, 2, 3, lo, hi]);
  /** The codes of a channel's span, as the firmware verification takes them. */
  const spanCodes = (ch: ReturnType<typeof createChannel>) => {
    const ends = [ch.span.min, ch.span.max].map((v) => ch.codeFromQuantity(v));
    return codes(Math.min(...ends), Math.max(...ends));
  };

  it('the constant the firmware bounds use is the stated figure', () => {
    expect(CHANNEL_MAP_RELATIVE_ACCURACY).toBe(BOUND);
  });

  it("quarter three-wire, ratiometric (m/m): within 1e-13 of the span's largest value, zero included", () => {
    const ch = createChannel(minimal);
    const largest = largestRead(ch);
    const rl = X(1.2);
    const rg = new D(350);
    for (const code of spanCodes(ch)) {
      const r1 = arm1Ref(ratioFromCodeRef(code, 128, 24), rg.plus(rl), rg, rg, new D(0));
      const ref = r1
        .minus(rl)
        .minus(rg)
        .div(rg.times(X(2.1)))
        .toNumber();
      expect(ch.quantityFromCode(code)).toBeNear(ref, { abs: BOUND * largest });
    }
  });

  it("RTD three-wire (°C), where a value near 0 °C has no useful relative accuracy: within 1e-13 of the span's largest", () => {
    const ch = createChannel({
      sensor: { kind: 'rtd', r0Ohms: 100 },
      bridge: { wiring: 'three-wire', ohmsPerLead: 0.8, completionOhms: 100 },
      excitation: { volts: 1 },
      amplifier: { gain: 8 },
      adc: { bits: 24, referenceVolts: 1, ratiometric: true },
      output: { quantity: 'temperature' },
    });
    const largest = largestRead(ch);
    const [r0, a, b, c] = [X(100), X(3.9083e-3), X(-5.775e-7), X(-4.183e-12)];
    let nearZero = 0;
    for (const code of spanCodes(ch)) {
      const arm = arm1Ref(ratioFromCodeRef(code, 8, 24), X(100.8), X(100), X(100), new D(0));
      const ref = cvdTemperature(arm.minus(X(0.8)), r0, a, b, c).toNumber();
      const got = ch.quantityFromCode(code);
      expect(got).toBeNear(ref, { abs: BOUND * largest });
      if (Math.abs(ref) < 1e-6) nearZero++;
    }
    // The sample holds readings near 0 °C, where a bound relative to the value itself would not hold.
    expect(nearZero).toBeGreaterThan(0);
  });

  it('load cell four-wire (N) and an absolute reference with source resistance (µε)', () => {
    const cell = createChannel({
      sensor: {
        kind: 'transducer',
        capacity: 5000,
        ratedOutputVoltsPerVolt: 2e-3,
        zeroBalanceVoltsPerVolt: 1.5e-5,
        inputOhms: 400,
        outputOhms: 350,
      },
      bridge: { wiring: 'four-wire', ohmsPerLead: 2.2 },
      excitation: { volts: 10 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 10, ratiometric: true },
      output: { quantity: 'force' },
    });
    const cellLargest = largestRead(cell);
    const span = X(400).div(X(400).plus(X(2.2).times(2)));
    for (const code of spanCodes(cell)) {
      const ref = X(5000)
        .times(ratioFromCodeRef(code, 128, 24).div(span).minus(X(1.5e-5)))
        .div(X(2e-3))
        .toNumber();
      expect(cell.quantityFromCode(code)).toBeNear(ref, { abs: BOUND * cellLargest });
    }
    const gauge = createChannel({
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.05, gaugeOhms: 120 },
      bridge: { arrangement: 'quarter', wiring: 'two-wire', cable: { awg: 26, lengthMeters: 15 } },
      excitation: { volts: 2.5, sourceOhms: 4.7 },
      amplifier: { gain: 64 },
      adc: { bits: 24, referenceVolts: 2.5 },
      environment: { temperatureCelsius: 35 },
      output: { quantity: 'strain', unit: 'µε' },
    });
    const gaugeLargest = largestRead(gauge);
    const rl = X(wireOhms({ awg: 26, lengthMeters: 15, temperatureCelsius: 35 }));
    const lsb = X(2.5).div(X(64).times(new D(2).pow(23)));
    const rg = new D(120);
    for (const code of spanCodes(gauge)) {
      const r1 = arm1Ref(X(code).times(lsb).div(X(2.5)), rg, rg, rg, X(4.7));
      const ref = r1
        .minus(rl.times(2))
        .minus(rg)
        .div(rg.times(X(2.05)))
        .times(1e6)
        .toNumber();
      expect(gauge.quantityFromCode(code)).toBeNear(ref, { abs: BOUND * gaugeLargest });
    }
  });
});
