import { BridgeworkError } from './BridgeworkError.js';
import { closestName } from './closestName.js';

/**
 * Formats a value for an error message: numbers as JavaScript prints them (`NaN`, `-Infinity`,
 * `-5`), strings quoted, arrays and objects by their kind.
 *
 * @param value - Any value.
 * @returns A short printable form.
 * @example
 * ```ts
 * formatValue(-5); // '-5'
 * formatValue('quater'); // "'quater'"
 * ```
 */
export function formatValue(value: unknown): string {
  if (typeof value === 'number') return Object.is(value, -0) ? '-0' : String(value);
  if (typeof value === 'string') return `'${value}'`;
  if (typeof value === 'bigint') return `${value}n`;
  if (value === null) return 'null';
  if (value === undefined) return 'undefined';
  if (Array.isArray(value)) return `an array of length ${value.length}`;
  if (typeof value === 'object') return 'an object';
  return typeof value;
}

function fail(
  code: ConstructorParameters<typeof BridgeworkError>[0],
  param: string,
  requirement: string,
  value: unknown,
  limit?: number | string | readonly (number | string)[],
): never {
  throw new BridgeworkError(code, `\`${param}\` must be ${requirement}; got ${formatValue(value)}`, {
    param,
    value,
    ...(limit === undefined ? {} : { limit }),
  });
}

/**
 * Checks that `value` is a finite number and returns it.
 *
 * @param param - The option name used in the message, as a dotted path.
 * @param value - The value to check.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type` when not a number; `not-finite` for NaN or ±Infinity.
 * @example
 * ```ts
 * checkFinite('strain', 1e-3); // 0.001
 * ```
 */
export function checkFinite(param: string, value: unknown): number {
  if (typeof value !== 'number') fail('wrong-type', param, 'a number', value);
  if (!Number.isFinite(value)) fail('not-finite', param, 'a finite number', value);
  return value;
}

/** Options of {@link checkPositive}. */
export interface CheckPositiveOptions {
  /** Accept `+Infinity` (an open circuit, for example a meter of infinite resistance). Default false. */
  readonly allowInfinity?: boolean;
}

/**
 * Checks that `value` is a number greater than zero and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param options - `allowInfinity` to accept `+Infinity`.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, or `not-positive` (zero or negative).
 * @example
 * ```ts
 * checkPositive('gaugeOhms', 350); // 350
 * checkPositive('meterOhms', Infinity, { allowInfinity: true }); // Infinity
 * ```
 */
export function checkPositive(param: string, value: unknown, options?: CheckPositiveOptions): number {
  const allowInfinity = allowsInfinity(options);
  if (typeof value !== 'number') fail('wrong-type', param, 'a number', value);
  if (Number.isNaN(value) || value === -Infinity) fail('not-finite', param, 'a finite number', value);
  if (value === Infinity && !allowInfinity) fail('not-finite', param, 'a finite number', value);
  if (!(value > 0)) fail('not-positive', param, '> 0', value, 0);
  return value;
}

function allowsInfinity(options: CheckPositiveOptions | undefined): boolean {
  if (options === undefined) return false;
  const o = checkOptions('options', options, { known: ['allowInfinity'] });
  const allow = o['allowInfinity'];
  if (allow === undefined) return false;
  if (typeof allow !== 'boolean') fail('wrong-type', 'options.allowInfinity', 'a boolean', allow);
  return allow;
}

/**
 * Checks that `value` is a finite number of zero or more and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, or `negative`.
 * @example
 * ```ts
 * checkNonNegative('ohmsPerLead', 0); // 0
 * ```
 */
export function checkNonNegative(param: string, value: unknown): number {
  const x = checkFinite(param, value);
  if (x < 0) fail('negative', param, '>= 0', value, 0);
  return x;
}

/** The interval accepted by {@link checkRange}; a missing end is unbounded. */
export interface RangeLimits {
  /** Lower limit. */
  readonly min?: number;
  /** Upper limit. */
  readonly max?: number;
  /** Exclude the lower limit itself. Default false (closed). */
  readonly minExclusive?: boolean;
  /** Exclude the upper limit itself. Default false (closed). */
  readonly maxExclusive?: boolean;
}

const limitKeys = ['min', 'max', 'minExclusive', 'maxExclusive'];

