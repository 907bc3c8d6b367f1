import {
  BridgeworkError,
  checkInteger,
  checkLength,
  checkOhms,
  checkOptions,
  checkRange,
  checkVolts,
  formatValue,
  microstrainFromStrain,
} from '@bridgework/core';
import { integrateSpectrum } from './bandNoise.js';
import { bridgeNoiseSource } from './bridgeNoiseSource.js';
import {
  bridgeOperatingPoints,
  type BridgeOperatingPoint,
  type BridgeSpan,
} from './bridgeOperatingPoints.js';
import {
  checkAmplifierLimits,
  checkHeadroom,
  type AmplifierLimits,
  type HeadroomIssue,
  type HeadroomValue,
} from './checkHeadroom.js';
import { combineNoise, type NoiseShare } from './combineNoise.js';
import { createAdc, type Adc, type AdcCode, type RatiometricAdc } from './createAdc.js';
import type { DesignCheck } from './DesignCheck.js';
import type { Interval } from '@bridgework/core';
import { bandwidthOf, checkFilter, type NoiseFilter } from './filters.js';
import { checkAmplifierNoise, frontEndSpectra, type AmplifierNoiseOptions } from './inputNoiseDensity.js';
import { checkGain, checkHertz, checkNoiseRmsVolts } from './internal/domain.js';
import { finiteFigures } from './internal/finiteFigures.js';

/** The keys a budget's `amplifier` holds besides its noise. */
const amplifierTopologyKeys = ['secondStageGain', 'outputReferenceVolts', 'inputSeriesOhms', 'limits'];
import { checkBoolean } from './internal/checkBoolean.js';
import { checkTemperature } from './johnsonNoiseDensity.js';
import { PEAK_TO_PEAK_PER_RMS } from './resolution.js';
import {
  checkSelfHeatingLimit,
  selfHeatingVerdict,
  type SelfHeatingIssue,
  type SelfHeatingLimit,
  type SelfHeatingOptions,
  type SelfHeatingValue,
} from './selfHeating.js';

/** The amplifier of a budget: its noise, topology and limits. */
export interface BudgetAmplifierOptions extends AmplifierNoiseOptions {
  /** Gain of the second (difference) stage (> 0); the first stage has gain/secondStageGain. Default 1. */
  readonly secondStageGain?: number;
  /** Output reference voltage in V. Default 0. */
  readonly outputReferenceVolts?: number;
  /** Resistances in series with the inputs `[to S+, to S−]` in Ω (sense leads, protection, RFI filter). Default `[0, 0]`. */
  readonly inputSeriesOhms?: readonly [number, number];
  /** Common-mode, differential, first-stage and output limits (see {@link AmplifierLimits}). Default: none checked. */
  readonly limits?: AmplifierLimits;
}

/** The converter of a budget (its gain is the amplifier gain being budgeted). */
export interface BudgetAdcOptions {
  /** Resolution in bits, an integer in [1, 32]. */
  readonly bits: number;
  /** Reference in V (> 0). Required unless ratiometric; ratiometric, it is the excitation (default `excitationVolts`). */
  readonly referenceVolts?: number;
  /** Bipolar coding. Default true. */
  readonly bipolar?: boolean;
  /** The reference is the excitation. Default false. */
  readonly ratiometric?: boolean;
  /**
   * The converter's own input-referred rms noise in V at the gain budgeted (> 0), as its data sheet
   * tabulates it for the data rate and filter used; a function of the gain for a PGA table. Replaces
   * the ideal quantization noise q/√12. Default: ideal quantization only.
   */
  readonly noiseRmsVolts?: number | ((gain: number) => number);
}

