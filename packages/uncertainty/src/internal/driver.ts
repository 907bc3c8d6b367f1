/**
 * The Monte Carlo procedure of JCGM 101 (7.2–7.7, and the adaptive procedure of 7.9) written once
 * as a coroutine: it yields requests for blocks of trials and receives their model values, so the
 * same code drives the in-process runner (synchronously) and the worker pool (asynchronously).
 */
import { BridgeworkError } from '@bridgework/core';
import type { Interval } from '@bridgework/core';
import { numericalTolerance } from '../validateGum.js';
import { BLOCK_TRIALS, mergeMoments, type MomentAccumulator } from './engine.js';
import { coveredCount, sampleIntervalsInPlace, type SampleIntervals } from './select.js';

/** A request for the model values of blocks `firstBlock … firstBlock + blockCount − 1`. */
export interface BlockRequest {
  /** `'blocks'`. */
  readonly kind: 'blocks';
  /** The first seeding block. */
  readonly firstBlock: number;
  /** How many blocks. */
  readonly blockCount: number;
  /** Trials in those blocks: blockCount·BLOCK_TRIALS, or fewer when the last block ends the run. */
  readonly trials: number;
  /** Trials of the run evaluated before this request (for progress). */
  readonly trialsBefore: number;
}

/** The reply to a {@link BlockRequest}. */
export interface BlockReply {
  /** The model values, trial by trial (length = `trials`). */
  readonly values: Float64Array;
  /** Per block: mean and sum of squared deviations, interleaved (length 2·blockCount). */
  readonly stats: Float64Array;
}

/** A request for the coverage intervals of the run's values (the runner may compute them in parallel). */
export interface IntervalsRequest {
  /** `'intervals'`. */
  readonly kind: 'intervals';
  /** The model values (may be permuted by the runner). */
  readonly values: Float64Array;
  /** Coverage probability p. */
  readonly coverage: number;
}

/** What the procedure asks a runner for. */
export type ProcedureRequest = BlockRequest | IntervalsRequest;

/** A runner's answer: block values for a {@link BlockRequest}, intervals for an {@link IntervalsRequest}. */
export type ProcedureReply = BlockReply | SampleIntervals;

/** Settings of a run, already checked. */
export interface DriverSettings {
  /** Trials of a fixed run (ignored when adaptive). */
  readonly trials: number;
  /** Coverage probability p. */
  readonly coverage: number;
  /** The adaptive procedure, or undefined for a fixed number of trials. */
  readonly adaptive:
    | { readonly significantDigits: number; readonly maxTrials: number; readonly interval: AdaptiveInterval }
    | undefined;
  /** Keep a copy of the model values in trial order. */
  readonly returnValues: boolean;
  /**
   * Adaptive runs: sequences to request at once (default 1). A parallel runner asks for several;
   * the ones after the sequence where the procedure stops are discarded.
   */
  readonly lookahead?: number;
}

/** The coverage interval whose ends the adaptive procedure must stabilise. */
export type AdaptiveInterval = 'symmetric' | 'shortest' | 'both';

/** Statistics of one sequence of the adaptive procedure. */
interface SequenceResult {
  readonly value: number;
  readonly standardUncertainty: number;
  readonly interval: Interval;
  readonly shortestInterval: Interval;
}

/** The spread of the sequence results when the adaptive procedure stopped (JCGM 101 7.9.4 h–i). */
export interface AdaptiveSpread {
  /** s_y: standard deviation of the average of the sequence estimates. */
  readonly value: number;
  /** s_u(y): the same for the standard uncertainty. */
  readonly standardUncertainty: number;
  /** s_ylow: the same for the lower end (`min`) of the probabilistically symmetric interval. */
  readonly min: number;
  /** s_yhigh: the same for its upper end (`max`). */
  readonly max: number;
  /** The same for the lower end of the shortest interval. */
  readonly shortestMin: number;
  /** The same for the upper end of the shortest interval. */
  readonly shortestMax: number;
}

