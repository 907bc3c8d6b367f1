import { describe, expect, it } from 'vitest';
import { monteCarlo, propagate, type InputQuantities, type PositionalModel } from '@bridgework/uncertainty';
import { twelveInputModel, twelveInputPositional, twelveInputs } from './support/benchModel.js';

const inputs = twelveInputs as InputQuantities;

describe('positional models (issue 13 item 5: a model over plain numeric parameters)', () => {
  it('give bit for bit the Monte Carlo results of the record form, fixed and adaptive', () => {
    // The same operations in the same order on the same draws: identical values (no tolerance).
    const options = { inputs, trials: 60_000, seed: 9, returnValues: true } as const;
    const byName = monteCarlo({ model: twelveInputModel, ...options });
    const byPosition = monteCarlo({ model: twelveInputPositional, ...options });
    expect(Array.from(byPosition.values!)).toEqual(Array.from(byName.values!));
    expect({ ...byPosition, values: undefined }).toEqual({ ...byName, values: undefined });
    const adaptive = { inputs, adaptive: { maxTrials: 2_000_000 }, seed: 3 } as const;
    expect(monteCarlo({ model: twelveInputPositional, ...adaptive })).toEqual(
      monteCarlo({ model: twelveInputModel, ...adaptive }),
    );
  });

  it('take the values in the declared order, whatever the order of the inputs record', () => {
    // y = a − 2b with the order reversed against the record: a wrong mapping would flip the sign.
    const reversed: PositionalModel = { order: ['b', 'a'], evaluate: (x) => x[1]! - 2 * x[0]! };
    const ab: InputQuantities = {
      a: { value: 10, standardUncertainty: 0.1 },
      b: { value: 1, distribution: 'rectangular', halfWidth: 0.2 },
    };
    const byName = ({ a, b }: Readonly<Record<string, number>>): number => a! - 2 * b!;
    const options = { inputs: ab, trials: 20_000, seed: 4, returnValues: true } as const;
    expect(Array.from(monteCarlo({ model: reversed, ...options }).values!)).toEqual(
      Array.from(monteCarlo({ model: byName, ...options }).values!),
    );
    const gum = propagate({ model: reversed, inputs: ab });
    // Exact sensitivities 1 and −2 (Ridders on a linear model: within 1e-12).
    expect([gum.sensitivities['a'], gum.sensitivities['b']]).toBeNear([1, -2], { rel: 1e-12 });
    expect(gum.value).toBe(8);
  });

  it('give the law of propagation of the record form; a positional gradient is mapped to the inputs', () => {
    const byName = propagate({ model: twelveInputModel, inputs });
    const byPosition = propagate({ model: twelveInputPositional, inputs });
    expect(byPosition).toEqual(byName);
    // Analytic gradient by position, for y = a·b·c with the order (c, a, b).
    const abc: InputQuantities = {
      a: { value: 2, standardUncertainty: 0.01 },
      b: { value: 3, standardUncertainty: 0.02 },
      c: { value: 5, standardUncertainty: 0.03 },
    };
    let calls = 0;
    const r = propagate({
      model: {
        order: ['c', 'a', 'b'],
        evaluate: (x) => {
          calls++;
          return x[0]! * x[1]! * x[2]!;
        },
        gradient: (x) => [x[1]! * x[2]!, x[0]! * x[2]!, x[0]! * x[1]!],
      },
      inputs: abc,
    });
    expect(calls).toBe(1); // only at the estimates
    expect(r.sensitivities).toEqual({ a: 15, b: 10, c: 6 });
    // u = √((15·0.01)² + (10·0.02)² + (6·0.03)²), evaluated in the same order (1 ulp).
    expect(r.standardUncertainty).toBeNear(Math.sqrt(0.15 ** 2 + 0.2 ** 2 + 0.18 ** 2), { ulps: 2 });
  });

  it('work for vector-valued models in propagate', () => {
    const ab: InputQuantities = {
      a: { value: 1, standardUncertainty: 0.1 },
      b: { value: 2, standardUncertainty: 0.2 },
    };
    const r = propagate({
      model: { order: ['a', 'b'], evaluate: (x) => [x[0]! + x[1]!, x[0]! - x[1]!] },
      inputs: ab,
    });
    const s = propagate({ model: ({ a, b }) => [a! + b!, a! - b!], inputs: ab });
    expect(r).toEqual(s);
  });

  it('refuse a bad order, form or gradient with typed errors', () => {
    const ab: InputQuantities = {
      a: { value: 1, standardUncertainty: 0.1 },
      b: { value: 2, standardUncertainty: 0.2 },
    };
    const run =
      (model: unknown, extra: Record<string, unknown> = {}) =>
      () =>
        monteCarlo({ model: model as PositionalModel, inputs: ab, trials: 1000, ...extra });
    const f = (x: Float64Array): number => x[0]!;
    expect(run({ order: ['a'], evaluate: f })).toThrowBridgeworkError('missing-option', {
      param: 'model.order',
    });
    expect(run({ order: ['a', 'bb'], evaluate: f })).toThrowBridgeworkError('invalid-option', {
      param: 'model.order[1]',
    });
    expect(run({ order: ['a', 'bb'], evaluate: f })).toThrow(/did you mean 'b'/);
    expect(run({ order: ['a', 'a', 'b'], evaluate: f })).toThrowBridgeworkError('conflicting-options', {
      param: 'model.order[1]',
    });
    expect(run({ order: 'ab', evaluate: f })).toThrowBridgeworkError('wrong-type', { param: 'model.order' });
    expect(run({ order: ['a', 'b'] })).toThrowBridgeworkError('missing-option', { param: 'model.evaluate' });
    expect(run({ order: ['a', 'b'], evaluate: 1 })).toThrowBridgeworkError('wrong-type', {
      param: 'model.evaluate',
    });
    expect(run({ order: ['a', 'b'], evaluat: f })).toThrowBridgeworkError('unknown-option', {
      param: 'model.evaluat',
    });
    expect(
      run({ order: ['a', 'b'], evaluate: f }, { gradient: () => ({ a: 1, b: 0 }) }),
    ).toThrowBridgeworkError('conflicting-options', { param: 'gradient' });
    expect(run(42)).toThrowBridgeworkError('wrong-type', { param: 'model' });
    expect(() =>
      propagate({ model: { order: ['a', 'b'], evaluate: f, gradient: () => [1] }, inputs: ab }),
    ).toThrowBridgeworkError('invalid-shape', { param: 'model.gradient' });
    expect(() =>
      propagate({ model: { order: ['a', 'b'], evaluate: f, gradient: () => [1, NaN] }, inputs: ab }),
    ).toThrowBridgeworkError('model-not-finite', { param: 'model.gradient[1]' });
  });
});
