import { describe, expect, it } from 'vitest';
import { distributions, propagate, standardUncertaintyOf, type InputQuantity } from '@bridgework/uncertainty';

describe('standardUncertaintyOf', () => {
  it('gives u for each distribution (JCGM 100 4.3.3, 4.3.7, 4.3.9; JCGM 101 6.4.6)', () => {
    expect(standardUncertaintyOf({ value: 1, standardUncertainty: 0.25 })).toBe(0.25);
    expect(standardUncertaintyOf({ value: 1, standardUncertainty: 0.25, distribution: 'normal' })).toBe(0.25);
    expect(standardUncertaintyOf({ value: 10, expandedUncertainty: 0.02, coverageFactor: 2 })).toBe(0.01);
    // a/√3, a/√6, a/√2: the standard deviations of the rectangular, symmetric triangular and
    // arcsine distributions of half-width a (variances a²/3, a²/6, a²/2).
    expect(standardUncertaintyOf({ value: 0, distribution: 'rectangular', halfWidth: 3 })).toBeNear(
      Math.sqrt(3),
      { ulps: 1 },
    );
    expect(standardUncertaintyOf({ value: 0, distribution: 'triangular', halfWidth: 6 })).toBeNear(
      Math.sqrt(6),
      { ulps: 1 },
    );
    expect(standardUncertaintyOf({ value: 0, distribution: 'arcsine', halfWidth: 2 })).toBeNear(Math.SQRT2, {
      ulps: 1,
    });
    // A Type A evaluation: the GUM uses u = s/√n with ν = n − 1 (JCGM 100 4.2.3, G.3.3).
    expect(standardUncertaintyOf({ value: 0, distribution: 't', scale: 0.5, degreesOfFreedom: 4 })).toBe(0.5);
    expect(distributions).toEqual(['normal', 'rectangular', 'triangular', 'arcsine', 't']);
  });

  it('accepts zero uncertainty (an exact input) and infinite degrees of freedom', () => {
    expect(standardUncertaintyOf({ value: 3, standardUncertainty: 0 })).toBe(0);
    expect(standardUncertaintyOf({ value: 3, distribution: 'rectangular', halfWidth: 0 })).toBe(0);
    expect(standardUncertaintyOf({ value: 3, standardUncertainty: 1, degreesOfFreedom: Infinity })).toBe(1);
  });

  it('rejects each bad field with its own code and the field path', () => {
    const bad = (q: unknown) => () => standardUncertaintyOf(q as InputQuantity);
    expect(bad(null)).toThrowBridgeworkError('wrong-type', { param: 'quantity' });
    expect(bad({ value: NaN, standardUncertainty: 1 })).toThrowBridgeworkError('not-finite', {
      param: 'quantity.value',
    });
    expect(bad({ value: '1', standardUncertainty: 1 })).toThrowBridgeworkError('wrong-type', {
      param: 'quantity.value',
    });
    expect(bad({ standardUncertainty: 1 })).toThrowBridgeworkError('missing-option', {
      param: 'quantity.value',
    });
    // A misspelt field names the closest one (issue 15 item 5), instead of reading as absent.
    expect(bad({ value: 1, standardUncertanty: 0.1 })).toThrowBridgeworkError('unknown-option', {
      param: 'quantity.standardUncertanty',
    });
    expect(() => standardUncertaintyOf({ value: 1, standardUncertanty: 0.1 } as never)).toThrow(
      /did you mean `standardUncertainty`/,
    );
    expect(bad({ value: 1, standardUncertainty: -0.1 })).toThrowBridgeworkError('negative', {
      param: 'quantity.standardUncertainty',
    });
    expect(bad({ value: 1, standardUncertainty: Infinity })).toThrowBridgeworkError('not-finite', {
      param: 'quantity.standardUncertainty',
    });
    expect(bad({ value: 1 })).toThrowBridgeworkError('missing-option', {
      param: 'quantity.standardUncertainty',
    });
    expect(bad({ value: 1, distribution: 'gaussian', standardUncertainty: 1 })).toThrowBridgeworkError(
      'invalid-option',
      { param: 'quantity.distribution' },
    );
    expect(bad({ value: 1, distribution: 'rectangular' })).toThrowBridgeworkError('missing-option', {
      param: 'quantity.halfWidth',
    });
    expect(bad({ value: 1, distribution: 'triangular', halfWidth: -1 })).toThrowBridgeworkError('negative', {
      param: 'quantity.halfWidth',
    });
    expect(
      bad({ value: 1, distribution: 'rectangular', halfWidth: 1, standardUncertainty: 1 }),
    ).toThrowBridgeworkError('conflicting-options', {
      param: 'quantity.standardUncertainty',
    });
    expect(
      bad({ value: 1, standardUncertainty: 1, expandedUncertainty: 2, coverageFactor: 2 }),
    ).toThrowBridgeworkError('conflicting-options', {
      param: 'quantity.expandedUncertainty',
    });
    expect(bad({ value: 1, expandedUncertainty: 2 })).toThrowBridgeworkError('missing-option', {
      param: 'quantity.coverageFactor',
    });
    expect(bad({ value: 1, coverageFactor: 2 })).toThrowBridgeworkError('missing-option', {
      param: 'quantity.expandedUncertainty',
    });
    expect(bad({ value: 1, expandedUncertainty: 2, coverageFactor: 0 })).toThrowBridgeworkError(
      'not-positive',
      { param: 'quantity.coverageFactor' },
    );
    expect(bad({ value: 1, expandedUncertainty: -2, coverageFactor: 2 })).toThrowBridgeworkError('negative', {
      param: 'quantity.expandedUncertainty',
    });
    expect(bad({ value: 1, standardUncertainty: 1, degreesOfFreedom: 0 })).toThrowBridgeworkError(
      'not-positive',
      { param: 'quantity.degreesOfFreedom' },
    );
    expect(bad({ value: 1, standardUncertainty: 1, degreesOfFreedom: NaN })).toThrowBridgeworkError(
      'not-finite',
      { param: 'quantity.degreesOfFreedom' },
    );
    expect(bad({ value: 1, distribution: 't', scale: 1 })).toThrowBridgeworkError('missing-option', {
      param: 'quantity.degreesOfFreedom',
    });
    expect(bad({ value: 1, distribution: 't', degreesOfFreedom: 3 })).toThrowBridgeworkError(
      'missing-option',
      { param: 'quantity.scale' },
    );
    expect(bad({ value: 1, distribution: 't', scale: -1, degreesOfFreedom: 3 })).toThrowBridgeworkError(
      'negative',
      { param: 'quantity.scale' },
    );
    // A misspelt field is not silently ignored: unknown-option, naming the closest field.
    expect(bad({ value: 1, standardUncertainty: 1, degreesOfFreedon: 3 })).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'quantity.degreesOfFreedon',
      },
    );
  });

  it('names the input in errors raised through propagate', () => {
    expect(() =>
      propagate({ model: ({ a }) => a!, inputs: { a: { value: 1, standardUncertainty: -1 } } }),
    ).toThrowBridgeworkError('negative', {
      param: 'inputs.a.standardUncertainty',
    });
    expect(() => propagate({ model: () => 1, inputs: {} })).toThrowBridgeworkError('invalid-shape', {
      param: 'inputs',
    });
    expect(() => propagate({ model: () => 1, inputs: 3 as never })).toThrowBridgeworkError('wrong-type', {
      param: 'inputs',
    });
  });
});
