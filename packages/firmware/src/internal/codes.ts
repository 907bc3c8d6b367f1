import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkOneOf,
  checkOptions,
  requireOption,
} from '@bridgework/core';
import { EXHAUSTIVE_CODE_LIMIT, verificationModes } from '../verification.js';

/** Codes are signed 32-bit integers (a converter's code, sign-extended): C type int32_t. */
export const CODE_LIMITS = { min: -(2 ** 31), max: 2 ** 31 - 1 } as const;

export interface CodeRange {
  readonly codeMin: number;
  readonly codeMax: number;
}

/** Checks `codeMin` ≤ `codeMax`, both int32. */
export function checkCodeRange(o: Record<string, unknown>, prefix = ''): CodeRange {
  const codeMin = checkInteger(`${prefix}codeMin`, o['codeMin'], CODE_LIMITS);
  const codeMax = checkInteger(`${prefix}codeMax`, o['codeMax'], CODE_LIMITS);
  if (codeMax < codeMin) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${prefix}codeMax\` must be >= codeMin (${codeMin}); got ${codeMax}`,
      {
        param: `${prefix}codeMax`,
        value: codeMax,
        limit: [codeMin, CODE_LIMITS.max],
      },
    );
  }
  return { codeMin, codeMax };
}

/** Picks the verification method for a range. */
export function resolveVerification(value: unknown, range: CodeRange): 'exhaustive' | 'sampled' {
  const mode = value === undefined ? 'auto' : checkOneOf('verification', value, verificationModes);
  if (mode !== 'auto') return mode;
  return range.codeMax - range.codeMin + 1 <= EXHAUSTIVE_CODE_LIMIT ? 'exhaustive' : 'sampled';
}

/** Checks an optional reference function. */
export function checkReference(value: unknown): ((code: number) => number) | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'function') {
    throw new BridgeworkError('wrong-type', '`exact` must be a function (code) => quantity', {
      param: 'exact',
      value,
    });
  }
  return value as (code: number) => number;
}

/** Calls the reference function and insists on a finite number. */
export function callReference(exact: (code: number) => number, code: number): number {
  const v = exact(code);
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new BridgeworkError(
      'model-not-finite',
      `\`exact(${code})\` must return a finite number; got ${String(v)}`,
      {
        param: 'exact',
        value: v,
      },
    );
  }
  return v;
}

/**
 * The codes a sampled verification evaluates: 1024 at each rail, 1024 around each of the `centres`
 * (the offset), a grid of 2^15 evenly spaced codes and 2^14 pseudo-random codes from a fixed-seed
 * generator, all inside the range, without repeats, in increasing order.
 */
export function sampleCodes(range: CodeRange, centres: readonly number[]): number[] {
  const { codeMin, codeMax } = range;
  const picked = new Set<number>();
  const addRun = (from: number, count: number) => {
    for (let i = 0; i < count; i++) {
      const c = from + i;
      if (c >= codeMin && c <= codeMax) picked.add(c);
    }
  };
  addRun(codeMin, 1024);
  addRun(codeMax - 1023, 1024);
  for (const c of centres) if (Number.isFinite(c)) addRun(Math.floor(c) - 512, 1024);
  const span = codeMax - codeMin;
  const grid = 2 ** 15;
  for (let i = 0; i <= grid; i++) picked.add(codeMin + Math.floor((span * i) / grid));
  // xorshift32 with a fixed seed: the same sample on every run and platform.
  let state = 0x2545f491;
  for (let i = 0; i < 2 ** 14; i++) {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    const unit = (state >>> 0) / 2 ** 32;
    picked.add(codeMin + Math.floor(unit * (span + 1)));
  }
  return [...picked].sort((a, b) => a - b);
}

/** Checks a bit width option with a default. */
export function checkBits(param: string, value: unknown, fallback: number, min: number, max: number): number {
  return value === undefined ? fallback : checkInteger(param, checkFinite(param, value), { min, max });
}

/**
 * The options rule of every public function ({@link checkOptions} from core): an unknown key is
 * `unknown-option` naming the closest known key (as `options.<key>`); a required key that is
 * absent is `missing-option` with `param` the key itself, like every other check of that option.
 */
export function readOptions(
  value: unknown,
  keys: { readonly known: readonly string[]; readonly required?: readonly string[] },
): Record<string, unknown> {
  const o = checkOptions('options', value, { known: keys.known });
  for (const key of keys.required ?? []) requireOption(key, o[key]);
  return o;
}
