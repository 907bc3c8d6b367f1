import {
  BridgeworkError,
  checkInteger,
  checkOneOf,
  checkOptions,
  checkPositive,
  checkRange,
  formatValue,
} from '@bridgework/core';
import {
  monteCarlo,
  type Correlation,
  type InputQuantities,
  type MonteCarloResult,
} from '@bridgework/uncertainty';
import { MAGNITUDE_LIMIT, checkBoundedArray } from '../internal/checks.js';
import {
  designCondition,
  factorDesign,
  solveDesign,
  unitCovariance,
  type DesignFactor,
} from '../internal/leastSquares.js';
import { MAX_ITERATIONS, createInverseSolver, type InverseModel } from './inverse.js';
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

/** Options of {@link MultiComponentCalibration.createInverse}. */
export interface MultiComponentInverseOptions {
  /**
   * Convergence of the iterative inverse: stop when every step |ΔF_j| ≤ tolerance·fullScale_j.
   * In [1e-15, 1e-3]. Default max(2⁻⁴⁴ ≈ 5.7e-14, 64·ε·κ), κ the condition of the weighted,
   * full-scale-scaled sensitivity matrix.
   */
  readonly tolerance?: number;
  /** The most Newton steps per sample (1–100). Default 30. */
  readonly maxIterations?: number;
}

/** The per-sample inverse: loads from readings (see {@link MultiComponentCalibration.createInverse}). */
export interface MultiComponentInverse {
  /**
   * `'direct'`: F = C·(r − a), the linear model. `'fixed-point'` (N = M with interactions): the
   * iteration F ← C·(r − a) − C·Q·g(F) of AIAA R-091, accepted when its steps contract by at least
   * half and the last is within the tolerance, with Newton steps from the linear start when they do
   * not. `'gauss-newton'` (N > M with interactions): Gauss–Newton steps on the weighted residuals.
   */
  readonly method: 'direct' | 'fixed-point' | 'gauss-newton';
  /** The convergence tolerance, relative to each component's full scale. */
  readonly tolerance: number;
  /** The most steps per sample. */
  readonly maxIterations: number;
  /**
   * Loads from one sample of readings.
   *
   * @param readings - N readings, in the order of `bridges`.
   * @param out - Optional output of M entries (reused, so nothing is allocated).
   * @returns The M load components (`out` when given).
   * @throws {@link @bridgework/core!BridgeworkError} `not-converged` when the iteration does not
   *   meet its tolerance within `maxIterations` (readings no load state explains).
   */
  loadsFromReadings(readings: ArrayLike<number>, out?: Float64Array): Float64Array;
  /**
   * Converts interleaved samples: readings `[r0…r(N−1), r0…]` to loads `[F0…F(M−1), F0…]`.
   * Allocates nothing; throws on the first sample that does not converge (its index in the message).
   *
   * @param readings - k·N readings.
   * @param out - At least k·M entries.
   * @returns The number of samples k.
   */
  convert(readings: Float64Array, out: Float64Array): number;
}

/** Options of {@link MultiComponentCalibration.uncertaintyAt} and `monteCarloAt`. */
export interface LoadStateOptions {
  /** The load state (M components). Give this or `readings`. */
  readonly loads?: readonly number[];
  /** The readings (N), solved by the inverse. Give this or `loads`. */
  readonly readings?: readonly number[];
  /** Standard uncertainty of each bridge's reading in use (≥ 0, N), from the channel's budget. Default: zeros. */
  readonly readingStandardUncertainties?: readonly number[];
  /** Include the calibration's own uncertainty (the coefficient covariance). Default true. */
  readonly includeCalibration?: boolean;
}

/** Options of {@link MultiComponentCalibration.monteCarloAt}. */
export interface LoadStateMonteCarloOptions extends LoadStateOptions {
  /** Trials per component (integer). Default 10⁵. */
  readonly trials?: number;
  /** Seed of the random streams. Default 1. */
  readonly seed?: number;
  /** Coverage probability. Default 0.95. */
  readonly coverage?: number;
}

