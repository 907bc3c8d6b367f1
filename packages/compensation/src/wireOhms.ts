import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkFiniteResult,
  checkNonNegative,
  checkOneOf,
  checkOptions,
  checkPositive,
  checkRange,
  requireOption,
} from '@bridgework/core';
import { awgDiameterMeters } from './awgDiameterMeters.js';

/** A conductor material with a built-in resistivity: annealed copper per IEC 60028. */
export type WireMaterial = 'copper';

/** The resistivity and temperature coefficient of a conductor material at 20 °C. */
export interface ConductorMaterial {
  /** Resistivity at 20 °C in Ω·m. */
  readonly resistivityOhmMeters: number;
  /** Temperature coefficient of resistance at 20 °C, α20 in 1/K. */
  readonly temperatureCoefficientPerKelvin: number;
}

/**
 * Annealed copper per IEC 60028 (the International Annealed Copper Standard): ρ20 = 1/58 Ω·mm²/m
 * (1.7241 × 10⁻⁸ Ω·m) and α20 = 0.00393 /K at 20 °C.
 *
 * @example
 * ```ts
 * ANNEALED_COPPER.resistivityOhmMeters; // 1.7241379310344828e-8
 * ```
 */
export const ANNEALED_COPPER: ConductorMaterial = Object.freeze({
  resistivityOhmMeters: 1 / 58e6,
  temperatureCoefficientPerKelvin: 0.00393,
});

const materials: Readonly<Record<WireMaterial, ConductorMaterial>> = { copper: ANNEALED_COPPER };

/** Temperatures accepted by {@link wireOhms}, in °C. */
const TEMPERATURE_MIN_CELSIUS = -100;
const TEMPERATURE_MAX_CELSIUS = 300;

/** Options of {@link wireOhms}. Give exactly one of `awg` and `diameterMeters`. */
export interface WireOhmsOptions {
  /** AWG size, an integer in [−3, 56] (−3 = 0000); the diameter follows {@link awgDiameterMeters}. */
  readonly awg?: number;
  /** Bare conductor diameter in m, in [1e-6, 1] (1 µm … 1 m), instead of `awg`. */
  readonly diameterMeters?: number;
  /** Length of each conductor in m (≥ 0). */
  readonly lengthMeters: number;
  /** Conductor temperature in °C, in [−100, 300]. Default 20. */
  readonly temperatureCelsius?: number;
  /** Conductor material. Default `'copper'` (annealed, IEC 60028). Excludes a custom resistivity. */
  readonly material?: WireMaterial;
  /** A custom resistivity at 20 °C in Ω·m (> 0), instead of `material`; needs `temperatureCoefficientPerKelvin`. */
  readonly resistivityOhmMeters?: number;
  /** The custom material's temperature coefficient at 20 °C in 1/K (finite); needs `resistivityOhmMeters`. */
  readonly temperatureCoefficientPerKelvin?: number;
  /** Number of identical conductors connected in parallel (an integer ≥ 1). Default 1. */
  readonly conductors?: number;
}

/**
 * The resistance of a solid round wire: resistivity, length, cross-section and temperature.
 *
 * @remarks
 * R = ρ20·L/A · (1 + α20·(t − 20 °C)) / n, with A = π·d²/4 and n conductors in parallel. The
 * diameter comes from the AWG size by the ASTM B258 rule ({@link awgDiameterMeters}) or is given.
 * Annealed copper follows IEC 60028: ρ20 = 1/58 Ω·mm²/m, α20 = 0.00393 /K; the linear temperature
 * law is the one that standard defines. Real copper departs from it by a few per cent far from
 * 20 °C (the resistivity curve is not straight), so the accepted temperatures are −100…300 °C.
 * With these values AWG 26 copper is 133.9 Ω/km and AWG 24 is 84.2 Ω/km at 20 °C, the values of
 * the usual wire tables. Stranded conductors have a slightly higher resistance than a solid wire
 * of the same size (lay length): use the cable's data sheet when it gives one. The result is the
 * closed form evaluated in double precision (within a few ulps).
 *
 * @param options - Size, length, temperature, material and number of parallel conductors.
 * @returns Resistance in Ω.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` when neither `awg` nor
 *   `diameterMeters` is given (or a custom material lacks one of its two values);
 *   `conflicting-options` when both sizes, or a material and a custom resistivity, are given;
 *   `invalid-option` for an unknown material; `out-of-range` for a temperature outside
 *   [−100, 300] °C or one at which the custom material's resistance would not be positive;
 *   `not-integer`, `not-positive`, `negative`, `not-finite`, `wrong-type` for bad numbers;
 *   `out-of-range` for a diameter outside [1e-6, 1] m, or when the resistance would exceed
 *   binary64 (an extreme length with a custom resistivity); `unknown-option` for a key it does not
 *   know (naming the closest), `missing-option` without `lengthMeters`.
 * @example
 * ```ts
 * wireOhms({ awg: 26, lengthMeters: 10 }); // 1.3390722264134383 Ω at 20 °C
 * wireOhms({ awg: 26, lengthMeters: 10, temperatureCelsius: 45 }); // 1.4706... Ω
 * wireOhms({ diameterMeters: 0.5e-3, lengthMeters: 1, conductors: 2 }); // 0.0439... Ω
 * ```
 */
