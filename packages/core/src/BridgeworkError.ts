/**
 * The closed union of stable error codes; {@link errorCodeDescriptions} says what each means.
 */
export type ErrorCode =
  | 'not-finite'
  | 'wrong-type'
  | 'not-positive'
  | 'negative'
  | 'not-integer'
  | 'out-of-range'
  | 'ratio-out-of-range'
  | 'no-solution'
  | 'invalid-option'
  | 'missing-option'
  | 'unknown-option'
  | 'conflicting-options'
  | 'invalid-shape'
  | 'unknown-count'
  | 'singular'
  | 'not-converged'
  | 'too-few-points'
  | 'not-positive-semidefinite'
  | 'model-not-finite'
  | 'model-failed'
  | 'closed'
  | 'overflow'
  | 'clipped'
  | 'invalid-spec'
  | 'parse-error'
  | 'file-exists'
  | 'io-error';

/**
 * Every error code a bridgework function can throw, with what it means.
 *
 * @remarks
 * The union is closed: a code is added to {@link ErrorCode} and here (the compiler insists on
 * both) before any package throws it; `pnpm run docs:codes` then updates the tables in
 * DEVELOPERS.md and docs/errors.md, which a test keeps in step. Codes are stable across releases, so callers may
 * branch on them.
 */
export const errorCodeDescriptions: Readonly<Record<ErrorCode, string>> = {
  'not-finite': 'A number is NaN or ±Infinity where a finite value is required.',
  'wrong-type': 'A value has the wrong JavaScript type (for example a string where a number is required).',
  'not-positive': 'A number must be greater than zero (resistances, excitation, gauge factor).',
  negative: 'A number must be zero or greater (lead resistance, source resistance, uncertainties).',
  'not-integer': 'A number must be an integer (bits, AWG size, counts).',
  'out-of-range':
    'A number lies outside the documented domain of the function (for example a strain that would make a gauge resistance non-positive, or a temperature outside a standard’s range).',
  'ratio-out-of-range':
    'A bridge output ratio that no admissible strain or resistance of the arrangement can produce.',
  'no-solution': 'The reading cannot be produced by any finite positive resistance or physical state.',
  'invalid-option': 'An option has a value that is not one of the documented choices.',
  'missing-option': 'A required option is absent (for example the Poisson ratio for a Poisson arrangement).',
  'unknown-option':
    'An options object holds a key the function does not know (usually a misspelling); the message names the closest known key.',
  'conflicting-options':
    'Options that exclude each other were given together (for example both an AWG size and a diameter).',
  'invalid-shape': 'An array or record has the wrong length or structure.',
  'unknown-count': 'The number of unknowns is wrong (for example not exactly one null arm).',
  singular:
    'A linear system is singular or too ill-conditioned to solve (nearly parallel rosette legs, all fit points at one abscissa).',
  'not-converged': 'An iteration did not reach its stated tolerance within its iteration limit.',
  'too-few-points': 'Fewer data points were given than the method needs.',
  'not-positive-semidefinite': 'A correlation or covariance matrix is not positive semidefinite.',
  'model-not-finite': 'A user-supplied model returned NaN or ±Infinity.',
  'model-failed':
    'A user-supplied model threw an error that is not a bridgework error; the message shows where (the trial and its inputs), `cause` holds the original.',
  closed:
    'An object was used after it was closed (for example a Monte Carlo worker pool after `close()`), or a run was stopped by its abort signal.',
  overflow: 'An integer pipeline would overflow its word or accumulator.',
  clipped: 'A converter code at or beyond the rails, when the policy is to throw rather than flag.',
  'invalid-spec': 'A specification or file holds one or more problems; each is listed with its field path.',
  'parse-error': 'A file or text could not be parsed (malformed YAML, JSON, CSV or unit string).',
  'file-exists': 'An output file exists already and overwriting was not allowed.',
  'io-error': 'A file could not be read or written.',
};

/** All error codes, in the order of {@link errorCodeDescriptions}. */
// Marked pure so that a bundle which never reads the codes drops the descriptions with them.
export const errorCodes: readonly ErrorCode[] = /* @__PURE__ */ Object.freeze(
  /* @__PURE__ */ Object.keys(errorCodeDescriptions) as ErrorCode[],
);

/**
 * One problem found in a specification, named by the field the user can change (used with
 * `invalid-spec`). Issues travel as data; the outermost layer formats them and never rewrites
 * `message`.
 */
