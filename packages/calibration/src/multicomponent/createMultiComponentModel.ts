/**
 * A multi-component model from its coefficients: the load matrix, cross-talk, the per-sample
 * inverse and the uncertainty at a load state. Shared by the fit ({@link fitMultiComponent}) and by
 * coefficients stored elsewhere ({@link createMultiComponentModel}).
 */
import {
  BridgeworkError,
  checkInteger,
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
import { designCondition, factorDesign, solveDesign } from '../internal/leastSquares.js';
import { MAX_ITERATIONS, createInverseSolver, type InverseModel } from './inverse.js';
import { termValue, type ModelTerm } from './terms.js';

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

/**
 * A multi-component model: the coefficients of r = a + S·F + Σ q·g(F) with what follows from them
 * (the load matrix, cross-talk, the per-sample inverse, the uncertainty at a load state). Made by
 * {@link fitMultiComponent} from a loading schedule (a {@link MultiComponentCalibration}, which adds
 * the fit's own figures) or by {@link createMultiComponentModel} from stored coefficients.
 */
export interface MultiComponentModel {
  /** Component names (M). */
  readonly components: readonly string[];
  /** Bridge names (N). */
  readonly bridges: readonly string[];
  /** The terms of the model, in the order of the coefficient columns. */
  readonly terms: readonly ModelTerm[];
  /** Coefficients b (N×T): reading_i = Σ_t b_it·g_t(F). */
  readonly coefficients: readonly (readonly number[])[];
  /** Their standard uncertainties (N×T); `undefined` when the model has no covariance. */
  readonly coefficientStandardUncertainties: readonly (readonly number[])[] | undefined;
  /** (AᵀA)⁻¹ over the terms (T×T): Cov(b_i, b_k) = Σ_ik·(AᵀA)⁻¹ (JCGM 100 for a multivariate linear model). */
  readonly unitCovariance: readonly (readonly number[])[] | undefined;
  /** Σ (N×N): the readings' covariance, from the residuals or the given uncertainties. */
  readonly readingCovariance: readonly (readonly number[])[] | undefined;
  /** Zero offsets a (N); zeros without `offset`. */
  readonly offsets: readonly number[];
  /** The sensitivity matrix S (N×M): ∂reading_i/∂F_j of the linear terms. */
  readonly sensitivity: readonly (readonly number[])[];
  /** C (M×N): the weighted left inverse of S, F = C·(r − a) for the linear model (S⁻¹ when N = M). */
  readonly loadMatrix: readonly (readonly number[])[];
  /** Degrees of freedom of the covariance: points − terms for a fit; as stored (default Infinity) otherwise. */
  readonly degreesOfFreedom: number;
  /** Where the coefficient uncertainties come from. */
  readonly uncertaintySource: 'residuals' | 'given' | 'stored' | 'none';
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

/** What a model is made of (the fit's or stored coefficients), for {@link buildMultiComponentModel}. */
export interface ModelParts {
  /** Component names (M). */
  readonly names: readonly string[];
  /** Bridge names (N). */
  readonly bridges: readonly string[];
  /** The terms (T), among them every component's linear term. */
  readonly terms: readonly ModelTerm[];
  /** b (N×T). */
  readonly coefficients: readonly (readonly number[])[];
  /** Full scale per component (M, > 0). */
  readonly fullScale: readonly number[];
  /** (AᵀA)⁻¹ (T×T), or undefined for a model without covariance. */
  readonly unitCovariance: readonly (readonly number[])[] | undefined;
  /** Σ (N×N), or undefined for a model without covariance. */
  readonly readingCovariance: readonly (readonly number[])[] | undefined;
  /** The model's `degreesOfFreedom`. */
  readonly degreesOfFreedom: number;
  /** The degrees of freedom `uncertaintyAt` states for the calibration part. */
  readonly uncertaintyDegreesOfFreedom: number;
  /** Where the covariance comes from. */
  readonly uncertaintySource: MultiComponentModel['uncertaintySource'];
  /** The option the coefficients came from, for messages (`points` or `coefficients`). */
  readonly param: string;
}

/** A rows×cols row-major array as nested arrays. */
export const matrix = (flat: ArrayLike<number>, rows: number, cols: number): number[][] =>
  Array.from({ length: rows }, (_, i) =>
    Array.from({ length: cols }, (_, j) => flat[i * cols + j] as number),
  );

const zeros = (rows: number, cols: number): number[][] =>
  Array.from({ length: rows }, () => new Array<number>(cols).fill(0));

/**
 * The model from its parts (checked by the caller): linear parts, weights, the load matrix, the
 * inverse, cross-talk, and the uncertainty evaluations.
 *
 * @param parts - Names, terms, coefficients, full scales and covariance.
 * @returns The model.
 * @throws {@link @bridgework/core!BridgeworkError} `singular` when the sensitivity matrix cannot be
 *   inverted; `out-of-range` when a derived figure overflows.
 */
export function buildMultiComponentModel(parts: ModelParts): MultiComponentModel {
  const { names, bridges, terms, coefficients, fullScale, param } = parts;
  const m = names.length;
  const nb = bridges.length;
  const tt = terms.length;
  const readingCov = (parts.readingCovariance ?? zeros(nb, nb)) as number[][];
  const unit = (parts.unitCovariance ?? zeros(tt, tt)) as number[][];
  const coefficientStandardUncertainties =
    parts.readingCovariance === undefined || parts.unitCovariance === undefined
      ? undefined
      : coefficients.map((row, i) =>
          row.map((_, t) =>
            Math.sqrt(
              Math.max(0, ((readingCov[i] as number[])[i] as number) * ((unit[t] as number[])[t] as number)),
            ),
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
      `\`${param}\` give a sensitivity matrix that cannot be inverted: no combination of bridges separates component ${missing} from the others`,
      { param, value: missing },
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
  const fs = (j: number): number => (fullScale[j] as number) || 1;

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

  const figures = [
    ...coefficients.flat(),
    ...(coefficientStandardUncertainties ?? []).flat(),
    ...crossTalk.flat(),
    ...termFractions.flat(),
    ...left,
  ];
  if (!figures.every(Number.isFinite)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must give coefficients whose products and ratios stay within the double range (a figure overflows); express the loads in a larger or smaller unit`,
      { param },
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
    coefficients,
    coefficientStandardUncertainties,
    unitCovariance: parts.unitCovariance,
    readingCovariance: parts.readingCovariance,
    offsets,
    sensitivity,
    loadMatrix: matrix(left, m, nb),
    degreesOfFreedom: parts.degreesOfFreedom,
    uncertaintySource: parts.uncertaintySource,
    fullScale,
    primaryComponents,
    fullScaleOutputs,
    crossTalk,
    termFractions,
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
        degreesOfFreedom: parts.uncertaintyDegreesOfFreedom,
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

/**
 * Checks the component and bridge names of a multi-component sensor: each a list of distinct,
 * non-empty names, with at least as many bridges as components (else the loads are not determined).
 */
export function checkComponentsAndBridges(
  components: unknown,
  bridgeNames: unknown,
): { readonly names: string[]; readonly bridges: string[] } {
  const names = checkNames('components', components);
  const bridges = checkNames('bridges', bridgeNames);
  if (bridges.length < names.length) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`bridges\` must number at least as many as the components (${names.length}) for the loads to be determined; got ${bridges.length}`,
      { param: 'bridges', value: bridges.length, limit: names.length },
    );
  }
  return { names, bridges };
}

/** Checks a list of distinct, non-empty names. */
export function checkNames(param: string, value: unknown): string[] {
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

/** Options of {@link createMultiComponentModel}. */
export interface MultiComponentModelOptions {
  /** Names of the M load components (distinct). */
  readonly components: readonly string[];
  /** Names of the N bridges (distinct, N ≥ M). */
  readonly bridges: readonly string[];
  /**
   * The terms of the coefficient columns, by name: `'1'` (the zero offset), a component's name (its
   * linear term), `'Fx²'` or `'Fx^2'` (a square), `'Fx·My'` or `'Fx*My'` (a product, either order).
   * Every component's linear term must be among them, each term at most once.
   */
  readonly terms: readonly string[];
  /**
   * b (N×T): reading_i = Σ_t b_it·g_t(F), one row per bridge, one column per term; readings in
   * the bridges' unit, loads in the components' units.
   */
  readonly coefficients: readonly (readonly number[])[];
  /** Full scale of each component (> 0, M): the scale of cross-talk and of the inverse's tolerance. */
  readonly fullScale: readonly number[];
  /**
   * The coefficients' covariance in the form of the multivariate linear model
   * (Cov(b_i·, b_k·) = Σ_ik·(AᵀA)⁻¹), when known; without it the model states no uncertainty of
   * its own (`uncertaintySource` `'none'`).
   */
  readonly covariance?: {
    /** (AᵀA)⁻¹ over the terms (T×T, symmetric, diagonal ≥ 0), in the terms' load units. */
    readonly unitCovariance: readonly (readonly number[])[];
    /** Σ, the readings' covariance (N×N, symmetric, diagonal ≥ 0), in the bridges' units squared. */
    readonly readingCovariance: readonly (readonly number[])[];
    /** Degrees of freedom of Σ (points − terms of the fit, > 0). Default Infinity. */
    readonly degreesOfFreedom?: number;
  };
}

/** Reads a term name (`1`, `Fx`, `Fx²`, `Fx^2`, `Fx·My`, `Fx*My`) against the component names. */
function parseTerm(name: unknown, names: readonly string[], at: string): ModelTerm {
  if (typeof name !== 'string') {
    throw new BridgeworkError('wrong-type', `\`${at}\` must be a term name; got ${formatValue(name)}`, {
      param: at,
      value: name,
    });
  }
  const text = name.trim();
  if (text === '1') return { kind: 'offset', components: [], name: '1' };
  const j = names.indexOf(text);
  if (j >= 0) return { kind: 'linear', components: [j], name: names[j] as string };
  const square = /^(.+?)(?:²|\^2)$/.exec(text);
  if (square !== null) {
    const a = names.indexOf((square[1] as string).trim());
    if (a >= 0) return { kind: 'square', components: [a, a], name: `${names[a]}²` };
  }
  const product = /^(.+?)\s*[·*]\s*(.+)$/.exec(text);
  if (product !== null) {
    const a = names.indexOf((product[1] as string).trim());
    const b = names.indexOf((product[2] as string).trim());
    if (a >= 0 && b >= 0 && a !== b) {
      const [lo, hi] = a < b ? [a, b] : [b, a];
      return { kind: 'product', components: [lo, hi], name: `${names[lo]}·${names[hi]}` };
    }
    if (a >= 0 && a === b) return { kind: 'square', components: [a, a], name: `${names[a]}²` };
  }
  throw new BridgeworkError(
    'invalid-option',
    `\`${at}\` must name a term of the components ${names.join(', ')}: '1', a component, a square such as '${names[0]}^2' or a product such as '${names[0]}*${names[1] ?? names[0]}'; got '${text}'`,
    { param: at, value: name },
  );
}

function checkSquareMatrix(param: string, value: unknown, size: number): number[][] {
  if (!Array.isArray(value) || value.length !== size) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}\` must be a ${size}×${size} matrix (a list of ${size} rows); got ${formatValue(value)}`,
      { param, value },
    );
  }
  const rows = value.map((row, i) => checkBoundedArray(`${param}[${i}]`, row, size));
  rows.forEach((row, i) => {
    if (!((row[i] as number) >= 0)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`${param}[${i}][${i}]\` is a variance and must be ≥ 0; got ${formatValue(row[i])}`,
        { param: `${param}[${i}][${i}]`, value: row[i], limit: [0, MAGNITUDE_LIMIT] },
      );
    }
    row.forEach((v, k) => {
      const w = (rows[k] as number[])[i] as number;
      if (!(Math.abs(v - w) <= 1e-12 * Math.max(Math.abs(v), Math.abs(w)))) {
        throw new BridgeworkError(
          'invalid-shape',
          `\`${param}\` must be symmetric (a covariance): [${i}][${k}] = ${formatValue(v)} but [${k}][${i}] = ${formatValue(w)}`,
          { param: `${param}[${i}][${k}]`, value: v },
        );
      }
    });
  });
  return rows;
}

