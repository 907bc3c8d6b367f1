/**
 * The contract of a sensor-kind module: everything the channel needs to know about one kind of
 * sensor, in one place. Adding a kind is its module, one line of the registry, and its tests.
 */
import type { ErrorCode, Interval, LeadWiring } from '@bridgework/core';
import type { BridgeSpan } from '@bridgework/chain';
import type { ChannelBudgetLine } from '../budget/ChannelBudgetLine.js';
import type { GaugePattern } from '@bridgework/bridge';
import type { OutputQuantity } from '../outputQuantities.js';
import type { Fields, ObjectOut, ParseContext } from '../spec/schema.js';
import type { CommonSpec } from '../spec/commonSpec.js';

/**
 * Indices of the model parameters every channel has, in the parameter vector a model is
 * evaluated with (a kind's own parameters follow from {@link KIND_PARAMETERS_START}).
 */
export const Parameter = {
  /** Excitation EMF, V. */
  excitationVolts: 0,
  /** Total gain. */
  gain: 1,
  /** Converter reference, V (ratiometric: ignored, the excitation is the reference). */
  referenceVolts: 2,
  /** Input-referred offset left after zeroing, V (nominal 0). */
  offsetVolts: 3,
  /** Completion resistance, Ω. */
  completionOhms: 4,
  /** Resistance of one lead, Ω. */
  ohmsPerLead: 5,
  /** Sensor temperature during the measurement, °C. */
  temperatureCelsius: 6,
} as const;

/** Where a kind's own parameters start in the parameter vector. */
export const KIND_PARAMETERS_START = 7;

/** Where the sensor sits in the bridge. */
export type SensorPlacement =
  /** Strain gauges in the arrangement named by `bridge.arrangement` (arms from the bridge package's table). */
  | 'arrangement'
  /** One resistive element in arm 1 of a quarter bridge, with completion resistors. */
  | 'arm-1'
  /** A transducer with its own full bridge (no completion resistors). */
  | 'own-bridge';

/** A parameter of a kind's model, with its nominal value from the spec. */
export interface KindParameter {
  /** Its name (`gaugeFactor`, `ratedOutputVoltsPerVolt`). */
  readonly key: string;
  /** The nominal value. */
  readonly nominal: number;
}

/** What a kind's maps are built from: the validated spec and what the channel resolved from it. */
export interface KindContext<S = Record<string, unknown>> {
  /** The validated sensor fragment (defaults applied). */
  readonly sensor: S;
  /** The whole validated spec. */
  readonly spec: CommonSpec;
  /** The strain arrangement (`'quarter'` for `'arm-1'` kinds; `undefined` for `'own-bridge'`). */
  readonly arrangement: string | undefined;
  /** The arms of the arrangement (the bridge package's table row). */
  readonly arms: readonly GaugePattern[];
  /** Poisson ratio of the specimen (`bridge.poissonRatio`), when given. */
  readonly poissonRatio: number | undefined;
  /** The lead wiring (defaults applied). */
  readonly wiring: LeadWiring;
  /** Resistance in series with the excitation that the ratio sees, Ω (0 with a ratiometric converter). */
  readonly sourceOhms: number;
  /** Sensor temperature when the zero was taken, °C. */
  readonly zeroTemperatureCelsius: number;
  /** The output quantity. */
  readonly quantity: OutputQuantity;
  /** The nominal parameter vector (common parameters, then the kind's own). */
  readonly nominal: Float64Array;
}

/**
 * The exact map of a kind at one parameter vector, composed from the packages that own each
 * stage: bridge ratio (Vout/Vexc at the sense terminals, polarity and offset removed) ↔ quantity
 * in the SI unit of the output quantity.
 */
export interface KindMap {
  /** The quantity for a bridge ratio; throws a `BridgeworkError` for a ratio the sensor cannot give. */
  quantityFromRatio(ratio: number): number;
  /** The bridge ratio for a quantity (exact inverse). */
  ratioFromQuantity(quantity: number): number;
  /** Ratios the sensor can produce (open interval). */
  readonly ratioRange: Interval;
  /** Whether the quantity is a linear-fractional (Möbius) function of the ratio. */
  readonly linearFractional: boolean;
  /** The span between two bridge ratios in the chain package's terms (strain on a bridge, or ratio on a transducer), for noise and headroom. */
  frontEndSpan(ratioMin: number, ratioMax: number): BridgeSpan;
  /**
   * The sensor's resistance as a function of the ratio and the quantity as a function of that
   * resistance, when the map factors so (RTDs, thermistors): lets a fast kernel use a Möbius map
   * for the first stage and the sensor's curve for the second.
   */
  readonly resistance?: {
    /** Sensor resistance for a ratio, Ω. */
    fromRatio(ratio: number): number;
    /** The curve that gives the quantity from the resistance, with its coefficients. */
    readonly curve: SensorCurve;
  };
}

