import { checkFinite, checkFiniteResult, checkGaugeFactor, checkOptions } from '@bridgework/core';

/** Options of {@link rescaleGaugeFactor}. */
export interface RescaleGaugeFactorOptions {
  /** The strain indicated with the instrument set to `fromGaugeFactor`, m/m. */
  readonly strain: number;
  /** The gauge-factor setting under which `strain` was indicated (> 0). */
  readonly fromGaugeFactor: number;
  /** The gauge factor to refer the strain to (> 0): usually the gauge's actual factor. */
  readonly toGaugeFactor: number;
}

/**
 * Re-expresses a strain indicated under one gauge-factor setting for another gauge factor.
 *
 * @remarks
 * An instrument set to GF_from turns a relative resistance change ΔR/R into ε = (ΔR/R)/GF_from.
 * The same resistance change read with GF_to is ε·GF_from/GF_to. This is exact for any
 * instrument whose strain is (ΔR/R)/GF, which includes the exact inverse of `createStrainBridge`
 * with the two-reading method (quarter bridge); it is the standard correction for a reading taken
 * with the "wrong" gauge-factor setting (common practice). Also used to rescale a thermal-output
 * curve recorded at one setting. Two roundings: within 1 ulp of the exact product.
 *
 * @param options - The indicated strain and the two gauge factors.
 * @returns The strain referred to `toGaugeFactor`, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`;
 *   `out-of-range` for a gauge factor outside [0.01, 1000], or a strain whose rescaled value would
 *   exceed binary64;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * // Logged with the instrument at GF 2.00; the gauges' lot factor is 2.11:
 * rescaleGaugeFactor({ strain: 1.2e-3, fromGaugeFactor: 2, toGaugeFactor: 2.11 }); // 1.1374407582938387e-3
 * ```
 */
export function rescaleGaugeFactor(options: RescaleGaugeFactorOptions): number {
  const o = checkOptions('options', options, {
    known: ['strain', 'fromGaugeFactor', 'toGaugeFactor'],
    required: ['strain', 'fromGaugeFactor', 'toGaugeFactor'],
  });
  const strain = checkFinite('strain', o['strain']);
  const from = checkGaugeFactor('fromGaugeFactor', o['fromGaugeFactor']);
  const to = checkGaugeFactor('toGaugeFactor', o['toGaugeFactor']);
  return checkFiniteResult((strain * from) / to, {
    what: 'the rescaled strain',
    param: 'strain',
    value: strain,
  });
}
