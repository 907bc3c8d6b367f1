import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { johnsonNoiseDensity } from '@bridgework/chain';
import { exactDecimalString } from '@bridgework/core';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
const X = (x: number) => new D(exactDecimalString(x));
// k = 1.380649e-23 J/K exactly (SI 2019 definition, CODATA 2018); T = t + 273.15 K exactly.
const K = new D('1.380649e-23');
const reference = (ohms: number, celsius: number): number =>
  new D(4).times(K).times(X(celsius).plus('273.15')).times(X(ohms)).sqrt().toNumber();

describe('johnsonNoiseDensity: check values', () => {
  it('350 Ω at 25 °C → 2.40062 nV/√Hz (issue #4; exact k, CODATA 2018 / SI 2019)', () => {
    // Derived: √(4 · 1.380649e-23 J/K · 298.15 K · 350 Ω) = 2.400618… nV/√Hz.
    expect(johnsonNoiseDensity({ ohms: 350 }) * 1e9).toBeNear(2.40062, { abs: 5e-6 }); // 6 significant digits as stated
    expect(johnsonNoiseDensity({ ohms: 350 })).toBeNear(reference(350, 25), { ulps: 2 });
  });

  it('1 kΩ at 25 °C → 4.05779 nV/√Hz (issue #4)', () => {
    expect(johnsonNoiseDensity({ ohms: 1000, temperatureCelsius: 25 }) * 1e9).toBeNear(4.05779, {
      abs: 5e-6,
    });
    expect(johnsonNoiseDensity({ ohms: 1000 })).toBeNear(reference(1000, 25), { ulps: 2 });
  });

  it('the textbook rule of thumb: 1 kΩ at room temperature is about 4 nV/√Hz (from memory)', () => {
    expect(johnsonNoiseDensity({ ohms: 1000, temperatureCelsius: 17 }) * 1e9).toBeNear(4.0, { abs: 0.01 });
  });

  it('scales as √R and √T, and is 0 for 0 Ω', () => {
    expect(johnsonNoiseDensity({ ohms: 0 })).toBe(0);
    expect(johnsonNoiseDensity({ ohms: 1400 }) / johnsonNoiseDensity({ ohms: 350 })).toBeNear(2, { ulps: 4 });
    // Liquid helium, 4.2 K: T = t + 273.15 loses ~3e-14 K to the double 273.15, i.e. ~1e-14 relative.
    expect(johnsonNoiseDensity({ ohms: 350, temperatureCelsius: -268.95 })).toBeNear(
      reference(350, -268.95),
      {
        rel: 1e-13,
      },
    );
  });
});

describe('johnsonNoiseDensity against 40-digit decimal.js', () => {
  it('agrees within 2 ulps from 1 mΩ to 100 MΩ and −200 °C to 500 °C', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 8, noNaN: true }).map((d) => 10 ** d),
        fc.double({ min: -200, max: 500, noNaN: true }),
        (ohms, celsius) => {
          expect(johnsonNoiseDensity({ ohms, temperatureCelsius: celsius })).toBeNear(
            reference(ohms, celsius),
            {
              ulps: 3, // four roundings (3 products, T sum) halved by the square root, plus its own
            },
          );
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('johnsonNoiseDensity: bad inputs', () => {
  it.each([
    ['NaN ohms', { ohms: Number.NaN }, 'not-finite', 'ohms'],
    ['infinite ohms', { ohms: Infinity }, 'not-finite', 'ohms'],
    ['negative ohms', { ohms: -1 }, 'negative', 'ohms'],
    ['string ohms', { ohms: '350' }, 'wrong-type', 'ohms'],
    ['missing ohms', {}, 'missing-option', 'options.ohms'],
    ['absolute zero', { ohms: 350, temperatureCelsius: -273.15 }, 'out-of-range', 'temperatureCelsius'],
    ['below absolute zero', { ohms: 350, temperatureCelsius: -300 }, 'out-of-range', 'temperatureCelsius'],
    ['NaN temperature', { ohms: 350, temperatureCelsius: Number.NaN }, 'not-finite', 'temperatureCelsius'],
  ] as const)('%s → %s', (_name, options, code, param) => {
    expect(() => johnsonNoiseDensity(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('rejects a missing options object', () => {
    expect(() => johnsonNoiseDensity(undefined as never)).toThrowBridgeworkError('wrong-type', {
      param: 'options',
    });
  });
});
