/**
 * Issue 14's channels end to end: the Pt100 bath channel of the issue, the demo's deck RTD and a
 * 10 kΩ NTC thermometer meet 0.01 °C in fixed point against their exact maps, proved over every
 * code; the compiled C (gcc, strict flags) gives the library's results bit for bit and stays
 * within each stated bound; an impossible target is refused naming the best bound reached; a Pt100
 * over −200 … 850 °C at 0.01 °C fits 2 KiB of fixed-point tables on a 32-bit integer core.
 *
 * The exact maps are checked first against outside sources: the channel's quantityFromCode against
 * IEC 60751 Table 1 through an independent bridge solve, the NTC map against a 60-digit
 * Steinhart–Hart evaluation. The compiled sweep covers a sample of about 10^5 codes (the worst
 * codes and the test vectors among them) by default, and every code with BRIDGEWORK_HEAVY=1.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { channelConstants, createChannel, type Channel, type ChannelSpec } from '@bridgework/channel';
import { createSteinhartHartThermistor } from '@bridgework/compensation';
import { exactDecimalString } from '@bridgework/core';
import { designFirmwareConstants, firmwareCost, type FirmwareChannel } from '@bridgework/firmware';
import { footbridgeSpecs } from '../packages/cli/test/support/footbridge.js';
import { needCompiler, scratch } from '../packages/firmware/test/support/cc.js';
import { hashOf, sweepCompiled } from '../packages/firmware/test/support/sweep.js';

const HEAVY = process.env['BRIDGEWORK_HEAVY'] === '1';
const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
const TYPES = ['fixed', 'float32', 'float64'] as const;

/** The bath channel (issue 14), restated in SI. */
const bathSpec: ChannelSpec = {
  name: 'bath-pt100',
  sensor: { kind: 'rtd', r0Ohms: 100, toleranceClass: 'B' },
  bridge: { wiring: 'three-wire', ohmsPerLead: 0.5 },
  excitation: { volts: 0.5 },
  amplifier: { gain: 4, inputVoltageNoiseVoltsPerRootHz: 15e-9 },
  adc: { bits: 24, referenceVolts: 0.5, ratiometric: true, filter: { dataRateHertz: 10 } },
  environment: { temperatureCelsius: 25, rangeCelsius: [15, 35] },
  tolerances: { completionOhmsFraction: 0.0001, ohmsPerLead: 0.05 },
  output: { quantity: 'temperature', range: [-50, 200] },
};

/** Codes for the compiled sweep: every code (heavy), or an even sample plus the vectors. */
function sweepCodes(ch: FirmwareChannel, codeMin: number, codeMax: number): Int32Array {
  if (HEAVY) return Int32Array.from({ length: codeMax - codeMin + 1 }, (_, i) => codeMin + i);
  const picked = new Set<number>();
  const step = Math.max(1, Math.ceil((codeMax - codeMin + 1) / 100_000));
  for (let c = codeMin; c <= codeMax; c += step) picked.add(c);
  for (const v of ch.testVectors ?? []) picked.add(v.code);
  picked.add(codeMax);
  return Int32Array.from([...picked].sort((a, b) => a - b));
}

/**
 * Compiles the channel's header and runs the sweep: bit for bit the library, every function within
 * its stated total of the reference, and the bound no more than twice what the C shows.
 */
function checkCompiled(
  ch: FirmwareChannel,
  exact: (code: number) => number,
  codeMin: number,
  codeMax: number,
): void {
  const codes = sweepCodes(ch, codeMin, codeMax);
  const reference = Float64Array.from(codes, exact);
  const { dir, remove } = scratch();
  try {
    const { lines, testProgramOutput } = sweepCompiled(dir, ch, codes, reference);
    for (const t of TYPES) {
      if (ch[t] === undefined) continue;
      const line = lines[t]!;
      const total = ch.totals![t]!;
      expect(line.hash, `${t}: C and TypeScript results`).toBe(hashOf(ch, t, codes));
      expect(line.maxError, t).toBeLessThanOrEqual(total.bound);
      expect(total.bound, t).toBeLessThanOrEqual(2 * line.maxError);
    }
    expect(testProgramOutput).toMatch(/ 0 failed\n$/);
  } finally {
    remove();
  }
}