/** Options of {@link resolutionBudget}. */
export interface ResolutionBudgetOptions {
  /** The span to measure: strain on a strain bridge, or ratio on a transducer. */
  readonly span: BridgeSpan;
  /** Excitation EMF in V (> 0). */
  readonly excitationVolts: number;
  /** Potential of E− relative to the amplifier ground in V. Default 0. */
  readonly excitationLowVolts?: number;
  /** Temperature of the bridge in °C, for its thermal noise. Default 25. */
  readonly temperatureCelsius?: number;
  /** Total gain from the bridge to the quantizer (> 0). */
  readonly gain: number;
  /** Amplifier noise, topology and limits. Default: noiseless, no limits. */
  readonly amplifier?: BudgetAmplifierOptions;
  /** The converter. */
  readonly adc: BudgetAdcOptions;
  /** The filter that sets the noise bandwidth (usually the converter's digital filter). */
  readonly filter: NoiseFilter;
  /** Lowest frequency for 1/f noise in Hz (> 0); required when a 1/f corner is given. */
  readonly lowHertz?: number;
  /** Peak-to-peak per rms for noise-free figures (> 0). Default 6.6 (common practice). */
  readonly peakToPeakFactor?: number;
  /** Self-heating limit of the gauges. Default: gauge power reported, not checked. */
  readonly selfHeating?: SelfHeatingOptions;
}

/** One input-referred noise line of a budget. */
export interface BudgetNoiseTerm extends NoiseShare {
  /** rms in V, input-referred (equal to `value`). */
  readonly rmsVolts: number;
  /** peakToPeakFactor × rms in V. */
  readonly peakToPeakVolts: number;
}

/** The input-referred noise of a budget, by source. */
export interface BudgetNoise {
  /**
   * `'bridge-thermal'`, `'amplifier-voltage'`, `'amplifier-current'`, `'amplifier-output'`, and
   * `'quantization'` (ideal, q/√12) or `'adc'` (the converter's own noise when given).
   */
  readonly terms: readonly BudgetNoiseTerm[];
  /** Root-sum-square of the terms, V rms. */
  readonly totalRmsVolts: number;
  /** peakToPeakFactor × total, V. */
  readonly totalPeakToPeakVolts: number;
  /** ENBW of the filter in Hz. */
  readonly noiseBandwidthHertz: number;
  /** The resistance whose thermal noise the amplifier sees (bridge output plus input series resistances), in Ω. */
  readonly sourceOhms: number;
}

/** The resolution a channel delivers (see {@link resolutionBudget}). */
export interface BudgetResolution {
  /** rms noise in measurand units (m/m or V/V). */
  readonly rms: number;
  /** Peak-to-peak (noise-free) resolution in measurand units. */
  readonly noiseFree: number;
  /** rms noise in µε (strain spans; `undefined` for ratio spans). */
  readonly rmsMicrostrain: number | undefined;
  /** Noise-free resolution in µε (strain spans; `undefined` for ratio spans). */
  readonly noiseFreeMicrostrain: number | undefined;
  /** rms noise in counts. */
  readonly rmsCounts: number;
  /** Span / peak-to-peak noise: the noise-free counts (divisions) over the span. */
  readonly noiseFreeCounts: number;
  /** log2(noiseFreeCounts): noise-free bits over the span. */
  readonly noiseFreeBitsOverSpan: number;
  /** IEEE Std 1241 effective bits over the converter's full scale. */
  readonly effectiveBits: number;
  /** Noise-free bits over the converter's full scale. */
  readonly noiseFreeBits: number;
}

/** One operating point of a budget with its converter code. */
export interface BudgetPoint extends BridgeOperatingPoint {
  /** The converter's code and flags at this point. */
  readonly adcCode: AdcCode;
}

/** The resolution budget of a channel at one gain (see {@link resolutionBudget}). */
export interface ResolutionBudget {
  /** The gain budgeted. */
  readonly gain: number;
  /** The converter at that gain. */
  readonly adc: Adc;
  /** `'strain'` (m/m) or `'ratio'` (V/V). */
  readonly measurand: 'strain' | 'ratio';
  /** The span's ends (and zero), with their codes. */
  readonly points: readonly BudgetPoint[];
  /** Input-referred signal per unit measurand at zero, V per m/m or V per V/V. */
  readonly sensitivityVolts: number;
  /** Counts per unit measurand at zero. */
  readonly countsPerUnit: number;
  /** Input-referred signal per µε in V (strain spans; else `undefined`). */
  readonly voltsPerMicrostrain: number | undefined;
  /** Counts per µε (strain spans; else `undefined`). */
  readonly countsPerMicrostrain: number | undefined;
  /** Differential input at the span's ends in V. */
  readonly spanVolts: Interval;
  /** The noise, by source. */
  readonly noise: BudgetNoise;
  /** The resolution. */
  readonly resolution: BudgetResolution;
  /** Headroom margins and nodes. */
  readonly headroom: HeadroomValue;
  /** The largest power in any gauge over the span, in W (always reported). */
  readonly gaugeWatts: number;
  /** The self-heating check (`undefined` when no limit was given). */
  readonly selfHeating: SelfHeatingValue | undefined;
}

