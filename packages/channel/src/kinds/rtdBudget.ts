/**
 * The budget side of the RTD kind (see `SensorKindBudget`): its map as straight-line arithmetic for Monte Carlo, its IEC 60751 class tolerance and the plausible range of R0. Only the budget imports
 * it (through `budgetRegistry.ts`), so the conversion path does not carry it.
 */
import { createStrainBridgeKernel } from '@bridgework/bridge';
import { rtdToleranceCelsius, RTD_TOLERANCE_CLASSES } from '@bridgework/compensation';
import { formatSignificant } from '../units/quantity.js';
import { Parameter, type KindContext, type SensorKindBudget } from './SensorKind.js';
import { CLASS_DEVIATION, curve, type RtdSpec, type rtdKind } from './rtd.js';

/** The RTD kind's budget side. */
export const rtdBudget: SensorKindBudget<(typeof rtdKind)['fields']> = {
  fastMap(ctx: KindContext<RtdSpec>) {
    const s = ctx.sensor;
    const rtd = curve(s);
    // The element in arm 1 of a quarter bridge: gauge factor 1, "gauge" resistance R0 (the bridge package's closed form).
    const bridge = createStrainBridgeKernel({
      arrangement: 'quarter',
      gaugeFactor: 1,
      gaugeOhms: s.r0Ohms,
      wiring: ctx.wiring,
      sourceOhms: ctx.sourceOhms,
    });
    return {
      quantity(ratio, _zero, p) {
        const e = bridge.strainFromRatio(
          ratio,
          p[Parameter.completionOhms] as number,
          p[Parameter.ohmsPerLead] as number,
        );
        return rtd.temperatureAt(s.r0Ohms * (1 + e)) + (p[CLASS_DEVIATION] as number);
      },
    };
  },
  budgetInputs(ctx, at) {
    const s = ctx.sensor;
    if (s.toleranceClass === undefined || ctx.quantity !== 'temperature') return [];
    const halfWidth = rtdToleranceCelsius({
      toleranceClass: s.toleranceClass,
      temperatureCelsius: at,
      element: s.element,
    });
    return [
      {
        name: 'RTD class tolerance',
        index: CLASS_DEVIATION,
        halfWidth,
        kind: 'tolerance',
        model: `IEC 60751 class ${s.toleranceClass} (${s.element}) limits ±(${RTD_TOLERANCE_CLASSES[s.toleranceClass].fixedCelsius} + ${RTD_TOLERANCE_CLASSES[s.toleranceClass].proportional}·|t|) °C at ${formatSignificant(at)} °C`,
      },
    ];
  },
  calibrationCheck: (s, spec) => {
    if (spec.output.quantity !== 'temperature') return undefined;
    if (s.toleranceClass === undefined) {
      return {
        holds: false,
        value: 0,
        unit: '°C',
        path: 'sensor.toleranceClass',
        message:
          "the budget lacks the RTD's tolerance: sensor.toleranceClass is not set, so U covers the electronics and the noise only; give the element's IEC 60751 class (AA, A, B or C) from its data sheet",
      };
    }
    const c = RTD_TOLERANCE_CLASSES[s.toleranceClass];
    return {
      holds: true,
      value: c.fixedCelsius,
      unit: '°C',
      path: 'sensor.toleranceClass',
      message: `the budget holds IEC 60751 class ${s.toleranceClass}'s tolerance ±(${c.fixedCelsius} + ${c.proportional}·|t|) °C (sensor.toleranceClass)`,
    };
  },
  plausibleRanges: (s) => [
    { path: 'sensor.r0Ohms', value: s.r0Ohms, range: { min: 10, max: 10_000 }, unit: 'Ω' },
  ],
};
