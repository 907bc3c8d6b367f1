/**
 * The result of a soft design check: `ok` is true when `issues` is empty, and `value` is reported
 * either way, so a failing design can still be inspected.
 */
export interface DesignCheck<T, I> {
  /** True when no limit is violated. */
  readonly ok: boolean;
  /** What was computed. */
  readonly value: T;
  /** Every violated limit, each with its margin. */
  readonly issues: readonly I[];
}
