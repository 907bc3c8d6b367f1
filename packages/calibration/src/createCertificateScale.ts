import {
  BridgeworkError,
  STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED,
  checkFinite,
  checkFiniteResult,
  checkOptions,
  checkOneOf,
  checkPositive,
  formatValue,
  requireOption,
} from '@bridgework/core';
import { checkNonZero } from './internal/checks.js';

/**
 * The unit a certificate states its capacity in.
 *
 * @remarks
 * - `'newton'`: a force.
 * - `'kilogram-force'`: a force of exactly 9.806 65 N per kgf (standard gravity, 3rd CGPM 1901).
 * - `'kilogram'`: the conventional mass of the reference weights that loaded the cell, acting at
 *   the calibration site's gravity and reduced by air buoyancy (see {@link CertificateScaleOptions}).
 */
export type CapacityUnit = 'newton' | 'kilogram-force' | 'kilogram';

/** The unit a certificate scale converts readings to: a force or a conventional mass. */
export type LoadUnit = 'newton' | 'kilogram';

/** Air buoyancy of the reference weights and of the weighed load (OIML D 28 conventions). */
export interface BuoyancyOptions {
  /** Air density during the calibration, kg/m³ (> 0). Default 1.2 (the conventional value). */
  readonly airDensityKilogramsPerCubicMeter?: number;
  /** Density of the reference weights, kg/m³ (> 0). Default 8000 (the conventional reference density). */
  readonly weightDensityKilogramsPerCubicMeter?: number;
}

/** Options of {@link createCertificateScale}. */
export interface CertificateScaleOptions {
  /** Rated capacity (> 0), in `capacityUnit`. */
  readonly capacity: number;
  /** What `capacity` is expressed in. */
  readonly capacityUnit: CapacityUnit;
  /** Rated output: output at capacity minus output at zero load, V/V (non-zero, either sign). */
  readonly ratedOutputVoltsPerVolt: number;
  /** The zero reading (certificate zero balance, or a zero taken on site), V/V. Default 0. */
  readonly zeroVoltsPerVolt?: number;
  /** The unit of the scale's loads. Default `'kilogram'` for a capacity in kilograms, else `'newton'`. */
  readonly outputUnit?: LoadUnit;
  /**
   * Gravity where the reference weights acted, m/s² (> 0). Required for `capacityUnit: 'kilogram'`.
   */
  readonly calibrationGravityMetersPerSecondSquared?: number;
  /** Gravity where the cell is used, m/s² (> 0). Required for `outputUnit: 'kilogram'`. */
  readonly localGravityMetersPerSecondSquared?: number;
  /**
   * Air buoyancy: the conventional values by default; `false` to treat mass × gravity as the force
   * (weighing in vacuum).
   */
  readonly buoyancy?: BuoyancyOptions | false;
}

/** A linear map between a certified transducer's output and load (see {@link createCertificateScale}). */
export interface CertificateScale {
  /** The unit of the loads this scale returns and accepts. */
  readonly outputUnit: LoadUnit;
  /** The zero reading, V/V. */
  readonly zeroRatio: number;
  /** Load per unit of output ratio (load = loadPerRatio·(ratio − zeroRatio)), output unit per V/V. */
  readonly loadPerRatio: number;
  /** The rated capacity as a force at the cell, N. */
  readonly capacityNewtons: number;
  /**
   * The load for an output ratio.
   *
   * @param ratio - Output ratio, V/V.
   * @returns Load in `outputUnit`.
   */
  loadFromRatio(ratio: number): number;
  /**
   * The output ratio for a load (exact inverse of `loadFromRatio`).
   *
   * @param load - Load in `outputUnit`.
   * @returns Output ratio, V/V.
   */
  ratioFromLoad(load: number): number;
}

/** Conventional air density ρ0 = 1.2 kg/m³ and reference density 8000 kg/m³ (OIML D 28; from memory). */
const CONVENTIONAL_AIR = 1.2;
const CONVENTIONAL_DENSITY = 8000;

