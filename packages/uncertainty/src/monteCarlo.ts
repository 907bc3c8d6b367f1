import {
  BridgeworkError,
  checkInteger,
  checkOneOf,
  checkOptions,
  checkRange,
  formatValue,
  type Interval,
} from '@bridgework/core';
import { choleskySemidefinite, normalizeCorrelations, type Correlation } from './correlations.js';
import {
  adaptiveSequenceTrials,
  minimumTrials,
  runProcedure,
  type AdaptiveInterval,
  type AdaptiveReport,
  type BlockReply,
  type BlockRequest,
  type DriverResult,
  type DriverSettings,
} from './internal/driver.js';
import { BLOCK_TRIALS, createBlockRunner, type EnginePlan } from './internal/engine.js';
import { sampleIntervalsInPlace } from './internal/select.js';
import { resolveModel, type ResolvedModel } from './internal/model.js';
import { propagateScalar, type Propagation } from './propagate.js';
import { normalizeInputs, type InputQuantities } from './quantities.js';
import type { MeasurementModel, PositionalModel } from './types.js';
import { validateGum, type GumValidation } from './validateGum.js';

export type { AdaptiveInterval, AdaptiveReport, AdaptiveSpread } from './internal/driver.js';

/**
 * The most trials one Monte Carlo run may evaluate, fixed or adaptive: 5·10⁷.
 *
 * @remarks
 * A run holds about 10 bytes per trial at its peak (8 for the model values, 1.2 for the two
 * tails of the coverage intervals, 0.75 while one is sorted), 18 with `returnValues`; the limit
 * keeps a run below about 0.5 GB (0.9 GB with the values returned). JCGM 101 7.2.2 suggests 10⁶
 * trials for a 95 % interval; the adaptive procedure usually stops far below the limit.
 */
export const MONTE_CARLO_MAX_TRIALS = 50_000_000;

/** Bytes a run holds per trial at its peak, without `returnValues` (see {@link MONTE_CARLO_MAX_TRIALS}). */
export const MONTE_CARLO_BYTES_PER_TRIAL = 10;

/** Settings of the adaptive procedure (JCGM 101 7.9). */
export interface AdaptiveOptions {
  /**
   * The coverage interval whose ends must stabilise: `'symmetric'` (the default; the one compared
   * with the GUM in clause 8), `'shortest'`, or `'both'`. The ends of the shortest interval of a
   * flat-topped output are poorly determined and may need many more trials.
   */
  readonly interval?: AdaptiveInterval;
  /**
   * The most trials the procedure may run before giving up with `not-converged`: an integer
   * from two sequences up to {@link MONTE_CARLO_MAX_TRIALS}. Default 10⁷ (80 MB of model values).
   */
  readonly maxTrials?: number;
}

/** How far a Monte Carlo run has got, passed to `onProgress`. */
export interface MonteCarloProgress {
  /** Trials whose model values are done. */
  readonly trials: number;
  /**
   * Trials the run evaluates once the work started so far is done: `trials` of a fixed run; for
   * an adaptive run, the trials of the sequences started so far (it grows by one sequence at a time).
   */
  readonly plannedTrials: number;
  /** The most trials the run may evaluate: `trials` of a fixed run, `adaptive.maxTrials` of an adaptive one. */
  readonly maxTrials: number;
}

/**
 * What a run reads of an `AbortSignal` (typed by the two properties read, so the declarations need
 * no DOM or Node globals): an `AbortController`'s `signal` will do.
 */
export interface AbortSignalLike {
  /** True once the run should stop. */
  readonly aborted: boolean;
  /** What the run rejects (or throws) with once stopped; an `AbortSignal` sets it on `abort()`. */
  readonly reason?: unknown;
}

