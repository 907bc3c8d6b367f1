/** A scalar measurement model Y = f(X₁, …, X_N): receives the inputs by name, returns the output estimate. */
export type MeasurementModel = (x: Readonly<Record<string, number>>) => number;

/** A vector-valued measurement model (several outputs from the same inputs, JCGM 102's multivariate model). */
export type VectorMeasurementModel = (x: Readonly<Record<string, number>>) => readonly number[];
