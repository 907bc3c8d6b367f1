import { solveArm, solveBridge } from '@bridgework/bridge';
import {
  BridgeworkError,
  OHMS_LIMITS,
  checkFinite,
  checkOhms,
  checkOneOf,
  checkOptions,
  formatValue,
  blameOption,
} from '@bridgework/core';
import type { Rtd } from './createRtd.js';

/** How an RTD is connected: two leads, three leads (one sense lead) or four leads (Kelvin). */
export type RtdWiring = 'two-wire' | 'three-wire' | 'four-wire';

/** How the instrument reads the RTD. */
export type RtdReadout = 'resistance' | 'quarter-bridge';

/** Options of {@link rtdLeadError}. */
export interface RtdLeadErrorOptions {
  /** The RTD model (from `createRtd`). */
  readonly rtd: Rtd;
  /** The true RTD temperature, °C, in [−200, 850]. */
  readonly temperatureCelsius: number;
  /** Resistance RL of one lead conductor (lead 2, and lead 1 before any mismatch), Ω (≥ 0). */
  readonly ohmsPerLead: number;
  /** `'two-wire'`, `'three-wire'` or `'four-wire'` (four-wire with the `'resistance'` readout only). */
  readonly wiring: RtdWiring;
  /** Lead 1 minus lead 2 resistance, Ω: the imbalance three-wire compensation cannot remove. Default 0. */
  readonly leadMismatchOhms?: number;
  /** `'resistance'` (default: a current source and voltmeter) or `'quarter-bridge'`. */
  readonly readout?: RtdReadout;
  /** Completion resistance of arms 2, 3 and 4 for the quarter-bridge readout, Ω (> 0). Default R0. */
  readonly completionOhms?: number;
}

/** The reading of an RTD through its leads (see {@link rtdLeadError}). */
export interface RtdLeadError {
  /** The resistance the instrument infers, assuming no lead resistance, Ω. */
  readonly measuredOhms: number;
  /** The temperature it indicates from that resistance, °C. */
  readonly indicatedCelsius: number;
  /** Indicated minus true temperature, K. */
  readonly errorCelsius: number;
}

/**
 * The temperature error of an RTD reading caused by its lead wires, for two-, three- and four-wire
 * connections.
 *
 * @remarks
 * Lead 1 and lead 2 carry the measuring current to the two ends of the element, RL1 = RL + ΔRL
 * and RL2 = RL; a three-wire connection adds a sense lead at the lead-2 end that carries no
 * current; four-wire adds sense leads at both ends. The instrument infers the element's
 * resistance assuming no leads, then the temperature through `rtd.temperatureAt`.
 *
 * With the `'resistance'` readout (a current source and a voltmeter, common practice):
 * - two-wire: both leads are in the measured loop, R = Rt + RL1 + RL2;
 * - three-wire: the instrument subtracts the lead-2 drop measured through the sense lead,
 *   R = Rt + RL1 − RL2 = Rt + ΔRL (exact compensation for equal leads);
 * - four-wire: the sense leads carry no current, R = Rt.
 *
 * With the `'quarter-bridge'` readout the RTD is arm 1 of a bridge with completion Rc and the
 * lead model of the bridge package: two-wire puts both leads in arm 1; three-wire puts lead 1 in
 * arm 1 and lead 2 in arm 2, the sense lead going to S−. The ratio comes from `solveBridge`
 * (ideal meter) and the instrument's resistance from `solveArm` of the lead-free bridge. Two-wire
 * then gives R = Rt + RL1 + RL2 again; three-wire gives R = Rc·(Rt + RL1)/(Rc + RL2), which
 * cancels equal leads only where Rt = Rc (at the balance temperature). Both are checked against
 * these closed forms in the tests.
 *
 * @param options - The RTD, its true temperature, the leads, the readout.
 * @returns Measured resistance (Ω), indicated temperature (°C) and its error (K).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown wiring or
 *   readout, or four-wire with the quarter-bridge readout; `out-of-range` for a temperature
 *   outside [−200, 850] °C, a resistance outside `OHMS_LIMITS` of the core package, a lead
 *   mismatch beyond ±1e15 Ω, or a measured resistance outside the RTD's range (reported against
 *   `ohmsPerLead`, the option that moved it there); `negative` when RL + ΔRL < 0; `wrong-type` for
 *   an `rtd` that is not an evaluator; `not-positive`, `not-finite` for bad numbers;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * // Pt100 at 60 °C on 25 m of AWG 24 copper (2.105 Ω per lead), two-wire:
 * rtdLeadError({ rtd: createRtd(), temperatureCelsius: 60, ohmsPerLead: 2.105, wiring: 'two-wire' }).errorCelsius;
 * // ≈ +10.98 K; three-wire with a 0.02 Ω mismatch: ≈ +0.052 K
 * ```
 */
