/**
 * A shunted bridge as the reading sees it, solved through the bridge package.
 *
 * Every shunt placement this package models reduces exactly to an ordinary four-arm bridge in
 * which one arm is `outside + base∥Rs` (Rs the shunt), driven by a scaled EMF through a source
 * resistance. `solveBridge` then gives the reading and `solveArm` inverts it.
 */
import { solveArm, solveBridge } from '@bridgework/bridge';
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';

/** Zero-based arm index (arm 1 → 0). */
export type ArmIndex = 0 | 1 | 2 | 3;

/** The equivalent four-arm network of a shunted bridge. */
export interface ShuntNetwork {
  /** The four arms when unshunted; `arms[index]` equals `outside + base`. */
  readonly arms: readonly [number, number, number, number];
  /** The arm that carries the shunt. */
  readonly index: ArmIndex;
  /** The resistance the shunt is in parallel with, Ω. */
  readonly base: number;
  /** Resistance in the shunted arm outside the shunt (leads between the shunt and the node), Ω. */
  readonly outside: number;
  /** EMF of the equivalent source per volt of the real source's EMF (1 unless transformed). */
  readonly excitationScale: number;
  /** Resistance in series with the equivalent source, Ω. */
  readonly sourceOhms: number;
}

/** Resistance of two resistors in parallel. */
export function parallel(a: number, b: number): number {
  return (a * b) / (a + b);
}

/** Output ratio (V per volt of source EMF) with a shunt of `shuntOhms` (Infinity: no shunt). */
export function networkRatio(network: ShuntNetwork, shuntOhms: number): number {
  const arms = [...network.arms] as [number, number, number, number];
  if (shuntOhms !== Infinity) arms[network.index] = network.outside + parallel(network.base, shuntOhms);
  return solveBridge({
    armsOhms: arms,
    excitationVolts: network.excitationScale,
    sourceOhms: network.sourceOhms,
  }).outputVolts;
}

/**
 * The shunt that makes the network read `ratio`, in closed form: `solveArm` gives the shunted arm
 * R′, and `base∥Rs = R′ − outside` gives Rs = base·x/(base − x) with x = R′ − outside.
 *
 * @param param - The caller's option named in a `no-solution` error, with its `value`.
 */
export function shuntOhmsForNetworkRatio(
  network: ShuntNetwork,
  ratio: number,
  param: string,
  value: number,
): number {
  const armsOhms = [...network.arms] as [number | null, number | null, number | null, number | null];
  armsOhms[network.index] = null;
  let shunted: number;
  try {
    shunted = solveArm({
      armsOhms,
      excitationVolts: network.excitationScale,
      outputVolts: ratio,
      sourceOhms: network.sourceOhms,
    });
  } catch (error) {
    if (!isBridgeworkError(error, 'no-solution')) throw error;
    shunted = Number.NaN; // reported below, against the caller's option
  }
  const x = shunted - network.outside;
  if (!(x > 0 && x < network.base)) {
    throw new BridgeworkError(
      'no-solution',
      `\`${param}\` must be reachable by a positive shunt across arm ${network.index + 1} (this one would need a negative or zero resistance); got ${value}`,
      { param, value },
    );
  }
  return (network.base * x) / (network.base - x);
}