/** Options of {@link monteCarlo}. */
export interface MonteCarloOptions {
  /**
   * The scalar measurement model: a function of the inputs by name (it receives one reused,
   * read-only record; it must not keep it), or a {@link PositionalModel} taking them by position.
   */
  readonly model: MeasurementModel | PositionalModel;
  /** The named input quantities. */
  readonly inputs: InputQuantities;
  /** Correlation coefficients between pairs of Gaussian inputs (default: none). */
  readonly correlations?: readonly Correlation[];
  /**
   * Number of trials M: an integer from the least that gives a coverage interval (11 for
   * p = 0.95) up to {@link MONTE_CARLO_MAX_TRIALS}. Default 10⁶. Not with `adaptive`.
   */
  readonly trials?: number;
  /** Seed of the random streams: an integer in [0, 2⁵³ − 1]. Default 1, so runs are reproducible. */
  readonly seed?: number;
  /** Coverage probability p, in (0, 1). Default 0.95. */
  readonly coverage?: number;
  /** Run the adaptive procedure of JCGM 101 7.9 instead of a fixed number of trials. Default false. */
  readonly adaptive?: boolean | AdaptiveOptions;
  /** ndig: significant digits regarded as meaningful in u(y), for `adaptive` and the GUM comparison (1–15). Default 2. */
  readonly significantDigits?: number;
  /** Also evaluate the law of propagation and compare (JCGM 101 clause 8). Default true. */
  readonly compareWithGum?: boolean;
  /**
   * The analytic gradient of a record model, passed to the law of propagation for the comparison
   * (a positional model carries its own `gradient`).
   */
  readonly gradient?: (x: Readonly<Record<string, number>>) => Readonly<Record<string, number>>;
  /** Return the model values in trial order (`values`). Default false. */
  readonly returnValues?: boolean;
  /**
   * Called as the trials are done, with how far the run has got. In one thread it is called
   * after every seeding block of 16 384 trials (synchronously, between blocks); from the worker
   * pool at most every 50 ms and once when a request's trials are all done. `trials` never
   * decreases, and a fixed run's last call has `trials` equal to the run's trials. A throw from
   * it abandons the run: the error is what the run throws.
   */
  readonly onProgress?: (progress: MonteCarloProgress) => void;
  /**
   * Stops the run once `signal.aborted` is true: it throws (a pooled run rejects with)
   * `signal.reason`, or a `closed` error when the signal has no reason. One thread reads it before
   * the run and after every seeding block of 16 384 trials (so only `onProgress` or the model can
   * abort a run there: the thread is busy); the worker pool also every 10 ms while its workers
   * draw, and no block is started after that. An `AbortController`'s `signal` will do.
   */
  readonly signal?: AbortSignalLike;
}

/** The result of {@link monteCarlo}. */
export interface MonteCarloResult {
  /** The estimate y: the average of the model values (JCGM 101 7.6). */
  readonly value: number;
  /** The standard uncertainty u(y): their standard deviation (JCGM 101 7.6). */
  readonly standardUncertainty: number;
  /** The probabilistically symmetric coverage interval (JCGM 101 7.7.1), closed. */
  readonly interval: Interval;
  /** The shortest coverage interval (JCGM 101 7.7.2), closed. */
  readonly shortestInterval: Interval;
  /** The number of trials M used. */
  readonly trials: number;
  /** The coverage probability p. */
  readonly coverage: number;
  /** The seed used. */
  readonly seed: number;
  /** The law of propagation for the same model (unless `compareWithGum` is false). */
  readonly gum?: Propagation;
  /** The comparison of JCGM 101 clause 8 (unless `compareWithGum` is false). */
  readonly gumValidation?: GumValidation;
  /** What the adaptive procedure did (when `adaptive`). */
  readonly adaptive?: AdaptiveReport;
  /** The model values in trial order (when `returnValues`). */
  readonly values?: Float64Array;
}

/** The keys of {@link MonteCarloOptions}, for the options check. */
export const monteCarloOptionKeys: readonly string[] = [
  'model',
  'inputs',
  'correlations',
  'trials',
  'seed',
  'coverage',
  'adaptive',
  'significantDigits',
  'compareWithGum',
  'gradient',
  'returnValues',
  'onProgress',
  'signal',
];

