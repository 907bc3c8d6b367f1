/**
 * Independent references for the mechanics tests. Nothing here shares code or algebra with src/:
 * - decimal.js at 400 digits: the closed-form eigen-decomposition of the 2×2 strain tensor;
 * - mathjs (private 40-digit BigNumber instance): an LU solve (`lusolve`) of the rosette leg equations εθ = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ (with
 *   the sines and cosines from decimal.js at 40 digits);
 * - decimal.js (private 40-digit clone): plane-stress equations and section formulas;
 * - Gauss–Legendre quadrature of the defining integrals of A and I.
 * Doubles enter exactly through `exactDecimalString`.
 */
import { Decimal } from 'decimal.js';
import { all, create, type BigNumber, type Matrix } from 'mathjs';
import { exactDecimalString } from '@bridgework/core';

// mathjs types its factory map as possibly undefined under noUncheckedIndexedAccess; it is always present.
// Its default tolerances (relTol 1e-12, absTol 1e-15) would treat strains below 1e-15 as zero and
// stop its solvers at 12 digits: tighten both for a 40-digit reference. Inputs are also scaled by an
// exact power of two to order one before solving, and the results scaled back.
const math = create(all as NonNullable<typeof all>, {
  number: 'BigNumber',
  precision: 40,
  relTol: 1e-36,
  absTol: 1e-300,
});
/** A power of two that brings the largest magnitude to [1, 2) (1 for all zeros). */
const scaleFor = (xs: readonly number[]): number => {
  const m = Math.max(...xs.map(Math.abs));
  return m === 0 ? 1 : 2 ** -Math.floor(Math.log2(m));
};
const big = (x: number): BigNumber => math.bignumber(exactDecimalString(x));

/** A private 40-digit decimal.js, rounding half to even; never `Decimal.set`. */
export const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
/** A double as an exact decimal (all its digits, not rounded to 40). */
export const dec = (x: number): Decimal => new D(exactDecimalString(x));
/**
 * An angle for a 40-digit sine or cosine: the double's exact value rounded to 50 digits (an
 * error of 1e-50 relative, far below the 40 digits kept). A tiny double such as 1e-300 has
 * hundreds of exact digits, which would make the series evaluation needlessly slow.
 */
const angle = (t: number): Decimal => dec(t).toSignificantDigits(50);

export interface EigenReference {
  /** Eigenvalues, ascending. */
  readonly values: readonly [number, number];
  /** Unit eigenvector of the larger eigenvalue, [vx, vy]. */
  readonly maxVector: readonly [number, number];
  /** Their difference, 2R (the maximum shear strain), rounded once. */
  readonly maxShear: number;
}

/**
 * A private 400-digit decimal.js for the closed-form eigen-decomposition: the products of the
 * doubles' exact values (at most about 70 significant digits for strains and stresses of these
 * tests) are exact, so an exact square's root is exact and an eigenvalue that is exactly zero
 * comes out as 0 (at 80 digits it came out as ±1e-87).
 */
const E = Decimal.clone({ precision: 400, rounding: Decimal.ROUND_HALF_EVEN });

/**
 * Eigen-decomposition of the symmetric tensor [[εx, γ/2], [γ/2, εy]] by the closed form of a
 * symmetric 2×2 matrix (any linear-algebra text): λ = c ± R with c = (εx + εy)/2 and
 * R = √(((εx − εy)/2)² + (γ/2)²), eigenvector of λ1 = c + R along (γ/2, λ1 − εx) — or along
 * (λ1 − εy, γ/2), whichever is longer — evaluated in decimal.js at 400 digits from the doubles'
 * exact values. (mathjs `eigs` at 40 digits was used before; on rare random tensors its BigNumber
 * Jacobi rotation ran for minutes.) At 400 digits c − R keeps more than 300 significant digits even
 * when it nearly cancels (a principal strain 1e-17 of the other), and is exactly 0 when the
 * eigenvalue is, so the smaller value needs no product form.
 */