/**
 * Creates the linear scale from a transducer's certificate (capacity, rated output, zero) to force
 * or to conventional mass, with gravity and air buoyancy as options.
 *
 * @remarks
 * The cell measures force. load = loadPerRatio·(ratio − zero) with
 * loadPerRatio = (capacity as a force)/RO, converted to the output unit:
 * - a capacity in N is a force; in kgf it is capacity·9.806 65 N (exact);
 * - a capacity in kg is the conventional mass mc of the reference weights. A weight of density ρw
 *   in air of density ρa pushes with F = m·g·(1 − ρa/ρw), and its conventional mass is defined by
 *   m·(1 − ρ0/ρw) = mc·(1 − ρ0/ρc) with ρ0 = 1.2 kg/m³ and ρc = 8000 kg/m³ (OIML D 28, conventional
 *   value of the result of weighing in air; from memory). So
 *   F = mc·g_cal·(1 − ρ0/ρc)·(1 − ρa/ρw)/(1 − ρ0/ρw), which is mc·g_cal·(1 − 1.2/8000) at the
 *   conventional values;
 * - an output in kg is the conventional mass of the load on the cell at the site,
 *   mc = F/(g_local·(1 − ρ0/ρc)): what an instrument adjusted with conventional-mass weights in
 *   air of 1.2 kg/m³ indicates, whatever the density of the load.
 * With `buoyancy: false` every (1 − ρ/ρ) factor is 1 (F = m·g). Gravity must be given where it
 * is needed: a certificate's gravity is not the site's (g varies by about 0.5 % between the
 * equator and the poles). Two roundings per conversion; the round trip is within a few ulps.
 *
 * @param options - Capacity and its unit, rated output, zero, output unit, gravities, buoyancy.
 * @returns The scale.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type` for bad
 *   numbers; `invalid-option` for an unknown unit; `missing-option` for a gravity that the units
 *   need; `out-of-range` for a zero rated output, or for options whose load per unit of output (or
 *   capacity as a force) lies beyond the double range; `loadFromRatio` and `ratioFromLoad` refuse
 *   (`out-of-range`, naming their argument) a result beyond it.
 * @example
 * ```ts
 * const scale = createCertificateScale({
 *   capacity: 1000, capacityUnit: 'kilogram', ratedOutputVoltsPerVolt: 2.0012e-3,
 *   calibrationGravityMetersPerSecondSquared: 9.8119, localGravityMetersPerSecondSquared: 9.8062,
 * });
 * scale.loadFromRatio(1.0006e-3); // ≈ 500.29 kg at the site
 * ```
 */
