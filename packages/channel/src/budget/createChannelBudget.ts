/**
 * The channel budget: noise and resolution from the chain package, the exact map's sensitivity,
 * the informative lines (nonlinearity of a linear map, lead desensitization), and the combined
 * uncertainty of the converted quantity through the uncertainty package (GUM, Monte Carlo on
 * request), each line naming its model and inputs.
 */
import { BridgeworkError, checkFinite, checkObject } from '@bridgework/core';
import {
  resolutionBudget,
  type BridgeSpan,
  type DesignCheck,
  type ResolutionBudget,
  type BudgetIssue,
} from '@bridgework/chain';
import { rtdToleranceCelsius } from '@bridgework/compensation';
import {
  monteCarlo,
  propagate,
  type InputQuantities,
  type MonteCarloResult,
  type Propagation,
} from '@bridgework/uncertainty';
import { createModel, type ModelParameters } from '../internal/model.js';
import type { Mapping } from '../internal/mapping.js';
import { cableOhmsPerLead, type ResolvedChannel } from '../internal/resolve.js';
import { outputUnits } from '../internal/units.js';

/** Options of a channel's `budget`. */
export interface BudgetOptions {
  /** The quantity at which the budget is evaluated, in the output unit. Default: the end of the span of larger magnitude. */
  readonly at?: number;
  /** Also run a Monte Carlo evaluation (JCGM 101): `true` for 10⁵ trials, or its options. Default false. */
  readonly monteCarlo?: boolean | MonteCarloBudgetOptions;
  /** Peak-to-peak per rms for noise-free figures. Default 6.6 (common practice). */
  readonly peakToPeakFactor?: number;
}

/** Monte Carlo settings of a budget. */
export interface MonteCarloBudgetOptions {
  /** Number of trials (integer). Default 10⁵. */
  readonly trials?: number;
  /** Seed of the random streams. Default 1. */
  readonly seed?: number;
  /**
   * Keep the model values in trial order in `monteCarlo.values` (8 bytes per trial), e.g. to pool
   * several seeded runs and compute coverage intervals over all of them. Default false.
   */
  readonly returnValues?: boolean;
}

/** One line of the budget. */
export interface ChannelBudgetLine {
  /** Short name (`'noise'`, `'gauge factor'`, `'lead resistance'`...). */
  readonly name: string;
  /** What kind of effect it is. */
  readonly kind: 'noise' | 'resolution' | 'nonlinearity' | 'leads' | 'temperature' | 'tolerance';
  /** The model behind the line, in words and equations. */
  readonly model: string;
  /** The inputs of that model, with their units in the names. */
  readonly inputs: Readonly<Record<string, number | string>>;
  /** The size of the effect at the budget point, in the output unit (signed where a sign means something). */
  readonly value: number;
  /** Its contribution to the combined standard uncertainty, in the output unit; `undefined` for informative lines. */
  readonly standardUncertainty: number | undefined;
}

/** A noise source referred to the output. */
export interface ChannelNoiseTerm {
  /** `'bridge-thermal'`, `'amplifier-voltage'`, `'amplifier-current'`, `'amplifier-output'`, `'quantization'` or `'adc'`. */
  readonly source: string;
  /** rms noise at the amplifier input, V. */
  readonly rmsVolts: number;
  /** rms noise in the output unit. */
  readonly rms: number;
  /** Peak-to-peak (peakToPeakFactor × rms) in the output unit. */
  readonly peakToPeak: number;
  /** Share of the total noise power, 0…1. */
  readonly fractionOfPower: number;
}