/** A violated limit of a budget: a headroom limit (margin in V) or self-heating (margin in W). */
export type BudgetIssue = HeadroomIssue | SelfHeatingIssue;

/** @internal Validated options shared by {@link resolutionBudget} and gain selection. */
export interface BudgetContext {
  readonly operating: ReturnType<typeof bridgeOperatingPoints>;
  readonly excitationVolts: number;
  readonly topology: {
    readonly secondStageGain: number;
    readonly outputReferenceVolts: number;
    readonly limits: ReturnType<typeof checkAmplifierLimits>;
  };
  readonly adc: { bits: number; referenceVolts: number; bipolar: boolean | undefined; ratiometric: boolean };
  readonly adcNoise: number | ((gain: number) => number) | undefined;
  readonly bridgeNoise: ReturnType<typeof bridgeNoiseSource>;
  readonly rmsBeforeGain: { name: string; rms: number }[];
  readonly noiseBandwidthHertz: number;
  readonly peakToPeakFactor: number;
  readonly selfHeating: SelfHeatingLimit | undefined;
}

/** @internal Validates everything but the gain, and integrates the gain-independent noise once. */
/** The keys of a budget's options, without the gain (`gain` or `gains`). */
const budgetKeys = [
  'span',
  'excitationVolts',
  'excitationLowVolts',
  'temperatureCelsius',
  'amplifier',
  'adc',
  'filter',
  'lowHertz',
  'peakToPeakFactor',
  'selfHeating',
];

/** Peak-to-peak per rms factors accepted (common practice uses 6 to 8). */
const PEAK_TO_PEAK_LIMITS = { min: 1, max: 100 } as const;

