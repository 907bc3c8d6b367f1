import { BridgeworkError, checkObject, checkPositive, checkRange, formatValue } from '@bridgework/core';
import { normalizeCorrelations, type Correlation, type CorrelationMatrix } from './correlations.js';
import { coverageFactor, effectiveDegreesOfFreedomOf, truncatedDegreesOfFreedom } from './coverageFactor.js';
import {
  baseSteps,
  higherDerivatives,
  jacobian,
  NotFiniteAtPoint,
  type PointEvaluator,
} from './internal/derivatives.js';
import { checkModel, describePoint, toOutputs } from './internal/model.js';
import { acquireRecord, type TrialRecord } from './internal/trialRecord.js';
import { normalizeInputs, type InputQuantities, type NormalizedInput } from './quantities.js';
import type { Interval } from '@bridgework/core';
import type { MeasurementModel, VectorMeasurementModel } from './types.js';

/** Options of {@link propagate} for a scalar model. */
export interface PropagateOptions {
  /** The measurement model; it must return a finite number near the estimates. */
  readonly model: MeasurementModel;
  /** The named input quantities. */
  readonly inputs: InputQuantities;
  /** Correlation coefficients between pairs of inputs (default: none). */
  readonly correlations?: readonly Correlation[];
  /**
   * The analytic gradient ∂f/∂xᵢ at a point, by input name (every input must be present). When
   * absent, sensitivities are numerical (Ridders' extrapolation, see {@link propagate}).
   */
  readonly gradient?: (x: Readonly<Record<string, number>>) => Readonly<Record<string, number>>;
  /** Add the second-order terms of JCGM 100 5.1.2 eq. (10); uncorrelated inputs only. Default false. */
  readonly secondOrder?: boolean;
  /** Coverage probability p of the expanded uncertainty, in (0, 1). Default 0.95. */
  readonly coverage?: number;
  /**
   * Degrees of freedom to use for the coverage factor instead of the Welch–Satterthwaite ν_eff
   * (> 0), when they are known otherwise — for example n − 2 when the inputs are the correlated
   * parameters of one least-squares fit, where Welch–Satterthwaite (which assumes independent
   * components) comes out far too low.
   */
  readonly degreesOfFreedom?: number;
}

/** Options of {@link propagate} for a vector-valued model. */
export interface VectorPropagateOptions {
  /** The vector-valued measurement model; it must return the same number of finite outputs at every point. */
  readonly model: VectorMeasurementModel;
  /** The named input quantities. */
  readonly inputs: InputQuantities;
  /** Correlation coefficients between pairs of inputs (default: none). */
  readonly correlations?: readonly Correlation[];
  /** The analytic gradient of each output (one record per output, every input present). */
  readonly gradient?: (x: Readonly<Record<string, number>>) => readonly Readonly<Record<string, number>>[];
  /** Coverage probability p of each output's expanded uncertainty, in (0, 1). Default 0.95. */
  readonly coverage?: number;
  /** Degrees of freedom for every output's coverage factor instead of Welch–Satterthwaite (> 0). */
  readonly degreesOfFreedom?: number;
}

/** One line of an uncertainty budget (see {@link Propagation}). */
export interface BudgetLine {
  /** The input's name. */
  readonly name: string;
  /** Its estimate xᵢ. */
  readonly value: number;
  /** Its standard uncertainty u(xᵢ). */
  readonly standardUncertainty: number;
  /** Its degrees of freedom νᵢ (`Infinity` when exact). */
  readonly degreesOfFreedom: number;
  /** The sensitivity coefficient cᵢ = ∂f/∂xᵢ at the estimates. */
  readonly sensitivity: number;
  /** The contribution uᵢ(y) = |cᵢ|·u(xᵢ), in the unit of y. */
  readonly contribution: number;
}

