import { createStrainBridge } from '@bridgework/bridge';
import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkLength,
  checkOptions,
  checkOneOf,
  checkPositive,
  formatValue,
  type LeadsOptions,
} from '@bridgework/core';
import { checkNonZero, finiteResult } from './internal/checks.js';
import {
  networkRatio,
  shuntOhmsForNetworkRatio,
  type ArmIndex,
  type ShuntNetwork,
} from './internal/shuntNetwork.js';
import type { BridgeArm } from './shuntOptions.js';

/** The full-bridge transducer and shunt position shared by the transducer shunt functions. */
export interface TransducerShuntOptions {
  /** Resistance of each of four equal arms in Ω (> 0). Default 350. Excludes `armsOhms`. */
  readonly bridgeOhms?: number;
  /** The four arms `[R1, R2, R3, R4]` in Ω, when they are not equal. Excludes `bridgeOhms`. */
  readonly armsOhms?: readonly [number, number, number, number];
  /** The arm the shunt is across, inside the transducer. Default 1. */
  readonly arm?: BridgeArm;
  /** The cable: `'four-wire'` (excitation leads drop part of the excitation) or `'six-wire'` (sensed). Default: none. */
  readonly leads?: LeadsOptions;
  /** Series resistance of the excitation source in Ω (≥ 0). Default 0. */
  readonly sourceOhms?: number;
}

/** Options of {@link ratioChangeFromShunt}. */
export interface RatioChangeFromShuntOptions extends TransducerShuntOptions {
  /** Shunt resistance in Ω (> 0, finite). */
  readonly shuntOhms: number;
}

/** Options of {@link shuntOhmsForRatioChange}. */
export interface ShuntOhmsForRatioChangeOptions extends TransducerShuntOptions {
  /**
   * The change of output the shunt should cause, V/V (shunted minus unshunted reading): negative
   * for arm 1 or 3, positive for arm 2 or 4.
   */
  readonly ratioChange: number;
}

/** Options of {@link shuntEquivalentLoad}. */
export interface ShuntEquivalentLoadOptions {
  /** Rated capacity of the transducer, in its certificate's load unit (> 0). */
  readonly capacity: number;
  /** Rated output: output at capacity minus output at zero load, V/V (non-zero, either sign). */
  readonly ratedOutputVoltsPerVolt: number;
  /** The shunt reading: output with the shunt minus output without it, V/V. */
  readonly ratioChange: number;
}

/** The keys every transducer shunt function reads besides its own target. */
const transducerKeys = ['bridgeOhms', 'armsOhms', 'arm', 'leads', 'sourceOhms'] as const;

function transducerNetwork(options: unknown, target: 'shuntOhms' | 'ratioChange'): ShuntNetwork {
  const o = checkOptions('options', options, { known: [...transducerKeys, target], required: [target] });
  if (o['bridgeOhms'] !== undefined && o['armsOhms'] !== undefined) {
    throw new BridgeworkError('conflicting-options', '`bridgeOhms` and `armsOhms` must not both be given', {
      param: 'armsOhms',
    });
  }
  const arms = (
    o['armsOhms'] === undefined
      ? new Array<number>(4).fill(
          o['bridgeOhms'] === undefined ? 350 : checkPositive('bridgeOhms', o['bridgeOhms']),
        )
      : checkLength<unknown>('armsOhms', o['armsOhms'], 4).map((r, i) => checkPositive(`armsOhms[${i}]`, r))
  ) as [number, number, number, number];
  const arm = o['arm'] === undefined ? 1 : checkInteger('arm', o['arm'], { min: 1, max: 4 });
  let leads: LeadsOptions | undefined;
  if (o['leads'] !== undefined) {
    const l = checkOptions('leads', o['leads'], {
      known: ['ohmsPerLead', 'wiring'],
      required: ['ohmsPerLead', 'wiring'],
    });
    leads = {
      ohmsPerLead: l['ohmsPerLead'] as number,
      wiring: checkOneOf('leads.wiring', l['wiring'], ['four-wire', 'six-wire'] as const),
    };
  }
  // The cable model is the bridge package's: four-wire puts both excitation leads in series with
  // the source, six-wire refers the ratio to the excitation sensed at the bridge.
  const { seriesOhms } = createStrainBridge({
    arrangement: 'full-bending',
    gaugeFactor: 1,
    ...(leads === undefined ? {} : { leads }),
    ...(o['sourceOhms'] === undefined ? {} : { sourceOhms: o['sourceOhms'] as number }),
  });
  const index = (arm - 1) as ArmIndex;
  return { arms, index, base: arms[index], outside: 0, excitationScale: 1, sourceOhms: seriesOhms };
}

