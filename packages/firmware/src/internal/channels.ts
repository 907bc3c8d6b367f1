/**
 * Checks and normalises the emitters' options: one model of the channels for the C and JSON forms.
 */
import { BridgeworkError, checkInteger, checkObject, checkOneOf, formatValue } from '@bridgework/core';
import { cIdentifierFromName } from '../cIdentifierFromName.js';
import { evaluatorTypes, type EmitOptions, type EvaluatorType } from '../emitOptions.js';
import type { FixedPointMap } from '../fixedPointMap.js';
import type { AffineFloatMap, FloatMap, PolynomialFloatMap } from '../floatMap.js';
import { fixedPointRoundings, roundShiftUnchecked } from '../roundShift.js';
import { CODE_LIMITS } from './codes.js';
import { checkQuantityUnit } from './text.js';

export interface EmittedChannel {
  readonly name: string;
  readonly identifier: string;
  readonly quantityUnit: string;
  readonly codeMin: number;
  readonly codeMax: number;
  readonly fixed: FixedPointMap | undefined;
  readonly float32: FloatMap | undefined;
  readonly float64: FloatMap | undefined;
}

export interface EmitModel {
  readonly prefix: string;
  readonly channels: readonly EmittedChannel[];
}

const PREFIX = /^[a-z][a-z0-9]*(?:_[a-z0-9]+)*$/;

function checkPrefix(value: unknown): string {
  if (value === undefined) return 'bridgework';
  if (typeof value !== 'string' || !PREFIX.test(value) || value.length > 24) {
    throw new BridgeworkError(
      'invalid-option',
      `\`prefix\` must be lower-case words of [a-z0-9] joined by single '_', starting with a letter, at most 24 characters; got ${formatValue(value)}`,
      { param: 'prefix', value },
    );
  }
  return value;
}

function checkTypes(value: unknown): readonly EvaluatorType[] | undefined {
  if (value === undefined) return undefined;
  if (!Array.isArray(value) || value.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`types\` must be a non-empty array; got ${formatValue(value)}`,
      {
        param: 'types',
        value,
      },
    );
  }
  const types = value.map((t: unknown, i: number) => checkOneOf(`types[${i}]`, t, evaluatorTypes));
  if (new Set(types).size !== types.length) {
    throw new BridgeworkError('invalid-option', '`types` must not repeat a type', { param: 'types', value });
  }
  return evaluatorTypes.filter((t) => types.includes(t));
}

function fail(
  code: 'invalid-option' | 'wrong-type' | 'overflow',
  param: string,
  message: string,
  value: unknown,
): never {
  throw new BridgeworkError(code, `\`${param}\` ${message}`, { param, value });
}

/** Re-checks a fixed-point map's constants and its overflow proof (it may have been edited). */
function checkFixed(param: string, value: unknown): FixedPointMap {
  const m = checkObject(param, value) as unknown as FixedPointMap;
  const int = (key: string, min: number, max: number) =>
    checkInteger(`${param}.${key}`, (m as unknown as Record<string, unknown>)[key], { min, max });
  const cb = int('coefficientBits', 2, 32);
  const ab = int('accumulatorBits', 8, 64);
  const ob = int('outputBits', 2, 32);
  const codeMin = int('codeMin', CODE_LIMITS.min, CODE_LIMITS.max);
  const codeMax = int('codeMax', codeMin, CODE_LIMITS.max);
  const shift = int('shift', 0, ab - 2);
  const coefLimit = 2 ** (cb - 1) - 1;
  const multiplier = int('multiplier', -coefLimit, coefLimit);
  const offsetCode = int('offsetCode', -Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER);
  const bias = int('bias', -Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER);
  const rounding = checkOneOf(`${param}.rounding`, m.rounding, fixedPointRoundings);
  checkQuantityUnit(m.quantityUnit, `${param}.quantityUnit`);
  const limit = (1n << BigInt(ab - 1)) - 1n;
  const half = shift > 0 && rounding !== 'floor' ? 1n << BigInt(shift - 1) : 0n;
  const outLimit = 1n << BigInt(ob - 1);
  for (const code of [codeMin, codeMax]) {
    const d = BigInt(code) - BigInt(offsetCode);
    const product = d * BigInt(multiplier);
    const acc = product + BigInt(bias);
    const extremes = [d, BigInt(multiplier), BigInt(bias), product, acc - half, acc + half];
    if (extremes.some((v) => v > limit || v < -limit)) {
      fail(
        'overflow',
        `${param}`,
        `must keep the accumulator within ±${limit} at code ${code}; it overflows`,
        value,
      );
    }
    const y = roundShiftUnchecked(acc, BigInt(shift), rounding);
    if (y < -outLimit || y >= outLimit) {
      fail(
        'overflow',
        `${param}`,
        `must keep the output within ${ob} bits at code ${code}; it overflows`,
        value,
      );
    }
  }
  return m;
}

