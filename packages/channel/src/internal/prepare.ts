/**
 * Builds a validated spec's nominal model once and checks what only the model can tell: that the
 * converter's codes cover readings the sensor can produce, and that the span of interest lies
 * inside what the channel reads. Problems are issues against the field the user can change, in
 * the channel's unit, with the limit and a way out; without `output.range` the span defaults to
 * the sensor's usual span narrowed to what the channel reads.
 */
import { isBridgeworkError, type Interval, type SpecIssue } from '@bridgework/core';
import { fromBaseUnit, formatQuantity, formatSignificant } from '../units/quantity.js';
import type { ChannelRules } from '../spec/channelSchema.js';
import { createMapping, type Mapping } from './mapping.js';
import { Parameter } from '../kinds/SensorKind.js';
import { leadDriftOhms, resolveChannel, type AnySpec, type ResolvedChannel } from './resolve.js';

/** A channel ready to be made: resolved, its nominal mapping, its span. */
export interface PreparedChannel {
  /** The resolved channel. */
  readonly resolved: ResolvedChannel;
  /** The exact mapping at the nominal parameters. */
  readonly nominal: Mapping;
  /** The span of interest, in the channel's unit (`output.range`, or the default). */
  readonly span: Interval;
  /** What the channel reads: the values at the ends of the valid codes, in the channel's unit. */
  readonly readable: Interval;
}

/** Component parameters, as the packages name them, and the spec field they come from. */
const fieldOfParam: Readonly<Record<string, string>> = {
  zeroRatio: 'zero.code',
  completionOhms: 'bridge.completionOhms',
  gain: 'amplifier.gain',
  referenceVolts: 'adc.referenceVolts',
  ohmsPerLead: 'bridge.ohmsPerLead',
  'leads.ohmsPerLead': 'bridge.ohmsPerLead',
  sourceOhms: 'excitation.sourceOhms',
  temperatureCelsius: 'environment.temperatureCelsius',
  excitationVolts: 'excitation.volts',
  calibration: 'calibration.coefficients',
};

/**
 * The spec field a component package's parameter comes from: the table above, else the sensor
 * field of the same name (`gaugeFactor` → `sensor.gaugeFactor`, `r0Ohms` → `sensor.r0Ohms`), else
 * `''` (the channel as a whole).
 */
export function specFieldOf(param: string | undefined, spec: AnySpec): string {
  const key = (param ?? '').slice((param ?? '').lastIndexOf('.') + 1);
  return (
    fieldOfParam[param ?? ''] ??
    (key !== '' && Object.hasOwn(spec.sensor, key) ? `sensor.${key}` : (fieldOfParam[key] ?? ''))
  );
}

/** The issue for a component package's error while building the model. */
function buildIssue(e: unknown, prefix: string, spec: AnySpec): SpecIssue {
  if (!isBridgeworkError(e)) throw e;
  const field = specFieldOf(e.param, spec);
  return {
    code: e.code,
    path: prefix === '' ? field : field === '' ? prefix : `${prefix}.${field}`,
    message: `the channel cannot be built with this value: ${e.message}`,
  };
}

/** The value at a code, or NaN. */
function valueAt(m: Mapping, code: number): number {
  return m.valueOrNaN(code);
}

/** Rounds an interval inward to three significant digits of its larger end. */
function roundInward(x: Interval): Interval {
  const m = Math.max(Math.abs(x.min), Math.abs(x.max));
  if (!(m > 0)) return x;
  const step = 10 ** (Math.floor(Math.log10(m)) - 2);
  const min = Math.ceil(x.min / step) * step;
  const max = Math.floor(x.max / step) * step;
  const nice = (v: number) => Number(v.toPrecision(12));
  return min < max ? { min: nice(min), max: nice(max) } : x;
}

/** The largest power of two (for a power-of-two gain) or 2-significant-digit gain at most `g`. */
function niceGainBelow(current: number, g: number): number {
  if (Number.isInteger(Math.log2(current))) return 2 ** Math.floor(Math.log2(g));
  const k = 10 ** (Math.floor(Math.log10(g)) - 1);
  return Math.floor(g / k) * k;
}