export function strainTensorEigs(strainX: number, strainY: number, shearStrainXY: number): EigenReference {
  const x = new E(exactDecimalString(strainX));
  const y = new E(exactDecimalString(strainY));
  const b = new E(exactDecimalString(shearStrainXY)).div(2); // tensor shear εxy = γxy/2 (exact)
  const c = x.plus(y).div(2);
  const r = x.minus(y).div(2).pow(2).plus(b.pow(2)).sqrt();
  const max = c.plus(r);
  const min = c.minus(r);
  // Two candidate eigenvectors of λ1; the longer is the better conditioned (both vanish only
  // when the tensor is a multiple of the identity, where every direction is principal).
  const u = [b, max.minus(x)] as const;
  const v = [max.minus(y), b] as const;
  const norm = (w: readonly [Decimal, Decimal]) => w[0].pow(2).plus(w[1].pow(2)).sqrt();
  const w = norm(u).gte(norm(v)) ? u : v;
  const n = norm(w);
  const maxVector: readonly [number, number] = n.isZero()
    ? [1, 0]
    : [w[0].div(n).toNumber(), w[1].div(n).toNumber()];
  return { values: [min.toNumber(), max.toNumber()], maxVector, maxShear: r.times(2).toNumber() };
}

/** Solves the three leg equations for (εx, εy, γxy) by a 40-digit LU solve. */
export function solveLegsReference(
  anglesRadians: readonly [number, number, number],
  strains: readonly [number, number, number],
): [number, number, number] {
  const rows = anglesRadians.map((t) => {
    const c = math.bignumber(angle(t).cos().toString());
    const s = math.bignumber(angle(t).sin().toString());
    return [math.multiply(c, c), math.multiply(s, s), math.multiply(s, c)] as BigNumber[];
  });
  const x = (
    math.lusolve(math.matrix(rows), math.matrix(strains.map((e) => [big(e)]))) as Matrix
  ).toArray() as BigNumber[][];
  return [Number(x[0]![0]), Number(x[1]![0]), Number(x[2]![0])];
}

/** The leg strains of a state at 40 digits: εθ = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ. */
export function legStrainsReference(
  anglesRadians: readonly [number, number, number],
  strainX: number,
  strainY: number,
  shearStrainXY: number,
): [number, number, number] {
  const out = anglesRadians.map((t) => {
    const c = angle(t).cos();
    const s = angle(t).sin();
    return Number(
      dec(strainX)
        .times(c.times(c))
        .plus(dec(strainY).times(s.times(s)))
        .plus(dec(shearStrainXY).times(s.times(c))),
    );
  });
  return out as [number, number, number];
}

/**
 * Leg strains of a rectangular or delta rosette at the exact angles, 40 digits, from the
 * transformation equation evaluated by hand at 45°, 60° and 120° (no trigonometry):
 * rectangular εa = εx, εb = (εx + εy + γ)/2, εc = εy; delta εa = εx,
 * εb,c = εx/4 + 3εy/4 ± (√3/4)γ.
 */
export function namedLegsReference(
  layout: 'rectangular' | 'delta',
  strainX: number,
  strainY: number,
  shearStrainXY: number,
): [number, number, number] {
  const x = dec(strainX);
  const y = dec(strainY);
  const g = dec(shearStrainXY);
  if (layout === 'rectangular') return [strainX, Number(x.plus(y).plus(g).div(2)), strainY];
  const mean = x.div(4).plus(y.times(3).div(4));
  const shear = g.times(D.sqrt(3)).div(4);
  return [strainX, Number(mean.plus(shear)), Number(mean.minus(shear))];
}

