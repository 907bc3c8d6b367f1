import {
  BridgeworkError,
  checkLength,
  checkOptions,
  checkStrain,
  formatValue,
  requireOption,
  rosetteLegAngles,
  type RosetteLayout,
} from '@bridgework/core';
import { mohrStrain, wrapAxis } from './internal/mohr.js';
import type { PrincipalStrains } from './PrincipalStrains.js';
import { readStrainState, strainAlong, type StrainState } from './strainState.js';

/** The strains of gauges a, b and c of a rosette, in m/m, in the order of the layout's angles. */
export type RosetteLegStrains = readonly [number, number, number];

/**
 * The largest condition number {@link createRosette} accepts (Frobenius norm, see
 * {@link Rosette.conditionNumber}).
 *
 * @remarks
 * A layout above it has two legs within about 0.1° of each other (modulo 180°) with the third at
 * right angles, or all three legs spread over only about 5°. The condition number bounds how much a relative error in the leg readings is
 * amplified in the strain state. Leg readings are seldom better than 0.1 % (gauge-factor
 * tolerance alone is typically ±0.5 % to ±1 %; common practice), so at 1000 even an optimistic
 * leg error can become a 100 % error in the result: such a reduction says nothing about the
 * surface and is rejected as `singular` rather than returned. Below the limit the condition
 * number is reported, so a user can judge a poorly conditioned but usable layout. The numerical
 * loss at the limit is only three of sixteen digits.
 */
export const maxRosetteConditionNumber = 1000;

/** Options of {@link createRosette}. */
export interface RosetteOptions {
  /**
   * `'rectangular'` (0°/45°/90°), `'delta'` (0°/60°/120°) or `{ anglesRadians: [θa, θb, θc] }`:
   * gauge directions counterclockwise from +x (see `RosetteLayout` in `@bridgework/core`).
   */
  readonly layout: RosetteLayout;
}

/** The reduction of one set of rosette readings: the strain state and its principal strains. */
export interface RosetteReduction extends StrainState, PrincipalStrains {
  /**
   * Direction of `maxStrain` measured from gauge a, counterclockwise positive, in radians in
   * (−π/2, π/2]; 0 when `equalPrincipalStrains` is true. For the named layouts and any layout
   * with θa = 0 it equals `angleFromXRadians`.
   */
  readonly angleRadians: number;
}

/** A configured rosette: the reduction and its forward map (see {@link createRosette}). */
export interface Rosette {
  /** Gauge directions [θa, θb, θc] in radians, counterclockwise from +x. */
  readonly anglesRadians: readonly [number, number, number];
  /**
   * Condition number κF = ‖B‖F·‖B⁻¹‖F of the leg equations written as
   * εi = c + d·cos 2θi + g·sin 2θi (c = (εx + εy)/2, d = (εx − εy)/2, g = γxy/2). It depends
   * only on the angles between the legs: √10 ≈ 3.16 for the delta (the smallest possible),
   * √15 ≈ 3.87 for the rectangular rosette; at most {@link maxRosetteConditionNumber}.
   */
  readonly conditionNumber: number;
  /**
   * Reduces three leg strains to the strain state, principal strains and principal direction.
   *
   * @param strains - `[εa, εb, εc]` in m/m, each in (−1, 1).
   * @returns The reduction (strains in m/m, angles in radians).
   * @throws {@link @bridgework/core!BridgeworkError} `missing-option`, `invalid-shape` (not three entries),
   *   `wrong-type`, `not-finite`, `out-of-range` (|ε| ≥ 1: probably µε passed as m/m).
   */
  reduce(strains: RosetteLegStrains): RosetteReduction;
  /**
   * The three leg strains a strain state produces (the forward map; `reduce` inverts it).
   *
   * @param state - εx, εy, γxy in m/m, each in (−1, 1).
   * @returns `[εa, εb, εc]` in m/m.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `out-of-range`.
   */
  legStrains(state: StrainState): [number, number, number];
}

/** Per-leg weights: εx = Σ x[i]·εi, εy = Σ y[i]·εi, γxy = Σ shear[i]·εi. */
interface LegWeights {
  readonly x: readonly [number, number, number];
  readonly y: readonly [number, number, number];
  readonly shear: readonly [number, number, number];
}

const SQRT3 = Math.sqrt(3);
const namedWeights: Readonly<Record<'rectangular' | 'delta', LegWeights>> = {
  // εx = εa, εy = εc, γxy = 2εb − εa − εc.
  rectangular: { x: [1, 0, 0], y: [0, 0, 1], shear: [-1, 2, -1] },
  // εx = εa, εy = (2εb + 2εc − εa)/3, γxy = 2(εb − εc)/√3.
  delta: { x: [1, 0, 0], y: [-1 / 3, 2 / 3, 2 / 3], shear: [0, 2 / SQRT3, -2 / SQRT3] },
};

