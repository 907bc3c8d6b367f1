/**
 * Checks and normalises the emitters' options: one model of the channels for the C and JSON forms.
 */
import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkObject,
  checkOneOf,
  checkOptions,
  formatValue,
} from '@bridgework/core';
import { cIdentifierFromName } from '../cIdentifierFromName.js';
import { evaluatorTypes, type EmitOptions, type EvaluatorType } from '../emitOptions.js';
import type { FirmwareFixedMap, FirmwareFloatMap } from '../firmwareCost.js';
import { proveSegment, type FixedPiecewiseMap } from '../fixedPiecewiseMap.js';
import type { FixedPointMap } from '../fixedPointMap.js';
import type { AffineFloatMap, PolynomialFloatMap } from '../floatMap.js';
import type { FloatMobiusMap } from '../floatMobiusMap.js';
import type { FloatPiecewiseMap } from '../floatPiecewiseMap.js';
import { segmentCodesUnchecked } from '../piecewisePolynomial.js';
import { fixedPointRoundings, roundShiftUnchecked } from '../roundShift.js';
import type { ReferenceError, TestVector, TotalErrorBound, TotalErrors } from '../totalError.js';
import { CODE_LIMITS, readOptions } from './codes.js';
import { checkQuantityUnit } from './text.js';