/** The budget of a channel at one operating point (see `Channel.budget`). */
export interface ChannelBudget {
  /** Channel name. */
  readonly channel: string;
  /** Output quantity and unit. */
  readonly quantity: string;
  /** Output unit. */
  readonly unit: string;
  /** The quantity at which the budget is evaluated. */
  readonly at: number;
  /** The converter code at that point (fractional: the exact inverse). */
  readonly code: number;
  /** The span of interest. */
  readonly span: {
    /** Lower end, output unit. */
    readonly min: number;
    /** Upper end, output unit. */
    readonly max: number;
  };
  /** Output per code at the budget point (exact map), output unit per count. */
  readonly quantityPerCode: number;
  /** Output per volt at the amplifier input at the budget point, output unit per V. */
  readonly quantityPerVolt: number;
  /** Noise by source, referred to the output. */
  readonly noise: {
    /** Equivalent noise bandwidth of the converter's filter, Hz. */
    readonly bandwidthHertz: number;
    /** Each source. */
    readonly terms: readonly ChannelNoiseTerm[];
    /** Root-sum-square of the sources, output unit rms. */
    readonly totalRms: number;
    /** Peak-to-peak (peakToPeakFactor × rms), output unit. */
    readonly totalPeakToPeak: number;
  };
  /** Resolution figures. */
  readonly resolution: {
    /** One converter step in the output unit. */
    readonly quantityPerCode: number;
    /** rms noise in the output unit. */
    readonly rms: number;
    /** Noise-free (peak-to-peak) resolution in the output unit. */
    readonly noiseFree: number;
    /** Span / peak-to-peak noise. */
    readonly noiseFreeCounts: number;
    /** IEEE Std 1241 effective bits over the converter's full scale. */
    readonly effectiveBits: number;
    /** Noise-free bits over the converter's full scale. */
    readonly noiseFreeBits: number;
  };
  /** Every line, informative and contributing. */
  readonly lines: readonly ChannelBudgetLine[];
  /** The combined uncertainty by the law of propagation (JCGM 100). */
  readonly combined: Propagation;
  /** The Monte Carlo evaluation (JCGM 101), when requested. */
  readonly monteCarlo: MonteCarloResult | undefined;
  /** Headroom, noise and self-heating checks of the front end (chain). */
  readonly frontEnd: DesignCheck<ResolutionBudget, BudgetIssue>;
  /** True when no headroom or self-heating limit is violated. */
  readonly ok: boolean;
  /** The safety caution. */
  readonly caution: string;
}

/** The caution every budget carries. */
export const BUDGET_CAUTION =
  'Results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.';

const SQRT3 = Math.sqrt(3);

/** The model inputs that can carry an uncertainty, as they enter `ModelParameters`. */
type Perturbable = keyof ModelParameters;

