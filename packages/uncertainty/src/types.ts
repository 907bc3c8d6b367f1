/** A scalar measurement model Y = f(X₁, …, X_N): receives the inputs by name, returns the output estimate. */
export type MeasurementModel = (x: Readonly<Record<string, number>>) => number;

/** A vector-valued measurement model (several outputs from the same inputs, JCGM 102's multivariate model). */
export type VectorMeasurementModel = (x: Readonly<Record<string, number>>) => readonly number[];

/**
 * A measurement model over its inputs by position: `evaluate(x)` receives the input values in a
 * Float64Array, `x[i]` being the input named `order[i]`.
 *
 * @remarks
 * The positional form suits a model that is a function of plain numeric parameters (a channel's
 * exact map with its tolerances, a model compiled from an expression): no property is looked up
 * by name per call. The engine fills one reused array per call; the model must not keep it (it
 * may write to it: the next call overwrites it). `order` names every input of `inputs` exactly
 * once; it fixes only how values are passed, not how they are drawn, so a positional model gives
 * bit for bit the results of the equivalent record model for the same seed.
 *
 * @typeParam Output - `number` for a scalar model, `readonly number[]` for a vector-valued one
 *   (law of propagation only).
 */
export interface PositionalModel<Output extends number | readonly number[] = number> {
  /** The input names in the order of `x`: every key of `inputs`, each once. */
  readonly order: readonly string[];
  /** The model: output(s) from the input values in `order`. */
  readonly evaluate: (x: Float64Array) => Output;
  /**
   * The analytic gradient at a point, for the law of propagation (optional): ∂f/∂xᵢ in `order`
   * (n numbers) for a scalar model, one such row per output for a vector-valued model. When
   * absent, sensitivities are numerical.
   */
  readonly gradient?: (
    x: Float64Array,
  ) => Output extends number ? ArrayLike<number> : readonly ArrayLike<number>[];
}