/**
 * A multi-component model from stored coefficients: a sensor calibrated elsewhere (or by
 * {@link fitMultiComponent} on another day), its coefficients, full scales and, when known, the
 * fit's covariance; with the same load matrix, cross-talk, inverse and uncertainty evaluations as
 * a fitted calibration.
 *
 * @remarks
 * The model is the one of {@link fitMultiComponent} (AIAA R-091's form, from memory):
 * r_i = Σ_t b_it·g_t(F) over the named terms. Given the fit's covariance in the form of the
 * multivariate linear model — (AᵀA)⁻¹ over the terms and Σ over the readings, as a fitted
 * calibration exposes them (`unitCovariance`, `readingCovariance`) — the model's uncertainty at a
 * load state is the fitted calibration's, and for the same coefficients every derived figure is
 * the same bit for bit (the same code computes them). Without it, only the reading noise in use
 * enters `uncertaintyAt` and `monteCarloAt`, and `coefficientStandardUncertainties` is undefined.
 *
 * @param options - Names, terms, coefficients, full scales, covariance.
 * @returns The model.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` (the options
 *   rule); `invalid-shape` for names or matrices of the wrong shape, N < M, or a covariance that
 *   is not symmetric; `invalid-option` for a term name that is not a term of the components, or
 *   a term given twice; `singular` (param `terms`) when a component's linear term is missing, or
 *   (param `coefficients`) when the sensitivity matrix cannot be inverted; `not-finite`,
 *   `out-of-range` for bad numbers (within ±1e100; variances ≥ 0, full scales > 0, degrees of
 *   freedom > 0).
 * @example
 * ```ts
 * const model = createMultiComponentModel({
 *   components: ['Fx', 'Fy'],
 *   bridges: ['A', 'B'],
 *   terms: ['1', 'Fx', 'Fy', 'Fx*Fy'],
 *   coefficients: [[1e-5, 2e-6, 4e-8, 1e-12], [-2e-5, 3e-8, 1.9e-6, -2e-12]],
 *   fullScale: [500, 500],
 * });
 * model.createInverse().loadsFromReadings([1.2e-4, -0.4e-4]); // Float64Array [Fx, Fy]
 * ```
 */
