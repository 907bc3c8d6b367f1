/**
 * The one independent nodal solver of the test suites: modified nodal analysis of any network of
 * resistors between named nodes, ideal voltage sources and injected currents, solved with mathjs
 * `lusolve` in 40-digit BigNumber arithmetic. It shares no code or algebra with any package's
 * `src/` (no bridge formula, no star–delta transform): each wire, lead, arm, shunt, source
 * resistance and meter is a resistor between two nodes, written from the circuit's description.
 *
 * The Wheatstone-bridge helpers below build the bridge of docs/conventions.md (R1: E+–S−,
 * R2: S−–E−, R3: S+–E−, R4: E+–S+; E− is ground) on the general solver.
 */
import { all, create, type BigNumber, type Matrix } from 'mathjs';
import { exactDecimalString } from '@bridgework/core';

// mathjs types its factory map as possibly undefined under noUncheckedIndexedAccess; it is always present.
const math = create(all as NonNullable<typeof all>, { number: 'BigNumber', precision: 40 });

/** A double as the exact 40-digit number it is (not its shortest decimal string). */
export const big = (x: number): BigNumber => math.bignumber(exactDecimalString(x));
const zero = math.bignumber(0);
const one = math.bignumber(1);
const add = (x: BigNumber, y: BigNumber): BigNumber => math.add(x, y) as BigNumber;
/** r·(1 + x) at 40 digits from the doubles r and x (no rounding to a double between). */
export const bigScaled = (r: number, x: number): BigNumber =>
  math.multiply(big(r), add(one, big(x))) as BigNumber;
const sub = (x: BigNumber, y: BigNumber): BigNumber => math.subtract(x, y) as BigNumber;
const div = (x: BigNumber, y: BigNumber): BigNumber => math.divide(x, y) as BigNumber;

/** A resistor between two named nodes: 0 Ω is a wire (its nodes merge), `Infinity` is absent. */
export interface Resistor {
  readonly a: string;
  readonly b: string;
  readonly ohms: number;
  /**
   * The resistance at 40 digits when the double `ohms` would round it (an arm R·(1 + x) formed
   * from the doubles R and x, say: rounding it changes the arm's ratio by about ε, which is
   * 1e-12 of a cell ratio of 1e-4). `ohms` still says whether it is a wire or absent.
   */
  readonly exactOhms?: BigNumber;
}

/** An ideal voltage source: V(plus) − V(minus) = volts. */
export interface VoltageSource {
  readonly plus: string;
  readonly minus: string;
  readonly volts: number;
}

/** A current driven into a node from ground, in A. */
export interface Injection {
  readonly node: string;
  readonly amps: number;
}

/** A network and the node taken as 0 V. */
export interface Network {
  readonly resistors: readonly Resistor[];
  readonly sources?: readonly VoltageSource[];
  readonly injections?: readonly Injection[];
  readonly ground: string;
}

/** The solved network: node voltages and source currents, at 40 digits. */
export interface NetworkSolution {
  /** V(node) relative to ground. */
  volts(node: string): BigNumber;
  /** Current through source `i`, flowing out of its `plus` terminal into the network, in A. */
  sourceAmps(i: number): BigNumber;
  /** Current through a resistor from `a` to `b` (0 for an absent one), in A. */
  amps(r: Resistor): BigNumber;
}

