/**
 * Numerical derivatives of a model for the law of propagation: central difference quotients
 * extrapolated to zero step by Ridders' method (C. J. F. Ridders, "Accurate computation of F′(x)
 * and F′(x)F″(x)", Adv. Eng. Software 4(2), 1982; as in Numerical Recipes, 2nd ed., §5.7).
 *
 * Every quotient used here is an even function of the step h, q(h) = D + c₂h² + c₄h⁴ + …, so a
 * Neville tableau over steps h₀, h₀/1.4, h₀/1.4², … removes the error term by term; the entry with
 * the smallest estimated error is kept, and the tableau stops when the error starts to grow
 * (rounding takes over), but not before four columns: the first estimates can agree by chance
 * (two quotients whose errors nearly cancel) and stopping there left errors of 2e-8 relative in
 * about one derivative in 10⁵ of smooth models; with four columns the worst of 10⁶ random cases
 * was 1.5e-10. The step rule: for input i the step is h·sᵢ with
 * sᵢ = max(u(xᵢ), 2⁻¹⁰·|xᵢ|) — the input's standard uncertainty (the scale over which the
 * linearisation is meant to hold), but not so small against the value that rounding swamps the
 * difference — or 2⁻¹⁰ when both are 0; h starts at 1. If the model is not finite at a stencil
 * point, the whole extrapolation restarts with h₀/16, up to four times.
 */

const SHRINK = 1.4;
const SHRINK2 = SHRINK * SHRINK;
const TABLE = 10;
const SAFE = 2;
/** Columns computed before the tableau may stop: the first error estimates can be small by chance. */
const MIN_COLUMNS = 4;
const RETRIES = 4;

/** Thrown by an evaluation when the model is not finite at a stencil point. */
export class NotFiniteAtPoint extends Error {
  constructor(
    /** The offending output value. */
    readonly output: unknown,
    /** The point evaluated. */
    readonly point: Float64Array,
  ) {
    super('model not finite at a stencil point');
  }
}

/**
 * Ridders' extrapolation of the vector quotient q(h) → D as h → 0, starting from h = 1 (the
 * quotient itself scales its steps). Returns the estimate and its error estimate per component.
 */
export function ridders(
  q: (h: number) => Float64Array,
  outputs: number,
): { value: Float64Array; error: Float64Array } {
  let lastFailure: NotFiniteAtPoint | undefined;
  for (let attempt = 0, h0 = 1; attempt <= RETRIES; attempt++, h0 /= 16) {
    try {
      return extrapolate(q, h0, outputs);
    } catch (e) {
      if (!(e instanceof NotFiniteAtPoint)) throw e;
      lastFailure = e;
    }
  }
  throw lastFailure as NotFiniteAtPoint;
}

function extrapolate(
  q: (h: number) => Float64Array,
  h0: number,
  m: number,
): { value: Float64Array; error: Float64Array } {
  // table[j][i]: column i (step h0/1.4^i), extrapolation order j; one tableau per output.
  const value = new Float64Array(m);
  const error = new Float64Array(m).fill(Infinity);
  const done = new Uint8Array(m);
  let previous: Float64Array[] = [q(h0)];
  for (let k = 0; k < m; k++) value[k] = (previous[0] as Float64Array)[k] as number;
  let h = h0;
  for (let i = 1; i < TABLE; i++) {
    h /= SHRINK;
    const current: Float64Array[] = [q(h)];
    let factor = SHRINK2;
    for (let j = 1; j <= i; j++) {
      const up = current[j - 1] as Float64Array;
      const left = previous[j - 1] as Float64Array;
      const next = new Float64Array(m);
      for (let k = 0; k < m; k++) next[k] = ((up[k] as number) * factor - (left[k] as number)) / (factor - 1);
      current.push(next);
      factor *= SHRINK2;
      for (let k = 0; k < m; k++) {
        if (done[k]) continue;
        const e = Math.max(
          Math.abs((next[k] as number) - (up[k] as number)),
          Math.abs((next[k] as number) - (left[k] as number)),
        );
        if (e <= (error[k] as number)) {
          error[k] = e;
          value[k] = next[k] as number;
        }
      }
    }
    let all = true;
    for (let k = 0; k < m; k++) {
      if (done[k]) continue;
      const diagonal = Math.abs(
        ((current[i] as Float64Array)[k] as number) - ((previous[i - 1] as Float64Array)[k] as number),
      );
      if (i + 1 >= MIN_COLUMNS && diagonal >= SAFE * (error[k] as number)) done[k] = 1;
      else all = false;
    }
    if (all) break;
    previous = current;
  }
  return { value, error };
}

/** The base step sᵢ of each input (see the module comment). */
export function baseSteps(values: Float64Array, uncertainties: Float64Array): Float64Array {
  return values.map((x, i) => {
    const s = Math.max(uncertainties[i] as number, Math.abs(x) * 2 ** -10);
    return s > 0 ? s : 2 ** -10;
  });
}

