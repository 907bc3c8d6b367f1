import type { EmitOptions } from './emitOptions.js';
import { FIRMWARE_CAUTION } from './emitCHeader.js';
import type { FixedPointMap } from './fixedPointMap.js';
import type { FloatMap } from './floatMap.js';
import { emitModel } from './internal/channels.js';
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
    ...(m.totalError === undefined ? {} : { totalError: m.totalError }),
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
    ...(m.totalError === undefined ? {} : { totalError: m.totalError }),
    source: m.source,
  };
}

/**
 * Writes the same constants as {@link emitCHeader} as JSON, for apps and test rigs.
 *
 * @remarks
 * One object: `generator`, `caution`, `prefix`, and `channels`, each with `name` (as given),
 * `identifier`, `quantityUnit`, `codeMin`, `codeMax` and one entry per evaluator type (`fixed`,
 * `float32`, `float64`) holding the C function name, the constants, the bounds, the verification
 * record and the exact source values. Float constants are JSON numbers (the shortest round-trip
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
        ...(c.fixed === undefined ? {} : { fixed: fixedJson(`${base}_fixed`, c.fixed) }),
        ...(c.float32 === undefined ? {} : { float32: floatJson(`${base}_f32`, c.float32) }),
        ...(c.float64 === undefined ? {} : { float64: floatJson(`${base}_f64`, c.float64) }),
      };
    }),
  };
  return `${JSON.stringify(out, null, 2)}\n`;
}
