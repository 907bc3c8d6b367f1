import { describe, expect, it } from 'vitest';
import { solveBridge } from '@bridgework/bridge';
import { checkSelfHeating, heatSinkPowerDensity, selfHeatingLimit } from '@bridgework/chain';

describe('heatSinkPowerDensity (common practice, from memory)', () => {
  it('converts the traditional W/in² figures exactly (1 in² = 6.4516e-4 m²)', () => {
    const perSquareInch = {
      excellent: [5, 10],
      good: [2, 5],
      fair: [0.5, 2],
      poor: [0.1, 0.5],
      'very-poor': [0.01, 0.05],
    };
    for (const [name, [lo, hi]] of Object.entries(perSquareInch)) {
      const r = heatSinkPowerDensity[name as keyof typeof heatSinkPowerDensity];
      expect(r.minWattsPerSquareMeter).toBeNear(lo! / 6.4516e-4, { rel: 1e-15 });
      expect(r.maxWattsPerSquareMeter).toBeNear(hi! / 6.4516e-4, { rel: 1e-15 });
      expect(r.description.length).toBeGreaterThan(0);
    }
    expect(heatSinkPowerDensity.good.minWattsPerSquareMeter).toBeNear(3100.0062, { abs: 1e-4 });
  });
});

describe('selfHeatingLimit', () => {
  const area = 3.2e-3 * 3.2e-3; // a 3.2 mm square grid

  it('uses the lower end of a heat-sink class over the grid area', () => {
    const r = selfHeatingLimit({ gridAreaSquareMeters: area, heatSink: 'good' });
    expect(r.maxWattsPerGauge).toBeNear(area * (2 / 6.4516e-4), { rel: 1e-15 }); // 31.7 mW
    expect(r.basis).toBe('power-density');
    // A 350 Ω gauge may then carry √(P·R) = 3.33 V: an equal-arm bridge takes 2√(P·R) ≈ 6.7 V.
    expect(2 * Math.sqrt(r.maxWattsPerGauge * 350)).toBeNear(6.666, { abs: 1e-3 });
  });

  it('takes a density override, a direct limit, and the smaller of a density and a direct limit', () => {
    expect(
      selfHeatingLimit({ gridAreaSquareMeters: 1e-5, powerDensityWattsPerSquareMeter: 2000 })
        .maxWattsPerGauge,
    ).toBe(0.02);
    expect(selfHeatingLimit({ maxWattsPerGauge: 0.015 })).toEqual({
      maxWattsPerGauge: 0.015,
      basis: 'power',
      powerDensityWattsPerSquareMeter: undefined,
    });
    const both = selfHeatingLimit({
      maxWattsPerGauge: 0.015,
      gridAreaSquareMeters: 1e-5,
      powerDensityWattsPerSquareMeter: 2000,
    });
    expect(both).toEqual({ maxWattsPerGauge: 0.015, basis: 'power', powerDensityWattsPerSquareMeter: 2000 });
    const tighter = selfHeatingLimit({
      maxWattsPerGauge: 0.05,
      gridAreaSquareMeters: 1e-5,
      heatSink: 'poor',
    });
    expect(tighter.basis).toBe('power-density');
    expect(tighter.maxWattsPerGauge).toBeNear(1e-5 * (0.1 / 6.4516e-4), { rel: 1e-15 });
  });

  it.each([
    ['nothing given', {}, 'missing-option', 'maxWattsPerGauge'],
    ['heat sink without area', { heatSink: 'good' }, 'missing-option', 'gridAreaSquareMeters'],
    [
      'area without density',
      { gridAreaSquareMeters: 1e-5 },
      'missing-option',
      'powerDensityWattsPerSquareMeter',
    ],
    [
      'density and heat sink',
      { gridAreaSquareMeters: 1e-5, heatSink: 'good', powerDensityWattsPerSquareMeter: 1 },
      'conflicting-options',
      'powerDensityWattsPerSquareMeter',
    ],
    ['unknown heat sink', { gridAreaSquareMeters: 1e-5, heatSink: 'marble' }, 'invalid-option', 'heatSink'],
    ['zero area', { gridAreaSquareMeters: 0, heatSink: 'good' }, 'not-positive', 'gridAreaSquareMeters'],
    ['negative power', { maxWattsPerGauge: -1 }, 'not-positive', 'maxWattsPerGauge'],
    [
      'NaN density',
      { gridAreaSquareMeters: 1e-5, powerDensityWattsPerSquareMeter: Number.NaN },
      'not-finite',
      'powerDensityWattsPerSquareMeter',
    ],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => selfHeatingLimit(options as never)).toThrowBridgeworkError(code, { param });
  });
});