/** Solves a network by modified nodal analysis (one unknown per node and per voltage source). */
export function solveNetwork(network: Network): NetworkSolution {
  // Wires merge their nodes (union–find); ground stays its class's representative.
  const parent = new Map<string, string>();
  const find = (n: string): string => {
    const p = parent.get(n);
    return p === undefined || p === n ? n : find(p);
  };
  for (const r of network.resistors) {
    if (r.ohms !== 0) continue;
    const a = find(r.a);
    const b = find(r.b);
    if (a === b) continue;
    if (b === find(network.ground)) parent.set(a, b);
    else parent.set(b, a);
  }
  const ground = find(network.ground);
  const resistors = network.resistors
    .filter((r) => r.ohms !== 0 && r.ohms !== Infinity)
    .map((r) => ({ a: find(r.a), b: find(r.b), g: div(one, r.exactOhms ?? big(r.ohms)) }))
    .filter((r) => r.a !== r.b);
  const sources = (network.sources ?? []).map((s) => ({
    plus: find(s.plus),
    minus: find(s.minus),
    volts: s.volts,
  }));
  const injections = (network.injections ?? []).map((i) => ({ node: find(i.node), amps: i.amps }));
  const named = [
    ...resistors.flatMap((r) => [r.a, r.b]),
    ...sources.flatMap((s) => [s.plus, s.minus]),
    ...injections.map((i) => i.node),
  ];
  const nodes = [...new Set(named)].filter((n) => n !== ground);
  const index = new Map(nodes.map((n, i) => [n, i]));
  const size = nodes.length + sources.length;
  const g = Array.from({ length: size }, () => new Array<BigNumber>(size).fill(zero));
  const rhs = new Array<BigNumber>(size).fill(zero);
  const stamp = (i: number | undefined, j: number | undefined, v: BigNumber): void => {
    if (i !== undefined && j !== undefined) g[i]![j] = add(g[i]![j]!, v);
  };
  for (const r of resistors) {
    const i = index.get(r.a);
    const j = index.get(r.b);
    stamp(i, i, r.g);
    stamp(j, j, r.g);
    stamp(i, j, math.unaryMinus(r.g) as BigNumber);
    stamp(j, i, math.unaryMinus(r.g) as BigNumber);
  }
  sources.forEach((s, k) => {
    const row = nodes.length + k;
    const p = index.get(s.plus);
    const m = index.get(s.minus);
    // The source current leaves `plus` into the network: it is drawn from `plus`'s equation.
    stamp(p, row, math.unaryMinus(one) as BigNumber);
    stamp(m, row, one);
    stamp(row, p, one);
    stamp(row, m, math.unaryMinus(one) as BigNumber);
    rhs[row] = big(s.volts);
  });
  for (const inj of injections) {
    const i = index.get(inj.node);
    if (i !== undefined) rhs[i] = add(rhs[i]!, big(inj.amps));
  }
  const x =
    size === 0
      ? []
      : ((
          math.lusolve(math.matrix(g), math.matrix(rhs.map((v) => [v]))) as Matrix
        ).toArray() as BigNumber[][]);
  const volts = (node: string): BigNumber => {
    const n = find(node);
    if (n === ground) return zero;
    const i = index.get(n);
    if (i === undefined) throw new Error(`node ${node} is not connected`);
    return x[i]![0]!;
  };
  return {
    volts,
    sourceAmps: (k) => x[nodes.length + k]![0]!,
    amps: (r) =>
      r.ohms === Infinity
        ? zero
        : r.ohms === 0
          ? zero
          : div(sub(volts(r.a), volts(r.b)), r.exactOhms ?? big(r.ohms)),
  };
}

/** A network with one ideal EMF of `volts` from `minus` (ground) to `plus`. */
export interface Circuit {
  readonly resistors: readonly Resistor[];
  readonly plus: string;
  readonly minus: string;
  readonly volts: number;
}

/** Node voltages relative to `minus`, as 40-digit numbers, of a network driven by one EMF. */
export function solveCircuit(circuit: Circuit): (node: string) => BigNumber {
  const solution = solveNetwork({
    resistors: circuit.resistors,
    sources: [{ plus: circuit.plus, minus: circuit.minus, volts: circuit.volts }],
    ground: circuit.minus,
  });
  return (node) => solution.volts(node);
}

/** Difference of two 40-digit node voltages divided by a third difference, as a double. */
export function ratioOf(
  voltage: (node: string) => BigNumber,
  [plus, minus]: readonly [string, string],
  [refPlus, refMinus]: readonly [string, string],
): number {
  return div(sub(voltage(plus), voltage(minus)), sub(voltage(refPlus), voltage(refMinus))).toNumber();
}

// --- The Wheatstone bridge of docs/conventions.md on the general solver -----------------------

/** A bridge: four arms, an EMF behind a source resistance, a meter across S+ and S−. */
export interface BridgeNetwork {
  readonly armsOhms: readonly [number, number, number, number];
  readonly excitationVolts: number;
  /** ≥ 0; 0 puts the EMF straight across E+ and E−. */
  readonly sourceOhms: number;
  /** `Infinity`: no meter. */
  readonly meterOhms: number;
}

