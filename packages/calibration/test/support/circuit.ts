/**
 * Independent reference for shunted bridges: modified nodal analysis of a resistor network with
 * one ideal EMF, solved by mathjs `lusolve` in 40-digit BigNumber arithmetic. It shares no code or
 * algebra with src/ (no star–delta transform, no bridge formula): each physical wire, lead, gauge
 * and shunt is a resistor between named nodes.
 */
import { all, create, type BigNumber, type Matrix } from 'mathjs';
import { exactDecimalString } from '@bridgework/core';

// mathjs types its factory map as possibly undefined under noUncheckedIndexedAccess; it is always present.
const math = create(all as NonNullable<typeof all>, { number: 'BigNumber', precision: 40 });
const big = (x: number): BigNumber => math.bignumber(exactDecimalString(x));

/** A resistor between two named nodes. */
export interface Resistor {
  readonly a: string;
  readonly b: string;
  readonly ohms: number;
}

/**
 * A network: resistors (0 Ω ones are shorts that merge their nodes), and an ideal EMF of `volts`
 * from node `minus` (ground) to node `plus`.
 */
export interface Circuit {
  readonly resistors: readonly Resistor[];
  readonly plus: string;
  readonly minus: string;
  readonly volts: number;
}

/** Node voltages relative to `minus`, as 40-digit numbers. */
export function solveCircuit(circuit: Circuit): (node: string) => BigNumber {
  // Shorts: merge their nodes (union–find), then solve the remaining resistors.
  const parent = new Map<string, string>();
  const find = (n: string): string => {
    const p = parent.get(n);
    return p === undefined || p === n ? n : find(p);
  };
  for (const r of circuit.resistors) {
    if (r.ohms === 0) {
      const a = find(r.a);
      const b = find(r.b);
      // Keep ground as its class's representative.
      if (a !== b) parent.set(b === circuit.minus ? a : b, b === circuit.minus ? b : a);
    }
  }
  const minus = find(circuit.minus);
  const resistors = circuit.resistors
    .filter((r) => r.ohms !== 0)
    .map((r) => ({ a: find(r.a), b: find(r.b), ohms: r.ohms }))
    .filter((r) => r.a !== r.b);
  const nodes = [...new Set(resistors.flatMap((r) => [r.a, r.b]))].filter((n) => n !== minus);
  const index = new Map(nodes.map((n, i) => [n, i]));
  const size = nodes.length + 1; // plus one unknown: the EMF's current
  const zero = math.bignumber(0);
  const g = Array.from({ length: size }, () => new Array<BigNumber>(size).fill(zero));
  const rhs = new Array<BigNumber>(size).fill(zero);
  const add = (i: number, j: number, v: BigNumber): void => {
    g[i]![j] = math.add(g[i]![j]!, v) as BigNumber;
  };
  for (const r of resistors) {
    const conductance = math.divide(math.bignumber(1), big(r.ohms)) as BigNumber;
    const i = index.get(r.a);
    const j = index.get(r.b);
    if (i !== undefined) add(i, i, conductance);
    if (j !== undefined) add(j, j, conductance);
    if (i !== undefined && j !== undefined) {
      add(i, j, math.unaryMinus(conductance) as BigNumber);
      add(j, i, math.unaryMinus(conductance) as BigNumber);
    }
  }
  const p = index.get(find(circuit.plus))!;
  const k = size - 1;
  add(p, k, math.bignumber(1));
  add(k, p, math.bignumber(1));
  rhs[k] = big(circuit.volts);
  const v = (
    math.lusolve(math.matrix(g), math.matrix(rhs.map((x) => [x]))) as Matrix
  ).toArray() as BigNumber[][];
  return (node) => (find(node) === minus ? zero : v[index.get(find(node))!]![0]!);
}

/** Difference of two 40-digit node voltages divided by a third difference, as a double. */
export function ratioOf(
  voltage: (node: string) => BigNumber,
  [plus, minus]: readonly [string, string],
  [refPlus, refMinus]: readonly [string, string],
): number {
  const num = math.subtract(voltage(plus), voltage(minus)) as BigNumber;
  const den = math.subtract(voltage(refPlus), voltage(refMinus)) as BigNumber;
  return (math.divide(num, den) as BigNumber).toNumber();
}
