import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createThermalOutput } from '@bridgework/compensation';
import { D, X, type Dec } from './support/decimal.js';

// An invented lot polynomial of the usual shape (µε, °C): near zero at room temperature, falling
// at both ends.
const coefficients = [-30.5, 2.61, -5.7e-2, 2.9e-4, -4.1e-7];
const lot = createThermalOutput({
  coefficientsMicrostrain: coefficients,
  gaugeFactor: 2,
  rangeCelsius: [-30, 200],
});

function referenceMicrostrain(t: number): Dec {
  return coefficients.reduce((sum, a, i) => sum.plus(X(a).times(X(t).pow(i))), new D(0));
}
function referenceSlope(t: number): Dec {
  return coefficients.reduce(
    (sum, a, i) =>
      i === 0
        ? sum
        : sum.plus(
            X(a)
              .times(i)
              .times(X(t).pow(i - 1)),
          ),
    new D(0),
  );
}

describe('createThermalOutput', () => {
  it('evaluates the lot polynomial (µε) and returns m/m: check values by hand', () => {
    // By hand: ε(0) = a0 = −30.5 µε; ε(100) = −30.5 + 261 − 570 + 290 − 41 = −90.5 µε.
    expect(lot.apparentStrainAt(0)).toBeNear(-30.5e-6, { ulps: 1 });
    expect(lot.apparentStrainAt(100)).toBeNear(-90.5e-6, { rel: 1e-13 });
  });

  it('equals the polynomial in 40-digit arithmetic over its range (Horner, within its condition number)', () => {
    fc.assert(
      fc.property(fc.double({ min: -30, max: 200, noNaN: true }), (t) => {
        const ref = referenceMicrostrain(t);
        // Horner's bound: 2·degree·u·Σ|aᵢtⁱ| (u = 2⁻⁵³), as an absolute error in µε.
        const bound = coefficients.reduce((s, a, i) => s + Math.abs(a * t ** i), 0) * 8 * 2 ** -53 * 1.01;
        expect(lot.apparentStrainAt(t) * 1e6).toBeNear(ref.toNumber(), { abs: bound, rel: 1e-15 });
        const slope = referenceSlope(t).toNumber();
        expect(lot.slopeAt(t) * 1e6).toBeNear(slope, { rel: 1e-12, abs: 1e-13 });
      }),
      { numRuns: 200 },
    );
  });

  it('rescales to another instrument setting by GF_ref/GF_setting (constant ΔR/R)', () => {
    for (const t of [-30, 20, 150, 200]) {
      expect(lot.apparentStrainAt(t, 2.1)).toBeNear((lot.apparentStrainAt(t) * 2) / 2.1, { ulps: 2 });
      expect(lot.apparentStrainAt(t, 2)).toBeNear(lot.apparentStrainAt(t), { ulps: 1 });
      expect(lot.slopeAt(t, 2.1)).toBeNear((lot.slopeAt(t) * 2) / 2.1, { ulps: 2 });
    }
  });

  it('slope matches a central difference of the polynomial', () => {
    for (const t of [-20, 0, 75, 180]) {
      const h = 1e-3;
      const fd = (lot.apparentStrainAt(t + h) - lot.apparentStrainAt(t - h)) / (2 * h);
      // Truncation O(h²·ε‴) and rounding u·ε/h are both far below 1e-6 of the slope here.
      expect(lot.slopeAt(t)).toBeNear(fd, { rel: 1e-6 });
    }
  });

  it('accepts degree 0 to 4 and exposes its data', () => {
    const flat = createThermalOutput({
      coefficientsMicrostrain: [5],
      gaugeFactor: 2.1,
      rangeCelsius: [0, 50],
    });
    expect(flat.apparentStrainAt(33)).toBeNear(5e-6, { ulps: 1 });
    expect(flat.slopeAt(33)).toBe(0);
    expect(lot.coefficientsMicrostrain).toEqual(coefficients);
    expect(lot.gaugeFactor).toBe(2);
    expect(lot.rangeCelsius).toEqual([-30, 200]);
  });

  it('rejects temperatures outside the fitted range (no extrapolation)', () => {
    expect(() => lot.apparentStrainAt(200.5)).toThrowBridgeworkError('out-of-range', {
      param: 'temperatureCelsius',
    });
    expect(() => lot.slopeAt(-31)).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
    expect(() => lot.apparentStrainAt(Number.NaN)).toThrowBridgeworkError('not-finite', {
      param: 'temperatureCelsius',
    });
    expect(() => lot.apparentStrainAt(20, 0)).toThrowBridgeworkError('not-positive', {
      param: 'gaugeFactorSetting',
    });
  });

  it.each([
    [
      'no coefficients',
      { coefficientsMicrostrain: [], gaugeFactor: 2, rangeCelsius: [0, 1] },
      'invalid-shape',
      'coefficientsMicrostrain',
    ],
    [
      'degree 5',
      { coefficientsMicrostrain: [1, 2, 3, 4, 5, 6], gaugeFactor: 2, rangeCelsius: [0, 1] },
      'invalid-shape',
      'coefficientsMicrostrain',
    ],
    [
      'not an array',
      { coefficientsMicrostrain: 3, gaugeFactor: 2, rangeCelsius: [0, 1] },
      'invalid-shape',
      'coefficientsMicrostrain',
    ],
    [
      'a NaN coefficient',
      { coefficientsMicrostrain: [1, Number.NaN], gaugeFactor: 2, rangeCelsius: [0, 1] },
      'not-finite',
      'coefficientsMicrostrain[1]',
    ],
    [
      'zero gauge factor',
      { coefficientsMicrostrain: [1], gaugeFactor: 0, rangeCelsius: [0, 1] },
      'not-positive',
      'gaugeFactor',
    ],
    ['no range', { coefficientsMicrostrain: [1], gaugeFactor: 2 }, 'missing-option', 'options.rangeCelsius'],
    [
      'reversed range',
      { coefficientsMicrostrain: [1], gaugeFactor: 2, rangeCelsius: [50, 0] },
      'out-of-range',
      'rangeCelsius',
    ],
    [
      'infinite range end',
      { coefficientsMicrostrain: [1], gaugeFactor: 2, rangeCelsius: [0, Infinity] },
      'not-finite',
      'rangeCelsius[1]',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => createThermalOutput(options as never)).toThrowBridgeworkError(code, { param });
  });
});
