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