/** The result of the law of propagation for one output (see {@link propagate}). */
export interface Propagation {
  /** The output estimate y = f(x₁, …, x_N). */
  readonly value: number;
  /** The combined standard uncertainty u_c(y). */
  readonly standardUncertainty: number;
  /** Sensitivity coefficients cᵢ = ∂f/∂xᵢ, by input name. */
  readonly sensitivities: Readonly<Record<string, number>>;
  /** Contributions uᵢ(y) = |cᵢ|·u(xᵢ), by input name (JCGM 100 5.1.3). */
  readonly contributions: Readonly<Record<string, number>>;
  /** The budget, one line per input, in the order of `inputs`. */
  readonly budget: readonly BudgetLine[];
  /** Effective degrees of freedom ν_eff (Welch–Satterthwaite, or the stated `degreesOfFreedom`; `Infinity` when every input is exact). */
  readonly effectiveDegreesOfFreedom: number;
  /** The coverage probability p. */
  readonly coverage: number;
  /** The coverage factor k = t_p(ν) with ν = ν_eff truncated to an integer. */
  readonly coverageFactor: number;
  /** The expanded uncertainty U = k·u_c(y). */
  readonly expandedUncertainty: number;
  /** The coverage interval y ± U. */
  readonly interval: Interval;
  /** The variance added by the second-order terms (0 unless `secondOrder` was requested). */
  readonly secondOrderVariance: number;
}

/** The result of the law of propagation for a vector-valued model (see {@link propagate}). */
export interface VectorPropagation {
  /** The output estimates. */
  readonly values: readonly number[];
  /** Their standard uncertainties. */
  readonly standardUncertainties: readonly number[];
  /** The covariance matrix of the outputs, V(y) = J·V(x)·Jᵀ (JCGM 102 6.2.1.3). */
  readonly covariance: readonly (readonly number[])[];
  /** The correlation matrix of the outputs (an entry of an output with zero uncertainty is 0 off the diagonal). */
  readonly correlation: readonly (readonly number[])[];
  /** Each output on its own, as a scalar propagation. */
  readonly outputs: readonly Propagation[];
}

interface Internals {
  readonly inputs: NormalizedInput[];
  readonly m: number;
  readonly scalar: boolean;
  readonly y: Float64Array;
  /** a[k·n + i] = c_ki·u_i. */
  readonly weighted: Float64Array;
  readonly jac: Float64Array;
  readonly covariance: Float64Array;
  readonly coverage: number;
  readonly secondOrderVariance: number;
  readonly statedDegreesOfFreedom: number | undefined;
}

/**
 * Evaluates the model at points through the shared trial record of these names (see
 * internal/trialRecord.ts), so the model sees the same object shape as in Monte Carlo runs.
 */
function evaluatorFor(
  model: (x: Readonly<Record<string, number>>) => unknown,
  view: TrialRecord,
  m: number,
): PointEvaluator {
  const { record, columns, cursor } = view;
  return (point) => {
    cursor.index = 0;
    columns.forEach((column, i) => {
      column[0] = point[i] as number;
    });
    const raw = model(record);
    const out = toOutputs(raw);
    if (out === undefined || out.length !== m || out.some((v) => !Number.isFinite(v)))
      throw new NotFiniteAtPoint(raw, point.slice());
    return out;
  };
}

function notFiniteError(names: readonly string[], failure: NotFiniteAtPoint): BridgeworkError {
  return new BridgeworkError(
    'model-not-finite',
    `\`model\` must return finite outputs near the estimates; got ${formatValue(failure.output)} at ${describePoint(names, failure.point)} while differentiating (check the model's domain, or supply \`gradient\`)`,
    { param: 'model', value: failure.output },
  );
}