/** The Pt100's three-wire quarter bridge in decimal: arm 1 = RTD + lead, arm 2 = completion + lead. */
function bathCodeForOhms(ohms: string): number {
  const rl = new D('0.5');
  const r1 = new D(ohms).plus(rl);
  const r2 = new D(100).plus(rl);
  const ratio = r1.times(100).minus(r2.times(100)).div(r1.plus(r2).times(200));
  return ratio.times(4 * 2 ** 23).toNumber(); // gain 4, 24-bit bipolar ratiometric: code = ratio·4·2^23
}

describe('the Pt100 bath channel of issue 14 at 0.01 °C', () => {
  const bath = createChannel(bathSpec);

  it('its exact map agrees with IEC 60751 Table 1 through an independent bridge solve', () => {
    // IEC 60751:2008, Table 1 (Pt100), from memory: R at −50, 0, 50, 100, 150 and 200 °C.
    const table: [number, string][] = [
      [-50, '80.31'],
      [0, '100.00'],
      [50, '119.40'],
      [100, '138.51'],
      [150, '157.33'],
      [200, '175.86'],
    ];
    for (const [celsius, ohms] of table) {
      // The table rounds to 0.005 Ω; near 0.38 Ω/K that is 0.0132 K (0.014 K at 200 °C, 0.37 Ω/K).
      expect(bath.quantityFromCode(bathCodeForOhms(ohms))).toBeNear(celsius, { abs: 0.014 });
    }
  });

  const c = channelConstants(bath, { targetError: 0.01 });

  it('meets 0.01 °C in every type, proved over all 6.4 million codes of −50 … 200 °C', () => {
    expect(c.codeMax - c.codeMin + 1).toBeGreaterThan(6_000_000);
    for (const t of TYPES) {
      const total = c.totals[t]!;
      expect(total.bound, t).toBeLessThanOrEqual(0.01);
      expect(total.proved, t).toBe(true);
      expect(total.codesChecked).toBe(c.codeMax - c.codeMin + 1);
    }
    // The header was 14.35 °C off in fixed point with an affine map: now a nonlinear form.
    expect(c.fixed!.kind).toBe('piecewise-polynomial');
    expect(firmwareCost(c.fixed!).libraryCalls).toBe('none');
  });

  it('compiled with gcc: bit for bit the library, within every stated bound', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    checkCompiled(c.firmwareChannel, (code) => bath.quantityFromCode(code), c.codeMin, c.codeMax);
  });

  it('refuses 1e-9 °C in 16-bit coefficients, naming the best bound reached', () => {
    let message = '';
    try {
      channelConstants(bath, {
        targetError: 1e-9,
        coefficientBits: 16,
        types: ['fixed'],
        verification: 'sampled',
      });
    } catch (e) {
      expect((e as { code: string }).code).toBe('out-of-range');
      expect((e as { param: string }).param).toBe('targetError');
      message = (e as Error).message;
    }
    expect(message).toMatch(
      // The output step defaults to the finest whose outputs fit an int32 (1e-6 °C over ±200 °C).
      /`targetError` 1e-9 °C cannot be met by a fixed function: no fixed function can do better than 5\.00\d*e-7 °C \(half the output step of 0\.000001 °C\)/,
    );
  });
});

describe('the demo’s deck RTD channel (packages/cli/demo/footbridge-monitoring.yaml) at 0.01 °C', () => {
  const deck = createChannel(footbridgeSpecs['deck-temp']);
  const c = channelConstants(deck, { targetError: 0.01 });

  it('meets 0.01 °C in fixed point, proved over every code', () => {
    expect(c.totals.fixed!.bound).toBeLessThanOrEqual(0.01);
    expect(c.totals.fixed!.proved).toBe(true);
  });

  it('compiled with gcc: bit for bit the library, within every stated bound', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    checkCompiled(c.firmwareChannel, (code) => deck.quantityFromCode(code), c.codeMin, c.codeMax);
  });
});

