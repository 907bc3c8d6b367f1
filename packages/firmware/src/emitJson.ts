import type { EmitOptions, EvaluatorType } from './emitOptions.js';
import { FIRMWARE_CAUTION } from './emitCHeader.js';
import {
  firmwareCost,
  type FirmwareCost,
  type FirmwareFixedMap,
  type FirmwareFloatMap,
} from './firmwareCost.js';
import type { FixedPiecewiseMap } from './fixedPiecewiseMap.js';
import type { FixedPointMap } from './fixedPointMap.js';
import type { FloatMap } from './floatMap.js';
import type { FloatMobiusMap } from './floatMobiusMap.js';
import type { FloatPiecewiseMap } from './floatPiecewiseMap.js';
import { emitModel, type EmittedChannel } from './internal/channels.js';
import type { TotalErrorBound } from './totalError.js';
import { FIRMWARE_GENERATOR_VERSION } from './version.js';

const bytes = new DataView(new ArrayBuffer(8));

/** The IEEE 754 bit pattern of a float constant, as hex (`0x…`), so apps can check it exactly. */
function bitsOf(value: number, f32: boolean): string {
  if (f32) {
    bytes.setFloat32(0, value);
    return `0x${bytes.getUint32(0).toString(16).padStart(8, '0')}`;
  }
  bytes.setFloat64(0, value);
  return `0x${bytes.getBigUint64(0).toString(16).padStart(16, '0')}`;
}

function fixedJson(fn: string, m: FixedPointMap): Record<string, unknown> {
  return {
    function: fn,
    kind: m.kind,
    offsetCode: m.offsetCode,
    multiplier: m.multiplier,
    shift: m.shift,
    bias: m.bias,
    rounding: m.rounding,
    coefficientBits: m.coefficientBits,
    accumulatorBits: m.accumulatorBits,
    outputBits: m.outputBits,
    qFormat: m.qFormat.text,
    outputUnit: m.source.outputUnit,
    outputRange: m.outputRange,
    accumulatorRange: { min: String(m.accumulatorRange.min), max: String(m.accumulatorRange.max) },
    accumulatorLimit: String(m.accumulatorLimit),
    coefficientError: m.coefficientError,
    errorUnit: 'output LSB',
    maxAbsError: m.maxAbsError,
    errorBound: m.errorBound,
    verification: m.verification,
    source: m.source,
  };
}

function fixedPiecewiseJson(fn: string, m: FixedPiecewiseMap): Record<string, unknown> {
  return {
    function: fn,
    kind: m.kind,
    outputUnit: m.outputUnit,
    segmentBase: m.segmentBase,
    segmentBits: m.segmentBits,
    segmentCount: m.segmentCount,
    degree: m.degree,
    coefficientBits: m.coefficientBits,
    accumulatorBits: m.accumulatorBits,
    rounding: m.rounding,
    segments: m.segments.map((s) => ({
      coefficients: s.coefficients,
      fractionBits: s.fractionBits,
      shifts: s.shifts,
      arithmeticBound: s.arithmeticBound,
      accumulatorBound: s.accumulatorBound,
    })),
    errorUnit: 'output LSB',
    arithmeticBound: m.arithmeticBound,
    accumulatorBound: m.accumulatorBound,
    outputRange: m.outputRange,
    polynomial: m.polynomial,
  };
}

function floatPiecewiseJson(fn: string, m: FloatPiecewiseMap): Record<string, unknown> {
  const f32 = m.precision === 'float32';
  return {
    function: fn,
    kind: m.kind,
    segmentBase: m.segmentBase,
    segmentBits: m.segmentBits,
    segmentCount: m.segmentCount,
    degree: m.degree,
    coefficients: m.coefficients,
    coefficientsHex: m.coefficients.map((row) => row.map((c) => bitsOf(c, f32))),
    errorUnit: 'quantity unit',
    arithmeticBound: m.arithmeticBound,
    polynomial: m.polynomial,
  };
}

function mobiusJson(fn: string, m: FloatMobiusMap): Record<string, unknown> {
  const f32 = m.precision === 'float32';
  return {
    function: fn,
    kind: m.kind,
    centre: m.centre,
    a: m.a,
    b: m.b,
    c: m.c,
    hex: { a: bitsOf(m.a, f32), b: bitsOf(m.b, f32), c: bitsOf(m.c, f32) },
    errorUnit: 'quantity unit',
    arithmeticBound: m.arithmeticBound,
    source: m.source,
  };
}