/** Nodes and weights of n-point Gauss–Legendre quadrature on [−1, 1] (Newton on Pn). */
export function gaussLegendre(n: number): { nodes: number[]; weights: number[] } {
  const nodes: number[] = [];
  const weights: number[] = [];
  for (let i = 1; i <= n; i++) {
    let x = Math.cos((Math.PI * (i - 0.25)) / (n + 0.5));
    let dp = 0;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      dp = (n * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    nodes.push(x);
    weights.push(2 / ((1 - x * x) * dp * dp));
  }
  return { nodes, weights };
}

const rules = new Map<number, { nodes: number[]; weights: number[] }>();

/** ∫_a^b f(t) dt by n-point Gauss–Legendre. */
export function integrate(f: (t: number) => number, a: number, b: number, n = 24): number {
  let rule = rules.get(n);
  if (rule === undefined) {
    rule = gaussLegendre(n);
    rules.set(n, rule);
  }
  const { nodes, weights } = rule;
  const h = (b - a) / 2;
  const m = (a + b) / 2;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += (weights[i] as number) * f(m + h * (nodes[i] as number));
  return sum * h;
}

export interface PlaneStressReference {
  readonly stressX: number;
  readonly stressY: number;
  readonly shearStressXY: number;
  /** Principal stresses [σ2, σ1] as eigenvalues of the stress tensor (closed form, 400 digits). */
  readonly principal: readonly [number, number];
  readonly vonMises: number;
  readonly outOfPlaneStrain: number;
}

/**
 * Plane stress the other way round from src/: Hooke's law on the x–y components first (40-digit
 * decimal.js), then the principal stresses as eigenvalues of [[σx, τxy], [τxy, σy]] (the closed
 * form of a symmetric 2×2 matrix at 400 digits), and von Mises from the component form √(σx² − σxσy + σy² + 3τxy²).
 */
export function planeStressReference(
  strainX: number,
  strainY: number,
  shearStrainXY: number,
  modulusPascals: number,
  poissonRatio: number,
): PlaneStressReference {
  const e = dec(modulusPascals);
  const nu = dec(poissonRatio);
  const k = e.div(new D(1).minus(nu.times(nu)));
  const sx = k.times(dec(strainX).plus(nu.times(dec(strainY))));
  const sy = k.times(dec(strainY).plus(nu.times(dec(strainX))));
  const txy = e.div(nu.plus(1).times(2)).times(dec(shearStrainXY));
  // The eigenvalues of [[σx, τxy], [τxy, σy]]: c ± √(((σx − σy)/2)² + τxy²), at 400 digits.
  const [x, y, b] = [new E(sx), new E(sy), new E(txy)];
  const c = x.plus(y).div(2);
  const r = x.minus(y).div(2).pow(2).plus(b.pow(2)).sqrt();
  const principal: [number, number] = [c.minus(r).toNumber(), c.plus(r).toNumber()];
  const vonMises = sx.times(sx).minus(sx.times(sy)).plus(sy.times(sy)).plus(txy.times(txy).times(3)).sqrt();
  const ez = nu
    .negated()
    .div(new D(1).minus(nu))
    .times(dec(strainX).plus(dec(strainY)));
  return {
    stressX: Number(sx),
    stressY: Number(sy),
    shearStressXY: Number(txy),
    principal,
    vonMises: Number(vonMises),
    outOfPlaneStrain: Number(ez),
  };
}

/**
 * The least-squares solution of A·x = b by the normal equations AᵀA·x = Aᵀb solved with mathjs
 * `lusolve` at 40 digits (squaring the condition number costs nothing at that precision). Each
 * column is scaled by an exact power of two first, and the unknowns scaled back.
 */
export function leastSquaresReference(rows: readonly (readonly number[])[], b: readonly number[]): number[] {
  const k = (rows[0] as readonly number[]).length;
  const scales = Array.from({ length: k }, (_, j) => scaleFor(rows.map((r) => r[j] as number)));
  const a = math.matrix(rows.map((r) => r.map((x, j) => big(x * (scales[j] as number)))));
  const at = math.transpose(a);
  const bb = math.matrix(b.map((x) => [big(x)]));
  const x = (
    math.lusolve(math.multiply(at, a) as Matrix, math.multiply(at, bb) as Matrix) as Matrix
  ).toArray() as BigNumber[][];
  return x.map((r, j) => Number(r[0]) * (scales[j] as number));
}
