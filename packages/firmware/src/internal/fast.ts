/**
 * Fast evaluators of the maps, without the per-call range check, for the error scans. Kept in a
 * registry rather than on the (frozen, public) map objects.
 */
const registry = new WeakMap<object, (code: number) => number>();

/** Records the unchecked evaluator of a map. */
export function registerFastEvaluator(map: object, evaluate: (code: number) => number): void {
  registry.set(map, evaluate);
}

/** The unchecked evaluator of a map, or its checked `evaluate` for a map made elsewhere. */
export function fastEvaluator(map: { evaluate(code: number): number }): (code: number) => number {
  return registry.get(map) ?? ((code: number) => map.evaluate(code));
}