function gradientRows(
  gradient: (x: Readonly<Record<string, number>>) => unknown,
  names: readonly string[],
  x: Float64Array,
  m: number,
  scalar: boolean,
): Float64Array {
  const record: Record<string, number> = {};
  names.forEach((name, i) => {
    record[name] = x[i] as number;
  });
  const raw = gradient(record);
  const rows: unknown[] = scalar ? [raw] : Array.isArray(raw) ? raw : [];
  if (rows.length !== m) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`gradient\` must return ${scalar ? 'a record' : `${m} records, one per output`}; got ${formatValue(raw)}`,
      {
        param: 'gradient',
        value: raw,
        limit: m,
      },
    );
  }
  const n = names.length;
  const jac = new Float64Array(m * n);
  rows.forEach((row, k) => {
    const path = scalar ? 'gradient' : `gradient[${k}]`;
    const r = checkObject(path, row);
    for (const key of Object.keys(r)) {
      if (!names.includes(key)) {
        throw new BridgeworkError(
          'invalid-option',
          `\`${path}.${key}\` must name an input (${names.join(', ')})`,
          {
            param: `${path}.${key}`,
            value: r[key],
            limit: names,
          },
        );
      }
    }
    names.forEach((name, i) => {
      const v = r[name];
      if (v === undefined) {
        throw new BridgeworkError(
          'missing-option',
          `\`${path}.${name}\` must be given (the gradient needs every input)`,
          {
            param: `${path}.${name}`,
            value: v,
          },
        );
      }
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        throw new BridgeworkError(
          'model-not-finite',
          `\`${path}.${name}\` must be a finite number; got ${formatValue(v)}`,
          {
            param: `${path}.${name}`,
            value: v,
          },
        );
      }
      jac[k * n + i] = v;
    });
  });
  return jac;
}

function compute(options: unknown, vectorAllowed: boolean): Internals {
  const o = checkObject('options', options);
  const model = checkModel(o['model']);
  const inputs = normalizeInputs(o['inputs']);
  const names = inputs.map((q) => q.name);
  const { matrix: r, pairs } = normalizeCorrelations(names, o['correlations']);
  const coverage =
    o['coverage'] === undefined
      ? 0.95
      : checkRange('coverage', o['coverage'], { min: 0, max: 1, minExclusive: true, maxExclusive: true });
  const secondOrder = o['secondOrder'];
  if (secondOrder !== undefined && typeof secondOrder !== 'boolean') {
    throw new BridgeworkError(
      'wrong-type',
      `\`secondOrder\` must be a boolean; got ${formatValue(secondOrder)}`,
      { param: 'secondOrder', value: secondOrder },
    );
  }
  const statedDegreesOfFreedom =
    o['degreesOfFreedom'] === undefined
      ? undefined
      : checkPositive('degreesOfFreedom', o['degreesOfFreedom'], { allowInfinity: true });
  const gradient = o['gradient'];
  if (gradient !== undefined && typeof gradient !== 'function') {
    throw new BridgeworkError('wrong-type', `\`gradient\` must be a function; got ${formatValue(gradient)}`, {
      param: 'gradient',
      value: gradient,
    });
  }
  const x = Float64Array.from(inputs, (q) => q.value);
  const u = Float64Array.from(inputs, (q) => q.standardUncertainty);

  const view = acquireRecord(names);
  try {
    return lawOfPropagation(
      model,
      gradient,
      view,
      inputs,
      x,
      u,
      r,
      pairs,
      coverage,
      secondOrder === true,
      statedDegreesOfFreedom,
      vectorAllowed,
    );
  } finally {
    view.inUse = false;
  }
}