export function createCertificateScale(options: CertificateScaleOptions): CertificateScale {
  const o = checkOptions('options', options, {
    known: [
      'capacity',
      'capacityUnit',
      'ratedOutputVoltsPerVolt',
      'zeroVoltsPerVolt',
      'outputUnit',
      'calibrationGravityMetersPerSecondSquared',
      'localGravityMetersPerSecondSquared',
      'buoyancy',
    ],
    required: ['capacity', 'capacityUnit', 'ratedOutputVoltsPerVolt'],
  });
  const capacity = checkPositive('capacity', o['capacity']);
  const capacityUnit = checkOneOf('capacityUnit', o['capacityUnit'], [
    'newton',
    'kilogram-force',
    'kilogram',
  ] as const);
  const ratedOutput = checkNonZero('ratedOutputVoltsPerVolt', o['ratedOutputVoltsPerVolt']);
  const zeroRatio =
    o['zeroVoltsPerVolt'] === undefined ? 0 : checkFinite('zeroVoltsPerVolt', o['zeroVoltsPerVolt']);
  const outputUnit =
    o['outputUnit'] === undefined
      ? capacityUnit === 'kilogram'
        ? 'kilogram'
        : 'newton'
      : checkOneOf('outputUnit', o['outputUnit'], ['newton', 'kilogram'] as const);

  let airFactor = 1; // (1 − ρa/ρw)/(1 − ρ0/ρw) for the reference weights
  let conventionalFactor = 1; // 1 − ρ0/ρc
  if (o['buoyancy'] !== false) {
    const b =
      o['buoyancy'] === undefined
        ? {}
        : checkOptions('buoyancy', o['buoyancy'], {
            known: ['airDensityKilogramsPerCubicMeter', 'weightDensityKilogramsPerCubicMeter'],
          });
    const air =
      b['airDensityKilogramsPerCubicMeter'] === undefined
        ? CONVENTIONAL_AIR
        : checkPositive('buoyancy.airDensityKilogramsPerCubicMeter', b['airDensityKilogramsPerCubicMeter']);
    const density =
      b['weightDensityKilogramsPerCubicMeter'] === undefined
        ? CONVENTIONAL_DENSITY
        : checkPositive(
            'buoyancy.weightDensityKilogramsPerCubicMeter',
            b['weightDensityKilogramsPerCubicMeter'],
          );
    if (!(air < density)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`buoyancy.airDensityKilogramsPerCubicMeter\` must be below the weights' density ${density}; got ${formatValue(air)}`,
        { param: 'buoyancy.airDensityKilogramsPerCubicMeter', value: air, limit: [0, density] },
      );
    }
    airFactor = (1 - air / density) / (1 - CONVENTIONAL_AIR / density);
    conventionalFactor = 1 - CONVENTIONAL_AIR / CONVENTIONAL_DENSITY;
  }
  const gravity = (param: string, why: string): number =>
    checkPositive(param, requireOption(param, o[param] as number | undefined, why));

  // Every figure of the scale is finite: a product or quotient beyond the double range is refused
  // against the option the caller gave (capacity 1e308 kg, a rated output of 1e-308 V/V).
  let capacityNewtons: number;
  if (capacityUnit === 'newton') capacityNewtons = capacity;
  else if (capacityUnit === 'kilogram-force') {
    capacityNewtons = checkFiniteResult(capacity * STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED, {
      what: 'the capacity as a force',
      param: 'capacity',
      value: capacity,
    });
  } else {
    const param = 'calibrationGravityMetersPerSecondSquared';
    const g = gravity(param, "for capacityUnit 'kilogram'");
    capacityNewtons = checkFiniteResult(capacity * g * conventionalFactor * airFactor, {
      what: 'the capacity as a force (capacity × calibration gravity)',
      // The larger of the two factors is the one out of its range.
      param: capacity >= g ? 'capacity' : param,
      value: capacity >= g ? capacity : g,
    });
  }
  let capacityInOutput = capacityNewtons;
  if (outputUnit === 'kilogram') {
    const param = 'localGravityMetersPerSecondSquared';
    const g = gravity(param, "for outputUnit 'kilogram'");
    capacityInOutput = checkFiniteResult(capacityNewtons / (g * conventionalFactor), {
      what: 'the capacity as a mass at the site (capacity ÷ local gravity)',
      param,
      value: g,
    });
  }
  const loadPerRatio = checkFiniteResult(capacityInOutput / ratedOutput, {
    what: 'the load per unit of output (capacity ÷ rated output)',
    param: 'ratedOutputVoltsPerVolt',
    value: ratedOutput,
  });

  return {
    outputUnit,
    zeroRatio,
    loadPerRatio,
    capacityNewtons,
    loadFromRatio: (ratio: number) =>
      checkFiniteResult(loadPerRatio * (checkFinite('ratio', ratio) - zeroRatio), {
        what: 'the load',
        param: 'ratio',
        value: ratio,
      }),
    ratioFromLoad: (load: number) =>
      checkFiniteResult(zeroRatio + checkFinite('load', load) / loadPerRatio, {
        what: 'the output ratio',
        param: 'load',
        value: load,
      }),
  };
}