/** A checked Monte Carlo set-up, shared by the in-process runner and the worker pool. */
export interface MonteCarloSetup {
  readonly plan: EnginePlan;
  readonly settings: DriverSettings;
  readonly seed: number;
  readonly coverage: number;
  readonly significantDigits: number;
  readonly compareWithGum: boolean;
  /** Reports progress (a no-op without `onProgress`). */
  readonly progress: ProgressReporter;
  /** The run's `signal`, if any. */
  readonly signal: AbortSignalLike | undefined;
}

/** Throws what an aborted run throws: the signal's reason, or a `closed` error when it has none. */
export function throwIfAborted(signal: AbortSignalLike | undefined): void {
  if (signal === undefined || signal.aborted !== true) return;
  if (signal.reason !== undefined) throw signal.reason;
  throw new BridgeworkError('closed', 'the Monte Carlo run was stopped by its `signal` (aborted)', {
    param: 'signal',
  });
}

/** Turns trials done into `onProgress` calls. */
export interface ProgressReporter {
  /** True when there is an `onProgress` to call. */
  readonly active: boolean;
  /** Reports `done` trials of the run, `request` being the block request in progress. */
  report(done: number, request: BlockRequest): void;
}

function trialLimitError(param: string, value: number, returnValues: boolean): BridgeworkError {
  const bytes = returnValues ? MONTE_CARLO_BYTES_PER_TRIAL + 8 : MONTE_CARLO_BYTES_PER_TRIAL;
  return new BridgeworkError(
    'out-of-range',
    `\`${param}\` must be at most ${MONTE_CARLO_MAX_TRIALS} trials (a run holds about ${bytes} bytes per trial, ${((bytes * MONTE_CARLO_MAX_TRIALS) / 1e9).toFixed(1)} GB at the limit); got ${formatValue(value)}. JCGM 101 7.2.2 suggests 10⁶ trials; for more digits use \`adaptive\`, or combine the results of runs with different seeds`,
    { param, value, limit: MONTE_CARLO_MAX_TRIALS },
  );
}

/**
 * Checks the options of a run (everything but the model, which the caller checks against the
 * returned input names) and builds its plan. The caller has checked the keys.
 */
