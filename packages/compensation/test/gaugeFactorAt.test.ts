import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gaugeFactorAt } from '@bridgework/compensation';
import { X } from './support/decimal.js';

describe('gaugeFactorAt', () => {
  it('GF 2.05 at 24 °C with +1.1 %/100 K is 2.07255 at 124 °C and 2.02745 at −76 °C', () => {
    // By hand: 2.05·(1 ± 0.011).
    const base = { gaugeFactor: 2.05, temperatureCoefficientPerKelvin: 1.1e-4, referenceCelsius: 24 };
    expect(gaugeFactorAt({ ...base, temperatureCelsius: 124 })).toBeNear(2.07255, { rel: 1e-15 });
    expect(gaugeFactorAt({ ...base, temperatureCelsius: -76 })).toBeNear(2.02745, { rel: 1e-15 });
    expect(gaugeFactorAt({ ...base, temperatureCelsius: 24 })).toBe(2.05);
  });

  it('equals GF0·(1 + β·(T − T0)) in 40-digit arithmetic to 1e-15', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 200, noNaN: true }),
        fc.double({ min: -5e-4, max: 5e-4, noNaN: true }),
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.double({ min: -269, max: 400, noNaN: true }),
        (gf, beta, t0, t) => {
          const expected = X(gf).times(
            X(beta)
              .times(X(t).minus(X(t0)))
              .plus(1),
          );
          expect(
            gaugeFactorAt({
              gaugeFactor: gf,
              temperatureCoefficientPerKelvin: beta,
              referenceCelsius: t0,
              temperatureCelsius: t,
            }),
          ).toBeNear(expected.toNumber(), { rel: 1e-15 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it.each([
    [
      'a factor that would turn negative',
      {
        gaugeFactor: 2,
        temperatureCoefficientPerKelvin: -0.01,
        referenceCelsius: 20,
        temperatureCelsius: 200,
      },
      'out-of-range',
      'temperatureCelsius',
    ],
    [
      'zero gauge factor',
      { gaugeFactor: 0, temperatureCoefficientPerKelvin: 0, referenceCelsius: 20, temperatureCelsius: 20 },
      'not-positive',
      'gaugeFactor',
    ],
    [
      'NaN coefficient',
      {
        gaugeFactor: 2,
        temperatureCoefficientPerKelvin: Number.NaN,
        referenceCelsius: 20,
        temperatureCelsius: 20,
      },
      'not-finite',
      'temperatureCoefficientPerKelvin',
    ],
    [
      'missing reference',
      { gaugeFactor: 2, temperatureCoefficientPerKelvin: 1e-4, temperatureCelsius: 20 },
      'missing-option',
      'options.referenceCelsius',
    ],
    [
      'infinite temperature',
      {
        gaugeFactor: 2,
        temperatureCoefficientPerKelvin: 1e-4,
        referenceCelsius: 20,
        temperatureCelsius: Infinity,
      },
      'not-finite',
      'temperatureCelsius',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => gaugeFactorAt(options as never)).toThrowBridgeworkError(code, { param });
  });
});
