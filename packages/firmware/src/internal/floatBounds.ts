/**
 * A priori error bounds of the float evaluators and of the double-double reference, in exact
 * rational arithmetic (so the bounds themselves carry no rounding).
 */
import type { BinaryFormat } from './binary.js';
import { abs, add, cmp, div, max, mul, mulPow2, pow, rat, sub, ZERO, type Rational } from './rational.js';

/** The exact map, the rounded constants and the code range. */
export interface FloatBoundInput {
  readonly kind: 'affine' | 'polynomial';
  readonly format: BinaryFormat;
  /** Exact and rounded offsets. */
  readonly offset: Rational;
  readonly offsetRounded: Rational;
  /** Exact and rounded ascending coefficients (affine: [scale]). */
  readonly coefficients: readonly Rational[];
  readonly coefficientsRounded: readonly Rational[];
  readonly codeMin: number;
  readonly codeMax: number;
}

/** γ_m = m·u/(1 − m·u) (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §3.1). */
function gamma(m: number, u: Rational): Rational {
  const mu = mul(rat(BigInt(m)), u);
  return div(mu, sub(rat(1n), mu));
}

/** Σ w_k X^k over k (w ascending). */
function weightedPowers(weights: readonly Rational[], x: Rational, shift = 0): Rational {
  let sum = ZERO;
  weights.forEach((w, k) => {
    if (k >= shift) sum = add(sum, mul(w, pow(x, k - shift)));
  });
  return sum;
}

/** max |code − offset| over the range: at one of the ends. */
function widest(input: FloatBoundInput, offset: Rational): Rational {
  return max(abs(sub(rat(BigInt(input.codeMin)), offset)), abs(sub(rat(BigInt(input.codeMax)), offset)));
}

/** The coefficients of the polynomial form: affine y = x·s is the polynomial 0 + s·x. */
function polynomialOf(kind: 'affine' | 'polynomial', c: readonly Rational[]): readonly Rational[] {
  return kind === 'affine' ? [ZERO, c[0] as Rational] : c;
}

/**
 * Bound on |ŷ(code) − P(code − offset)| over the range for the emulated evaluator (see
 * docs/firmware.md, "Float maps"). With u = 2^−p and η = 2^(emin − p) (half the subnormal spacing):
 * - conversion |ĉ − c| ≤ u·max|c| when max|c| > 2^p, else 0; offset |ô − o| exactly;
 * - argument ξ = εc + εo + u(X + εc + εo) + η, with X = max|c − o|, and X' = X + ξ;
 * - evaluation: affine u·|ŝ|X' + η; Horner γ_2n Σ|â_k|X'^k + 2η(1 + γ_2n) Σ_{j<n} X'^j
 *   (Higham, 2nd ed., §5.1, eq. (5.3), with the mixed model fl(z) = z(1 + δ) + η' for underflow);
 * - coefficients Σ|â_k − a_k|X'^k; argument error ξ·Σ k|a_k|X'^(k−1).
 */
export function evaluationBound(input: FloatBoundInput): Rational {
  const { format } = input;
  const u = mulPow2(rat(1n), -format.precision);
  const eta = mulPow2(rat(1n), format.minExponent - format.precision);
  const cMax = max(abs(rat(BigInt(input.codeMin))), abs(rat(BigInt(input.codeMax))));
  const conversion = cmp(cMax, mulPow2(rat(1n), format.precision)) > 0 ? mul(u, cMax) : ZERO;
  const offsetError = abs(sub(input.offsetRounded, input.offset));
  const X = widest(input, input.offset);
  const xi = add(add(add(conversion, offsetError), mul(u, add(add(X, conversion), offsetError))), eta);
  const Xp = add(X, xi);
  const exact = polynomialOf(input.kind, input.coefficients);
  const rounded = polynomialOf(input.kind, input.coefficientsRounded);
  const n = exact.length - 1;
  let evaluation: Rational;
  if (input.kind === 'affine') {
    evaluation = add(mul(mul(u, abs(rounded[1] as Rational)), Xp), eta);
  } else if (n === 0) {
    evaluation = ZERO;
  } else {
    const g = gamma(2 * n, u);
    const underflow = mul(
      mul(mulPow2(eta, 1), add(rat(1n), g)),
      weightedPowers(
        Array.from({ length: n }, () => rat(1n)),
        Xp,
      ),
    );
    evaluation = add(mul(g, weightedPowers(rounded.map(abs), Xp)), underflow);
  }
  const coefficientPart = weightedPowers(
    exact.map((a, k) => abs(sub(rounded[k] as Rational, a))),
    Xp,
  );
  const derivative = exact.map((a, k) => mul(rat(BigInt(k)), abs(a)));
  const argumentPart = mul(xi, weightedPowers(derivative, Xp, 1));
  return add(add(evaluation, coefficientPart), argumentPart);
}

/**
 * Bound on the reference's own error (floatScan.ts) over the range. With q the representation unit
 * of the coefficients and offset, w the relative error of one reference operation, and τ the error
 * of t = code − offset:
 * - binary64 reference (float32 maps): q = w = u = 2^−53, τ = 2u(|o| + X);
 * - double-double reference (float64 maps): q = u², w = 2^−100, τ = 4u²(|o| + X);
 * the bound is γ_2n(w)(1 + q)·S' + 2q·S' + τ·Σ k|a_k|X'^(k−1) + (16n + 16)·2^−1074, with
 * S' = Σ|a_k|X'^k and X' = X + τ. The last term covers underflow; the second also covers the
 * low part of the reference in the final subtraction.
 */
export function referenceBound(input: FloatBoundInput, doubleDouble: boolean): Rational {
  const u = mulPow2(rat(1n), -53);
  const q = doubleDouble ? mul(u, u) : u;
  const w = doubleDouble ? mulPow2(rat(1n), -100) : u;
  const X = widest(input, input.offset);
  const tau = mul(doubleDouble ? mulPow2(q, 2) : mulPow2(u, 1), add(abs(input.offset), X));
  const Xp = add(X, tau);
  const exact = polynomialOf(input.kind, input.coefficients);
  const n = exact.length - 1;
  const S = weightedPowers(exact.map(abs), Xp);
  const derivative = exact.map((a, k) => mul(rat(BigInt(k)), abs(a)));
  const horner = n === 0 ? ZERO : mul(mul(gamma(2 * n, w), add(rat(1n), q)), S);
  const representation = mul(mulPow2(q, 1), S);
  const argument = mul(tau, weightedPowers(derivative, Xp, 1));
  const underflow = mulPow2(rat(BigInt(16 * n + 16)), -1074);
  return add(add(add(horner, representation), argument), underflow);
}
