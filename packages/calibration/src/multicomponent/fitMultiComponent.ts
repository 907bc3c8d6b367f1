import {
  BridgeworkError,
  checkInteger,
  checkOneOf,
  checkOptions,
  checkPositive,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { checkBoundedArray } from '../internal/checks.js';
import {
  designCondition,
  factorDesign,
  solveDesign,
  unitCovariance,
  type DesignFactor,
} from '../internal/leastSquares.js';
import {
  buildMultiComponentModel,
  checkComponentsAndBridges,
  matrix,
  type MultiComponentModel,
} from './createMultiComponentModel.js';
import {
  candidateTerms,
  interactionTermChoices,
  termValue,
  type InteractionTerms,
  type ModelTerm,
} from './terms.js';

/** One point of a loading schedule: the applied load components and the bridges' readings. */
export interface LoadingPoint {
  /** The applied load components, one per entry of `components` (any units, per component). */
  readonly loads: readonly number[];
  /** The bridges' readings (V/V or codes), one per entry of `bridges`. */
  readonly readings: readonly number[];
  /** Whether the load was rising or falling to this point (for the hysteresis figure). */
  readonly direction?: 'ascending' | 'descending';
  /** The repeat this point belongs to (integer ≥ 0), when the schedule is run more than once. */
  readonly run?: number;
}

/** Options of {@link fitMultiComponent}. */
export interface MultiComponentFitOptions {
  /** Names of the M load components (distinct), e.g. `['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz']`. */
  readonly components: readonly string[];
  /** Names of the N bridges (distinct, N ≥ M). */
  readonly bridges: readonly string[];
  /** The loading schedule: n points, more than the number of model terms (or as many, with `readingStandardUncertainties`). */
  readonly points: readonly LoadingPoint[];
  /** The second-order terms the model may hold. Default `'none'` (the linear model). */
  readonly interactions?: InteractionTerms;
  /** Fit a zero offset per bridge. Default true. */
  readonly offset?: boolean;
  /** Full scale of each component (> 0), the scale of cross-talk and of the inverse's tolerance. Default: the largest |load| of the component in the schedule. */
  readonly fullScale?: readonly number[];
  /**
   * Known standard uncertainty of each bridge's readings (> 0): the coefficient covariance is then
   * a Type B evaluation from them; without it, from the residuals (which needs more points than
   * terms).
   */
  readonly readingStandardUncertainties?: readonly number[];
  /**
   * A candidate term whose column's part independent of the accepted terms (the sine of its angle
   * to their span, on unit-norm columns) is at or below this is rejected as undetermined. In
   * (0, 0.1]. Default 1e-7.
   */
  readonly independenceTolerance?: number;
}

/** A candidate term that the schedule cannot determine (see {@link MultiComponentCalibration.rejectedTerms}). */
export interface RejectedTerm {
  /** The term. */
  readonly term: ModelTerm;
  /** Its independence when it was considered (0 for a column of zeros). */
  readonly independence: number;
  /** Why, in words. */
  readonly reason: string;
}

/** A fitted multi-component calibration (see {@link fitMultiComponent}): the model and the fit's own figures. */
export interface MultiComponentCalibration extends MultiComponentModel {
  /** Candidate terms the schedule cannot determine, with the reason (not in the model). */
  readonly rejectedTerms: readonly RejectedTerm[];
  /**
   * The reverse linear fit, loads regressed on readings (F = D·r + d, least squares), with its
   * load residuals. Noise-free it equals (C, −C·a); with reading noise it is biased towards zero
   * (errors in the regressor), which is why the forward fit is the calibration.
   */
  readonly reverseFit: {
    /** D (M×N). */
    readonly matrix: readonly (readonly number[])[];
    /** d (M). */
    readonly offsets: readonly number[];
    /** Largest |D_jk − C_jk|/max|C_j·| over the entries: the relation between the two fits. */
    readonly largestDifferenceFraction: number;
  };
  /** Residuals reading − fitted reading (n×N). */
  readonly residuals: readonly (readonly number[])[];
  /** s_i = √(Σ e²/ν) per bridge (N), `undefined` when ν = 0. */
  readonly standardErrors: readonly (number | undefined)[];
  /** Load residuals: the inverse of each point's readings minus its applied loads (n×M). */
  readonly loadResiduals: readonly (readonly number[])[];
  /** √(Σ load residual²/ν) per component (M), `undefined` when ν = 0. */
  readonly loadStandardErrors: readonly (number | undefined)[];
  /** Largest |load residual| per component as a fraction of its full scale (M). */
  readonly largestLoadResidualFractions: readonly number[];
  /**
   * Hysteresis per component: the largest |mean descending − mean ascending load residual| over
   * load states visited both ways, as a fraction of full scale (M); `undefined` without both
   * directions at one load state.
   */
  readonly hysteresisFractions: readonly (number | undefined)[];
  /** The rank of the design (the number of terms). */
  readonly rank: number;
  /** The 2-norm condition number of the schedule's design matrix with unit-norm columns. */
  readonly condition: number;
  /** The coefficients' standard uncertainties (N×T), from the residuals or the given reading uncertainties. */
  readonly coefficientStandardUncertainties: readonly (readonly number[])[];
  /** (AᵀA)⁻¹ over the terms (T×T). */
  readonly unitCovariance: readonly (readonly number[])[];
  /** Σ (N×N): the readings' covariance, from the residuals or the given uncertainties. */
  readonly readingCovariance: readonly (readonly number[])[];
  /** Where the coefficient uncertainties come from. */
  readonly uncertaintySource: 'residuals' | 'given';
}

function rejectionReason(
  term: ModelTerm,
  names: readonly string[],
  zero: boolean,
  tolerance: number,
): string {
  const [a, b] = term.components as [number, number];
  if (zero) {
    if (term.kind === 'offset') return 'the offset column is zero (no points)';
    if (term.kind === 'linear') return `component ${names[a]} is never loaded (it is 0 at every point)`;
    if (term.kind === 'square')
      return `component ${names[a]} is never loaded, so ${term.name} is undetermined`;
    return `${names[a]} and ${names[b]} are never loaded together (their product is 0 at every point)`;
  }
  const which =
    term.kind === 'linear'
      ? `component ${names[a]} is loaded only in fixed proportion to the terms before it (a constant load, or always with another component)`
      : term.kind === 'square'
        ? `${term.name} is indistinguishable from the terms before it (${names[a]} takes too few distinct values: load it at three or more levels)`
        : `${term.name} is indistinguishable from the terms before it (load ${names[a]} and ${names[b]} together at several combinations)`;
  return `${which}; its independent part is at most ${tolerance}`;
}

/**
 * Fits a multi-component calibration (a multi-axis force/moment sensor, a balance) to a loading
 * schedule: the linear model and, optionally, second-order interaction terms, with covariance,
 * cross-talk, condition and the per-sample inverse.
 *
 * @remarks
 * Model (the form AIAA R-091-2003, _Calibration and Use of Internal Strain-Gage Balances_,
 * recommends for balances, from memory): each bridge's reading is
 * r_i = a_i + Σ_j S_ij·F_j + Σ_{j≤k} q_ijk·F_j·F_k, with the squares and products as chosen by
 * `interactions`. Every bridge shares the design matrix A (n×T, one row of term values g(F) per
 * point), so one Householder QR of A (columns scaled to unit norm) solves all N regressions; the
 * normal equations are never formed. Terms enter in a fixed order (offset, linear, squares,
 * products); a term whose column's part independent of the terms before it is at or below
 * `independenceTolerance` is rejected as undetermined by the schedule, with the reason. A rejected
 * linear term (a component never loaded, or loaded only with another) refuses the fit: without it
 * the inverse does not exist.
 *
 * Covariance: the N regressions are a multivariate linear model, Cov(b_i·, b_k·) = Σ_ik·(AᵀA)⁻¹,
 * with Σ the readings' covariance estimated from the residuals (EᵀE/ν) or diagonal from
 * `readingStandardUncertainties` (a Type B input), and (AᵀA)⁻¹ = R⁻¹R⁻ᵀ.
 *
 * The relation of the two linear forms: the calibration is the forward fit r = a + S·F (the loads
 * are the exactly known quantities); its inverse is F = C·(r − a) with C = (SᵀWS)⁻¹SᵀW, W the
 * readings' weights (1/s_i²; equal when any s_i is 0), which is S⁻¹ when N = M. The reverse fit,
 * loads regressed on readings, is reported beside it: equal to C noise-free, attenuated by reading
 * noise otherwise.
 *
 * Cross-talk: each bridge's primary component p is the one with the largest |S_ij|·FS_j; its
 * full-scale output FSO_i = S_ip·FS_p; cross-talk is S_ij·FS_j/FSO_i, and every term's
 * full-scale share b_it·g_t(FS)/FSO_i. These are fractions (reports show percent).
 *
 * @param options - Names, schedule, terms, full scales, reading uncertainties, tolerance.
 * @returns The calibration, its figures, the inverse and the uncertainty evaluations.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` by the
 *   options rule (also per point); `invalid-shape` for names or arrays of the wrong shape, or
 *   N < M; `not-finite`, `wrong-type`, `out-of-range` for bad numbers (loads and readings within
 *   ±1e100); `invalid-option` for unknown interactions or direction; `too-few-points` for no more
 *   points than terms (or fewer, with given uncertainties); `singular` (param `points`) when a
 *   component's linear term is undetermined (the reason names the component) or the sensitivity
 *   matrix cannot be inverted.
 * @example
 * ```ts
 * const cal = fitMultiComponent({ components: ['Fx', 'Fy'], bridges: ['A', 'B'], points });
 * cal.sensitivity; // [[S_AFx, S_AFy], [S_BFx, S_BFy]]
 * cal.crossTalk[0][1]; // bridge A's output at full-scale Fy / its full-scale output
 * cal.createInverse().loadsFromReadings([1.2e-3, -0.4e-3]); // Float64Array [Fx, Fy]
 * ```
 */
export function fitMultiComponent(options: MultiComponentFitOptions): MultiComponentCalibration {
  const o = checkOptions('options', options, {
    known: [
      'components',
      'bridges',
      'points',
      'interactions',
      'offset',
      'fullScale',
      'readingStandardUncertainties',
      'independenceTolerance',
    ],
    required: ['components', 'bridges', 'points'],
  });
  const { names, bridges } = checkComponentsAndBridges(o['components'], o['bridges']);
  const m = names.length;
  const nb = bridges.length;
  const interactions =
    o['interactions'] === undefined
      ? 'none'
      : checkOneOf('interactions', o['interactions'], interactionTermChoices);
  if (o['offset'] !== undefined && typeof o['offset'] !== 'boolean') {
    throw new BridgeworkError('wrong-type', `\`offset\` must be a boolean; got ${formatValue(o['offset'])}`, {
      param: 'offset',
      value: o['offset'],
    });
  }
  const withOffset = o['offset'] !== false;
  const tolerance =
    o['independenceTolerance'] === undefined
      ? 1e-7
      : checkRange('independenceTolerance', o['independenceTolerance'], {
          min: 0,
          max: 0.1,
          minExclusive: true,
        });
  if (!Array.isArray(o['points'])) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`points\` must be an array of loading points; got ${formatValue(o['points'])}`,
      {
        param: 'points',
        value: o['points'],
      },
    );
  }
  const points = (o['points'] as unknown[]).map((p, i) => {
    const po = checkOptions(`points[${i}]`, p, {
      known: ['loads', 'readings', 'direction', 'run'],
      required: ['loads', 'readings'],
    });
    return {
      loads: checkBoundedArray(`points[${i}].loads`, po['loads'], m),
      readings: checkBoundedArray(`points[${i}].readings`, po['readings'], nb),
      direction:
        po['direction'] === undefined
          ? undefined
          : checkOneOf(`points[${i}].direction`, po['direction'], ['ascending', 'descending'] as const),
      run: po['run'] === undefined ? undefined : checkInteger(`points[${i}].run`, po['run'], { min: 0 }),
    };
  });
  const n = points.length;
  const given =
    o['readingStandardUncertainties'] === undefined
      ? undefined
      : checkBoundedArray('readingStandardUncertainties', o['readingStandardUncertainties'], nb).map((u, i) =>
          checkPositive(`readingStandardUncertainties[${i}]`, u),
        );
  const fullScale =
    o['fullScale'] === undefined
      ? names.map((_, j) => Math.max(0, ...points.map((p) => Math.abs(p.loads[j] as number))))
      : checkBoundedArray('fullScale', o['fullScale'], m).map((v, j) => checkPositive(`fullScale[${j}]`, v));

  // Term selection by ordered rejection on one QR of the design.
  const candidates = candidateTerms(names, withOffset, interactions);
  const tc = candidates.length;
  const design = new Float64Array(n * tc);
  points.forEach((p, i) => candidates.forEach((term, t) => (design[i * tc + t] = termValue(term, p.loads))));
  const needed = given === undefined ? tc + 1 : tc;
  if (n < needed) {
    throw new BridgeworkError(
      'too-few-points',
      `\`points\` must hold at least ${needed} points for ${tc} candidate terms${given === undefined ? ' with uncertainties from the residuals (or give readingStandardUncertainties)' : ''}; got ${n}`,
      { param: 'points', value: n, limit: needed },
    );
  }
  const factor: DesignFactor = factorDesign(design, n, tc, tolerance);
  const acceptedSet = new Set(factor.accepted);
  const rejectedTerms: RejectedTerm[] = candidates.flatMap((term, t) =>
    acceptedSet.has(t)
      ? []
      : [
          {
            term,
            independence: factor.independence[t] as number,
            reason: rejectionReason(term, names, factor.norms[t] === 0, tolerance),
          },
        ],
  );
  const missingLinear = rejectedTerms.find((r) => r.term.kind === 'linear' || r.term.kind === 'offset');
  if (missingLinear !== undefined) {
    throw new BridgeworkError(
      'singular',
      `\`points\` must determine every component's sensitivity (and the offsets): ${missingLinear.reason}`,
      { param: 'points', value: missingLinear.term.name },
    );
  }
  const terms = factor.accepted.map((t) => candidates[t] as ModelTerm);
  const tt = terms.length;
  // Coefficients per bridge, residuals, Σ.
  const coefficients: number[][] = [];
  const residuals = Array.from({ length: n }, () => new Array<number>(nb).fill(0));
  for (let i = 0; i < nb; i++) {
    const y = points.map((p) => p.readings[i] as number);
    const b = Array.from(solveDesign(factor, y));
    coefficients.push(b);
    points.forEach((p, r) => {
      let fitted = 0;
      terms.forEach((term, t) => (fitted += (b[t] as number) * termValue(term, p.loads)));
      (residuals[r] as number[])[i] = (p.readings[i] as number) - fitted;
    });
  }
  const dof = n - tt;
  const residualCov = Array.from({ length: nb }, (_, i) =>
    Array.from({ length: nb }, (_, k) =>
      dof > 0 ? residuals.reduce((s, e) => s + (e[i] as number) * (e[k] as number), 0) / dof : 0,
    ),
  );
  const readingCov =
    given === undefined
      ? residualCov
      : Array.from({ length: nb }, (_, i) =>
          Array.from({ length: nb }, (_, k) => (i === k ? (given[i] as number) ** 2 : 0)),
        );
  const standardErrors = residualCov.map((row, i) => (dof > 0 ? Math.sqrt(row[i] as number) : undefined));
  const unit = matrix(unitCovariance(factor), tt, tt);
  const coefficientStandardUncertainties = coefficients.map((row, i) =>
    row.map((_, t) =>
      Math.sqrt(((readingCov[i] as number[])[i] as number) * ((unit[t] as number[])[t] as number)),
    ),
  );

  const model = buildMultiComponentModel({
    names,
    bridges,
    terms,
    coefficients,
    fullScale,
    unitCovariance: unit,
    readingCovariance: readingCov,
    degreesOfFreedom: dof,
    uncertaintyDegreesOfFreedom: given === undefined ? dof : Infinity,
    uncertaintySource: given === undefined ? 'residuals' : 'given',
    param: 'points',
  });
  const inverse = model.createInverse();
  const left = Float64Array.from(model.loadMatrix.flat());

  // Load residuals, hysteresis.
  const loadResiduals = points.map((p) => {
    const f = inverse.loadsFromReadings(p.readings);
    return names.map((_, j) => (f[j] as number) - (p.loads[j] as number));
  });
  const loadStandardErrors = names.map((_, j) =>
    dof > 0 ? Math.sqrt(loadResiduals.reduce((s, e) => s + (e[j] as number) ** 2, 0) / dof) : undefined,
  );
  const fs = (j: number): number => (fullScale[j] as number) || 1;
  const largestLoadResidualFractions = names.map((_, j) =>
    Math.max(0, ...loadResiduals.map((e) => Math.abs(e[j] as number) / fs(j))),
  );
  const states = new Map<string, { up: number[][]; down: number[][] }>();
  points.forEach((p, r) => {
    if (p.direction === undefined) return;
    const key = p.loads.join(',');
    const entry = states.get(key) ?? { up: [], down: [] };
    (p.direction === 'ascending' ? entry.up : entry.down).push(loadResiduals[r] as number[]);
    states.set(key, entry);
  });
  const hysteresisFractions = names.map((_, j) => {
    let largest: number | undefined;
    for (const { up, down } of states.values()) {
      if (up.length === 0 || down.length === 0) continue;
      const mean = (xs: number[][]): number => xs.reduce((s, e) => s + (e[j] as number), 0) / xs.length;
      const h = Math.abs(mean(down) - mean(up)) / fs(j);
      largest = Math.max(largest ?? 0, h);
    }
    return largest;
  });

  // Reverse fit: loads on readings (offset column first when fitted).
  const rc = nb + (withOffset ? 1 : 0);
  const reverseDesign = new Float64Array(n * rc);
  points.forEach((p, r) => {
    if (withOffset) reverseDesign[r * rc] = 1;
    for (let i = 0; i < nb; i++) reverseDesign[r * rc + i + (withOffset ? 1 : 0)] = p.readings[i] as number;
  });
  const reverseFactor = factorDesign(reverseDesign, n, rc, 64 * n * Number.EPSILON);
  let reverseFit: MultiComponentCalibration['reverseFit'];
  if (reverseFactor.accepted.length === rc) {
    const rows = names.map((_, j) =>
      Array.from(
        solveDesign(
          reverseFactor,
          points.map((p) => p.loads[j] as number),
        ),
      ),
    );
    const matrixD = rows.map((row) => row.slice(withOffset ? 1 : 0));
    const largestDifferenceFraction = Math.max(
      ...matrixD.map((row, j) => {
        const scale = Math.max(...Array.from({ length: nb }, (_, i) => Math.abs(left[j * nb + i] as number)));
        return Math.max(...row.map((d, i) => Math.abs(d - (left[j * nb + i] as number)) / scale));
      }),
    );
    reverseFit = {
      matrix: matrixD,
      offsets: rows.map((row) => (withOffset ? (row[0] as number) : 0)),
      largestDifferenceFraction,
    };
  } else {
    reverseFit = { matrix: [], offsets: [], largestDifferenceFraction: Infinity };
  }

  return {
    ...model,
    coefficientStandardUncertainties,
    unitCovariance: unit,
    readingCovariance: readingCov,
    uncertaintySource: given === undefined ? 'residuals' : 'given',
    rejectedTerms,
    reverseFit,
    residuals,
    standardErrors,
    loadResiduals,
    loadStandardErrors,
    largestLoadResidualFractions,
    hysteresisFractions,
    rank: tt,
    condition: designCondition(factor),
  };
}
