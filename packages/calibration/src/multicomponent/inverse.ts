/**
 * The per-sample inverse of a multi-component model, loads from readings, on plain typed arrays:
 * no allocation per sample (every buffer is made once, when the inverse is created).
 */
import { BridgeworkError, formatValue } from '@bridgework/core';

/** The numeric model the inverse solves: r = a + S·F + Q·g(F), with g the second-order terms. */
export interface InverseModel {
  /** Components M. */
  readonly m: number;
  /** Bridges N (≥ M). */
  readonly n: number;
  /** Offsets a (N). */
  readonly offsets: Float64Array;
  /** S, N×M row-major. */
  readonly linear: Float64Array;
  /** The two component indices of each second-order term (equal for a square). */
  readonly termA: Int32Array;
  readonly termB: Int32Array;
  /** Q, N×T2 row-major. */
  readonly quadratic: Float64Array;
  /** C = (SᵀWS)⁻¹SᵀW, M×N row-major: the linear inverse (S⁻¹ when N = M). */
  readonly left: Float64Array;
  /** √w_i, the weights' square roots (N), relative: for N > M the inverse minimises Σ w_i·residual_i². */
  readonly sqrtWeights: Float64Array;
  /** Full scale of each component (M), the scale of the convergence test. */
  readonly fullScale: Float64Array;
  /** Convergence: stop when every |ΔF_j| ≤ tolerance·fullScale_j. */
  readonly tolerance: number;
  /** The most Newton steps per sample. */
  readonly maxIterations: number;
  /**
   * Whether the fixed-point step may run as straight-line code compiled for this model (default
   * true; false keeps the loop, which gives the same results bit for bit).
   */
  readonly compile?: boolean;
}

/** The number of Newton (Gauss–Newton) steps a sample may take. */
export const MAX_ITERATIONS = 30;

/** A solver bound to one model and its work buffers. */
export interface InverseSolver {
  /**
   * Solves one sample: readings at `input[inOffset … inOffset + N)`, loads to
   * `output[outOffset … outOffset + M)`. Returns the iterations taken (0 for a linear model).
   */
  solve(input: Float64Array, inOffset: number, output: Float64Array, outOffset: number): number;
  /**
   * Solves `count` interleaved samples (N readings each) into `output` (M loads each). A reading
   * beyond ±`limit` (or NaN) throws `out-of-range` naming its index in `input`.
   */
  convert(input: Float64Array, output: Float64Array, count: number, limit: number): void;
  /** Whether the fixed-point step runs as compiled straight-line code (else as loops, or unused). */
  readonly compiledStep: boolean;
}

/** The most fixed-point iterations before the solver changes to Newton steps. */
export const MAX_FIXED_POINT_ITERATIONS = 60;

