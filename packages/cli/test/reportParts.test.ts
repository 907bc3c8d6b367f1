/**
 * The parts of the design report: number formatting, the shown units, the sampled curves of the
 * HTML plots (checked against the textbook quarter-bridge inverse), the headroom checks and the
 * inputs table.
 */
import { channelBudget, createChannel } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { loadChannels } from '../src/channels/loadChannels.js';
import { channelCurves } from '../src/report/channelCurves.js';
import { channelInputs } from '../src/report/channelInputs.js';
import { designChecks } from '../src/report/designChecks.js';
import { displayUnit } from '../src/report/displayUnit.js';
import { formatNumber, formatPercent, formatProbability, formatStated } from '../src/report/formatNumber.js';
import { footbridgeSpecs, examplePath } from './support/footbridge.js';

describe('formatNumber and friends', () => {
  it('shows three significant digits, integers whole, tiny and huge values with an exponent, a true minus', () => {
    expect(formatNumber(346.41)).toBe('346');
    expect(formatNumber(0.07896232)).toBe('0.0790');
    expect(formatNumber(1520872.4)).toBe('1520872');
    expect(formatNumber(-0.026864)).toBe('−0.0269');
    expect(formatNumber(4.3656e-11)).toBe('4.37e−11');
    expect(formatNumber(-4.3656e-14)).toBe('−4.37e−14');
    expect(formatNumber(999.6)).toBe('1000');
    expect(formatNumber(0)).toBe('0');
    expect(formatNumber(2.5e15)).toBe('2.50e15');
    expect([formatNumber(NaN), formatNumber(Infinity), formatNumber(-Infinity)]).toEqual(['NaN', '∞', '−∞']);
  });

  it('shows percentages, probabilities and stated values', () => {
    expect(formatPercent(0.998)).toBe('99.8 %');
    expect(formatPercent(0.0016)).toBe('0.16 %');
    expect(formatPercent(4.6e-7)).toBe('4.6e−5 %');
    expect(formatPercent(0)).toBe('0 %');
    expect(formatProbability(0.95)).toBe('95 %');
    expect(formatProbability(0.9545)).toBe('95.45 %');
    expect(formatStated(-10)).toBe('−10');
    expect(formatStated(120)).toBe('120');
    expect(formatStated(0.0015)).toBe('0.0015');
  });
});

describe('displayUnit', () => {
  const span = (min: number, max: number) => ({ min, max });
  it.each([
    ['m/m', span(-1e-3, 2e-3), 'µε', 1e6],
    ['µε', span(-300, 1200), 'µε', 1],
    ['V/V', span(0, 2e-3), 'mV/V', 1e3],
    ['Pa', span(0, 250e6), 'MPa', 1e-6],
    ['N', span(-10e3, 120e3), 'kN', 1e-3],
    ['N', span(0, 5000), 'N', 1],
    ['N', span(0, 20e6), 'MN', 1e-6],
    ['kg', span(0, 2000), 'kg', 1],
    ['kg', span(0, 50e3), 't', 1e-3],
    ['°C', span(-30, 60), '°C', 1],
  ] as const)('%s over %o is shown in %s', (unit, s, shown, factor) => {
    expect(displayUnit({ unit, span: s })).toEqual({ unit: shown, factor });
  });
});

