/**
 * The bridge's exact map as straight-line arithmetic of its parameters, for Monte Carlo trials
 * where the completion and lead resistances change from trial to trial and nothing may be built
 * per trial. It restates the closed form of the bridge package's `createStrainBridge` (arms
 * affine in strain, Ri = pi + gi·ε; Vout/Vexc = (R1R3 − R2R4)/((R1 + R2)(R3 + R4) + Rser·ΣR)) and
 * its root selection; the channel checks it against `createStrainBridge` itself before using it
 * (see internal/fastModel.ts), so a difference is caught, never used.
 */
import { differenceOfProducts, type LeadWiring } from '@bridgework/core';

/** A gauge's strain as `axial·ε + poisson·ν·ε`; `null` for a completion resistor (the bridge package's table rows). */
export type ArmPattern = readonly [axial: number, poisson: number] | null;

/** What stays fixed from trial to trial: which arms hold gauges, their strain multipliers, where the leads sit. */
export interface ArmLayout {
  /** Strain multiplier sᵢ of each arm (0 for a completion resistor). */
  readonly multipliers: readonly [number, number, number, number];
  /** Whether each arm holds a gauge. */
  readonly gauge: readonly [boolean, boolean, boolean, boolean];
  /** Lead resistances in each arm, in units of one lead. */
  readonly leadsInArms: readonly [number, number, number, number];
  /** Leads in series with the excitation, in units of one lead (four-wire: 2). */
  readonly leadsInSeries: number;
  /** Whether the source resistance counts (not with remote sense). */
  readonly sourceCounts: boolean;
}

/** The layout of an arrangement row with a wiring (the lead rules of `createStrainBridge`). */
export function armLayout(
  arms: readonly ArmPattern[],
  poissonRatio: number | undefined,
  wiring: LeadWiring,
): ArmLayout {
  const nu = poissonRatio ?? 0;
  const m = arms.map((g) => (g === null ? 0 : g[0] + g[1] * nu)) as unknown as [
    number,
    number,
    number,
    number,
  ];
  const gauge = arms.map((g) => g !== null) as unknown as [boolean, boolean, boolean, boolean];
  let leadsInArms: [number, number, number, number] = [0, 0, 0, 0];
  let leadsInSeries = 0;
  let sourceCounts = true;
  if (wiring === 'two-wire') leadsInArms = gauge[2] ? [2, 0, 2, 0] : [2, 0, 0, 0];
  else if (wiring === 'three-wire') leadsInArms = [1, 1, 0, 0];
  else if (wiring === 'four-wire') leadsInSeries = 2;
  else sourceCounts = false;
  return { multipliers: m, gauge, leadsInArms, leadsInSeries, sourceCounts };
}

/** Scratch for the six coefficients, so an evaluation allocates nothing. */
const q = new Float64Array(6);

/** Fills `q` with n0, n1, n2, d0, d1, d2 of ratio(ε) = (n0 + n1ε + n2ε²)/(d0 + d1ε + d2ε²); returns whether the halves are equal. */
function coefficients(
  l: ArmLayout,
  gaugeOhms: number,
  gaugeFactor: number,
  completionOhms: number,
  ohmsPerLead: number,
  sourceOhms: number,
): boolean {
  const L = l.leadsInArms;
  const s = l.multipliers;
  const p1 = (l.gauge[0] ? gaugeOhms : completionOhms) + L[0] * ohmsPerLead;
  const p2 = (l.gauge[1] ? gaugeOhms : completionOhms) + L[1] * ohmsPerLead;
  const p3 = (l.gauge[2] ? gaugeOhms : completionOhms) + L[2] * ohmsPerLead;
  const p4 = (l.gauge[3] ? gaugeOhms : completionOhms) + L[3] * ohmsPerLead;
  const k = gaugeOhms * gaugeFactor;
  const g1 = k * s[0];
  const g2 = k * s[1];
  const g3 = k * s[2];
  const g4 = k * s[3];
  const rs = l.sourceCounts ? sourceOhms + l.leadsInSeries * ohmsPerLead : 0;
  if (p1 === p3 && g1 === g3 && p2 === p4 && g2 === g4) {
    // Equal halves: ratio = (R1 − R2)/(R1 + R2 + 2·Rser), in lowest terms (as the bridge package).
    q[0] = p1 - p2;
    q[1] = g1 - g2;
    q[2] = 0;
    q[3] = p1 + p2 + 2 * rs;
    q[4] = g1 + g2;
    q[5] = 0;
    return true;
  }
  const a0 = p1 + p2;
  const a1 = g1 + g2;
  const b0 = p3 + p4;
  const b1 = g3 + g4;
  q[0] = differenceOfProducts(p1, p3, p2, p4);
  q[1] = p1 * g3 + p3 * g1 - p2 * g4 - p4 * g2;
  q[2] = differenceOfProducts(g1, g3, g2, g4);
  q[3] = a0 * b0 + rs * (a0 + b0);
  q[4] = a0 * b1 + a1 * b0 + rs * (a1 + b1);
  q[5] = a1 * b1;
  return false;
}