/** Creates the solver: a direct product for a linear model, else Newton / Gauss–Newton steps. */
export function createInverseSolver(model: InverseModel): InverseSolver {
  const { m, n, offsets, linear, termA, termB, quadratic, left, sqrtWeights, fullScale, tolerance } = model;
  const t2 = termA.length;
  const f = new Float64Array(m);
  const res = new Float64Array(n);
  const jac = new Float64Array(n * m); // row-major, weighted
  const step = new Float64Array(m);
  const v = new Float64Array(n); // Householder vector
  const limit = new Float64Array(m);
  for (let j = 0; j < m; j++) limit[j] = tolerance * (fullScale[j] as number);
  // F_lin = C·r − C·a, and D = C·Q for the fixed-point form F = F_lin − D·g(F) (N = M).
  const lin0 = new Float64Array(m);
  const d = new Float64Array(m * t2);
  for (let j = 0; j < m; j++) {
    let s0 = 0;
    for (let i = 0; i < n; i++) s0 += (left[j * n + i] as number) * (offsets[i] as number);
    lin0[j] = s0;
    for (let t = 0; t < t2; t++) {
      let st = 0;
      for (let i = 0; i < n; i++) st += (left[j * n + i] as number) * (quadratic[i * t2 + t] as number);
      d[j * t2 + t] = st;
    }
  }
  const fLin = new Float64Array(m);
  const g = new Float64Array(t2);
  const fixedPoint = n === m;

  function linearStart(input: Float64Array, inOffset: number): void {
    for (let j = 0; j < m; j++) {
      let s = -(lin0[j] as number);
      const row = j * n;
      for (let i = 0; i < n; i++) s += (left[row + i] as number) * (input[inOffset + i] as number);
      f[j] = s;
      fLin[j] = s;
    }
  }

  const compiledStep =
    fixedPoint && t2 > 0 && model.compile !== false ? compileFixedPointStep(m, termA, termB) : undefined;
  const fixedPointStep = compiledStep ?? loopFixedPointStep(m, termA, termB, g);

  /**
   * The fixed-point iteration F ← F_lin − D·g(F) (N = M). Returns the iterations once the error
   * bound ρ/(1 − ρ)·|δ| of the last step is within the tolerance for every component, with the
   * contraction estimate ρ ≤ 1/2; 0 when the steps do not contract so (the caller then takes Newton
   * steps from the linear start).
   */
  function iterateFixedPoint(): number {
    let previous = Infinity;
    for (let iteration = 1; iteration <= MAX_FIXED_POINT_ITERATIONS; iteration++) {
      const largest = fixedPointStep(f, fLin, d, fullScale, step);
      if (iteration > 1) {
        // Contraction estimate ρ = |δ_k|/|δ_(k−1)|; the error left after this step is at most
        // ρ/(1 − ρ)·|δ_k| for a contraction, so stop when that is within the tolerance.
        const rho = previous === 0 ? 0 : largest / previous;
        if (!(rho <= 0.5)) return 0; // not contracting by half: Newton takes over
        const factor = rho / (1 - rho);
        let within = true;
        for (let j = 0; j < m; j++)
          if (!(factor * (step[j] as number) <= (limit[j] as number))) within = false;
        if (within) return iteration;
      }
      previous = largest;
    }
    return 0;
  }

  // Least-squares step min ‖jac·δ − res‖ by Householder QR of the small N×M system, in place.
  function householderStep(): void {
    for (let k = 0; k < m; k++) {
      let norm = 0;
      for (let i = k; i < n; i++) norm += (jac[i * m + k] as number) * (jac[i * m + k] as number);
      norm = Math.sqrt(norm);
      const x0 = jac[k * m + k] as number;
      const alpha = x0 >= 0 ? -norm : norm;
      v[k] = x0 - alpha;
      for (let i = k + 1; i < n; i++) v[i] = jac[i * m + k] as number;
      let vv = 0;
      for (let i = k; i < n; i++) vv += (v[i] as number) * (v[i] as number);
      jac[k * m + k] = alpha;
      if (vv === 0) continue;
      const beta = 2 / vv;
      for (let c = k + 1; c < m; c++) {
        let dot = 0;
        for (let i = k; i < n; i++) dot += (v[i] as number) * (jac[i * m + c] as number);
        const g = beta * dot;
        for (let i = k; i < n; i++) jac[i * m + c] = (jac[i * m + c] as number) - g * (v[i] as number);
      }
      let dot = 0;
      for (let i = k; i < n; i++) dot += (v[i] as number) * (res[i] as number);
      const g = beta * dot;
      for (let i = k; i < n; i++) res[i] = (res[i] as number) - g * (v[i] as number);
    }
    for (let k = m - 1; k >= 0; k--) {
      let s = res[k] as number;
      for (let c = k + 1; c < m; c++) s -= (jac[k * m + c] as number) * (step[c] as number);
      step[k] = s / (jac[k * m + k] as number);
    }
  }

  function fail(input: Float64Array, inOffset: number, why: string): never {
    const readings = Array.from({ length: n }, (_, i) => input[inOffset + i] as number);
    throw new BridgeworkError(
      'not-converged',
      `\`readings\` [${readings.map((r) => formatValue(r)).join(', ')}] have no load state the model reaches within ${model.maxIterations} Newton steps (${why}); they may lie far outside the calibrated loads`,
      { param: 'readings', value: readings, limit: model.maxIterations },
    );
  }

  if (t2 === 0) {
    return {
      compiledStep: false,
      solve(input, inOffset, output, outOffset) {
        linearStart(input, inOffset);
        for (let j = 0; j < m; j++) output[outOffset + j] = f[j] as number;
        return 0;
      },
      convert(input, output, count, bound) {
        // F = C·r − C·a per sample, inline (the hot loop of the linear model).
        for (let k = 0; k < count; k++) {
          const base = k * n;
          const out = k * m;
          for (let i = 0; i < n; i++) {
            if (!(Math.abs(input[base + i] as number) <= bound)) badReading(input, base + i, bound);
          }
          for (let j = 0; j < m; j++) {
            let s = -(lin0[j] as number);
            const row = j * n;
            for (let i = 0; i < n; i++) s += (left[row + i] as number) * (input[base + i] as number);
            output[out + j] = s;
          }
        }
      },
    };
  }

  function newton(input: Float64Array, inOffset: number, output: Float64Array, outOffset: number): number {
    for (let iteration = 1; iteration <= model.maxIterations; iteration++) {
      // Weighted residual and Jacobian at f.
      for (let i = 0; i < n; i++) {
        let r = (input[inOffset + i] as number) - (offsets[i] as number);
        const row = i * m;
        for (let j = 0; j < m; j++) {
          const s = linear[row + j] as number;
          r -= s * (f[j] as number);
          jac[row + j] = s;
        }
        const qrow = i * t2;
        for (let t = 0; t < t2; t++) {
          const q = quadratic[qrow + t] as number;
          const a = termA[t] as number;
          const b = termB[t] as number;
          const fa = f[a] as number;
          const fb = f[b] as number;
          r -= q * fa * fb;
          jac[row + a] = (jac[row + a] as number) + q * fb;
          jac[row + b] = (jac[row + b] as number) + q * fa;
        }
        const w = sqrtWeights[i] as number;
        res[i] = w * r;
        for (let j = 0; j < m; j++) jac[row + j] = w * (jac[row + j] as number);
      }
      householderStep();
      let done = true;
      let finite = true;
      for (let j = 0; j < m; j++) {
        const d = step[j] as number;
        f[j] = (f[j] as number) + d;
        if (!(Math.abs(d) <= (limit[j] as number))) done = false;
        if (!Number.isFinite(f[j] as number)) finite = false;
      }
      if (!finite) fail(input, inOffset, 'the iteration diverged');
      if (done) {
        for (let j = 0; j < m; j++) output[outOffset + j] = f[j] as number;
        return iteration;
      }
    }
    return fail(input, inOffset, 'the last step was still above the tolerance');
  }

  function solve(input: Float64Array, inOffset: number, output: Float64Array, outOffset: number): number {
    linearStart(input, inOffset);
    if (fixedPoint) {
      const iterations = iterateFixedPoint();
      if (iterations > 0) {
        for (let j = 0; j < m; j++) output[outOffset + j] = f[j] as number;
        return iterations;
      }
      for (let j = 0; j < m; j++) f[j] = fLin[j] as number;
    }
    return newton(input, inOffset, output, outOffset);
  }

  return {
    compiledStep: compiledStep !== undefined,
    solve,
    convert(input, output, count, bound) {
      for (let k = 0; k < count; k++) {
        const base = k * n;
        for (let i = 0; i < n; i++) {
          if (!(Math.abs(input[base + i] as number) <= bound)) badReading(input, base + i, bound);
        }
        solve(input, base, output, k * m);
      }
    },
  };
}

