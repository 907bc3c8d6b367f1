import { BridgeworkError, checkOptions, checkPositive, checkRange, formatValue } from '@bridgework/core';
import { normalizeCorrelations, type Correlation, type CorrelationMatrix } from './correlations.js';
import { coverageFactor, effectiveDegreesOfFreedomOf, truncatedDegreesOfFreedom } from './coverageFactor.js';
import {
  baseSteps,
  higherDerivatives,
  jacobian,
  NotFiniteAtPoint,
  type PointEvaluator,
} from './internal/derivatives.js';
import {
  describePoint,
  locateModelError,
  resolveModel,
  toOutputs,
  type ResolvedModel,
} from './internal/model.js';
import { acquireRecord, type TrialRecord } from './internal/trialRecord.js';
import { normalizeInputs, type InputQuantities, type NormalizedInput } from './quantities.js';
import type { Interval } from '@bridgework/core';
import type { MeasurementModel, PositionalModel, VectorMeasurementModel } from './types.js';

/** Options of {@link propagate} for a scalar model. */
export interface PropagateOptions {
  /**
   * The measurement model, a function of the inputs by name or a {@link PositionalModel} taking
   * them by position; it must return a finite number near the estimates.
   */
  readonly model: MeasurementModel | PositionalModel;
  /** The named input quantities. */
  readonly inputs: InputQuantities;
  /** Correlation coefficients between pairs of inputs (default: none). */
  readonly correlations?: readonly Correlation[];
  /**
   * The analytic gradient ∂f/∂xᵢ at a point, by input name (every input must be present), for a
   * record model (a positional model carries its own `gradient`). When absent, sensitivities are
   * numerical (Ridders' extrapolation, see {@link propagate}).
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
  /**
   * The vector-valued measurement model (by name, or a {@link PositionalModel} by position); it
   * must return the same number of finite outputs at every point.
   */
  readonly model: VectorMeasurementModel | PositionalModel<readonly number[]>;
  /** The named input quantities. */
  readonly inputs: InputQuantities;
  /** Correlation coefficients between pairs of inputs (default: none). */
  readonly correlations?: readonly Correlation[];
  /** The analytic gradient of each output (one record per output, every input present), for a record model. */
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
  /** V(y)/scale², so that no sum of products overflows or underflows. */
  readonly scaledCovariance: Float64Array;
  /** The scale: the largest |a[k·n + i]| (1 when all are 0). */
  readonly scale: number;
  readonly coverage: number;
  /** The second-order variance over scale². */
  readonly scaledSecondOrder: number;
  readonly statedDegreesOfFreedom: number | undefined;
}

/**
 * Evaluates the model at points (in the inputs' order): a record model through the shared trial
 * record of these names (see internal/trialRecord.ts), so it sees the same object shape as in
 * Monte Carlo runs; a positional model with the point rearranged into its order.
 */
