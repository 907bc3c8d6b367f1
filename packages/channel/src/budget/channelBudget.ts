/**
 * The channel budget: noise, resolution and headroom from the chain package, the exact map's
 * sensitivity, informative lines (nonlinearity of a linear map, lead desensitization, the kind's
 * own), the combined uncertainty through the uncertainty package (GUM; Monte Carlo on request)
 * over the channel's parametric model, and the design checks a reviewing engineer would make.
 */
import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkOptions,
  checkPositive,
  checkRange,
  formatValue,
  type Interval,
} from '@bridgework/core';
import {
  resolutionBudget,
  type BudgetIssue,
  type DesignCheck,
  type ResolutionBudget,
} from '@bridgework/chain';
import {
  MONTE_CARLO_MAX_TRIALS,
  monteCarlo,
  type AbortSignalLike,
  propagate,
  type InputQuantities,
  type MonteCarloProgress,
  type MonteCarloResult,
  type PositionalModel,
  type Propagation,
} from '@bridgework/uncertainty';
import type { Channel } from '../Channel.js';
import {
  createFastModel,
  exactParametricModel,
  fastModelAgrees,
  type ParametricModel,
} from '../internal/fastModel.js';
import { channelInternals } from '../internal/makeChannel.js';
import type { Mapping } from '../internal/mapping.js';
import { leadDriftOhms, type ResolvedChannel } from '../internal/resolve.js';
import { budgetSideOf } from '../kinds/budgetRegistry.js';
import { Parameter } from '../kinds/SensorKind.js';
import { differenceFromBaseUnit, formatQuantity, formatSignificant } from '../units/quantity.js';
import type { ChannelBudgetLine } from './ChannelBudgetLine.js';
import { designChecks, type ChannelDesignCheck, type DesignLimits } from './designChecks.js';
import { inChannelTerms } from './frontEndErrors.js';

/** Monte Carlo settings of a budget. */
export interface MonteCarloBudgetOptions {
  /** Number of trials, an integer in [1000, 5·10⁷] (the uncertainty package's bound by memory). Default 10⁶ (JCGM 101 7.2.2). */
  readonly trials?: number;
  /** Seed of the random streams, an integer in [0, 2⁵³ − 1]. Default 1. */
  readonly seed?: number;
  /** Keep the model values in trial order in `monteCarlo.values` (8 bytes per trial). Default false. */
  readonly returnValues?: boolean;
  /** Called as the trials are done (the uncertainty package's `onProgress`: after every block of 16 384 trials). */
  readonly onProgress?: (progress: MonteCarloProgress) => void;
  /**
   * Stops the run once `signal.aborted` is true (the uncertainty package's `signal`, read before
   * the run and after every block of 16 384 trials): the budget throws `signal.reason`, or a
   * `closed` error when it has none. In one thread only `onProgress` or another thread (through
   * shared memory) can set it while the run is busy. An `AbortController`'s `signal` will do.
   */
  readonly signal?: AbortSignalLike;
}

/** Options of {@link channelBudget}. */
export interface ChannelBudgetOptions {
  /** The quantity at which the budget is evaluated, in the channel's unit. Default: the end of the span of larger magnitude. */
  readonly at?: number;
  /** Also run a Monte Carlo evaluation (JCGM 101): `true` for 10⁶ trials, or its settings. Default false. */
  readonly monteCarlo?: boolean | MonteCarloBudgetOptions;
  /** Peak-to-peak per rms for noise-free figures (> 0). Default 6.6 (common practice). */
  readonly peakToPeakFactor?: number;
  /** Coverage probability of the expanded uncertainty, in [0.5, 0.9999]. Default: the spec's `tolerances.coverageProbability`. */
  readonly coverageProbability?: number;
  /** Thresholds of the design checks (see {@link DesignLimits}). */
  readonly limits?: DesignLimits;
}

/** A noise source referred to the output. */
export interface ChannelNoiseTerm {
  /** `'bridge-thermal'`, `'amplifier-voltage'`, `'amplifier-current'`, `'amplifier-output'`, `'quantization'` or `'adc'`. */
  readonly source: string;
  /** rms noise at the amplifier input, V. */
  readonly rmsVolts: number;
  /** rms noise in the channel's unit. */
  readonly rms: number;
  /** Peak-to-peak (peakToPeakFactor × rms) in the channel's unit. */
  readonly peakToPeak: number;
  /** Share of the total noise power, 0…1. */
  readonly fractionOfPower: number;
}