export function prepareMonteCarlo(o: Record<string, unknown>): MonteCarloSetup {
  const inputs = normalizeInputs(o['inputs']);
  const names = inputs.map((q) => q.name);
  for (const q of inputs) {
    // JCGM 101 6.4.9: the t-distribution has a variance only for ν > 2.
    if (q.sampler.kind === 't' && !(q.sampler.degreesOfFreedom > 2)) {
      const nu = q.sampler.degreesOfFreedom;
      throw new BridgeworkError(
        'out-of-range',
        `\`inputs.${q.name}.degreesOfFreedom\` must be > 2 for Monte Carlo: the input is drawn from a t-distribution, which has no finite variance for ν ≤ 2, so u(y) would not exist (JCGM 101 6.4.9); got ${formatValue(nu)}. Base the input on more observations, or use \`propagate\`, whose Type A u(x) = s holds for any ν`,
        { param: `inputs.${q.name}.degreesOfFreedom`, value: nu, limit: 2 },
      );
    }
  }
  for (const q of inputs) {
    const spec = q.sampler;
    if ('halfWidth' in spec && !(Math.abs(spec.mean) + spec.halfWidth <= Number.MAX_VALUE)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`inputs.${q.name}.halfWidth\` must keep value ± halfWidth within binary64 (±1.8e308); got ${formatValue(spec.halfWidth)} about ${formatValue(spec.mean)}`,
        { param: `inputs.${q.name}.halfWidth`, value: spec.halfWidth },
      );
    }
  }
  const { matrix, pairs } = normalizeCorrelations(names, o['correlations']);
  const coverage =
    o['coverage'] === undefined
      ? 0.95
      : checkRange('coverage', o['coverage'], { min: 0, max: 1, minExclusive: true, maxExclusive: true });
  const seed =
    o['seed'] === undefined ? 1 : checkInteger('seed', o['seed'], { min: 0, max: Number.MAX_SAFE_INTEGER });
  const significantDigits =
    o['significantDigits'] === undefined
      ? 2
      : checkInteger('significantDigits', o['significantDigits'], { min: 1, max: 15 });
  for (const key of ['compareWithGum', 'returnValues'] as const) {
    if (o[key] !== undefined && typeof o[key] !== 'boolean') {
      throw new BridgeworkError('wrong-type', `\`${key}\` must be a boolean; got ${formatValue(o[key])}`, {
        param: key,
        value: o[key],
      });
    }
  }
  const returnValues = o['returnValues'] === true;
  const onProgress = o['onProgress'];
  if (onProgress !== undefined && typeof onProgress !== 'function') {
    throw new BridgeworkError(
      'wrong-type',
      `\`onProgress\` must be a function; got ${formatValue(onProgress)}`,
      {
        param: 'onProgress',
        value: onProgress,
      },
    );
  }
  const signal = o['signal'];
  if (
    signal !== undefined &&
    (typeof signal !== 'object' ||
      signal === null ||
      typeof (signal as { aborted?: unknown }).aborted !== 'boolean')
  ) {
    throw new BridgeworkError(
      'wrong-type',
      `\`signal\` must be an AbortSignal (an object with a boolean \`aborted\`); got ${formatValue(signal)}`,
      { param: 'signal', value: signal },
    );
  }
  const adaptiveOption = o['adaptive'];
  let adaptive: DriverSettings['adaptive'];
  if (adaptiveOption !== undefined && adaptiveOption !== false) {
    if (adaptiveOption !== true && typeof adaptiveOption !== 'object') {
      throw new BridgeworkError(
        'wrong-type',
        `\`adaptive\` must be a boolean or { interval, maxTrials }; got ${formatValue(adaptiveOption)}`,
        { param: 'adaptive', value: adaptiveOption },
      );
    }
    if (o['trials'] !== undefined) {
      throw new BridgeworkError(
        'conflicting-options',
        '`trials` must not be given with `adaptive` (the procedure chooses the number of trials)',
        { param: 'trials', value: o['trials'] },
      );
    }
    const a =
      adaptiveOption === true
        ? {}
        : checkOptions('adaptive', adaptiveOption, { known: ['interval', 'maxTrials'] });
    const least = 2 * adaptiveSequenceTrials(coverage);
    let maxTrials = 1e7;
    if (a['maxTrials'] !== undefined) {
      maxTrials = checkInteger('adaptive.maxTrials', a['maxTrials']);
      if (maxTrials > MONTE_CARLO_MAX_TRIALS)
        throw trialLimitError('adaptive.maxTrials', maxTrials, returnValues);
    }
    if (maxTrials < least) {
      throw new BridgeworkError(
        'out-of-range',
        `\`adaptive.maxTrials\` must be at least ${least}, two sequences of the adaptive procedure for p = ${coverage} (JCGM 101 7.9.4); got ${formatValue(maxTrials)}`,
        { param: 'adaptive.maxTrials', value: maxTrials, limit: least },
      );
    }
    const interval =
      a['interval'] === undefined
        ? 'symmetric'
        : checkOneOf('adaptive.interval', a['interval'], ['symmetric', 'shortest', 'both'] as const);
    adaptive = { significantDigits, maxTrials, interval };
  }
  const least = minimumTrials(coverage);
  let trials = 1e6;
  if (o['trials'] !== undefined) {
    trials = checkInteger('trials', o['trials']);
    if (trials > MONTE_CARLO_MAX_TRIALS) throw trialLimitError('trials', trials, returnValues);
    if (trials < least) {
      throw new BridgeworkError(
        'out-of-range',
        `\`trials\` must be at least ${least} for a coverage interval with p = ${coverage} (JCGM 101 7.7 needs pM rounded below M); got ${formatValue(trials)}`,
        { param: 'trials', value: trials, limit: least },
      );
    }
  } else if (adaptive === undefined && least > trials) {
    throw new BridgeworkError(
      'out-of-range',
      `\`coverage\` ${coverage} needs at least ${least} trials for an interval, more than the default 10⁶: give \`trials\` (at most ${MONTE_CARLO_MAX_TRIALS})`,
      { param: 'coverage', value: coverage, limit: least },
    );
  }
  if (least > MONTE_CARLO_MAX_TRIALS) {
    throw new BridgeworkError(
      'out-of-range',
      `\`coverage\` must leave at least one coverage interval within ${MONTE_CARLO_MAX_TRIALS} trials; p = ${coverage} needs ${least}`,
      { param: 'coverage', value: coverage, limit: MONTE_CARLO_MAX_TRIALS },
    );
  }

  // Correlated inputs are drawn from a multivariate Gaussian (JCGM 101 6.4.8).
  const members: number[] = [];
  for (const { i, j, entry } of pairs) {
    for (const k of [i, j]) {
      const q = inputs[k]!;
      if (q.standardUncertainty === 0) continue;
      if (!q.gaussian) {
        throw new BridgeworkError(
          'conflicting-options',
          `\`correlations[${entry}]\` must relate Gaussian inputs in monteCarlo (JCGM 101 6.4.8 samples a multivariate Gaussian); '${q.name}' is ${q.sampler.kind === 't' ? 'Student-t (finite degreesOfFreedom)' : q.sampler.kind}`,
          { param: `correlations[${entry}]`, value: q.name },
        );
      }
      if (!members.includes(k)) members.push(k);
    }
  }
  members.sort((a, b) => a - b);
  const n = names.length;
  const g = members.length;
  const sub = new Float64Array(g * g);
  members.forEach((a, r) => members.forEach((b, c) => (sub[r * g + c] = matrix[a * n + b] as number)));
  const factor = choleskySemidefinite(sub, g);
  const lower = 'lower' in factor ? factor.lower : new Float64Array(g * g); // a principal submatrix of a PSD matrix is PSD
  const plan: EnginePlan = {
    names,
    samplers: inputs.map((q) => q.sampler),
    group: g === 0 ? undefined : { members, lower: Array.from(lower) },
    seed,
  };
  const maxTrials = adaptive === undefined ? trials : adaptive.maxTrials;
  const callback = onProgress as ((p: MonteCarloProgress) => void) | undefined;
  return {
    plan,
    settings: { trials, coverage, adaptive, returnValues },
    seed,
    coverage,
    significantDigits,
    compareWithGum: o['compareWithGum'] !== false,
    progress: {
      active: callback !== undefined,
      report(done, request) {
        callback?.({ trials: done, plannedTrials: request.trialsBefore + request.trials, maxTrials });
      },
    },
    signal: signal as AbortSignalLike | undefined,
  };
}