export function createChannelBudget(
  r: ResolvedChannel,
  nominal: Mapping,
  span: { readonly min: number; readonly max: number },
  options: BudgetOptions = {},
): ChannelBudget {
  const o = checkObject('options', options);
  const at =
    o['at'] === undefined
      ? Math.abs(span.max) >= Math.abs(span.min)
        ? span.max
        : span.min
      : checkFinite('at', o['at']);
  const { model } = nominal;
  const code = codeAt(r, nominal, at);
  const quantityPerCode = slopeAt(nominal, code);
  const quantityPerVolt = quantityPerCode * model.adc.countsPerVolt;

  // Noise, resolution, headroom and gauge power from the chain package, at the span's ends.
  const frontEnd = resolutionBudget({
    span: bridgeSpan(r, nominal, span),
    excitationVolts: r.nominal.excitationVolts,
    excitationLowVolts: r.amplifier.excitationLowVolts,
    temperatureCelsius: r.nominal.temperatureCelsius,
    gain: r.nominal.gain,
    amplifier: {
      inputVoltageNoiseVoltsPerRootHz: r.amplifier.inputVoltageNoiseVoltsPerRootHz,
      voltageCornerHertz: r.amplifier.voltageCornerHertz,
      currentNoiseAmpsPerRootHz: r.amplifier.currentNoiseAmpsPerRootHz,
      currentCornerHertz: r.amplifier.currentCornerHertz,
      secondStageGain: r.amplifier.secondStageGain,
      outputReferenceVolts: r.amplifier.outputReferenceVolts,
      limits: limitsOf(r),
    },
    adc: {
      bits: r.adc.bits,
      referenceVolts: r.adc.ratiometric ? r.nominal.excitationVolts : r.nominal.referenceVolts,
      bipolar: r.adc.bipolar,
      ratiometric: r.adc.ratiometric,
      ...(r.adc.noiseRmsVolts === undefined ? {} : { noiseRmsVolts: r.adc.noiseRmsVolts }),
    },
    filter: { kind: 'sinc', order: r.adc.filterOrder, dataRateHertz: r.adc.dataRateHertz },
    ...(r.amplifier.voltageCornerHertz > 0 || r.amplifier.currentCornerHertz > 0 ? { lowHertz: 0.01 } : {}),
    ...(options.peakToPeakFactor === undefined ? {} : { peakToPeakFactor: options.peakToPeakFactor }),
  });
  const fe = frontEnd.value;
  const ppf = options.peakToPeakFactor ?? 6.6;
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

  // The combined uncertainty: the exact model rebuilt with each uncertain input perturbed.
  const inputs: Record<string, InputQuantities[string]> = {
    reading: { value: code, standardUncertainty: noiseRmsCodes },
  };
  const names: Partial<Record<Perturbable, string>> = {};
  const rect = (name: string, key: Perturbable, value: number, halfWidth: number) => {
    if (halfWidth > 0) {
      inputs[name] = { value, distribution: 'rectangular', halfWidth };
      names[key] = name;
    }
  };
  const t = r.tolerances;
  const n = r.nominal;
  if (r.sensor.kind === 'strain-gauge')
    rect('gauge factor', 'gaugeFactor', n.gaugeFactor, t.gaugeFactor * n.gaugeFactor);
  if (r.sensor.kind === 'transducer') {
    rect(
      'rated output',
      'ratedOutputVoltsPerVolt',
      n.ratedOutputVoltsPerVolt,
      t.ratedOutput * n.ratedOutputVoltsPerVolt,
    );
  }
  if (r.sensor.kind !== 'transducer')
    rect('completion resistors', 'completionOhms', n.completionOhms, t.completionOhms * n.completionOhms);
  const leadDrift = leadDriftOhms(r);
  if (t.ohmsPerLead + leadDrift > n.ohmsPerLead) {
    throw new BridgeworkError(
      'out-of-range',
      `\`tolerances.ohmsPerLead\` must be <= the lead resistance ${n.ohmsPerLead} Ω (less the cable's drift ${leadDrift} Ω); got ${t.ohmsPerLead}`,
      { param: 'tolerances.ohmsPerLead', value: t.ohmsPerLead, limit: n.ohmsPerLead - leadDrift },
    );
  }
  rect('lead resistance', 'ohmsPerLead', n.ohmsPerLead, t.ohmsPerLead + leadDrift);
  if (!r.adc.ratiometric) {
    rect('excitation', 'excitationVolts', n.excitationVolts, t.excitationVolts * n.excitationVolts);
    rect('converter reference', 'referenceVolts', n.referenceVolts, t.referenceVolts * n.referenceVolts);
  }
  rect('gain', 'gain', n.gain, t.gain * n.gain);
  rect('offset', 'offsetVolts', 0, t.offsetVolts);
  const [tMin, tMax] = r.rangeCelsius;
  const temperatureHalfWidth = Math.max(
    t.temperatureCelsius,
    n.temperatureCelsius - tMin,
    tMax - n.temperatureCelsius,
  );
  if (r.sensor.kind === 'strain-gauge')
    rect('gauge temperature', 'temperatureCelsius', n.temperatureCelsius, temperatureHalfWidth);
  if (r.sensor.kind === 'transducer')
    rect('transducer temperature', 'temperatureCelsius', n.temperatureCelsius, temperatureHalfWidth);

  const keys = Object.entries(names) as [Perturbable, string][];
  const evaluate = (x: Readonly<Record<string, number>>): number => {
    const p: Record<string, number> = { ...n };
    for (const [key, name] of keys) p[key] = x[name] as number;
    const m = createModel(r, p as unknown as ModelParameters);
    return m.quantityFromRatio(m.ratioFromCode(x['reading'] as number));
  };
  // RTD tolerance class: a limit on the sensor's temperature, added to the output directly.
  let rtdClassHalfWidth = 0;
  if (
    r.sensor.kind === 'rtd' &&
    r.sensor.toleranceClass !== undefined &&
    r.output.quantity === 'temperature'
  ) {
    rtdClassHalfWidth = rtdToleranceCelsius({
      toleranceClass: r.sensor.toleranceClass,
      temperatureCelsius: at,
    });
    inputs['RTD class tolerance'] = { value: 0, distribution: 'rectangular', halfWidth: rtdClassHalfWidth };
  }
  const modelFn =
    rtdClassHalfWidth > 0
      ? (x: Readonly<Record<string, number>>) => evaluate(x) + (x['RTD class tolerance'] as number)
      : evaluate;
  const combined = propagate({ model: modelFn, inputs, coverage: t.coverageProbability });
  const mcOptions = options.monteCarlo;
  const monte =
    mcOptions === undefined || mcOptions === false
      ? undefined
      : monteCarlo({
          model: modelFn,
          inputs,
          coverage: t.coverageProbability,
          trials: (mcOptions === true ? undefined : mcOptions.trials) ?? 100_000,
          seed: (mcOptions === true ? undefined : mcOptions.seed) ?? 1,
          ...(mcOptions !== true && mcOptions.returnValues === true ? { returnValues: true } : {}),
        });

  const lines: ChannelBudgetLine[] = [];
  const contribution = (name: string) => combined.contributions[name];
  lines.push({
    name: 'noise',
    kind: 'noise',
    model: `root-sum-square of ${fe.noise.terms.map((x) => x.name).join(', ')} over the sinc${r.adc.filterOrder} filter's noise bandwidth (${fe.noise.noiseBandwidthHertz.toPrecision(4)} Hz), referred to the output by the exact map's slope`,
    inputs: {
      noiseBandwidthHertz: fe.noise.noiseBandwidthHertz,
      rmsVolts: fe.noise.totalRmsVolts,
      rmsCodes: noiseRmsCodes,
      sourceOhms: fe.noise.sourceOhms,
    },
    value: noiseRms,
    standardUncertainty: contribution('reading'),
  });
  lines.push({
    name: 'resolution',
    kind: 'resolution',
    model: 'one converter step at the budget point (its q/√12 quantization noise is part of the noise line)',
    inputs: { bits: r.adc.bits, gain: n.gain, lsbVolts: model.adc.lsbVolts },
    value: Math.abs(quantityPerCode),
    standardUncertainty: undefined,
  });
  lines.push(nonlinearityLine(nominal, span));
  const leadLine = leadsLine(r, nominal, at, code);
  if (leadLine !== undefined) lines.push(leadLine);
  for (const [key, name] of keys) {
    const input = inputs[name] as { value: number; halfWidth: number };
    lines.push({
      name,
      kind: key === 'temperatureCelsius' ? 'temperature' : key === 'ohmsPerLead' ? 'leads' : 'tolerance',
      model: `the exact channel map rebuilt with ${name} varied; rectangular limits ±${input.halfWidth.toPrecision(4)} (u = a/√3, JCGM 100 4.3.7)${key === 'ohmsPerLead' && leadDrift > 0 ? `, including ${leadDrift.toPrecision(3)} Ω of copper drift over the cable's temperature range` : ''}${key === 'temperatureCelsius' ? (r.sensor.kind === 'transducer' ? ' (zero and span temperature coefficients over the stated range)' : ' (gauge-factor temperature coefficient and thermal output over the stated range)') : ''}`,
      inputs: {
        estimate: input.value,
        halfWidth: input.halfWidth,
        sensitivity: combined.sensitivities[name] as number,
      },
      value: (combined.sensitivities[name] as number) * input.halfWidth,
      standardUncertainty: contribution(name),
    });
  }
  if (rtdClassHalfWidth > 0 && r.sensor.kind === 'rtd') {
    lines.push({
      name: 'RTD class tolerance',
      kind: 'tolerance',
      model: `IEC 60751 class ${String(r.sensor.toleranceClass)} limits at ${at.toPrecision(4)} °C, rectangular`,
      inputs: { toleranceClass: String(r.sensor.toleranceClass), halfWidthCelsius: rtdClassHalfWidth },
      value: rtdClassHalfWidth,
      standardUncertainty: rtdClassHalfWidth / SQRT3,
    });
  }
  const ok = frontEnd.ok;
  return {
    channel: r.name,
    quantity: r.output.quantity,
    unit: outputUnits[r.output.quantity],
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
    resolution: {
      quantityPerCode: Math.abs(quantityPerCode),
      rms: noiseRms,
      noiseFree: noiseRms * ppf,
      noiseFreeCounts: (span.max - span.min) / (noiseRms * ppf),
      effectiveBits: fe.resolution.effectiveBits,
      noiseFreeBits: fe.resolution.noiseFreeBits,
    },
    lines,
    combined,
    monteCarlo: monte,
    frontEnd,
    ok,
    caution: BUDGET_CAUTION,
  };
}