/** The budget of a channel at one operating point (see {@link channelBudget}). */
export interface ChannelBudget {
  /** Channel name. */
  readonly channel: string;
  /** Output quantity. */
  readonly quantity: string;
  /** The channel's unit (every figure below is in it unless named otherwise). */
  readonly unit: string;
  /** The quantity at which the budget is evaluated. */
  readonly at: number;
  /** The converter code at that point (fractional: the exact inverse). */
  readonly code: number;
  /** The span of interest (closed). */
  readonly span: Interval;
  /** Output per code at the budget point (exact map), unit per count. */
  readonly quantityPerCode: number;
  /** Output per volt at the amplifier input at the budget point, unit per V. */
  readonly quantityPerVolt: number;
  /** Noise by source, referred to the output. */
  readonly noise: {
    /** Equivalent noise bandwidth of the converter's filter, Hz. */
    readonly bandwidthHertz: number;
    /** Each source. */
    readonly terms: readonly ChannelNoiseTerm[];
    /** Root-sum-square of the sources, rms. */
    readonly totalRms: number;
    /** Peak-to-peak (peakToPeakFactor × rms). */
    readonly totalPeakToPeak: number;
  };
  /** Resolution figures. */
  readonly resolution: {
    /** One converter step. */
    readonly quantityPerCode: number;
    /** rms noise. */
    readonly rms: number;
    /** Noise-free (peak-to-peak) resolution. */
    readonly noiseFree: number;
    /** Span / peak-to-peak noise: the noise-free divisions of the span. */
    readonly noiseFreeCounts: number;
    /** rms-based resolution over the converter's full scale, log2(FSR/(σ·√12)) (IEEE Std 1241 effective bits). */
    readonly effectiveBits: number;
    /** Peak-to-peak-based resolution over the full scale, log2(FSR/(peakToPeakFactor·σ)) (noise-free bits). */
    readonly noiseFreeBits: number;
  };
  /** Every line, informative and contributing. */
  readonly lines: readonly ChannelBudgetLine[];
  /** The combined uncertainty by the law of propagation (JCGM 100). */
  readonly combined: Propagation;
  /** The Monte Carlo evaluation (JCGM 101), when requested. */
  readonly monteCarlo: MonteCarloResult | undefined;
  /**
   * How the uncertainty model was evaluated: `'closed-form'` (the kind's straight-line arithmetic
   * of the parameters, checked against the exact composed map at every input's limits) or
   * `'composed'` (the exact map rebuilt per evaluation: slower).
   */
  readonly model: 'closed-form' | 'composed';
  /** Headroom, noise and self-heating checks of the front end (chain). */
  readonly frontEnd: DesignCheck<ResolutionBudget, BudgetIssue>;
  /** The design checks (span, uncertainty, noise, headroom, finite figures, plausible inputs). */
  readonly checks: readonly ChannelDesignCheck[];
  /** True when no check of severity `'error'` failed. */
  readonly ok: boolean;
  /** The safety caution. */
  readonly caution: string;
}

/** The caution every budget carries. */
export const BUDGET_CAUTION =
  'Results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.';

/** The most Monte Carlo trials a budget runs: the uncertainty package's bound (10 bytes per trial). */
export const MAX_BUDGET_TRIALS = MONTE_CARLO_MAX_TRIALS;

/** One uncertain input of the parametric model. */
interface UncertainInput {
  readonly name: string;
  readonly index: number;
  readonly halfWidth: number;
  readonly kind: ChannelBudgetLine['kind'];
  readonly model: string;
  /** A normal input of this standard uncertainty instead of rectangular limits (`halfWidth` is then the same number). */
  readonly standardUncertainty?: number;
}

