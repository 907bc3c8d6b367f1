/**
 * The result of a design or compliance check that can fail softly.
 *
 * @remarks
 * `ok` is true when no issue was found; `value` carries the figures either way, so a failed check
 * still reports what was computed. `issues` are readable sentences, one per finding.
 */
export interface CheckResult<T> {
  /** True when the check passed (no issue). */
  readonly ok: boolean;
  /** The computed figures. */
  readonly value: T;
  /** One sentence per finding; empty when `ok`. */
  readonly issues: readonly string[];
}
