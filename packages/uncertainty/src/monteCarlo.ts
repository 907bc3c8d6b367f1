import {
  BridgeworkError,
  checkInteger,
  checkObject,
  checkOneOf,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { choleskySemidefinite, normalizeCorrelations, type Correlation } from './correlations.js';
import {
  minimumTrials,
  runProcedure,
  type AdaptiveInterval,
  type AdaptiveReport,
  type BlockReply,
  type BlockRequest,
  type DriverResult,
  type DriverSettings,
} from './internal/driver.js';
import { BLOCK_TRIALS, createBlockRunner, type EngineModel, type EnginePlan } from './internal/engine.js';
import { sampleIntervalsInPlace } from './internal/select.js';
import { checkModel } from './internal/model.js';
import { propagateScalar, type Propagation } from './propagate.js';
import { normalizeInputs, type InputQuantities } from './quantities.js';
import type { Interval } from '@bridgework/core';
import type { MeasurementModel } from './types.js';
import { validateGum, type GumValidation } from './validateGum.js';

export type { AdaptiveInterval, AdaptiveReport, AdaptiveSpread } from './internal/driver.js';

/** Settings of the adaptive procedure (JCGM 101 7.9). */
export interface AdaptiveOptions {
  /**
   * The coverage interval whose ends must stabilise: `'symmetric'` (the default; the one compared
   * with the GUM in clause 8), `'shortest'`, or `'both'`. The ends of the shortest interval of a
   * flat-topped output are poorly determined and may need many more trials.
   */
  readonly interval?: AdaptiveInterval;
  /**
   * The most trials the procedure may run before giving up with `not-converged` (integer ≥ the
   * length of two sequences). Default 10⁷ (80 MB of model values).
   */
  readonly maxTrials?: number;
}

/** Options of {@link monteCarlo}. */
export interface MonteCarloOptions {
  /** The scalar measurement model. It receives one reused, read-only record; it must not keep it. */
  readonly model: MeasurementModel;
  /** The named input quantities. */
  readonly inputs: InputQuantities;
  /** Correlation coefficients between pairs of Gaussian inputs (default: none). */
  readonly correlations?: readonly Correlation[];
  /** Number of trials M (integer, at least enough for one coverage interval). Default 10⁶. Not with `adaptive`. */
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
  /** The model's analytic gradient, passed to the law of propagation for the comparison. */
  readonly gradient?: (x: Readonly<Record<string, number>>) => Readonly<Record<string, number>>;
  /** Return the model values in trial order (`values`). Default false. */
  readonly returnValues?: boolean;
}

/** The result of {@link monteCarlo}. */
export interface MonteCarloResult {
  /** The estimate y: the average of the model values (JCGM 101 7.6). */
  readonly value: number;
  /** The standard uncertainty u(y): their standard deviation (JCGM 101 7.6). */
  readonly standardUncertainty: number;
  /** The probabilistically symmetric coverage interval (JCGM 101 7.7.1). */
  readonly interval: Interval;
  /** The shortest coverage interval (JCGM 101 7.7.2). */
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

/** A checked Monte Carlo set-up, shared by the in-process runner and the worker pool. */
export interface MonteCarloSetup {
  readonly plan: EnginePlan;
  readonly settings: DriverSettings;
  readonly seed: number;
  readonly coverage: number;
  readonly significantDigits: number;
  readonly compareWithGum: boolean;
}

/** Checks the options of a run (everything but the model) and builds its plan. */
export function prepareMonteCarlo(o: Record<string, unknown>): MonteCarloSetup {
  const inputs = normalizeInputs(o['inputs']);
  const names = inputs.map((q) => q.name);
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
  const adaptiveOption = o['adaptive'];
  let adaptive: DriverSettings['adaptive'];
  if (adaptiveOption !== undefined && adaptiveOption !== false) {
    if (o['trials'] !== undefined) {
      throw new BridgeworkError(
        'conflicting-options',
        '`trials` must not be given with `adaptive` (the procedure chooses the number of trials)',
        {
          param: 'trials',
          value: o['trials'],
        },
      );
    }
    const a = adaptiveOption === true ? {} : checkObject('adaptive', adaptiveOption);
    const maxTrials =
      a['maxTrials'] === undefined
        ? 1e7
        : checkInteger('adaptive.maxTrials', a['maxTrials'], { min: 2 * BLOCK_TRIALS, max: 1e9 });
    const interval =
      a['interval'] === undefined
        ? 'symmetric'
        : checkOneOf('adaptive.interval', a['interval'], ['symmetric', 'shortest', 'both'] as const);
    adaptive = { significantDigits, maxTrials, interval };
  }
  const least = minimumTrials(coverage);
  const trials =
    o['trials'] === undefined ? 1e6 : checkInteger('trials', o['trials'], { min: least, max: 1e9 });

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
  return {
    plan,
    settings: { trials, coverage, adaptive, returnValues: o['returnValues'] === true },
    seed,
    coverage,
    significantDigits,
    compareWithGum: o['compareWithGum'] !== false,
  };
}

/** The law of propagation for the comparison (unless `compareWithGum` is false). */
export function gumFor(
  setup: MonteCarloSetup,
  o: Record<string, unknown>,
  model: MeasurementModel,
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
 * The model is called once per trial with one reused, read-only record whose properties are
 * getters reading the current trial: nothing is allocated per trial. It must not keep the record
 * or write to it. The same record shape is passed by {@link propagate}, so a model evaluated by
 * both stays fast; calling the same model function elsewhere with other objects may slow it.
 *
 * Memory: about 10·M bytes at the peak — 8·M for the model values, 1.2·M for the two tails and
 * 0.75·M while one is sorted — plus 16 KB per input, and 8·M more with `returnValues`; 10⁶ trials
 * hold about 10 MB. The adaptive procedure holds up to twice the model values it has used, plus
 * one sequence. Nothing stays allocated after the run but the 16 KB per input of the cached
 * trial record.
 *
 * @param options - Model, inputs, correlations, trials or adaptive, seed, coverage, comparison.
 * @returns Estimate, standard uncertainty, both coverage intervals, trials, and the GUM comparison.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` unless `model` is a function
 *   returning a number; `model-not-finite` when it returns NaN or ±Infinity for a trial (the
 *   message shows the trial's inputs); the input codes of {@link standardUncertaintyOf} and of
 *   {@link propagate}; `conflicting-options` for a correlation with a non-Gaussian input, or
 *   `trials` with `adaptive`; `not-integer`, `out-of-range` for bad trials, seed or digits;
 *   `not-converged` when the adaptive procedure exceeds `maxTrials`.
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
  const o = checkObject('options', options);
  const model = checkModel(o['model']) as EngineModel;
  const setup = prepareMonteCarlo(o);
  const runner = createBlockRunner(setup.plan, model);
  let run: DriverResult;
  try {
    const procedure = runProcedure(setup.settings);
    let step = procedure.next();
    while (!step.done) {
      const request = step.value;
      step = procedure.next(
        request.kind === 'blocks'
          ? runLocally(runner, request)
          : sampleIntervalsInPlace(request.values, request.coverage),
      );
    }
    run = step.value;
  } finally {
    runner.release();
  }
  return monteCarloResult(setup, run, gumFor(setup, o, model));
}

function runLocally(runner: ReturnType<typeof createBlockRunner>, request: BlockRequest): BlockReply {
  const values = new Float64Array(request.trials);
  const stats = new Float64Array(2 * request.blockCount);
  for (let b = 0; b < request.blockCount; b++) {
    const count = Math.min(BLOCK_TRIALS, request.trials - b * BLOCK_TRIALS);
    runner.runBlock(request.firstBlock + b, count, values, b * BLOCK_TRIALS, stats, b);
  }
  return { values, stats };
}