function readMonteCarlo(value: unknown): MonteCarloBudgetOptions | undefined {
  if (value === undefined || value === false) return undefined;
  if (value === true) return {};
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`options.monteCarlo\` must be true, false or a set of Monte Carlo settings ({ trials, seed, returnValues, onProgress, signal }); got ${formatValue(value)}`,
      { param: 'options.monteCarlo', value },
    );
  }
  const o = checkOptions('options.monteCarlo', value, {
    known: ['trials', 'seed', 'returnValues', 'onProgress', 'signal'],
  });
  const signal = o['signal'];
  if (
    signal !== undefined &&
    (typeof signal !== 'object' ||
      signal === null ||
      typeof (signal as { aborted?: unknown }).aborted !== 'boolean')
  ) {
    throw new BridgeworkError(
      'wrong-type',
      `\`options.monteCarlo.signal\` must be an AbortSignal (an object with a boolean \`aborted\`); got ${formatValue(signal)}`,
      { param: 'options.monteCarlo.signal', value: signal },
    );
  }
  if (o['onProgress'] !== undefined && typeof o['onProgress'] !== 'function') {
    throw new BridgeworkError(
      'wrong-type',
      `\`options.monteCarlo.onProgress\` must be a function; got ${formatValue(o['onProgress'])}`,
      {
        param: 'options.monteCarlo.onProgress',
        value: o['onProgress'],
      },
    );
  }
  if (o['trials'] !== undefined)
    checkInteger('options.monteCarlo.trials', o['trials'], { min: 1000, max: MAX_BUDGET_TRIALS });
  if (o['seed'] !== undefined)
    checkInteger('options.monteCarlo.seed', o['seed'], { min: 0, max: Number.MAX_SAFE_INTEGER });
  if (o['returnValues'] !== undefined && typeof o['returnValues'] !== 'boolean') {
    throw new BridgeworkError(
      'wrong-type',
      `\`options.monteCarlo.returnValues\` must be true or false; got ${formatValue(o['returnValues'])}`,
      {
        param: 'options.monteCarlo.returnValues',
        value: o['returnValues'],
      },
    );
  }
  return o as MonteCarloBudgetOptions;
}

/**
 * The channel's error and uncertainty budget at one point of its span, with its design checks.
 *
 * @remarks
 * **Noise and resolution** come from the chain package's `resolutionBudget` (bridge thermal
 * noise, amplifier voltage and current noise, converter or quantization noise over the sinc
 * filter's noise bandwidth), referred to the output by the exact map's slope at the point.
 *
 * **Uncertainty.** The channel's value is a function of the reading (a code, with the noise as a
 * normal standard uncertainty) and plain numeric parameters: gauge factor or rated output,
 * completion resistors, lead resistance (with the copper drift of a cable over
 * `environment.rangeCelsius`), excitation and reference (absolute references only), gain,
 * offset, sensor temperature, and the kind's own (RTD class, thermistor tolerances). Each stated
 * tolerance is a rectangular limit (u = a/√3, JCGM 100 4.3.7). The function is the sensor kind's
 * straight-line closed form, checked against the exact composed map (rebuilt from the owning
 * packages) at every input's limits within 1e-10 of the span; where it disagrees, the exact map
 * is rebuilt per evaluation instead (`model: 'composed'`). The law of propagation (JCGM 100,
 * uncertainty `propagate`) gives the combined and expanded uncertainty; with `monteCarlo` the
 * same function is evaluated by JCGM 101 Monte Carlo (10⁶ trials by default), with its
 * comparison to the GUM result.
 *
 * **Design checks** (see {@link DesignLimits} for the thresholds): the span covers enough codes
 * and a sensible share of the converter's range; the expanded uncertainty and the noise are small
 * against the span; every figure is finite; the front end's headroom (chain); inputs within
 * plausible ranges (warnings). `ok` is false when a check of severity `'error'` fails.
 *
 * @param channel - A channel made by `createChannel`.
 * @param options - Budget point, Monte Carlo, peak-to-peak factor, coverage, limits.
 * @returns The budget.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` (not a channel; `monteCarlo` not a
 *   boolean or settings), `unknown-option`, `out-of-range` (`at` outside what the channel reads,
 *   trials beyond 5·10⁷), `not-integer`, `not-finite`; for a Monte Carlo trial whose inputs give a
 *   reading the sensor cannot produce, `model-not-finite` or the map's own code
 *   (`ratio-out-of-range`), with the trial's inputs; `signal.reason` (or `closed` without one) once
 *   `monteCarlo.signal` is aborted.
 * @example
 * ```ts
 * const budget = channelBudget(channel, { at: 1000 });
 * budget.combined.expandedUncertainty; // in the channel's unit
 * budget.checks.filter((c) => !c.ok); // what a reviewer would flag
 * ```
 */
