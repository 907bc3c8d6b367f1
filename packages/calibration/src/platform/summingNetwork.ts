import {
  BridgeworkError,
  checkNonNegative,
  checkOneOf,
  checkOptions,
  checkPositive,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { checkBoundedArray } from '../internal/checks.js';
import { factorDesign, solveDesign } from '../internal/leastSquares.js';

/** Where a cell's excitation trim resistor sits in an analog summing junction. */
export type TrimPlacement = 'positive-excitation' | 'both-excitation';

/** The topology of an analog summing junction (shared by the summing-network functions). */
export interface SummingNetworkOptions {
  /** Each cell's bridge resistance R_i in Ω, 1 mΩ to 1 TΩ: four arms of R_i at zero load. One entry per cell. */
  readonly cellOhms: readonly number[];
  /**
   * `'both-excitation'` (default): the trim is split equally between the cell's +E and −E leads,
   * which keeps its common mode; `'positive-excitation'`: the whole trim in the +E lead.
   */
  readonly trimPlacement?: TrimPlacement;
  /** The resistor from each cell's +S and from its −S to the common signal buses, Ω (≥ 0). Default 0 (signals paralleled directly). */
  readonly summingOhms?: number;
  /** The meter's input resistance across the buses, Ω (≥ 1e-3, or Infinity). Default Infinity. */
  readonly meterOhms?: number;
}

/** Options of {@link summingNetworkRatio}. */
export interface SummingNetworkRatioOptions extends SummingNetworkOptions {
  /** Each cell's trim resistor, Ω (≥ 0). */
  readonly trimsOhms: readonly number[];
  /** Each cell's own output ratio (V/V), as it reads alone at full excitation: the load state. */
  readonly cellRatios: readonly number[];
}

/** Options of {@link fitSummingTrims}. */
export interface SummingTrimsOptions extends SummingNetworkOptions {
  /**
   * The eccentricity test: for each position of the test load, every cell's own output ratio (V/V,
   * zero subtracted, each cell read alone at full excitation). At least as many positions as cells.
   */
  readonly cellRatios: readonly (readonly number[])[];
  /** Further positions (the centre, say) evaluated with the trims, not used to find them. */
  readonly checkRatios?: readonly (readonly number[])[];
}

/** Trims for an analog summing junction (see {@link fitSummingTrims}). */
export interface SummingTrims {
  /** Each cell's trim resistor, Ω (≥ 0; the reference cell's is 0). */
  readonly trimsOhms: readonly number[];
  /** The cell left untrimmed (the one whose signal needs the most excitation). */
  readonly referenceCell: number;
  /** The summed output ratio (V/V of the supply) with the test load at each position. */
  readonly positionRatios: readonly number[];
  /** (largest − smallest position output)/mean, as a fraction: 0 to rounding when positions = cells. */
  readonly positionSpreadFraction: number;
  /** Each check position's output and its difference from the mean position output, as a fraction. */
  readonly checks: readonly {
    /** The summed output ratio with the load at the check position, V/V of the supply. */
    readonly ratio: number;
    /** (ratio − mean position output)/mean position output, as a fraction. */
    readonly differenceFraction: number;
  }[];
  /** Newton iterations taken. */
  readonly iterations: number;
}

interface Network {
  readonly cells: number;
  readonly cellOhms: readonly number[];
  readonly both: boolean;
  readonly summingOhms: number;
  readonly meterOhms: number;
}

const networkKeys = ['cellOhms', 'trimPlacement', 'summingOhms', 'meterOhms'] as const;

/** An open meter (Infinity) or at least 1 mΩ. */
function meterOhmsChecked(ohms: number): number {
  return ohms === Infinity ? ohms : checkRange('meterOhms', ohms, { min: 1e-3 });
}

function readNetwork(o: Record<string, unknown>): Network {
  const cellOhms = checkBoundedArray('cellOhms', o['cellOhms']).map((r, i) =>
    checkRange(`cellOhms[${i}]`, checkPositive(`cellOhms[${i}]`, r), { min: 1e-3, max: 1e12 }),
  );
  if (cellOhms.length < 2) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`cellOhms\` must list at least two cells; got ${cellOhms.length}`,
      {
        param: 'cellOhms',
        value: cellOhms.length,
        limit: 2,
      },
    );
  }
  const placement =
    o['trimPlacement'] === undefined
      ? 'both-excitation'
      : checkOneOf('trimPlacement', o['trimPlacement'], ['positive-excitation', 'both-excitation'] as const);
  const summingOhms =
    o['summingOhms'] === undefined
      ? 0
      : checkRange('summingOhms', checkNonNegative('summingOhms', o['summingOhms']), { max: 1e12 });
  const meterOhms =
    o['meterOhms'] === undefined
      ? Infinity
      : meterOhmsChecked(checkPositive('meterOhms', o['meterOhms'], { allowInfinity: true }));
  return { cells: cellOhms.length, cellOhms, both: placement === 'both-excitation', summingOhms, meterOhms };
}

