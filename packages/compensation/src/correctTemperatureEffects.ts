import {
  BridgeworkError,
  checkCelsius,
  checkFinite,
  checkGaugeFactor,
  checkOptions,
  checkFiniteResult,
  formatValue,
  requireOption,
  blameOption,
} from '@bridgework/core';
import type { ThermalOutput } from './createThermalOutput.js';
import { gaugeFactorAt } from './gaugeFactorAt.js';

const gaugeTemperatureKeys = [
  'gaugeFactorSetting',
  'zeroCelsius',
  'temperatureCelsius',
  'thermalOutput',
  'gaugeFactor',
  'gaugeFactorTemperatureCoefficientPerKelvin',
  'gaugeFactorReferenceCelsius',
];
const gaugeTemperatureRequired = ['gaugeFactorSetting', 'zeroCelsius', 'temperatureCelsius', 'gaugeFactor'];

/** The gauge and temperatures shared by {@link correctTemperatureEffects} and its forward model. */
export interface GaugeTemperatureOptions {
  /** The instrument's gauge-factor setting GF_i under which the strain is indicated (> 0). */
  readonly gaugeFactorSetting: number;
  /** Temperature T0 at which the channel was zeroed, °C. */
  readonly zeroCelsius: number;
  /** Temperature T at which the reading is taken, °C. */
  readonly temperatureCelsius: number;
  /**
   * The lot's thermal output (from `createThermalOutput`). Omit it when the thermal output is
   * compensated otherwise (a dummy gauge in an adjacent arm) or negligible.
   */
  readonly thermalOutput?: ThermalOutput;
  /** The gauge's factor GF0 at `gaugeFactorReferenceCelsius` (> 0). */
  readonly gaugeFactor: number;
  /** Temperature coefficient β of the gauge factor in 1/K. Default 0 (GF independent of temperature). */
  readonly gaugeFactorTemperatureCoefficientPerKelvin?: number;
  /** Temperature at which `gaugeFactor` holds, °C. Required when the coefficient is given. */
  readonly gaugeFactorReferenceCelsius?: number;
}

/** Options of {@link correctTemperatureEffects}. */
export interface CorrectTemperatureEffectsOptions extends GaugeTemperatureOptions {
  /** The strain indicated at `temperatureCelsius`, zeroed at `zeroCelsius`, under `gaugeFactorSetting`, m/m. */
  readonly indicatedStrain: number;
}

/** Options of {@link indicatedStrainWithTemperatureEffects}. */
export interface IndicatedStrainWithTemperatureEffectsOptions extends GaugeTemperatureOptions {
  /** The true mechanical strain change since zeroing, m/m. */
  readonly strain: number;
}

interface Checked {
  readonly gaugeFactorSetting: number;
  /** GF(T). */
  readonly gaugeFactorNow: number;
  /** GF_ref·(ε_app(T) − ε_app(T0)) expressed at the instrument setting: the thermal ΔR/R over GF_i. */
  readonly thermalStrain: number;
}

function check(o: Record<string, unknown>): Checked {
  const gaugeFactorSetting = checkGaugeFactor('gaugeFactorSetting', o['gaugeFactorSetting']);
  const zeroCelsius = checkCelsius('zeroCelsius', o['zeroCelsius']);
  const temperatureCelsius = checkCelsius('temperatureCelsius', o['temperatureCelsius']);
  const gaugeFactor = checkGaugeFactor('gaugeFactor', o['gaugeFactor']);
  const beta = o['gaugeFactorTemperatureCoefficientPerKelvin'];
  const gaugeFactorNow =
    beta === undefined
      ? gaugeFactor
      : gaugeFactorAt({
          gaugeFactor,
          temperatureCoefficientPerKelvin: checkFinite('gaugeFactorTemperatureCoefficientPerKelvin', beta),
          referenceCelsius: checkCelsius(
            'gaugeFactorReferenceCelsius',
            requireOption(
              'gaugeFactorReferenceCelsius',
              o['gaugeFactorReferenceCelsius'],
              'with `gaugeFactorTemperatureCoefficientPerKelvin`',
            ),
          ),
          temperatureCelsius,
        });
  const thermal = o['thermalOutput'];
  let thermalStrain = 0;
  if (thermal !== undefined) {
    if (typeof (thermal as Partial<ThermalOutput> | null)?.apparentStrainAt !== 'function') {
      throw new BridgeworkError(
        'wrong-type',
        `\`thermalOutput\` must be an evaluator from createThermalOutput; got ${formatValue(thermal)}`,
        { param: 'thermalOutput', value: thermal },
      );
    }
    const to = thermal as ThermalOutput;
    thermalStrain =
      to.apparentStrainAt(temperatureCelsius, gaugeFactorSetting) -
      blameOption(
        { param: 'zeroCelsius', value: zeroCelsius, requirement: "must lie in the thermal output's range" },
        () => to.apparentStrainAt(zeroCelsius, gaugeFactorSetting),
      );
  }
  return { gaugeFactorSetting, gaugeFactorNow, thermalStrain };
}