export function channelBudget(channel: Channel, options: ChannelBudgetOptions = {}): ChannelBudget {
  const { prepared } = channelInternals(channel);
  const o = checkOptions('options', options, {
    known: ['at', 'monteCarlo', 'peakToPeakFactor', 'coverageProbability', 'limits'],
  });
  const { resolved: r, nominal, span } = prepared;
  budgetSideOf(r.kind); // a kind without a budget side is refused before any work
  const spec = r.spec;
  const mc = readMonteCarlo(o['monteCarlo']);
  const ppf =
    o['peakToPeakFactor'] === undefined
      ? 6.6
      : checkPositive('options.peakToPeakFactor', o['peakToPeakFactor']);
  const coverage =
    o['coverageProbability'] === undefined
      ? spec.tolerances.coverageProbability
      : checkRange('options.coverageProbability', o['coverageProbability'], { min: 0.5, max: 0.9999 });
  const at =
    o['at'] === undefined
      ? Math.abs(span.max) >= Math.abs(span.min)
        ? span.max
        : span.min
      : checkFinite('options.at', o['at']);
  const unit = r.unit;
  const { model } = nominal;
  const code = codeAt(nominal, at, unit);
  const quantityPerCode = slopeAt(nominal, code);
  const quantityPerVolt = quantityPerCode * model.adc.countsPerVolt;
  const p0 = r.context.nominal;

  // Noise, resolution, headroom and gauge power from the chain package, over the span.
  const ratioEnds = [model.ratioFromValue(span.min), model.ratioFromValue(span.max)];
  const amp = spec.amplifier;
  const limits = amp.limits;
  const frontEnd = inChannelTerms(() =>
    resolutionBudget({
      span: model.kindMap.frontEndSpan(
        Math.min(...(ratioEnds as [number, number])),
        Math.max(...(ratioEnds as [number, number])),
      ),
      excitationVolts: p0[Parameter.excitationVolts] as number,
      excitationLowVolts: amp.excitationLowVolts,
      temperatureCelsius: spec.environment.temperatureCelsius,
      gain: amp.gain,
      amplifier: {
        inputVoltageNoiseVoltsPerRootHz: amp.inputVoltageNoiseVoltsPerRootHz,
        voltageCornerHertz: amp.voltageCornerHertz,
        currentNoiseAmpsPerRootHz: amp.currentNoiseAmpsPerRootHz,
        currentCornerHertz: amp.currentCornerHertz,
        secondStageGain: amp.secondStageGain,
        outputReferenceVolts: amp.outputReferenceVolts,
        limits: {
          ...(limits?.inputCommonModeVolts === undefined
            ? {}
            : { inputCommonModeVolts: limits.inputCommonModeVolts }),
          ...(limits?.inputDifferentialVolts === undefined
            ? {}
            : { inputDifferentialVolts: limits.inputDifferentialVolts }),
          ...(limits?.firstStageVolts === undefined ? {} : { firstStageVolts: limits.firstStageVolts }),
          ...(limits?.outputVolts === undefined ? {} : { outputVolts: limits.outputVolts }),
        },
      },
      adc: {
        bits: spec.adc.bits,
        referenceVolts: spec.adc.ratiometric ? spec.excitation.volts : spec.adc.referenceVolts,
        bipolar: spec.adc.bipolar,
        ratiometric: spec.adc.ratiometric,
        ...(spec.adc.noiseRmsVolts === undefined ? {} : { noiseRmsVolts: spec.adc.noiseRmsVolts }),
      },
      filter: spec.adc.filter,
      ...(amp.voltageCornerHertz > 0 || amp.currentCornerHertz > 0 ? { lowHertz: 0.01 } : {}),
      peakToPeakFactor: ppf,
    }),
  );
  const fe = frontEnd.value;
  const absPerVolt = Math.abs(quantityPerVolt);
  const terms: ChannelNoiseTerm[] = fe.noise.terms.map((t) => ({
    source: t.name,
    rmsVolts: t.rmsVolts,
    rms: t.rmsVolts * absPerVolt,
    peakToPeak: t.peakToPeakVolts * absPerVolt,
    fractionOfPower: t.fractionOfPower,
  }));
  const noiseRms = fe.noise.totalRmsVolts * absPerVolt;
  const noiseRmsCodes = fe.noise.totalRmsVolts * model.adc.countsPerVolt;

  // The uncertain inputs: the sensor's own first (gauge factor, rated output), then the channel's,
  // then the kind's others (class tolerances, thermistor constants).
  const t = spec.tolerances;
  const uncertain: UncertainInput[] = [];
  const add = (
    name: string,
    index: number,
    halfWidth: number,
    kind: ChannelBudgetLine['kind'],
    text: string,
  ) => {
    if (halfWidth > 0) uncertain.push({ name, index, halfWidth, kind, model: text });
  };
  const atSi = siQuantity(nominal, at);
  const kindInputs = budgetSideOf(r.kind).budgetInputs(r.context as never, atSi);
  for (const input of kindInputs)
    if (input.first === true) add(input.name, input.index, input.halfWidth, input.kind, input.model);
  const percent = (x: number) => `${formatSignificant(x * 100)} %`;
  if (r.kind.placement !== 'own-bridge') {
    add(
      'completion resistors',
      Parameter.completionOhms,
      t.completionOhmsFraction * (p0[Parameter.completionOhms] as number),
      'tolerance',
      `the map with the completion resistors varied over ±${percent(t.completionOhmsFraction)}`,
    );
  }
  const drift = leadDriftOhms(r);
  add(
    'lead resistance',
    Parameter.ohmsPerLead,
    t.ohmsPerLead + drift,
    'leads',
    `the map with the lead resistance varied over ±${formatSignificant(t.ohmsPerLead + drift)} Ω${drift > 0 ? `, including ${formatSignificant(drift, 3)} Ω of copper drift over the cable's temperature range` : ''}`,
  );
  if (!spec.adc.ratiometric) {
    add(
      'excitation',
      Parameter.excitationVolts,
      t.excitationVoltsFraction * (p0[Parameter.excitationVolts] as number),
      'tolerance',
      `the map with the excitation EMF varied over ±${percent(t.excitationVoltsFraction)}`,
    );
    add(
      'converter reference',
      Parameter.referenceVolts,
      t.referenceVoltsFraction * (p0[Parameter.referenceVolts] as number),
      'tolerance',
      `the map with the converter reference varied over ±${percent(t.referenceVoltsFraction)}`,
    );
  }
  // A shunt calibration measured the gain from the bridge to the code (span factor k): the
  // factor's standard uncertainty (the shunt's tolerance and the readings' scatter) replaces the
  // gain tolerance, as a normal input on the effective gain G/k, u(G/k)/(G/k) = u(k)/k.
  const shunt = spec.spanCorrection;
  if (shunt?.factorStandardUncertainty !== undefined && shunt.factorStandardUncertainty > 0) {
    const u = ((p0[Parameter.gain] as number) * shunt.factorStandardUncertainty) / shunt.factor;
    uncertain.push({
      name: 'span correction',
      index: Parameter.gain,
      halfWidth: u,
      standardUncertainty: u,
      kind: 'calibration',
      model: `the shunt calibration's span factor k = ${formatSignificant(shunt.factor)} with u(k)/k = ${formatSignificant(shunt.factorStandardUncertainty / shunt.factor, 3)} (the shunt's tolerance and the readings' scatter), on the gain it measured (replaces the gain tolerance)`,
    });
  } else {
    add(
      'gain',
      Parameter.gain,
      t.gainFraction * (p0[Parameter.gain] as number),
      'tolerance',
      `the map with the gain varied over ±${percent(t.gainFraction)}`,
    );
  }
  add(
    'offset',
    Parameter.offsetVolts,
    t.offsetVolts,
    'tolerance',
    `an input-referred offset within ±${formatQuantity(t.offsetVolts, 'V')} left after zeroing`,
  );
  if (r.kind.temperatureLine !== undefined) {
    const temperature = p0[Parameter.temperatureCelsius] as number;
    const range = spec.environment.rangeCelsius;
    const halfWidth = Math.max(t.temperatureKelvin, temperature - range.min, range.max - temperature);
    add(
      r.kind.temperatureLine,
      Parameter.temperatureCelsius,
      halfWidth,
      'temperature',
      `the map with the sensor temperature varied over ±${formatSignificant(halfWidth)} K (${r.kind.placement === 'own-bridge' ? 'zero and span temperature coefficients' : 'gauge-factor temperature coefficient and thermal output'})`,
    );
  }

  for (const input of kindInputs)
    if (input.first !== true) add(input.name, input.index, input.halfWidth, input.kind, input.model);
  // A calibration against reference loads: the fitted curve's standard uncertainty at the budget
  // point, √(gᵀ·V·g) with g = (1, q, …, q^d) (JCGM 100 H.3, generalised), as a normal offset of
  // the curve in bridge ratio.
  const calibration = spec.calibration;
  if (r.calibrationSlot !== undefined && calibration?.covariance !== undefined) {
    const n = calibration.coefficients.length;
    const g = Array.from({ length: n }, (_, k) => at ** k);
    let variance = 0;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++)
        variance += (g[i] as number) * (calibration.covariance[i * n + j] as number) * (g[j] as number);
    const u = Math.sqrt(Math.max(0, variance));
    if (u > 0 && Number.isFinite(u)) {
      uncertain.push({
        name: 'calibration fit',
        index: r.calibrationSlot,
        halfWidth: u,
        standardUncertainty: u,
        kind: 'calibration',
        model: `the calibration's fitted curve offset by its standard uncertainty at the budget point, ${formatSignificant(u * 1e3)} mV/V (from the coefficients' covariance)`,
      });
    }
  }

  // The parametric model: closed form when it agrees with the exact composed map at every input's limits.
  const spanScale = Math.max(Math.abs(span.min), Math.abs(span.max), Math.abs(span.max - span.min));
  const fast = createFastModel(r);
  const vectors = [
    p0,
    ...uncertain.flatMap((u) =>
      [-1, 1].map((s) => withValue(p0, u.index, (p0[u.index] as number) + s * u.halfWidth)),
    ),
  ];
  const checkCodes = [
    code,
    ...[span.min, span.max].map((v) => model.exactCodeFromRatio(model.ratioFromValue(v))),
  ];
  const useFast = fast !== undefined && fastModelAgrees(r, fast, vectors, checkCodes, spanScale);
  const evaluate: ParametricModel = useFast ? fast : exactParametricModel(r);
  checkReadableAtLimits(evaluate, p0, uncertain, checkCodes, [at, span.min, span.max], unit);

  const inputs: Record<string, InputQuantities[string]> = {
    reading: { value: code, standardUncertainty: noiseRmsCodes },
  };
  for (const u of uncertain)
    inputs[u.name] =
      u.standardUncertainty === undefined
        ? { value: p0[u.index] as number, distribution: 'rectangular', halfWidth: u.halfWidth }
        : { value: p0[u.index] as number, standardUncertainty: u.standardUncertainty };
  const names = uncertain.map((u) => u.name);
  const indices = uncertain.map((u) => u.index);
  // The positional form: the engine hands the inputs over in one array, in `order`; nothing is
  // looked up by name or built per trial.
  const p = p0.slice();
  const k = names.length;
  const slots = Int32Array.from(indices);
  const modelFn: PositionalModel = {
    order: ['reading', ...names],
    evaluate(x) {
      for (let i = 0; i < k; i++) p[slots[i] as number] = x[i + 1] as number;
      return evaluate(x[0] as number, p);
    },
  };
  const combined = propagate({ model: modelFn, inputs, coverage });
  const monte =
    mc === undefined
      ? undefined
      : monteCarlo({
          model: modelFn,
          inputs,
          coverage,
          trials: mc.trials ?? 1_000_000,
          seed: mc.seed ?? 1,
          ...(mc.returnValues === true ? { returnValues: true } : {}),
          ...(mc.onProgress === undefined ? {} : { onProgress: mc.onProgress }),
          ...(mc.signal === undefined ? {} : { signal: mc.signal }),
        });

  const lines: ChannelBudgetLine[] = [];
  lines.push({
    name: 'noise',
    kind: 'noise',
    model: `root-sum-square of ${fe.noise.terms.map((x) => x.name).join(', ')} over the sinc${spec.adc.filter.order} filter's noise bandwidth (${formatSignificant(fe.noise.noiseBandwidthHertz)} Hz), referred to the output by the exact map's slope`,
    inputs: {
      noiseBandwidthHertz: fe.noise.noiseBandwidthHertz,
      rmsVolts: fe.noise.totalRmsVolts,
      rmsCodes: noiseRmsCodes,
      sourceOhms: fe.noise.sourceOhms,
    },
    value: noiseRms,
    standardUncertainty: combined.contributions['reading'],
  });
  lines.push({
    name: 'resolution',
    kind: 'resolution',
    model: 'one converter step at the budget point (its q/√12 quantization noise is part of the noise line)',
    inputs: { bits: spec.adc.bits, gain: amp.gain, lsbVolts: model.adc.lsbVolts },
    value: Math.abs(quantityPerCode),
    standardUncertainty: undefined,
  });
  lines.push(nonlinearityLine(nominal, span));
  const leadLine = leadsLine(r, nominal, at, code);
  if (leadLine !== undefined) lines.push(leadLine);
  for (const u of uncertain) {
    const sensitivity = combined.sensitivities[u.name] as number;
    lines.push({
      name: u.name,
      kind: u.kind,
      model:
        u.standardUncertainty === undefined
          ? `${u.model}; rectangular limits (u = a/√3, JCGM 100 4.3.7)`
          : `${u.model}; normal`,
      inputs:
        u.standardUncertainty === undefined
          ? { estimate: p0[u.index] as number, halfWidth: u.halfWidth, sensitivity }
          : { estimate: p0[u.index] as number, standardUncertainty: u.standardUncertainty, sensitivity },
      value: sensitivity * u.halfWidth,
      standardUncertainty: combined.contributions[u.name],
    });
  }
  for (const line of budgetSideOf(r.kind).budgetLines?.(r.context as never, model.kindMap, atSi) ?? []) {
    lines.push({ ...line, value: differenceFromBaseUnit(line.value, r.dimension, unit) });
  }

  const resolution = {
    quantityPerCode: Math.abs(quantityPerCode),
    rms: noiseRms,
    noiseFree: noiseRms * ppf,
    noiseFreeCounts: (span.max - span.min) / (noiseRms * ppf),
    effectiveBits: fe.resolution.effectiveBits,
    noiseFreeBits: fe.resolution.noiseFreeBits,
  };
  const checks = designChecks({
    resolved: r,
    nominal,
    span,
    frontEnd,
    combined,
    noiseRms,
    resolution,
    lines,
    limits: o['limits'],
    display: channel.display,
  });
  return {
    channel: r.name,
    quantity: spec.output.quantity,
    unit,
    at,
    code,
    span,
    quantityPerCode,
    quantityPerVolt,
    noise: {
      bandwidthHertz: fe.noise.noiseBandwidthHertz,
      terms,
      totalRms: noiseRms,
      totalPeakToPeak: noiseRms * ppf,
    },
    resolution,
    lines,
    combined,
    monteCarlo: monte,
    model: useFast ? 'closed-form' : 'composed',
    frontEnd,
    checks,
    ok: checks.every((c) => c.status !== 'fail'),
    caution: BUDGET_CAUTION,
  };
}