export function rtdLeadError(options: RtdLeadErrorOptions): RtdLeadError {
  const o = checkOptions('options', options, {
    known: [
      'rtd',
      'temperatureCelsius',
      'ohmsPerLead',
      'wiring',
      'leadMismatchOhms',
      'readout',
      'completionOhms',
    ],
    required: ['rtd', 'temperatureCelsius', 'ohmsPerLead', 'wiring'],
  });
  const rtd = o['rtd'] as Rtd;
  if (typeof (rtd as Partial<Rtd> | null)?.temperatureAt !== 'function' || typeof rtd.ohmsAt !== 'function') {
    throw new BridgeworkError(
      'wrong-type',
      `\`rtd\` must be an evaluator from createRtd; got ${formatValue(rtd)}`,
      {
        param: 'rtd',
        value: rtd,
      },
    );
  }
  const temperatureCelsius = checkFinite('temperatureCelsius', o['temperatureCelsius']);
  const ohmsPerLead = checkOhms('ohmsPerLead', o['ohmsPerLead'], { allowZero: true });
  const wiring = checkOneOf('wiring', o['wiring'], ['two-wire', 'three-wire', 'four-wire']);
  const mismatch =
    o['leadMismatchOhms'] === undefined ? 0 : checkFinite('leadMismatchOhms', o['leadMismatchOhms']);
  if (!(Math.abs(mismatch) <= OHMS_LIMITS.max)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`leadMismatchOhms\` must be within ±${OHMS_LIMITS.max} Ω; got ${formatValue(mismatch)}`,
      { param: 'leadMismatchOhms', value: mismatch, limit: [-OHMS_LIMITS.max, OHMS_LIMITS.max] },
    );
  }
  const readout =
    o['readout'] === undefined
      ? 'resistance'
      : checkOneOf('readout', o['readout'], ['resistance', 'quarter-bridge']);
  const lead1 = ohmsPerLead + mismatch;
  if (lead1 < 0) {
    throw new BridgeworkError(
      'negative',
      `\`leadMismatchOhms\` must keep lead 1 (RL + ΔRL) ≥ 0; got ${mismatch}`,
      {
        param: 'leadMismatchOhms',
        value: mismatch,
        limit: -ohmsPerLead,
      },
    );
  }
  const lead2 = ohmsPerLead;
  const rt = rtd.ohmsAt(temperatureCelsius);
  const leads = { param: 'ohmsPerLead', value: ohmsPerLead };

  let measuredOhms: number;
  if (readout === 'resistance') {
    measuredOhms =
      wiring === 'two-wire' ? rt + lead1 + lead2 : wiring === 'three-wire' ? rt + (lead1 - lead2) : rt;
  } else {
    if (wiring === 'four-wire') {
      throw new BridgeworkError(
        'invalid-option',
        "`wiring` must be 'two-wire' or 'three-wire' for the quarter-bridge readout; got 'four-wire'",
        {
          param: 'wiring',
          value: wiring,
          limit: ['two-wire', 'three-wire'],
        },
      );
    }
    const rc =
      o['completionOhms'] === undefined ? rtd.r0Ohms : checkOhms('completionOhms', o['completionOhms']);
    const armsOhms: [number, number, number, number] =
      wiring === 'two-wire' ? [rt + lead1 + lead2, rc, rc, rc] : [rt + lead1, rc + lead2, rc, rc];
    measuredOhms = blameOption(
      { ...leads, requirement: 'must leave a bridge the instrument can solve' },
      () =>
        solveArm({
          armsOhms: [null, rc, rc, rc],
          excitationVolts: 1,
          outputVolts: solveBridge({ armsOhms, excitationVolts: 1 }).outputVolts,
        }),
    );
  }
  const indicatedCelsius = blameOption(
    { ...leads, requirement: "must leave the measured resistance inside the sensor's range" },
    () => rtd.temperatureAt(measuredOhms),
  );
  return { measuredOhms, indicatedCelsius, errorCelsius: indicatedCelsius - temperatureCelsius };
}