/** A sensor curve (resistance → temperature) named with its coefficients, for kernels and emitters. */
export type SensorCurve =
  | {
      /** IEC 60751 Callendar–Van Dusen: R(t) = R0(1 + A·t + B·t² + C·(t − 100)·t³), C below 0 °C only. */
      readonly model: 'callendar-van-dusen';
      /** R0, Ω. */
      readonly r0Ohms: number;
      /** A, 1/°C. */
      readonly a: number;
      /** B, 1/°C². */
      readonly b: number;
      /** C, 1/°C⁴. */
      readonly c: number;
    }
  | {
      /** NTC beta model: 1/T = 1/T0 + ln(R/R0)/B (T in K). */
      readonly model: 'beta';
      /** R0 at t0, Ω. */
      readonly referenceOhms: number;
      /** t0, °C. */
      readonly referenceCelsius: number;
      /** B, K. */
      readonly betaKelvin: number;
    }
  | {
      /** Steinhart–Hart: 1/T = a + b·ln R + c·(ln R)³ (T in K, R in Ω). */
      readonly model: 'steinhart-hart';
      /** a, 1/K. */
      readonly a: number;
      /** b, 1/K. */
      readonly b: number;
      /** c, 1/K. */
      readonly c: number;
    };

/**
 * A kind's map as straight-line arithmetic of the parameter vector, for Monte Carlo: nothing is
 * built per evaluation. Checked by the channel against the exact map ({@link KindMap}).
 */
export interface FastKindMap {
  /**
   * The quantity (SI) for a bridge ratio under the parameters `p`.
   *
   * @param ratio - The bridge ratio, V/V.
   * @param zeroRatio - The bridge ratio of the zero reading under the same parameters, or NaN.
   * @param p - The parameter vector.
   */
  quantity(ratio: number, zeroRatio: number, p: Float64Array): number;
}

/** One uncertain input of a kind's budget. */
export interface KindBudgetInput {
  /** The line's name (`'gauge factor'`). */
  readonly name: string;
  /** Index in the parameter vector. */
  readonly index: number;
  /** Half-width of the rectangular limits (JCGM 100 4.3.7), in the parameter's unit (> 0 to count). */
  readonly halfWidth: number;
  /** Kind of line. */
  readonly kind: ChannelBudgetLine['kind'];
  /** The model in words (what varying this input means). */
  readonly model: string;
  /** List it before the channel's own inputs (the sensor's defining constant: gauge factor, rated output). Default false. */
  readonly first?: boolean;
}

/**
 * What a kind's budget holds of the sensor's own calibration (its tolerance, class or fitted
 * curve's uncertainty), or lacks: the design check `sensor-calibration`.
 */
export interface SensorCalibrationCheck {
  /** True when the budget holds it (a pass); false when it lacks it (a warning). */
  readonly holds: boolean;
  /** The figure the check reports (the tolerance, 0 when lacking), in `unit`. */
  readonly value: number;
  /** The figure's unit (`''` for a fraction). */
  readonly unit: string;
  /** What the budget holds, or what it lacks and how to fill it in, in the user's terms. */
  readonly message: string;
  /** The field to fill in (or the one that holds it). */
  readonly path: string;
}

/** A plausible range of an input, checked as a warning (a real design could go there). */
export interface PlausibleRange {
  /** Field path. */
  readonly path: string;
  /** The value. */
  readonly value: number;
  /** Plausible range, in the value's unit. */
  readonly range: Interval;
  /** The unit for the message. */
  readonly unit: string;
}

/** Reports a problem against a field path of the spec (`code` defaults to `'invalid-option'`). */
export type SpecReporter = (
  path: string,
  message: string,
  extra?: {
    readonly code?: ErrorCode;
    readonly suggestion?: string;
    readonly expected?: string;
    readonly limit?: string;
  },
) => void;

