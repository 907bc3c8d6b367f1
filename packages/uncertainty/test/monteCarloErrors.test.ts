import { describe, expect, it } from 'vitest';
import { BridgeworkError } from '@bridgework/core';
import { monteCarlo, type InputQuantities } from '@bridgework/uncertainty';

const inputs: InputQuantities = {
  a: { value: 1, standardUncertainty: 0.1 },
  b: { value: 2, distribution: 'rectangular', halfWidth: 0.5 },
};
const model = ({ a, b }: Readonly<Record<string, number>>): number => a! * b!;

describe('monteCarlo: bad input', () => {
  it('reports a model that returns NaN for some trial, with the trial and its inputs', () => {
    const run = () =>
      monteCarlo({ model: ({ a }) => (a! > 1.25 ? NaN : a!), inputs, trials: 100000, compareWithGum: false });
    expect(run).toThrowBridgeworkError('model-not-finite', { param: 'model' });
    try {
      run();
    } catch (e) {
      expect((e as BridgeworkError).message).toMatch(/at trial \d+ \(a = 1\.[2-9]\d*, b = \d/);
    }
    expect(() =>
      monteCarlo({ model: () => Infinity, inputs, trials: 1000, compareWithGum: false }),
    ).toThrowBridgeworkError('model-not-finite', {
      param: 'model',
    });
    expect(() =>
      monteCarlo({ model: () => '1' as never, inputs, trials: 1000, compareWithGum: false }),
    ).toThrowBridgeworkError('wrong-type', {
      param: 'model',
    });
    expect(() => monteCarlo({ model: () => NaN, inputs, trials: 1000 })).toThrowBridgeworkError(
      'model-not-finite',
      { param: 'model' },
    );
  });

  it('refuses correlations with non-Gaussian inputs (JCGM 101 6.4.8 samples a multivariate Gaussian)', () => {
    expect(() =>
      monteCarlo({ model, inputs, correlations: [{ between: ['a', 'b'], coefficient: 0.3 }], trials: 1000 }),
    ).toThrowBridgeworkError('conflicting-options', { param: 'correlations[0]' });
    // A normal input with finite degrees of freedom is sampled as Student-t: also refused.
    const t: InputQuantities = {
      a: { value: 1, standardUncertainty: 0.1, degreesOfFreedom: 5 },
      b: { value: 2, standardUncertainty: 0.1 },
    };
    expect(() =>
      monteCarlo({
        model,
        inputs: t,
        correlations: [{ between: ['a', 'b'], coefficient: 0.3 }],
        trials: 1000,
      }),
    ).toThrowBridgeworkError('conflicting-options', { param: 'correlations[0]' });
    // An exact input may be "correlated": it has nothing to draw.
    const exact: InputQuantities = {
      a: { value: 1, standardUncertainty: 0.1 },
      b: { value: 2, distribution: 'rectangular', halfWidth: 0 },
    };
    expect(() =>
      monteCarlo({
        model,
        inputs: exact,
        correlations: [{ between: ['a', 'b'], coefficient: 0.3 }],
        trials: 1000,
      }),
    ).not.toThrow();
  });

  it('rejects bad options with specific errors', () => {
    const run = (extra: Record<string, unknown>) => () => monteCarlo({ model, inputs, ...extra } as never);
    expect(run({ model: undefined })).toThrowBridgeworkError('missing-option', { param: 'options.model' });
    expect(run({ model: 3 })).toThrowBridgeworkError('wrong-type', { param: 'model' });
    expect(
      run({ inputs: { a: { value: 1, distribution: 'lognormal', halfWidth: 1 } } }),
    ).toThrowBridgeworkError('invalid-option', {
      param: 'inputs.a.distribution',
    });
    expect(run({ inputs: { a: { value: 1, standardUncertainty: -1 } } })).toThrowBridgeworkError('negative', {
      param: 'inputs.a.standardUncertainty',
    });
    expect(run({ trials: 1.5 })).toThrowBridgeworkError('not-integer', { param: 'trials' });
    expect(run({ trials: 10 })).toThrowBridgeworkError('out-of-range', { param: 'trials' }); // q = ⌊9.5 + ½⌋ = M: no interval
    expect(run({ trials: 11, compareWithGum: false })).not.toThrow(); // the least M for p = 0.95: q = ⌊10.45 + ½⌋ = 10 < 11
    expect(run({ trials: 2e9 })).toThrowBridgeworkError('out-of-range', { param: 'trials' });
    // p = 1 − 10⁻⁷ needs M > ½/(1 − p) = 5·10⁶ trials for an interval to exist (found without a search).
    expect(run({ coverage: 1 - 1e-7, trials: 4_000_000 })).toThrowBridgeworkError('out-of-range', {
      param: 'trials',
    });
    expect(run({ seed: -1 })).toThrowBridgeworkError('out-of-range', { param: 'seed' });
    expect(run({ seed: 0.5 })).toThrowBridgeworkError('not-integer', { param: 'seed' });
    expect(run({ seed: 2 ** 53 })).toThrowBridgeworkError('out-of-range', { param: 'seed' });
    expect(run({ coverage: 0 })).toThrowBridgeworkError('out-of-range', { param: 'coverage' });
    expect(run({ significantDigits: 0 })).toThrowBridgeworkError('out-of-range', {
      param: 'significantDigits',
    });
    expect(run({ compareWithGum: 'no' })).toThrowBridgeworkError('wrong-type', { param: 'compareWithGum' });
    expect(run({ returnValues: 1 })).toThrowBridgeworkError('wrong-type', { param: 'returnValues' });
    expect(run({ adaptive: true, trials: 1000 })).toThrowBridgeworkError('conflicting-options', {
      param: 'trials',
    });
    expect(run({ adaptive: 3 })).toThrowBridgeworkError('wrong-type', { param: 'adaptive' });
    expect(run({ adaptive: { maxTrials: 100 } })).toThrowBridgeworkError('out-of-range', {
      param: 'adaptive.maxTrials',
    });
    expect(run({ adaptive: { interval: 'widest' } })).toThrowBridgeworkError('invalid-option', {
      param: 'adaptive.interval',
    });
    expect(() => monteCarlo(undefined as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });
});