/** What the adaptive procedure did. */
export interface AdaptiveReport {
  /** Number of sequences h. */
  readonly sequences: number;
  /** Trials per sequence. */
  readonly trialsPerSequence: number;
  /** ndig. */
  readonly significantDigits: number;
  /** The interval whose ends had to stabilise. */
  readonly interval: AdaptiveInterval;
  /** The numerical tolerance δ of u(y) at the end. */
  readonly tolerance: number;
  /** The standard deviations of the averages of the sequence results; twice each that is tested is ≤ δ. */
  readonly spread: AdaptiveSpread;
}

/** The statistical results of a run. */
export interface DriverResult {
  readonly value: number;
  readonly standardUncertainty: number;
  readonly interval: Interval;
  readonly shortestInterval: Interval;
  readonly trials: number;
  readonly values: Float64Array | undefined;
  readonly adaptive: AdaptiveReport | undefined;
}

function* finish(
  values: Float64Array,
  moments: MomentAccumulator,
  settings: DriverSettings,
  adaptive?: AdaptiveReport,
): Generator<ProcedureRequest, DriverResult, ProcedureReply> {
  const copy = settings.returnValues ? values.slice() : undefined;
  const { interval, shortestInterval } = (yield {
    kind: 'intervals',
    values,
    coverage: settings.coverage,
  }) as SampleIntervals;
  return {
    value: moments.mean,
    standardUncertainty: Math.sqrt(moments.m2 / (moments.count - 1)),
    interval,
    shortestInterval,
    trials: moments.count,
    values: copy,
    adaptive,
  };
}

function mergeBlocks(into: MomentAccumulator, reply: BlockReply, request: BlockRequest): void {
  for (let b = 0; b < request.blockCount; b++) {
    const count = Math.min(BLOCK_TRIALS, request.trials - b * BLOCK_TRIALS);
    mergeMoments(into, count, reply.stats[2 * b] as number, reply.stats[2 * b + 1] as number);
  }
}

/** s = √(Σ(vᵣ − v̄)²/(h(h − 1))): the standard deviation of the average of h values (JCGM 101 7.9.4 h). */
function spreadOfAverage(values: readonly number[]): number {
  const h = values.length;
  const mean = values.reduce((a, b) => a + b, 0) / h;
  const ss = values.reduce((a, v) => a + (v - mean) ** 2, 0);
  return Math.sqrt(ss / (h * (h - 1)));
}

