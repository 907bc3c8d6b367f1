import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createCertificateScale, type CertificateScaleOptions } from '@bridgework/calibration';

/** 1000 kg of reference weights (conventional mass), read as a force. */
const massToForce = {
  capacity: 1000,
  capacityUnit: 'kilogram',
  ratedOutputVoltsPerVolt: 2e-3,
  outputUnit: 'newton',
} as const;

describe('createCertificateScale', () => {
  it('a force certificate: load = capacity·(r − zero)/RO', () => {
    // 10 kN, RO 2.0012 mV/V, zero 0.0124 mV/V; half the rated output above zero is 5 kN (by hand).
    const scale = createCertificateScale({
      capacity: 10_000,
      capacityUnit: 'newton',
      ratedOutputVoltsPerVolt: 2.0012e-3,
      zeroVoltsPerVolt: 1.24e-5,
    });
    expect(scale.outputUnit).toBe('newton');
    expect(scale.capacityNewtons).toBe(10_000);
    expect(scale.loadFromRatio(1.24e-5 + 1.0006e-3)).toBeNear(5000, { rel: 1e-13 });
    expect(scale.loadFromRatio(1.24e-5)).toBe(0);
    expect(scale.loadPerRatio).toBeNear(10_000 / 2.0012e-3, { ulps: 1 });
  });

  it('kilogram-force is exactly 9.806 65 N (3rd CGPM, 1901)', () => {
    const scale = createCertificateScale({
      capacity: 500,
      capacityUnit: 'kilogram-force',
      ratedOutputVoltsPerVolt: 2e-3,
    });
    expect(scale.capacityNewtons).toBeNear(500 * 9.80665, { ulps: 1 });
    expect(scale.loadFromRatio(2e-3)).toBeNear(4903.325, { rel: 1e-15 });
  });

  it('a mass certificate with conventional buoyancy: F = mc·g·(1 − 1.2/8000) (OIML D 28; from memory)', () => {
    // Reference weights of conventional mass 1000 kg at g = 9.8119 m/s² push with
    // 1000·9.8119·(1 − 0.00015) = 9810.428215 N (by hand).
    const scale = createCertificateScale({
      ...massToForce,
      calibrationGravityMetersPerSecondSquared: 9.8119,
    });
    expect(scale.capacityNewtons).toBeNear(9810.428215, { rel: 1e-14 });
    expect(scale.loadFromRatio(2e-3)).toBeNear(9810.428215, { rel: 1e-14 });
  });

  it('weights of another density in other air: F = mc·g·(1 − ρ0/ρc)(1 − ρa/ρw)/(1 − ρ0/ρw)', () => {
    // Cast-iron weights (7100 kg/m³) in thin air (1.0 kg/m³) push slightly harder than the
    // conventional case: by hand, factor (1 − 1/7100)/(1 − 1.2/7100) = 1 + 0.2/7098.8.
    const scale = createCertificateScale({
      ...massToForce,
      calibrationGravityMetersPerSecondSquared: 9.81,
      buoyancy: { airDensityKilogramsPerCubicMeter: 1.0, weightDensityKilogramsPerCubicMeter: 7100 },
    });
    const expected = 1000 * 9.81 * (1 - 1.2 / 8000) * (1 + 0.2 / 7098.8);
    expect(scale.capacityNewtons).toBeNear(expected, { rel: 1e-14 });
  });

  it('without buoyancy, force is mass × gravity', () => {
    const scale = createCertificateScale({
      ...massToForce,
      calibrationGravityMetersPerSecondSquared: 9.81,
      buoyancy: false,
    });
    expect(scale.capacityNewtons).toBeNear(9810, { ulps: 1 });
  });

  it('mass at another site scales by g_cal/g_local; buoyancy cancels between like conventions', () => {
    // Calibrated at 9.8119 m/s², used at 9.8062 m/s²: the rated output now means
    // 1000·9.8119/9.8062 = 1000.58126…kg (by hand); at equal gravity it means exactly the capacity.
    const options: CertificateScaleOptions = {
      capacity: 1000,
      capacityUnit: 'kilogram',
      ratedOutputVoltsPerVolt: 2.0012e-3,
      calibrationGravityMetersPerSecondSquared: 9.8119,
      localGravityMetersPerSecondSquared: 9.8062,
    };
    const scale = createCertificateScale(options);
    expect(scale.outputUnit).toBe('kilogram');
    expect(scale.loadFromRatio(2.0012e-3)).toBeNear((1000 * 9.8119) / 9.8062, { rel: 1e-14 });
    const same = createCertificateScale({ ...options, localGravityMetersPerSecondSquared: 9.8119 });
    expect(same.loadFromRatio(2.0012e-3)).toBeNear(1000, { rel: 1e-14 });
  });

  it('force certificate to conventional mass on site: m = F/(g·(1 − 1.2/8000))', () => {
    const scale = createCertificateScale({
      capacity: 9810,
      capacityUnit: 'newton',
      ratedOutputVoltsPerVolt: 2e-3,
      outputUnit: 'kilogram',
      localGravityMetersPerSecondSquared: 9.81,
    });
    expect(scale.loadFromRatio(2e-3)).toBeNear(1000 / (1 - 1.2 / 8000), { rel: 1e-14 });
  });

  it('ratioFromLoad inverts loadFromRatio (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1e6, noNaN: true }),
        fc.double({ min: 5e-4, max: 4e-3, noNaN: true }),
        fc.boolean(),
        fc.double({ min: -1e-4, max: 1e-4, noNaN: true }),
        fc.double({ min: -0.2, max: 1.5, noNaN: true }),
        (capacity, ro, negative, zero, fraction) => {
          const scale = createCertificateScale({
            capacity,
            capacityUnit: 'kilogram',
            ratedOutputVoltsPerVolt: negative ? -ro : ro,
            zeroVoltsPerVolt: zero,
            calibrationGravityMetersPerSecondSquared: 9.81,
            localGravityMetersPerSecondSquared: 9.79,
          });
          const load = fraction * capacity;
          // Absolute 8ε·capacity·(1 + |zero|/ro): the zero is subtracted from a ratio up to ~1.6·ro.
          expect(scale.loadFromRatio(scale.ratioFromLoad(load))).toBeNear(load, {
            abs: 8 * Number.EPSILON * capacity * (1 + Math.abs(zero) / ro),
          });
        },
      ),
      { numRuns: 1000 },
    );
  });

  const base = { capacity: 1000, capacityUnit: 'newton', ratedOutputVoltsPerVolt: 2e-3 } as const;
  it.each([
    ['capacity', { ...base, capacity: -1 }, 'not-positive'],
    ['capacity', { ...base, capacity: Number.NaN }, 'not-finite'],
    ['capacityUnit', { ...base, capacityUnit: 'pound' }, 'invalid-option'],
    ['ratedOutputVoltsPerVolt', { ...base, ratedOutputVoltsPerVolt: 0 }, 'out-of-range'],
    ['ratedOutputVoltsPerVolt', { ...base, ratedOutputVoltsPerVolt: Infinity }, 'not-finite'],
    ['zeroVoltsPerVolt', { ...base, zeroVoltsPerVolt: '0' }, 'wrong-type'],
    ['outputUnit', { ...base, outputUnit: 'tonne' }, 'invalid-option'],
    ['calibrationGravityMetersPerSecondSquared', { ...base, capacityUnit: 'kilogram' }, 'missing-option'],
    [
      'calibrationGravityMetersPerSecondSquared',
      { ...base, capacityUnit: 'kilogram', calibrationGravityMetersPerSecondSquared: 0 },
      'not-positive',
    ],
    ['localGravityMetersPerSecondSquared', { ...base, outputUnit: 'kilogram' }, 'missing-option'],
    [
      'buoyancy.airDensityKilogramsPerCubicMeter',
      { ...base, buoyancy: { airDensityKilogramsPerCubicMeter: -1.2 } },
      'not-positive',
    ],
    [
      'buoyancy.airDensityKilogramsPerCubicMeter',
      { ...base, buoyancy: { airDensityKilogramsPerCubicMeter: 9000 } },
      'out-of-range',
    ],
    ['buoyancy', { ...base, buoyancy: true }, 'wrong-type'],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => createCertificateScale(options as never)).toThrowBridgeworkError(code, { param });
  });

  // Issue 15 (fuzz): options whose scale overflows the double range read as Infinity before.
  it.each([
    ['capacity', { ...base, capacity: 1e308, capacityUnit: 'kilogram-force' }],
    ['ratedOutputVoltsPerVolt', { ...base, ratedOutputVoltsPerVolt: 1e-308 }],
    [
      'capacity',
      { ...base, capacity: 1e308, capacityUnit: 'kilogram', calibrationGravityMetersPerSecondSquared: 9.81 },
    ],
    [
      'calibrationGravityMetersPerSecondSquared',
      { ...base, capacityUnit: 'kilogram', calibrationGravityMetersPerSecondSquared: 1e308 },
    ],
    [
      'localGravityMetersPerSecondSquared',
      { ...base, outputUnit: 'kilogram', localGravityMetersPerSecondSquared: 1e-308 },
    ],
  ] as const)('refuses a scale beyond the double range, naming %s', (param, options) => {
    expect(() => createCertificateScale(options as never)).toThrowBridgeworkError('out-of-range', { param });
  });

  it('refuses a load or ratio beyond the double range, naming the argument', () => {
    const scale = createCertificateScale(base);
    expect(() => scale.loadFromRatio(1e306)).toThrowBridgeworkError('out-of-range', { param: 'ratio' });
    expect(() => scale.loadFromRatio(-1.7e308)).toThrowBridgeworkError('out-of-range', { param: 'ratio' });
    const steep = createCertificateScale({ ...base, capacity: 1e-300 });
    expect(() => steep.ratioFromLoad(1e300)).toThrowBridgeworkError('out-of-range', { param: 'load' });
  });

  it('rejects a non-finite ratio or load in the maps', () => {
    const scale = createCertificateScale(base);
    expect(() => scale.loadFromRatio(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'ratio' });
    expect(() => scale.ratioFromLoad(Infinity)).toThrowBridgeworkError('not-finite', { param: 'load' });
  });
});
