import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ANNEALED_COPPER, awgDiameterMeters, wireOhms } from '@bridgework/compensation';
import { D, PI, X } from './support/decimal.js';

/** The ASTM B258 rule and IEC 60028 copper restated in 40-digit decimal arithmetic. */
function referenceDiameter(awg: number) {
  return new D('0.000127').times(new D(92).pow(new D(36 - awg).div(39)));
}
function referenceOhms(awg: number, lengthMeters: number, temperatureCelsius = 20, conductors = 1) {
  const d = referenceDiameter(awg);
  const area = PI.times(d).times(d).div(4);
  const factor = new D('0.00393').times(X(temperatureCelsius).minus(20)).plus(1);
  return X(lengthMeters).times(factor).div(new D(58e6).times(area).times(conductors));
}

describe('awgDiameterMeters', () => {
  it('follows the ASTM B258 rule at its defining sizes: AWG 36 = 0.005 in, AWG 0000 = 0.46 in', () => {
    // ASTM B258: 0.127 mm at AWG 36 and 92 times that (11.684 mm) at AWG 0000 (= −3), exactly.
    expect(awgDiameterMeters(36)).toBe(0.127e-3);
    expect(awgDiameterMeters(-3)).toBeNear(11.684e-3, { ulps: 2 });
  });

  it('matches the ASTM B258 table diameters, which are rounded to 0.0001 in', () => {
    // ASTM B258 table (from memory): AWG 10 0.1019 in, 24 0.0201 in, 26 0.0159 in, 30 0.0100 in.
    // The table rounds to 0.0001 in, so the rule must lie within half of that.
    const inches = (awg: number) => awgDiameterMeters(awg) / 0.0254;
    expect(inches(10)).toBeNear(0.1019, { abs: 0.5e-4 });
    expect(inches(24)).toBeNear(0.0201, { abs: 0.5e-4 });
    expect(inches(26)).toBeNear(0.0159, { abs: 0.5e-4 });
    expect(inches(30)).toBeNear(0.01, { abs: 0.5e-4 });
  });

  it('equals the rule evaluated in 40-digit decimal arithmetic for every size (within 4 ulps)', () => {
    for (let n = -3; n <= 56; n++) {
      expect(awgDiameterMeters(n)).toBeNear(referenceDiameter(n).toNumber(), { ulps: 4 });
    }
  });

  it('shrinks by the factor 92^(1/39) per size step and halves every 6 sizes (≈, common practice)', () => {
    const step = Math.pow(92, 1 / 39);
    for (let n = -3; n < 56; n++) {
      expect(awgDiameterMeters(n) / awgDiameterMeters(n + 1)).toBeNear(step, { rel: 1e-14 });
    }
    // 92^(6/39) = 2.0050: "six gauges halve the diameter" (common practice).
    expect(awgDiameterMeters(20) / awgDiameterMeters(26)).toBeNear(2, { rel: 3e-3 });
  });

  it.each([
    ['NaN', Number.NaN, 'not-finite'],
    ['Infinity', Infinity, 'not-finite'],
    ['a string', '26', 'wrong-type'],
    ['a half size', 26.5, 'not-integer'],
    ['AWG 57', 57, 'out-of-range'],
    ['AWG −4', -4, 'out-of-range'],
  ] as const)('rejects %s', (_name, awg, code) => {
    expect(() => awgDiameterMeters(awg as never)).toThrowBridgeworkError(code, { param: 'awg' });
  });
});