/**
 * One step of the fixed-point iteration: f ← F_lin − D·g(f) with g(f) from the f before the step,
 * |δ_j| into `step`; returns the largest |δ_j|/fullScale_j (NaN when a value is NaN).
 */
type FixedPointStep = (
  f: Float64Array,
  fLin: Float64Array,
  d: Float64Array,
  fullScale: Float64Array,
  step: Float64Array,
) => number;

/** The fixed-point step as loops over the terms and components. */
function loopFixedPointStep(
  m: number,
  termA: Int32Array,
  termB: Int32Array,
  g: Float64Array,
): FixedPointStep {
  const t2 = termA.length;
  return (f, fLin, d, fullScale, step) => {
    for (let t = 0; t < t2; t++) g[t] = (f[termA[t] as number] as number) * (f[termB[t] as number] as number);
    let largest = 0;
    for (let j = 0; j < m; j++) {
      let s = fLin[j] as number;
      const row = j * t2;
      for (let t = 0; t < t2; t++) s -= (d[row + t] as number) * (g[t] as number);
      const delta = Math.abs(s - (f[j] as number));
      step[j] = delta;
      const scaled = delta / (fullScale[j] as number);
      if (!(scaled <= largest)) largest = scaled; // NaN propagates
      f[j] = s;
    }
    return largest;
  };
}