/**
 * d(quantity)/d(code) of the exact map at a code: a central difference over up to ±16 codes,
 * shrunk (one-sided at the edges) to stay inside the valid codes. The map is smooth on the scale
 * of a few codes, so the truncation error is far below the figures reported.
 */
function slopeAt(m: Mapping, code: number): number {
  const room = Math.min(16, (m.hi - code) * 0.5, (code - m.lo) * 0.5);
  if (room >= 0.5) return (m.quantityFromCode(code + room) - m.quantityFromCode(code - room)) / (2 * room);
  const h = Math.min(16, (m.hi - m.lo) * 0.25);
  return m.hi - code < code - m.lo
    ? (m.quantityFromCode(code) - m.quantityFromCode(code - h)) / h
    : (m.quantityFromCode(code + h) - m.quantityFromCode(code)) / h;
}

/** The (fractional) code at which the exact map gives `at`. */
function codeAt(r: ResolvedChannel, nominal: Mapping, at: number): number {
  const code = nominal.model.exactCodeFromRatio(nominal.model.ratioFromQuantity(at));
  if (!(code > nominal.lo && code < nominal.hi)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`at\` must map to a code inside the channel's valid codes; ${at} ${outputUnits[r.output.quantity]} maps to ${code}`,
      {
        param: 'at',
        value: at,
        limit: [nominal.lo, nominal.hi],
      },
    );
  }
  return code;
}