describe('a 10 kΩ NTC thermometer at 0.01 °C (compensation’s Steinhart–Hart model)', () => {
  // A 10 kΩ NTC as arm 1 of a bridge of 10 kΩ completion resistors, 24-bit ratiometric, gain 1:
  // ratio r = (R − 10 kΩ)/(2(R + 10 kΩ)), code = r·2^23, so R = 10 kΩ·(1 + 2r)/(1 − 2r).
  // Steinhart–Hart coefficients of a typical 10 kΩ part (the compensation package's example).
  const sh = { a: 1.129241e-3, b: 2.341077e-4, c: 8.775468e-8 };
  const ntc = createSteinhartHartThermistor(sh);
  const exact = (code: number) => {
    const r = code / 2 ** 23;
    return ntc.temperatureAt((10000 * (1 + 2 * r)) / (1 - 2 * r));
  };
  const exactDecimal = (code: number) => {
    const r = new D(code).div(2 ** 23);
    const ln = new D(10000)
      .times(r.times(2).plus(1))
      .div(new D(1).minus(r.times(2)))
      .ln();
    const [a, b, cc] = [sh.a, sh.b, sh.c].map((x) => new D(exactDecimalString(x)));
    return new D(1).div(a!.plus(b!.times(ln)).plus(cc!.times(ln.pow(3)))).minus('273.15');
  };
  const codeOf = (celsius: number) => {
    const R = ntc.ohmsAt(celsius);
    return Math.round(((R - 10000) / (2 * (R + 10000))) * 2 ** 23);
  };
  const codeMin = codeOf(80) + 1; // the map falls with temperature
  const codeMax = codeOf(-20) - 1;
  // The binary64 map's own error, measured against 60 digits below: a few 1e-13 °C.
  const referenceError = {
    bound: 2e-12,
    source: 'binary64 Steinhart-Hart with its bridge, checked at 40 digits (test)',
  };

  it('its binary64 map is within the stated 2e-12 °C of a 40-digit evaluation (sampled)', () => {
    let worst = 0;
    for (let code = codeMin; code <= codeMax; code += 4099) {
      worst = Math.max(
        worst,
        new D(exactDecimalString(exact(code))).minus(exactDecimal(code)).abs().toNumber(),
      );
    }
    expect(worst).toBeLessThanOrEqual(referenceError.bound);
  });

  const design = designFirmwareConstants({
    name: 'ntc 10k',
    exact,
    referenceError,
    codeMin,
    codeMax,
    quantityUnit: '°C',
    targetError: 0.01,
    outputUnit: '0.001',
  });

  it('meets 0.01 °C in fixed point over −20 … 80 °C, proved over every code', () => {
    expect(codeMax - codeMin).toBeGreaterThan(5_000_000);
    const total = design.totals!.fixed!;
    expect(total.bound).toBeLessThanOrEqual(0.01);
    expect(total.proved).toBe(true);
    expect(design.fixed!.kind).toBe('piecewise-polynomial');
  });

  it('compiled with gcc: bit for bit the library, within every stated bound', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    checkCompiled(design, exact, codeMin, codeMax);
  });
});

describe('a 10 kΩ NTC channel (the channel’s thermistor kind) at 0.01 °C', () => {
  // The same Steinhart–Hart part in a three-wire quarter bridge of 10 kΩ, read by the channel.
  const ntcChannel = createChannel({
    name: 'ntc-channel',
    sensor: {
      kind: 'thermistor',
      referenceOhms: 10_000,
      steinhartHart: { a: 1.129241e-3, b: 2.341077e-4, c: 8.775468e-8 },
      rangeCelsius: [-40, 125],
    },
    bridge: { wiring: 'three-wire', ohmsPerLead: 0.2 },
    excitation: { volts: 2.5 },
    adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
    output: { quantity: 'temperature', range: [-20, 80] },
  });
  const c = channelConstants(ntcChannel, { targetError: 0.01 });

  it('meets 0.01 °C in every type, proved over every code of −20 … 80 °C', () => {
    expect(c.codeMax - c.codeMin).toBeGreaterThan(5_000_000);
    for (const t of TYPES) {
      expect(c.totals[t]!.bound, t).toBeLessThanOrEqual(0.01);
      expect(c.totals[t]!.proved, t).toBe(true);
    }
    expect(c.fixed!.kind).toBe('piecewise-polynomial');
  });

  it('compiled with gcc: bit for bit the library, within every stated bound', (ctx) => {
    if (!needCompiler('gcc', () => ctx.skip())) return;
    checkCompiled(c.firmwareChannel, (code) => ntcChannel.quantityFromCode(code), c.codeMin, c.codeMax);
  });
});