describe('wireOhms', () => {
  it('gives 133.9 Ω/km for AWG 26 and 84.2 Ω/km for AWG 24 copper at 20 °C', () => {
    // Issue #3 check values: NBS Handbook 100 (Copper Wire Tables) / ASTM B258 sizes, from memory:
    // AWG 26 133.9 Ω/km, AWG 24 84.2 Ω/km, AWG 10 3.277 Ω/km (tables round to four figures).
    expect(wireOhms({ awg: 26, lengthMeters: 1000 })).toBeNear(133.9, { abs: 0.05 });
    expect(wireOhms({ awg: 24, lengthMeters: 1000 })).toBeNear(84.2, { abs: 0.05 });
    expect(wireOhms({ awg: 10, lengthMeters: 1000 })).toBeNear(3.277, { abs: 5e-4 });
  });

  it('equals ρ20·L/A·(1 + α20·(t − 20))/n evaluated in 40-digit decimal arithmetic', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -3, max: 56 }),
        fc.double({ min: 0.01, max: 5000, noNaN: true }),
        fc.double({ min: -100, max: 300, noNaN: true }),
        fc.integer({ min: 1, max: 8 }),
        (awg, lengthMeters, temperatureCelsius, conductors) => {
          const r = wireOhms({ awg, lengthMeters, temperatureCelsius, conductors });
          // 1e-14: about ten roundings (π, 92^x, the area, ρ20 = 1/58e6 and the products).
          expect(r).toBeNear(referenceOhms(awg, lengthMeters, temperatureCelsius, conductors).toNumber(), {
            rel: 1e-14,
          });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('uses IEC 60028 annealed copper: 1/58 Ω·mm²/m and 0.00393 /K at 20 °C', () => {
    expect(ANNEALED_COPPER.resistivityOhmMeters).toBeNear(1.7241379310344828e-8, { ulps: 0 });
    expect(ANNEALED_COPPER.temperatureCoefficientPerKelvin).toBe(0.00393);
    // A 1 mm² conductor (d = 2/√π mm) of 58 m is 1 Ω by definition of the standard.
    const d = 2e-3 / Math.sqrt(Math.PI);
    expect(wireOhms({ diameterMeters: d, lengthMeters: 58 })).toBeNear(1, { rel: 1e-15 });
    // +25 K raises copper by 9.825 %.
    expect(wireOhms({ diameterMeters: d, lengthMeters: 58, temperatureCelsius: 45 })).toBeNear(1.09825, {
      rel: 1e-15,
    });
  });

  it('takes a diameter instead of a size, and parallel conductors divide the resistance', () => {
    const one = wireOhms({ awg: 22, lengthMeters: 25 });
    expect(wireOhms({ diameterMeters: awgDiameterMeters(22), lengthMeters: 25 })).toBe(one);
    expect(wireOhms({ awg: 22, lengthMeters: 25, conductors: 2 })).toBeNear(one / 2, { ulps: 1 });
    expect(wireOhms({ awg: 22, lengthMeters: 0 })).toBe(0);
    expect(wireOhms({ awg: 22, lengthMeters: 25, material: 'copper' })).toBe(one);
  });

  it('accepts a custom resistivity and temperature coefficient (constantan-like: 4.9e-7 Ω·m, 2e-5 /K)', () => {
    const d = 0.2e-3;
    const r = wireOhms({
      diameterMeters: d,
      lengthMeters: 2,
      temperatureCelsius: 70,
      resistivityOhmMeters: 4.9e-7,
      temperatureCoefficientPerKelvin: 2e-5,
    });
    expect(r).toBeNear(((4.9e-7 * 2) / ((Math.PI * d * d) / 4)) * (1 + 2e-5 * 50), { rel: 1e-15 });
  });

  it.each([
    ['no size', { lengthMeters: 1 }, 'missing-option', 'awg'],
    [
      'both sizes',
      { awg: 26, diameterMeters: 1e-3, lengthMeters: 1 },
      'conflicting-options',
      'diameterMeters',
    ],
    ['a bad AWG', { awg: 26.5, lengthMeters: 1 }, 'not-integer', 'awg'],
    ['zero diameter', { diameterMeters: 0, lengthMeters: 1 }, 'not-positive', 'diameterMeters'],
    ['NaN diameter', { diameterMeters: Number.NaN, lengthMeters: 1 }, 'not-finite', 'diameterMeters'],
    ['negative length', { awg: 26, lengthMeters: -1 }, 'negative', 'lengthMeters'],
    ['missing length', { awg: 26 }, 'missing-option', 'options.lengthMeters'],
    ['infinite length', { awg: 26, lengthMeters: Infinity }, 'not-finite', 'lengthMeters'],
    [
      'temperature 301 °C',
      { awg: 26, lengthMeters: 1, temperatureCelsius: 301 },
      'out-of-range',
      'temperatureCelsius',
    ],
    [
      'temperature −101 °C',
      { awg: 26, lengthMeters: 1, temperatureCelsius: -101 },
      'out-of-range',
      'temperatureCelsius',
    ],
    [
      'temperature NaN',
      { awg: 26, lengthMeters: 1, temperatureCelsius: Number.NaN },
      'not-finite',
      'temperatureCelsius',
    ],
    ['unknown material', { awg: 26, lengthMeters: 1, material: 'silver' }, 'invalid-option', 'material'],
    ['zero conductors', { awg: 26, lengthMeters: 1, conductors: 0 }, 'out-of-range', 'conductors'],
    ['1.5 conductors', { awg: 26, lengthMeters: 1, conductors: 1.5 }, 'not-integer', 'conductors'],
    [
      'material and resistivity',
      {
        awg: 26,
        lengthMeters: 1,
        material: 'copper',
        resistivityOhmMeters: 1e-8,
        temperatureCoefficientPerKelvin: 0,
      },
      'conflicting-options',
      'material',
    ],
    [
      'resistivity without coefficient',
      { awg: 26, lengthMeters: 1, resistivityOhmMeters: 1e-8 },
      'missing-option',
      'temperatureCoefficientPerKelvin',
    ],
    [
      'coefficient without resistivity',
      { awg: 26, lengthMeters: 1, temperatureCoefficientPerKelvin: 0.004 },
      'missing-option',
      'resistivityOhmMeters',
    ],
    [
      'negative resistivity',
      { awg: 26, lengthMeters: 1, resistivityOhmMeters: -1e-8, temperatureCoefficientPerKelvin: 0 },
      'not-positive',
      'resistivityOhmMeters',
    ],
    [
      'a coefficient that makes R ≤ 0',
      {
        awg: 26,
        lengthMeters: 1,
        temperatureCelsius: -80,
        resistivityOhmMeters: 1e-8,
        temperatureCoefficientPerKelvin: 0.02,
      },
      'out-of-range',
      'temperatureCelsius',
    ],
    [
      'NaN coefficient',
      { awg: 26, lengthMeters: 1, resistivityOhmMeters: 1e-8, temperatureCoefficientPerKelvin: Number.NaN },
      'not-finite',
      'temperatureCoefficientPerKelvin',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => wireOhms(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects a non-object', () => {
    expect(() => wireOhms(null as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });
});
