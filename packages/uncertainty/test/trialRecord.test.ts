import { describe, expect, it } from 'vitest';
import { monteCarlo, propagate, type InputQuantities, type PositionalModel } from '@bridgework/uncertainty';
import { recordOver } from '../src/internal/trialRecord.js';

// Input names a record must carry as they are: integer-like keys (listed first by Object.keys),
// names of Object.prototype's members, `__proto__` (an own property, not the prototype), and
// characters that need escaping in a string literal.
const oddNames = ['b', '7', 'a', '__proto__', 'constructor', 'toString', 'a b', 'x"y\\z', 'l\u2028s', 'ε₀'];
const oddInputs: InputQuantities = Object.fromEntries(
  oddNames.map((name, i) => [
    name,
    i % 2 === 0
      ? { value: 1 + i, standardUncertainty: 0.1 }
      : { value: 2 + i, distribution: 'rectangular' as const, halfWidth: 0.2 },
  ]),
);
// JSON.parse makes `__proto__` an own key, as a user's inputs read from a file would have it.
const inputs = JSON.parse(JSON.stringify(oddInputs)) as InputQuantities;
const names = Object.keys(inputs);

describe('the trial record (a sealed record of plain data properties, loaded per trial)', () => {
  it('has every input as an own writable data property, in the inputs’ order, compiled or not', () => {
    expect(names).toContain('__proto__');
    for (const compiled of [true, false]) {
      const rows = Float64Array.from({ length: 3 * names.length }, (_, k) => 0.25 + k);
      const { record, load } = recordOver(names, rows, compiled);
      expect(Object.keys(record)).toEqual(names);
      expect(Object.getPrototypeOf(record)).toBe(Object.prototype);
      expect(Object.isSealed(record)).toBe(true);
      for (const at of [0, 2 * names.length, names.length]) {
        load(at);
        names.forEach((name, j) => {
          expect(Object.getOwnPropertyDescriptor(record, name)).toEqual({
            value: rows[at + j],
            writable: true,
            enumerable: true,
            configurable: false,
          });
        });
      }
      expect(() => {
        (record as Record<string, number>)['extra'] = 1;
      }).toThrow(TypeError);
    }
  });

  it('gives a record model the values a positional model gets, bit for bit, with these names', () => {
    // y = Σ w_j·x_j with distinct weights: a value under the wrong name changes y.
    const weights = names.map((_, j) => 1 + j / 7);
    const byName = (x: Readonly<Record<string, number>>): number =>
      names.reduce((s, name, j) => s + weights[j]! * x[name]!, 0);
    const byPosition: PositionalModel = {
      order: names,
      evaluate: (x) => names.reduce((s, _, j) => s + weights[j]! * x[j]!, 0),
    };
    const options = { inputs, trials: 40_000, seed: 12, returnValues: true } as const;
    const r = monteCarlo({ model: byName, ...options });
    const p = monteCarlo({ model: byPosition, ...options });
    expect(Array.from(r.values!)).toEqual(Array.from(p.values!));
    expect({ ...r, values: undefined }).toEqual({ ...p, values: undefined });
    // The law of propagation reads the same record: the estimate Σ w_j·value_j.
    const estimate = names.reduce(
      (s, name, j) => s + weights[j]! * (inputs[name] as { value: number }).value,
      0,
    );
    expect(propagate({ model: byName, inputs }).value).toBe(estimate);
  });

  it('refuses a property a model adds to the record (model-failed, the record is sealed)', () => {
    const adding = (x: Readonly<Record<string, number>>): number => {
      (x as Record<string, number>)['scratch'] = 1;
      return x['a']!;
    };
    expect(() =>
      monteCarlo({
        model: adding,
        inputs: { a: { value: 1, standardUncertainty: 0.1 } },
        compareWithGum: false,
      }),
    ).toThrowBridgeworkError('model-failed', { param: 'model' });
  });
});
