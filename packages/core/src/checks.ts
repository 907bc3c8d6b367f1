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
export function checkPositive(param: string, value: unknown, options: CheckPositiveOptions = {}): number {
  if (typeof value !== 'number') fail('wrong-type', param, 'a number', value);
  if (Number.isNaN(value) || value === -Infinity) fail('not-finite', param, 'a finite number', value);
  if (value === Infinity && options.allowInfinity !== true)
    fail('not-finite', param, 'a finite number', value);
  if (!(value > 0)) fail('not-positive', param, '> 0', value, 0);
  return value;
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

/**
 * Describes an interval in the message grammar, e.g. `in [-200, 850]` or `in (-1, 0.5]`.
 *
 * @param limits - The interval.
 * @returns The requirement text.
 */
export function describeRange(limits: RangeLimits): string {
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
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, or `out-of-range` (with `limit` = [min, max]).
 * @example
 * ```ts
 * checkRange('poissonRatio', 0.3, { min: -1, max: 0.5, minExclusive: true }); // 0.3
 * ```
 */
export function checkRange(param: string, value: unknown, limits: RangeLimits): number {
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
  if (typeof value === 'string' && (choices as readonly string[]).includes(value)) return value as T;
  fail('invalid-option', param, `one of ${choices.map((c) => `'${c}'`).join(', ')}`, value, choices);
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
 *   `limit` = the known keys), `missing-option`.
 * @example
 * ```ts
 * checkOptions('options', { whiteDensity: 1e-8 }, { known: ['whiteDensity', 'cornerHertz'], required: ['whiteDensity'] });
 * // checkOptions('options', { whiteDensty: 1e-8 }, …) throws unknown-option:
 * // "`options.whiteDensty` is not a known option; did you mean `whiteDensity`?"
 * ```
 */
export function checkOptions(param: string, value: unknown, keys: OptionKeys): Record<string, unknown> {
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