function floatJson(fn: string, m: FloatMap): Record<string, unknown> {
  const f32 = m.precision === 'float32';
  const constants =
    m.kind === 'affine'
      ? { scale: m.scale, scaleHex: bitsOf(m.scale, f32) }
      : { coefficients: m.coefficients, coefficientsHex: m.coefficients.map((c) => bitsOf(c, f32)) };
  return {
    function: fn,
    kind: m.kind,
    offset: m.offset,
    offsetHex: bitsOf(m.offset, f32),
    ...constants,
    errorUnit: 'quantity unit',
    maxAbsError: m.maxAbsError,
    errorBound: m.errorBound,
    verification: m.verification,
    source: m.source,
  };
}

/** One function's entry: its constants, its total error when stated, and its cost. */
function functionJson(
  ch: EmittedChannel,
  type: EvaluatorType,
  fn: string,
): Record<string, unknown> | undefined {
  const map = ch[type];
  if (map === undefined) return undefined;
  let body: Record<string, unknown>;
  if (type === 'fixed') {
    const m = map as FirmwareFixedMap;
    body = m.kind === 'affine' ? fixedJson(fn, m) : fixedPiecewiseJson(fn, m);
  } else {
    const m = map as FirmwareFloatMap;
    body =
      m.kind === 'piecewise-polynomial'
        ? floatPiecewiseJson(fn, m)
        : m.kind === 'mobius'
          ? mobiusJson(fn, m)
          : floatJson(fn, m);
  }
  const total = ch.totals[type];
  return {
    ...body,
    totalError: total ?? null,
    cost: firmwareCost(map),
  };
}

/**
 * Writes the same constants as {@link emitCHeader} as JSON, for apps and test rigs.
 *
 * @remarks
 * One object: `generator`, `caution`, `prefix`, and `channels`, each with `name` (as given),
 * `identifier`, `quantityUnit`, `codeMin`, `codeMax`, the `targetError` and `referenceError` when
 * the channel was designed against an exact map, one entry per evaluator type (`fixed`, `float32`,
 * `float64`) holding the C function name, the form (`kind`), the constants and tables, the
 * arithmetic bounds, `totalError` (the {@link TotalErrorBound}, or null when no exact map was
 * given) and `cost` ({@link FirmwareCost}), and the `testVectors`. Float constants are JSON numbers (the shortest round-trip
 * form of the value, which parses back to the identical double) together with their IEEE 754 bit
 * patterns in hex; 64-bit accumulator figures are decimal strings, because they can exceed 2^53.
 * Deterministic: the same input gives the same text.
 *
 * @param options - Channels, prefix and evaluator types, as for {@link emitCHeader}.
 * @returns JSON text, two-space indented, ending with a newline.
 * @throws {@link @bridgework/core!BridgeworkError} the codes of {@link emitCHeader}.
 * @example
 * ```ts
 * const fixed = fixedPointMap({ scale: '50/2147483.648', outputUnit: '0.00001', codeMin: -8388608, codeMax: 8388607 });
 * JSON.parse(emitJson({ channels: [{ name: 'Weight', fixed }], prefix: 'hopper' })).channels[0].fixed.multiplier;
 * // 1250000000
 * ```
 */
export function emitJson(options: EmitOptions): string {
  const { prefix, channels } = emitModel(options);
  const out = {
    generator: `@bridgework/firmware ${FIRMWARE_GENERATOR_VERSION}`,
    caution: FIRMWARE_CAUTION,
    prefix,
    channels: channels.map((c) => {
      const base = `${prefix}_${c.identifier}`;
      return {
        name: c.name,
        identifier: c.identifier,
        quantityUnit: c.quantityUnit,
        codeMin: c.codeMin,
        codeMax: c.codeMax,
        ...(c.targetError === undefined ? {} : { targetError: c.targetError }),
        ...(c.reference === undefined ? {} : { referenceError: c.reference }),
        ...(c.fixed === undefined ? {} : { fixed: functionJson(c, 'fixed', `${base}_fixed`) }),
        ...(c.float32 === undefined ? {} : { float32: functionJson(c, 'float32', `${base}_f32`) }),
        ...(c.float64 === undefined ? {} : { float64: functionJson(c, 'float64', `${base}_f64`) }),
        ...(c.testVectors.length === 0 ? {} : { testVectors: c.testVectors }),
      };
    }),
  };
  return `${JSON.stringify(out, null, 2)}\n`;
}