/** The span in the chain package's terms: strain (strain gauges, RTDs as ΔR/R0) or ratio (transducers). */
function bridgeSpan(r: ResolvedChannel, nominal: Mapping, span: { min: number; max: number }): BridgeSpan {
  const { model } = nominal;
  const ends = [model.ratioFromQuantity(span.min), model.ratioFromQuantity(span.max)];
  const sign = r.polarity === 'inverted' ? -1 : 1;
  if (model.bridge === undefined) {
    const R = r.sensor.kind === 'transducer' ? r.sensor.outputOhms : 350;
    const ratios = ends.map((x) => sign * x).sort((a, b) => a - b) as [number, number];
    return { armsOhms: [R, R, R, R], ratioRange: { min: ratios[0], max: ratios[1] } };
  }
  const strains = ends.map((x) => model.bridge!.strainFromRatio(x)).sort((a, b) => a - b) as [number, number];
  return { bridge: model.bridge, strainRange: { min: strains[0], max: strains[1] } };
}

function limitsOf(r: ResolvedChannel) {
  const l = r.amplifier.limits;
  const range = (x: readonly number[] | undefined) =>
    x === undefined ? undefined : { min: x[0] as number, max: x[1] as number };
  const cm = range(l.inputCommonModeVolts);
  const fs = range(l.firstStageVolts);
  const out = range(l.outputVolts);
  return {
    ...(cm === undefined ? {} : { inputCommonModeVolts: cm }),
    ...(l.inputDifferentialVolts === undefined ? {} : { inputDifferentialVolts: l.inputDifferentialVolts }),
    ...(fs === undefined ? {} : { firstStageVolts: fs }),
    ...(out === undefined ? {} : { outputVolts: out }),
  };
}

/** Copper drift of one lead over the cable's temperature range, Ω (0 without a cable). */
function leadDriftOhms(r: ResolvedChannel): number {
  if (r.cable === undefined) return 0;
  const cable = r.cable;
  const at = (temperatureCelsius: number) => cableOhmsPerLead(cable, temperatureCelsius);
  const [lo, hi] = r.rangeCelsius;
  const nominal = r.nominal.ohmsPerLead;
  return Math.max(Math.abs(at(lo) - nominal), Math.abs(at(hi) - nominal));
}

/** Largest deviation over the span of the exact map from its terminal line (a linear map's nonlinearity). */
function nonlinearityLine(nominal: Mapping, span: { min: number; max: number }): ChannelBudgetLine {
  const { model } = nominal;
  const codeOf = (q: number) => model.exactCodeFromRatio(model.ratioFromQuantity(q));
  const c1 = codeOf(span.min);
  const c2 = codeOf(span.max);
  let worst = 0;
  let where = span.min;
  const samples = 256;
  for (let i = 0; i <= samples; i++) {
    const c = c1 + ((c2 - c1) * i) / samples;
    const q = nominal.quantityOrNaN(c);
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
  if (r.nominal.ohmsPerLead === 0 || r.output.quantity === 'ratio') return undefined;
  const noLeads = createModel(r, { ...r.nominal, ohmsPerLead: 0 });
  const withoutLeads = noLeads.quantityFromRatio(nominal.model.ratioFromCode(code));
  return {
    name: 'lead desensitization',
    kind: 'leads',
    model: `${r.wiring ?? 'no'} wiring with ${r.nominal.ohmsPerLead.toPrecision(4)} Ω per lead: the error a map ignoring the leads would make at the budget point (corrected exactly here)`,
    inputs: { ohmsPerLead: r.nominal.ohmsPerLead, wiring: r.wiring ?? 'none', leadSource: r.leadSource },
    value: withoutLeads - at,
    standardUncertainty: undefined,
  };
}