/** Solves the dense system g (u×(u+1), augmented) by Gaussian elimination with partial pivoting. */
function eliminate(g: Float64Array, u: number): Float64Array {
  const w = u + 1;
  for (let k = 0; k < u; k++) {
    let pivot = k;
    for (let r = k + 1; r < u; r++)
      if (Math.abs(g[r * w + k] as number) > Math.abs(g[pivot * w + k] as number)) pivot = r;
    if (pivot !== k) {
      for (let c = k; c <= u; c++) {
        const tmp = g[k * w + c] as number;
        g[k * w + c] = g[pivot * w + c] as number;
        g[pivot * w + c] = tmp;
      }
    }
    const d = g[k * w + k] as number;
    for (let r = k + 1; r < u; r++) {
      const f = (g[r * w + k] as number) / d;
      if (f === 0) continue;
      for (let c = k; c <= u; c++) g[r * w + c] = (g[r * w + c] as number) - f * (g[k * w + c] as number);
    }
  }
  const v = new Float64Array(u);
  for (let r = u - 1; r >= 0; r--) {
    let sum = g[r * w + u] as number;
    for (let c = r + 1; c < u; c++) sum -= (g[r * w + c] as number) * (v[c] as number);
    v[r] = sum / (g[r * w + r] as number);
  }
  return v;
}

/**
 * The summed output per volt of supply, by nodal analysis of the whole junction; zero-ohm
 * elements merge their nodes. Cell i is a bridge with arms R1 = R3 = R_i(1 + x_i),
 * R2 = R4 = R_i(1 − x_i), whose own ratio (R1R3 − R2R4)/((R1 + R2)(R3 + R4)) is exactly x_i.
 *
 * Two solves, so the small output is never the difference of two large node voltages: first the
 * unloaded junction G₀·v₀ = b₀ (every cell balanced, so the two buses are at the same voltage by
 * symmetry), then the change u = v − v₀ from G(x)·u = −Σ δg·(v₀_a − v₀_b) over the arms, with
 * δg = g(x) − g(0) formed directly (−x/(R(1 + x)), x/(R(1 − x))). The output is u(+bus) − u(−bus),
 * of the size of the loads' effect, accurate to about κ(G)·ε relative.
 */
