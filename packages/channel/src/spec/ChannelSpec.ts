import type { LeadWiring } from '@bridgework/core';
import type { StrainArrangement } from '@bridgework/bridge';

/**
 * One measurement channel: sensor, bridge and cable, excitation, amplifier, converter, zero,
 * environment, tolerances and the output quantity.
 *
 * @remarks
 * Only `sensor`, `excitation`, `adc` and `output` are required, with a few required fields inside
 * them; everything else has a documented default (the field reference, generated from the
 * schema, is in docs/channel.md). Units are SI (V, Ω, m, Pa, N, kg, Hz), temperatures °C, strain
 * m/m, bridge ratios V/V.
 */
export interface ChannelSpec {
  /** A name for reports and generated code. Default `'channel'`. */
  readonly name?: string;
  /** The sensor in the bridge. */
  readonly sensor: SensorSpec;
  /** Bridge arrangement, completion and cable. Default: arrangement from the sensor, no lead resistance. */
  readonly bridge?: BridgeSpec;
  /** The excitation source. */
  readonly excitation: ExcitationSpec;
  /** The amplifier between bridge and converter. Default: gain 1, noiseless, no limits checked. */
  readonly amplifier?: AmplifierSpec;
  /** The analog-to-digital converter. */
  readonly adc: AdcSpec;
  /** The zero reading, for the exact two-reading method. Default: none (the bridge's own zero). */
  readonly zero?: ZeroSpec;
  /** `'inverted'` when the signal leads are swapped, so tension reads negative codes. Default `'normal'`. */
  readonly polarity?: 'normal' | 'inverted';
  /** Temperatures of the installation. Default: 20 °C everywhere. */
  readonly environment?: EnvironmentSpec;
  /** Tolerances of the inputs, for the budget. Default: none stated (zero). */
  readonly tolerances?: TolerancesSpec;
  /** The measured quantity, its unit and the span of interest. */
  readonly output: OutputSpec;
}

/** The sensor: a strain gauge, a full-bridge transducer (load cell) or an RTD. */
export type SensorSpec = StrainGaugeSpec | TransducerSpec | RtdSpec;

/** Strain gauges, in the arrangement given by `bridge.arrangement`. */
export interface StrainGaugeSpec {
  /** Discriminant. */
  readonly kind: 'strain-gauge';
  /** Gauge factor at the reference temperature (> 0). */
  readonly gaugeFactor: number;
  /** Gauge resistance in Ω (> 0). Default 350. */
  readonly gaugeOhms?: number;
  /** Transverse sensitivity Kt of the gauge, in (−1, 1), measured with ν0 = 0.285. Default 0. */
  readonly transverseSensitivity?: number;
  /** Gauge-factor temperature coefficient β in 1/K: GF(T) = GF·(1 + β·(T − T0)). Default 0. */
  readonly gaugeFactorTemperatureCoefficientPerKelvin?: number;
  /** Reference temperature T0 of the gauge factor in °C. Default 24 (common data-sheet practice). */
  readonly gaugeFactorReferenceCelsius?: number;
  /** Thermal output (apparent strain) of the gauge lot on the specimen material. Default: none. */
  readonly thermalOutput?: ThermalOutputSpec;
}

/** A lot's thermal-output polynomial ε_app(T) = Σ aᵢ·Tⁱ in µε, T in °C. */
export interface ThermalOutputSpec {
  /** Coefficients a0…a4 in µε/°Cⁱ (1 to 5 values). */
  readonly coefficientsMicrostrain: readonly number[];
  /** The gauge-factor setting the curve was recorded with (> 0). Default 2.0. */
  readonly gaugeFactor?: number;
  /** Temperatures `[min, max]` in °C over which the curve holds. */
  readonly rangeCelsius: readonly [number, number];
}

/** A full-bridge transducer (load cell, pressure or torque transducer) with a certificate. */
export interface TransducerSpec {
  /** Discriminant. */
  readonly kind: 'transducer';
  /** Rated capacity (> 0), in `capacityUnit`. */
  readonly capacity: number;
  /**
   * What the certificate's capacity is expressed in: `'newton'`, `'kilogram-force'`, or
   * `'kilogram'` (conventional mass of reference weights). Default `'kilogram'` for a mass
   * output, else `'newton'`.
   */
  readonly capacityUnit?: 'newton' | 'kilogram-force' | 'kilogram';
  /** Gravity where the certificate's weights acted, m/s² (> 0). Default 9.80665. */
  readonly calibrationGravityMetersPerSecondSquared?: number;
  /** Gravity where the transducer is used, m/s² (> 0), for a mass output. Default 9.80665. */
  readonly localGravityMetersPerSecondSquared?: number;
  /**
   * Temperature effect on the zero, as a fraction of the rated output per kelvin (a data sheet's
   * "0.02 % RO/10 K" is 2e-5). The zero moves by this × rated output × (T − T_zero). Default 0.
   */
  readonly zeroTemperatureCoefficientPerKelvin?: number;
  /**
   * Temperature effect on the span (rated output), fraction per kelvin (data sheets: "% of reading
   * per 10 K"), relative to `certificateCelsius`. Default 0.
   */
  readonly spanTemperatureCoefficientPerKelvin?: number;
  /** Temperature at which the certificate's rated output holds, °C. Default 23. */
  readonly certificateCelsius?: number;
  /** Rated output at capacity in V/V (> 0), e.g. 0.002 for 2 mV/V. */
  readonly ratedOutputVoltsPerVolt: number;
  /** Zero balance (output at no load) in V/V. Default 0. */
  readonly zeroBalanceVoltsPerVolt?: number;
  /** Input (excitation) resistance in Ω (> 0). Default 350. */
  readonly inputOhms?: number;
  /** Output resistance in Ω (> 0). Default 350. */
  readonly outputOhms?: number;
}

