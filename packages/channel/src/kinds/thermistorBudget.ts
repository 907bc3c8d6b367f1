/**
 * The budget side of the thermistor kind (see `SensorKindBudget`): its map as straight-line arithmetic for Monte Carlo, its tolerances, its self-heating line and the plausible ranges of its inputs. Only the budget imports
 * it (through `budgetRegistry.ts`), so the conversion path does not carry it.
 */
import { ZERO_CELSIUS_KELVIN } from '@bridgework/core';
import { createStrainBridge, createStrainBridgeKernel, solveBridge } from '@bridgework/bridge';
import { formatSignificant } from '../units/quantity.js';
import { Parameter, type KindContext, type SensorKindBudget } from './SensorKind.js';
import { toleranceText } from './toleranceCheck.js';
import {
  BETA,
  DISSIPATION,
  RESISTANCE_DEVIATION,
  model,
  type ThermistorSpec,
  type thermistorKind,
} from './thermistor.js';

/** The thermistor kind's budget side. */
export const thermistorBudget: SensorKindBudget<(typeof thermistorKind)['fields']> = {
  fastMap(ctx: KindContext<ThermistorSpec>) {
    const s = ctx.sensor;
    const r0 = s.referenceOhms;
    // The element in arm 1 of a quarter bridge (gauge factor 1, "gauge" resistance R0): the bridge
    // package's closed form, once as the ratio sees the source, once with the whole source in series (power).
    const quarter = { arrangement: 'quarter', gaugeFactor: 1, gaugeOhms: r0, wiring: ctx.wiring } as const;
    const bridge = createStrainBridgeKernel({ ...quarter, sourceOhms: ctx.sourceOhms });
    const power = createStrainBridgeKernel({ ...quarter, sourceOhms: ctx.spec.excitation.sourceOhms });
    // Power in the element (not its leads) at a strain: the arm current of the unloaded bridge fed
    // through the series resistance, I1 = E·Q/(P·Q + Rs·(P + Q)) with P = R1 + R2, Q = R3 + R4 (the
    // exact map uses solveBridge; the channel checks the two agree before this one is used).
    const watts = (e: number, completion: number, lead: number, volts: number): number => {
      const pp = power.armOhms(1, e, completion, lead) + power.armOhms(2, e, completion, lead);
      const qq = power.armOhms(3, e, completion, lead) + power.armOhms(4, e, completion, lead);
      const current = (volts * qq) / (pp * qq + power.seriesOhms(lead) * (pp + qq));
      return current * current * r0 * (1 + e);
    };
    const sh = s.steinhartHart === undefined ? undefined : model(s, 0);
    const t0 = s.referenceCelsius;
    const k0 = t0 + ZERO_CELSIUS_KELVIN;
    const lo = s.rangeCelsius.min;
    const hi = s.rangeCelsius.max;
    return {
      quantity(ratio, _zero, p) {
        const completion = p[Parameter.completionOhms] as number;
        const lead = p[Parameter.ohmsPerLead] as number;
        const e = bridge.strainFromRatio(ratio, completion, lead);
        const ohms = (r0 * (1 + e)) / (1 + (p[RESISTANCE_DEVIATION] as number));
        let t: number;
        if (sh !== undefined) t = sh.temperatureAt(ohms);
        else {
          // The beta model's inverse (compensation createBetaThermistor): t = t0 − T0²·L/(B + T0·L), L = ln(R/R0).
          const l = Math.log(ohms / r0);
          t = t0 - (k0 * k0 * l) / ((p[BETA] as number) + k0 * l);
          if (!(t >= lo && t <= hi)) return Number.NaN;
        }
        const d = p[DISSIPATION] as number;
        return d > 0 ? t - watts(e, completion, lead, p[Parameter.excitationVolts] as number) / d : t;
      },
    };
  },
  budgetInputs(ctx) {
    const s = ctx.sensor;
    const inputs = [];
    if (s.referenceOhmsToleranceFraction > 0) {
      inputs.push({
        name: 'thermistor resistance',
        index: RESISTANCE_DEVIATION,
        halfWidth: s.referenceOhmsToleranceFraction,
        kind: 'tolerance' as const,
        model: `the element reads as R·(1 + δ) with δ within ±${formatSignificant(s.referenceOhmsToleranceFraction * 100)} %`,
      });
    }
    if (s.betaToleranceFraction > 0 && s.betaKelvin !== undefined) {
      inputs.push({
        name: 'thermistor beta',
        index: BETA,
        halfWidth: s.betaToleranceFraction * s.betaKelvin,
        kind: 'tolerance' as const,
        model: `the beta model with B varied over ±${formatSignificant(s.betaToleranceFraction * 100)} %`,
      });
    }
    if (s.dissipationToleranceFraction > 0 && s.dissipationConstantWattsPerKelvin !== undefined) {
      inputs.push({
        name: 'dissipation constant',
        index: DISSIPATION,
        halfWidth: s.dissipationToleranceFraction * s.dissipationConstantWattsPerKelvin,
        kind: 'self-heating' as const,
        model: `the self-heating correction P/δ with δ varied over ±${formatSignificant(s.dissipationToleranceFraction * 100)} %`,
      });
    }
    return inputs;
  },
  budgetLines(ctx, map, at) {
    const s = ctx.sensor;
    const d = s.dissipationConstantWattsPerKelvin;
    if (d === undefined || ctx.quantity !== 'temperature') return [];
    // The element's power at the budget point: the correction a map ignoring self-heating would miss.
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 1,
      gaugeOhms: s.referenceOhms,
      completionOhms: ctx.nominal[Parameter.completionOhms] as number,
      sourceOhms: ctx.sourceOhms,
      leads: { ohmsPerLead: ctx.nominal[Parameter.ohmsPerLead] as number, wiring: ctx.wiring },
    });
    const strain = bridge.strainFromRatio(map.ratioFromQuantity(at));
    const sol = solveBridge({
      armsOhms: bridge.armsOhms(strain),
      excitationVolts: ctx.nominal[Parameter.excitationVolts] as number,
      sourceOhms: ctx.spec.excitation.sourceOhms,
    });
    const watts = (sol.armAmps[0] as number) ** 2 * s.referenceOhms * (1 + strain);
    return [
      {
        name: 'self-heating',
        kind: 'self-heating',
        model:
          'the element sits above the ambient by P/δ (P the power in it, from the bridge network); the map subtracts it, so this is the error of a map that ignores it',
        inputs: { powerWatts: watts, dissipationConstantWattsPerKelvin: d },
        value: watts / d,
        standardUncertainty: undefined,
      },
    ];
  },
  calibrationCheck: (s, spec) => {
    if (spec.output.quantity !== 'temperature') return undefined;
    const held = [
      ...(s.referenceOhmsToleranceFraction > 0
        ? [
            toleranceText(
              'the resistance tolerance',
              s.referenceOhmsToleranceFraction,
              'sensor.referenceOhmsToleranceFraction',
            ),
          ]
        : []),
      ...(s.betaToleranceFraction > 0 && s.betaKelvin !== undefined
        ? [toleranceText('the beta tolerance', s.betaToleranceFraction, 'sensor.betaToleranceFraction')]
        : []),
    ];
    if (held.length > 0) {
      return {
        holds: true,
        value: s.referenceOhmsToleranceFraction,
        unit: '',
        path: 'sensor.referenceOhmsToleranceFraction',
        message: `the budget holds the thermistor's ${held.join(' and ')}`,
      };
    }
    return {
      holds: false,
      value: 0,
      unit: '',
      path: 'sensor.referenceOhmsToleranceFraction',
      message: `the budget lacks the thermistor's tolerance: sensor.referenceOhmsToleranceFraction is 0${s.betaKelvin === undefined ? '' : ' and so is sensor.betaToleranceFraction'}, so U covers the electronics and the noise only; fill in the element's resistance tolerance from its data sheet${s.betaKelvin === undefined ? ", or the bath calibration's uncertainty as a relative resistance half-width" : ' (and the beta tolerance)'}`,
    };
  },
  plausibleRanges: (s) => [
    { path: 'sensor.referenceOhms', value: s.referenceOhms, range: { min: 100, max: 1e6 }, unit: 'Ω' },
    ...(s.betaKelvin === undefined
      ? []
      : [{ path: 'sensor.betaKelvin', value: s.betaKelvin, range: { min: 2000, max: 6000 }, unit: 'K' }]),
  ],
};