/** Lower end of the strain range of a layout (every gauge resistance positive). */
function strainMin(l: ArmLayout, gaugeFactor: number): number {
  let lo = -Infinity;
  for (let i = 0; i < 4; i++) {
    const s = l.multipliers[i] as number;
    if (s > 0) lo = Math.max(lo, -1 / (gaugeFactor * s));
  }
  return lo;
}

/** Upper end of the strain range of a layout. */
function strainMax(l: ArmLayout, gaugeFactor: number): number {
  let hi = Infinity;
  for (let i = 0; i < 4; i++) {
    const s = l.multipliers[i] as number;
    if (s < 0) hi = Math.min(hi, -1 / (gaugeFactor * s));
  }
  return hi;
}

/**
 * The strain for a bridge ratio (NaN when no strain of the range gives it): the closed form of
 * the bridge package's `strainFromRatio`, with the same root selection.
 */
export function strainFromRatioArms(
  l: ArmLayout,
  gaugeOhms: number,
  gaugeFactor: number,
  completionOhms: number,
  ohmsPerLead: number,
  sourceOhms: number,
  ratio: number,
): number {
  coefficients(l, gaugeOhms, gaugeFactor, completionOhms, ohmsPerLead, sourceOhms);
  const lo = strainMin(l, gaugeFactor);
  const hi = strainMax(l, gaugeFactor);
  const n0 = q[0] as number;
  const n1 = q[1] as number;
  const n2 = q[2] as number;
  const d0 = q[3] as number;
  const d1 = q[4] as number;
  const d2 = q[5] as number;
  let e: number;
  if (n2 === 0 && d2 === 0) e = -differenceOfProducts(d0, ratio, n0, 1) / (d1 * ratio - n1);
  else {
    const qa = ratio * d2 - n2;
    const qb = ratio * d1 - n1;
    const qc = differenceOfProducts(ratio, d0, n0, 1);
    e = Number.NaN;
    if (qa === 0) e = -qc / qb;
    else {
      const disc = qb * qb - 4 * qa * qc;
      if (disc >= 0) {
        const r = -0.5 * (qb + (qb < 0 ? -Math.sqrt(disc) : Math.sqrt(disc)));
        e = qc / r;
        if (!(e > lo && e < hi)) e = r / qa;
      }
    }
  }
  return e > lo && e < hi ? e : Number.NaN;
}

/** The bridge ratio for a strain (the closed form of `ratioFromStrain`). */
export function ratioFromStrainArms(
  l: ArmLayout,
  gaugeOhms: number,
  gaugeFactor: number,
  completionOhms: number,
  ohmsPerLead: number,
  sourceOhms: number,
  strain: number,
): number {
  coefficients(l, gaugeOhms, gaugeFactor, completionOhms, ohmsPerLead, sourceOhms);
  const e = strain;
  return (
    ((q[0] as number) + e * ((q[1] as number) + e * (q[2] as number))) /
    ((q[3] as number) + e * ((q[4] as number) + e * (q[5] as number)))
  );
}

/**
 * Power dissipated in arm 1 (its gauge or element, leads excluded) at a strain, W: the arm's
 * current from the unloaded bridge with a series resistance (the five-resistor closed form of
 * the bridge package's `solveBridge` with an infinite meter resistance), squared, times the
 * element's resistance.
 */
export function arm1Watts(
  l: ArmLayout,
  gaugeOhms: number,
  gaugeFactor: number,
  completionOhms: number,
  ohmsPerLead: number,
  sourceOhms: number,
  excitationVolts: number,
  strain: number,
): number {
  const L = l.leadsInArms;
  const s = l.multipliers;
  const arm = (i: 0 | 1 | 2 | 3) =>
    (l.gauge[i] ? gaugeOhms * (1 + gaugeFactor * (s[i] as number) * strain) : completionOhms) +
    (L[i] as number) * ohmsPerLead;
  const r1 = arm(0);
  const r2 = arm(1);
  const r3 = arm(2);
  const r4 = arm(3);
  const rs = l.sourceCounts ? sourceOhms + l.leadsInSeries * ohmsPerLead : 0;
  const p = r1 + r2;
  const qq = r3 + r4;
  // I1 = E·Q/(P·Q + Rs·(P + Q)) (solveBridge with Rm = ∞).
  const current = (excitationVolts * qq) / (p * qq + rs * (p + qq));
  const element = l.gauge[0] ? gaugeOhms * (1 + gaugeFactor * (s[0] as number) * strain) : completionOhms;
  return current * current * element;
}