function lawOfPropagation(
  model: (x: Readonly<Record<string, number>>) => unknown,
  gradient: unknown,
  view: TrialRecord,
  inputs: NormalizedInput[],
  x: Float64Array,
  u: Float64Array,
  r: Float64Array,
  pairs: CorrelationMatrix['pairs'],
  coverage: number,
  secondOrder: boolean,
  statedDegreesOfFreedom: number | undefined,
  vectorAllowed: boolean,
): Internals {
  const names = inputs.map((q) => q.name);
  const n = names.length;
  // The estimate fixes the shape of the output.
  view.cursor.index = 0;
  view.columns.forEach((column, i) => {
    column[0] = x[i] as number;
  });
  const raw = model(view.record);
  const y = toOutputs(raw);
  if (y === undefined || y.length === 0) {
    throw new BridgeworkError(
      'wrong-type',
      `\`model\` must return a number${vectorAllowed ? ' or a non-empty array of numbers' : ''}; got ${formatValue(raw)}`,
      {
        param: 'model',
        value: raw,
      },
    );
  }
  const scalar = typeof raw === 'number';
  if (!scalar && !vectorAllowed) {
    throw new BridgeworkError('wrong-type', `\`model\` must return a number; got ${formatValue(raw)}`, {
      param: 'model',
      value: raw,
    });
  }
  if (y.some((v) => !Number.isFinite(v))) {
    throw new BridgeworkError(
      'model-not-finite',
      `\`model\` must return finite outputs; got ${formatValue(raw)} at the estimates (${describePoint(names, x)})`,
      {
        param: 'model',
        value: raw,
      },
    );
  }
  const m = y.length;
  if (secondOrder === true && !scalar) {
    throw new BridgeworkError(
      'conflicting-options',
      '`secondOrder` must not be requested for a vector-valued model',
      { param: 'secondOrder', value: secondOrder },
    );
  }
  if (secondOrder === true && pairs.length > 0) {
    throw new BridgeworkError(
      'conflicting-options',
      '`secondOrder` must not be combined with `correlations`: JCGM 100 5.1.2 eq. (10) holds for uncorrelated inputs',
      { param: 'secondOrder', value: secondOrder },
    );
  }

  const evaluate = evaluatorFor(model, view, m);
  const steps = baseSteps(x, u);
  let jac: Float64Array;
  try {
    jac =
      gradient === undefined
        ? jacobian(evaluate, x, steps, m)
        : gradientRows(gradient as (x: Readonly<Record<string, number>>) => unknown, names, x, m, scalar);
  } catch (e) {
    throw e instanceof NotFiniteAtPoint ? notFiniteError(names, e) : e;
  }

  // V(y) = J·V(x)·Jᵀ with V(x)ᵢⱼ = rᵢⱼ·uᵢ·uⱼ, written with the weighted sensitivities aₖᵢ = cₖᵢ·uᵢ.
  const weighted = jac.map((c, index) => c * (u[index % n] as number));
  const covariance = new Float64Array(m * m);
  for (let k = 0; k < m; k++) {
    for (let l = k; l < m; l++) {
      let v = 0;
      let scale = 0;
      for (let i = 0; i < n; i++) {
        const t = (weighted[k * n + i] as number) * (weighted[l * n + i] as number);
        v += t;
        scale += Math.abs(t);
      }
      for (const { i, j } of pairs) {
        const t =
          (r[i * n + j] as number) *
          ((weighted[k * n + i] as number) * (weighted[l * n + j] as number) +
            (weighted[k * n + j] as number) * (weighted[l * n + i] as number));
        v += t;
        scale += Math.abs(t);
      }
      // A variance can come out a few ulps below zero when correlations cancel it exactly.
      if (k === l && v < 0 && -v <= 1e-12 * scale) v = 0;
      covariance[k * m + l] = v;
      covariance[l * m + k] = v;
    }
  }

  let secondOrderVariance = 0;
  if (secondOrder === true) {
    try {
      const { second, third } = higherDerivatives(
        evaluate,
        x,
        steps,
        Array.from(u, (v) => v > 0),
      );
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          const ui2uj2 = (u[i] as number) ** 2 * (u[j] as number) ** 2;
          if (ui2uj2 === 0) continue;
          secondOrderVariance +=
            (0.5 * (second[i * n + j] as number) ** 2 + (jac[i] as number) * (third[i * n + j] as number)) *
            ui2uj2;
        }
      }
    } catch (e) {
      throw e instanceof NotFiniteAtPoint ? notFiniteError(names, e) : e;
    }
    if ((covariance[0] as number) + secondOrderVariance < 0) {
      throw new BridgeworkError(
        'out-of-range',
        '`secondOrder` terms must not make the variance negative; the Taylor expansion does not describe this model (use monteCarlo)',
        { param: 'secondOrder', value: secondOrderVariance },
      );
    }
  }
  return {
    inputs,
    m,
    scalar,
    y,
    weighted,
    jac,
    covariance,
    coverage,
    secondOrderVariance,
    statedDegreesOfFreedom,
  };
}

