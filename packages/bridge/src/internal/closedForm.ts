/**
 * The one closed form of a strain bridge, shared by `createStrainBridge` (resistances fixed at
 * creation) and `createStrainBridgeKernel` (completion and lead resistances given per call):
 * arms affine in strain, Ri = pi + gi·ε, so
 * ratio = (R1R3 − R2R4)/((R1 + R2)(R3 + R4) + Rser·ΣR), a ratio of quadratics in ε, in lowest
 * terms a linear-fractional map for every arrangement but one; and its inverse with the
 * cancellation-free root formula. Nothing here allocates: the kernel runs it per Monte Carlo trial.
 */
import { differenceOfProducts, type LeadWiring } from '@bridgework/core';
import type { ArrangementInfo } from '../arrangements.js';

/** What stays fixed for an arrangement row and a wiring: the arms' strain multipliers and where the leads sit. */
export interface ArmLayout {
  /** Strain multiplier sᵢ = axial + poisson·ν of each arm (0 for a completion resistor). */
  readonly multipliers: readonly [number, number, number, number];
  /** Whether each arm holds a gauge. */
  readonly gauge: readonly [boolean, boolean, boolean, boolean];
  /** Leads in each arm, in units of one lead's resistance. */
  readonly leadsInArms: readonly [number, number, number, number];
  /** Leads in series with the excitation, in units of one lead (four-wire: 2). */
  readonly excitationLeads: number;
  /** Whether the source resistance is in series with the bridge (not with remote sense, six-wire). */
  readonly sourceCounts: boolean;
}

/**
 * The layout of a table row with a wiring (`undefined`: no leads). Two-wire puts both leads of
 * each gauge pair in arms 1 and 3 (arm 3 only when it holds a gauge); three-wire one lead in arm 1
 * and one in arm 2 (the sense lead carries no current); four-wire both excitation leads in series
 * with the excitation; six-wire senses the excitation at the bridge.
 */
export function armLayout(
  info: ArrangementInfo,
  poissonRatio: number | undefined,
  wiring: LeadWiring | undefined,
): ArmLayout {
  const nu = poissonRatio ?? 0;
  const a = info.arms;
  const multipliers = [0, 1, 2, 3].map((i) => {
    const g = a[i];
    return g === null || g === undefined ? 0 : g[0] + g[1] * nu;
  }) as unknown as ArmLayout['multipliers'];
  const gauge = [0, 1, 2, 3].map((i) => a[i] !== null && a[i] !== undefined) as unknown as ArmLayout['gauge'];
  let leadsInArms: ArmLayout['leadsInArms'] = [0, 0, 0, 0];
  let excitationLeads = 0;
  let sourceCounts = true;
  if (wiring === 'two-wire') leadsInArms = gauge[2] ? [2, 0, 2, 0] : [2, 0, 0, 0];
  else if (wiring === 'three-wire') leadsInArms = [1, 1, 0, 0];
  else if (wiring === 'four-wire') excitationLeads = 2;
  else if (wiring === 'six-wire') sourceCounts = false;
  return { multipliers, gauge, leadsInArms, excitationLeads, sourceCounts };
}

/** The resistance in series with the excitation that the ratio sees, Ω. */
export function seriesOhmsOf(l: ArmLayout, sourceOhms: number, ohmsPerLead: number): number {
  return l.sourceCounts ? sourceOhms + l.excitationLeads * ohmsPerLead : 0;
}

/** The open interval of strains keeping every gauge resistance Rg(1 + GF·s·ε) positive. */
export function strainLimits(l: ArmLayout, gaugeFactor: number): [number, number] {
  let lo = -Infinity;
  let hi = Infinity;
  for (const s of l.multipliers) {
    if (s > 0) lo = Math.max(lo, -1 / (gaugeFactor * s));
    if (s < 0) hi = Math.min(hi, -1 / (gaugeFactor * s));
  }
  return [lo, hi];
}

/** Beyond this strain the quotient is formed from powers of 1/ε, so nothing overflows on the way. */
const HUGE_STRAIN = 1e100;

/** (n0 + n1x + n2x²)/(d0 + d1x + d2x²) without intermediate overflow at any finite x. */
export function quotientOf(
  n0: number,
  n1: number,
  n2: number,
  d0: number,
  d1: number,
  d2: number,
  x: number,
): number {
  if (Math.abs(x) <= HUGE_STRAIN) return (n0 + x * (n1 + x * n2)) / (d0 + x * (d1 + x * d2));
  if (n2 === 0 && d2 === 0) return (n0 / x + n1) / (d0 / x + d1);
  return ((n0 / x + n1) / x + n2) / ((d0 / x + d1) / x + d2);
}

/** n(x)/d(x) for quadratics given by their coefficients, constant term first (see {@link quotientOf}). */
export function quotient(n: ArrayLike<number>, d: ArrayLike<number>, x: number): number {
  return quotientOf(
    n[0] as number,
    n[1] as number,
    n[2] as number,
    d[0] as number,
    d[1] as number,
    d[2] as number,
    x,
  );
}

/** Slots of a coefficient vector filled by {@link fillRational} (length {@link RATIONAL_LENGTH}). */
export const N0 = 0;
export const N1 = 1;
export const N2 = 2;
export const D0 = 3;
export const D1 = 4;
export const D2 = 5;
/** The linear-fractional form in lowest terms, ratio = (M0 + M1·ε)/(K0 + K1·ε); M0 is NaN when there is none. */
export const M0 = 6;
export const M1 = 7;
export const K0 = 8;
export const K1 = 9;
/** The inputs of {@link fillRational}: completion resistance, one lead, resistance in series with the excitation (Ω). */
export const COMPLETION_OHMS = 10;
export const OHMS_PER_LEAD = 11;
export const SERIES_OHMS = 12;
/** Length of a coefficient vector. */
export const RATIONAL_LENGTH = 13;