/** @internal Validates everything but the gain (`gainKey`), and integrates the gain-independent noise once. */
export function budgetContext(
  options: Omit<ResolutionBudgetOptions, 'gain'>,
  gainKey: string,
): BudgetContext {
  const o = checkOptions('options', options, {
    known: [...budgetKeys, gainKey],
    required: ['span', 'excitationVolts', 'adc', 'filter', gainKey],
  });
  const excitationVolts = checkVolts('excitationVolts', o['excitationVolts']);
  const operating = bridgeOperatingPoints({
    span: o['span'] as BridgeSpan,
    excitationVolts,
    ...(o['excitationLowVolts'] === undefined
      ? {}
      : { excitationLowVolts: o['excitationLowVolts'] as number }),
  });
  const temperatureCelsius = checkTemperature('temperatureCelsius', o['temperatureCelsius']);
  const amplifier = o['amplifier'] === undefined ? {} : (o['amplifier'] as Record<string, unknown>);
  const ampNoise = checkAmplifierNoise('amplifier.', o['amplifier'], amplifierTopologyKeys);
  const topology = {
    secondStageGain:
      amplifier['secondStageGain'] === undefined
        ? 1
        : checkGain('amplifier.secondStageGain', amplifier['secondStageGain']),
    outputReferenceVolts:
      amplifier['outputReferenceVolts'] === undefined
        ? 0
        : checkVolts('amplifier.outputReferenceVolts', amplifier['outputReferenceVolts'], { signed: true }),
    limits: checkAmplifierLimits('amplifier.limits', amplifier['limits']),
  };
  const series =
    amplifier['inputSeriesOhms'] === undefined
      ? undefined
      : checkLength<unknown>('amplifier.inputSeriesOhms', amplifier['inputSeriesOhms'], 2).map((r, i) =>
          checkOhms(`amplifier.inputSeriesOhms[${i}]`, r, { allowZero: true }),
        );

  const a = checkOptions('adc', o['adc'], {
    known: ['bits', 'referenceVolts', 'bipolar', 'ratiometric', 'noiseRmsVolts'],
    required: ['bits'],
  });
  const bits = checkInteger('adc.bits', a['bits'], { min: 1, max: 32 });
  const ratiometric = checkBoolean('adc.ratiometric', a['ratiometric'], false);
  let referenceVolts: number;
  if (ratiometric) {
    referenceVolts =
      a['referenceVolts'] === undefined
        ? excitationVolts
        : checkVolts('adc.referenceVolts', a['referenceVolts']);
    if (referenceVolts !== excitationVolts) {
      throw new BridgeworkError(
        'conflicting-options',
        `\`adc.referenceVolts\` must equal \`excitationVolts\` (${excitationVolts}) for a ratiometric converter, whose reference is the excitation; got ${formatValue(referenceVolts)}`,
        { param: 'adc.referenceVolts', value: referenceVolts, limit: excitationVolts },
      );
    }
  } else {
    if (a['referenceVolts'] === undefined) {
      throw new BridgeworkError(
        'missing-option',
        '`adc.referenceVolts` must be given for a non-ratiometric converter; got undefined',
        {
          param: 'adc.referenceVolts',
        },
      );
    }
    referenceVolts = checkVolts('adc.referenceVolts', a['referenceVolts']);
  }
  const adcNoiseRaw = a['noiseRmsVolts'];
  const adcNoise =
    adcNoiseRaw === undefined || typeof adcNoiseRaw === 'function'
      ? (adcNoiseRaw as ((gain: number) => number) | undefined)
      : checkNoiseRmsVolts('adc.noiseRmsVolts', adcNoiseRaw);

  const filter = checkFilter('filter', o['filter']);
  const noiseBandwidthHertz = bandwidthOf(filter);
  const lowHertz = o['lowHertz'] === undefined ? undefined : checkHertz('lowHertz', o['lowHertz']);
  const peakToPeakFactor =
    o['peakToPeakFactor'] === undefined
      ? PEAK_TO_PEAK_PER_RMS
      : checkRange('peakToPeakFactor', o['peakToPeakFactor'], PEAK_TO_PEAK_LIMITS);

  const bridgeNoise = bridgeNoiseSource({
    armsOhms: operating.zeroArmsOhms,
    sourceOhms: operating.seriesOhms,
    temperatureCelsius,
    ...(series === undefined ? {} : { inputSeriesOhms: series as [number, number] }),
  });
  // Integrate each spectrum at unit gain; only the output-noise term scales (as 1/gain).
  const spectra = frontEndSpectra(bridgeNoise, ampNoise, 1);
  const rmsBeforeGain = spectra.map((s) => ({
    name: s.name,
    rms: integrateSpectrum(s.white, s.corner, filter, noiseBandwidthHertz, lowHertz, 'lowHertz'),
  }));
  return {
    operating,
    excitationVolts,
    topology,
    adc: { bits, referenceVolts, bipolar: checkBoolean('adc.bipolar', a['bipolar'], true), ratiometric },
    adcNoise,
    bridgeNoise,
    rmsBeforeGain,
    noiseBandwidthHertz,
    peakToPeakFactor,
    selfHeating:
      o['selfHeating'] === undefined ? undefined : checkSelfHeatingLimit('selfHeating.', o['selfHeating']),
  };
}

/** @internal The headroom check of a context at one gain. */
export function headroomAt(ctx: BudgetContext, gain: number, adc: Adc) {
  const { secondStageGain, outputReferenceVolts, limits } = ctx.topology;
  return checkHeadroom({
    points: ctx.operating.points.map((p) => ({
      differentialVolts: p.differentialVolts,
      commonModeVolts: p.commonModeVolts,
    })),
    gain,
    adc,
    secondStageGain,
    outputReferenceVolts,
    limits: {
      ...(limits.commonMode === undefined ? {} : { inputCommonModeVolts: limits.commonMode }),
      ...(limits.differential === undefined ? {} : { inputDifferentialVolts: limits.differential }),
      ...(limits.firstStage === undefined ? {} : { firstStageVolts: limits.firstStage }),
      ...(limits.output === undefined ? {} : { outputVolts: limits.output }),
    },
  });
}