function solveNetwork(net: Network, trims: readonly number[], ratios: readonly number[]): number {
  // Node numbering: 0 = E+ (1 V), 1 = E− (0 V), then per cell T, B, P (S+), Q (S−), then the buses.
  const n = net.cells;
  const busP = 2 + 4 * n;
  const busM = busP + 1;
  const total = busM + 1;
  const parent = Array.from({ length: total }, (_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i] as number)));
  const merge = (a: number, b: number): void => {
    const ra = find(a);
    const rb = find(b);
    if (ra === rb) return;
    // Keep the fixed nodes (0, 1) as roots.
    if (rb < 2) parent[ra] = rb;
    else parent[rb] = ra;
  };
  /** [node a, node b, conductance at zero load, its change with load]. */
  const elements: [number, number, number, number][] = [];
  const add = (a: number, b: number, ohms: number, delta = 0): void => {
    if (ohms === 0) merge(a, b);
    else if (ohms !== Infinity) elements.push([a, b, 1 / ohms, delta]);
  };
  for (let i = 0; i < n; i++) {
    const base = 2 + 4 * i;
    const [t, b, p, q] = [base, base + 1, base + 2, base + 3];
    const r = net.cellOhms[i] as number;
    const x = ratios[i] as number;
    const trim = trims[i] as number;
    if (net.both) {
      add(0, t, trim / 2);
      add(b, 1, trim / 2);
    } else {
      add(0, t, trim);
      add(b, 1, 0);
    }
    const up = -x / (r * (1 + x)); // 1/(R(1 + x)) − 1/R
    const down = x / (r * (1 - x)); // 1/(R(1 − x)) − 1/R
    add(t, q, r, up); // R1: E+ side to S−
    add(q, b, r, down); // R2: S− to E−
    add(b, p, r, up); // R3: E− to S+
    add(p, t, r, down); // R4: S+ to E+ side
    add(p, busP, net.summingOhms);
    add(q, busM, net.summingOhms);
  }
  add(busP, busM, net.meterOhms);
  const roots = [...new Set(Array.from({ length: total }, (_, i) => find(i)))].filter((r) => r > 1);
  const index = new Map(roots.map((r, k) => [r, k]));
  const u = roots.length;
  const w = u + 1;
  const fixed = (node: number): number | undefined => (node === 0 ? 1 : node === 1 ? 0 : undefined);
  const stamp = (loaded: boolean): Float64Array => {
    const g = new Float64Array(u * w);
    for (const [a0, b0, c0, delta] of elements) {
      const a = find(a0);
      const b = find(b0);
      if (a === b) continue;
      const c = loaded ? c0 + delta : c0;
      for (const [x, y] of [
        [a, b],
        [b, a],
      ] as const) {
        const row = index.get(x);
        if (row === undefined) continue;
        g[row * w + row] = (g[row * w + row] as number) + c;
        const col = index.get(y);
        if (col !== undefined) g[row * w + col] = (g[row * w + col] as number) - c;
        else if (!loaded) g[row * w + u] = (g[row * w + u] as number) + c * (fixed(y) as number);
      }
    }
    return g;
  };
  const v0 = eliminate(stamp(false), u);
  const voltage0 = (node: number): number => fixed(node) ?? (v0[index.get(node) as number] as number);
  const g = stamp(true);
  for (const [a0, b0, , delta] of elements) {
    if (delta === 0) continue;
    const a = find(a0);
    const b = find(b0);
    if (a === b) continue;
    const drop = voltage0(a) - voltage0(b);
    const ra = index.get(a);
    const rb = index.get(b);
    if (ra !== undefined) g[ra * w + u] = (g[ra * w + u] as number) - delta * drop;
    if (rb !== undefined) g[rb * w + u] = (g[rb * w + u] as number) + delta * drop;
  }
  const change = eliminate(g, u);
  const at = (node: number): number => {
    const root = find(node);
    return fixed(root) === undefined ? (change[index.get(root) as number] as number) : 0;
  };
  const output = at(busP) - at(busM);
  if (!Number.isFinite(output)) {
    throw new BridgeworkError(
      'out-of-range',
      '`cellOhms` and the trims, summing and meter resistances must form a junction whose node equations are solvable in doubles (resistances from 1 mΩ to 1 TΩ)',
      { param: 'cellOhms' },
    );
  }
  return output;
}

function checkCellRatios(param: string, value: unknown, cells: number): number[] {
  return checkBoundedArray(param, value, cells).map((x, i) =>
    checkRange(`${param}[${i}]`, x, { min: -0.5, max: 0.5, minExclusive: true, maxExclusive: true }),
  );
}

/**
 * The output of an analog summing junction of load cells, per volt of supply, solved exactly
 * through the network.
 *
 * @remarks
 * Topology: one supply (ideal, 1 V; the result scales with it) feeds every cell's excitation
 * through its trim resistor (split equally between the +E and −E leads, or all in +E); each cell's
 * +S and −S connect through `summingOhms` to two buses, read by a meter of `meterOhms`. Each cell
 * is a bridge of four arms R_i(1 ± x_i) whose own ratio is exactly x_i (`cellRatios`), so the
 * cell's input and output resistances R_i(1 − x_i²) change with load, as they do. The node
 * equations of the whole junction are solved by Gaussian elimination with partial pivoting, first
 * unloaded and then for the change the loads make, so the output is computed directly rather
 * than as the difference of two bus voltages near half the supply (exact but for rounding: within
 * 1e-12 relative, or 1e-12 of the largest cell ratio when the cells' outputs cancel, in the tests
 * against a 40-digit solve). The output is
 * a rational function of the cell ratios, not their weighted sum: currents that one cell's
 * imbalance drives through the others make it nonlinear at second order.
 *
 * @param options - Topology, trims and each cell's ratio.
 * @returns V(+bus) − V(−bus) per volt of supply.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` by the options
 *   rule; `invalid-shape` for lists that do not match `cellOhms` or fewer than two cells;
 *   `not-positive`, `negative`, `not-finite`, `out-of-range` for bad numbers (ratios in (−0.5, 0.5)).
 * @example
 * ```ts
 * summingNetworkRatio({ cellOhms: [350, 350], trimsOhms: [0, 0], cellRatios: [2e-3, 0] }); // 1e-3
 * ```
 */