export interface SpecIssue {
  /** The stable code of the problem (one of {@link ErrorCode}), when one applies. */
  readonly code?: ErrorCode;
  /** Dotted field path such as `bridge.ohmsPerLead` or `channels[2].adc.bits`. */
  readonly path: string;
  /** What was wrong and what was expected, in the user's terms and unit. */
  readonly message: string;
  /** The limit that was passed, in the user's unit, as text (`181.2 °C`), when there is one. */
  readonly limit?: string;
  /** What the field must be, as text (`> 0`, `one of 'quarter', 'half-bending'`), when useful. */
  readonly expected?: string;
  /** A way out the user can take (`lower amplifier.gain to 2 or narrow output.range`). */
  readonly suggestion?: string;
}

/** Machine-readable details carried by a {@link BridgeworkError}. */
export interface BridgeworkErrorDetails {
  /** The option or argument at fault, as a dotted path (`leads.ohmsPerLead`). */
  readonly param?: string;
  /** The offending value, as given. */
  readonly value?: unknown;
  /** The limit that was violated, or the allowed range or choices. */
  readonly limit?: number | string | readonly (number | string)[];
  /** Every problem found, for `invalid-spec` errors. */
  readonly issues?: readonly SpecIssue[];
  /** The underlying error, when this one wraps another. */
  readonly cause?: unknown;
}

/**
 * The one error class of bridgework: a stable `code` plus the parameter, value and limit at fault.
 *
 * @remarks
 * Messages follow one grammar: "`param` must be <requirement>; got <value>", so they read the
 * same in every package and can be shown to users as they are. Branch on `code`, never on the
 * message text.
 *
 * @example
 * ```ts
 * try {
 *   checkPositive('excitationVolts', -5);
 * } catch (e) {
 *   if (e instanceof BridgeworkError) console.log(e.code, e.param, e.value); // 'not-positive' 'excitationVolts' -5
 * }
 * ```
 */
export class BridgeworkError extends Error {
  /**
   * Recognises a bridgework error made by any copy of `@bridgework/core` (two installed
   * versions, another realm) by its registered brand, so `instanceof` works across copies.
   *
   * @param value - Any value.
   * @returns True when `value` carries the brand.
   */
  static override [Symbol.hasInstance](value: unknown): boolean {
    return this === BridgeworkError
      ? hasBrand(value)
      : (Function.prototype[Symbol.hasInstance] as (v: unknown) => boolean).call(this, value);
  }

  /** The stable error code. */
  readonly code: ErrorCode;
  /** The option or argument at fault, as a dotted path, when there is one. */
  readonly param: string | undefined;
  /** The offending value, as given. */
  readonly value: unknown;
  /** The violated limit, range or list of allowed choices, when there is one. */
  readonly limit: number | string | readonly (number | string)[] | undefined;
  /** Every problem found, for `invalid-spec` errors (empty otherwise). */
  readonly issues: readonly SpecIssue[];

  /**
   * @param code - The stable error code.
   * @param message - The human-readable message, in the house grammar.
   * @param details - Machine-readable fields: `param`, `value`, `limit`, `issues`, `cause`.
   */
  constructor(code: ErrorCode, message: string, details: BridgeworkErrorDetails = {}) {
    super(message, details.cause === undefined ? undefined : { cause: details.cause });
    this.name = 'BridgeworkError';
    this.code = code;
    this.param = details.param;
    this.value = details.value;
    this.limit = details.limit;
    this.issues = details.issues ?? [];
    Object.defineProperty(this, BRIDGEWORK_ERROR_BRAND, { value: true, enumerable: false });
  }
}

/**
 * The registered symbol that marks every {@link BridgeworkError}, whichever copy of
 * `@bridgework/core` made it (`Symbol.for` is shared across copies and realms).
 */
export const BRIDGEWORK_ERROR_BRAND: unique symbol = Symbol.for('@bridgework/core/BridgeworkError') as never;

function hasBrand(value: unknown): boolean {
  return (
    typeof value === 'object' &&
    value !== null &&
    (value as Record<PropertyKey, unknown>)[BRIDGEWORK_ERROR_BRAND] === true
  );
}

/**
 * True when `error` is a {@link BridgeworkError} made by any copy of `@bridgework/core`
 * (recognised by its registered brand), optionally with the given code.
 *
 * @param error - Any value.
 * @param code - The code to require, if any.
 * @returns Whether `error` is such an error.
 */
export function isBridgeworkError(error: unknown, code?: ErrorCode): error is BridgeworkError {
  return hasBrand(error) && (code === undefined || (error as BridgeworkError).code === code);
}
