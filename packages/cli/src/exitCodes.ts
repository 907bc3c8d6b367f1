/**
 * The exit codes of the `bridgework` command.
 *
 * @remarks
 * - `ok` (0): the command did what was asked and every check passed.
 * - `badInput` (1): the command could not run as asked: a usage error (unknown option, missing or
 *   malformed value), a file that cannot be read or parsed, a channel file that fails validation,
 *   an output file that exists already without `--force`.
 * - `failedCheck` (2): the command ran and wrote its results, but a design check failed (for
 *   example amplifier or converter headroom, or an accuracy-class check).
 *
 * Scripts and build steps may branch on these values; they are stable.
 *
 * @example
 * ```ts
 * const code = await runCli(['report', 'hopper.yaml'], nodeIo());
 * if (code === exitCodes.failedCheck) console.log('a design check failed');
 * ```
 */
export const exitCodes = Object.freeze({
  /** Success; every check passed. */
  ok: 0,
  /** Bad input: usage, file, parse or validation error. */
  badInput: 1,
  /** The command ran, but a design check failed (headroom, class check). */
  failedCheck: 2,
} as const);

/** One of the values of {@link exitCodes}. */
export type ExitCode = (typeof exitCodes)[keyof typeof exitCodes];
