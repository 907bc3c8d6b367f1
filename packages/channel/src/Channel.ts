import type { Interval } from '@bridgework/core';
import type { Adc } from '@bridgework/chain';
import type { ConversionResult, ConvertOptions } from './convert/ConversionStatus.js';
import type { SensorCurve } from './kinds/SensorKind.js';
import type { DisplayUnit, OutputQuantity } from './outputQuantities.js';
import type { ValidChannelSpec } from './spec/ChannelSpec.js';

/** Codes accepted by the converters: integer codes, or codes already averaged to non-integers. */
export type CodeBuffer = Int32Array | Float64Array;

/** The coefficients of a Möbius (linear-fractional) map y = (a·x + b)/(c·x + d). */
export interface MobiusCoefficients {
  /** a. */
  readonly a: number;
  /** b. */
  readonly b: number;
  /** c. */
  readonly c: number;
  /** d. */
  readonly d: number;
}

/**
 * The structure of a channel's code → value map, for fast kernels and for emitters (SQL,
 * firmware) that must reproduce `convert`:
 *
 * - `'mobius'`: `convert` computes `(a·x + b)/(c·x + d)` per code x with exactly these
 *   coefficients, in this order of operations (multiply, add, multiply, add, divide);
 * - `'resistance-curve'`: the sensor's resistance is `(a·x + b)/(c·x + d)` Ω, and the value is the
 *   sensor curve's temperature at that resistance (compensation `createRtd`,
 *   `createBetaThermistor`, `createSteinhartHartThermistor` `temperatureAt`), in `unit`;
 * - `'exact'`: no closed structure (a quadratic bridge, self-heating): the exact composed map.
 *
 * Codes outside `validCodes` (open interval) convert to NaN.
 */
export type ChannelMap =
  | {
      /** One Möbius function of the code. */
      readonly form: 'mobius';
      /** Its coefficients. */
      readonly coefficients: MobiusCoefficients;
      /** Codes that convert (open interval). */
      readonly validCodes: Interval;
    }
  | {
      /** A Möbius map to the sensor's resistance, then the sensor's curve. */
      readonly form: 'resistance-curve';
      /** Resistance in Ω as a Möbius function of the code. */
      readonly resistance: MobiusCoefficients;
      /** The curve resistance → temperature, with its coefficients. */
      readonly curve: SensorCurve;
      /** The unit of the value (`'°C'`, `'K'`, `'°F'`). */
      readonly unit: string;
      /** Codes that convert (open interval). */
      readonly validCodes: Interval;
    }
  | {
      /** The exact composed map per code. */
      readonly form: 'exact';
      /** Codes that convert (open interval). */
      readonly validCodes: Interval;
    };

/** What the converter sees for a quantity (see `Channel.inputAt`). */
export interface ChannelInput {
  /** The quantity, in the channel's unit. */
  readonly quantity: number;
  /** The bridge's output ratio Vout/Vexc at its sense terminals, V/V (before polarity and offset). */
  readonly bridgeRatio: number;
  /** The voltage at the amplifier's input, polarity and input-referred offset applied, V. */
  readonly inputVolts: number;
  /** `inputVolts` as a fraction of the excitation, V/V (what the converter reads, ratiometrically). */
  readonly inputRatio: number;
  /** The voltage at the converter's input (gain applied), V. */
  readonly converterVolts: number;
  /** The exact (fractional, unrounded) converter code. */
  readonly code: number;
  /** The code the converter gives (nearest, ties to even, clipped to the rails). */
  readonly nearestCode: number;
  /** Whether that code is at or beyond a rail. */
  readonly clipped: boolean;
}

/** A channel's exact map sampled over its span (see `Channel.curve`). */
export interface ChannelCurve {
  /** Converter codes (fractional), evenly spaced from the span's lower to its upper end. */
  readonly codes: Float64Array;
  /** The exact quantity at each code, in the channel's unit. */
  readonly quantity: Float64Array;
  /** The converter's input at each code as a fraction of the excitation, V/V (polarity and offset applied). */
  readonly inputRatio: Float64Array;
  /** Exact quantity minus the terminal line through the span's ends, in the channel's unit. */
  readonly nonlinearity: Float64Array;
  /** The (fractional) codes of the span's lower and upper ends. */
  readonly spanCodes: readonly [number, number];
}

/**
 * A transformer for a WHATWG `TransformStream`: `new TransformStream(channel.transformer())`
 * converts each chunk of codes (see `Channel.convert`). Declared structurally, so the package's
 * types need no DOM or Node stream types.
 */
export interface ConversionTransformer<R> {
  /**
   * Converts one chunk and enqueues the result.
   *
   * @param chunk - The codes.
   * @param controller - The stream's controller.
   */
  transform(chunk: CodeBuffer, controller: { enqueue(result: R): void }): void;
}

