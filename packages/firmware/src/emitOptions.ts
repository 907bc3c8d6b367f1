import type { cIdentifierFromName } from './cIdentifierFromName.js';
import type { FixedPointMap, fixedPointMap } from './fixedPointMap.js';
import type { FloatMap, floatMap } from './floatMap.js';

/** Which evaluator of a channel an emitter writes: fixed-point, float32 or float64. */
export type EvaluatorType = 'fixed' | 'float32' | 'float64';

/** Every {@link EvaluatorType}, in the order the emitters write them. */
export const evaluatorTypes: readonly EvaluatorType[] = ['fixed', 'float32', 'float64'];

/** One measurement channel's maps, to be emitted together under one name. */
export interface FirmwareChannel {
  /**
   * The channel's name, any text (e.g. `'Hopper 2 weight'`); the emitted identifiers are made from it
   * by {@link cIdentifierFromName}, and comments show it sanitised, so no name can break the code.
   */
  readonly name: string;
  /** The fixed-point map, from {@link fixedPointMap}. */
  readonly fixed?: FixedPointMap;
  /** The float32 map, from {@link floatMap} with `precision: 'float32'`. */
  readonly float32?: FloatMap;
  /** The float64 map, from {@link floatMap} with `precision: 'float64'`. */
  readonly float64?: FloatMap;
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
