import { checkOptions } from '@bridgework/core';
import { checkArms, checkCircuit, networkTerms, type Arms } from './internal/network.js';

/** Options of {@link solveBridge}. */
export interface SolveBridgeOptions {
  /** The four arm resistances `[R1, R2, R3, R4]` in Ω, each in [1e-9, 1e15] (ring order, see docs/conventions.md). */
  readonly armsOhms: readonly [number, number, number, number];
  /** Source EMF of the excitation in V, in [1e-9, 1e6], before its internal resistance. */
  readonly excitationVolts: number;
  /** Internal resistance of the excitation source plus any series resistance in Ω (0 or in [1e-9, 1e15]). Default 0. */
  readonly sourceOhms?: number;
  /** Input resistance of the meter across S+ and S− in Ω (in [1e-9, 1e15], or `Infinity`). Default `Infinity`. */
  readonly meterOhms?: number;
}

/** The exact electrical state of a bridge network (see {@link solveBridge}). */
export interface BridgeSolution {
  /** What the meter reads, V(S+) − V(S−), in V. */
  readonly outputVolts: number;
  /** `outputVolts / excitationVolts`, V/V. */
  readonly ratio: number;
  /** Open-circuit output (infinite meter resistance) with the given source resistance, in V. */
  readonly theveninVolts: number;
  /** Output resistance of the bridge seen by the meter (source EMF shorted, source resistance kept), in Ω. */
  readonly theveninOhms: number;
  /** Voltage across the bridge, E+ to E−, after the drop in the source resistance, in V. */
  readonly bridgeVolts: number;
  /** Current drawn from the source, in A. */
  readonly supplyAmps: number;
  /** Resistance the bridge (with the meter connected) presents to the source, in Ω. */
  readonly inputOhms: number;
  /** Current through the meter, from S+ to S−, in A (0 for an infinite meter resistance). */
  readonly meterAmps: number;
  /** Current in each arm R1…R4, in A, positive from the E+ side towards the E− side. */
  readonly armAmps: readonly [number, number, number, number];
  /** Power dissipated in each arm R1…R4 (I²·R), in W: the self-heating of each gauge. */
  readonly armWatts: readonly [number, number, number, number];
}

/**
 * Solves a Wheatstone bridge exactly, with source resistance and meter loading.
 *
 * @remarks
 * Arms R1→R2→R3→R4 in ring order; E+ at the R4/R1 junction, E− at R2/R3, S− at R1/R2, S+ at
 * R3/R4, so an unloaded bridge gives Vout/Vexc = (R1·R3 − R2·R4)/((R1 + R2)(R3 + R4)).
 *
 * Method: with M = R1R3 − R2R4, P = R1 + R2, Q = R3 + R4, S = P + Q, T = R1R2Q + R3R4P and
 * W = (R1 + R4)(R2 + R3), nodal analysis of the five-node network reduces to the closed form
 *
 *   Vout = E·M / (PQ + Rs·S + (T + Rs·W)/Rm),
 *
 * with the bridge voltage Vb = E·(PQ + T/Rm)/(same denominator), the supply current
 * I = E·(S + W/Rm)/(same denominator) and the arm currents I1 = E·(Q + R4(R2 + R3)/Rm)/(…),
 * I2 = E·(Q + R3(R1 + R4)/Rm)/(…), I3 = E·(P + R2(R1 + R4)/Rm)/(…), I4 = E·(P + R1(R2 + R3)/Rm)/(…),
 * all sums of positive terms, so no field suffers cancellation. The Thevenin equivalent seen by the meter is
 * Vth = E·M/(PQ + Rs·S) and Rth = (T + Rs·W)/(PQ + Rs·S), the classic five-resistor bridge
 * formula (any circuit-analysis text; derivation in docs/bridge.md). M is formed with an
 * error-free product difference, so a nearly balanced bridge keeps its full relative precision and
 * a balanced one gives exactly 0. The test suite checks every field against a 40-digit nodal solve
 * of the full network (mathjs `lusolve`).
 *
 * Resistances are bounded to `OHMS_LIMITS` of the core package (1 nΩ … 1 PΩ) and the excitation
 * to [1 nV, 1 MV] (`VOLTS_LIMITS`), which keeps every product of the closed forms, every current and every power finite:
 * no accepted input gives a non-finite field.
 *
 * @param options - Arms, excitation EMF, source and meter resistance.
 * @returns Output, Thevenin equivalent, bridge voltage, currents and arm powers (SI units).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` when `armsOhms` is not four entries;
 *   `not-positive`, `not-finite` or `wrong-type` for a bad arm, excitation or meter resistance;
 *   `negative` for a negative source resistance; `out-of-range` for a resistance outside
 *   [1e-9, 1e15] Ω or an excitation outside [1e-9, 1e6] V; `unknown-option` for a key it does not know
 *   (naming the closest); `missing-option` without `armsOhms` or `excitationVolts`.
 * @example
 * ```ts
 * const s = solveBridge({ armsOhms: [350.7, 350, 350, 350], excitationVolts: 10, sourceOhms: 50, meterOhms: 10_000 });
 * s.outputVolts; // 0.004223022653… (4.223 mV)
 * ```
 */
export function solveBridge(options: SolveBridgeOptions): BridgeSolution {
  const o = checkOptions('options', options, {
    known: ['armsOhms', 'excitationVolts', 'sourceOhms', 'meterOhms'],
    required: ['armsOhms', 'excitationVolts'],
  });
  const arms = checkArms(o['armsOhms'], false) as unknown as Arms;
  const { excitationVolts: e, sourceOhms: rs, meterOhms: rm } = checkCircuit(o);
  const [r1, r2, r3, r4] = arms;
  const { m, p, q, s, t, w } = networkTerms(arms);

  const openDenominator = p * q + rs * s;
  const denominator = openDenominator + (t + rs * w) / rm;
  const outputVolts = (e * m) / denominator;
  const bridgeVolts = rs === 0 ? e : (e * (p * q + t / rm)) / denominator;
  const supplyAmps = (e * (s + w / rm)) / denominator;
  const meterAmps = outputVolts / rm;

  // Arm currents in forms free of cancellation (every term positive): e.g. I1 = (Vb − Im·R2)/P
  // simplifies, using T − M·R2 = R4·P·(R2 + R3), to E·(Q + R4(R2 + R3)/Rm)/D.
  const armAmps = [
    (e * (q + (r4 * (r2 + r3)) / rm)) / denominator,
    (e * (q + (r3 * (r1 + r4)) / rm)) / denominator,
    (e * (p + (r2 * (r1 + r4)) / rm)) / denominator,
    (e * (p + (r1 * (r2 + r3)) / rm)) / denominator,
  ] as const;

  return {
    outputVolts,
    ratio: outputVolts / e,
    theveninVolts: (e * m) / openDenominator,
    theveninOhms: (t + rs * w) / openDenominator,
    bridgeVolts,
    supplyAmps,
    inputOhms: bridgeVolts / supplyAmps,
    meterAmps,
    armAmps,
    armWatts: [
      armAmps[0] * armAmps[0] * r1,
      armAmps[1] * armAmps[1] * r2,
      armAmps[2] * armAmps[2] * r3,
      armAmps[3] * armAmps[3] * r4,
    ],
  };
}
