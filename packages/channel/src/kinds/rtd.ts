/**
 * A platinum RTD (IEC 60751 Callendar–Van Dusen, compensation `createRtd`) in arm 1 of a quarter
 * bridge. The element's relative change (R − R0)/R0 enters arm 1 exactly as a gauge's GF·ε does,
 * so the bridge package's quarter bridge with gauge factor 1 and "gauge" resistance R0 solves it.
 */
import { createStrainBridge } from '@bridgework/bridge';
import { IEC_60751_COEFFICIENTS, createRtd, RTD_TOLERANCE_CLASSES } from '@bridgework/compensation';
import { choiceField, numberField, type ObjectOut } from '../spec/schema.js';
import { formatSignificant } from '../units/quantity.js';
import { KIND_PARAMETERS_START, Parameter, type SensorKind } from './SensorKind.js';

const fields = {
  r0Ohms: numberField({
    unit: { dimension: 'resistance' },
    min: 0,
    minExclusive: true,
    default: 100,
  }),
  a: numberField({ default: IEC_60751_COEFFICIENTS.a }),
  b: numberField({ default: IEC_60751_COEFFICIENTS.b }),
  c: numberField({ default: IEC_60751_COEFFICIENTS.c }),
  toleranceClass: choiceField(['AA', 'A', 'B', 'C'] as const, {
    optional: true,
  }),
  element: choiceField(['wire-wound', 'film'] as const, {
    default: 'wire-wound',
  }),
};

type RtdSpec = ObjectOut<typeof fields>;
/** Index of the class deviation (°C, nominal 0) in the parameter vector. */
export const CLASS_DEVIATION = KIND_PARAMETERS_START;

/** The element's IEC 60751 curve. */
export function curve(s: RtdSpec) {
  return createRtd({ r0Ohms: s.r0Ohms, a: s.a, b: s.b, c: s.c });
}

/** The RTD kind. */
export const rtdKind: SensorKind<typeof fields, 'rtd'> = {
  name: 'rtd',
  fields,
  quantities: ['temperature'],
  placement: 'arm-1',
  temperatureLine: undefined,
  // The class tolerance: the element's deviation from the standard curve, added to the temperature (nominal 0).
  parameters: () => [{ key: 'classDeviationCelsius', nominal: 0 }],
  nominalOhms: (s) => s.r0Ohms,
  check(s, spec, report) {
    if (spec.zero !== undefined)
      report('zero', 'must be absent for an RTD (its temperature is absolute; there is no zero reading)');
    if (
      s.toleranceClass !== undefined &&
      spec.output.range !== undefined &&
      spec.output.quantity === 'temperature' &&
      spec.output.unit === '°C'
    ) {
      const c = RTD_TOLERANCE_CLASSES[s.toleranceClass];
      const [lo, hi] = s.element === 'film' ? c.filmRangeCelsius : c.wireWoundRangeCelsius;
      const r = spec.output.range;
      if (r.min < lo || r.max > hi) {
        report(
          'output.range',
          `must lie inside [${lo}, ${hi}] °C, where IEC 60751 class ${s.toleranceClass} (${s.element}) holds; got [${r.min}, ${r.max}] °C`,
          {
            suggestion:
              'narrow output.range, or remove sensor.toleranceClass and state the sensor’s tolerance otherwise',
          },
        );
      }
    }
  },
  describe: (s) =>
    `platinum RTD, R0 ${formatSignificant(s.r0Ohms)} Ω${s.toleranceClass === undefined ? '' : ` (IEC 60751 class ${s.toleranceClass})`}, in a quarter bridge`,
  defaultSpan(ctx) {
    const s = ctx.sensor;
    if (s.toleranceClass !== undefined) {
      const c = RTD_TOLERANCE_CLASSES[s.toleranceClass];
      const [min, max] = s.element === 'film' ? c.filmRangeCelsius : c.wireWoundRangeCelsius;
      return { min, max };
    }
    // The curve's whole range less 1 % of its width at each end: the budget's tolerances move a
    // reading at the very end of IEC 60751's range past it (0.1 % of excitation is about 2 °C at 850 °C).
    const [min, max] = curve(s).rangeCelsius;
    const room = 0.01 * (max - min);
    return { min: min + room, max: max - room };
  },
  exactMap(ctx, p) {
    const s = ctx.sensor;
    const rtd = curve(s);
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 1,
      gaugeOhms: s.r0Ohms,
      completionOhms: p[Parameter.completionOhms] as number,
      sourceOhms: ctx.sourceOhms,
      leads: { ohmsPerLead: p[Parameter.ohmsPerLead] as number, wiring: ctx.wiring },
    });
    const deviation = p[CLASS_DEVIATION] as number;
    const ohmsFromRatio = (ratio: number) => s.r0Ohms * (1 + bridge.strainFromRatio(ratio));
    return {
      quantityFromRatio: (ratio) => rtd.temperatureAt(ohmsFromRatio(ratio)) + deviation,
      ratioFromQuantity: (t) => bridge.ratioFromStrain(rtd.ohmsAt(t - deviation) / s.r0Ohms - 1),
      // The sensor's range is the curve's (−200…850 °C for IEC 60751), inside the bridge's.
      ratioRange: {
        min: bridge.ratioFromStrain(rtd.rangeOhms[0] / s.r0Ohms - 1),
        max: bridge.ratioFromStrain(rtd.rangeOhms[1] / s.r0Ohms - 1),
      },
      linearFractional: false,
      frontEndSpan(ratioMin, ratioMax) {
        const ends = [bridge.strainFromRatio(ratioMin), bridge.strainFromRatio(ratioMax)].sort(
          (a, b) => a - b,
        ) as [number, number];
        return { bridge, strainRange: { min: ends[0], max: ends[1] } };
      },
      ...(deviation === 0
        ? {
            resistance: {
              fromRatio: ohmsFromRatio,
              curve: { model: 'callendar-van-dusen' as const, r0Ohms: s.r0Ohms, a: s.a, b: s.b, c: s.c },
            },
          }
        : {}),
    };
  },
};

export type { RtdSpec };
