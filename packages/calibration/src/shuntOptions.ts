import type { StrainArrangement } from '@bridgework/bridge';
import type { LeadsOptions } from '@bridgework/core';

/**
 * A bridge arm in the ring numbering of docs/conventions.md: E+ → R1 → S− → R2 → E− → R3 → S+ →
 * R4 → E+. Shunting arm 1 or 3 lowers the output (simulates compression of an arm-1 gauge);
 * shunting arm 2 or 4 raises it (simulates tension).
 */
export type BridgeArm = 1 | 2 | 3 | 4;

/**
 * What "the strain a shunt simulates" means.
 *
 * @remarks
 * - `'resistance-equivalent'`: the strain at which a gauge's own resistance change
 *   (ΔR/R = GF·ε) equals the fractional change the shunt makes. With no leads,
 *   ε = −Rg/(GF·(Rg + Rs)) for arm 1 or 3 (the value printed beside a shunt resistor); the sign is
 *   reversed for arm 2 or 4. It does not depend on the arrangement or the instrument.
 * - `'exact'`: the strain an instrument indicates when it converts the shunted reading with the
 *   arrangement's exact inverse (`createStrainBridge(...).strainFromRatio`, two-reading method
 *   against the unshunted reading). Leads, placement and the arrangement all count.
 * - `'linear'`: the strain an instrument indicates when it converts the change of reading with
 *   the tangent-line sensitivity at zero strain, ε = (r − r0)/sensitivity (for a bridge without
 *   leads, sensitivity = N·GF/4).
 */
export type ShuntDefinition = 'resistance-equivalent' | 'exact' | 'linear';

/**
 * Where the shunt is connected.
 *
 * @remarks
 * - `'gauge'`: directly across the arm's resistive element (the gauge at the specimen, or the
 *   completion resistor), so any lead in that arm stays in series outside the shunt.
 * - `'instrument'`: across the arm's terminals at the instrument end of a two- or three-wire cable,
 *   so the shunt also spans the lead(s) in that arm. On a three-wire cable the instrument reaches
 *   the S− node (at the gauge) only through the sense lead, which then carries the shunt current
 *   and moves the reading point: this is modelled exactly (see docs/calibration.md).
 *
 * With no lead resistance, and for arms that hold no lead, the two are the same.
 */
export type ShuntPlacement = 'gauge' | 'instrument';

/** The bridge and shunt configuration shared by {@link shuntOhmsForStrain} and {@link strainFromShunt}. */
export interface ShuntBridgeOptions {
  /** Unstrained resistance of each gauge in Ω (> 0). */
  readonly gaugeOhms: number;
  /** Gauge factor (> 0). */
  readonly gaugeFactor: number;
  /** The arm the shunt is across. Default 1. */
  readonly arm?: BridgeArm;
  /** The bridge arrangement, as in `createStrainBridge`. Default `'quarter'`. */
  readonly arrangement?: StrainArrangement;
  /** Completion resistance in Ω (> 0). Default `gaugeOhms`. */
  readonly completionOhms?: number;
  /** Poisson ratio in (−1, 0.5]; required by the Poisson arrangements. */
  readonly poissonRatio?: number;
  /** Lead wires, as in `createStrainBridge`. Default: none. */
  readonly leads?: LeadsOptions;
  /** Series resistance of the excitation source in Ω (≥ 0). Default 0. */
  readonly sourceOhms?: number;
  /** Where the shunt is connected. Default `'gauge'`. */
  readonly placement?: ShuntPlacement;
  /** What the simulated strain means. Default `'resistance-equivalent'`. */
  readonly definition?: ShuntDefinition;
  /**
   * For the `'exact'` and `'linear'` definitions: whether the instrument's conversion knows the
   * lead resistance (true: it uses the same leads as the installation; false: it converts as if
   * there were none, so lead desensitization shows in the indicated strain). Default true.
   */
  readonly instrumentModelsLeads?: boolean;
}

/** Options of {@link shuntOhmsForStrain}. */
export interface ShuntOhmsForStrainOptions extends ShuntBridgeOptions {
  /**
   * The strain to simulate, m/m, signed as the bridge reads it: negative for a shunt across arm 1
   * or 3, positive for arm 2 or 4. Its magnitude must be reachable by a positive shunt.
   */
  readonly strain: number;
}

/** Options of {@link strainFromShunt} and {@link shuntRatios}. */
export interface StrainFromShuntOptions extends ShuntBridgeOptions {
  /** Shunt resistance in Ω (> 0, finite). */
  readonly shuntOhms: number;
}

/** The readings of a shunt calibration (see {@link shuntRatios}). */
export interface ShuntRatios {
  /** Output ratio without the shunt, V/V (non-zero only for an unbalanced bridge or two-wire leads). */
  readonly zeroRatio: number;
  /** Output ratio with the shunt connected, V/V. */
  readonly shuntedRatio: number;
}