/** The law of propagation for the comparison (unless `compareWithGum` is false). */
export function gumFor(
  setup: MonteCarloSetup,
  o: Record<string, unknown>,
  model: MeasurementModel | PositionalModel,
): Propagation | undefined {
  if (!setup.compareWithGum) return undefined;
  return propagateScalar({
    model,
    inputs: o['inputs'] as InputQuantities,
    coverage: setup.coverage,
    ...(o['correlations'] === undefined ? {} : { correlations: o['correlations'] as readonly Correlation[] }),
    ...(o['gradient'] === undefined
      ? {}
      : { gradient: o['gradient'] as NonNullable<MonteCarloOptions['gradient']> }),
  });
}

/** Assembles the public result from the procedure's statistics and the optional GUM result. */
export function monteCarloResult(
  setup: MonteCarloSetup,
  run: DriverResult,
  gum: Propagation | undefined,
): MonteCarloResult {
  const base = {
    value: run.value,
    standardUncertainty: run.standardUncertainty,
    interval: run.interval,
    shortestInterval: run.shortestInterval,
    trials: run.trials,
    coverage: setup.coverage,
    seed: setup.seed,
    ...(run.adaptive === undefined ? {} : { adaptive: run.adaptive }),
    ...(run.values === undefined ? {} : { values: run.values }),
  };
  if (gum === undefined) return base;
  const gumValidation = validateGum({ gum, monteCarlo: base, significantDigits: setup.significantDigits });
  return { ...base, gum, gumValidation };
}