/** Checks a {@link RangeLimits} object (a developer's argument, so a slip is caught at once). */
function checkLimits(limits: unknown): RangeLimits {
  const o = checkOptions('limits', limits, { known: limitKeys });
  for (const end of ['min', 'max']) {
    const v = o[end];
    if (v !== undefined && (typeof v !== 'number' || Number.isNaN(v))) {
      fail(
        typeof v === 'number' ? 'not-finite' : 'wrong-type',
        `limits.${end}`,
        'a number (±Infinity allowed)',
        v,
      );
    }
  }
  for (const flag of ['minExclusive', 'maxExclusive']) {
    const v = o[flag];
    if (v !== undefined && typeof v !== 'boolean') fail('wrong-type', `limits.${flag}`, 'a boolean', v);
  }
  return o as RangeLimits;
}

/**
 * Describes an interval in the message grammar, e.g. `in [-200, 850]` or `in (-1, 0.5]`.
 *
 * @param limits - The interval.
 * @returns The requirement text.
 */
export function describeRange(limits: RangeLimits): string {
  checkLimits(limits);
  const lo = limits.min ?? -Infinity;
  const hi = limits.max ?? Infinity;
  const open = limits.minExclusive === true || lo === -Infinity ? '(' : '[';
  const close = limits.maxExclusive === true || hi === Infinity ? ')' : ']';
  return `in ${open}${String(lo)}, ${String(hi)}${close}`;
}

/**
 * Checks that `value` is a finite number inside an interval and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param limits - The interval; ends are closed unless marked exclusive.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, or `out-of-range` (with `limit` = [min, max]);
 *   `unknown-option`, `wrong-type` or `not-finite` for malformed `limits`.
 * @example
 * ```ts
 * checkRange('poissonRatio', 0.3, { min: -1, max: 0.5, minExclusive: true }); // 0.3
 * ```
 */
export function checkRange(param: string, value: unknown, limits: RangeLimits): number {
  return checkWithin(param, value, checkLimits(limits));
}

/**
 * {@link checkRange} for limits that are the library's own constants (known to be well formed,
 * so not checked again on every call): the same checks and messages. Internal to core.
 */
export function checkWithin(param: string, value: unknown, limits: RangeLimits): number {
  const x = checkFinite(param, value);
  const lo = limits.min ?? -Infinity;
  const hi = limits.max ?? Infinity;
  const belowMin = limits.minExclusive === true ? x <= lo : x < lo;
  const aboveMax = limits.maxExclusive === true ? x >= hi : x > hi;
  if (belowMin || aboveMax) fail('out-of-range', param, describeRange(limits), value, [lo, hi]);
  return x;
}

/**
 * Checks that `value` is an integer (optionally inside an interval) and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param limits - Optional closed interval.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, `not-integer`, or `out-of-range`.
 * @example
 * ```ts
 * checkInteger('bits', 24, { min: 1, max: 32 }); // 24
 * ```
 */
export function checkInteger(param: string, value: unknown, limits: RangeLimits = {}): number {
  const x = checkFinite(param, value);
  if (!Number.isInteger(x)) fail('not-integer', param, 'an integer', value);
  return checkRange(param, x, limits);
}

/**
 * Checks that `value` is one of the allowed choices and returns it, narrowed to their type.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param choices - The allowed values.
 * @returns `value`, narrowed.
 * @throws {@link BridgeworkError} `invalid-option`, with `limit` = the choices.
 * @example
 * ```ts
 * checkOneOf('wiring', 'three-wire', ['two-wire', 'three-wire'] as const); // 'three-wire'
 * ```
 */
export function checkOneOf<const T extends string>(param: string, value: unknown, choices: readonly T[]): T {
  if (!Array.isArray(choices)) fail('wrong-type', 'choices', 'an array of strings', choices);
  if (typeof value === 'string' && (choices as readonly string[]).includes(value)) return value as T;
  // A slip of letter case (`'Quarter'`) is named; other near misses are left to the list.
  const lower = typeof value === 'string' ? value.toLowerCase() : undefined;
  const near = choices.find((c) => typeof c === 'string' && c.toLowerCase() === lower);
  const requirement = `one of ${choices.map((c) => `'${c}'`).join(', ')}`;
  if (near === undefined) fail('invalid-option', param, requirement, value, choices);
  throw new BridgeworkError(
    'invalid-option',
    `\`${param}\` must be ${requirement}; got ${formatValue(value)} (did you mean '${near}'?)`,
    { param, value, limit: choices },
  );
}

/**
 * Checks that a required option is present and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param why - Why it is required, appended to the message (e.g. `for 'half-poisson'`).
 * @returns `value`, without `undefined`.
 * @throws {@link BridgeworkError} `missing-option` when `value` is `undefined` or `null`.
 * @example
 * ```ts
 * requireOption('poissonRatio', 0.3, "for 'full-poisson'"); // 0.3
 * ```
 */