/**
 * Every budget input at either limit of its tolerance must leave the readings of the budget point
 * and the span's ends inside what the sensor can produce (the derivatives and the Monte Carlo
 * trials evaluate the model there): otherwise the span is too close to the end of the sensor's
 * range for these tolerances, and the user is told so in terms of output.range.
 */
function checkReadableAtLimits(
  evaluate: ParametricModel,
  p0: Float64Array,
  uncertain: readonly UncertainInput[],
  codes: readonly number[],
  values: readonly number[],
  unit: string,
): void {
  for (const u of uncertain) {
    for (const s of [-1, 1]) {
      const p = withValue(p0, u.index, (p0[u.index] as number) + s * u.halfWidth);
      codes.forEach((code, i) => {
        let v: number;
        try {
          v = evaluate(code, p);
        } catch {
          v = Number.NaN;
        }
        if (Number.isFinite(v)) return;
        const value = values[i] as number;
        throw new BridgeworkError(
          'out-of-range',
          `the reading at ${formatQuantity(value, unit)} lies past the end of what the sensor covers when the ${u.name} is at its tolerance limit (${s < 0 ? '−' : '+'}${formatSignificant(u.halfWidth)}): the budget cannot be evaluated there; narrow output.range away from that end, or state a smaller tolerance`,
          {
            param: 'output.range',
            value,
            issues: [
              {
                code: 'out-of-range',
                path: 'output.range',
                message: `reaches ${formatQuantity(value, unit)}, where the reading with the ${u.name} at its tolerance limit lies past the end of what the sensor covers`,
                suggestion: 'narrow output.range away from that end, or state a smaller tolerance',
              },
            ],
          },
        );
      });
    }
  }
}