/** Checks the model against the inputs' names; `gradient` only goes with a record model. */
export function checkMonteCarloModel(
  model: unknown,
  names: readonly string[],
  o: Record<string, unknown>,
): ResolvedModel {
  const resolved = resolveModel(model, names);
  if (o['gradient'] !== undefined && resolved.kind === 'positional') {
    throw new BridgeworkError(
      'conflicting-options',
      '`gradient` must not be given with a positional model: give it as `model.gradient`, by position',
      { param: 'gradient', value: o['gradient'] },
    );
  }
  if (o['gradient'] !== undefined && typeof o['gradient'] !== 'function') {
    throw new BridgeworkError(
      'wrong-type',
      `\`gradient\` must be a function; got ${formatValue(o['gradient'])}`,
      {
        param: 'gradient',
        value: o['gradient'],
      },
    );
  }
  return resolved;
}

/**
 * Evaluates a measurement model by the Monte Carlo method of JCGM 101 (propagation of
 * distributions), reproducibly from a seed.
 *
 * @remarks
 * JCGM 101 clause 7: M trials each draw every input from its distribution (6.4: Gaussian,
 * rectangular, symmetric triangular, arcsine, scaled and shifted t; correlated Gaussian inputs
 * jointly through the Cholesky factor of their correlation matrix, 6.4.8) and evaluate the model.
 * The estimate is the mean of the M values, u(y) their standard deviation (7.6); the
 * probabilistically symmetric interval is [y₍ᵣ₎, y₍ᵣ₊q₎] with q = pM rounded as in 7.7.1 and
 * r = (M − q)/2 (or (M − q + 1)/2), and the shortest interval minimises y₍ᵣ₊q₎ − y₍ᵣ₎ (7.7.2). Only
 * the lowest and highest M − q values are sorted, never the whole sample: one pass against two
 * thresholds taken from a sample of the values collects them (Floyd–Rivest selection when ties
 * defeat the thresholds), and a stable bucket sort orders them. `adaptive` runs sequences of max(100/(1 − p), 10⁴) trials (rounded up to whole
 * blocks of 16 384) until twice the standard deviation of the average of each sequence result —
 * estimate, u(y) and the ends of the chosen coverage interval — is at most the tolerance δ of
 * u(y) to `significantDigits` digits (7.9.2, 7.9.4), then reports the results of all trials. Unless
 * `compareWithGum` is false the law of propagation is evaluated too, and compared by JCGM 101
 * clause 8 ({@link validateGum}).
 *
 * Random numbers: xoshiro128** (Blackman and Vigna 2021) with one stream per input and block of
 * 16 384 trials, 2⁶⁴ draws apart; rectangular variates from one 32-bit output (2³² values);
 * normal variates by a 1024-layer ziggurat (Marsaglia and Tsang 2000) from one 32-bit output,
 * 10 bits for the layer and 22 disjoint bits for the abscissa; triangular, arcsine and t
 * variates (Bailey's polar method) from 53-bit uniforms. The generators use only exactly rounded
 * arithmetic and their own logarithm and exponential, so the same seed gives the same result on
 * every machine and engine (provided the model itself is deterministic), and the same result as
 * `monteCarloInWorkers` (from `@bridgework/uncertainty/node`) with any number of workers. A run of
 * M trials is the prefix of any longer run with the same seed.
 *
 * The model is called once per trial: a record model with one reused, sealed record of plain data
 * properties holding the trial's input values, a {@link PositionalModel} with a fixed view of the
 * trial's row of input values in its declared order; nothing is allocated per trial, and both
 * forms of one model give the same results bit for bit. A record model must not keep the record
 * or write to it. The same record shape is passed by {@link propagate}, so a
 * model evaluated by both stays fast; calling the same model function elsewhere with other
 * objects may slow it. A model that throws a bridgework error keeps its code, with the trial
 * added to the message; anything else it throws becomes `model-failed`.
 *
 * Memory: about {@link MONTE_CARLO_BYTES_PER_TRIAL}·M = 10·M bytes at the peak — 8·M for the
 * model values, 1.2·M for the two tails and 0.75·M while one is sorted — plus 16 KB per input,
 * and 8·M more with `returnValues`; 10⁶ trials hold about 10 MB. M is at most
 * {@link MONTE_CARLO_MAX_TRIALS} (5·10⁷, about 0.5 GB). The adaptive procedure holds at most 8
 * bytes per trial of `maxTrials` for the values, plus one sequence. Nothing stays allocated
 * after the run but the 16 KB per input of the cached trial record.
 *
 * Inputs drawn from a t-distribution (a `'t'` quantity, or a normal one with finite
 * `degreesOfFreedom`) need ν > 2: below, the distribution has no variance and u(y) does not exist.
 *
 * @param options - Model, inputs, correlations, trials or adaptive, seed, coverage, comparison,
 *   progress hook, abort signal.
 * @returns Estimate, standard uncertainty, both coverage intervals, trials, and the GUM comparison.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option` (naming the closest key),
 *   `missing-option` for the options' keys; `wrong-type` unless `model` is a function or a
 *   positional model returning a number; `model-not-finite` when it returns NaN or ±Infinity for
 *   a trial (the message shows the trial's inputs); `model-failed` when it throws an error of its
 *   own; the input codes of {@link standardUncertaintyOf} and of {@link propagate};
 *   `conflicting-options` for a correlation with a non-Gaussian input, `trials` with `adaptive`,
 *   or `gradient` with a positional model; `not-integer`, `out-of-range` for bad trials (more
 *   than {@link MONTE_CARLO_MAX_TRIALS}), seed or digits, and for a t-distributed input with
 *   ν ≤ 2; `not-converged` when the adaptive procedure exceeds `maxTrials`; whatever
 *   `onProgress` throws; `signal.reason` once `signal` is aborted (`closed` without a reason);
 *   `wrong-type` for a `signal` without a boolean `aborted`.
 * @example
 * ```ts
 * const r = monteCarlo({
 *   model: ({ a, b, c, d }) => a + b + c + d,
 *   inputs: {
 *     a: { value: 0, standardUncertainty: 1 },
 *     b: { value: 0, standardUncertainty: 1 },
 *     c: { value: 0, standardUncertainty: 1 },
 *     d: { value: 0, standardUncertainty: 1 },
 *   },
 * });
 * r.interval; // ≈ { min: -3.92, max: 3.92 } (JCGM 101 9.2.2)
 * r.gumValidation?.validated; // true
 * ```
 */
