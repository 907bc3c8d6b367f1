/**
 * The total error of a firmware function against the exact map it stands for, as a header and
 * the JSON state it.
 */

/**
 * The bound of |firmware result − exact map| over a function's code range, with its parts.
 *
 * @remarks
 * `bound` is the only figure stated as "the error". It is `againstReference` (the largest
 * |result − reference(code)| over the codes checked, rounded upward by the margin of the binary64
 * subtraction that measured it) plus `referenceError` (the reference's own stated error against the
 * mathematical map it computes, for example a channel's map evaluated in binary64).
 * `proved` is true only when every code of the range was evaluated (`method: 'exhaustive'`): then
 * `againstReference` is a proved maximum, and `bound` is proved given the reference's stated error.
 * With `method: 'sampled'` the bound is the sampled approximation error plus the analytic
 * arithmetic bound: a measured figure, not a proof.
 *
 * The parts are named as parts: `approximation` (the designed function — line, polynomial or
 * Möbius form with its coefficients as fitted in binary64 — against the reference, measured over
 * the same codes) and `arithmetic` (the analytic bound of the target's arithmetic against the
 * designed function: coefficient rounding, operation rounding, output rounding). The bound never
 * exceeds approximation + arithmetic + referenceError by more than the measuring margins, and is
 * usually well below their sum.
 */
export interface TotalErrorBound {
  /** The stated total error bound, quantity unit. */
  readonly bound: number;
  /** True when every code was evaluated (the bound is proved against the reference). */
  readonly proved: boolean;
  /** `'exhaustive'` (every code) or `'sampled'`. */
  readonly method: 'exhaustive' | 'sampled';
  /** How many codes were evaluated. */
  readonly codesChecked: number;
  /** A code where the largest |result − reference| was found. */
  readonly worstCode: number;
  /** The largest |result − reference| found (with its measuring margin), quantity unit. */
  readonly againstReference: number;
  /** The reference's own error bound that was added, quantity unit (0 when none was stated). */
  readonly referenceError: number;
  /** Where `referenceError` comes from, in words. */
  readonly referenceErrorSource: string;
  /** Part: the largest |designed function − reference| over the codes checked, quantity unit. */
  readonly approximation: number;
  /** Part: the analytic bound of |result − designed function|, quantity unit. */
  readonly arithmetic: number;
  /** The target the function was chosen to meet, quantity unit. */
  readonly target: number;
}

/** A code with the reference value and each function's expected result, for firmware tests. */
export interface TestVector {
  /** The converter code. */
  readonly code: number;
  /** Why it was chosen. */
  readonly reason: 'rail' | 'segment-edge' | 'worst-error' | 'spread';
  /** The reference (exact map) at the code, quantity unit, as computed by the reference in binary64. */
  readonly exact: number;
  /** The fixed-point function's output (output LSB), when there is one. */
  readonly fixed?: number;
  /** The float32 function's result (a binary32 value), when there is one. */
  readonly float32?: number;
  /** The float64 function's result, when there is one. */
  readonly float64?: number;
}

/** The total error of each function of a channel, by evaluator type. */
export interface TotalErrors {
  /** The fixed-point function's total error, when there is one. */
  readonly fixed?: TotalErrorBound;
  /** The float32 function's total error, when there is one. */
  readonly float32?: TotalErrorBound;
  /** The float64 function's total error, when there is one. */
  readonly float64?: TotalErrorBound;
}

/** The reference's own error, as the caller states it. */
export interface ReferenceError {
  /** Bound of |reference(code) − the mathematical map| over the range, quantity unit (≥ 0). */
  readonly bound: number;
  /** Where the bound comes from, in words, for the header (e.g. "the channel's stated accuracy"). */
  readonly source: string;
}
