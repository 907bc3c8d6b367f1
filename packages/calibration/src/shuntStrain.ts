import { BridgeworkError, checkFinite, checkPositive, formatValue } from '@bridgework/core';
import { networkRatio, shuntOhmsForNetworkRatio } from './internal/shuntNetwork.js';
import { strainShuntSetup, type StrainShuntSetup } from './internal/strainShuntSetup.js';
import type { ShuntOhmsForStrainOptions, ShuntRatios, StrainFromShuntOptions } from './shuntOptions.js';

function ratios(setup: StrainShuntSetup, shuntOhms: number): ShuntRatios {
  return {
    zeroRatio: networkRatio(setup.network, Infinity),
    shuntedRatio: networkRatio(setup.network, shuntOhms),
  };
}

/** The resistance-equivalent strain's magnitude factor: |ε|·(spanned + series + Rs) = k. */
function resistanceEquivalentFactor(setup: StrainShuntSetup): number {
  return (setup.spannedOhms * (setup.spannedOhms / setup.elementOhms)) / setup.gaugeFactor;
}

/**
 * The output ratios of a shunt calibration: without and with the shunt, solved through the bridge
 * network with the leads where they are.
 *
 * @remarks
 * The shunted arm becomes its parallel combination with the shunt and the network is solved by
 * `solveBridge` (ideal meter). Placement at the instrument end of a three-wire cable sends the
 * shunt current through the sense lead and moves the reading point to its instrument end; the
 * star–delta transform of the gauge junction turns that circuit into an ordinary four-arm bridge,
 * so it is solved exactly too (method in docs/calibration.md). Checked against a 40-digit nodal
 * solve of the physical circuit (every wiring, placement and arm), within 1e-12 relative.
 *
 * @param options - Bridge, leads, placement, arm and `shuntOhms` (see {@link StrainFromShuntOptions}).
 * @returns The unshunted and shunted output ratios, V/V.
 * @throws {@link @bridgework/core!BridgeworkError} as {@link strainFromShunt}.
 * @example
 * ```ts
 * shuntRatios({ gaugeOhms: 350, gaugeFactor: 2, shuntOhms: 174_650 });
 * // { zeroRatio: 0, shuntedRatio: ≈ -5.005005005005e-4 } (= −Rg/(2(Rg + 2Rs)))
 * ```
 */
export function shuntRatios(options: StrainFromShuntOptions): ShuntRatios {
  const setup = strainShuntSetup(options, 'shuntOhms');
  const shuntOhms = checkPositive('shuntOhms', (options as unknown as Record<string, unknown>)['shuntOhms']);
  return ratios(setup, shuntOhms);
}

/**
 * The strain a shunt resistor simulates, by the chosen definition, with leads and placement.
 *
 * @remarks
 * Sign: the strain is signed as the bridge reads it (tension positive, active gauge in arm 1).
 * A shunt lowers its arm, so across arm 1 or 3 it simulates a negative strain and across arm 2 or
 * 4 a positive one.
 *
 * - `'resistance-equivalent'` (default): ε = −s·Ra²/(GF·Re·(Ra + Rb)), the strain at which a gauge
 *   of the arm changes by the same fraction ΔR/Re. Here s = +1 for arms 1, 3 and −1 for arms 2, 4;
 *   Re is the arm's element (gauge or completion resistor); Ra is what the shunt spans (Re at the
 *   gauge; the element and the arm's leads at the instrument); Rb is the shunt branch (Rs, plus
 *   the sense lead on a three-wire cable at the instrument). With no leads this is the textbook
 *   ε = −Rg/(GF·(Rg + Rs)) (for example Window & Holister, _Strain Gauge Technology_, shunt
 *   calibration; from memory). Closed form, correctly rounded to a few ulps.
 * - `'exact'`: the instrument converts the shunted reading with the arrangement's exact inverse,
 *   referenced to the unshunted reading (`strainFromRatio(r, { zeroRatio: r0 })`). For a gauge in
 *   arm 1 shunted at the gauge this equals the resistance-equivalent strain (the shunted gauge is
 *   a gauge at that strain), leads or not.
 * - `'linear'`: ε = (r − r0)/sensitivity, the tangent-line conversion of the instrument's model.
 *
 * The readings r0, r come from {@link shuntRatios} (exact, through `solveBridge`).
 *
 * @param options - Bridge, leads, placement, arm, definition and `shuntOhms`.
 * @returns The simulated strain, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type` for
 *   bad numbers; `invalid-option` for an unknown definition, placement, arrangement or wiring, or
 *   placement `'instrument'` on a four- or six-wire full bridge; `out-of-range` or `not-integer`
 *   for an arm other than 1–4; `missing-option` for a Poisson arrangement without `poissonRatio`;
 *   `ratio-out-of-range` when the instrument's model cannot convert the reading.
 * @example
 * ```ts
 * strainFromShunt({ gaugeOhms: 350, gaugeFactor: 2, shuntOhms: 174_650 }); // -0.001
 * strainFromShunt({ gaugeOhms: 350, gaugeFactor: 2, shuntOhms: 174_650, arm: 2 }); // 0.001
 * ```
 */
