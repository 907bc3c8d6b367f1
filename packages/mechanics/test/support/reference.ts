/**
 * Independent references for the mechanics tests. Nothing here shares code or algebra with src/:
 * - mathjs (private 40-digit BigNumber instance): `eigs` of the 2×2 strain tensor and an LU solve
 *   (`lusolve`) of the rosette leg equations εθ = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ (with
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
// stop eigs at 12 digits: tighten both for a 40-digit reference. Inputs are also scaled by an
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
}

/** Eigen-decomposition of [[εx, γ/2], [γ/2, εy]] by mathjs `eigs` at 40 digits. */
export function strainTensorEigs(strainX: number, strainY: number, shearStrainXY: number): EigenReference {
  const k = scaleFor([strainX, strainY, shearStrainXY]);
  const half = big((shearStrainXY * k) / 2); // tensor shear εxy = γxy/2 (exact: powers of two)
  const tensor = math.matrix([
    [big(strainX * k), half],
    [half, big(strainY * k)],
  ]);
  const r = math.eigs(tensor);
  const pairs = r.eigenvectors.map((e) => ({
    value: Number(e.value as BigNumber) / k,
    vector: ((e.vector as Matrix).toArray() as BigNumber[]).map(Number),
  }));
  pairs.sort((a, b) => a.value - b.value);
  const top = pairs[1]!;
  return {
    values: [pairs[0]!.value, top.value],
    maxVector: [top.vector[0]!, top.vector[1]!],
  };
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
  /** Principal stresses [σ2, σ1] as eigenvalues of the stress tensor (mathjs eigs, 40 digits). */
  readonly principal: readonly [number, number];
  readonly vonMises: number;
  readonly outOfPlaneStrain: number;
}

/**
 * Plane stress the other way round from src/: Hooke's law on the x–y components first (40-digit
 * decimal.js), then the principal stresses as eigenvalues of [[σx, τxy], [τxy, σy]] (mathjs
 * eigs), and von Mises from the component form √(σx² − σxσy + σy² + 3τxy²).
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
  const scale = Math.max(Math.abs(Number(sx)), Math.abs(Number(sy)), Math.abs(Number(txy)));
  const s = scale === 0 ? 1 : 2 ** -Math.floor(Math.log2(scale));
  const tensor = math.matrix([
    [math.bignumber(sx.times(s).toString()), math.bignumber(txy.times(s).toString())],
    [math.bignumber(txy.times(s).toString()), math.bignumber(sy.times(s).toString())],
  ]);
  const values = (math.eigs(tensor, { eigenvectors: false }).values as Matrix).toArray() as BigNumber[];
  const principal = values.map((v) => Number(v) / s).sort((a, b) => a - b) as [number, number];
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