/**
 * The change of output ratio caused by a shunt across one arm of a full-bridge transducer.
 *
 * @remarks
 * The shunted arm becomes R′ = R·Rs/(R + Rs) and the network is solved by `solveBridge`
 * (ideal meter), with four-wire excitation leads in series with the source or a six-wire cable
 * sensing the excitation at the bridge. For four equal arms and no leads this is, exactly,
 * Δr = (R′ − R)/(2(R′ + R)) = −R/(2(R + 2Rs)) (derived from Vout/E = (R1R3 − R2R4)/((R1 + R2)(R3 + R4))),
 * so 43 575 Ω across one 350 Ω arm gives −2.000000 mV/V. The change is the shunted reading minus
 * the unshunted one, so an unbalanced bridge's offset does not enter.
 *
 * @param options - Arms, shunted arm, cable, source and `shuntOhms`.
 * @returns Shunted minus unshunted output ratio, V/V (negative for arms 1 and 3).
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type` for bad
 *   numbers; `conflicting-options` for both `bridgeOhms` and `armsOhms`; `invalid-shape` for arms
 *   that are not four; `invalid-option` for a wiring other than four- or six-wire; `out-of-range` or
 *   `not-integer` for an arm other than 1–4.
 * @example
 * ```ts
 * ratioChangeFromShunt({ bridgeOhms: 350, shuntOhms: 43_575 }); // ≈ -0.002 (−2.000000 mV/V)
 * ```
 */
export function ratioChangeFromShunt(options: RatioChangeFromShuntOptions): number {
  const network = transducerNetwork(options, 'shuntOhms');
  const shuntOhms = checkPositive('shuntOhms', (options as unknown as Record<string, unknown>)['shuntOhms']);
  return networkRatio(network, shuntOhms) - networkRatio(network, Infinity);
}

/**
 * The shunt that changes a full-bridge transducer's output by a target ratio (for example to
 * simulate a stated fraction of rated output).
 *
 * @remarks
 * The inverse of {@link ratioChangeFromShunt}, in closed form: `solveArm` gives the shunted arm
 * R′ for the target reading and Rs = R·R′/(R − R′). For four equal arms and no leads,
 * Rs = (R/(2|Δr|) − R)/2, so −2 mV/V across 350 Ω arms needs 43 575 Ω. Round trip within 1e-12
 * relative.
 *
 * @param options - Arms, shunted arm, cable, source and the target `ratioChange` (V/V).
 * @returns The shunt resistance, Ω.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (param `ratioChange`) for zero or a
 *   change of the sign the arm cannot produce; `no-solution` when the change needs a negative or
 *   zero shunt; and the errors of {@link ratioChangeFromShunt}.
 * @example
 * ```ts
 * shuntOhmsForRatioChange({ bridgeOhms: 350, ratioChange: -0.002 }); // ≈ 43575
 * ```
 */
export function shuntOhmsForRatioChange(options: ShuntOhmsForRatioChangeOptions): number {
  const network = transducerNetwork(options, 'ratioChange');
  const change = checkFinite('ratioChange', (options as unknown as Record<string, unknown>)['ratioChange']);
  const sign = network.index % 2 === 0 ? 1 : -1;
  if (!(sign * change < 0)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`ratioChange\` must be ${sign > 0 ? 'negative' : 'positive'} for a shunt across arm ${network.index + 1}; got ${formatValue(change)}`,
      { param: 'ratioChange', value: change, limit: sign > 0 ? [-Infinity, 0] : [0, Infinity] },
    );
  }
  return shuntOhmsForNetworkRatio(network, networkRatio(network, Infinity) + change, 'ratioChange', change);
}

/**
 * The load a shunt reading is equivalent to, from a transducer's capacity and rated output.
 *
 * @remarks
 * load = capacity · Δr / RO, with Δr the shunt reading (shunted minus unshunted output) and RO
 * the rated output (output at capacity minus output at zero): the certificate's straight line
 * through zero and capacity (common practice). The sign follows: a shunt that moves the output
 * against the loading direction gives a negative equivalent load. The result is in the capacity's
 * unit; use {@link createCertificateScale} for gravity and buoyancy between force and mass.
 *
 * @param options - Capacity, rated output (V/V) and shunt reading (V/V).
 * @returns The equivalent load, in the unit of `capacity`.
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`;
 *   `out-of-range` for a zero rated output.
 * @example
 * ```ts
 * shuntEquivalentLoad({ capacity: 5000, ratedOutputVoltsPerVolt: 2.0012e-3, ratioChange: -1.4979e-3 });
 * // ≈ -3742.5 (in the capacity's unit)
 * ```
 */
export function shuntEquivalentLoad(options: ShuntEquivalentLoadOptions): number {
  const o = checkOptions('options', options, {
    known: ['capacity', 'ratedOutputVoltsPerVolt', 'ratioChange'],
    required: ['capacity', 'ratedOutputVoltsPerVolt', 'ratioChange'],
  });
  const capacity = checkPositive('capacity', o['capacity']);
  const ratedOutput = checkNonZero('ratedOutputVoltsPerVolt', o['ratedOutputVoltsPerVolt']);
  const change = checkFinite('ratioChange', o['ratioChange']);
  return finiteResult('ratioChange', change, (capacity * change) / ratedOutput, 'the equivalent load');
}
