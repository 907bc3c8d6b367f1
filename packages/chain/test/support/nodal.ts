/**
 * Independent reference for the bridge as seen from the amplifier: nodal analysis of the nodes
 * E+ (A), S− (C) and S+ (D), with E− as ground, solved with mathjs `lusolve` in 40-digit
 * BigNumber arithmetic. It gives node potentials for an excitation EMF behind a source resistance
 * (with a zero source resistance, node A is fixed at the EMF), and for test currents injected into
 * S+ or S− (EMF shorted). Shares nothing with src/.
 */
import { all, create, type BigNumber, type Matrix } from 'mathjs';
import { exactDecimalString } from '@bridgework/core';

const math = create(all as NonNullable<typeof all>, { number: 'BigNumber', precision: 40 });
const big = (x: number): BigNumber => math.bignumber(exactDecimalString(x));
const zero = math.bignumber(0);
const one = math.bignumber(1);
const add = (...xs: BigNumber[]): BigNumber => xs.reduce((s, x) => math.add(s, x) as BigNumber, zero);
const sub = (x: BigNumber, y: BigNumber): BigNumber => math.subtract(x, y) as BigNumber;
const mul = (x: BigNumber, y: BigNumber): BigNumber => math.multiply(x, y) as BigNumber;
const neg = (x: BigNumber): BigNumber => math.unaryMinus(x) as BigNumber;
const inv = (x: BigNumber): BigNumber => math.divide(one, x) as BigNumber;

export interface Network {
  readonly armsOhms: readonly [number, number, number, number];
  /** ≥ 0; with 0 the node E+ is held at the EMF. */
  readonly sourceOhms: number;
}

/** Node potentials [V(E+), V(S−), V(S+)] (BigNumber) for an EMF and currents injected into S− and S+. */
function solve(
  n: Network,
  e: number,
  intoNegative: number,
  intoPositive: number,
): [BigNumber, BigNumber, BigNumber] {
  const [g1, g2, g3, g4] = n.armsOhms.map((r) => inv(big(r))) as [BigNumber, BigNumber, BigNumber, BigNumber];
  const emf = big(e);
  if (n.sourceOhms === 0) {
    const G = math.matrix([
      [add(g1, g2), zero],
      [zero, add(g3, g4)],
    ]);
    const I = math.matrix([[add(big(intoNegative), mul(g1, emf))], [add(big(intoPositive), mul(g4, emf))]]);
    const v = (math.lusolve(G, I) as Matrix).toArray() as BigNumber[][];
    return [emf, v[0]![0]!, v[1]![0]!];
  }
  const gs = inv(big(n.sourceOhms));
  const G = math.matrix([
    [add(gs, g1, g4), neg(g1), neg(g4)],
    [neg(g1), add(g1, g2), zero],
    [neg(g4), zero, add(g3, g4)],
  ]);
  const I = math.matrix([[mul(gs, emf)], [big(intoNegative)], [big(intoPositive)]]);
  const v = (math.lusolve(G, I) as Matrix).toArray() as BigNumber[][];
  return [v[0]![0]!, v[1]![0]!, v[2]![0]!];
}

/** V(S+) − V(S−) per ampere injected into S+ (EMF shorted), at 40 digits. */
export function positiveTransimpedance(n: Network): number {
  const [, c, d] = solve(n, 0, 0, 1);
  return sub(d, c).toNumber();
}

/** V(S+) − V(S−) per ampere drawn out of S− (EMF shorted), at 40 digits. */
export function negativeTransimpedance(n: Network): number {
  const [, c, d] = solve(n, 0, -1, 0);
  return sub(d, c).toNumber();
}

/** Output and common mode for an EMF: [V(S+) − V(S−), (V(S+) + V(S−))/2, V(E+)], at 40 digits. */
export function outputAndCommonMode(n: Network, e: number): [number, number, number] {
  const [a, c, d] = solve(n, e, 0, 0);
  return [sub(d, c).toNumber(), (math.divide(add(c, d), 2) as BigNumber).toNumber(), a.toNumber()];
}