/** One measurement channel (see {@link createChannel}). */
export interface Channel {
  /** The channel's name. */
  readonly name: string;
  /** The validated spec with every default applied. */
  readonly spec: ValidChannelSpec;
  /** The sensor kind (`sensor.kind`). */
  readonly kind: string;
  /** The sensor and bridge in one line of words, for reports. */
  readonly description: string;
  /** The output quantity. */
  readonly quantity: OutputQuantity;
  /** The unit of every value the channel takes or gives (`output.unit`, or the quantity's SI unit). */
  readonly unit: string;
  /** The unit people read the quantity in (`output.unit` when given, else chosen by the span's magnitude). */
  readonly display: DisplayUnit;
  /** The converter model at the nominal parameters (chain). */
  readonly adc: Adc;
  /** Codes that convert: the open interval inside the rails whose readings the sensor can produce. */
  readonly validCodes: Interval;
  /** The span of interest in the channel's unit (`output.range`, or the default the channel can read). */
  readonly span: Interval;
  /** The exact (fractional) codes of the span's ends, lower code first. */
  readonly spanCodes: Interval;
  /**
   * How `convert` works: `'kernel'` (a closed form checked against the exact map within 1e-12 of
   * its largest value: one Möbius division per sample, or for a full-bending-poisson bridge the
   * root of a quadratic; for a map with a pole just beyond the valid codes, the codes nearest the
   * pole take the exact map) or `'exact'` (the sensor's curve or the exact map per sample).
   */
  readonly method: 'kernel' | 'exact';
  /** The map's structure and coefficients (see {@link ChannelMap}). */
  readonly map: ChannelMap;
  /**
   * The exact quantity for a converter code.
   *
   * @param code - A code strictly inside `validCodes` (averaged, fractional codes are accepted).
   * @returns The quantity in the channel's unit.
   * @throws {@link @bridgework/core!BridgeworkError} `clipped` at or beyond the rails; `ratio-out-of-range`
   *   for a code whose reading the sensor cannot produce; `not-finite`, `wrong-type`.
   */
  quantityFromCode(code: number): number;
  /**
   * The code the converter gives for a quantity (nearest code, ties to even; clipped to the rails).
   *
   * @param quantity - In the channel's unit, inside what the sensor can reach.
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` or `ratio-out-of-range` for a quantity
   *   the sensor cannot reach; `not-finite`, `wrong-type`.
   */
  codeFromQuantity(quantity: number): number;
  /**
   * The exact (fractional, unrounded, unclipped) code of a quantity: the inverse of `quantityFromCode`.
   *
   * @param quantity - In the channel's unit.
   * @throws {@link @bridgework/core!BridgeworkError} as `codeFromQuantity`.
   */
  exactCodeFromQuantity(quantity: number): number;
  /**
   * What the converter sees for a quantity: bridge ratio, amplifier input, converter input and
   * code, with polarity and offset applied.
   *
   * @param quantity - In the channel's unit.
   * @throws {@link @bridgework/core!BridgeworkError} as `codeFromQuantity`.
   */
  inputAt(quantity: number): ChannelInput;
  /**
   * The exact map sampled over the span: `points` codes evenly spaced between the span's ends.
   *
   * @param points - Number of points, an integer in [11, 10001]. Default 201.
   * @throws {@link @bridgework/core!BridgeworkError} `not-integer`, `out-of-range`, `wrong-type` for `points`.
   */
  curve(points?: number): ChannelCurve;
  /** What the converter sees at the span's ends (and at zero, when zero lies inside the span), in ascending quantity. */
  operatingPoints(): readonly ChannelInput[];
  /**
   * Converts a buffer of codes to quantities. Codes at or beyond the rails, or whose reading the
   * sensor cannot produce, become NaN and are counted and located in the status (or throw with
   * `onInvalid: 'throw'`). No allocation per sample.
   *
   * @param codes - Codes (Int32Array, or Float64Array of possibly averaged codes).
   * @param out - Output buffer of at least `codes.length` (default: a new one).
   * @param options - Block temperature, invalid-code policy, how many locations to record.
   * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for a short `out`; `clipped` under
   *   the `'throw'` policy; `unknown-option`, `invalid-option`, `wrong-type`, `out-of-range` for options.
   */
  convert(codes: CodeBuffer, out?: Float64Array, options?: ConvertOptions): ConversionResult;
  /**
   * A transformer for `new TransformStream(...)` that converts each chunk like `convert`.
   *
   * @param options - As for `convert`, applied to every chunk (checked now).
   */
  transformer(options?: ConvertOptions): ConversionTransformer<ConversionResult>;
}