export interface EmittedChannel {
  readonly name: string;
  readonly identifier: string;
  readonly quantityUnit: string;
  readonly codeMin: number;
  readonly codeMax: number;
  readonly fixed: FirmwareFixedMap | undefined;
  readonly float32: FirmwareFloatMap | undefined;
  readonly float64: FirmwareFloatMap | undefined;
  /** Total errors of the written maps (only those of written types). */
  readonly totals: TotalErrors;
  readonly reference: ReferenceError | undefined;
  readonly targetError: number | undefined;
  /** Test vectors (empty when none were given). */
  readonly testVectors: readonly TestVector[];
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
function checkFixed(param: string, value: unknown): FirmwareFixedMap {
  const any = checkObject(param, value);
  if (any['kind'] === 'piecewise-polynomial') return checkFixedPiecewise(param, value);
  checkOneOf(`${param}.kind`, any['kind'], ['affine', 'piecewise-polynomial'] as const);
  const m = any as unknown as FixedPointMap;
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

/** Checks a table of finite constants of a precision. */
function checkConstants(param: string, values: readonly unknown[], precision: 'float32' | 'float64'): void {
  for (const v of values) {
    const ok =
      typeof v === 'number' && Number.isFinite(v) && (precision === 'float64' || Math.fround(v) === v);
    if (!ok)
      fail('invalid-option', param, `must hold finite ${precision} constants; got ${formatValue(v)}`, v);
  }
}

/** Re-checks a fixed piecewise map: table shapes and the int32 proof of every segment. */
function checkFixedPiecewise(param: string, value: unknown): FixedPiecewiseMap {
  const m = value as FixedPiecewiseMap;
  checkLayout(param, m);
  const cb = checkInteger(`${param}.coefficientBits`, m.coefficientBits, { min: 8, max: 32 });
  checkQuantityUnit(m.quantityUnit, `${param}.quantityUnit`);
  if (!Array.isArray(m.segments) || m.segments.length !== m.segmentCount) {
    fail('invalid-option', `${param}.segments`, `must hold ${m.segmentCount} segments`, m.segments);
  }
  m.segments.forEach((seg, i) => {
    const p = `${param}.segments[${i}]`;
    const c = seg.coefficients;
    const sh = seg.shifts;
    if (!Array.isArray(c) || c.length !== m.degree + 1 || !Array.isArray(sh) || sh.length !== m.degree + 1) {
      fail('invalid-option', p, `must hold ${m.degree + 1} coefficients and shifts`, seg);
    }
    c.forEach((v, j) =>
      checkInteger(`${p}.coefficients[${j}]`, v, { min: -(2 ** 31) + 1, max: 2 ** 31 - 1 }),
    );
    sh.forEach((v, j) => checkInteger(`${p}.shifts[${j}]`, v, { min: 0, max: 30 }));
    const s = segmentCodesUnchecked(m, i);
    const T = BigInt(Math.max(Math.abs(s.first - s.centre), Math.abs(s.last - s.centre)));
    const proof = proveSegment(
      c.map((v) => BigInt(v)),
      sh.slice(0, m.degree),
      T,
      cb,
    );
    if (typeof proof === 'number') {
      fail('overflow', p, 'must keep every intermediate value within int32_t; it overflows', seg);
    }
  });
  return m;
}

/** Checks the segmentation fields shared by piecewise maps. */
function checkLayout(param: string, m: FixedPiecewiseMap | FloatPiecewiseMap): void {
  const codeMin = checkInteger(`${param}.codeMin`, m.codeMin, CODE_LIMITS);
  const codeMax = checkInteger(`${param}.codeMax`, m.codeMax, { min: codeMin, max: CODE_LIMITS.max });
  const bits = checkInteger(`${param}.segmentBits`, m.segmentBits, { min: 1, max: 31 });
  const base = checkInteger(`${param}.segmentBase`, m.segmentBase, {
    min: Math.max(CODE_LIMITS.min, codeMin - 2 ** bits + 1),
    max: codeMin,
  });
  const count = Math.floor((codeMax - base) / 2 ** bits) + 1;
  checkInteger(`${param}.segmentCount`, m.segmentCount, { min: count, max: count });
  checkInteger(`${param}.degree`, m.degree, { min: 0, max: 5 });
}

/** Re-checks a float map's constants: the right precision, finite and representable. */
function checkFloat(param: string, value: unknown, precision: 'float32' | 'float64'): FirmwareFloatMap {
  const m = checkObject(param, value) as unknown as FirmwareFloatMap;
  if (m.precision !== precision) {
    fail(
      'invalid-option',
      `${param}.precision`,
      `must be '${precision}'; got ${formatValue(m.precision)}`,
      m.precision,
    );
  }
  const kind = checkOneOf(`${param}.kind`, m.kind, [
    'affine',
    'polynomial',
    'piecewise-polynomial',
    'mobius',
  ] as const);
  if (kind === 'piecewise-polynomial') {
    const pm = m as FloatPiecewiseMap;
    checkLayout(param, pm);
    if (!Array.isArray(pm.coefficients) || pm.coefficients.length !== pm.segmentCount) {
      fail(
        'invalid-option',
        `${param}.coefficients`,
        `must hold ${pm.segmentCount} segments`,
        pm.coefficients,
      );
    }
    pm.coefficients.forEach((row, i) => {
      if (!Array.isArray(row) || row.length !== pm.degree + 1) {
        fail('invalid-option', `${param}.coefficients[${i}]`, `must hold ${pm.degree + 1} numbers`, row);
      }
      checkConstants(`${param}.coefficients[${i}]`, row, precision);
    });
  } else if (kind === 'mobius') {
    const mm = m as FloatMobiusMap;
    checkConstants(param, [mm.a, mm.b, mm.c], precision);
    checkInteger(`${param}.centre`, mm.centre, { min: m.codeMin, max: m.codeMax });
  } else {
    const fm = m as AffineFloatMap | PolynomialFloatMap;
    const constants: unknown = fm.kind === 'affine' ? [fm.scale] : fm.coefficients;
    if (!Array.isArray(constants) || constants.length === 0) {
      fail('wrong-type', `${param}.coefficients`, 'must be a non-empty array of numbers', constants);
    }
    checkConstants(param, [fm.offset, ...(constants as unknown[])], precision);
  }
  checkQuantityUnit(m.quantityUnit, `${param}.quantityUnit`);
  checkInteger(`${param}.codeMin`, m.codeMin, CODE_LIMITS);
  checkInteger(`${param}.codeMax`, m.codeMax, { min: m.codeMin, max: CODE_LIMITS.max });
  return m;
}

const TOTAL_KEYS = [
  'bound',
  'proved',
  'method',
  'codesChecked',
  'worstCode',
  'againstReference',
  'referenceError',
  'referenceErrorSource',
  'approximation',
  'arithmetic',
  'target',
];

/** Checks a total error record (it is written into headers as a promise). */
function checkTotal(param: string, value: unknown): TotalErrorBound {
  const t = checkOptions(param, value, { known: TOTAL_KEYS, required: TOTAL_KEYS });
  for (const key of [
    'bound',
    'againstReference',
    'referenceError',
    'approximation',
    'arithmetic',
    'target',
  ]) {
    const v = checkFinite(`${param}.${key}`, t[key]);
    if (v < 0) fail('invalid-option', `${param}.${key}`, `must be >= 0; got ${v}`, v);
  }
  if (typeof t['proved'] !== 'boolean')
    fail('wrong-type', `${param}.proved`, 'must be true or false', t['proved']);
  checkOneOf(`${param}.method`, t['method'], ['exhaustive', 'sampled'] as const);
  if (t['proved'] === true && t['method'] !== 'exhaustive') {
    fail('invalid-option', `${param}.proved`, 'must be false for a sampled verification', t['proved']);
  }
  checkInteger(`${param}.codesChecked`, t['codesChecked'], { min: 1, max: 2 ** 32 });
  checkInteger(`${param}.worstCode`, t['worstCode'], CODE_LIMITS);
  if (typeof t['referenceErrorSource'] !== 'string') {
    fail('wrong-type', `${param}.referenceErrorSource`, 'must be a string', t['referenceErrorSource']);
  }
  return t as unknown as TotalErrorBound;
}

/** Checks test vectors against the maps written. */
function checkVectors(
  param: string,
  value: unknown,
  wanted: readonly EvaluatorType[],
): readonly TestVector[] {
  if (value === undefined) return [];
  if (!Array.isArray(value)) fail('wrong-type', param, 'must be an array of test vectors', value);
  return (value as unknown[]).map((v, i) => {
    const p = `${param}[${i}]`;
    const o = checkOptions(p, v, {
      known: ['code', 'reason', 'exact', 'fixed', 'float32', 'float64'],
      required: ['code', 'reason', 'exact'],
    });
    checkInteger(`${p}.code`, o['code'], CODE_LIMITS);
    checkOneOf(`${p}.reason`, o['reason'], ['rail', 'segment-edge', 'worst-error', 'spread'] as const);
    checkFinite(`${p}.exact`, o['exact']);
    for (const t of wanted) checkFinite(`${p}.${t}`, o[t]);
    return o as unknown as TestVector;
  });
}

/** Checks the emitters' options and returns the channels to write. */
export function emitModel(options: EmitOptions): EmitModel {
  const o = readOptions(options, { known: ['channels', 'prefix', 'types'], required: ['channels'] });
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
    const ch = checkOptions(p, entry, {
      known: ['name', 'fixed', 'float32', 'float64', 'totals', 'reference', 'targetError', 'testVectors'],
      required: ['name'],
    });
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
    const first = maps[0] as FirmwareFixedMap | FirmwareFloatMap;
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
    const totals: { -readonly [K in EvaluatorType]?: TotalErrorBound } = {};
    if (ch['totals'] !== undefined) {
      const given = checkOptions(`${p}.totals`, ch['totals'], { known: [...evaluatorTypes] });
      for (const t of wanted) {
        if (given[t] !== undefined) totals[t] = checkTotal(`${p}.totals.${t}`, given[t]);
      }
    }
    const reference =
      ch['reference'] === undefined
        ? undefined
        : (checkOptions(`${p}.reference`, ch['reference'], {
            known: ['bound', 'source'],
            required: ['bound', 'source'],
          }) as unknown as ReferenceError);
    const targetError =
      ch['targetError'] === undefined ? undefined : checkFinite(`${p}.targetError`, ch['targetError']);
    return {
      name: name as string,
      identifier,
      quantityUnit: first.quantityUnit,
      codeMin: first.codeMin,
      codeMax: first.codeMax,
      fixed,
      float32,
      float64,
      totals,
      reference,
      targetError,
      testVectors: checkVectors(`${p}.testVectors`, ch['testVectors'], wanted),
    };
  });
  return { prefix, channels };
}