export function monteCarlo(options: MonteCarloOptions): MonteCarloResult {
  const o = checkOptions('options', options, { known: monteCarloOptionKeys, required: ['model', 'inputs'] });
  const setup = prepareMonteCarlo(o);
  const model = checkMonteCarloModel(o['model'], setup.plan.names, o);
  throwIfAborted(setup.signal);
  const runner = createBlockRunner(setup.plan, model);
  let run: DriverResult;
  try {
    const procedure = runProcedure(setup.settings);
    let step = procedure.next();
    while (!step.done) {
      const request = step.value;
      step = procedure.next(
        request.kind === 'blocks'
          ? runLocally(runner, request, setup.progress, setup.signal)
          : sampleIntervalsInPlace(request.values, request.coverage),
      );
    }
    run = step.value;
  } finally {
    runner.release();
  }
  return monteCarloResult(setup, run, gumFor(setup, o, o['model'] as MeasurementModel | PositionalModel));
}

function runLocally(
  runner: ReturnType<typeof createBlockRunner>,
  request: BlockRequest,
  progress: ProgressReporter,
  signal: AbortSignalLike | undefined,
): BlockReply {
  const values = new Float64Array(request.trials);
  const stats = new Float64Array(2 * request.blockCount);
  for (let b = 0; b < request.blockCount; b++) {
    const count = Math.min(BLOCK_TRIALS, request.trials - b * BLOCK_TRIALS);
    runner.runBlock(request.firstBlock + b, count, values, b * BLOCK_TRIALS, stats, b);
    if (progress.active) progress.report(request.trialsBefore + b * BLOCK_TRIALS + count, request);
    throwIfAborted(signal);
  }
  return { values, stats };
}