describe('channelCurves', () => {
  // A quarter bridge without lead resistance, ratiometric: ratio r = code/(G·2^(N−1)) and the
  // textbook inverse ε = 4r/(GF(1 − 2r)) (arm 1 active, docs/bridge.md).
  const gf = 2;
  const gain = 128;
  const channel = createChannel({
    sensor: { kind: 'strain-gauge', gaugeFactor: gf },
    bridge: { arrangement: 'quarter', wiring: 'three-wire' },
    excitation: { volts: 5 },
    amplifier: { gain },
    adc: { bits: 24, referenceVolts: 5, ratiometric: true },
    output: { quantity: 'strain', range: [-2e-3, 2e-3] },
  });
  const ratio = (code: number) => code / (gain * 2 ** 23);
  const strain = (r: number) => (4 * r) / (gf * (1 - 2 * r));
  const curves = channelCurves(channel, 201);

  it('samples the exact map evenly in code from one end of the span to the other', () => {
    expect(curves.codes).toHaveLength(201);
    expect(curves.quantity[0]).toBeNear(-2e-3, { abs: 1e-16 }); // Newton to 1e-9 of a code
    expect(curves.quantity[200]).toBeNear(2e-3, { abs: 1e-16 });
    for (let i = 0; i < 201; i += 20) {
      const c = curves.codes[i]!;
      expect(curves.inputRatio[i]).toBeNear(ratio(c), { rel: 1e-15 });
      expect(curves.quantity[i]).toBeNear(strain(ratio(c)), { rel: 1e-12, abs: 1e-18 });
    }
  });

  it('gives the deviation from the terminal line, whose extreme is the budget’s nonlinearity line', () => {
    const [c1, c2] = curves.spanCodes;
    const e1 = strain(ratio(c1));
    const e2 = strain(ratio(c2));
    let worst = 0;
    for (let i = 0; i < 201; i++) {
      const c = curves.codes[i]!;
      const line = e1 + ((e2 - e1) * (c - c1)) / (c2 - c1);
      expect(curves.nonlinearity[i]).toBeNear(strain(ratio(c)) - line, { abs: 1e-15 });
      if (Math.abs(curves.nonlinearity[i]!) > Math.abs(worst)) worst = curves.nonlinearity[i]!;
    }
    expect(curves.nonlinearity[0]).toBeNear(0, { abs: 1e-18 });
    const line = channelBudget(channel).lines.find((l) => l.name === 'nonlinearity of a linear map')!;
    // Both are sampled (201 and 257 points) near a smooth extreme: they agree to 1e-3.
    expect(worst).toBeNear(line.value, { rel: 1e-3 });
  });

  it('rejects a point count outside [11, 10001]', () => {
    expect(() => channelCurves(channel, 10)).toThrowBridgeworkError('out-of-range', { param: 'points' });
    expect(() => channelCurves(channel, 20.5)).toThrowBridgeworkError('not-integer', { param: 'points' });
  });
});

describe('designChecks', () => {
  it('lists every headroom margin, and a failed one with the chain package’s message', () => {
    const spec = footbridgeSpecs['hanger-h3'];
    const failing = channelBudget(
      createChannel({
        ...spec,
        amplifier: { ...spec.amplifier, limits: { ...spec.amplifier!.limits, outputVolts: [3.5, 4.9] } },
      }),
    );
    const rows = designChecks(failing);
    expect(rows.map((r) => r.limit)).toEqual(failing.frontEnd.value.headroom.margins.map((m) => m.limit));
    const low = rows.find((r) => r.limit === 'output-low')!;
    expect(low.ok).toBe(false);
    expect(low.marginVolts).toBeLessThan(0);
    expect(low.detail).toContain(failing.frontEnd.issues.find((i) => i.limit === 'output-low')!.message);
    expect(rows.filter((r) => !r.ok)).toHaveLength(failing.frontEnd.issues.length);
  });
});

describe('channelInputs', () => {
  it('shows each input in SI with its unit, marked as written in the file or a default', async () => {
    const loaded = await loadChannels(examplePath, ['hanger-h3']);
    const c = loaded.channels[0]!;
    const groups = channelInputs(c.spec, c.raw, c.channel.unit);
    const row = (group: string, name: string) =>
      groups.find((g) => g.title === group)!.rows.find((r) => r.name === name)!;
    expect(row('sensor', 'gaugeOhms')).toEqual({
      name: 'gaugeOhms',
      value: '350',
      unit: 'Ω',
      note: '"350 Ω" in the file',
    });
    expect(row('sensor', 'gaugeFactor')).toEqual({
      name: 'gaugeFactor',
      value: '2.09',
      unit: '',
      note: 'in the file',
    });
    expect(row('sensor', 'transverseSensitivity').note).toBe('default');
    expect(row('bridge', 'cable.lengthMeters')).toMatchObject({
      value: '35',
      unit: 'm',
      note: '"35 m" in the file',
    });
    expect(row('environment', 'rangeCelsius')).toMatchObject({
      value: '[−5, 35]',
      unit: '°C',
      note: '"[-5 °C, 35 °C]" in the file',
    });
    expect(row('amplifier', 'inputVoltageNoiseVoltsPerRootHz')).toMatchObject({
      value: '8e−9',
      unit: 'V/√Hz',
    });
    expect(row('output', 'range')).toMatchObject({
      value: '[−10000, 120000]',
      unit: 'N',
      note: '"[-10 kN, 120 kN]" in the file',
    });
    expect(row('output', 'areaSquareMeters')).toMatchObject({ value: '0.000561', unit: 'm²' });
    expect(row('sensor', 'gaugeFactorToleranceFraction')).toMatchObject({
      value: '0.005',
      note: '"0.5 %" in the file',
    });
    expect(groups.find((g) => g.title === 'other')!.rows).toEqual([
      { name: 'polarity', value: 'normal', unit: '', note: 'default' },
    ]);
  });
});