/** A platinum RTD (IEC 60751 Callendar–Van Dusen) in arm 1 of a quarter bridge. */
export interface RtdSpec {
  /** Discriminant. */
  readonly kind: 'rtd';
  /** Resistance at 0 °C in Ω (> 0). Default 100. */
  readonly r0Ohms?: number;
  /** Callendar–Van Dusen A in 1/°C. Default 3.9083e-3 (IEC 60751). */
  readonly a?: number;
  /** Callendar–Van Dusen B in 1/°C². Default −5.775e-7 (IEC 60751). */
  readonly b?: number;
  /** Callendar–Van Dusen C in 1/°C⁴ (below 0 °C). Default −4.183e-12 (IEC 60751). */
  readonly c?: number;
  /** IEC 60751 tolerance class, for the budget. Default: none stated. */
  readonly toleranceClass?: 'AA' | 'A' | 'B' | 'C';
}

/** Bridge arrangement, completion resistors and cable. */
export interface BridgeSpec {
  /** Strain-gauge arrangement (strain gauges only; RTDs sit in a quarter bridge). Default `'quarter'`. */
  readonly arrangement?: StrainArrangement;
  /** Poisson ratio of the specimen in (−1, 0.5]: required by the Poisson arrangements and by a transverse-sensitivity correction. */
  readonly poissonRatio?: number;
  /** Completion resistors in Ω (> 0). Default: the sensor's nominal resistance. */
  readonly completionOhms?: number;
  /**
   * Lead wiring. Default: `'three-wire'` for quarter and half bridges (`'two-wire'` for
   * `'half-opposite'`), `'six-wire'` when `excitation.remoteSense` is true, else `'four-wire'`
   * for full bridges and transducers.
   */
  readonly wiring?: LeadWiring;
  /** Resistance of one lead conductor in Ω (≥ 0). Default 0, or from `cable`. */
  readonly ohmsPerLead?: number;
  /** The cable, from which the lead resistance is computed (instead of `ohmsPerLead`). */
  readonly cable?: CableSpec;
}

/** A cable of copper (or another material) conductors. */
export interface CableSpec {
  /** AWG size of each conductor (integer). Give this or `diameterMeters`. */
  readonly awg?: number;
  /** Conductor diameter in m (> 0). Give this or `awg`. */
  readonly diameterMeters?: number;
  /** Length of the cable (one conductor) in m (> 0). */
  readonly lengthMeters: number;
  /** Conductors in parallel per lead (integer ≥ 1). Default 1. */
  readonly conductorsPerLead?: number;
}

/** The excitation source. */
export interface ExcitationSpec {
  /** Source EMF in V (> 0). */
  readonly volts: number;
  /** Internal resistance of the source in Ω (≥ 0); matters only without a ratiometric converter. Default 0. */
  readonly sourceOhms?: number;
  /** The excitation is sensed at the bridge (six-wire). Default: true when `bridge.wiring` is `'six-wire'`. */
  readonly remoteSense?: boolean;
}

/** The amplifier (instrumentation amplifier or the converter's PGA). */
export interface AmplifierSpec {
  /** Total gain from the bridge to the quantizer (> 0). Default 1. */
  readonly gain?: number;
  /** Input voltage noise density (white) in V/√Hz (≥ 0). Default 0. */
  readonly inputVoltageNoiseVoltsPerRootHz?: number;
  /** 1/f corner of the voltage noise in Hz (≥ 0). Default 0. */
  readonly voltageCornerHertz?: number;
  /** Input current noise density in A/√Hz (≥ 0). Default 0. */
  readonly currentNoiseAmpsPerRootHz?: number;
  /** 1/f corner of the current noise in Hz (≥ 0). Default 0. */
  readonly currentCornerHertz?: number;
  /** Gain of the second (difference) stage (> 0). Default 1. */
  readonly secondStageGain?: number;
  /** Output reference voltage in V. Default 0. */
  readonly outputReferenceVolts?: number;
  /** Potential of E− relative to the amplifier ground in V (sets the common mode). Default 0. */
  readonly excitationLowVolts?: number;
  /** Limits to check for headroom. Default: none checked. */
  readonly limits?: AmplifierLimitsSpec;
}