/** Runs the procedure; yields block requests, returns the results. */
export function* runProcedure(
  settings: DriverSettings,
): Generator<ProcedureRequest, DriverResult, ProcedureReply> {
  const all: MomentAccumulator = { count: 0, mean: 0, m2: 0 };
  if (settings.adaptive === undefined) {
    const request: BlockRequest = {
      kind: 'blocks',
      firstBlock: 0,
      blockCount: Math.ceil(settings.trials / BLOCK_TRIALS),
      trials: settings.trials,
      trialsBefore: 0,
    };
    const reply = (yield request) as BlockReply;
    mergeBlocks(all, reply, request);
    return yield* finish(reply.values, all, settings);
  }

  // JCGM 101 7.9.4: sequences of M = max(J, 10⁴) trials, J the smallest integer ≥ 100/(1 − p),
  // here rounded up to whole seeding blocks so that every trial is computed once.
  const { significantDigits, maxTrials, interval } = settings.adaptive;
  const perSequence = adaptiveSequenceTrials(settings.coverage);
  const blocksPerSequence = perSequence / BLOCK_TRIALS;
  const most = Math.floor(maxTrials / perSequence) * perSequence; // the trials of the sequences allowed
  let buffer = new Float64Array(Math.min(4 * perSequence, most));
  const scratch = new Float64Array(perSequence);
  const sequences: SequenceResult[] = [];
  const allowed = Math.floor(maxTrials / perSequence); // sequences maxTrials allows
  for (let h = 0; ;) {
    if (h >= allowed) {
      throw new BridgeworkError(
        'not-converged',
        `the adaptive Monte Carlo procedure did not stabilise to ${significantDigits} significant digits within \`maxTrials\` = ${maxTrials} trials`,
        { param: 'adaptive.maxTrials', value: maxTrials, limit: maxTrials },
      );
    }
    // Several sequences at once when the runner works in parallel; those after the one where the
    // procedure stops are discarded, so the result is that of one sequence at a time.
    const ahead = Math.min(settings.lookahead ?? 1, allowed - h);
    const request: BlockRequest = {
      kind: 'blocks',
      firstBlock: h * blocksPerSequence,
      blockCount: ahead * blocksPerSequence,
      trials: ahead * perSequence,
      trialsBefore: h * perSequence,
    };
    const reply = (yield request) as BlockReply;
    for (let k = 0; k < ahead; k++, h++) {
      const sequence: BlockRequest = { ...request, blockCount: blocksPerSequence, trials: perSequence };
      const part: BlockReply = {
        values: reply.values.subarray(k * perSequence, (k + 1) * perSequence),
        stats: reply.stats.subarray(2 * k * blocksPerSequence, 2 * (k + 1) * blocksPerSequence),
      };
      if (buffer.length < (h + 1) * perSequence) {
        // Doubling, but never past the sequences maxTrials allows: at most 8 bytes per allowed trial.
        const grown = new Float64Array(Math.min(2 * buffer.length, most));
        grown.set(buffer.subarray(0, h * perSequence));
        buffer = grown;
      }
      buffer.set(part.values, h * perSequence);
      const own: MomentAccumulator = { count: 0, mean: 0, m2: 0 };
      mergeBlocks(own, part, sequence);
      mergeBlocks(all, part, sequence);
      scratch.set(part.values);
      const intervals = sampleIntervalsInPlace(scratch, settings.coverage);
      sequences.push({
        value: own.mean,
        standardUncertainty: Math.sqrt(own.m2 / (own.count - 1)),
        ...intervals,
      });
      if (sequences.length < 2) continue;
      const spread: AdaptiveSpread = {
        value: spreadOfAverage(sequences.map((q) => q.value)),
        standardUncertainty: spreadOfAverage(sequences.map((q) => q.standardUncertainty)),
        min: spreadOfAverage(sequences.map((q) => q.interval.min)),
        max: spreadOfAverage(sequences.map((q) => q.interval.max)),
        shortestMin: spreadOfAverage(sequences.map((q) => q.shortestInterval.min)),
        shortestMax: spreadOfAverage(sequences.map((q) => q.shortestInterval.max)),
      };
      const tolerance = numericalTolerance(Math.sqrt(all.m2 / (all.count - 1)), significantDigits);
      const tested = [spread.value, spread.standardUncertainty];
      if (interval !== 'shortest') tested.push(spread.min, spread.max);
      if (interval !== 'symmetric') tested.push(spread.shortestMin, spread.shortestMax);
      if (tested.every((q) => 2 * q <= tolerance)) {
        const report: AdaptiveReport = {
          sequences: sequences.length,
          trialsPerSequence: perSequence,
          significantDigits,
          interval,
          tolerance,
          spread,
        };
        return yield* finish(buffer.subarray(0, all.count), all, settings, report);
      }
    }
  }
}

/**
 * Trials per sequence of the adaptive procedure: M = max(J, 10⁴), J the smallest integer
 * ≥ 100/(1 − p) (JCGM 101 7.9.4), rounded up to whole seeding blocks.
 */
export function adaptiveSequenceTrials(coverage: number): number {
  const j = Math.ceil(100 / (1 - coverage) - 1e-9);
  return Math.ceil(Math.max(j, 1e4) / BLOCK_TRIALS) * BLOCK_TRIALS;
}

/**
 * The smallest number of trials for which a coverage interval exists (q < M): ⌊pM + ½⌋ < M holds
 * from M = ⌊½/(1 − p)⌋ + 1 on; the loop only repairs the rounding of ½/(1 − p).
 */
export function minimumTrials(coverage: number): number {
  let m = Math.max(2, Math.floor(0.5 / (1 - coverage)) + 1);
  while (m > 2 && coveredCount(coverage, m - 1) < m - 1) m--;
  while (coveredCount(coverage, m) >= m) m++;
  return m;
}