/** Re-checks a float map's constants: the right precision, finite and representable. */
function checkFloat(param: string, value: unknown, precision: 'float32' | 'float64'): FloatMap {
  const m = checkObject(param, value) as unknown as FloatMap;
  if (m.precision !== precision) {
    fail(
      'invalid-option',
      `${param}.precision`,
      `must be '${precision}'; got ${formatValue(m.precision)}`,
      m.precision,
    );
  }
  const kind = checkOneOf(`${param}.kind`, m.kind, ['affine', 'polynomial'] as const);
  const constants: unknown =
    kind === 'affine' ? [(m as AffineFloatMap).scale] : (m as PolynomialFloatMap).coefficients;
  if (!Array.isArray(constants) || constants.length === 0) {
    fail('wrong-type', `${param}.coefficients`, 'must be a non-empty array of numbers', constants);
  }
  for (const v of [m.offset, ...(constants as unknown[])]) {
    const ok =
      typeof v === 'number' && Number.isFinite(v) && (precision === 'float64' || Math.fround(v) === v);
    if (!ok)
      fail('invalid-option', param, `must hold finite ${precision} constants; got ${formatValue(v)}`, v);
  }
  checkQuantityUnit(m.quantityUnit, `${param}.quantityUnit`);
  checkInteger(`${param}.codeMin`, m.codeMin, CODE_LIMITS);
  checkInteger(`${param}.codeMax`, m.codeMax, { min: m.codeMin, max: CODE_LIMITS.max });
  return m;
}

/** Checks the emitters' options and returns the channels to write. */
export function emitModel(options: EmitOptions): EmitModel {
  const o = checkObject('options', options);
  const prefix = checkPrefix(o['prefix']);
  const types = checkTypes(o['types']);
  const list = o['channels'];
  if (!Array.isArray(list) || list.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`channels\` must be a non-empty array; got ${formatValue(list)}`,
      {
        param: 'channels',
        value: list,
      },
    );
  }
  const seen = new Map<string, number>();
  const channels = list.map((entry: unknown, i: number): EmittedChannel => {
    const p = `channels[${i}]`;
    const ch = checkObject(p, entry);
    const name = ch['name'];
    const identifier = cIdentifierFromName(name as string, `${p}.name`);
    const previous = seen.get(identifier);
    if (previous !== undefined) {
      throw new BridgeworkError(
        'conflicting-options',
        `\`${p}.name\` must give an identifier distinct from channels[${previous}]; both give '${identifier}'`,
        { param: `${p}.name`, value: name },
      );
    }
    seen.set(identifier, i);
    const wanted = types ?? evaluatorTypes.filter((t) => ch[t] !== undefined);
    if (wanted.length === 0) {
      throw new BridgeworkError(
        'missing-option',
        `\`${p}\` must carry at least one of fixed, float32, float64`,
        {
          param: p,
        },
      );
    }
    for (const t of wanted) {
      if (ch[t] === undefined) {
        throw new BridgeworkError('missing-option', `\`${p}.${t}\` must be given: \`types\` asks for it`, {
          param: `${p}.${t}`,
        });
      }
    }
    const fixed = wanted.includes('fixed') ? checkFixed(`${p}.fixed`, ch['fixed']) : undefined;
    const float32 = wanted.includes('float32')
      ? checkFloat(`${p}.float32`, ch['float32'], 'float32')
      : undefined;
    const float64 = wanted.includes('float64')
      ? checkFloat(`${p}.float64`, ch['float64'], 'float64')
      : undefined;
    const maps = [fixed, float32, float64].filter((m) => m !== undefined);
    const first = maps[0] as FixedPointMap | FloatMap;
    for (const m of maps) {
      if (
        m.codeMin !== first.codeMin ||
        m.codeMax !== first.codeMax ||
        m.quantityUnit !== first.quantityUnit
      ) {
        throw new BridgeworkError(
          'conflicting-options',
          `\`${p}\` must hold maps of one code range and one quantity unit`,
          { param: p },
        );
      }
    }
    return {
      name: name as string,
      identifier,
      quantityUnit: first.quantityUnit,
      codeMin: first.codeMin,
      codeMax: first.codeMax,
      fixed,
      float32,
      float64,
    };
  });
  return { prefix, channels };
}
