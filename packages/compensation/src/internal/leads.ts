import { createStrainBridge, type StrainBridge } from '@bridgework/bridge';
import { checkGaugeFactor, checkOhms, checkOneOf } from '@bridgework/core';
/** Lead wirings of a quarter-bridge gauge (see `LeadWiring` in the core package). */
export type QuarterBridgeWiring = 'two-wire' | 'three-wire';

/** The option keys of a quarter-bridge gauge (`QuarterBridgeGaugeOptions`). */
export const quarterGaugeKeys = ['gaugeFactor', 'gaugeOhms', 'completionOhms', 'wiring'] as const;

/** The quarter-bridge lead wirings, for option checks. */
export const quarterBridgeWirings: readonly QuarterBridgeWiring[] = ['two-wire', 'three-wire'];

/** Checks a quarter-bridge wiring option. */
export function checkQuarterWiring(param: string, value: unknown): QuarterBridgeWiring {
  return checkOneOf(param, value, quarterBridgeWirings);
}

/**
 * The gauge factor used where a result does not depend on it: with GF = 4 the nominal
 * quarter-bridge slope GF/4 is exactly 1, and every strain-bridge slope is exactly proportional to
 * GF (4 is a power of two, so the scaling is exact in binary floating point).
 */
export const UNIT_SLOPE_GAUGE_FACTOR = 4;

/** Checked options of a quarter-bridge gauge with leads (lead resistance excluded). */
export interface QuarterBridgeSetup {
  readonly gaugeFactor: number;
  readonly gaugeOhms: number;
  readonly completionOhms: number;
  readonly wiring: QuarterBridgeWiring;
}

/** Checks gaugeFactor, gaugeOhms (default 350), completionOhms (default gaugeOhms) and wiring. */
export function checkQuarterSetup(o: Record<string, unknown>): QuarterBridgeSetup {
  const gaugeFactor = checkGaugeFactor('gaugeFactor', o['gaugeFactor']);
  const gaugeOhms = o['gaugeOhms'] === undefined ? 350 : checkOhms('gaugeOhms', o['gaugeOhms']);
  const completionOhms =
    o['completionOhms'] === undefined ? gaugeOhms : checkOhms('completionOhms', o['completionOhms']);
  return { gaugeFactor, gaugeOhms, completionOhms, wiring: checkQuarterWiring('wiring', o['wiring']) };
}

/** The exact quarter bridge of `createStrainBridge` with the given lead resistance (or none). */
export function quarterBridge(setup: QuarterBridgeSetup, ohmsPerLead: number | undefined): StrainBridge {
  const { wiring, ...rest } = setup;
  return createStrainBridge({
    arrangement: 'quarter',
    ...rest,
    ...(ohmsPerLead === undefined ? {} : { leads: { ohmsPerLead, wiring } }),
  });
}
