/**
 * The budget side of the strain-gauge kind (see `SensorKindBudget`): its map as straight-line
 * arithmetic for Monte Carlo, its uncertain inputs and the plausible ranges of its inputs. Only
 * the budget imports it (through `budgetRegistry.ts`), so the conversion path does not carry it.
 */
import { createStrainBridgeKernel, type StrainArrangement } from '@bridgework/bridge';
import { createThermalOutput, indicatedTransverseStrain } from '@bridgework/compensation';
import { formatSignificant } from '../units/quantity.js';
import { Parameter, type SensorKindBudget } from './SensorKind.js';
import { toleranceFractionCheck } from './toleranceCheck.js';
import { GAUGE_FACTOR, quantityPerStrain, type strainGaugeKind } from './strainGauge.js';

/** The strain-gauge kind's budget side. */
export const strainGaugeBudget: SensorKindBudget<(typeof strainGaugeKind)['fields']> = {
  fastMap(ctx) {
    const s = ctx.sensor;
    const setting = s.gaugeFactor;
    // The bridge package's closed form with the completion and lead resistances per call.
    const bridge = createStrainBridgeKernel({
      arrangement: (ctx.arrangement ?? 'quarter') as StrainArrangement,
      gaugeFactor: setting,
      gaugeOhms: s.gaugeOhms,
      ...(ctx.poissonRatio === undefined ? {} : { poissonRatio: ctx.poissonRatio }),
      wiring: ctx.wiring,
      sourceOhms: ctx.sourceOhms,
    });
    const to = s.thermalOutput;
    const thermal =
      to === undefined
        ? undefined
        : createThermalOutput({
            coefficientsMicrostrain: to.coefficientsMicrostrain,
            gaugeFactor: to.gaugeFactor,
            rangeCelsius: [to.rangeCelsius.min, to.rangeCelsius.max],
          });
    const beta = s.gaugeFactorTemperatureCoefficientPerKelvin;
    const t0 = s.gaugeFactorReferenceCelsius;
    const tZero = ctx.zeroTemperatureCelsius;
    const transverse =
      s.transverseSensitivity === 0
        ? 1
        : indicatedTransverseStrain({
            axialStrain: 1,
            transverseStrain: -(ctx.poissonRatio as number),
            transverseSensitivity: s.transverseSensitivity,
          });
    const perStrain = quantityPerStrain(ctx.spec, ctx.arrangement, ctx.poissonRatio);
    // Thermal output at the zero temperature, rescaled to the setting (compensation rescaleGaugeFactor: ε·from/to).
    const thermalZero =
      thermal === undefined ? 0 : (thermal.apparentStrainAt(tZero) * thermal.gaugeFactor) / setting;
    return {
      quantity(ratio, zeroRatio, p) {
        const completion = p[Parameter.completionOhms] as number;
        const lead = p[Parameter.ohmsPerLead] as number;
        let e = bridge.strainFromRatio(ratio, completion, lead);
        if (zeroRatio === zeroRatio) {
          const e0 = bridge.strainFromRatio(zeroRatio, completion, lead);
          e = (e - e0) / (1 + setting * e0);
        }
        const t = p[Parameter.temperatureCelsius] as number;
        const thermalStrain =
          thermal === undefined
            ? 0
            : (thermal.apparentStrainAt(t) * thermal.gaugeFactor) / setting - thermalZero;
        // correctTemperatureEffects: (ε_ind − thermal)·GF_setting/GF(T), GF(T) = GF·(1 + β(T − T0)).
        const gfNow =
          beta === 0 ? (p[GAUGE_FACTOR] as number) : (p[GAUGE_FACTOR] as number) * (1 + beta * (t - t0));
        return (perStrain * (((e - thermalStrain) * setting) / gfNow)) / transverse;
      },
    };
  },
  budgetInputs(ctx) {
    const s = ctx.sensor;
    return s.gaugeFactorToleranceFraction > 0
      ? [
          {
            name: 'gauge factor',
            first: true,
            index: GAUGE_FACTOR,
            halfWidth: s.gaugeFactorToleranceFraction * s.gaugeFactor,
            kind: 'tolerance',
            model: `the exact map with the gauge factor varied over ±${formatSignificant(s.gaugeFactorToleranceFraction * 100)} %`,
          },
        ]
      : [];
  },
  calibrationCheck: (s) =>
    toleranceFractionCheck(
      s.gaugeFactorToleranceFraction,
      'sensor.gaugeFactorToleranceFraction',
      "the gauge factor's tolerance",
      "the budget lacks the gauge factor's tolerance: sensor.gaugeFactorToleranceFraction is 0, so U covers the electronics and the noise only; fill it in from the gauge lot's data sheet (the gauge factor's tolerance, commonly ±0.5 % to ±1 %), or calibrate the channel against reference loads (calibration)",
    ),
  plausibleRanges: (s) => [
    { path: 'sensor.gaugeFactor', value: s.gaugeFactor, range: { min: 1, max: 5 }, unit: '' },
    { path: 'sensor.gaugeOhms', value: s.gaugeOhms, range: { min: 60, max: 10_000 }, unit: 'Ω' },
  ],
};
