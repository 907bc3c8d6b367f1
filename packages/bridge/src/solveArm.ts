import { BridgeworkError, checkFinite, checkOptions, formatValue } from '@bridgework/core';
import { ACROSS, OPPOSITE, PARTNER, SIGN, checkArms, checkCircuit } from './internal/network.js';

/** Options of {@link solveArm}. */
export interface SolveArmOptions {
  /** The four arms `[R1, R2, R3, R4]` in Ω (each in [1e-9, 1e15]) with exactly one entry `null`: the arm to solve for. */
  readonly armsOhms: readonly [number | null, number | null, number | null, number | null];
  /** Source EMF of the excitation in V, in [1e-9, 1e6]. */
  readonly excitationVolts: number;
  /** The meter reading V(S+) − V(S−) in V (finite, either sign). */
  readonly outputVolts: number;
  /** Source resistance in Ω (0 or in [1e-9, 1e15]). Default 0. */
  readonly sourceOhms?: number;
  /** Meter input resistance in Ω (in [1e-9, 1e15], or `Infinity`). Default `Infinity`. */
  readonly meterOhms?: number;
}

/**
 * Solves the one unknown arm of a bridge from a meter reading, exactly.
 *
 * @remarks
 * The reading is a bilinear (Möbius) function of any single arm Rj: with the terms of
 * {@link solveBridge}, M = mA·Rj + mB and D = PQ + Rs·S + (T + Rs·W)/Rm = dA·Rj + dB are both affine
 * in Rj, so Vout/E = M/D inverts in closed form to Rj = (mB − r·dB)/(r·dA − mA) with r = Vout/E.
 * The coefficients are formed directly from the known arms (no differencing of evaluations), so
 * the result has full relative precision. As Rj runs over (0, ∞) the reading sweeps the open
 * interval between its values at Rj → 0 and Rj → ∞; a reading outside it has no positive
 * solution.
 *
 * @param options - Three known arms and one `null`, excitation, reading, source and meter resistance.
 * @returns The unknown arm resistance in Ω.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-count` unless exactly one arm is `null`;
 *   `no-solution` when no finite positive resistance gives the reading (with `limit` = the reachable
 *   interval of readings in V); `not-finite`, `not-positive`, `negative`, `invalid-shape`,
 *   `out-of-range` for bad inputs (resistances and excitation as in {@link solveBridge});
 *   `unknown-option`, `missing-option`.
 * @example
 * ```ts
 * solveArm({ armsOhms: [null, 350, 350, 350], excitationVolts: 10, outputVolts: 0.004223022653, sourceOhms: 50, meterOhms: 10_000 });
 * // ≈ 350.7
 * ```
 */
export function solveArm(options: SolveArmOptions): number {
  const o = checkOptions('options', options, {
    known: ['armsOhms', 'excitationVolts', 'outputVolts', 'sourceOhms', 'meterOhms'],
    required: ['armsOhms', 'excitationVolts', 'outputVolts'],
  });
  const arms = checkArms(o['armsOhms'], true);
  const unknowns = arms.flatMap((arm, i) => (arm === null ? [i] : []));
  if (unknowns.length !== 1) {
    throw new BridgeworkError(
      'unknown-count',
      `\`armsOhms\` must hold exactly one null (the unknown arm); got ${unknowns.length}`,
      { param: 'armsOhms', value: o['armsOhms'], limit: 1 },
    );
  }
  const { excitationVolts: e, sourceOhms: rs, meterOhms: rm } = checkCircuit(o);
  const outputVolts = checkFinite('outputVolts', o['outputVolts']);
  const j = unknowns[0] as 0 | 1 | 2 | 3;
  const known = arms as number[];
  const rp = known[PARTNER[j]] as number;
  const ro = known[OPPOSITE[j]] as number;
  const rc = known[ACROSS[j]] as number;
  const sigma = SIGN[j];

  // Affine pieces in the unknown arm R: M = σ(R·Ro − Rp·Rc), PQ = (R + Rp)(Ro + Rc),
  // S = R + (Rp + Ro + Rc), T = R·(Rp(Ro + Rc) + Ro·Rc) + Rp·Ro·Rc, W = R·(Rp + Ro) + Rc(Rp + Ro).
  const mA = sigma * ro;
  const mB = -sigma * rp * rc;
  const other = ro + rc;
  const dA = other + rs + (rp * other + ro * rc + rs * (rp + ro)) / rm;
  const dB = rp * other + rs * (rp + other) + (rp * ro * rc + rs * rc * (rp + ro)) / rm;

  const r = outputVolts / e;
  const resistance = (mB - r * dB) / (r * dA - mA);
  if (!Number.isFinite(resistance) || !(resistance > 0)) {
    const atZero = (e * mB) / dB;
    const atInfinity = (e * mA) / dA;
    const lo = Math.min(atZero, atInfinity);
    const hi = Math.max(atZero, atInfinity);
    throw new BridgeworkError(
      'no-solution',
      `\`outputVolts\` must be in (${lo}, ${hi}) for a positive arm ${j + 1}; got ${formatValue(outputVolts)}`,
      { param: 'outputVolts', value: outputVolts, limit: [lo, hi] },
    );
  }
  return resistance;
}
