import { checkOhms, checkOneOf, checkOptions } from '@bridgework/core';
import type { FullBridgeWiring } from './leadDesensitization.js';

/** Options of {@link leadSpanDrift}. */
export interface LeadSpanDriftOptions {
  /** `'four-wire'` or `'six-wire'` (remote sense). */
  readonly wiring: FullBridgeWiring;
  /** Input resistance Rin of the transducer in Ω (> 0). */
  readonly inputOhms: number;
  /** Resistance of one lead when the channel was calibrated, Ω (≥ 0). */
  readonly referenceOhmsPerLead: number;
  /** Resistance of one lead now, Ω (≥ 0); see `wireOhms` for its temperature dependence. */
  readonly ohmsPerLead: number;
}

/**
 * The fractional span change of a full-bridge transducer when its cable's lead resistance changes.
 *
 * @remarks
 * On a four-wire cable the excitation leads and the transducer's input resistance form a divider,
 * so the span factor is Rin/(Rin + 2RL) (see `leadDesensitization`). Calibrated with leads of RL0
 * and read with RL1, the span changes by
 *
 *   (Rin + 2RL0)/(Rin + 2RL1) − 1 = −2(RL1 − RL0)/(Rin + 2RL1),
 *
 * evaluated in the right-hand form, without cancellation. A copper cable warming by ΔT raises RL
 * by 0.393 %/K, so the span drifts by about −2·RL·0.00393·ΔT/Rin. Six-wire remote sense measures
 * the excitation at the transducer, so its span does not drift with the leads: the result is 0.
 * Excitation leads do not shift the zero of a bridge with zero output at no load.
 *
 * @param options - Wiring, input resistance, reference and present lead resistance.
 * @returns Span change as a fraction (negative when the leads warm).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a wiring other than
 *   four- or six-wire; `not-positive`, `negative`, `not-finite`, `wrong-type` for bad numbers;
 *   `out-of-range` for a resistance outside `OHMS_LIMITS` of the core package (leads may be 0);
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * leadSpanDrift({ wiring: 'four-wire', inputOhms: 350, referenceOhmsPerLead: 2, ohmsPerLead: 2.2 });
 * // -0.0011286681715575... (−0.113 %)
 * ```
 */
export function leadSpanDrift(options: LeadSpanDriftOptions): number {
  const o = checkOptions('options', options, {
    known: ['wiring', 'inputOhms', 'referenceOhmsPerLead', 'ohmsPerLead'],
    required: ['wiring', 'inputOhms', 'referenceOhmsPerLead', 'ohmsPerLead'],
  });
  const wiring = checkOneOf('wiring', o['wiring'], ['four-wire', 'six-wire']);
  const inputOhms = checkOhms('inputOhms', o['inputOhms']);
  const referenceOhmsPerLead = checkOhms('referenceOhmsPerLead', o['referenceOhmsPerLead'], {
    allowZero: true,
  });
  const ohmsPerLead = checkOhms('ohmsPerLead', o['ohmsPerLead'], { allowZero: true });
  if (wiring === 'six-wire') return 0;
  return (-2 * (ohmsPerLead - referenceOhmsPerLead)) / (inputOhms + 2 * ohmsPerLead);
}
