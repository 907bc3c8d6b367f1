/**
 * Defects the fuzz still finds in packages whose owners are fixing them, listed so that the suite
 * stays green meanwhile and no new defect can hide behind them. Each entry matches the start of a
 * failing case's text. The test fails when an entry no longer matches any failure: delete the
 * entry then (the defect is fixed).
 */
/**
 * Who fixes a listed defect: the helper owning the package (or the part of it) where it lies.
 * Calibration, bridge, compensation and mechanics defects are not listed: they are fixed as found.
 */
export const defectOwners = {
  firmware: 'helper B (firmware)',
  uncertainty: 'helper C (uncertainty, chain)',
  channel: 'helper G (channel)',
} as const;

export type DefectOwner = (typeof defectOwners)[keyof typeof defectOwners];

export interface KnownDefect {
  /** The start of the case text (`function [variant]: path = attack`), or a pattern for it. */
  readonly cases: string | RegExp;
  /** Who is fixing it. */
  readonly owner: DefectOwner;
  /** What goes wrong, and where. */
  readonly note: string;
  /** Found by a seeded random case, which another seed may not draw: not checked for staleness. */
  readonly random?: boolean;
}

/** Whether a finding is the known defect. */
export function isKnown(finding: string, k: KnownDefect): boolean {
  return typeof k.cases === 'string' ? finding.startsWith(k.cases) : k.cases.test(finding);
}

export const knownDefects: readonly KnownDefect[] = [];

/** Option objects that still accept a misspelt key, with their owner (same rule as above). */
export const knownOptionDefects: readonly KnownDefect[] = [];