function evaluatorFor(
  model: ResolvedModel,
  view: TrialRecord,
  names: readonly string[],
  m: number,
): PointEvaluator {
  const { record, rows, cursor, load } = view;
  const x = new Float64Array(names.length);
  const call = (point: Float64Array): unknown => {
    try {
      if (model.kind === 'positional') {
        model.positions.forEach((p, i) => (x[i] = point[p] as number));
        return model.evaluate(x);
      }
      cursor.row = 0;
      rows.set(point);
      load(0);
      return model.evaluate(record);
    } catch (error) {
      throw locateModelError(error, `at ${describePoint(names, point)}`);
    }
  };
  return (point) => {
    const raw = call(point);
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

function checkedEntry(path: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new BridgeworkError(
      'model-not-finite',
      `\`${path}\` must be a finite number; got ${formatValue(v)}`,
      {
        param: path,
        value: v,
      },
    );
  }
  return v;
}

function gradientShapeError(param: string, expected: string, raw: unknown, limit: number): BridgeworkError {
  return new BridgeworkError(
    'invalid-shape',
    `\`${param}\` must return ${expected}; got ${formatValue(raw)}`,
    {
      param,
      value: raw,
      limit,
    },
  );
}

/** The Jacobian from a positional model's gradient (rows in `order`, mapped to the inputs' order). */
function positionalGradientRows(
  model: Extract<ResolvedModel, { kind: 'positional' }>,
  gradient: (x: Float64Array) => unknown,
  x: Float64Array,
  m: number,
  scalar: boolean,
): Float64Array {
  const n = x.length;
  const inOrder = new Float64Array(n);
  model.positions.forEach((p, i) => (inOrder[i] = x[p] as number));
  const raw = gradient(inOrder);
  const isRow = (r: unknown): r is ArrayLike<unknown> =>
    Array.isArray(r) || r instanceof Float64Array || r instanceof Float32Array;
  const rows: unknown[] = scalar ? [raw] : Array.isArray(raw) ? raw : [];
  const expected = scalar ? `${n} numbers, one per input of \`order\`` : `${m} arrays of ${n} numbers`;
  if (rows.length !== m || !rows.every((r) => isRow(r) && r.length === n)) {
    throw gradientShapeError('model.gradient', expected, raw, scalar ? n : m);
  }
  const jac = new Float64Array(m * n);
  rows.forEach((row, k) => {
    const r = row as ArrayLike<unknown>;
    for (let i = 0; i < n; i++) {
      const path = scalar ? `model.gradient[${i}]` : `model.gradient[${k}][${i}]`;
      jac[k * n + (model.positions[i] as number)] = checkedEntry(path, r[i]);
    }
  });
  return jac;
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
    throw gradientShapeError('gradient', scalar ? 'a record' : `${m} records, one per output`, raw, m);
  }
  const n = names.length;
  const jac = new Float64Array(m * n);
  rows.forEach((row, k) => {
    const path = scalar ? 'gradient' : `gradient[${k}]`;
    const r = checkOptions(path, row, { known: names, required: names });
    names.forEach((name, i) => {
      jac[k * n + i] = checkedEntry(`${path}.${name}`, r[name]);
    });
  });
  return jac;
}

/** The keys of {@link PropagateOptions} (a vector model's options are a subset). */
const propagateOptionKeys = [
  'model',
  'inputs',
  'correlations',
  'gradient',
  'secondOrder',
  'coverage',
  'degreesOfFreedom',
] as const;