/**
 * The budget side of a sensor kind: what only `channelBudget` (and the constants, through it)
 * reads. Kept apart from {@link SensorKind} so that the conversion path does not carry it.
 *
 * @typeParam F - The fields of the kind's spec fragment.
 */
export interface SensorKindBudget<F extends Fields = Fields> {
  /** The map as straight-line arithmetic (for Monte Carlo), or undefined to use the exact map per trial. */
  fastMap?(context: KindContext<ObjectOut<F>>): FastKindMap;
  /** The kind's uncertain inputs at a budget point (a quantity in SI). */
  budgetInputs(context: KindContext<ObjectOut<F>>, atQuantity: number): readonly KindBudgetInput[];
  /** Informative budget lines of its own (self-heating, say). */
  budgetLines?(
    context: KindContext<ObjectOut<F>>,
    map: KindMap,
    atQuantity: number,
  ): readonly ChannelBudgetLine[];
  /** Inputs to check against plausible ranges (warnings). */
  plausibleRanges?(sensor: ObjectOut<F>): readonly PlausibleRange[];
  /**
   * What the budget holds of the sensor's own calibration, or lacks (the design check
   * `sensor-calibration`); undefined when no such input applies to this channel. Not asked for a
   * channel read as a bridge ratio, nor one calibrated against reference loads (whose fit holds it).
   */
  calibrationCheck?(sensor: ObjectOut<F>, spec: CommonSpec): SensorCalibrationCheck | undefined;
}

/**
 * A sensor-kind module.
 *
 * @typeParam F - The fields of its spec fragment (besides `kind`).
 * @typeParam N - Its name.
 */
export interface SensorKind<F extends Fields = Fields, N extends string = string> {
  /** The value of `sensor.kind`. */
  readonly name: N;
  /** One line for the field reference (a built-in kind's is in `spec/fieldDocs.ts`, under `sensor<name>`). */
  readonly doc?: string;
  /** The fields of `sensor` besides `kind` (defaults inside). */
  readonly fields: F;
  /** The output quantities it can give (besides `'ratio'`, which every kind gives). */
  readonly quantities: readonly OutputQuantity[];
  /** Where the sensor sits in the bridge. */
  readonly placement: SensorPlacement;
  /** Name of the budget line for the sensor temperature, when the map depends on it (else the temperature is not a budget input). */
  readonly temperatureLine: string | undefined;
  /** The kind's own model parameters in vector order, with their nominal values. */
  parameters(sensor: ObjectOut<F>): readonly KindParameter[];
  /** The sensor's nominal resistance, Ω (the default completion resistance; the bridge's noise source). */
  nominalOhms(sensor: ObjectOut<F>): number;
  /**
   * Fills in the fragment's `'derived'` fields (defaults that depend on other fields), once the
   * whole spec parsed; may report problems through `ctx`.
   */
  finalize?(sensor: ObjectOut<F>, spec: CommonSpec, path: string, ctx: ParseContext): ObjectOut<F>;
  /** Rules across the spec that involve this kind; each reports against the field to change. */
  check?(sensor: ObjectOut<F>, spec: CommonSpec, report: SpecReporter, ctx: ParseContext): void;
  /** One line describing the sensor for reports. */
  describe(sensor: ObjectOut<F>, spec: CommonSpec): string;
  /** The span of interest when `output.range` is absent, in the SI unit of the quantity (the channel narrows it to what it can read). */
  defaultSpan(context: KindContext<ObjectOut<F>>): Interval;
  /** The exact map at a parameter vector; `zeroRatio` is the bridge ratio of the zero reading (or undefined). */
  exactMap(context: KindContext<ObjectOut<F>>, p: Float64Array, zeroRatio: number | undefined): KindMap;
  /** The `output` fields (`modulusPascals`, `areaSquareMeters`...) the channel's quantity uses; any other such field given is a problem. */
  outputFields?(sensor: ObjectOut<F>, spec: CommonSpec): readonly string[];
  /**
   * The kind's budget side, for a kind made outside this package (see {@link SensorKindBudget}).
   * The built-in kinds leave it out: theirs are in `kinds/budgetRegistry.ts`, which only the
   * budget imports, so that an application that only converts does not carry them.
   */
  readonly budget?: SensorKindBudget<F>;
}
