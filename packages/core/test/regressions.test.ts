/**
 * Regressions of issue 15 in the core package: each defect the attacks found, with the test named
 * after what it checks.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import {
  checkOptions,
  checkRange,
  differenceOfProducts,
  exactDecimalString,
  kelvinFromCelsius,
  microstrainFromStrain,
  strainFromMicrostrain,
  twoProduct,
} from '@bridgework/core';

const D = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN });
const X = (x: number) => new D(exactDecimalString(x));

describe('regressions: core helpers check their inputs (issue 15, item 10)', () => {
  it('microstrainFromStrain refuses NaN instead of returning NaN', () => {
    expect(() => microstrainFromStrain(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'strain' });
  });

  it('microstrainFromStrain refuses a strain whose microstrain would overflow', () => {
    expect(() => microstrainFromStrain(1e308)).toThrowBridgeworkError('out-of-range', { param: 'strain' });
  });

  it('strainFromMicrostrain refuses null instead of reading it as 0', () => {
    expect(() => strainFromMicrostrain(null as never)).toThrowBridgeworkError('wrong-type', {
      param: 'microstrain',
    });
  });

  it('kelvinFromCelsius refuses the string \'20\' instead of concatenating "20273.15"', () => {
    expect(() => kelvinFromCelsius('20' as never)).toThrowBridgeworkError('wrong-type', {
      param: 'temperatureCelsius',
    });
  });

  it('kelvinFromCelsius refuses a temperature below absolute zero', () => {
    expect(() => kelvinFromCelsius(-274)).toThrowBridgeworkError('out-of-range', {
      param: 'temperatureCelsius',
    });
  });
});

describe('regressions: error-free products at the ends of binary64', () => {
  it('differenceOfProducts is exact where Veltkamp splitting would overflow (1e308 factors)', () => {
    // The plain fast path gives NaN here (the split of 1e308 overflows); decimal.js at 60 digits.
    const cases: [number, number, number, number][] = [
      [1e308, 1, 1e308, 1],
      [1e308, 1.5, 1e308, 1],
      [1.7e308, 0.5, 3, 1e307],
      [1e300, 1e7, 1e307, 0.999],
    ];
    for (const [a, b, c, d] of cases) {
      const exact = X(a)
        .times(X(b))
        .minus(X(c).times(X(d)))
        .toNumber();
      expect(differenceOfProducts(a, b, c, d)).toBeNear(exact, { ulps: 1 });
    }
  });

  it('differenceOfProducts refuses a result beyond binary64 and a non-number', () => {
    expect(() => differenceOfProducts(1e308, 10, -1e308, 10)).toThrowBridgeworkError('out-of-range');
    expect(() => differenceOfProducts('2' as never, 3, 1, 1)).toThrowBridgeworkError('wrong-type', {
      param: 'a',
    });
    expect(() => differenceOfProducts(Number.NaN, 3, 1, 1)).toThrowBridgeworkError('not-finite', {
      param: 'a',
    });
  });

  it('twoProduct stays error-free for a factor above 2^996', () => {
    for (const [a, b] of [
      [1e308, 0.5],
      [3, 5e307],
      [1.2345e300, 1.1],
    ] as const) {
      const [p, e] = twoProduct(a, b);
      expect(
        X(p)
          .plus(X(e))
          .equals(X(a).times(X(b))),
      ).toBe(true);
    }
    expect(() => twoProduct(1e308, 10)).toThrowBridgeworkError('out-of-range', { param: 'a' });
  });
});

describe('regressions: the options rule applies to the checks themselves', () => {
  it('checkOptions refuses malformed keys and names the closest of its own', () => {
    expect(() => checkOptions('options', {}, { known: ['a'], requierd: [] } as never)).toThrowBridgeworkError(
      'unknown-option',
      { param: 'keys.requierd' },
    );
    expect(() => checkOptions('options', {}, null as never)).toThrowBridgeworkError('wrong-type', {
      param: 'keys',
    });
  });

  it('checkRange refuses limits with a misspelt key instead of ignoring them', () => {
    expect(() => checkRange('x', 5, { mni: 0, max: 1 } as never)).toThrowBridgeworkError('unknown-option', {
      param: 'limits.mni',
    });
  });
});