/** The bridge's state, as doubles rounded from the 40-digit solution. */
export interface BridgeState {
  /** V(S+) − V(S−), V. */
  readonly outputVolts: number;
  /** V(E+) − V(E−), V. */
  readonly bridgeVolts: number;
  /** Current from the EMF, A. */
  readonly supplyAmps: number;
  /** Current in R1…R4 from the E+ side towards the E− side, A. */
  readonly armAmps: readonly number[];
  /** Current through the meter from S+ to S−, A. */
  readonly meterAmps: number;
  /** (V(S+) + V(S−))/2, V. */
  readonly commonModeVolts: number;
}

function bridgeResistors(n: Omit<BridgeNetwork, 'excitationVolts'>): Resistor[] {
  const [r1, r2, r3, r4] = n.armsOhms;
  return [
    { a: 'E+', b: 'S-', ohms: r1 },
    { a: 'S-', b: 'E-', ohms: r2 },
    { a: 'S+', b: 'E-', ohms: r3 },
    { a: 'E+', b: 'S+', ohms: r4 },
    { a: 'emf', b: 'E+', ohms: n.sourceOhms },
    { a: 'S+', b: 'S-', ohms: n.meterOhms },
  ];
}

/** Solves the bridge with its EMF (nodes `emf`, `E+`, `E-` = ground, `S+`, `S-`). */
export function solveBridgeNetwork(n: BridgeNetwork): BridgeState {
  const resistors = bridgeResistors(n);
  const s = solveNetwork({
    resistors,
    sources: [{ plus: 'emf', minus: 'E-', volts: n.excitationVolts }],
    ground: 'E-',
  });
  const [arm1, arm2, arm3, arm4, , meter] = resistors as [
    Resistor,
    Resistor,
    Resistor,
    Resistor,
    Resistor,
    Resistor,
  ];
  return {
    outputVolts: sub(s.volts('S+'), s.volts('S-')).toNumber(),
    bridgeVolts: s.volts('E+').toNumber(),
    supplyAmps: s.sourceAmps(0).toNumber(),
    armAmps: [s.amps(arm1), s.amps(arm2), s.amps(arm3), s.amps(arm4)].map((a) => a.toNumber()),
    meterAmps: s.amps(meter).toNumber(),
    commonModeVolts: (div(add(s.volts('S+'), s.volts('S-')), math.bignumber(2)) as BigNumber).toNumber(),
  };
}

/** Current from S+ to S− through a wire in place of the meter (for the Thevenin resistance), A. */
export function bridgeShortCircuitAmps(n: Omit<BridgeNetwork, 'meterOhms'>): number {
  // A 0 Ω meter is a wire: S+ and S− become one node.
  const s = solveNetwork({
    resistors: bridgeResistors({ ...n, meterOhms: 0 }),
    sources: [{ plus: 'emf', minus: 'E-', volts: n.excitationVolts }],
    ground: 'E-',
  });
  // The wire carries what arrives at the S+ side through R4 and does not leave through R3.
  const fromR4 = div(sub(s.volts('E+'), s.volts('S+')), big(n.armsOhms[3]));
  const intoR3 = div(s.volts('S+'), big(n.armsOhms[2]));
  return sub(fromR4, intoR3).toNumber();
}

/**
 * V(S+) − V(S−) per ampere injected into a signal node with the EMF shorted (its source
 * resistance kept): the transimpedance an amplifier's input current noise sees, Ω.
 */
export function bridgeTransimpedance(
  n: Omit<BridgeNetwork, 'excitationVolts' | 'meterOhms'>,
  node: 'S+' | 'S-',
  sign: 1 | -1,
): number {
  const s = solveNetwork({
    resistors: bridgeResistors({ ...n, meterOhms: Infinity }),
    sources: [{ plus: 'emf', minus: 'E-', volts: 0 }],
    injections: [{ node, amps: sign }],
    ground: 'E-',
  });
  return sub(s.volts('S+'), s.volts('S-')).toNumber();
}