/**
 * Prepares a validated spec, or reports why the model cannot serve it.
 *
 * @param spec - The validated spec.
 * @param rules - The kinds and arrangements.
 * @param prefix - Path prefix of the issues.
 * @param issues - Where problems are recorded.
 */
export function prepareChannel(
  spec: AnySpec,
  rules: ChannelRules,
  prefix: string,
  issues: SpecIssue[],
): PreparedChannel | undefined {
  const at = (field: string) => (prefix === '' ? field : `${prefix}.${field}`);
  let resolved: ResolvedChannel;
  let nominal: Mapping;
  try {
    resolved = resolveChannel(spec, rules);
    nominal = createMapping(resolved, resolved.context.nominal);
  } catch (e) {
    issues.push(buildIssue(e, prefix, spec));
    return undefined;
  }
  // The lead tolerance (with a cable's copper drift) cannot exceed the lead resistance itself.
  const lead = resolved.context.nominal[Parameter.ohmsPerLead] as number;
  const drift = leadDriftOhms(resolved);
  const tolerance = spec.tolerances.ohmsPerLead;
  if (tolerance > 0 && tolerance + drift > lead) {
    const limit = Math.max(0, lead - drift);
    issues.push({
      code: 'out-of-range',
      path: at('tolerances.ohmsPerLead'),
      message: `must be at most ${formatQuantity(limit, 'Ω')}, the lead resistance ${formatQuantity(lead, 'Ω')}${drift > 0 ? ` less the cable's copper drift ${formatQuantity(drift, 'Ω', 3)}` : ''}; got ${formatQuantity(tolerance, 'Ω')}`,
      limit: formatQuantity(limit, 'Ω'),
      suggestion:
        lead === 0
          ? 'state bridge.ohmsPerLead or bridge.cable, or remove the tolerance'
          : `lower it to ${formatQuantity(limit, 'Ω')}`,
    });
    return undefined;
  }
  const unit = resolved.unit;
  const adc = nominal.model.adc;
  const gain = spec.amplifier.gain;
  const { lo, hi } = nominal;
  if (!(hi - lo > 2)) {
    issues.push({
      code: 'out-of-range',
      path: at('amplifier.gain'),
      message: `leaves no converter code for a reading the sensor can produce (valid codes (${formatSignificant(lo, 6)}, ${formatSignificant(hi, 6)}))`,
      suggestion:
        'check amplifier.gain, adc.referenceVolts, the bridge resistances (bridge.completionOhms and the sensor), zero.code and polarity',
    });
    return undefined;
  }
  // What the channel reads: the values just inside the valid codes, with half a per cent of
  // headroom from a converter rail (an end set by the sensor's own range needs none).
  const margin = Math.max(1, 0.005 * (hi - lo));
  const inward = 1e-9 * (hi - lo);
  const ends = [
    valueAt(nominal, lo + (lo === adc.codeMin ? margin : inward)),
    valueAt(nominal, hi - (hi === adc.codeMax ? margin : inward)),
  ];
  const open = [valueAt(nominal, Math.floor(lo) + 1), valueAt(nominal, Math.ceil(hi) - 1)];
  if (!ends.every(Number.isFinite) || !open.every(Number.isFinite)) {
    issues.push({
      code: 'no-solution',
      path: at('output.quantity'),
      message: 'the channel’s map is not finite over its codes; check the sensor and bridge values',
    });
    return undefined;
  }
  const readable: Interval = { min: Math.min(...ends), max: Math.max(...ends) };
  const reads: Interval = { min: Math.min(...open), max: Math.max(...open) };
  const range = spec.output.range;
  if (range === undefined) {
    const kindSpan = resolved.kind.defaultSpan(resolved.context as never);
    let span: Interval;
    if (spec.output.quantity === 'ratio') {
      const r = [kindSpan.min, kindSpan.max].map((q) => nominal.model.kindMap.ratioFromQuantity(q));
      span = {
        min: fromBaseUnit(Math.min(...(r as [number, number])), 'ratio', unit),
        max: fromBaseUnit(Math.max(...(r as [number, number])), 'ratio', unit),
      };
    } else {
      const a = fromBaseUnit(kindSpan.min, resolved.dimension, unit);
      const b = fromBaseUnit(kindSpan.max, resolved.dimension, unit);
      span = { min: Math.min(a, b), max: Math.max(a, b) };
    }
    const narrowed = { min: Math.max(span.min, readable.min), max: Math.min(span.max, readable.max) };
    if (!(narrowed.min < narrowed.max)) {
      issues.push({
        code: 'out-of-range',
        path: at('output.range'),
        message: `is needed: the sensor's usual span [${formatQuantity(span.min, unit)}, ${formatQuantity(span.max, unit)}] lies outside what this channel reads [${formatQuantity(readable.min, unit)}, ${formatQuantity(readable.max, unit)}]`,
        suggestion: 'give output.range inside what the channel reads, or change amplifier.gain',
      });
      return undefined;
    }
    const finalSpan = narrowed.min > span.min || narrowed.max < span.max ? roundInward(narrowed) : span;
    return { resolved, nominal, span: finalSpan, readable: reads };
  }
  // A given span: each end strictly inside what the channel reads.
  const increasing = (open[0] as number) < (open[1] as number);
  const codeOf = (v: number) => {
    try {
      return nominal.model.exactCodeFromRatio(nominal.model.ratioFromValue(v));
    } catch {
      return Number.NaN;
    }
  };
  // A readable end rounded inward to a round number (a ten-thousandth of the readable width).
  const width = reads.max - reads.min;
  const step = 10 ** (Math.floor(Math.log10(width > 0 ? width : 1)) - 4);
  const nice = (x: number, end: 'lower' | 'upper') =>
    Number((end === 'lower' ? Math.ceil(x / step) * step : Math.floor(x / step) * step).toPrecision(12));
  const problems: string[] = [];
  const fixed = { min: range.min, max: range.max };
  let limitText = '';
  let byConverter = false;
  let bySensor = false;
  for (const end of ['lower', 'upper'] as const) {
    const value = end === 'lower' ? range.min : range.max;
    const limit = end === 'lower' ? reads.min : reads.max;
    if (end === 'lower' ? value > limit : value < limit) continue;
    // Which limit binds: the converter's rails, or the sensor's own range?
    const highCode = (end === 'upper') === increasing;
    const railBound = highCode ? hi === adc.codeMax : lo === adc.codeMin;
    const most = end === 'lower' ? 'least' : 'most';
    byConverter ||= railBound;
    bySensor ||= !railBound;
    problems.push(
      `${formatQuantity(value, unit, 8)} is past what this channel reads (at ${most} ${formatQuantity(limit, unit, 8)}${railBound ? `, the converter's full scale at gain ${formatSignificant(gain)}` : ", the end of the sensor's range"})`,
    );
    fixed[end === 'lower' ? 'min' : 'max'] = nice(limit, end);
    limitText = formatQuantity(limit, unit, 8);
  }
  if (problems.length > 0) {
    const inward = `narrow output.range to [${formatQuantity(fixed.min, unit, 8)}, ${formatQuantity(fixed.max, unit, 8)}]`;
    let suggestion = inward;
    if (byConverter && !bySensor) {
      const codes = [codeOf(range.min), codeOf(range.max)];
      if (!spec.adc.bipolar && codes.some((c) => c < 0)) {
        suggestion = `set adc.bipolar to true (the span's lower end needs a negative input), or ${inward}`;
      } else if (codes.every(Number.isFinite)) {
        // Codes scale with the gain (the input is referred to the amplifier's input), so the span fits below this gain.
        const room = codes
          .map((c) => (c > 0 ? adc.codeMax - 1 : -(adc.codeMin + 1)) / Math.abs(c))
          .filter((x) => Number.isFinite(x) && x > 0);
        const maxGain = gain * Math.min(...room);
        if (maxGain > 0 && maxGain < gain)
          suggestion = `lower amplifier.gain to ${formatSignificant(niceGainBelow(gain, maxGain))} or ${inward}`;
      }
    }
    issues.push({
      code: 'out-of-range',
      path: at('output.range'),
      message: `${problems.join('; ')}; ${suggestion}`,
      limit: limitText,
      suggestion,
    });
    return undefined;
  }
  return { resolved, nominal, span: { min: range.min, max: range.max }, readable: reads };
}