/** Amplifier limits, as data sheets state them at the supply used. */
export interface AmplifierLimitsSpec {
  /** Input common-mode range `[min, max]` in V. */
  readonly inputCommonModeVolts?: readonly [number, number];
  /** Largest differential input magnitude in V (> 0). */
  readonly inputDifferentialVolts?: number;
  /** First-stage output range `[min, max]` in V. */
  readonly firstStageVolts?: readonly [number, number];
  /** Output swing `[min, max]` in V. */
  readonly outputVolts?: readonly [number, number];
}

/** The converter and its digital filter. */
export interface AdcSpec {
  /** Resolution in bits (integer, 2…32). */
  readonly bits: number;
  /** Reference voltage in V (> 0); ratiometric, the nominal excitation. */
  readonly referenceVolts: number;
  /** Two's complement ±full scale. Default true. */
  readonly bipolar?: boolean;
  /** The reference is the excitation (at the instrument, or at the bridge with remote sense). Default false. */
  readonly ratiometric?: boolean;
  /** Output data rate in Hz (> 0). Default 10. */
  readonly dataRateHertz?: number;
  /** Digital filter: `'sinc1'` … `'sinc5'` at the data rate. Default `'sinc3'`. */
  readonly filter?: 'sinc1' | 'sinc2' | 'sinc3' | 'sinc4' | 'sinc5';
  /** The converter's own input-referred rms noise in V at this gain and rate (> 0). Default: ideal quantization. */
  readonly noiseRmsVolts?: number;
}

/** The zero reading: the code read at zero load, for the exact two-reading method. */
export interface ZeroSpec {
  /** The converter code at zero, inside the converter's range (a mean of codes need not be an integer). */
  readonly code: number;
}

/** Temperatures of the installation. */
export interface EnvironmentSpec {
  /** Gauge (sensor) temperature during the measurement in °C. Default 20. */
  readonly temperatureCelsius?: number;
  /** Gauge temperature when the zero was taken in °C. Default: `temperatureCelsius`. */
  readonly zeroTemperatureCelsius?: number;
  /** Cable temperature in °C (for a cable's resistance). Default: `temperatureCelsius`. */
  readonly cableTemperatureCelsius?: number;
  /** The temperature range `[min, max]` in °C the budget covers. Default: `[temperatureCelsius, temperatureCelsius]`. */
  readonly rangeCelsius?: readonly [number, number];
}

/**
 * Tolerances for the budget: half-widths of the limits within which each input lies (treated as
 * rectangular distributions, JCGM 100 4.3.7). Relative ones are fractions (0.01 = 1 %).
 */
export interface TolerancesSpec {
  /** Gauge factor, relative. Default 0. */
  readonly gaugeFactor?: number;
  /** Transducer rated output (certificate), relative. Default 0. */
  readonly ratedOutput?: number;
  /** Completion resistors, relative. Default 0. */
  readonly completionOhms?: number;
  /** Lead resistance, in Ω. Default 0. */
  readonly ohmsPerLead?: number;
  /** Excitation EMF, relative (only without a ratiometric converter). Default 0. */
  readonly excitationVolts?: number;
  /** Amplifier gain, relative. Default 0. */
  readonly gain?: number;
  /** Converter reference, relative (only without a ratiometric converter). Default 0. */
  readonly referenceVolts?: number;
  /** Input-referred offset after zeroing, in V. Default 0. */
  readonly offsetVolts?: number;
  /** Gauge temperature used in corrections, in °C. Default 0. */
  readonly temperatureCelsius?: number;
  /** Coverage probability of the expanded uncertainty. Default 0.95. */
  readonly coverageProbability?: number;
}

/** The measured quantity. */
export interface OutputSpec {
  /**
   * `'strain'` (m/m) or `'microstrain'` (µε) or `'stress'` (Pa, uniaxial σ = E·ε) or `'force'`
   * (N; strain gauges on an axial member need `modulusPascals` and `areaSquareMeters`) for strain
   * gauges; `'force'` (N) or `'mass'` (kg) for transducers; `'temperature'` (°C) for RTDs;
   * `'ratio'` (V/V) for any sensor.
   */
  readonly quantity: 'strain' | 'microstrain' | 'stress' | 'force' | 'mass' | 'temperature' | 'ratio';
  /** The span of interest `[min, max]` in the output unit (sets the budget points and the firmware range). Default: the converter's full scale, within the sensor's range. */
  readonly range?: readonly [number, number];
  /** Young's modulus of the specimen in Pa (> 0), for stress and force from strain. */
  readonly modulusPascals?: number;
  /** Cross-section of an axial member in m² (> 0), for force from strain. */
  readonly areaSquareMeters?: number;
  /** Output resolution for fixed-point firmware constants, in the output unit (> 0). Default: 1e-3 of the span's largest magnitude, rounded down to a power of ten. */
  readonly firmwareResolution?: number;
}