/** Evaluates the model at a point; returns its outputs or throws {@link NotFiniteAtPoint}. */
export type PointEvaluator = (point: Float64Array) => Float64Array;

/** Central first derivatives: the m × n Jacobian, row-major, at `x`. */
export function jacobian(f: PointEvaluator, x: Float64Array, steps: Float64Array, m: number): Float64Array {
  const n = x.length;
  const jac = new Float64Array(m * n);
  const p = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = steps[i] as number;
    const { value } = ridders((h) => {
      p.set(x);
      p[i] = (x[i] as number) + h * s;
      const plus = f(p);
      p[i] = (x[i] as number) - h * s;
      const minus = f(p);
      return plus.map((v, k) => (v - (minus[k] as number)) / (2 * h * s));
    }, m);
    for (let k = 0; k < m; k++) jac[k * n + i] = value[k] as number;
  }
  return jac;
}

/** f at x + a·sᵢ·eᵢ + b·sⱼ·eⱼ, scalar model. */
function at(
  f: PointEvaluator,
  x: Float64Array,
  p: Float64Array,
  i: number,
  a: number,
  j: number,
  b: number,
): number {
  p.set(x);
  p[i] = (p[i] as number) + a;
  p[j] = (p[j] as number) + b;
  return f(p)[0] as number;
}

/**
 * Second and third partial derivatives of a scalar model for the second-order terms of the law of
 * propagation: fᵢⱼ = ∂²f/∂xᵢ∂xⱼ and fᵢⱼⱼ = ∂³f/∂xᵢ∂xⱼ², both n × n row-major, for the inputs
 * flagged in `active` (the others are left 0). Stencils (all even in the step):
 * fᵢᵢ ≈ (f(x + hᵢ) − 2f(x) + f(x − hᵢ))/hᵢ²; fᵢⱼ ≈ (f₊₊ − f₊₋ − f₋₊ + f₋₋)/(4hᵢhⱼ);
 * fᵢᵢᵢ ≈ (f(x + 2hᵢ) − 2f(x + hᵢ) + 2f(x − hᵢ) − f(x − 2hᵢ))/(2hᵢ³);
 * fᵢⱼⱼ ≈ (f₊₊ − 2f₊₀ + f₊₋ − f₋₊ + 2f₋₀ − f₋₋)/(2hᵢhⱼ²).
 */
export function higherDerivatives(
  f: PointEvaluator,
  x: Float64Array,
  steps: Float64Array,
  active: readonly boolean[],
): { second: Float64Array; third: Float64Array } {
  const n = x.length;
  const second = new Float64Array(n * n);
  const third = new Float64Array(n * n);
  const p = new Float64Array(n);
  const f0 = f(x)[0] as number;
  const one = (v: number): Float64Array => Float64Array.of(v);
  for (let i = 0; i < n; i++) {
    if (!active[i]) continue;
    const si = steps[i] as number;
    second[i * n + i] = ridders((h) => {
      const hi = h * si;
      return one((at(f, x, p, i, hi, i, 0) - 2 * f0 + at(f, x, p, i, -hi, i, 0)) / (hi * hi));
    }, 1).value[0] as number;
    third[i * n + i] = ridders((h) => {
      const hi = h * si;
      const d =
        at(f, x, p, i, 2 * hi, i, 0) -
        2 * at(f, x, p, i, hi, i, 0) +
        2 * at(f, x, p, i, -hi, i, 0) -
        at(f, x, p, i, -2 * hi, i, 0);
      return one(d / (2 * hi * hi * hi));
    }, 1).value[0] as number;
    for (let j = 0; j < n; j++) {
      if (j === i || !active[j]) continue;
      const sj = steps[j] as number;
      if (j > i) {
        const mixed = ridders((h) => {
          const hi = h * si;
          const hj = h * sj;
          const d =
            at(f, x, p, i, hi, j, hj) -
            at(f, x, p, i, hi, j, -hj) -
            at(f, x, p, i, -hi, j, hj) +
            at(f, x, p, i, -hi, j, -hj);
          return one(d / (4 * hi * hj));
        }, 1).value[0] as number;
        second[i * n + j] = mixed;
        second[j * n + i] = mixed;
      }
      third[i * n + j] = ridders((h) => {
        const hi = h * si;
        const hj = h * sj;
        const d =
          at(f, x, p, i, hi, j, hj) -
          2 * at(f, x, p, i, hi, j, 0) +
          at(f, x, p, i, hi, j, -hj) -
          at(f, x, p, i, -hi, j, hj) +
          2 * at(f, x, p, i, -hi, j, 0) -
          at(f, x, p, i, -hi, j, -hj);
        return one(d / (2 * hi * hj * hj));
      }, 1).value[0] as number;
    }
  }
  return { second, third };
}