/** Uncertainty of the load components at a load state (see {@link MultiComponentCalibration.uncertaintyAt}). */
export interface LoadStateUncertainty {
  /** The load state F (M). */
  readonly loads: readonly number[];
  /** u(F_j), each component's standard uncertainty (M). */
  readonly standardUncertainties: readonly number[];
  /** Covariance of F (M×M): calibration plus reading noise. */
  readonly covariance: readonly (readonly number[])[];
  /** The calibration's part of the covariance (M×M). */
  readonly calibrationCovariance: readonly (readonly number[])[];
  /** The reading noise's part of the covariance (M×M). */
  readonly noiseCovariance: readonly (readonly number[])[];
  /** Degrees of freedom of the calibration part (points − terms; Infinity for given uncertainties). */
  readonly degreesOfFreedom: number;
}

/** A fitted multi-component calibration (see {@link fitMultiComponent}). */
export interface MultiComponentCalibration {
  /** Component names (M). */
  readonly components: readonly string[];
  /** Bridge names (N). */
  readonly bridges: readonly string[];
  /** The terms of the model, in the order of the coefficient columns. */
  readonly terms: readonly ModelTerm[];
  /** Candidate terms the schedule cannot determine, with the reason (not in the model). */
  readonly rejectedTerms: readonly RejectedTerm[];
  /** Coefficients b (N×T): reading_i = Σ_t b_it·g_t(F). */
  readonly coefficients: readonly (readonly number[])[];
  /** Their standard uncertainties (N×T). */
  readonly coefficientStandardUncertainties: readonly (readonly number[])[];
  /** (AᵀA)⁻¹ over the terms (T×T): Cov(b_i, b_k) = Σ_ik·(AᵀA)⁻¹ (JCGM 100 for a multivariate linear model). */
  readonly unitCovariance: readonly (readonly number[])[];
  /** Σ (N×N): the readings' covariance, from the residuals or the given uncertainties. */
  readonly readingCovariance: readonly (readonly number[])[];
  /** Zero offsets a (N); zeros without `offset`. */
  readonly offsets: readonly number[];
  /** The sensitivity matrix S (N×M): ∂reading_i/∂F_j of the linear terms. */
  readonly sensitivity: readonly (readonly number[])[];
  /** C (M×N): the weighted left inverse of S, F = C·(r − a) for the linear model (S⁻¹ when N = M). */
  readonly loadMatrix: readonly (readonly number[])[];
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
  /** ν = points − terms. */
  readonly degreesOfFreedom: number;
  /** Where the coefficient uncertainties come from. */
  readonly uncertaintySource: 'residuals' | 'given';
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
  /** Full scale of each component (M). */
  readonly fullScale: readonly number[];
  /** The component each bridge measures most: the largest |S_ij|·FS_j (N). */
  readonly primaryComponents: readonly number[];
  /** Full-scale output of each bridge: S_ip·FS_p for its primary component p (N). */
  readonly fullScaleOutputs: readonly number[];
  /**
   * Cross-talk (N×M): the output of bridge i at full scale of component j as a fraction of its
   * full-scale output, S_ij·FS_j/(S_ip·FS_p) (1 for the primary component).
   */
  readonly crossTalk: readonly (readonly number[])[];
  /**
   * Each term's output at full scale as a fraction of the bridge's full-scale output (N×T):
   * b_it·g_t(FS)/FSO_i, g_t(FS) the product of the term's full scales (1 for the offset). The
   * second-order interactions, beside the linear cross-talk.
   */
  readonly termFractions: readonly (readonly number[])[];
  /** The rank of the design (the number of terms). */
  readonly rank: number;
  /** The 2-norm condition number of the schedule's design matrix with unit-norm columns. */
  readonly condition: number;
  /** The condition of the weighted sensitivity matrix with full-scale columns (what the inverse amplifies). */
  readonly sensitivityCondition: number;
  /**
   * The readings the model gives at a load state (the forward map).
   *
   * @param loads - M load components.
   * @returns N readings.
   */
  readingsAt(loads: readonly number[]): number[];
  /**
   * The per-sample inverse.
   *
   * @param options - Tolerance and iteration bound.
   */
  createInverse(options?: MultiComponentInverseOptions): MultiComponentInverse;
  /**
   * The load components' uncertainty at a load state by the law of propagation (JCGM 100).
   *
   * @param options - The load state (or readings) and the reading noise in use.
   */
  uncertaintyAt(options: LoadStateOptions): LoadStateUncertainty;
  /**
   * The load components' distribution at a load state by Monte Carlo through the exact inverse
   * (JCGM 101), one run per component with the same seed.
   *
   * @param options - The load state (or readings), the reading noise, trials, seed, coverage.
   */
  monteCarloAt(options: LoadStateMonteCarloOptions): readonly MonteCarloResult[];
}