describe('checkSelfHeating', () => {
  it('an equal-arm bridge puts (E/2)²/R in each arm; the excitation limit is 2√(P·R)', () => {
    const r = checkSelfHeating({
      armsOhms: [350, 350, 350, 350],
      excitationVolts: 10,
      gaugeArms: [true, false, false, false],
      limit: { maxWattsPerGauge: 0.05 },
    });
    expect(r.value.gaugeWatts).toBeNear(25 / 350, { ulps: 2 });
    expect(r.value.maxExcitationVolts).toBeNear(2 * Math.sqrt(0.05 * 350), { ulps: 4 });
    expect(r.ok).toBe(false);
    expect(r.issues[0]!.limit).toBe('self-heating');
    expect(r.issues[0]!.marginWatts).toBeNear(0.05 - 25 / 350, { ulps: 8 });
    expect(r.issues[0]!.message).toMatch(/reduce the excitation to 8\.367 V/);
  });

  it('the maximum excitation, solved again, puts exactly the limit in the hottest gauge (with source resistance)', () => {
    const base = {
      armsOhms: [120, 121.5, 119, 120] as const,
      sourceOhms: 12,
      limit: { maxWattsPerGauge: 0.02 },
    };
    const r = checkSelfHeating({ ...base, excitationVolts: 3 });
    expect(r.ok).toBe(true);
    expect(r.value.marginWatts).toBeGreaterThan(0);
    const again = solveBridge({
      armsOhms: base.armsOhms,
      excitationVolts: r.value.maxExcitationVolts,
      sourceOhms: 12,
    });
    expect(Math.max(...again.armWatts)).toBeNear(0.02, { rel: 1e-14 });
  });

  it('counts only the arms marked as gauges', () => {
    const arms = [350, 350, 120, 120] as const; // a gauge pair on one side, low-value completion on the other
    const gauges = checkSelfHeating({
      armsOhms: arms,
      excitationVolts: 5,
      gaugeArms: [true, true, false, false],
      limit: { maxWattsPerGauge: 1 },
    });
    const all = checkSelfHeating({ armsOhms: arms, excitationVolts: 5, limit: { maxWattsPerGauge: 1 } });
    expect(gauges.value.gaugeWatts).toBeNear(2.5 ** 2 / 350, { ulps: 2 });
    expect(all.value.gaugeWatts).toBeNear(2.5 ** 2 / 120, { ulps: 2 });
  });

  it.each([
    ['gauge arms of the wrong length', { gaugeArms: [true] }, 'invalid-shape', 'gaugeArms'],
    ['no gauge arm', { gaugeArms: [false, false, false, false] }, 'invalid-shape', 'gaugeArms'],
    ['a non-boolean gauge arm', { gaugeArms: [1, 0, 0, 0] }, 'wrong-type', 'gaugeArms[0]'],
    ['negative source', { sourceOhms: -2 }, 'negative', 'sourceOhms'],
    ['zero excitation', { excitationVolts: 0 }, 'not-positive', 'excitationVolts'],
    ['bad arm', { armsOhms: [350, 350, 350, -1] }, 'not-positive', 'armsOhms[3]'],
    ['no limit', { limit: undefined }, 'missing-option', 'options.limit'],
    ['a bad limit', { limit: { maxWattsPerGauge: 0 } }, 'not-positive', 'limit.maxWattsPerGauge'],
  ] as const)('%s → %s', (_name, extra, code, param) => {
    const good = { armsOhms: [350, 350, 350, 350], excitationVolts: 5, limit: { maxWattsPerGauge: 0.05 } };
    expect(() => checkSelfHeating({ ...good, ...extra } as never)).toThrowBridgeworkError(code, { param });
  });
});