function withValue(p: Float64Array, index: number, value: number): Float64Array {
  const q = p.slice();
  q[index] = value;
  return q;
}

/** The quantity in SI (the kind's terms) for a value in the channel's unit. */
function siQuantity(m: Mapping, value: number): number {
  return m.model.kindMap.quantityFromRatio(m.model.ratioFromValue(value));
}

/**
 * d(value)/d(code) of the exact map at a code: a central difference over up to ±16 codes, shrunk
 * (one-sided at the edges) to stay inside the valid codes. The map is smooth on the scale of a
 * few codes, so the truncation error is far below the figures reported.
 */
function slopeAt(m: Mapping, code: number): number {
  const room = Math.min(16, (m.hi - code) * 0.5, (code - m.lo) * 0.5);
  if (room >= 0.5) return (m.valueFromCode(code + room) - m.valueFromCode(code - room)) / (2 * room);
  const h = Math.min(16, (m.hi - m.lo) * 0.25);
  return m.hi - code < code - m.lo
    ? (m.valueFromCode(code) - m.valueFromCode(code - h)) / h
    : (m.valueFromCode(code + h) - m.valueFromCode(code)) / h;
}

/** The (fractional) code at which the exact map gives `at`. */
function codeAt(m: Mapping, at: number, unit: string): number {
  let code: number;
  try {
    code = m.model.exactCodeFromRatio(m.model.ratioFromValue(at));
  } catch {
    code = Number.NaN;
  }
  if (!(code > m.lo && code < m.hi)) {
    const ends = [m.valueOrNaN(Math.floor(m.lo) + 1), m.valueOrNaN(Math.ceil(m.hi) - 1)] as [number, number];
    const lo = Math.min(...ends);
    const hi = Math.max(...ends);
    throw new BridgeworkError(
      'out-of-range',
      `\`options.at\` must lie inside what the channel reads, [${formatQuantity(lo, unit)}, ${formatQuantity(hi, unit)}]; got ${formatQuantity(at, unit, 8)}`,
      { param: 'options.at', value: at, limit: [lo, hi] },
    );
  }
  return code;
}