/**
 * Corrects a strain reading for the gauge's thermal output and the temperature change of its gauge
 * factor: the full temperature correction of a reading zeroed at T0 and taken at T.
 *
 * @remarks
 * Model (superposition of the two relative resistance changes since zeroing, the form in which
 * gauge data are published; e.g. Window & Holister, _Strain Gauge Technology_, temperature
 * effects, from memory):
 *
 *   GF_i·ε̂ = GF(T)·ε + GF_ref·(ε_app(T) − ε_app(T0)),
 *
 * where ε̂ is the indicated strain under the instrument setting GF_i, ε the true mechanical strain
 * change, GF(T) = GF0·(1 + β·(T − T0,GF)) ({@link gaugeFactorAt}) and ε_app the lot's thermal
 * output recorded at GF_ref ({@link createThermalOutput}). Solved exactly for ε:
 *
 *   ε = [ε̂ − (ε_app(T) − ε_app(T0))·GF_ref/GF_i] · GF_i/GF(T).
 *
 * The indicated strain must be the relative resistance change since zeroing over GF_i, which is
 * what the exact two-reading inverse of `createStrainBridge` gives (quarter bridge); a reading
 * linearised as 4·ratio/GF still carries the bridge nonlinearity. The product of mechanical and
 * thermal resistance changes (order 10⁻⁶ relative) is outside this published model. Evaluation:
 * a few roundings, within 1e-14 relative of the model; {@link indicatedStrainWithTemperatureEffects}
 * is its exact inverse.
 *
 * @param options - The reading, the instrument setting, temperatures, thermal output, gauge factor model.
 * @returns The corrected mechanical strain since zeroing, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` when β is given without its
 *   reference temperature; `out-of-range` for a temperature outside the thermal output's range or
 *   one that makes GF(T) leave [0.01, 1000], a temperature at or below −273.15 °C, a gauge factor
 *   outside [0.01, 1000], or a strain whose result would exceed binary64; `wrong-type` for a `thermalOutput` that is
 *   not an evaluator; `not-positive`, `not-finite` for bad numbers; `unknown-option` for a key it
 *   does not know (naming the closest), `missing-option` for a required one.
 * @example
 * ```ts
 * const lot = createThermalOutput({
 *   coefficientsMicrostrain: [-30.5, 2.61, -5.7e-2, 2.9e-4, -4.1e-7],
 *   gaugeFactor: 2,
 *   rangeCelsius: [-30, 200],
 * });
 * correctTemperatureEffects({
 *   indicatedStrain: 512e-6, gaugeFactorSetting: 2, zeroCelsius: 20, temperatureCelsius: 80,
 *   thermalOutput: lot, gaugeFactor: 2.08,
 *   gaugeFactorTemperatureCoefficientPerKelvin: 1e-4, gaugeFactorReferenceCelsius: 24,
 * }); // ≈ 5.4308e-4 (543.08 µε: 512 µε read, −55.97 µε of thermal output removed, GF(80 °C) = 2.0916)
 * ```
 */
export function correctTemperatureEffects(options: CorrectTemperatureEffectsOptions): number {
  const o = checkOptions('options', options, {
    known: [...gaugeTemperatureKeys, 'indicatedStrain'],
    required: [...gaugeTemperatureRequired, 'indicatedStrain'],
  });
  const indicatedStrain = checkFinite('indicatedStrain', o['indicatedStrain']);
  const c = check(o);
  return checkFiniteResult(((indicatedStrain - c.thermalStrain) * c.gaugeFactorSetting) / c.gaugeFactorNow, {
    what: 'the corrected strain',
    param: 'indicatedStrain',
    value: indicatedStrain,
  });
}

/**
 * The strain an instrument indicates for a true strain, with the gauge's thermal output and the
 * temperature change of its gauge factor: the forward model of {@link correctTemperatureEffects}.
 *
 * @remarks
 * ε̂ = [GF(T)·ε + GF_ref·(ε_app(T) − ε_app(T0))]/GF_i, the model stated at
 * {@link correctTemperatureEffects}, for simulations and uncertainty budgets.
 *
 * @param options - The true strain, the instrument setting, temperatures, thermal output, gauge factor model.
 * @returns The indicated strain, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} as {@link correctTemperatureEffects}.
 * @example
 * ```ts
 * indicatedStrainWithTemperatureEffects({
 *   strain: 500e-6, gaugeFactorSetting: 2, zeroCelsius: 20, temperatureCelsius: 20, gaugeFactor: 2.1,
 * }); // ≈ 5.25e-4: the gauge-factor mismatch alone
 * ```
 */
export function indicatedStrainWithTemperatureEffects(
  options: IndicatedStrainWithTemperatureEffectsOptions,
): number {
  const o = checkOptions('options', options, {
    known: [...gaugeTemperatureKeys, 'strain'],
    required: [...gaugeTemperatureRequired, 'strain'],
  });
  const strain = checkFinite('strain', o['strain']);
  const c = check(o);
  return checkFiniteResult((strain * c.gaugeFactorNow) / c.gaugeFactorSetting + c.thermalStrain, {
    what: 'the indicated strain',
    param: 'strain',
    value: strain,
  });
}