export function summingNetworkRatio(options: SummingNetworkRatioOptions): number {
  const o = checkOptions('options', options, {
    known: [...networkKeys, 'trimsOhms', 'cellRatios'],
    required: ['cellOhms', 'trimsOhms', 'cellRatios'],
  });
  const net = readNetwork(o);
  const trims = checkBoundedArray('trimsOhms', o['trimsOhms'], net.cells).map((t, i) =>
    checkRange(`trimsOhms[${i}]`, checkNonNegative(`trimsOhms[${i}]`, t), { max: 1e12 }),
  );
  return solveNetwork(net, trims, checkCellRatios('cellRatios', o['cellRatios'], net.cells));
}

/**
 * Trim resistors that make an analog summing junction read the same test load alike at every
 * position (corner adjustment), solved through the network exactly.
 *
 * @remarks
 * An analog junction cannot scale a cell up, only reduce its excitation: the cell that needs the
 * most excitation is left untrimmed and the others get series trims. The trims t (N − 1 unknowns,
 * the reference cell's fixed at 0) solve O_p(t) = O_1(t) for every position p, where O_p is the
 * junction's exact output ({@link summingNetworkRatio}) with the test load at p, by Newton's method
 * with a central-difference Jacobian from a start taken from the digital factors (a Jacobian
 * error slows Newton but does not move its root, which is where the exact outputs agree); with
 * more positions than cells, by Gauss–Newton in the least-squares sense. It stops when every
 * position output agrees with the first within 1e-13 relative (or the steps stop shrinking below
 * 1e-12 of the cell resistance), at most 50 iterations (`not-converged` otherwise). Should a trim
 * come out negative, the cell that needs it becomes the reference and the solve is repeated.
 *
 * The check positions (the centre, typically) are then evaluated with the trims: their difference
 * from the corners' mean is reported, not hidden. It is the junction's second-order effect: the
 * cells' input and output resistances change as R(1 − x²) with load, and one cell's imbalance
 * drives currents through the others, so the relative difference shrinks roughly as the load
 * squared (verified in the tests at two load levels).
 *
 * @param options - Topology, the test's cell ratios per position, check positions.
 * @returns The trims, the reference cell, every position's output and the check differences.
 * @throws {@link @bridgework/core!BridgeworkError} as {@link summingNetworkRatio}; `too-few-points`
 *   for fewer positions than cells; `singular` when the positions cannot tell the cells apart;
 *   `no-solution` when no set of non-negative trims equalises the positions; `not-converged`.
 * @example
 * ```ts
 * const trims = fitSummingTrims({
 *   cellOhms: [350, 350, 350, 350],
 *   cellRatios: [[2.02e-3, 0, 0, 0], [0, 2e-3, 0, 0], [0, 0, 1.99e-3, 0], [0, 0, 0, 2.01e-3]],
 * });
 * trims.trimsOhms; // [≈ 10.5, ≈ 3.5, 0, ≈ 7] (Ω; cell 3 is the reference)
 * ```
 */