export function wireOhms(options: WireOhmsOptions): number {
  const o = checkOptions('options', options, {
    known: [
      'awg',
      'diameterMeters',
      'lengthMeters',
      'temperatureCelsius',
      'material',
      'resistivityOhmMeters',
      'temperatureCoefficientPerKelvin',
      'conductors',
    ],
    required: ['lengthMeters'],
  });
  if (o['awg'] !== undefined && o['diameterMeters'] !== undefined) {
    throw new BridgeworkError(
      'conflicting-options',
      '`awg` and `diameterMeters` exclude each other; give one',
      {
        param: 'diameterMeters',
        value: o['diameterMeters'],
      },
    );
  }
  const diameterMeters =
    o['diameterMeters'] !== undefined
      ? checkRange('diameterMeters', checkPositive('diameterMeters', o['diameterMeters']), {
          min: 1e-6,
          max: 1,
        })
      : awgDiameterMeters(requireOption('awg', o['awg'] as number | undefined, 'or `diameterMeters`'));
  const lengthMeters = checkNonNegative('lengthMeters', o['lengthMeters']);
  const temperatureCelsius =
    o['temperatureCelsius'] === undefined
      ? 20
      : checkRange('temperatureCelsius', o['temperatureCelsius'], {
          min: TEMPERATURE_MIN_CELSIUS,
          max: TEMPERATURE_MAX_CELSIUS,
        });
  const conductors =
    o['conductors'] === undefined ? 1 : checkInteger('conductors', o['conductors'], { min: 1 });
  const material = resolveMaterial(o);
  const factor = 1 + material.temperatureCoefficientPerKelvin * (temperatureCelsius - 20);
  if (!(factor > 0)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`temperatureCelsius\` must keep 1 + α20·(t − 20) > 0 for the given material; got ${temperatureCelsius}`,
      { param: 'temperatureCelsius', value: temperatureCelsius },
    );
  }
  const areaSquareMeters = (Math.PI * diameterMeters * diameterMeters) / 4;
  return checkFiniteResult(
    (material.resistivityOhmMeters * ((lengthMeters * factor) / areaSquareMeters)) / conductors,
    { what: 'the wire resistance', param: 'lengthMeters', value: lengthMeters },
  );
}

function resolveMaterial(o: Record<string, unknown>): ConductorMaterial {
  const customRho = o['resistivityOhmMeters'];
  const customAlpha = o['temperatureCoefficientPerKelvin'];
  if (customRho === undefined && customAlpha === undefined) {
    const name = o['material'] === undefined ? 'copper' : checkOneOf('material', o['material'], ['copper']);
    return materials[name];
  }
  if (o['material'] !== undefined) {
    throw new BridgeworkError(
      'conflicting-options',
      '`material` and a custom `resistivityOhmMeters`/`temperatureCoefficientPerKelvin` exclude each other; give one',
      { param: 'material', value: o['material'] },
    );
  }
  const why = 'for a custom material (give both values at 20 °C)';
  return {
    resistivityOhmMeters: checkPositive(
      'resistivityOhmMeters',
      requireOption('resistivityOhmMeters', customRho, why),
    ),
    temperatureCoefficientPerKelvin: checkFinite(
      'temperatureCoefficientPerKelvin',
      requireOption('temperatureCoefficientPerKelvin', customAlpha, why),
    ),
  };
}