/** The most products D_jt·g_t a compiled fixed-point step holds (beyond it, the loop). */
const MAX_COMPILED_PRODUCTS = 1024;

/**
 * The fixed-point step as straight-line code for this model's shape: the loads of f, the terms
 * g_t and each component's sum written out, so the step runs without loop control or index
 * arithmetic (about three times the loop's speed for six components with all 21 second-order
 * terms). The source holds only identifiers and integer indices, never a coefficient (those are
 * read from `d`), and performs the loop's operations in the loop's order, so the results are the
 * same bit for bit. `undefined` when the model is larger than {@link MAX_COMPILED_PRODUCTS} or
 * the platform refuses to compile code (a content-security policy without `unsafe-eval`).
 */
function compileFixedPointStep(m: number, termA: Int32Array, termB: Int32Array): FixedPointStep | undefined {
  const t2 = termA.length;
  if (m * t2 > MAX_COMPILED_PRODUCTS) return undefined;
  const lines = ['"use strict";'];
  for (let j = 0; j < m; j++) lines.push(`const f${j} = f[${j}];`);
  for (let t = 0; t < t2; t++) lines.push(`const g${t} = f${termA[t] as number} * f${termB[t] as number};`);
  lines.push('let largest = 0;', 'let s = 0;', 'let delta = 0;', 'let scaled = 0;');
  for (let j = 0; j < m; j++) {
    // s = F_lin,j − d_j0·g0 − d_j1·g1 − …, evaluated left to right as the loop's `s -= d·g`.
    const products = Array.from({ length: t2 }, (_, t) => ` - d[${j * t2 + t}] * g${t}`).join('');
    lines.push(
      `s = fLin[${j}]${products};`,
      `delta = Math.abs(s - f${j});`,
      `step[${j}] = delta;`,
      `scaled = delta / fullScale[${j}];`,
      'if (!(scaled <= largest)) largest = scaled;',
      `f[${j}] = s;`,
    );
  }
  lines.push('return largest;');
  try {
    return new Function('f', 'fLin', 'd', 'fullScale', 'step', lines.join('\n')) as FixedPointStep;
  } catch {
    return undefined;
  }
}

function badReading(input: Float64Array, index: number, bound: number): never {
  const x = input[index] as number;
  throw new BridgeworkError(
    'out-of-range',
    `\`readings[${index}]\` must be a finite reading within ±${bound}; got ${formatValue(x)}`,
    { param: `readings[${index}]`, value: x, limit: [-bound, bound] },
  );
}