/** Largest deviation over the span of the exact map from its terminal line (a linear map's nonlinearity). */
function nonlinearityLine(nominal: Mapping, span: { min: number; max: number }): ChannelBudgetLine {
  const { model } = nominal;
  const codeOf = (q: number) => model.exactCodeFromRatio(model.ratioFromValue(q));
  const c1 = codeOf(span.min);
  const c2 = codeOf(span.max);
  let worst = 0;
  let where = span.min;
  const samples = 256;
  for (let i = 0; i <= samples; i++) {
    const c = c1 + ((c2 - c1) * i) / samples;
    const q = nominal.valueOrNaN(c);
    if (Number.isNaN(q)) continue;
    const line = span.min + ((span.max - span.min) * (c - c1)) / (c2 - c1);
    if (Math.abs(q - line) > Math.abs(worst)) {
      worst = q - line;
      where = q;
    }
  }
  return {
    name: 'nonlinearity of a linear map',
    kind: 'nonlinearity',
    model:
      'largest deviation of the exact map from the terminal line through the span ends (257 points); the channel itself uses the exact map, so this is informative',
    inputs: { spanMin: span.min, spanMax: span.max, atQuantity: where },
    value: worst,
    standardUncertainty: undefined,
  };
}

/** How much the leads reduce the signal at the budget point, as the map corrects it exactly. */
function leadsLine(
  r: ResolvedChannel,
  nominal: Mapping,
  at: number,
  code: number,
): ChannelBudgetLine | undefined {
  const ohms = r.context.nominal[Parameter.ohmsPerLead] as number;
  if (ohms === 0 || r.spec.output.quantity === 'ratio') return undefined;
  const exact = exactParametricModel(r);
  const withoutLeads = exact(code, withValue(r.context.nominal, Parameter.ohmsPerLead, 0));
  return {
    name: 'lead desensitization',
    kind: 'leads',
    model: `${r.spec.bridge.wiring} wiring with ${formatSignificant(ohms)} Ω per lead: the error a map ignoring the leads would make at the budget point (corrected exactly here)`,
    inputs: { ohmsPerLead: ohms, wiring: r.spec.bridge.wiring, leadSource: r.leadSource },
    value: withoutLeads - at,
    standardUncertainty: undefined,
  };
}