/**
 * Weights of any three directions, by Cramer's rule in a cancellation-free product form: with
 * (i, j, k) a cyclic order of the legs and Δi = sin(θi − θj)·sin(θk − θi),
 * x[i] = −sinθj·sinθk/Δi, y[i] = −cosθj·cosθk/Δi, shear[i] = sin(θj + θk)/Δi.
 */
function generalWeights(theta: readonly [number, number, number]): LegWeights {
  const x: number[] = [];
  const y: number[] = [];
  const shear: number[] = [];
  for (let i = 0; i < 3; i++) {
    const ti = theta[i] as number;
    const tj = theta[(i + 1) % 3] as number;
    const tk = theta[(i + 2) % 3] as number;
    const delta = Math.sin(ti - tj) * Math.sin(tk - ti);
    x.push((-Math.sin(tj) * Math.sin(tk)) / delta);
    y.push((-Math.cos(tj) * Math.cos(tk)) / delta);
    shear.push(Math.sin(tj + tk) / delta);
  }
  return { x, y, shear } as unknown as LegWeights;
}

/** κF = √6·‖B⁻¹‖F, with B⁻¹ the map from legs to (c, d, g). NaN or ∞ for parallel legs. */
function conditionOf(w: LegWeights): number {
  let sum = 0;
  for (let i = 0; i < 3; i++) {
    const wx = w.x[i] as number;
    const wy = w.y[i] as number;
    const wg = 0.5 * (w.shear[i] as number);
    sum += 0.25 * (wx + wy) ** 2 + 0.25 * (wx - wy) ** 2 + wg * wg;
  }
  return Math.sqrt(6 * sum);
}

/** The smallest angle between two legs as directions (modulo 180°), in degrees, for messages. */
function closestPairDegrees(theta: readonly [number, number, number]): number {
  let best = Infinity;
  for (let i = 0; i < 3; i++) {
    const gap = Math.abs(wrapAxis((theta[i] as number) - (theta[(i + 1) % 3] as number)));
    best = Math.min(best, gap);
  }
  return (best * 180) / Math.PI;
}

const EPSILON_HALF = 2 ** -53; // unit roundoff of binary64

/**
 * Creates a rosette reduction for a rectangular, delta or any three-direction layout.
 *
 * @remarks
 * A gauge at θ reads εθ = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ (the strain-transformation
 * equation, {@link normalStrainAtAngle}). Three gauges give three linear equations in εx, εy and
 * the engineering shear strain γxy, solved here once per layout in closed form:
 *
 * - rectangular (0°/45°/90°): εx = εa, εy = εc, γxy = 2εb − εa − εc;
 * - delta (0°/60°/120°): εx = εa, εy = (2εb + 2εc − εa)/3, γxy = 2(εb − εc)/√3;
 * - any three directions: Cramer's rule written as products of sines, so nearly parallel legs
 *   lose no accuracy to cancellation (equations in docs/mechanics.md).
 *
 * The state is then reduced with Mohr's circle ({@link principalStrainsFromState}); the
 * principal direction comes from atan2, so every quadrant is kept. Rectangular and delta
 * formulas: Dally & Riley, _Experimental Stress Analysis_, strain-analysis chapter (from memory);
 * they follow in three lines from the transformation equation.
 *
 * Equal principal strains: every direction is principal. The angles are reported as 0 with
 * `equalPrincipalStrains: true` when R = (ε1 − ε2)/2 is within the rounding error of the
 * reduction, R ≤ 64·u·κF·max|εi| (u = 2⁻⁵³; about 2e-14·max|εi| for a delta rosette): for example
 * three equal legs, whatever the layout (the largest R seen for three equal legs over a million
 * random layouts was 9.3·u·κF·max|εi|).
 *
 * Nearly parallel legs: a layout whose condition number exceeds
 * {@link maxRosetteConditionNumber} (for example two legs within about 0.1°, modulo 180°, with the
 * third at right angles) is rejected.
 *
 * Accuracy: the round trip state → legs → state is within 2e-15 of the largest state component
 * for the named layouts, and within 1e-15·κF of the largest leg or component for any accepted
 * layout (both property-tested against 40-digit references).
 *
 * @param options - `layout`.
 * @returns An evaluator with `reduce(strains)`, `legStrains(state)`, the angles and κF.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` (no layout), `invalid-option` (unknown layout name),
 *   `invalid-shape`, `not-finite`, `wrong-type` (bad `anglesRadians`), `singular` (nearly
 *   parallel legs; `limit` = {@link maxRosetteConditionNumber}).
 * @example
 * ```ts
 * const rosette = createRosette({ layout: 'rectangular' });
 * rosette.conditionNumber; // 3.872983346207417 (√15)
 * rosette.reduce([600e-6, 900e-6, -200e-6]).maxStrain; // 0.0010062257748298551 (1006.23 µε)
 * ```
 */