function outputPropagation(s: Internals, k: number): Propagation {
  const n = s.inputs.length;
  const variance = (s.covariance[k * s.m + k] as number) + (k === 0 ? s.secondOrderVariance : 0);
  const standardUncertainty = Math.sqrt(variance);
  const firstOrder = Math.sqrt(s.covariance[k * s.m + k] as number);
  const sensitivities: Record<string, number> = {};
  const contributions: Record<string, number> = {};
  const budget: BudgetLine[] = [];
  let denominator = 0;
  s.inputs.forEach((q, i) => {
    const c = s.jac[k * n + i] as number;
    const contribution = Math.abs(s.weighted[k * n + i] as number);
    sensitivities[q.name] = c;
    contributions[q.name] = contribution;
    budget.push({
      name: q.name,
      value: q.value,
      standardUncertainty: q.standardUncertainty,
      degreesOfFreedom: q.degreesOfFreedom,
      sensitivity: c,
      contribution,
    });
    if (q.degreesOfFreedom !== Infinity && contribution > 0)
      denominator += (contribution * contribution * (contribution * contribution)) / q.degreesOfFreedom;
  });
  const effectiveDegreesOfFreedom =
    s.statedDegreesOfFreedom ?? effectiveDegreesOfFreedomOf(firstOrder, denominator);
  const k95 = coverageFactor(s.coverage, truncatedDegreesOfFreedom(effectiveDegreesOfFreedom));
  const value = s.y[k] as number;
  const expandedUncertainty = k95 * standardUncertainty;
  return {
    value,
    standardUncertainty,
    sensitivities,
    contributions,
    budget,
    effectiveDegreesOfFreedom,
    coverage: s.coverage,
    coverageFactor: k95,
    expandedUncertainty,
    interval: { min: value - expandedUncertainty, max: value + expandedUncertainty },
    secondOrderVariance: k === 0 ? s.secondOrderVariance : 0,
  };
}

/**
 * Evaluates the law of propagation of uncertainty (JCGM 100, the GUM) for a scalar model.
 *
 * @remarks
 * JCGM 100 5.1.2 and 5.2.2: with sensitivity coefficients cᵢ = ∂f/∂xᵢ at the estimates,
 *
 *   u_c²(y) = Σᵢ cᵢ²u²(xᵢ) + 2 Σᵢ<ⱼ cᵢcⱼ·r(xᵢ, xⱼ)·u(xᵢ)u(xⱼ)   (eq. 13 and 16).
 *
 * Each input's standard uncertainty comes from its distribution ({@link standardUncertaintyOf}).
 * Sensitivities are the caller's `gradient` when given, else central differences extrapolated to
 * zero step by Ridders' method (Adv. Eng. Software 4, 1982) with a starting step of
 * max(u(xᵢ), 2⁻¹⁰·|xᵢ|), shrunk by 1.4 up to ten times and restarted at a sixteenth if the model
 * is not finite at a step; for smooth models they agree with analytic derivatives to 1e-9
 * relative (tested). The effective degrees of freedom follow
 * Welch–Satterthwaite (G.4.1, from the first-order contributions), unless `degreesOfFreedom` states
 * them; with correlated inputs of finite degrees of freedom Welch–Satterthwaite is only an
 * approximation and can be far too low (JCGM 100 H.3 predicted by propagation: 1.3 against the
 * fit's 9). The coverage factor is Student's t at
 * ν_eff truncated to the next lower integer (G.4.1) — the normal quantile when every input is
 * exact. `secondOrder` adds JCGM 100 5.1.2 eq. (10),
 *
 *   Σᵢ Σⱼ [½(∂²f/∂xᵢ∂xⱼ)² + (∂f/∂xᵢ)(∂³f/∂xᵢ∂xⱼ²)]·u²(xᵢ)u²(xⱼ),
 *
 * to the variance (derivatives by Ridders' method on central stencils), exact for normal inputs
 * and a polynomial model of degree ≤ 3, an approximation otherwise. A model that returns an array
 * is vector-valued: see the other signature.
 *
 * Verified against JCGM 100 Annex H.2 (correlated V, I, φ) and H.3, and against analytic
 * derivatives and exact variances (docs/uncertainty.md).
 *
 * @param options - The model, inputs, correlations, optional gradient, second order, coverage.
 * @returns The estimate, combined and expanded uncertainty, sensitivities, contributions, budget,
 *   effective degrees of freedom and coverage interval, in the unit of the model's output.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` unless `model` is a function
 *   returning a number; `model-not-finite` when it (or `gradient`) is not finite near the
 *   estimates; the input codes of {@link standardUncertaintyOf}; `not-positive-semidefinite`,
 *   `invalid-option`, `out-of-range` for bad correlations; `out-of-range` for a coverage outside
 *   (0, 1); `conflicting-options` for `secondOrder` with correlations; `missing-option` or
 *   `invalid-option` for a gradient without an input or with an unknown name.
 * @example
 * ```ts
 * const r = propagate({
 *   model: ({ V, I }) => V / I,
 *   inputs: { V: { value: 5, standardUncertainty: 0.002 }, I: { value: 0.02, standardUncertainty: 1e-5 } },
 * });
 * r.value; // 250 (Ω)
 * r.standardUncertainty; // 0.16007810593575247 (= √((50·0.002)² + (12 500·1e-5)²))
 * r.sensitivities; // { V: 49.99999999999633, I: -12499.999999991784 } (exact: 50, −12 500)
 * ```
 */
