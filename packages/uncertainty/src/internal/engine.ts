/**
 * The Monte Carlo kernel shared by the in-process runner and the Node worker threads.
 *
 * Trials are numbered 0, 1, 2, … and cut into seeding blocks of {@link BLOCK_TRIALS}. Every input
 * column has its own random stream in every block: the state of column j in block k is
 * J64^k(J96^j(s₀)), where s₀ comes from the seed and J64, J96 advance xoshiro128** by 2⁶⁴ and 2⁹⁶
 * steps. Streams therefore never overlap (for fewer than 2³² blocks and 2³² inputs), and the
 * values of a block depend only on the seed, the block's index and the inputs — not on which
 * thread computes it, nor on how many trials a run has (a run of M trials is a prefix of any
 * longer run with the same seed). Block statistics are merged in block order, so every result is
 * bit-identical whatever the number of workers.
 *
 * Inside a block, trials are generated in chunks of {@link CHUNK_TRIALS} into rows of n input
 * values (each sampler writes one input's place with stride n). A record model receives one
 * reused record of plain data properties into which the current row is copied before each call
 * (see trialRecord.ts); a positional model receives a fixed view of the current row, its inputs
 * in the declared order. Nothing is allocated per trial. Either way the model values depend only
 * on the seed, the block and the inputs.
 */
import { BridgeworkError, formatValue } from '@bridgework/core';
import { locateModelError, type ResolvedModel } from './model.js';
import { fillFrom, fillNormal, type SamplerSpec } from './samplers.js';
import { acquireRecord, acquireRows, CHUNK_TRIALS, type TrialRecord, type TrialRows } from './trialRecord.js';
import { jump64, jump96, stateFromSeed, type GeneratorState } from './xoshiro128.js';

/** Trials per seeding block. */
export const BLOCK_TRIALS = 16384;
export { CHUNK_TRIALS };

/** Inputs drawn jointly from a multivariate Gaussian: x = mean + scale·(L·z) (JCGM 101 6.4.8). */
export interface CorrelatedGroup {
  /** Column indices of the members, in order. */
  readonly members: readonly number[];
  /** Lower-triangular factor L of the members' correlation matrix, row-major g×g (R = L·Lᵀ). */
  readonly lower: Float64Array | readonly number[];
}

/** Everything a runner needs to generate trials (plain data, so it can be posted to a worker). */
export interface EnginePlan {
  /** Input names, in column order. */
  readonly names: readonly string[];
  /** The sampler of each column (members of the correlated group are `'normal'`). */
  readonly samplers: readonly SamplerSpec[];
  /** The correlated normal inputs, if any. */
  readonly group: CorrelatedGroup | undefined;
  /** The seed (a non-negative safe integer). */
  readonly seed: number;
}

/** Runs blocks of trials of one plan and one model. */
export interface BlockRunner {
  /**
   * Runs the first `count` trials of seeding block `block`, writes the model values to
   * `out[offset…offset + count)`, and stores the block's mean and sum of squared deviations in
   * `stats[2·slot]` and `stats[2·slot + 1]`. When the model fails, `failedTrial` holds the
   * number of the trial (counted from 0 over the whole run) before the error is thrown.
   */
  runBlock(
    block: number,
    count: number,
    out: Float64Array,
    offset: number,
    stats: Float64Array,
    slot: number,
  ): void;
  /** The trial at which the model last failed, or −1. */
  readonly failedTrial: number;
  /** Gives the trial record back for reuse; the runner must not be used afterwards. */
  release(): void;
}

function describeTrial(
  names: readonly string[],
  slots: readonly Float64Array[],
  stride: number,
  t: number,
): string {
  return names.map((n, j) => `${n} = ${String((slots[j] as Float64Array)[t * stride])}`).join(', ');
}

/**
 * The largest model value a run accepts, in magnitude: the sums of squared deviations of up to
 * 5·10⁷ values within ±1e150 stay below 1e308, so u(y) never overflows.
 */
export const MODEL_VALUE_LIMIT = 1e150;

