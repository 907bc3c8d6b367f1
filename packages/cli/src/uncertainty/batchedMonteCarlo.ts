import { channelBudget, type Channel, type ChannelBudget } from '@bridgework/channel';
import { BridgeworkError, checkInteger, type Interval } from '@bridgework/core';
import { sampleCoverageIntervals, validateGum, type GumValidation } from '@bridgework/uncertainty';

/** The most trials in one batch (one progress step). */
export const BATCH_TRIALS = 10_000;

/** 2³²: batch i runs with seed + i·2³² (seeds are below 2³², so no two batches of two runs share a seed). */
const SEED_STRIDE = 2 ** 32;

/** Options of {@link batchedMonteCarlo}. */
export interface BatchedMonteCarloOptions {
  /** Trials in all (integer in [1000, 10⁷]). */
  readonly trials: number;
  /** The run's seed (integer in [0, 2³² − 1]). */
  readonly seed: number;
  /** Called after each batch with the trials done so far. */
  readonly onProgress?: (done: number) => void;
}

/** What {@link batchedMonteCarlo} found. */
export interface BatchedMonteCarloResult {
  /** The channel's budget (its `combined` is the GUM result at the same point and coverage). */
  readonly budget: ChannelBudget;
  /** Trials in all. */
  readonly trials: number;
  /** The batches' sizes, in order. */
  readonly batches: readonly number[];
  /** The batches' seeds, in order. */
  readonly seeds: readonly number[];
  /** The coverage probability (the channel's `tolerances.coverageProbability`). */
  readonly coverage: number;
  /** The estimate: the mean of all model values (JCGM 101 7.6). */
  readonly value: number;
  /** Their standard deviation (JCGM 101 7.6). */
  readonly standardUncertainty: number;
  /** The probabilistically symmetric coverage interval over all values (JCGM 101 7.7.1). */
  readonly interval: Interval;
  /** The shortest coverage interval over all values (JCGM 101 7.7.2). */
  readonly shortestInterval: Interval;
  /** The comparison with the GUM interval (JCGM 101 clause 8, u(y) to two significant digits). */
  readonly gumValidation: GumValidation;
}

/**
 * The batch sizes of a run: as few batches of at most {@link BATCH_TRIALS} as possible, of equal
 * size to within one trial (so no batch is too small for a coverage interval of its own).
 *
 * @param trials - Trials in all.
 * @returns The sizes.
 */
export function batchSizes(trials: number): number[] {
  checkInteger('trials', trials, { min: 1, max: 10_000_000 });
  const k = Math.ceil(trials / BATCH_TRIALS);
  const base = Math.floor(trials / k);
  return Array.from({ length: k }, (_, i) => base + (i < trials - base * k ? 1 : 0));
}

/**
 * Monte Carlo evaluation (JCGM 101) of a channel's budget in seeded batches, pooled: the
 * intervals and moments are those of all the model values together.
 *
 * @remarks
 * Batch i is the channel package's own Monte Carlo run of the budget model
 * (`channelBudget(channel, { monteCarlo: { trials, seed: seed + i·2³², returnValues: true } })`: the
 * exact channel map rebuilt with every uncertain input drawn from its distribution). The values
 * of all batches are pooled: the estimate is their mean and u(y) their standard deviation with
 * M − 1 degrees of freedom (JCGM 101 7.6; two passes, the first about the first value); both coverage intervals come from the uncertainty package's
 * `sampleCoverageIntervals` over all of them, and the GUM comparison from its `validateGum`. A run
 * is therefore the same for the same seed and trials on every machine, and a run of one batch is
 * exactly the channel package's run with that seed. Batches are what lets a progress bar move:
 * the uncertainty package's Monte Carlo has no progress hook.
 *
 * @param channel - The channel.
 * @param options - Trials, seed, progress hook.
 * @returns The pooled result, with the budget and the GUM comparison.
 * @throws {@link @bridgework/core!BridgeworkError} `not-integer` or `out-of-range` for trials or
 * seed; `model-not-finite` from a trial whose inputs make the model fail.
 */
export function batchedMonteCarlo(
  channel: Channel,
  options: BatchedMonteCarloOptions,
): BatchedMonteCarloResult {
  const trials = checkInteger('trials', options.trials, { min: 1000, max: 10_000_000 });
  const seed = checkInteger('seed', options.seed, { min: 0, max: SEED_STRIDE - 1 });
  const batches = batchSizes(trials);
  const seeds = batches.map((_, i) => seed + i * SEED_STRIDE);
  const values = new Float64Array(trials);
  let done = 0;
  let budget: ChannelBudget | undefined;
  batches.forEach((n, i) => {
    const b = channelBudget(channel, {
      monteCarlo: { trials: n, seed: seeds[i] as number, returnValues: true },
    });
    const v = b.monteCarlo?.values;
    if (v === undefined || v.length !== n) {
      throw new Error(`the channel's Monte Carlo returned ${v?.length ?? 'no'} values for ${n} trials`);
    }
    values.set(v, done);
    done += n;
    budget ??= b;
    options.onProgress?.(done);
  });
  if (budget === undefined)
    throw new BridgeworkError('too-few-points', 'no trials were run', { param: 'trials' });
  // Two passes, the first about the first value so the sum stays at the scale of the spread.
  const shift = values[0] as number;
  let sum = 0;
  for (let i = 0; i < trials; i++) sum += (values[i] as number) - shift;
  const value = shift + sum / trials;
  let squares = 0;
  for (let i = 0; i < trials; i++) squares += ((values[i] as number) - value) ** 2;
  const standardUncertainty = Math.sqrt(squares / (trials - 1));
  const coverage = budget.combined.coverage;
  const intervals = sampleCoverageIntervals(values, coverage);
  const gumValidation = validateGum({
    gum: budget.combined,
    monteCarlo: { standardUncertainty, interval: intervals.interval },
  });
  return {
    budget,
    trials,
    batches,
    seeds,
    coverage,
    value,
    standardUncertainty,
    interval: intervals.interval,
    shortestInterval: intervals.shortestInterval,
    gumValidation,
  };
}
