/**
 * TEST ONLY: an invented sensor kind, written against the public contract only, like a new kind
 * would be. Used by the channel package's touch-point test and by the command's test that runs
 * every command on a kind it cannot know by name.
 */
import { createStrainBridge } from '@bridgework/bridge';
import { KIND_PARAMETERS_START, Parameter, type SensorKind } from '../../src/kinds/SensorKind.js';
import { numberField } from '../../src/spec/schema.js';

/**
 * An invented resistive sensor: an element whose relative resistance change is k times the
 * strain, R = R0·(1 + k·ε), in arm 1 of a quarter bridge. Its module is written against the
 * public contract only, like a new kind would be.
 */
const fields = {
  r0Ohms: numberField({
    doc: 'Element resistance at zero',
    unit: { dimension: 'resistance' },
    min: 0,
    minExclusive: true,
    default: 1000,
  }),
  sensitivity: numberField({ doc: 'Relative resistance change per unit strain', min: 0, minExclusive: true }),
};
export const fakeKind: SensorKind<typeof fields, 'resistive-film'> = {
  name: 'resistive-film',
  doc: 'An invented resistive film: R = R0·(1 + k·ε), in arm 1',
  fields,
  quantities: ['strain'],
  placement: 'arm-1',
  temperatureLine: undefined,
  parameters: (s) => [{ key: 'sensitivity', nominal: s.sensitivity }],
  nominalOhms: (s) => s.r0Ohms,
  describe: (s) => `resistive film, R0 ${s.r0Ohms} Ω, k ${s.sensitivity}`,
  defaultSpan: () => ({ min: -1e-3, max: 1e-3 }),
  exactMap(ctx, p) {
    // The bridge package's quarter bridge with "gauge factor" k solves it exactly.
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: p[KIND_PARAMETERS_START] as number,
      gaugeOhms: ctx.sensor.r0Ohms,
      completionOhms: p[Parameter.completionOhms] as number,
      sourceOhms: ctx.sourceOhms,
      leads: { ohmsPerLead: p[Parameter.ohmsPerLead] as number, wiring: ctx.wiring },
    });
    return {
      quantityFromRatio: (r) => bridge.strainFromRatio(r),
      ratioFromQuantity: (q) => bridge.ratioFromStrain(q),
      ratioRange: bridge.ratioRange,
      linearFractional: true,
      frontEndSpan: (a, b) => ({
        bridge,
        strainRange: { min: bridge.strainFromRatio(a), max: bridge.strainFromRatio(b) },
      }),
    };
  },
  budget: { budgetInputs: () => [] },
};