function compute(options: unknown, vectorAllowed: boolean): Internals {
  const o = checkOptions('options', options, { known: propagateOptionKeys, required: ['model', 'inputs'] });
  const inputs = normalizeInputs(o['inputs']);
  const names = inputs.map((q) => q.name);
  const model = resolveModel(o['model'], names);
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
  if (gradient !== undefined && model.kind === 'positional') {
    throw new BridgeworkError(
      'conflicting-options',
      '`gradient` must not be given with a positional model: give it as `model.gradient`, by position',
      { param: 'gradient', value: gradient },
    );
  }
  const x = Float64Array.from(inputs, (q) => q.value);
  const u = Float64Array.from(inputs, (q) => q.standardUncertainty);

  const view = acquireRecord(names);
  try {
    return lawOfPropagation(
      model,
      gradient as ((x: Readonly<Record<string, number>>) => unknown) | undefined,
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
  model: ResolvedModel,
  gradient: ((x: Readonly<Record<string, number>>) => unknown) | undefined,
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
  let raw: unknown;
  try {
    if (model.kind === 'positional') {
      const inOrder = new Float64Array(n);
      model.positions.forEach((p, i) => (inOrder[i] = x[p] as number));
      raw = model.evaluate(inOrder);
    } else {
      view.cursor.row = 0;
      view.rows.set(x);
      view.load(0);
      raw = model.evaluate(view.record);
    }
  } catch (error) {
    throw locateModelError(error, `at the estimates (${describePoint(names, x)})`);
  }
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

  const evaluate = evaluatorFor(model, view, names, m);
  const steps = baseSteps(x, u);
  let jac: Float64Array;
  try {
    if (model.kind === 'positional' && model.gradient !== undefined)
      jac = positionalGradientRows(model, model.gradient, x, m, scalar);
    else if (gradient !== undefined) jac = gradientRows(gradient, names, x, m, scalar);
    else jac = jacobian(evaluate, x, steps, m);
  } catch (e) {
    throw e instanceof NotFiniteAtPoint ? notFiniteError(names, e) : e;
  }
  jac.forEach((c, index) => {
    if (!Number.isFinite(c)) {
      const name = names[index % n] as string;
      throw new BridgeworkError(
        'model-not-finite',
        `\`model\` must have a finite sensitivity to '${name}' at the estimates; the difference quotients overflow (${formatValue(c)}): check the model near ${describePoint(names, x)}, or supply the gradient`,
        { param: 'model', value: c },
      );
    }
  });

  // V(y) = J·V(x)·Jᵀ with V(x)ᵢⱼ = rᵢⱼ·uᵢ·uⱼ, written with the weighted sensitivities aₖᵢ = cₖᵢ·uᵢ,
  // each divided by the largest |aₖᵢ| so that no product overflows or underflows (u(y) itself is
  // representable whenever the inputs are; its square may not be).
  const weighted = jac.map((c, index) => c * (u[index % n] as number));
  let scale = 0;
  for (const a of weighted) scale = Math.max(scale, Math.abs(a));
  if (!Number.isFinite(scale)) {
    throw new BridgeworkError(
      'out-of-range',
      `an uncertainty contribution |cᵢ|·u(xᵢ) exceeds the range of binary64 (about 1.8e308) at ${describePoint(names, x)}: express the quantities in other units`,
      { param: 'inputs', value: scale },
    );
  }
  if (scale === 0) scale = 1;
  const a = weighted.map((v) => v / scale);
  const covariance = new Float64Array(m * m);
  for (let k = 0; k < m; k++) {
    for (let l = k; l < m; l++) {
      let v = 0;
      let size = 0;
      for (let i = 0; i < n; i++) {
        const t = (a[k * n + i] as number) * (a[l * n + i] as number);
        v += t;
        size += Math.abs(t);
      }
      for (const { i, j } of pairs) {
        const t =
          (r[i * n + j] as number) *
          ((a[k * n + i] as number) * (a[l * n + j] as number) +
            (a[k * n + j] as number) * (a[l * n + i] as number));
        v += t;
        size += Math.abs(t);
      }
      // A variance can come out a few ulps below zero when correlations cancel it exactly.
      if (k === l && v < 0 && -v <= 1e-12 * size) v = 0;
      covariance[k * m + l] = v;
      covariance[l * m + k] = v;
    }
  }

  let scaledSecondOrder = 0;
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
          const ui = u[i] as number;
          const uj = u[j] as number;
          if (ui === 0 || uj === 0) continue;
          // [½(fᵢⱼuᵢuⱼ)² + (fᵢuᵢ)(fᵢⱼⱼuᵢuⱼ²)]/scale².
          const mixed = ((second[i * n + j] as number) * ui * uj) / scale;
          const cross =
            (((jac[i] as number) * ui) / scale) * (((third[i * n + j] as number) * ui * uj * uj) / scale);
          scaledSecondOrder += 0.5 * mixed * mixed + cross;
        }
      }
    } catch (e) {
      throw e instanceof NotFiniteAtPoint ? notFiniteError(names, e) : e;
    }
    if (!Number.isFinite(scaledSecondOrder)) {
      throw new BridgeworkError(
        'model-not-finite',
        '`secondOrder` terms must be finite; the second and third derivatives of the model overflow at the estimates (use monteCarlo)',
        { param: 'secondOrder', value: scaledSecondOrder },
      );
    }
    if ((covariance[0] as number) + scaledSecondOrder < 0) {
      throw new BridgeworkError(
        'out-of-range',
        '`secondOrder` terms must not make the variance negative; the Taylor expansion does not describe this model (use monteCarlo)',
        { param: 'secondOrder', value: scaledSecondOrder * scale * scale },
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
    scaledCovariance: covariance,
    scale,
    coverage,
    scaledSecondOrder,
    statedDegreesOfFreedom,
  };
}

/** A figure of the result that must be finite; otherwise the inputs are past what binary64 holds. */
function finiteFigure(name: string, value: number, why: string): number {
  if (Number.isFinite(value)) return value;
  throw new BridgeworkError(
    'out-of-range',
    `the ${name} is not representable (${formatValue(value)}): ${why}`,
    { param: 'inputs', value },
  );
}