export function createRosette(options: RosetteOptions): Rosette {
  const o = checkOptions('options', options, { known: ['layout'], required: ['layout'] });
  const layout = o['layout'] as RosetteLayout;
  const anglesRadians = rosetteLegAngles(layout);
  const weights =
    layout === 'rectangular' || layout === 'delta' ? namedWeights[layout] : generalWeights(anglesRadians);
  const conditionNumber = conditionOf(weights);
  if (!(conditionNumber <= maxRosetteConditionNumber)) {
    throw new BridgeworkError(
      'singular',
      `\`layout.anglesRadians\` must be three well-separated gauge directions (condition number <= ${maxRosetteConditionNumber}); ` +
        `got ${Number.isFinite(conditionNumber) ? `condition number ${conditionNumber.toPrecision(4)}` : 'parallel legs (the reduction does not exist)'}: ` +
        `the closest two legs are ${closestPairDegrees(anglesRadians).toPrecision(3)}° apart (modulo 180°)`,
      { param: 'layout.anglesRadians', value: anglesRadians, limit: maxRosetteConditionNumber },
    );
  }
  const [xa, xb, xc] = weights.x;
  const [ya, yb, yc] = weights.y;
  const [sa, sb, sc] = weights.shear;
  const thetaA = anglesRadians[0];
  const roundingScale = 64 * EPSILON_HALF * conditionNumber;

  return {
    anglesRadians,
    conditionNumber,
    reduce(strains: RosetteLegStrains): RosetteReduction {
      const legs = checkLength<number>('strains', requireOption('strains', strains), 3);
      const ea = checkStrain('strains[0]', legs[0]);
      const eb = checkStrain('strains[1]', legs[1]);
      const ec = checkStrain('strains[2]', legs[2]);
      const strainX = xa * ea + xb * eb + xc * ec;
      const strainY = ya * ea + yb * eb + yc * ec;
      const shearStrainXY = sa * ea + sb * eb + sc * ec;
      const tolerance = roundingScale * Math.max(Math.abs(ea), Math.abs(eb), Math.abs(ec));
      // An ill-conditioned layout amplifies the legs by up to κF: legs that no strain state can
      // produce (inconsistent readings) may reduce to a "state" no gauge could survive. Refuse it
      // here, rather than hand on figures that every later step rejects.
      checkReducedStrain('strainX', strainX, legs, conditionNumber);
      checkReducedStrain('strainY', strainY, legs, conditionNumber);
      checkReducedStrain('shearStrainXY', shearStrainXY, legs, conditionNumber);
      const p = mohrStrain(strainX, strainY, shearStrainXY, tolerance);
      checkReducedStrain('maxStrain', p.maxStrain, legs, conditionNumber);
      checkReducedStrain('minStrain', p.minStrain, legs, conditionNumber);
      return {
        strainX,
        strainY,
        shearStrainXY,
        maxStrain: p.maxStrain,
        minStrain: p.minStrain,
        maxShearStrain: p.maxShearStrain,
        angleRadians: p.equalPrincipalStrains ? 0 : wrapAxis(p.angleFromXRadians - thetaA),
        angleFromXRadians: p.angleFromXRadians,
        equalPrincipalStrains: p.equalPrincipalStrains,
      };
    },
    legStrains(state: StrainState): [number, number, number] {
      const { strainX, strainY, shearStrainXY } = readStrainState('state', state);
      return [
        strainAlong(strainX, strainY, shearStrainXY, anglesRadians[0]),
        strainAlong(strainX, strainY, shearStrainXY, anglesRadians[1]),
        strainAlong(strainX, strainY, shearStrainXY, anglesRadians[2]),
      ];
    },
  };
}

/** Refuses a reduced strain outside (−1, 1): the legs are inconsistent for this layout. */
function checkReducedStrain(
  name: string,
  value: number,
  legs: readonly unknown[],
  conditionNumber: number,
): void {
  if (Math.abs(value) < 1) return;
  throw new BridgeworkError(
    'out-of-range',
    `\`strains\` must reduce to a strain state inside (-1, 1) m/m; got ${name} = ${formatValue(value)} from legs ` +
      `[${legs.map((l) => formatValue(l)).join(', ')}]: this layout amplifies leg errors up to ${conditionNumber.toPrecision(3)} times ` +
      '(condition number), so the readings are inconsistent with any strain state (check them, or use a better separated layout)',
    { param: 'strains', value: legs, limit: [-1, 1] },
  );
}
