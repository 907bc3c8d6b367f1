/**
 * An NTC thermistor (compensation `createBetaThermistor` or `createSteinhartHartThermistor`) in
 * arm 1 of a quarter bridge, solved like an RTD (a quarter bridge with gauge factor 1 and "gauge"
 * resistance R0). With a dissipation constant the map corrects the element's self-heating: the
 * element sits at T = T_ambient + P/δ, P the power in it (bridge package `solveBridge`), and the
 * channel reads the ambient temperature.
 */
import { ZERO_CELSIUS_KELVIN } from '@bridgework/core';
import { createStrainBridge, solveBridge } from '@bridgework/bridge';
import {
  createBetaThermistor,
  createSteinhartHartThermistor,
  type Thermistor,
} from '@bridgework/compensation';
import { intervalField, numberField, objectField, type ObjectOut } from '../spec/schema.js';
import { formatSignificant } from '../units/quantity.js';
import { KIND_PARAMETERS_START, Parameter, type SensorKind } from './SensorKind.js';

const fraction = { dimension: 'fraction' } as const;
const relative = () => numberField({ unit: fraction, min: 0, max: 1, maxExclusive: true, default: 0 });

const fields = {
  referenceOhms: numberField({
    doc: 'Resistance R0 at the reference temperature (a data sheet’s R25)',
    unit: { dimension: 'resistance' },
    min: 0,
    minExclusive: true,
  }),
  referenceCelsius: numberField({
    unit: { dimension: 'temperature' },
    default: 25,
  }),
  betaKelvin: numberField({
    unit: { dimension: 'temperature-difference' },
    min: 0,
    minExclusive: true,
    optional: true,
  }),
  steinhartHart: objectField(
    {
      a: numberField({ doc: 'a, 1/K' }),
      b: numberField({ doc: 'b, 1/K (> 0 for an NTC)', min: 0, minExclusive: true }),
      c: numberField({ doc: 'c, 1/K' }),
    },
    {
      presence: 'optional',
    },
  ),
  rangeCelsius: intervalField({
    unit: { dimension: 'temperature' },
    derived: true,
  }),
  referenceOhmsToleranceFraction: relative(),
  betaToleranceFraction: relative(),
  dissipationConstantWattsPerKelvin: numberField({
    unit: { dimension: 'thermal-conductance' },
    min: 0,
    minExclusive: true,
    optional: true,
  }),
  dissipationToleranceFraction: relative(),
};

type ThermistorSpec = ObjectOut<typeof fields>;

/** Index of the element's relative resistance deviation δ in the parameter vector. */
export const RESISTANCE_DEVIATION = KIND_PARAMETERS_START;
/** Index of the beta constant, K. */
export const BETA = KIND_PARAMETERS_START + 1;
/** Index of the dissipation constant, W/K (0: no self-heating correction). */
export const DISSIPATION = KIND_PARAMETERS_START + 2;

/** The default temperature range of the model (a common NTC rating; common practice). */
const DEFAULT_RANGE = { min: -55, max: 150 } as const;

/** The element's model (beta with the given B, or Steinhart–Hart). */
export function model(s: ThermistorSpec, beta: number): Thermistor {
  const rangeCelsius: [number, number] = [s.rangeCelsius.min, s.rangeCelsius.max];
  return s.steinhartHart !== undefined
    ? createSteinhartHartThermistor({ ...s.steinhartHart, rangeCelsius })
    : createBetaThermistor({
        referenceOhms: s.referenceOhms,
        referenceCelsius: s.referenceCelsius,
        betaKelvin: beta,
        rangeCelsius,
      });
}