const matrix = (flat: ArrayLike<number>, rows: number, cols: number): number[][] =>
  Array.from({ length: rows }, (_, i) =>
    Array.from({ length: cols }, (_, j) => flat[i * cols + j] as number),
  );

function checkNames(param: string, value: unknown): string[] {
  if (!Array.isArray(value) || value.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}\` must be a non-empty array of names; got ${formatValue(value)}`,
      {
        param,
        value,
      },
    );
  }
  const names = value.map((v, i) => {
    if (typeof v !== 'string' || v.length === 0) {
      throw new BridgeworkError(
        'wrong-type',
        `\`${param}[${i}]\` must be a non-empty string; got ${formatValue(v)}`,
        {
          param: `${param}[${i}]`,
          value: v,
        },
      );
    }
    return v;
  });
  const duplicate = names.find((v, i) => names.indexOf(v) !== i);
  if (duplicate !== undefined) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}\` must hold distinct names; '${duplicate}' is repeated`,
      {
        param,
        value: duplicate,
      },
    );
  }
  return names;
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
  const names = checkNames('components', o['components']);
  const bridges = checkNames('bridges', o['bridges']);
  const m = names.length;
  const nb = bridges.length;
  if (nb < m) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`bridges\` must number at least as many as the components (${m}) for the loads to be determined; got ${nb}`,
      { param: 'bridges', value: nb, limit: m },
    );
  }
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

  // Linear parts.
  const offsetIndex = terms.findIndex((t) => t.kind === 'offset');
  const linearIndex = names.map((_, j) =>
    terms.findIndex((t) => t.kind === 'linear' && t.components[0] === j),
  );
  const offsets = coefficients.map((row) => (offsetIndex < 0 ? 0 : (row[offsetIndex] as number)));
  const sensitivity = coefficients.map((row) => linearIndex.map((t) => row[t] as number));
  const quadraticTerms = terms
    .map((t, index) => ({ t, index }))
    .filter(({ t }) => t.kind === 'square' || t.kind === 'product');

  // Weights: 1/σ², equal when any σ is zero (a noise-free schedule) or unknown.
  const sigma = readingCov.map((row, i) => Math.sqrt(row[i] as number));
  const sqrtWeights = Float64Array.from(
    sigma.every((s) => s > 0) ? sigma.map((s) => 1 / s) : sigma.map(() => 1),
  );
  const wMax = Math.max(...sqrtWeights);
  sqrtWeights.forEach((w, i) => (sqrtWeights[i] = w / wMax));

  // C = (SᵀWS)⁻¹SᵀW through QR of W½·S·diag(FS) (scaled so the condition is meaningful).
  const scaledS = new Float64Array(nb * m);
  for (let i = 0; i < nb; i++) {
    for (let j = 0; j < m; j++) {
      scaledS[i * m + j] =
        (sqrtWeights[i] as number) *
        ((sensitivity[i] as number[])[j] as number) *
        ((fullScale[j] as number) || 1);
    }
  }
  const sFactor = factorDesign(scaledS, nb, m, 64 * nb * Number.EPSILON);
  if (sFactor.accepted.length < m) {
    const missing = names[[...Array(m).keys()].find((j) => !sFactor.accepted.includes(j)) as number];
    throw new BridgeworkError(
      'singular',
      `\`points\` give a sensitivity matrix that cannot be inverted: no combination of bridges separates component ${missing} from the others`,
      { param: 'points', value: missing },
    );
  }
  const sensitivityCondition = designCondition(sFactor);
  const left = new Float64Array(m * nb);
  for (let i = 0; i < nb; i++) {
    const e = new Float64Array(nb);
    e[i] = sqrtWeights[i] as number;
    const col = solveDesign(sFactor, e);
    for (let j = 0; j < m; j++) left[j * nb + i] = (col[j] as number) * ((fullScale[j] as number) || 1);
  }
  const inverseModel = (tolerance_: number, maxIterations: number): InverseModel => ({
    m,
    n: nb,
    offsets: Float64Array.from(offsets),
    linear: Float64Array.from(sensitivity.flat()),
    termA: Int32Array.from(quadraticTerms.map(({ t }) => t.components[0] as number)),
    termB: Int32Array.from(quadraticTerms.map(({ t }) => t.components[1] as number)),
    quadratic: Float64Array.from(
      coefficients.flatMap((row) => quadraticTerms.map(({ index }) => row[index] as number)),
    ),
    left,
    sqrtWeights,
    fullScale: Float64Array.from(fullScale.map((v) => v || 1)),
    tolerance: tolerance_,
    maxIterations,
  });
  const defaultTolerance = Math.max(2 ** -44, 64 * Number.EPSILON * sensitivityCondition);

  function createInverse(inverseOptions: MultiComponentInverseOptions = {}): MultiComponentInverse {
    const io = checkOptions('options', inverseOptions, { known: ['tolerance', 'maxIterations'] });
    const tol =
      io['tolerance'] === undefined
        ? defaultTolerance
        : checkRange('tolerance', io['tolerance'], { min: 1e-15, max: 1e-3 });
    const maxIterations =
      io['maxIterations'] === undefined
        ? MAX_ITERATIONS
        : checkInteger('maxIterations', io['maxIterations'], { min: 1, max: 100 });
    const solver = createInverseSolver(inverseModel(tol, maxIterations));
    const scratch = new Float64Array(nb);
    return {
      method: quadraticTerms.length === 0 ? 'direct' : nb === m ? 'fixed-point' : 'gauss-newton',
      tolerance: tol,
      maxIterations,
      loadsFromReadings(readings, out) {
        // Copied into one Float64Array, so the solver only ever sees one array type (its code is
        // shared by every solver: mixed types would make it polymorphic and slow).
        scratch.set(checkBoundedArray('readings', Array.from(readings as ArrayLike<number>), nb));
        const r = scratch;
        const target = out ?? new Float64Array(m);
        if (!(target instanceof Float64Array) || target.length < m) {
          throw new BridgeworkError(
            'invalid-shape',
            `\`out\` must be a Float64Array of at least ${m} entries`,
            { param: 'out' },
          );
        }
        solver.solve(r, 0, target, 0);
        return target;
      },
      convert(readings, out) {
        if (!(readings instanceof Float64Array) || readings.length % nb !== 0) {
          throw new BridgeworkError(
            'invalid-shape',
            `\`readings\` must be a Float64Array of whole samples of ${nb} readings`,
            {
              param: 'readings',
            },
          );
        }
        const k = readings.length / nb;
        if (!(out instanceof Float64Array) || out.length < k * m) {
          throw new BridgeworkError(
            'invalid-shape',
            `\`out\` must be a Float64Array of at least ${k * m} entries`,
            { param: 'out' },
          );
        }
        solver.convert(readings, out, k, MAGNITUDE_LIMIT);
        return k;
      },
    };
  }
  const inverse = createInverse();

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

  // Cross-talk and term fractions.
  const primaryComponents = sensitivity.map((row) => {
    let best = 0;
    row.forEach((s, j) => {
      if (Math.abs(s) * fs(j) > Math.abs(row[best] as number) * fs(best)) best = j;
    });
    return best;
  });
  const fullScaleOutputs = sensitivity.map(
    (row, i) => (row[primaryComponents[i] as number] as number) * fs(primaryComponents[i] as number),
  );
  const crossTalk = sensitivity.map((row, i) =>
    row.map((s, j) => (s * fs(j)) / (fullScaleOutputs[i] as number)),
  );
  const termScale = (term: ModelTerm): number => term.components.reduce((p, j) => p * fs(j), 1);
  const termFractions = coefficients.map((row, i) =>
    row.map((b, t) => (b * termScale(terms[t] as ModelTerm)) / (fullScaleOutputs[i] as number)),
  );

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

  const figures = [
    ...coefficients.flat(),
    ...coefficientStandardUncertainties.flat(),
    ...crossTalk.flat(),
    ...termFractions.flat(),
    ...left,
  ];
  if (!figures.every(Number.isFinite)) {
    throw new BridgeworkError(
      'out-of-range',
      '`points` must hold loads and readings whose products and ratios stay within the double range (a coefficient overflows); express the loads in a larger or smaller unit',
      { param: 'points' },
    );
  }

  function termVector(loads: readonly number[]): number[] {
    return terms.map((t) => termValue(t, loads));
  }
  function readingsAt(loads: readonly number[]): number[] {
    const f = checkBoundedArray('loads', loads, m);
    const g = termVector(f);
    const r = coefficients.map((row) => row.reduce((s, b, t) => s + b * (g[t] as number), 0));
    if (!r.every(Number.isFinite)) overflow(f);
    return r;
  }
  function overflow(loads: readonly number[]): never {
    throw new BridgeworkError(
      'out-of-range',
      `\`loads\` must stay where the model's terms are finite (far beyond full scale they overflow the double range); got [${loads.map((v) => formatValue(v)).join(', ')}]`,
      { param: 'loads', value: loads },
    );
  }

  function loadState(so: Record<string, unknown>): {
    loads: number[];
    noise: number[];
    calibration: boolean;
  } {
    if ((so['loads'] === undefined) === (so['readings'] === undefined)) {
      throw new BridgeworkError(
        'conflicting-options',
        '`options` must give exactly one of `loads` and `readings`',
        {
          param: so['loads'] === undefined ? 'loads' : 'readings',
        },
      );
    }
    const loads =
      so['loads'] !== undefined
        ? checkBoundedArray('loads', so['loads'], m)
        : Array.from(inverse.loadsFromReadings(checkBoundedArray('readings', so['readings'], nb)));
    const noise =
      so['readingStandardUncertainties'] === undefined
        ? new Array<number>(nb).fill(0)
        : checkBoundedArray('readingStandardUncertainties', so['readingStandardUncertainties'], nb).map(
            (u, i) => checkRange(`readingStandardUncertainties[${i}]`, u, { min: 0 }),
          );
    if (so['includeCalibration'] !== undefined && typeof so['includeCalibration'] !== 'boolean') {
      throw new BridgeworkError(
        'wrong-type',
        `\`includeCalibration\` must be a boolean; got ${formatValue(so['includeCalibration'])}`,
        {
          param: 'includeCalibration',
          value: so['includeCalibration'],
        },
      );
    }
    return { loads, noise, calibration: so['includeCalibration'] !== false };
  }

  /** q = gᵀ(AᵀA)⁻¹g at a load state: Cov(r̂) = q·Σ. */
  function leverage(loads: readonly number[]): number {
    const g = termVector(loads);
    let q = 0;
    for (let a = 0; a < tt; a++)
      for (let b = 0; b < tt; b++)
        q += (g[a] as number) * ((unit[a] as number[])[b] as number) * (g[b] as number);
    return Math.max(q, 0);
  }

  /** K = (JᵀWJ)⁻¹JᵀW at a load state (M×N). */
  function gainAt(loads: readonly number[]): number[][] {
    const jac = new Float64Array(nb * m);
    for (let i = 0; i < nb; i++) {
      for (let j = 0; j < m; j++) jac[i * m + j] = (sensitivity[i] as number[])[j] as number;
      quadraticTerms.forEach(({ t, index }) => {
        const [a, b] = t.components as [number, number];
        const q = (coefficients[i] as number[])[index] as number;
        jac[i * m + a] = (jac[i * m + a] as number) + q * (loads[b] as number);
        jac[i * m + b] = (jac[i * m + b] as number) + q * (loads[a] as number);
      });
      for (let j = 0; j < m; j++) jac[i * m + j] = (sqrtWeights[i] as number) * (jac[i * m + j] as number);
    }
    const jf = factorDesign(jac, nb, m, 64 * nb * Number.EPSILON);
    if (jf.accepted.length < m) {
      throw new BridgeworkError(
        'singular',
        '`loads` lie where the model has no unique inverse (its Jacobian is singular)',
        {
          param: 'loads',
        },
      );
    }
    const k = Array.from({ length: m }, () => new Array<number>(nb).fill(0));
    for (let i = 0; i < nb; i++) {
      const e = new Float64Array(nb);
      e[i] = sqrtWeights[i] as number;
      const col = solveDesign(jf, e);
      for (let j = 0; j < m; j++) (k[j] as number[])[i] = col[j] as number;
    }
    return k;
  }

  function sandwich(k: number[][], cov: number[][]): number[][] {
    return k.map((ka) =>
      k.map((kb) => {
        let s = 0;
        for (let i = 0; i < nb; i++)
          for (let l = 0; l < nb; l++)
            s += (ka[i] as number) * ((cov[i] as number[])[l] as number) * (kb[l] as number);
        return s;
      }),
    );
  }

  return {
    components: names,
    bridges,
    terms,
    rejectedTerms,
    coefficients,
    coefficientStandardUncertainties,
    unitCovariance: unit,
    readingCovariance: readingCov,
    offsets,
    sensitivity,
    loadMatrix: matrix(left, m, nb),
    reverseFit,
    residuals,
    standardErrors,
    degreesOfFreedom: dof,
    uncertaintySource: given === undefined ? 'residuals' : 'given',
    loadResiduals,
    loadStandardErrors,
    largestLoadResidualFractions,
    hysteresisFractions,
    fullScale,
    primaryComponents,
    fullScaleOutputs,
    crossTalk,
    termFractions,
    rank: tt,
    condition: designCondition(factor),
    sensitivityCondition,
    readingsAt,
    createInverse,
    uncertaintyAt(stateOptions: LoadStateOptions): LoadStateUncertainty {
      const so = checkOptions('options', stateOptions, {
        known: ['loads', 'readings', 'readingStandardUncertainties', 'includeCalibration'],
      });
      const { loads, noise, calibration } = loadState(so);
      const k = gainAt(loads);
      const q = calibration ? leverage(loads) : 0;
      const calibrationCovariance = sandwich(
        k,
        readingCov.map((row) => row.map((v) => q * v)),
      );
      const noiseCovariance = sandwich(
        k,
        noise.map((u, i) => noise.map((_, l) => (i === l ? u * u : 0))),
      );
      const covariance = calibrationCovariance.map((row, a) =>
        row.map((v, b) => v + ((noiseCovariance[a] as number[])[b] as number)),
      );
      if (![...covariance.flat(), ...loads].every(Number.isFinite)) overflow(loads);
      return {
        loads,
        standardUncertainties: covariance.map((row, j) => Math.sqrt(Math.max(row[j] as number, 0))),
        covariance,
        calibrationCovariance,
        noiseCovariance,
        degreesOfFreedom: given === undefined ? dof : Infinity,
      };
    },
    monteCarloAt(stateOptions: LoadStateMonteCarloOptions): readonly MonteCarloResult[] {
      const so = checkOptions('options', stateOptions, {
        known: [
          'loads',
          'readings',
          'readingStandardUncertainties',
          'includeCalibration',
          'trials',
          'seed',
          'coverage',
        ],
      });
      const { loads, noise, calibration } = loadState(so);
      const trials =
        so['trials'] === undefined ? 1e5 : checkInteger('trials', so['trials'], { min: 1, max: 1e7 });
      const nominal = readingsAt(loads);
      const q = calibration ? leverage(loads) : 0;
      if (!Number.isFinite(q)) overflow(loads);
      const inputs: Record<string, InputQuantities[string]> = {};
      const correlations: Correlation[] = [];
      for (let i = 0; i < nb; i++) {
        inputs[`r${i}`] = { value: nominal[i] as number, standardUncertainty: noise[i] as number };
        inputs[`c${i}`] = {
          value: 0,
          standardUncertainty: Math.sqrt(q * ((readingCov[i] as number[])[i] as number)),
        };
      }
      for (let i = 0; i < nb; i++) {
        for (let l = i + 1; l < nb; l++) {
          const denom = Math.sqrt(
            ((readingCov[i] as number[])[i] as number) * ((readingCov[l] as number[])[l] as number),
          );
          const r = denom > 0 ? ((readingCov[i] as number[])[l] as number) / denom : 0;
          if (q > 0 && r !== 0)
            correlations.push({ between: [`c${i}`, `c${l}`], coefficient: Math.max(-1, Math.min(1, r)) });
        }
      }
      const buffer = new Float64Array(nb);
      const out = new Float64Array(m);
      const solver = createInverseSolver(inverseModel(defaultTolerance, MAX_ITERATIONS));
      const rNames = bridges.map((_, i) => `r${i}`);
      const cNames = bridges.map((_, i) => `c${i}`);
      return names.map((_, j) =>
        monteCarlo({
          model: (x) => {
            for (let i = 0; i < nb; i++)
              buffer[i] = (x[rNames[i] as string] as number) + (x[cNames[i] as string] as number);
            solver.solve(buffer, 0, out, 0);
            return out[j] as number;
          },
          inputs,
          ...(correlations.length === 0 ? {} : { correlations }),
          trials,
          ...(so['seed'] === undefined ? {} : { seed: so['seed'] as number }),
          ...(so['coverage'] === undefined ? {} : { coverage: so['coverage'] as number }),
        }),
      );
    },
  };
}