export function strainFromShunt(options: StrainFromShuntOptions): number {
  const setup = strainShuntSetup(options, 'shuntOhms');
  const shuntOhms = checkPositive('shuntOhms', (options as unknown as Record<string, unknown>)['shuntOhms']);
  if (setup.definition === 'resistance-equivalent') {
    return (
      (-setup.sign * resistanceEquivalentFactor(setup)) /
      (setup.spannedOhms + setup.branchSeriesOhms + shuntOhms)
    );
  }
  const { zeroRatio, shuntedRatio } = ratios(setup, shuntOhms);
  if (setup.definition === 'linear') return (shuntedRatio - zeroRatio) / setup.instrument.sensitivity;
  return setup.instrument.strainFromRatio(shuntedRatio, { zeroRatio });
}

/**
 * The shunt resistor that simulates a given strain, by the chosen definition, with leads and
 * placement: the inverse of {@link strainFromShunt}.
 *
 * @remarks
 * - `'resistance-equivalent'` (default), closed form: Rs = Ra²/(GF·Re·|ε|) − Ra − (sense lead);
 *   with no leads Rs = Rg/(GF·|ε|) − Rg, so 350 Ω, GF 2.0 and 1000 µε need 174 650 Ω.
 * - `'exact'`, `'linear'`: the target strain gives the reading the instrument must see (exact:
 *   r = ratioFromStrain(ε0 + ε·(1 + GF·ε0)) with ε0 the instrument's strain at the unshunted
 *   reading, the inverse of the two-reading method; linear: r = r0 + sensitivity·ε); `solveArm`
 *   then gives the shunted arm in closed form and the parallel formula the shunt. Round trip with
 *   {@link strainFromShunt} within 1e-10 relative (the shunt is the small difference of two arm
 *   resistances, which costs a few digits).
 *
 * The strain's sign must be one the arm can simulate (negative for arms 1 and 3, positive for 2
 * and 4), and its magnitude small enough for a positive shunt (for example |ε| < 1/GF with no
 * leads).
 *
 * @param options - Bridge, leads, placement, arm, definition and the target `strain` (m/m).
 * @returns The shunt resistance, Ω.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (param `strain`) for zero or a
 *   strain of the sign the arm cannot simulate, or a strain outside the instrument's range;
 *   `no-solution` (param `strain`) when the shunt would need a negative or zero resistance; and
 *   the errors of {@link strainFromShunt}.
 * @example
 * ```ts
 * shuntOhmsForStrain({ gaugeOhms: 350, gaugeFactor: 2, strain: -1e-3 }); // 174650
 * ```
 */
export function shuntOhmsForStrain(options: ShuntOhmsForStrainOptions): number {
  const setup = strainShuntSetup(options, 'strain');
  const strain = checkFinite('strain', (options as unknown as Record<string, unknown>)['strain']);
  if (!(setup.sign * strain < 0)) {
    const arm = setup.network.index + 1;
    const wanted = setup.sign > 0 ? 'negative' : 'positive';
    throw new BridgeworkError(
      'out-of-range',
      `\`strain\` must be ${wanted}: a shunt lowers arm ${arm}, which simulates ${setup.sign > 0 ? 'compression' : 'tension'}; got ${formatValue(strain)}`,
      { param: 'strain', value: strain, limit: setup.sign > 0 ? [-Infinity, 0] : [0, Infinity] },
    );
  }
  if (setup.definition === 'resistance-equivalent') {
    const shuntOhms =
      resistanceEquivalentFactor(setup) / Math.abs(strain) - setup.spannedOhms - setup.branchSeriesOhms;
    if (!(shuntOhms > 0)) {
      throw new BridgeworkError(
        'no-solution',
        `\`strain\` must be smaller in magnitude than ${resistanceEquivalentFactor(setup) / (setup.spannedOhms + setup.branchSeriesOhms)} for a positive shunt (this one would need a negative or zero resistance); got ${formatValue(strain)}`,
        { param: 'strain', value: strain },
      );
    }
    return shuntOhms;
  }
  const zeroRatio = networkRatio(setup.network, Infinity);
  const { instrument } = setup;
  let ratio: number;
  if (setup.definition === 'linear') {
    ratio = zeroRatio + instrument.sensitivity * strain;
  } else {
    const zeroStrain = instrument.strainFromRatio(zeroRatio);
    ratio = instrument.ratioFromStrain(zeroStrain + strain * (1 + setup.gaugeFactor * zeroStrain));
  }
  return shuntOhmsForNetworkRatio(setup.network, ratio, 'strain', strain);
}