export function createMultiComponentModel(options: MultiComponentModelOptions): MultiComponentModel {
  const o = checkOptions('options', options, {
    known: ['components', 'bridges', 'terms', 'coefficients', 'fullScale', 'covariance'],
    required: ['components', 'bridges', 'terms', 'coefficients', 'fullScale'],
  });
  const { names, bridges } = checkComponentsAndBridges(o['components'], o['bridges']);
  const m = names.length;
  const nb = bridges.length;
  if (!Array.isArray(o['terms']) || o['terms'].length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`terms\` must be a non-empty list of term names; got ${formatValue(o['terms'])}`,
      { param: 'terms', value: o['terms'] },
    );
  }
  const terms = (o['terms'] as unknown[]).map((t, i) => parseTerm(t, names, `terms[${i}]`));
  terms.forEach((t, i) => {
    const first = terms.findIndex((u) => u.name === t.name);
    if (first !== i) {
      throw new BridgeworkError(
        'invalid-option',
        `\`terms[${i}]\` repeats the term ${t.name} of terms[${first}]: each term has one coefficient column`,
        { param: `terms[${i}]`, value: t.name },
      );
    }
  });
  names.forEach((name, j) => {
    if (!terms.some((t) => t.kind === 'linear' && t.components[0] === j)) {
      throw new BridgeworkError(
        'singular',
        `\`terms\` must hold the linear term of every component (without it the loads are not determined); ${name} is missing`,
        { param: 'terms', value: name },
      );
    }
  });
  const tt = terms.length;
  if (!Array.isArray(o['coefficients']) || o['coefficients'].length !== nb) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`coefficients\` must hold one row per bridge (${nb}); got ${formatValue(o['coefficients'])}`,
      { param: 'coefficients', value: o['coefficients'] },
    );
  }
  const coefficients = (o['coefficients'] as unknown[]).map((row, i) =>
    checkBoundedArray(`coefficients[${i}]`, row, tt),
  );
  const fullScale = checkBoundedArray('fullScale', o['fullScale'], m).map((v, j) =>
    checkPositive(`fullScale[${j}]`, v),
  );
  let unitCovariance: number[][] | undefined;
  let readingCovariance: number[][] | undefined;
  let degreesOfFreedom = Infinity;
  if (o['covariance'] !== undefined) {
    const c = checkOptions('covariance', o['covariance'], {
      known: ['unitCovariance', 'readingCovariance', 'degreesOfFreedom'],
      required: ['unitCovariance', 'readingCovariance'],
    });
    unitCovariance = checkSquareMatrix('covariance.unitCovariance', c['unitCovariance'], tt);
    readingCovariance = checkSquareMatrix('covariance.readingCovariance', c['readingCovariance'], nb);
    if (c['degreesOfFreedom'] !== undefined) {
      degreesOfFreedom =
        c['degreesOfFreedom'] === Infinity
          ? Infinity
          : checkRange('covariance.degreesOfFreedom', c['degreesOfFreedom'], { min: 0, minExclusive: true });
    }
  }
  return buildMultiComponentModel({
    names,
    bridges,
    terms,
    coefficients,
    fullScale,
    unitCovariance,
    readingCovariance,
    degreesOfFreedom,
    uncertaintyDegreesOfFreedom: degreesOfFreedom,
    uncertaintySource: unitCovariance === undefined ? 'none' : 'stored',
    param: 'coefficients',
  });
}