describe('a Pt100 over −200 … 850 °C at 0.01 °C on a 32-bit integer core', () => {
  it('fits 2 KiB of fixed-point tables with 32-bit arithmetic only (no library call)', () => {
    // The bath channel with gain 2, so that 850 °C (390.48 Ω) stays inside the converter.
    const wide: Channel = createChannel({
      ...bathSpec,
      name: 'pt100-wide',
      // IEC 60751 states class B only for −196 … 600 °C: the wide span has no class.
      sensor: { kind: 'rtd', r0Ohms: 100 },
      amplifier: { gain: 2 },
      output: { quantity: 'temperature', range: [-199.99, 849.99] }, // strictly inside the standard's −200 … 850 °C
    });
    const c = channelConstants(wide, {
      targetError: 0.01,
      types: ['fixed'],
      accumulatorBits: 32,
      verification: HEAVY ? 'exhaustive' : 'sampled',
    });
    const cost = firmwareCost(c.fixed!);
    expect(cost.tableBytes).toBeLessThanOrEqual(2048);
    expect(cost.libraryCalls).toBe('none');
    expect(c.totals.fixed!.bound).toBeLessThanOrEqual(0.01);
    expect(c.totals.fixed!.proved).toBe(HEAVY);
  });
});

describe('every sensor kind: designed to a tight target, compiled, every code against the exact map', () => {
  // Small converters (16 to 18 bits) so that every code is swept in the default suite.
  const kinds: [string, ChannelSpec, number][] = [
    [
      'large-strain quarter bridge',
      {
        name: 'quarter',
        sensor: { kind: 'strain-gauge', gaugeFactor: 2.1 },
        bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 0.8 },
        excitation: { volts: 5 },
        amplifier: { gain: 16 },
        adc: { bits: 18, referenceVolts: 5, ratiometric: true },
        output: { quantity: 'strain', unit: 'µε', range: [-20000, 20000] },
      },
      0.5,
    ],
    [
      'full-bending-poisson bridge',
      {
        name: 'bending',
        sensor: { kind: 'strain-gauge', gaugeFactor: 2.0 },
        bridge: { arrangement: 'full-bending-poisson', poissonRatio: 0.3, wiring: 'four-wire' },
        excitation: { volts: 5 },
        amplifier: { gain: 32 },
        adc: { bits: 16, referenceVolts: 5, ratiometric: true },
        output: { quantity: 'strain', unit: 'µε', range: [-5000, 5000] },
      },
      0.05,
    ],
    [
      'load cell (transducer)',
      {
        name: 'cell',
        sensor: { kind: 'transducer', capacity: 500, ratedOutputVoltsPerVolt: 0.002 },
        bridge: { wiring: 'four-wire', ohmsPerLead: 0.3 },
        excitation: { volts: 5 },
        amplifier: { gain: 128 },
        adc: { bits: 18, referenceVolts: 5, ratiometric: true },
        output: { quantity: 'mass', range: [0, 500] },
      },
      0.01,
    ],
    [
      'Pt1000 RTD',
      {
        name: 'rtd',
        sensor: { kind: 'rtd', r0Ohms: 1000 },
        bridge: { wiring: 'three-wire', ohmsPerLead: 0.4 },
        excitation: { volts: 1 },
        amplifier: { gain: 4 },
        adc: { bits: 18, referenceVolts: 1, ratiometric: true },
        output: { quantity: 'temperature', range: [-100, 400] },
      },
      0.05,
    ],
  ];
  it.for(kinds)('%s', ([, spec, target], ctx) => {
    const ch = createChannel(spec);
    const c = channelConstants(ch, { targetError: target, hardwareDivide: true });
    for (const t of TYPES) {
      expect(c.totals[t]!.bound, t).toBeLessThanOrEqual(target);
      expect(c.totals[t]!.proved, t).toBe(true);
    }
    if (!needCompiler('gcc', () => ctx.skip())) return;
    const codes = Int32Array.from({ length: c.codeMax - c.codeMin + 1 }, (_, i) => c.codeMin + i);
    const reference = Float64Array.from(codes, (code) => ch.quantityFromCode(code));
    const { dir, remove } = scratch();
    try {
      const { lines } = sweepCompiled(dir, c.firmwareChannel, codes, reference);
      for (const t of TYPES) {
        expect(lines[t]!.hash, t).toBe(hashOf(c.firmwareChannel, t, codes));
        expect(lines[t]!.maxError, t).toBeLessThanOrEqual(c.totals[t]!.bound);
      }
    } finally {
      remove();
    }
  });
});