/** @internal The converter of a context at one gain. */
export function adcAt(ctx: BudgetContext, gain: number): Adc {
  return createAdc({
    bits: ctx.adc.bits,
    referenceVolts: ctx.adc.referenceVolts,
    gain,
    ratiometric: ctx.adc.ratiometric,
    ...(ctx.adc.bipolar === undefined ? {} : { bipolar: ctx.adc.bipolar }),
  });
}

/** @internal The budget of a validated context at one gain. */
export function budgetAt(
  ctx: BudgetContext,
  gainValue: unknown,
  gainParam = 'gain',
): DesignCheck<ResolutionBudget, BudgetIssue> {
  const gain = checkGain(gainParam, gainValue);
  const adc = adcAt(ctx, gain);
  const headroom = headroomAt(ctx, gain, adc);
  const op = ctx.operating;
  const p = ctx.peakToPeakFactor;

  let converterTerm: { name: string; rms: number };
  if (ctx.adcNoise === undefined) {
    converterTerm = { name: 'quantization', rms: adc.quantizationNoiseRmsVolts };
  } else {
    const rms = typeof ctx.adcNoise === 'number' ? ctx.adcNoise : ctx.adcNoise(gain);
    converterTerm = { name: 'adc', rms: checkNoiseRmsVolts('adc.noiseRmsVolts', rms) };
  }
  const lines = ctx.rmsBeforeGain.map((t) =>
    t.name === 'amplifier-output' ? { ...t, rms: t.rms / gain } : t,
  );
  lines.push(converterTerm);
  const combined = combineNoise(lines.map((l) => ({ name: l.name, value: l.rms })));
  const sigma = combined.total;

  // Codes from the input voltage: for a ratiometric converter, whose reference is the excitation
  // E, this is gain·Vd/E·s, the same exact decision its headroom check makes.
  const ratiometric = adc.ratiometric;
  const points = op.points.map((pt) => ({ ...pt, adcCode: adc.codeFromVolts(pt.differentialVolts) }));
  const countsPerUnit = ratiometric
    ? op.sensitivityRatio * (adc as RatiometricAdc).countsPerRatio
    : op.sensitivityVolts * adc.countsPerVolt;
  const spanMin = op.points[0]!.differentialVolts;
  const spanMax = op.points[op.points.length - 1]!.differentialVolts;
  const rms = sigma / op.sensitivityVolts;
  const strain = op.measurand === 'strain';
  const noiseFreeCounts = (spanMax - spanMin) / (p * sigma);

  const hottestOf = (pt: BridgeOperatingPoint): number =>
    Math.max(...pt.armWatts.filter((_, i) => op.gaugeArms[i]));
  const hottest = op.points.reduce((best, pt) => (hottestOf(pt) > hottestOf(best) ? pt : best));
  const gaugeWatts = hottestOf(hottest);
  const heating =
    ctx.selfHeating === undefined
      ? undefined
      : selfHeatingVerdict(hottest.armWatts, gaugeWatts, ctx.excitationVolts, ctx.selfHeating);

  const budget: ResolutionBudget = {
    gain,
    adc,
    measurand: op.measurand,
    points,
    sensitivityVolts: op.sensitivityVolts,
    countsPerUnit,
    // Per µε: the per-(m/m) figure divided by the exact integer 10⁶.
    voltsPerMicrostrain: strain ? op.sensitivityVolts / 1e6 : undefined,
    countsPerMicrostrain: strain ? countsPerUnit / 1e6 : undefined,
    spanVolts: { min: spanMin, max: spanMax },
    noise: {
      terms: combined.terms.map((t) => ({ ...t, rmsVolts: t.value, peakToPeakVolts: p * t.value })),
      totalRmsVolts: sigma,
      totalPeakToPeakVolts: p * sigma,
      noiseBandwidthHertz: ctx.noiseBandwidthHertz,
      sourceOhms: ctx.bridgeNoise.outputOhms,
    },
    resolution: {
      rms,
      noiseFree: p * rms,
      rmsMicrostrain: strain ? microstrainFromStrain(rms) : undefined,
      noiseFreeMicrostrain: strain ? microstrainFromStrain(p * rms) : undefined,
      rmsCounts: sigma * adc.countsPerVolt,
      noiseFreeCounts,
      noiseFreeBitsOverSpan: Math.log2(noiseFreeCounts),
      effectiveBits: adc.effectiveBits(sigma),
      noiseFreeBits: adc.noiseFreeBits(sigma, p),
    },
    headroom: headroom.value,
    gaugeWatts,
    selfHeating: heating?.value,
  };
  const issues: BudgetIssue[] = [...headroom.issues, ...(heating?.issues ?? [])];
  return { ok: issues.length === 0 && finiteFigures(budget), value: budget, issues };
}

