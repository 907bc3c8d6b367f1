/** A model module that fails while loading, for the worker pool's error path. */
export function model(x: Readonly<Record<string, number>>): number {
  return x['a'] as number;
}

throw new Error('this module fails to load on purpose');
