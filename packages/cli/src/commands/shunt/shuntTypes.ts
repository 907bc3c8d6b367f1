/** The results of `bridgework shunt-plan` and `shunt-apply` (the JSON payloads' shapes), in their own module so that the HTML page imports them without an import cycle. */
import type { BridgeArm, PreferredSeries, ShuntPlacement } from '@bridgework/calibration';
import type { ShuntStep } from './channelShunt.js';

/** The plan of one channel (the JSON payload's entry). */
export interface ShuntPlan {
  /** The channel's name. */
  readonly channel: string;
  /** The channel's unit (every quantity below is in it). */
  readonly unit: string;
  /** The arm. */
  readonly arm: BridgeArm;
  /** The placement. */
  readonly placement: ShuntPlacement;
  /** The quantity to simulate (absent when a resistor was given). */
  readonly simulate: number | undefined;
  /** The shunt that simulates it exactly, or the resistor given. */
  readonly exact: ShuntStep;
  /** The preferred resistor nearest to it. */
  readonly preferred: ShuntStep & { readonly series: PreferredSeries; readonly deviationFraction: number };
}

/** The measured readings of a shunt calibration. */
export type ShuntReadings =
  | { readonly zeroCode: number; readonly shuntedCode: number }
  | { readonly zeroReadings: readonly number[]; readonly shuntedReadings: readonly number[] };

/** The outcome of a shunt calibration of one channel (the JSON payload). */
export interface ShuntApplication {
  /** The channel's name. */
  readonly channel: string;
  /** The channel's unit. */
  readonly unit: string;
  /** The shunt, arm and placement. */
  readonly shunt: {
    readonly ohms: number;
    readonly arm: BridgeArm;
    readonly placement: 'gauge' | 'instrument';
    readonly tolerancePercent: number;
  };
  /** The step the exact network predicts (without any span correction). */
  readonly expected: ShuntStep & { readonly standardUncertaintyCodes: number };
  /** The measured step. */
  readonly measured: {
    /** Mean code without the shunt. */
    readonly zeroCode: number;
    /** Mean code with the shunt. */
    readonly shuntedCode: number;
    /** Readings per state (1 for two codes). */
    readonly readings: readonly [number, number];
    /** The step, codes. */
    readonly stepCodes: number;
    /** Its standard uncertainty, codes (Type A), when known. */
    readonly standardUncertaintyCodes: number | undefined;
    /** What the uncorrected channel indicates for it, channel unit (undefined when it cannot convert the readings). */
    readonly indicated: number | undefined;
  };
  /** measured/expected − 1. */
  readonly spanErrorFraction: number;
  /** k = expected / measured. */
  readonly factor: number;
  /** u(k). */
  readonly factorStandardUncertainty: number | undefined;
  /** The factor in the file before (absent when none). */
  readonly previousFactor: number | undefined;
  /** Whether the plausibility check passed. */
  readonly ok: boolean;
  /** Why not. */
  readonly issues: readonly string[];
}