/**
 * The resolution budget of a bridge channel at one gain: signal and counts per unit, noise by
 * source (rms and peak-to-peak), resolution in strain (µε) or ratio, noise-free counts over the
 * span, headroom margins and gauge self-heating.
 *
 * @remarks
 * Signal: the exact slope of the bridge at zero (`createStrainBridge(...).sensitivity`, leads
 * included) times the excitation; counts per unit = that × countsPerVolt, or
 * sensitivity × countsPerRatio when ratiometric (quarter bridge, GF 2, 24 bits, gain 128:
 * 0.5 × 2^30 × 10⁻⁶ = 536.870912 counts per µε). The slope at zero is used for the resolution
 * figures; a quarter bridge's slope falls by about GF·ε/2 relative at strain ε.
 *
 * Noise (input-referred, uncorrelated, combined by root-sum-square): bridge thermal noise of the
 * output resistance with any input series resistance ({@link bridgeNoiseSource}), amplifier
 * voltage noise with its 1/f corner, amplifier current noise through the bridge, amplifier output
 * noise divided by the gain, each integrated through the filter ({@link bandNoiseRms}); plus the
 * converter: ideal quantization q/√12 ({@link quantizationNoiseRms}), or the data sheet's
 * input-referred noise when `adc.noiseRmsVolts` is given. Peak-to-peak = 6.6 × rms
 * (common practice). Resolution = noise / signal; noise-free counts = span / peak-to-peak.
 *
 * Headroom ({@link checkHeadroom}) at the span's ends and zero ({@link bridgeOperatingPoints}),
 * including the converter's code range; self-heating ({@link checkSelfHeating}) from the largest
 * gauge power over the span. Not included: excitation or reference noise in non-ratiometric use,
 * thermal EMFs, interference, drift, and averaging (see {@link averagingGain}).
 *
 * @param options - Span, excitation, gain, amplifier, converter, filter and limits.
 * @returns `{ ok, value, issues }`: the budget, and every violated headroom or self-heating limit.
 * Domains: resistances and voltages as in the core package (`OHMS_LIMITS`, `VOLTS_LIMITS`),
 * frequencies in [1e-9, 1e12] Hz, noise densities up to 1 per √Hz, gains in [1e-9, 1e9], the
 * converter's own noise in [1e-15, 1e6] V rms, the peak-to-peak factor in [1, 100]: within them
 * every figure of the budget is finite, and `ok` is false whenever one is not.
 *
 * @throws {@link @bridgework/core!BridgeworkError} for invalid inputs, each with its own code and
 *   the caller's param (`missing-option` for `adc.referenceVolts` of a non-ratiometric converter,
 *   or `lowHertz` with a 1/f corner, or a required option; `conflicting-options` for a ratiometric
 *   reference other than the excitation; `out-of-range` outside the domains above;
 *   `unknown-option` for a key it does not know, at any level: `amplifier`, `adc`, `filter`,
 *   `span`, `selfHeating`, naming the closest).
 * @example
 * ```ts
 * const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
 * const { value } = resolutionBudget({
 *   span: { bridge, strainRange: { min: -2e-3, max: 2e-3 } },
 *   excitationVolts: 5,
 *   gain: 128,
 *   adc: { bits: 24, ratiometric: true },
 *   filter: { kind: 'sinc', order: 3, dataRateHertz: 10 },
 * });
 * value.countsPerMicrostrain; // 536.870912
 * ```
 */
export function resolutionBudget(
  options: ResolutionBudgetOptions,
): DesignCheck<ResolutionBudget, BudgetIssue> {
  const ctx = budgetContext(options, 'gain');
  return budgetAt(ctx, (options as unknown as Record<string, unknown>)['gain']);
}