export function fitSummingTrims(options: SummingTrimsOptions): SummingTrims {
  const o = checkOptions('options', options, {
    known: [...networkKeys, 'cellRatios', 'checkRatios'],
    required: ['cellOhms', 'cellRatios'],
  });
  const net = readNetwork(o);
  const n = net.cells;
  if (!Array.isArray(o['cellRatios'])) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`cellRatios\` must be an array of positions; got ${formatValue(o['cellRatios'])}`,
      {
        param: 'cellRatios',
      },
    );
  }
  const positions = (o['cellRatios'] as unknown[]).map((row, p) =>
    checkCellRatios(`cellRatios[${p}]`, row, n),
  );
  if (o['checkRatios'] !== undefined && !Array.isArray(o['checkRatios'])) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`checkRatios\` must be an array of positions; got ${formatValue(o['checkRatios'])}`,
      {
        param: 'checkRatios',
      },
    );
  }
  const checks = ((o['checkRatios'] ?? []) as unknown[]).map((row, p) =>
    checkCellRatios(`checkRatios[${p}]`, row, n),
  );
  const count = positions.length;
  if (count < n) {
    throw new BridgeworkError(
      'too-few-points',
      `\`cellRatios\` must hold at least as many test positions as cells (${n}); got ${count}`,
      { param: 'cellRatios', value: count, limit: n },
    );
  }
  // Start: the digital factors k (Σ k_i x_pi = 1); the cell with the largest k needs the most excitation.
  const design = Float64Array.from(positions.flat());
  const dfactor = factorDesign(design, count, n, 64 * count * Number.EPSILON);
  if (dfactor.accepted.length < n) {
    const missing = [...Array(n).keys()].find((i) => !dfactor.accepted.includes(i)) as number;
    throw new BridgeworkError(
      'singular',
      `\`cellRatios\` must load every cell independently: cell ${missing} cannot be told apart from the others; add positions over or near it`,
      { param: 'cellRatios', value: missing },
    );
  }
  const k = Array.from(solveDesign(dfactor, new Array<number>(count).fill(1)));
  if (!k.every((v) => v > 0)) {
    throw new BridgeworkError(
      'no-solution',
      '`cellRatios` need a negative weight for some cell (a reversed signal?): no trim can equalise the positions',
      { param: 'cellRatios' },
    );
  }
  const outputs = (trims: readonly number[]): number[] => positions.map((x) => solveNetwork(net, trims, x));

  let reference = k.indexOf(Math.max(...k));
  for (let attempt = 0; attempt < n; attempt++) {
    const kmax = k[reference] as number;
    const trims = k.map((ki, i) => (i === reference ? 0 : (net.cellOhms[i] as number) * (kmax / ki - 1)));
    const free = [...Array(n).keys()].filter((i) => i !== reference);
    let iterations = 0;
    let converged = false;
    for (; iterations < 50 && !converged; iterations++) {
      const out = outputs(trims);
      const scale = Math.max(...out.map(Math.abs));
      const residual = out.slice(1).map((v) => v - (out[0] as number));
      // The outputs are computed to about κ(G)·ε relative: stop at 1e-12 of them.
      if (Math.max(...residual.map(Math.abs)) <= 1e-12 * scale) {
        converged = true;
        break;
      }
      // Central-difference Jacobian of the residuals with respect to the free trims.
      const jac = new Float64Array((count - 1) * free.length);
      free.forEach((cell, c) => {
        const h = 1e-6 * ((net.cellOhms[cell] as number) + (trims[cell] as number));
        const up = [...trims];
        const down = [...trims];
        up[cell] = (trims[cell] as number) + h;
        down[cell] = Math.max(0, (trims[cell] as number) - h);
        const width = (up[cell] as number) - (down[cell] as number);
        const oUp = outputs(up);
        const oDown = outputs(down);
        for (let p = 1; p < count; p++) {
          jac[(p - 1) * free.length + c] =
            ((oUp[p] as number) - (oUp[0] as number) - ((oDown[p] as number) - (oDown[0] as number))) / width;
        }
      });
      const jf = factorDesign(jac, count - 1, free.length, 64 * count * Number.EPSILON);
      if (jf.accepted.length < free.length) break;
      const step = solveDesign(jf, residual);
      let largest = 0;
      free.forEach((cell, c) => {
        trims[cell] = (trims[cell] as number) - (step[c] as number);
        largest = Math.max(largest, Math.abs(step[c] as number) / (net.cellOhms[cell] as number));
      });
      if (count > n && largest <= 1e-12) {
        converged = true; // least squares: the steps have stopped
        iterations++;
        break;
      }
    }
    if (!converged) {
      throw new BridgeworkError(
        'not-converged',
        `\`cellRatios\` did not give equal position outputs within 50 Newton iterations of the trims`,
        { param: 'cellRatios', limit: 50 },
      );
    }
    const negative = trims.findIndex((t) => t < 0);
    if (negative >= 0) {
      reference = negative;
      continue;
    }
    const positionRatios = outputs(trims);
    const mean = positionRatios.reduce((s, v) => s + v, 0) / count;
    return {
      trimsOhms: trims,
      referenceCell: reference,
      positionRatios,
      positionSpreadFraction: (Math.max(...positionRatios) - Math.min(...positionRatios)) / Math.abs(mean),
      checks: checks.map((x) => {
        const ratio = solveNetwork(net, trims, x);
        return { ratio, differenceFraction: (ratio - mean) / mean };
      }),
      iterations,
    };
  }
  throw new BridgeworkError(
    'no-solution',
    '`cellRatios` need a negative trim whichever cell is left untrimmed',
    {
      param: 'cellRatios',
    },
  );
}
