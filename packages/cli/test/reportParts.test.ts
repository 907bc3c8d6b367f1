/**
 * The parts of the design report: number formatting, the shown units, the channel's sampled
 * curves that the HTML plots draw (checked against the textbook quarter-bridge inverse), the rows
 * of the design checks and the inputs table.
 */
import { channelBudget, createChannel } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { loadChannels } from '../src/channels/loadChannels.js';
import { channelInputs } from '../src/report/channelInputs.js';
import {
  checkDetail,
  checksOutcome,
  countChecks,
  statusMark,
  thresholdText,
} from '../src/report/checkRows.js';
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

describe('the shown unit (Channel.display)', () => {
  it('shows the footbridge channels in the unit people read', async () => {
    const loaded = await loadChannels(examplePath);
    const shown = Object.fromEntries(loaded.channels.map((c) => [c.name, c.channel.display]));
    // A force span of −10 … 120 kN is shown in kN; strain in µε (factor 10⁶ from m/m).
    expect(shown['hanger-h3']).toEqual({ unit: 'kN', factor: 1e-3 });
    for (const c of loaded.channels)
      if (c.channel.unit === 'm/m') expect(c.channel.display).toEqual({ unit: 'µε', factor: 1e6 });
  });
});

describe('Channel.curve, as the plots draw it', () => {
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
  const curves = channel.curve(201);

  it('samples the exact map evenly in code from one end of the span to the other', () => {
    expect(curves.codes).toHaveLength(201);
    expect(curves.quantity[0]).toBeNear(-2e-3, { abs: 1e-16 });
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
});

describe('design check rows', () => {
  it('show every check of the budget, a failed headroom at its operating point in the report’s unit', () => {
    const spec = footbridgeSpecs['hanger-h3'];
    const failing = channelBudget(
      createChannel({
        ...spec,
        amplifier: { ...spec.amplifier, limits: { ...spec.amplifier!.limits, outputVolts: [3.5, 4.9] } },
      }),
    );
    const headroom = failing.checks.filter((k) => k.id.startsWith('headroom-'));
    expect(headroom.map((k) => k.id)).toEqual(
      failing.frontEnd.value.headroom.margins.map((m) => `headroom-${m.limit}`),
    );
    const low = failing.checks.find((k) => k.id === 'headroom-output-low')!;
    expect(statusMark(low)).toBe('FAIL');
    // The worst point named by its value in the report's unit (kN), with true minus signs.
    const margin = failing.frontEnd.value.headroom.margins.find((m) => m.limit === 'output-low')!;
    expect(margin.pointIndex).toBe(0);
    expect(checkDetail(low)).toMatch(
      /^2\.424\u00a0V against 3\.5\u00a0V at −10\u00a0kN, margin −1\.076\u00a0V: the amplifier output, low swing is reached; lower amplifier\.gain or narrow output\.range$/,
    );
    expect(checkDetail(low)).not.toMatch(/point \d|-/);
    expect(headroom.filter((k) => k.status === 'fail')).toHaveLength(failing.frontEnd.issues.length);
    const counts = countChecks(failing.checks);
    expect(counts.pass + counts.warn + counts.fail).toBe(failing.checks.length);
    expect(checksOutcome(counts)).toMatch(/^\d+ failed/);
  });

  it('state each threshold in its unit, shares in percent', () => {
    const checks = channelBudget(createChannel(footbridgeSpecs['hanger-h3'])).checks;
    const byId = (id: string) => checks.find((k) => k.id === id)!;
    // A no-break space holds each figure to its unit when the text report wraps.
    expect(thresholdText(byId('span-codes'))).toBe('threshold 100\u00a0codes');
    expect(thresholdText(byId('span-share'))).toBe('threshold 5\u00a0%');
    expect(thresholdText(byId('finite'))).toBe('');
    // A message that states its threshold keeps it once (no second "(threshold …)").
    expect(checkDetail(byId('span-share'))).toMatch(
      /^the span uses [\d.]+\u00a0% of the converter's range \(at least 5\u00a0% advised\)$/,
    );
    // A passing uncertainty and noise state the warning threshold they were judged against.
    expect(byId('uncertainty').status).toBe('pass');
    expect(byId('uncertainty').limit).toBe(0.02);
    expect(checkDetail(byId('uncertainty'))).toMatch(
      /^U = [\d.]+\u00a0kN is [\d.]+\u00a0% of the span \[−10\u00a0kN, 120\u00a0kN\] \(at most 2\u00a0%\)$/,
    );
    expect(byId('noise').limit).toBe(0.005);
    expect(checkDetail(byId('noise'))).toMatch(
      /^the rms noise [\d.e−]+\u00a0kN is [\d.e−]+\u00a0% of the span \(at most 0\.5\u00a0%\)$/,
    );
    expect(checksOutcome({ pass: 3, warn: 0, fail: 0 })).toBe('pass');
    expect(checksOutcome({ pass: 1, warn: 2, fail: 1 })).toBe('1 failed, 2 warnings');
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
