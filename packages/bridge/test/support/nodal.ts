/**
 * Independent reference for the bridge network: modified nodal analysis of the full five-node
 * circuit (EMF, source resistance, four arms, meter), solved with mathjs `lusolve` in 40-digit
 * BigNumber arithmetic. Nothing here shares code or algebra with src/.
 */
import { all, create, type BigNumber, type Matrix } from 'mathjs';
import { exactDecimalString } from '@bridgework/core';

// mathjs types its factory map as possibly undefined under noUncheckedIndexedAccess; it is always present.
const math = create(all as NonNullable<typeof all>, { number: 'BigNumber', precision: 40 });

const big = (x: number): BigNumber => math.bignumber(exactDecimalString(x));

export interface NodalNetwork {
  readonly armsOhms: readonly [number, number, number, number];
  readonly excitationVolts: number;
  readonly sourceOhms: number; // > 0 here (0 is handled by fixing node A)
  readonly meterOhms: number; // Infinity = meter branch absent
}

export interface NodalSolution {
  readonly outputVolts: number;
  readonly bridgeVolts: number;
  readonly supplyAmps: number;
  readonly armAmps: readonly number[];
  readonly meterAmps: number;
}

/**
 * Nodes: A (E+ after the source resistance), C (S−, R1/R2), D (S+, R3/R4); E− is ground.
 * Branches: EMF–Rs–A, R1: A–C, R2: C–ground, R3: D–ground, R4: A–D, meter: D–C.
 */
export function nodalSolve(n: NodalNetwork): NodalSolution {
  const [r1, r2, r3, r4] = n.armsOhms.map(big) as [BigNumber, BigNumber, BigNumber, BigNumber];
  const e = big(n.excitationVolts);
  const one = math.bignumber(1);
  const g1 = math.divide(one, r1) as BigNumber;
  const g2 = math.divide(one, r2) as BigNumber;
  const g3 = math.divide(one, r3) as BigNumber;
  const g4 = math.divide(one, r4) as BigNumber;
  const gm = Number.isFinite(n.meterOhms)
    ? (math.divide(one, big(n.meterOhms)) as BigNumber)
    : math.bignumber(0);
  const zero = math.bignumber(0);
  const add = (...xs: BigNumber[]): BigNumber => xs.reduce((s, x) => math.add(s, x) as BigNumber, zero);
  const neg = (x: BigNumber): BigNumber => math.unaryMinus(x) as BigNumber;

  let va: BigNumber;
  let vc: BigNumber;
  let vd: BigNumber;
  if (n.sourceOhms > 0) {
    const gs = math.divide(one, big(n.sourceOhms)) as BigNumber;
    const G = math.matrix([
      [add(gs, g1, g4), neg(g1), neg(g4)],
      [neg(g1), add(g1, g2, gm), neg(gm)],
      [neg(g4), neg(gm), add(g3, g4, gm)],
    ]);
    const I = math.matrix([[math.multiply(gs, e) as BigNumber], [zero], [zero]]);
    const v = (math.lusolve(G, I) as Matrix).toArray() as BigNumber[][];
    [va, vc, vd] = [v[0]![0]!, v[1]![0]!, v[2]![0]!];
  } else {
    va = e;
    const G = math.matrix([
      [add(g1, g2, gm), neg(gm)],
      [neg(gm), add(g3, g4, gm)],
    ]);
    const I = math.matrix([[math.multiply(g1, e) as BigNumber], [math.multiply(g4, e) as BigNumber]]);
    const v = (math.lusolve(G, I) as Matrix).toArray() as BigNumber[][];
    [vc, vd] = [v[0]![0]!, v[1]![0]!];
  }
  const sub = (a: BigNumber, b: BigNumber): BigNumber => math.subtract(a, b) as BigNumber;
  const mul = (a: BigNumber, b: BigNumber): BigNumber => math.multiply(a, b) as BigNumber;
  const i1 = mul(sub(va, vc), g1);
  const i4 = mul(sub(va, vd), g4);
  return {
    outputVolts: sub(vd, vc).toNumber(),
    bridgeVolts: va.toNumber(),
    supplyAmps: add(i1, i4).toNumber(),
    armAmps: [i1.toNumber(), mul(vc, g2).toNumber(), mul(vd, g3).toNumber(), i4.toNumber()],
    meterAmps: mul(sub(vd, vc), gm).toNumber(),
  };
}

/** Short-circuit current from S+ to S− (meter replaced by a wire), for the Thevenin resistance. */
export function nodalShortCircuitAmps(n: Omit<NodalNetwork, 'meterOhms'>): number {
  const [r1, r2, r3, r4] = n.armsOhms.map(big) as [BigNumber, BigNumber, BigNumber, BigNumber];
  const one = math.bignumber(1);
  const inv = (x: BigNumber): BigNumber => math.divide(one, x) as BigNumber;
  const [g1, g2, g3, g4] = [inv(r1), inv(r2), inv(r3), inv(r4)];
  const gs = inv(big(n.sourceOhms));
  const e = big(n.excitationVolts);
  const add = (...xs: BigNumber[]): BigNumber =>
    xs.reduce((s, x) => math.add(s, x) as BigNumber, math.bignumber(0));
  // Nodes A and X (C and D tied together).
  const G = math.matrix([
    [add(gs, g1, g4), math.unaryMinus(add(g1, g4)) as BigNumber],
    [math.unaryMinus(add(g1, g4)) as BigNumber, add(g1, g2, g3, g4)],
  ]);
  const I = math.matrix([[math.multiply(gs, e) as BigNumber], [math.bignumber(0)]]);
  const v = (math.lusolve(G, I) as Matrix).toArray() as BigNumber[][];
  const va = v[0]![0]!;
  const vx = v[1]![0]!;
  // Current arriving at D from R4 minus what leaves through R3 flows through the short to C.
  const intoD = math.subtract(math.multiply(math.subtract(va, vx), g4), math.multiply(vx, g3)) as BigNumber;
  return intoD.toNumber();
}