export function propagate(options: PropagateOptions): Propagation;
/**
 * Evaluates the law of propagation for a vector-valued model: the covariance and correlation
 * matrices of the outputs, and each output's own propagation.
 *
 * @remarks
 * V(y) = J·V(x)·Jᵀ (JCGM 102 6.2.1.3; JCGM 100 F.1.2.3 for the covariance of two outputs), with J
 * the m × N Jacobian (analytic from `gradient`, else numerical as for scalar models) and
 * V(x)ᵢⱼ = r(xᵢ, xⱼ)u(xᵢ)u(xⱼ). Correlation coefficients r(yₖ, yₗ) = V(y)ₖₗ/(u(yₖ)u(yₗ)).
 * Verified against JCGM 100 H.2 (R, X, Z with r(R, X) = −0.588).
 *
 * @param options - The vector model, inputs, correlations, optional gradient, coverage.
 * @returns Values, standard uncertainties, covariance and correlation matrices, per-output results.
 * @throws {@link @bridgework/core!BridgeworkError} as the scalar form; `model-not-finite` when the
 *   number of outputs changes between points; `conflicting-options` for `secondOrder`.
 * @example
 * ```ts
 * const r = propagate({
 *   model: ({ a, b }) => [a + b, a - b],
 *   inputs: { a: { value: 1, standardUncertainty: 0.1 }, b: { value: 2, standardUncertainty: 0.1 } },
 * });
 * r.correlation[0][1]; // 3.5e-16 (≈ 0: with equal uncertainties, sum and difference are uncorrelated)
 * ```
 */
export function propagate(options: VectorPropagateOptions): VectorPropagation;
export function propagate(
  options: PropagateOptions | VectorPropagateOptions,
): Propagation | VectorPropagation {
  const s = compute(options, true);
  if (s.scalar) return outputPropagation(s, 0);
  const outputs = Array.from({ length: s.m }, (_, k) => outputPropagation(s, k));
  const sd = outputs.map((p) => p.standardUncertainty);
  const covariance = Array.from({ length: s.m }, (_, k) =>
    Array.from({ length: s.m }, (_, l) => s.covariance[k * s.m + l] as number),
  );
  const correlation = covariance.map((row, k) =>
    row.map((v, l) =>
      k === l
        ? 1
        : (sd[k] as number) > 0 && (sd[l] as number) > 0
          ? v / ((sd[k] as number) * (sd[l] as number))
          : 0,
    ),
  );
  return { values: Array.from(s.y), standardUncertainties: sd, covariance, correlation, outputs };
}

/** The scalar law of propagation for internal callers (monteCarlo's GUM comparison). */
export function propagateScalar(options: PropagateOptions): Propagation {
  return outputPropagation(compute(options, false), 0);
}