function notFinite(y: unknown): BridgeworkError {
  if (typeof y === 'number' && Number.isFinite(y)) {
    return new BridgeworkError(
      'out-of-range',
      `\`model\` values must lie within ±${MODEL_VALUE_LIMIT} for Monte Carlo (their variance would overflow binary64 beyond); got ${formatValue(y)}: express the output in another unit`,
      { param: 'model', value: y, limit: MODEL_VALUE_LIMIT },
    );
  }
  return new BridgeworkError(
    typeof y === 'number' ? 'model-not-finite' : 'wrong-type',
    `\`model\` must return a finite number; got ${formatValue(y)}`,
    { param: 'model', value: y },
  );
}

/** Creates a runner; its column buffers and generator states are reused from block to block. */
export function createBlockRunner(plan: EnginePlan, model: ResolvedModel): BlockRunner {
  const { names, samplers, group } = plan;
  const n = names.length;
  // Stream bases J96^j(s0), the states at the start of block `positionedAt`, and working states.
  const bases: GeneratorState[] = [];
  const seedState = stateFromSeed(plan.seed);
  for (let j = 0; j < n; j++) {
    bases.push(seedState.slice());
    jump96(seedState);
  }
  const starts = bases.map((b) => b.slice());
  const states = bases.map((b) => b.slice());
  let positionedAt = 0;
  let failedTrial = -1;

  // The draws go to rows of n values per trial (each sampler writes one input's place with
  // stride n). A record model reads them from the cached record, row t copied into its data
  // properties before the call (input j at place j); a positional model gets a fixed view of row t
  // (input j at its place in `order`). Either way nothing is allocated per trial, and the same
  // draws land in the same trials.
  const view = model.kind === 'record' ? acquireRecord(names) : undefined;
  const rowSet = model.kind === 'positional' ? acquireRows(n) : undefined;
  const record = view?.record;
  const cursor = view?.cursor ?? { row: 0 };
  const rows = view?.rows ?? (rowSet as TrialRows).rows;
  const places = new Int32Array(n).map((_, j) => j);
  if (model.kind === 'positional') model.positions.forEach((j, i) => (places[j] = i));
  const slots = Array.from(places, (place) => rows.subarray(place));
  const views = rowSet?.views ?? [];

  const members = group?.members ?? [];
  const g = members.length;
  const lower = group === undefined ? new Float64Array(0) : Float64Array.from(group.lower);
  const groupMeans = members.map((j) => (samplers[j] as { mean: number }).mean);
  const groupScales = members.map((j) => (samplers[j] as { scale: number }).scale);
  const inGroup = new Set(members);

  function positionAt(block: number): void {
    if (block < positionedAt) {
      for (let j = 0; j < n; j++) (starts[j] as GeneratorState).set(bases[j] as GeneratorState);
      positionedAt = 0;
    }
    for (; positionedAt < block; positionedAt++) for (const s of starts) jump64(s);
    for (let j = 0; j < n; j++) (states[j] as GeneratorState).set(starts[j] as GeneratorState);
  }

  // Columns are always filled whole (CHUNK_TRIALS), even for a shorter last chunk, so a column's
  // values never depend on how many trials the block runs (some kernels work in two passes).
  function fillChunk(length: number): void {
    for (let j = 0; j < n; j++) {
      const s = states[j] as GeneratorState;
      const slot = slots[j] as Float64Array;
      if (inGroup.has(j)) fillNormal(s, slot, 0, CHUNK_TRIALS, 0, 1, n);
      else fillFrom(samplers[j] as SamplerSpec, s, slot, 0, CHUNK_TRIALS, n);
    }
    // x_r = mean_r + scale_r·Σ_{c ≤ r} L[r][c]·z_c, rows from the last so each z_c is still intact.
    for (let r = g - 1; r >= 0; r--) {
      const target = slots[members[r] as number] as Float64Array;
      const mean = groupMeans[r] as number;
      const scale = groupScales[r] as number;
      for (let t = 0; t < length; t++) {
        let acc = 0;
        for (let c = 0; c <= r; c++) {
          acc +=
            (lower[r * g + c] as number) * ((slots[members[c] as number] as Float64Array)[t * n] as number);
        }
        target[t * n] = mean + scale * acc;
      }
    }
  }

  // Both loops keep the trial in `cursor.row` (= t·n), an object property, for the error report: a
  // closure variable written per trial stopped V8 from inlining the model (measured: 1.5× slower).

  /** Model values of trials [0, length) of the chunk into out[base…); `cursor.row` is t·n. */
  function evaluateRecord(length: number, out: Float64Array, base: number): void {
    const evaluate = (model as { evaluate: (x: Readonly<Record<string, number>>) => unknown }).evaluate;
    const x = record as Readonly<Record<string, number>>;
    const load = (view as TrialRecord).load;
    for (let t = 0; t < length; t++) {
      cursor.row = t * n;
      load(t * n);
      const y = evaluate(x);
      if (typeof y !== 'number' || !(Math.abs(y) <= MODEL_VALUE_LIMIT)) throw notFinite(y);
      out[base + t] = y;
    }
  }

  function evaluatePositional(length: number, out: Float64Array, base: number): void {
    const evaluate = (model as { evaluate: (x: Float64Array) => unknown }).evaluate;
    for (let t = 0; t < length; t++) {
      cursor.row = t * n;
      const y = evaluate(views[t] as Float64Array);
      if (typeof y !== 'number' || !(Math.abs(y) <= MODEL_VALUE_LIMIT)) throw notFinite(y);
      out[base + t] = y;
    }
  }

  const evaluateChunk = model.kind === 'record' ? evaluateRecord : evaluatePositional;

  return {
    runBlock(block, count, out, offset, stats, slot) {
      positionAt(block);
      for (let done = 0; done < count;) {
        const length = Math.min(CHUNK_TRIALS, count - done);
        fillChunk(length);
        try {
          evaluateChunk(length, out, offset + done);
        } catch (error) {
          const t = cursor.row / n;
          failedTrial = block * BLOCK_TRIALS + done + t;
          // A drawn input past binary64 (a distribution reaching beyond ±1.8e308) is not the model's fault.
          const overflowed = names.findIndex((_, j) => !Number.isFinite((slots[j] as Float64Array)[t * n]));
          if (overflowed >= 0) {
            const name = names[overflowed] as string;
            throw new BridgeworkError(
              'out-of-range',
              `\`inputs.${name}\` must be drawn within binary64; trial ${failedTrial} drew ${formatValue((slots[overflowed] as Float64Array)[t * n])}: its distribution reaches past ±1.8e308 (express it in other units)`,
              { param: `inputs.${name}`, value: (slots[overflowed] as Float64Array)[t * n] },
            );
          }
          throw locateModelError(error, `at trial ${failedTrial} (${describeTrial(names, slots, n, t)})`);
        }
        done += length;
      }
      // Two-pass mean and sum of squared deviations of the block.
      let sum = 0;
      for (let t = offset; t < offset + count; t++) sum += out[t] as number;
      const mean = sum / count;
      let m2 = 0;
      for (let t = offset; t < offset + count; t++) {
        const dev = (out[t] as number) - mean;
        m2 += dev * dev;
      }
      stats[2 * slot] = mean;
      stats[2 * slot + 1] = m2;
    },
    get failedTrial() {
      return failedTrial;
    },
    release() {
      if (view !== undefined) view.inUse = false;
      if (rowSet !== undefined) rowSet.inUse = false;
    },
  };
}

/** Running mean and sum of squared deviations, merged block after block in block order. */
export interface MomentAccumulator {
  /** Number of values. */
  count: number;
  /** Their mean. */
  mean: number;
  /** Their sum of squared deviations from the mean. */
  m2: number;
}

/**
 * Adds a block's statistics to an accumulator (T. F. Chan, G. H. Golub and R. J. LeVeque,
 * "Updating formulae and a pairwise algorithm for computing sample variances", 1979). Applied in
 * block order, the result does not depend on who computed the blocks.
 */
export function mergeMoments(acc: MomentAccumulator, count: number, mean: number, m2: number): void {
  if (count === 0) return;
  if (acc.count === 0) {
    acc.count = count;
    acc.mean = mean;
    acc.m2 = m2;
    return;
  }
  const total = acc.count + count;
  const delta = mean - acc.mean;
  acc.mean += (delta * count) / total;
  acc.m2 += m2 + (delta * delta * acc.count * count) / total;
  acc.count = total;
}