/** The thermistor kind. */
export const thermistorKind: SensorKind<typeof fields, 'thermistor'> = {
  name: 'thermistor',
  fields,
  quantities: ['temperature'],
  placement: 'arm-1',
  temperatureLine: undefined,
  parameters: (s) => [
    { key: 'resistanceDeviationFraction', nominal: 0 },
    { key: 'betaKelvin', nominal: s.betaKelvin ?? 0 },
    { key: 'dissipationConstantWattsPerKelvin', nominal: s.dissipationConstantWattsPerKelvin ?? 0 },
  ],
  nominalOhms: (s) => s.referenceOhms,
  finalize: (s) => (s.rangeCelsius === undefined ? { ...s, rangeCelsius: DEFAULT_RANGE } : s),
  check(s, spec, report) {
    if ((s.betaKelvin === undefined) === (s.steinhartHart === undefined)) {
      report(
        'sensor.betaKelvin',
        'give exactly one of sensor.betaKelvin and sensor.steinhartHart (the thermistor’s model)',
      );
    }
    if (s.betaToleranceFraction > 0 && s.betaKelvin === undefined) {
      report('sensor.betaToleranceFraction', 'applies to the beta model only (sensor.betaKelvin)');
    }
    if (s.dissipationToleranceFraction > 0 && s.dissipationConstantWattsPerKelvin === undefined) {
      report('sensor.dissipationToleranceFraction', 'needs sensor.dissipationConstantWattsPerKelvin');
    }
    if (!(s.rangeCelsius.min > -ZERO_CELSIUS_KELVIN))
      report('sensor.rangeCelsius', 'must lie above absolute zero');
    if (spec.zero !== undefined)
      report(
        'zero',
        'must be absent for a thermistor (its temperature is absolute; there is no zero reading)',
      );
  },
  describe: (s) =>
    `NTC thermistor, R0 ${formatSignificant(s.referenceOhms)} Ω at ${formatSignificant(s.referenceCelsius)} °C, ${s.betaKelvin === undefined ? 'Steinhart–Hart' : `B ${formatSignificant(s.betaKelvin)} K`}, in a quarter bridge`,
  defaultSpan: (ctx) => ({ min: ctx.sensor.rangeCelsius.min, max: ctx.sensor.rangeCelsius.max }),
  exactMap(ctx, p) {
    const s = ctx.sensor;
    const ntc = model(s, p[BETA] as number);
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 1,
      gaugeOhms: s.referenceOhms,
      completionOhms: p[Parameter.completionOhms] as number,
      sourceOhms: ctx.sourceOhms,
      leads: { ohmsPerLead: p[Parameter.ohmsPerLead] as number, wiring: ctx.wiring },
    });
    const deviation = 1 + (p[RESISTANCE_DEVIATION] as number);
    const dissipation = p[DISSIPATION] as number;
    const excitationVolts = p[Parameter.excitationVolts] as number;
    // Power in the element (not its leads): solveBridge with the arms at this strain, the whole source resistance in series.
    const watts = (strain: number): number => {
      const arms = bridge.armsOhms(strain);
      const sol = solveBridge({
        armsOhms: arms,
        excitationVolts,
        sourceOhms: ctx.spec.excitation.sourceOhms,
      });
      const element = s.referenceOhms * (1 + strain);
      return (sol.armAmps[0] as number) ** 2 * element;
    };
    const selfHeating = (strain: number) => (dissipation > 0 ? watts(strain) / dissipation : 0);
    const ohmsFromRatio = (ratio: number) => s.referenceOhms * (1 + bridge.strainFromRatio(ratio));
    const [rLow, rHigh] = [
      ntc.ohmsAt(s.rangeCelsius.max) * deviation,
      ntc.ohmsAt(s.rangeCelsius.min) * deviation,
    ];
    const ends = [
      bridge.ratioFromStrain(rLow / s.referenceOhms - 1),
      bridge.ratioFromStrain(rHigh / s.referenceOhms - 1),
    ];
    return {
      quantityFromRatio(ratio) {
        const strain = bridge.strainFromRatio(ratio);
        return ntc.temperatureAt((s.referenceOhms * (1 + strain)) / deviation) - selfHeating(strain);
      },
      ratioFromQuantity(ambient) {
        // The element's temperature T solves T = ambient + P(T)/δ: a contraction (P/δ changes by
        // far less than a kelvin per kelvin), iterated to a fixed point.
        let t = ambient;
        for (let i = 0; i < 100; i++) {
          const strain = (ntc.ohmsAt(t) * deviation) / s.referenceOhms - 1;
          const next = ambient + selfHeating(strain);
          if (Math.abs(next - t) <= 1e-13 * Math.max(1, Math.abs(t))) {
            t = next;
            break;
          }
          t = next;
        }
        return bridge.ratioFromStrain((ntc.ohmsAt(t) * deviation) / s.referenceOhms - 1);
      },
      ratioRange: { min: Math.min(...ends), max: Math.max(...ends) },
      linearFractional: false,
      frontEndSpan(ratioMin, ratioMax) {
        const e = [bridge.strainFromRatio(ratioMin), bridge.strainFromRatio(ratioMax)].sort(
          (a, b) => a - b,
        ) as [number, number];
        return { bridge, strainRange: { min: e[0], max: e[1] } };
      },
      ...(dissipation === 0 && deviation === 1
        ? {
            resistance: {
              fromRatio: ohmsFromRatio,
              curve:
                s.steinhartHart !== undefined
                  ? { model: 'steinhart-hart' as const, ...s.steinhartHart }
                  : {
                      model: 'beta' as const,
                      referenceOhms: s.referenceOhms,
                      referenceCelsius: s.referenceCelsius,
                      betaKelvin: p[BETA] as number,
                    },
            },
          }
        : {}),
    };
  },
};

export type { ThermistorSpec };