function outputPropagation(s: Internals, k: number): Propagation {
  const n = s.inputs.length;
  const scaledFirst = s.scaledCovariance[k * s.m + k] as number;
  const scaledVariance = scaledFirst + (k === 0 ? s.scaledSecondOrder : 0);
  const units = 'express the quantities in other units';
  const standardUncertainty = finiteFigure(
    'combined standard uncertainty',
    s.scale * Math.sqrt(scaledVariance),
    units,
  );
  const firstOrder = s.scale * Math.sqrt(scaledFirst);
  const sensitivities: Record<string, number> = {};
  const contributions: Record<string, number> = {};
  const budget: BudgetLine[] = [];
  const components: { contribution: number; degreesOfFreedom: number }[] = [];
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
    components.push({ contribution, degreesOfFreedom: q.degreesOfFreedom });
  });
  const effectiveDegreesOfFreedom =
    s.statedDegreesOfFreedom ?? effectiveDegreesOfFreedomOf(firstOrder, components);
  const k95 = finiteFigure(
    'coverage factor',
    coverageFactor(s.coverage, truncatedDegreesOfFreedom(effectiveDegreesOfFreedom)),
    `the effective degrees of freedom ${formatValue(effectiveDegreesOfFreedom)} are too few for a coverage factor at p = ${s.coverage}; state \`degreesOfFreedom\``,
  );
  const value = s.y[k] as number;
  const expandedUncertainty = finiteFigure('expanded uncertainty', k95 * standardUncertainty, units);
  const interval = {
    min: finiteFigure('coverage interval', value - expandedUncertainty, units),
    max: finiteFigure('coverage interval', value + expandedUncertainty, units),
  };
  const secondOrderVariance =
    k === 0 ? finiteFigure('second-order variance', s.scaledSecondOrder * s.scale * s.scale, units) : 0;
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
    interval,
    secondOrderVariance,
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
 * max(u(xᵢ), 2⁻¹⁰·|xᵢ|), shrunk by 1.4 four to ten times and restarted at a sixteenth if the
 * model is not finite at a step; for smooth models they agree with analytic derivatives to 1e-9
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
 * The sums are formed with the weighted sensitivities cᵢ·u(xᵢ) divided by the largest of them,
 * and Welch–Satterthwaite as 1/Σ(uᵢ/u_c)⁴/νᵢ, so uncertainties anywhere in the binary64 range
 * give finite results; a figure that is itself past binary64 is refused (`out-of-range`).
 *
 * Verified against JCGM 100 Annex H.2 (correlated V, I, φ) and H.3, and against analytic
 * derivatives and exact variances (docs/uncertainty.md).
 *
 * @param options - The model, inputs, correlations, optional gradient, second order, coverage.
 * @returns The estimate, combined and expanded uncertainty, sensitivities, contributions, budget,
 *   effective degrees of freedom and coverage interval, in the unit of the model's output.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` for the
 *   options' keys; `wrong-type` unless `model` is a function or a positional model returning a
 *   number; `model-not-finite` when it (or `gradient`) is not finite near the estimates;
 *   `model-failed` when it throws an error of its own; the input codes of
 *   {@link standardUncertaintyOf}; `not-positive-semidefinite`, `invalid-option`, `out-of-range`
 *   for bad correlations; `out-of-range` for a coverage outside (0, 1), or a result past
 *   binary64 (U, a covariance); `conflicting-options` for `secondOrder` with correlations, or
 *   `gradient` with a positional model; `missing-option` or `unknown-option` for a gradient
 *   without an input or with an unknown name; `invalid-shape` for a positional gradient of the
 *   wrong length.
 * @example
 * ```ts
 * const r = propagate({
 *   model: ({ V, I }) => V / I,
 *   inputs: { V: { value: 5, standardUncertainty: 0.002 }, I: { value: 0.02, standardUncertainty: 1e-5 } },
 * });
 * r.value; // 250 (Ω)
 * r.standardUncertainty; // 0.160078105935784 (= √((50·0.002)² + (12 500·1e-5)²))
 * r.sensitivities; // { V: 49.99999999999525, I: -12499.999999995993 } (exact: 50, −12 500)
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
  const cov = (k: number, l: number): number => s.scaledCovariance[k * s.m + l] as number;
  const covariance = Array.from({ length: s.m }, (_, k) =>
    Array.from({ length: s.m }, (_, l) =>
      finiteFigure(
        'output covariance',
        cov(k, l) * s.scale * s.scale,
        'express the quantities in other units',
      ),
    ),
  );
  // Correlations from the scaled covariance: no overflow where the covariance itself would.
  const correlation = covariance.map((row, k) =>
    row.map((_, l) =>
      k === l
        ? 1
        : (sd[k] as number) > 0 && (sd[l] as number) > 0
          ? cov(k, l) / (Math.sqrt(cov(k, k)) * Math.sqrt(cov(l, l)))
          : 0,
    ),
  );
  return { values: Array.from(s.y), standardUncertainties: sd, covariance, correlation, outputs };
}

/** The scalar law of propagation for internal callers (monteCarlo's GUM comparison). */
export function propagateScalar(options: PropagateOptions): Propagation {
  return outputPropagation(compute(options, false), 0);
}