/** The constants of a layout as one vector (see {@link layoutVector}): multipliers, gauge flags (1/0), leads per arm. */
export type LayoutVector = Float64Array;

/**
 * Packs a layout's constants and the gauges into a vector for {@link fillRational}: s1…s4, 1/0 for
 * a gauge in each arm, the leads in each arm, the gauge resistance and the gauge factor.
 */
export function layoutVector(l: ArmLayout, gaugeOhms: number, gaugeFactor: number): LayoutVector {
  return Float64Array.from([
    ...l.multipliers,
    ...l.gauge.map((g) => (g ? 1 : 0)),
    ...l.leadsInArms,
    gaugeOhms,
    gaugeFactor,
  ]);
}

/**
 * Fills `c` with the exact map ratio(ε) = (n0 + n1ε + n2ε²)/(d0 + d1ε + d2ε²) (both in Ω²) and,
 * when it is linear-fractional, its lowest terms: with equal halves (R1 ≡ R3, R2 ≡ R4) the factor
 * R1 + R2 cancels, ratio = (R1 − R2)/(R1 + R2 + 2·Rser); otherwise it is linear-fractional exactly
 * when n2 = d2 = 0. The resistances are read from `c` itself (slots {@link COMPLETION_OHMS},
 * {@link OHMS_PER_LEAD}, {@link SERIES_OHMS}): a call with only typed arrays boxes no number, which
 * matters where a Monte Carlo trial fills a vector per trial.
 */
export function fillRational(c: Float64Array, v: LayoutVector): void {
  const gaugeOhms = v[12] as number;
  const gaugeFactor = v[13] as number;
  const completionOhms = c[COMPLETION_OHMS] as number;
  const ohmsPerLead = c[OHMS_PER_LEAD] as number;
  const seriesOhms = c[SERIES_OHMS] as number;
  const p1 = ((v[4] as number) === 1 ? gaugeOhms : completionOhms) + (v[8] as number) * ohmsPerLead;
  const p2 = ((v[5] as number) === 1 ? gaugeOhms : completionOhms) + (v[9] as number) * ohmsPerLead;
  const p3 = ((v[6] as number) === 1 ? gaugeOhms : completionOhms) + (v[10] as number) * ohmsPerLead;
  const p4 = ((v[7] as number) === 1 ? gaugeOhms : completionOhms) + (v[11] as number) * ohmsPerLead;
  const k = gaugeOhms * gaugeFactor;
  const g1 = k * (v[0] as number);
  const g2 = k * (v[1] as number);
  const g3 = k * (v[2] as number);
  const g4 = k * (v[3] as number);
  const a0 = p1 + p2;
  const a1 = g1 + g2;
  const b0 = p3 + p4;
  const b1 = g3 + g4;
  const n0 = differenceOfProducts(p1, p3, p2, p4);
  const n1 = p1 * g3 + p3 * g1 - p2 * g4 - p4 * g2;
  const n2 = differenceOfProducts(g1, g3, g2, g4);
  const d0 = a0 * b0 + seriesOhms * (a0 + b0);
  const d1 = a0 * b1 + a1 * b0 + seriesOhms * (a1 + b1);
  const d2 = a1 * b1;
  c[N0] = n0;
  c[N1] = n1;
  c[N2] = n2;
  c[D0] = d0;
  c[D1] = d1;
  c[D2] = d2;
  if (p1 === p3 && g1 === g3 && p2 === p4 && g2 === g4) {
    c[M0] = p1 - p2;
    c[M1] = g1 - g2;
    c[K0] = a0 + 2 * seriesOhms;
    c[K1] = a1;
  } else if (n2 === 0 && d2 === 0) {
    c[M0] = n0;
    c[M1] = n1;
    c[K0] = d0;
    c[K1] = d1;
  } else {
    c[M0] = Number.NaN;
  }
}

/**
 * The strain for a ratio from a coefficient vector: the linear-fractional inverse
 * ε = (M0 − K0·r)/(K1·r − M1) when there is one, else the root of
 * (r·d2 − n2)ε² + (r·d1 − n1)ε + (r·d0 − n0) = 0 inside (lo, hi) by the cancellation-free
 * formula (at most one root lies there: the map is strictly monotonic on it). Unchecked: NaN or a
 * strain outside (lo, hi) when the ratio is not one the bridge gives.
 */
export function solveRational(c: Float64Array, ratio: number, lo: number, hi: number): number {
  const m0 = c[M0] as number;
  if (m0 === m0)
    return (
      -differenceOfProducts(c[K0] as number, ratio, m0, 1) / ((c[K1] as number) * ratio - (c[M1] as number))
    );
  const qa = ratio * (c[D2] as number) - (c[N2] as number);
  const qb = ratio * (c[D1] as number) - (c[N1] as number);
  const qc = differenceOfProducts(ratio, c[D0] as number, c[N0] as number, 1);
  if (qa === 0) return -qc / qb;
  const disc = qb * qb - 4 * qa * qc;
  if (!(disc >= 0)) return Number.NaN;
  const q = -0.5 * (qb + (qb < 0 ? -Math.sqrt(disc) : Math.sqrt(disc)));
  const strain = qc / q;
  return strain > lo && strain < hi ? strain : q / qa;
}

/** The ratio at a strain from a coefficient vector (see {@link quotientOf}). */
export function ratioOfRational(c: Float64Array, strain: number): number {
  return quotientOf(
    c[N0] as number,
    c[N1] as number,
    c[N2] as number,
    c[D0] as number,
    c[D1] as number,
    c[D2] as number,
    strain,
  );
}