export function requireOption<T>(param: string, value: T | undefined | null, why?: string): T {
  if (why !== undefined && typeof why !== 'string') fail('wrong-type', 'why', 'a string', why);
  if (value === undefined || value === null) {
    throw new BridgeworkError(
      'missing-option',
      `\`${param}\` must be given${why === undefined ? '' : ` ${why}`}; got ${formatValue(value)}`,
      { param, value },
    );
  }
  return value;
}

/**
 * Checks that `value` is an array of exactly `length` entries and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param length - The required number of entries.
 * @returns `value`, typed as an array.
 * @throws {@link BridgeworkError} `invalid-shape`.
 * @example
 * ```ts
 * checkLength('armsOhms', [350, 350, 350, 350], 4);
 * ```
 */
export function checkLength<T>(param: string, value: readonly T[] | unknown, length: number): readonly T[] {
  if (typeof length !== 'number' || !Number.isInteger(length) || length < 0) {
    fail(typeof length === 'number' ? 'out-of-range' : 'wrong-type', 'length', 'an integer >= 0', length);
  }
  if (!Array.isArray(value) || value.length !== length) {
    fail('invalid-shape', param, `an array of length ${length}`, value, length);
  }
  return value as readonly T[];
}

/**
 * Checks that `value` is a plain options object (not null, not an array) and returns it.
 *
 * @param param - The argument name used in the message (usually `options`).
 * @param value - The value to check.
 * @returns `value`, typed as a record.
 * @throws {@link BridgeworkError} `wrong-type`.
 */
export function checkObject(param: string, value: unknown): Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    fail('wrong-type', param, 'an options object', value);
  }
  return value as Record<string, unknown>;
}

/** The keys an options object may hold, for {@link checkOptions}. */
export interface OptionKeys {
  /** Every key the function reads (required ones included). */
  readonly known: readonly string[];
  /** Keys that must be present (not `undefined`). Default: none. */
  readonly required?: readonly string[];
}

function checkNames(param: string, value: unknown): readonly string[] {
  if (!Array.isArray(value) || !value.every((k) => typeof k === 'string')) {
    fail('wrong-type', param, 'an array of strings', value);
  }
  return value as readonly string[];
}

/** Checks the `keys` argument of {@link checkOptions} by the rule it enforces. */
function checkOptionKeys(keys: unknown): void {
  const o = checkObject('keys', keys);
  for (const key of Object.keys(o)) {
    if (key !== 'known' && key !== 'required') {
      const near = closestName(key, ['known', 'required']);
      throw new BridgeworkError(
        'unknown-option',
        `\`keys.${key}\` is not a known option${near === undefined ? ' (known: known, required)' : `; did you mean \`${near}\`?`}`,
        { param: `keys.${key}`, value: o[key], limit: ['known', 'required'] },
      );
    }
  }
  checkNames('keys.known', o['known']);
  if (o['required'] !== undefined) checkNames('keys.required', o['required']);
}

/**
 * Checks an options object against the keys a function reads: the one rule of every public
 * options object in bridgework.
 *
 * @remarks
 * An unknown key is an error naming the closest known key, so a misspelt option can never be
 * read as absent (and silently defaulted or taken as zero). A required key that is `undefined`
 * is `missing-option`. Keys are own enumerable keys; a key named like an object prototype member
 * (`constructor`, `__proto__`, `toString`) is unknown like any other.
 *
 * @param param - The argument name used in messages (usually `options`); nested objects use a
 *   dotted path such as `amplifier`.
 * @param value - The value to check.
 * @param keys - The known and required keys.
 * @returns `value`, typed as a record.
 * @throws {@link BridgeworkError} `wrong-type` (not a plain object), `unknown-option` (with
 *   `limit` = the known keys), `missing-option`; `wrong-type` or `unknown-option` for malformed
 *   `keys`.
 * @example
 * ```ts
 * checkOptions('options', { whiteDensity: 1e-8 }, { known: ['whiteDensity', 'cornerHertz'], required: ['whiteDensity'] });
 * // checkOptions('options', { whiteDensty: 1e-8 }, …) throws unknown-option:
 * // "`options.whiteDensty` is not a known option; did you mean `whiteDensity`?"
 * ```
 */
export function checkOptions(param: string, value: unknown, keys: OptionKeys): Record<string, unknown> {
  checkOptionKeys(keys);
  const o = checkObject(param, value);
  for (const key of Object.keys(o)) {
    if (!keys.known.includes(key)) {
      const near = closestName(key, keys.known);
      const path = param === '' ? key : `${param}.${key}`;
      throw new BridgeworkError(
        'unknown-option',
        `\`${path}\` is not a known option${near === undefined ? ` (known: ${keys.known.join(', ')})` : `; did you mean \`${near}\`?`}`,
        { param: path, value: o[key], limit: keys.known },
      );
    }
  }
  for (const key of keys.required ?? []) {
    if (o[key] === undefined) {
      const path = param === '' ? key : `${param}.${key}`;
      throw new BridgeworkError('missing-option', `\`${path}\` must be given; got undefined`, {
        param: path,
        value: undefined,
      });
    }
  }
  return o;
}

