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
