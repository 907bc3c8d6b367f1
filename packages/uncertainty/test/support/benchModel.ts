/** A model of twelve inputs with a handful of arithmetic operations (the benchmark's and the worker tests' model). */
export function twelveInputModel(x: Readonly<Record<string, number>>): number {
  return (
    ((x['a'] as number) * (x['b'] as number) + (x['c'] as number)) /
      ((x['d'] as number) + (x['e'] as number)) -
    (x['f'] as number) * (x['g'] as number) +
    (x['h'] as number) * (x['i'] as number) -
    (x['j'] as number) +
    (x['k'] as number) * (x['l'] as number)
  );
}

/** A model that fails on some trials (for the worker error path). */
export function failingModel(x: Readonly<Record<string, number>>): number {
  return (x['a'] as number) > 1.2 ? NaN : (x['a'] as number);
}

/** Not a function: for the export check. */
export const notAModel = 42;

/** The inputs of the twelve-input model: six normal, six rectangular. */
export const twelveInputs = Object.fromEntries(
  ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h', 'i', 'j', 'k', 'l'].map((name, i) => [
    name,
    i % 2 === 0
      ? { value: 1 + i, standardUncertainty: 0.1 }
      : { value: 2 + i, distribution: 'rectangular' as const, halfWidth: 0.2 },
  ]),
);

/** The twelve-input model in the positional form (the same operations in the same order). */
export const twelveInputPositional = {
  order: ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h', 'i', 'j', 'k', 'l'],
  evaluate(x: Float64Array): number {
    return (
      ((x[0] as number) * (x[1] as number) + (x[2] as number)) / ((x[3] as number) + (x[4] as number)) -
      (x[5] as number) * (x[6] as number) +
      (x[7] as number) * (x[8] as number) -
      (x[9] as number) +
      (x[10] as number) * (x[11] as number)
    );
  },
};

/** A factory (for `model.argument`): the twelve-input model scaled by `factor`, positional. */
export function scaledTwelveInputModel(argument: { factor: number }): typeof twelveInputPositional {
  const { factor } = argument;
  return {
    order: twelveInputPositional.order,
    evaluate: (x: Float64Array) => factor * twelveInputPositional.evaluate(x),
  };
}

/**
 * Fails (NaN) where a > 1.4, four standard deviations out: a few dozen trials of 10⁶, in
 * several blocks, so that workers meet failures in different blocks.
 */
export function rarelyFailingModel(x: Readonly<Record<string, number>>): number {
  return (x['a'] as number) > 1.4 ? NaN : (x['a'] as number);
}

/** Throws a RangeError (a model's own error, not a bridgework one) where a > 1.4. */
export function throwingModel(x: Readonly<Record<string, number>>): number {
  if ((x['a'] as number) > 1.4) throw new RangeError('a is past what this model takes');
  return x['a'] as number;
}

/** A non-linear model of a correlated normal pair, a Student-t input and a triangular one. */
export function correlatedModel(x: Readonly<Record<string, number>>): number {
  return ((x['a'] as number) * (x['b'] as number)) / (1 + (x['c'] as number) ** 2) + (x['d'] as number);
}

/** The inputs of {@link correlatedModel} (a and b correlated by {@link correlatedPairs}). */
export const correlatedInputs = {
  a: { value: 2, standardUncertainty: 0.2 },
  b: { value: -1, standardUncertainty: 0.1 },
  c: { value: 0.5, distribution: 't', scale: 0.05, degreesOfFreedom: 5 },
  d: { value: 1, distribution: 'triangular', halfWidth: 0.3 },
} as const;

/** a and b correlated at −0.6. */
export const correlatedPairs = [{ between: ['a', 'b'], coefficient: -0.6 }] as const;

/** a rounded to a grid of 0.05 plus b to 0.01: the values tie in runs of thousands at the interval ends. */
export function quantisedModel(x: Readonly<Record<string, number>>): number {
  return Math.round((x['a'] as number) * 20) / 20 + Math.round((x['b'] as number) * 100) / 100;
}

/**
 * A factory (for `model.argument`) of a model that ends its thread with `process.exit(code)` where
 * a > 1.4 (for the pool's path of a worker that stops). Only ever run in a pool's worker: the
 * pool's main thread evaluates it at the estimates only, a = 1.
 */
export function exitingModel(argument: { code: number }): (x: Readonly<Record<string, number>>) => number {
  return (x) => {
    if ((x['a'] as number) > 1.4) process.exit(argument.code);
    return x['a'] as number;
  };
}