/** What a result is and which input the caller can change, for {@link checkFiniteResult}. */
export interface FiniteResultBlame {
  /** What was computed, in words (`the wire resistance`). */
  readonly what: string;
  /** The caller's option that drives the result out of range, as a dotted path. */
  readonly param: string;
  /** The value the caller gave for it. */
  readonly value: unknown;
}

/**
 * Returns a computed number when it is finite; otherwise throws `out-of-range` naming the input
 * the caller gave (never an internal quantity).
 *
 * @remarks
 * The last guard of a function whose documented domain is "where the result is finite": an
 * accepted input never yields NaN or ±Infinity. Use it after computing in a form that does not
 * overflow on the way, so that only a result that truly lies beyond binary64 (|x| > 1.8e308) or
 * is undefined is refused.
 *
 * @param result - The computed value.
 * @param blame - What it is, and the option (with its value) that the caller can change.
 * @returns `result`.
 * @throws {@link BridgeworkError} `out-of-range` with `param` = `blame.param`; `wrong-type`,
 *   `unknown-option` or `missing-option` for a malformed `blame` or a `result` that is not a number.
 * @example
 * ```ts
 * checkFiniteResult(1.2, { what: 'the wire resistance', param: 'lengthMeters', value: 10 }); // 1.2
 * ```
 */
export function checkFiniteResult(result: number, blame: FiniteResultBlame): number {
  const b = checkOptions('blame', blame, { known: ['what', 'param', 'value'], required: ['what', 'param'] });
  if (typeof b['what'] !== 'string') fail('wrong-type', 'blame.what', 'a string', b['what']);
  if (typeof b['param'] !== 'string') fail('wrong-type', 'blame.param', 'a string', b['param']);
  if (typeof result !== 'number') fail('wrong-type', 'result', 'a number', result);
  if (Number.isFinite(result)) return result;
  throw new BridgeworkError(
    'out-of-range',
    `\`${blame.param}\` must keep ${blame.what} finite (within ±1.8e308); got ${formatValue(blame.value)}`,
    { param: blame.param, value: blame.value },
  );
}

/** The caller's option an inner failure is reported against (see {@link blameOption}). */
export interface OptionBlame {
  /** The caller's option, as a dotted path. */
  readonly param: string;
  /** The value the caller gave for it. */
  readonly value: unknown;
  /** What the option must do, in the message grammar (`must leave a reading the bridge can take`). */
  readonly requirement: string;
}

/**
 * Runs a computation on values derived from the caller's options; a {@link BridgeworkError} from
 * inside it (which names an internal quantity such as `ratio` or `armsOhms[0]`) is re-raised as
 * `out-of-range` against the option the caller gave, with the inner message as the reason and
 * the inner error as `cause`.
 *
 * @param blame - The option, its value and what it must do.
 * @param compute - The computation.
 * @returns What `compute` returns.
 * @throws {@link BridgeworkError} `out-of-range` with `param` = `blame.param`, for any
 *   `BridgeworkError` from `compute`; other errors pass through unchanged; `wrong-type`,
 *   `unknown-option` or `missing-option` for a malformed `blame` or a `compute` that is not a
 *   function.
 * @example
 * ```ts
 * blameOption({ param: 'ohmsPerLead', value: 1e9, requirement: 'must leave a reading the bridge can take' }, () =>
 *   bridge.strainFromRatio(ratio),
 * );
 * ```
 */
export function blameOption<T>(blame: OptionBlame, compute: () => T): T {
  const b = checkOptions('blame', blame, {
    known: ['param', 'value', 'requirement'],
    required: ['param', 'requirement'],
  });
  if (typeof b['param'] !== 'string') fail('wrong-type', 'blame.param', 'a string', b['param']);
  if (typeof b['requirement'] !== 'string')
    fail('wrong-type', 'blame.requirement', 'a string', b['requirement']);
  if (typeof compute !== 'function') fail('wrong-type', 'compute', 'a function', compute);
  try {
    return compute();
  } catch (e) {
    if (!(e instanceof BridgeworkError)) throw e;
    throw new BridgeworkError(
      'out-of-range',
      `\`${blame.param}\` ${blame.requirement}; got ${formatValue(blame.value)} (${e.message})`,
      { param: blame.param, value: blame.value, cause: e },
    );
  }
}
