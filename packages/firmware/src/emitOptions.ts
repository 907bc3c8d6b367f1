import type { cIdentifierFromName } from './cIdentifierFromName.js';
import type { FirmwareFixedMap, FirmwareFloatMap } from './firmwareCost.js';
import type { fixedPiecewiseMap } from './fixedPiecewiseMap.js';
import type { fixedPointMap } from './fixedPointMap.js';
import type { floatMap } from './floatMap.js';
import type { floatMobiusMap } from './floatMobiusMap.js';
import type { floatPiecewiseMap } from './floatPiecewiseMap.js';
import type { ReferenceError, TestVector, TotalErrors } from './totalError.js';

/** Which evaluator of a channel an emitter writes: fixed-point, float32 or float64. */
export type EvaluatorType = 'fixed' | 'float32' | 'float64';

/** Every {@link EvaluatorType}, in the order the emitters write them. */
export const evaluatorTypes: readonly EvaluatorType[] = ['fixed', 'float32', 'float64'];

/**
 * One measurement channel's maps, to be emitted together under one name: made by
 * {@link designFirmwareConstants} (with total errors and test vectors), or assembled by hand from
 * the map builders (then the emitters state each map's arithmetic error against its own defining
 * formula, and no total error).
 */
export interface FirmwareChannel {
  /**
   * The channel's name, any text (e.g. `'Hopper 2 weight'`); the emitted identifiers are made from it
   * by {@link cIdentifierFromName}, and comments show it sanitised, so no name can break the code.
   */
  readonly name: string;
  /** The fixed-point map, from {@link fixedPointMap} or {@link fixedPiecewiseMap}. */
  readonly fixed?: FirmwareFixedMap;
  /** The float32 map, from {@link floatMap}, {@link floatPiecewiseMap} or {@link floatMobiusMap}. */
  readonly float32?: FirmwareFloatMap;
  /** The float64 map, likewise with `precision: 'float64'`. */
  readonly float64?: FirmwareFloatMap;
  /** Each map's total error against the exact map (from {@link designFirmwareConstants}). */
  readonly totals?: TotalErrors;
  /** The exact map's own stated error (from {@link designFirmwareConstants}). */
  readonly reference?: ReferenceError;
  /** The total error the maps were designed to meet, quantity unit. */
  readonly targetError?: number;
  /** Codes with the expected result of every map, for firmware tests. */
  readonly testVectors?: readonly TestVector[];
}

/** Options of {@link emitCHeader} and {@link emitJson}. */
export interface EmitOptions {
  /** The channels, at least one; names must stay distinct after sanitising. */
  readonly channels: readonly FirmwareChannel[];
  /**
   * Lower-case prefix of every emitted name (`[a-z][a-z0-9]*` words joined by single `_`, at most 24
   * characters): functions are `<prefix>_<channel>_fixed`, macros `<PREFIX>_<CHANNEL>_MULTIPLIER`.
   * Default `'bridgework'`.
   */
  readonly prefix?: string;
  /**
   * Which evaluators to write. Default: every map each channel carries. When given, every channel
   * must carry each listed type (for example `['fixed', 'float32']` for a Cortex-M4F, whose FPU
   * has no double precision).
   */
  readonly types?: readonly EvaluatorType[];
}
