/**
 * The design checks of a channel's budget: what a reviewing engineer would check before trusting
 * the channel, each with its figure, its threshold and a message naming the field to change.
 */
import { checkOptions, checkPositive, checkRange, type Interval } from '@bridgework/core';
import type { BudgetIssue, DesignCheck, ResolutionBudget } from '@bridgework/chain';
import type { Propagation } from '@bridgework/uncertainty';
import type { Mapping } from '../internal/mapping.js';
import type { ResolvedChannel } from '../internal/resolve.js';
import { budgetSideOf } from '../kinds/budgetRegistry.js';
import type { PlausibleRange } from '../kinds/SensorKind.js';
import type { DisplayUnit } from '../outputQuantities.js';
import { formatSignificant } from '../units/quantity.js';
import type { ChannelBudgetLine } from './ChannelBudgetLine.js';

/** Thresholds of the design checks (every one has a default; see {@link channelBudget}). */
export interface DesignLimits {
  /** Fewest converter codes the span must cover to be measured at all (fail below). Default 100. */
  readonly minimumSpanCodes?: number;
  /** Least share of the converter's codes the span should use (warning below). Default 0.05. */
  readonly minimumSpanShare?: number;
  /** Expanded uncertainty over the span width above which the channel warns. Default 0.02. */
  readonly uncertaintyShareWarning?: number;
  /** Expanded uncertainty over the span width above which the channel cannot measure its span (fail). Default 0.1. */
  readonly uncertaintyShareLimit?: number;
  /** rms noise over the span width above which the channel warns. Default 0.005. */
  readonly noiseShareWarning?: number;
  /** rms noise over the span width above which the channel cannot measure its span (fail). Default 0.1. */
  readonly noiseShareLimit?: number;
}

/** One design check: its verdict, figure and threshold, and a message in the user's terms. */
export interface ChannelDesignCheck {
  /** Stable identifier (`'span-codes'`, `'uncertainty'`, `'headroom-output-high'`, `'plausible:sensor.gaugeOhms'`...). */
  readonly id: string;
  /** What was checked, in words. */
  readonly name: string;
  /** `'pass'`, `'warn'` (a reviewer would question it), or `'fail'` (the channel cannot be trusted as designed). */
  readonly status: 'pass' | 'warn' | 'fail';
  /** False only for `'fail'`. */
  readonly ok: boolean;
  /** The figure checked. */
  readonly value: number;
  /** The threshold it was checked against (the one crossed, for a warning or a failure). */
  readonly limit: number;
  /** The unit of `value` and `limit` (`''` for a plain number or share). */
  readonly unit: string;
  /** The verdict with its figures, and for a warning or failure what to change. */
  readonly message: string;
  /** The field to change, when one applies. */
  readonly path?: string;
}

const DEFAULTS: Required<DesignLimits> = {
  minimumSpanCodes: 100,
  minimumSpanShare: 0.05,
  uncertaintyShareWarning: 0.02,
  uncertaintyShareLimit: 0.1,
  noiseShareWarning: 0.005,
  noiseShareLimit: 0.1,
};

/** Checks the `limits` option. */
export function readDesignLimits(value: unknown): Required<DesignLimits> {
  if (value === undefined) return DEFAULTS;
  const o = checkOptions('options.limits', value, { known: Object.keys(DEFAULTS) });
  const out: Record<string, number> = { ...DEFAULTS };
  for (const key of Object.keys(DEFAULTS)) {
    if (o[key] === undefined) continue;
    out[key] =
      key === 'minimumSpanCodes'
        ? checkPositive(`options.limits.${key}`, o[key])
        : checkRange(`options.limits.${key}`, o[key], { min: 0, max: 1 });
  }
  return out as Required<DesignLimits>;
}

const headroomNames: Readonly<Record<string, string>> = {
  'input-common-mode-low': 'amplifier input common mode, low limit',
  'input-common-mode-high': 'amplifier input common mode, high limit',
  'input-differential': 'amplifier differential input range',
  'first-stage-low': 'amplifier first stage, low swing',
  'first-stage-high': 'amplifier first stage, high swing',
  'output-low': 'amplifier output, low swing',
  'output-high': 'amplifier output, high swing',
  'adc-low': 'converter low rail',
  'adc-high': 'converter high rail',
};

/** The field to change first when a headroom limit is reached. */
function headroomField(limit: string): string {
  return limit.startsWith('input-common-mode') || limit === 'input-differential'
    ? 'excitation.volts'
    : 'amplifier.gain';
}

/** What to change when a headroom limit is reached. */
function headroomWayOut(limit: string): string {
  if (limit.startsWith('input-common-mode'))
    return 'the bridge sets the common mode: change excitation.volts or amplifier.excitationLowVolts, or use an amplifier whose input range includes it';
  if (limit === 'input-differential') return 'lower excitation.volts or narrow output.range';
  return 'lower amplifier.gain or narrow output.range';
}

/** Inputs every channel has, with the range a real design keeps them in (common practice). */
function commonRanges(r: ResolvedChannel): PlausibleRange[] {
  const s = r.spec;
  const ranges: PlausibleRange[] = [
    { path: 'excitation.volts', value: s.excitation.volts, range: { min: 0.1, max: 30 }, unit: 'V' },
    { path: 'excitation.sourceOhms', value: s.excitation.sourceOhms, range: { min: 0, max: 100 }, unit: 'Ω' },
    { path: 'amplifier.gain', value: s.amplifier.gain, range: { min: 0.1, max: 10_000 }, unit: '' },
    {
      path: 'amplifier.inputVoltageNoiseVoltsPerRootHz',
      value: s.amplifier.inputVoltageNoiseVoltsPerRootHz * 1e9,
      range: { min: 0, max: 1000 },
      unit: 'nV/√Hz',
    },
    {
      path: 'amplifier.currentNoiseAmpsPerRootHz',
      value: s.amplifier.currentNoiseAmpsPerRootHz * 1e12,
      range: { min: 0, max: 1000 },
      unit: 'pA/√Hz',
    },
    {
      path: 'adc.filter.dataRateHertz',
      value: s.adc.filter.dataRateHertz,
      range: { min: 0.01, max: 1e6 },
      unit: 'Hz',
    },
    {
      path: 'environment.temperatureCelsius',
      value: s.environment.temperatureCelsius,
      range: { min: -80, max: 300 },
      unit: '°C',
    },
  ];
  if (s.bridge.ohmsPerLead !== undefined)
    ranges.push({
      path: 'bridge.ohmsPerLead',
      value: s.bridge.ohmsPerLead,
      range: { min: 0, max: 100 },
      unit: 'Ω',
    });
  if (s.bridge.cable !== undefined)
    ranges.push({
      path: 'bridge.cable.lengthMeters',
      value: s.bridge.cable.lengthMeters,
      range: { min: 0, max: 2000 },
      unit: 'm',
    });
  if (s.bridge.completionOhms !== undefined) {
    const nominal = r.kind.nominalOhms(s.sensor as never);
    ranges.push({
      path: 'bridge.completionOhms',
      value: s.bridge.completionOhms,
      range: { min: nominal / 10, max: nominal * 10 },
      unit: 'Ω',
    });
  }
  return ranges;
}

/** What the design checks read. */
export interface DesignCheckInput {
  readonly resolved: ResolvedChannel;
  readonly nominal: Mapping;
  readonly span: Interval;
  readonly frontEnd: DesignCheck<ResolutionBudget, BudgetIssue>;
  readonly combined: Propagation;
  readonly noiseRms: number;
  readonly resolution: Readonly<Record<string, number>>;
  readonly lines: readonly ChannelBudgetLine[];
  readonly limits: unknown;
  /** The unit people read the channel's values in (the report's unit: kN, t, µε). */
  readonly display: DisplayUnit;
}

/** A number as the reports print it: a true minus sign (U+2212), in the exponent too. */
function withMinus(text: string): string {
  return text.replace(/-/g, '−');
}

/** The space between a figure and its unit: a no-break space (U+00A0), so the two stay on one line. */
const UNIT_SPACE = '\u00a0';

/** A figure with its unit for a design-check message, with a true minus sign. */
function figure(value: number, unit: string, digits = 4): string {
  const n = withMinus(formatSignificant(value, digits));
  return unit === '' ? n : `${n}${UNIT_SPACE}${unit}`;
}

/** A share in percent for a message (`'0.52 %'`). */
function percent(share: number, digits = 3): string {
  return figure(share * 100, '%', digits);
}

/** The design checks of a budget. */
export function designChecks(x: DesignCheckInput): ChannelDesignCheck[] {
  const limits = readDesignLimits(x.limits);
  const r = x.resolved;
  const { unit: shown, factor } = x.display;
  /** A value of the channel (in its unit) in the report's unit. */
  const value = (v: number) => figure(v * factor, shown);
  const width = x.span.max - x.span.min;
  const checks: ChannelDesignCheck[] = [];
  const push = (c: Omit<ChannelDesignCheck, 'ok'>) => checks.push({ ...c, ok: c.status !== 'fail' });
  const spanText = `[${value(x.span.min)}, ${value(x.span.max)}]`;

  // The span against the converter's codes.
  const model = x.nominal.model;
  const codes = Math.abs(
    model.exactCodeFromRatio(model.ratioFromValue(x.span.max)) -
      model.exactCodeFromRatio(model.ratioFromValue(x.span.min)),
  );
  const totalCodes = model.adc.codeMax - model.adc.codeMin + 1;
  const share = codes / totalCodes;
  push({
    id: 'span-codes',
    name: 'converter codes across the span',
    status: codes >= limits.minimumSpanCodes ? 'pass' : 'fail',
    value: codes,
    limit: limits.minimumSpanCodes,
    unit: 'codes',
    message:
      codes >= limits.minimumSpanCodes
        ? `the span ${spanText} covers ${withMinus(formatSignificant(codes, 6))} converter codes (at least ${figure(limits.minimumSpanCodes, 'codes')} needed)`
        : `the span ${spanText} covers only ${withMinus(formatSignificant(codes))} converter codes (at least ${figure(limits.minimumSpanCodes, 'codes')} are needed to measure it); raise amplifier.gain or adc.bits, or check excitation and the sensor's output`,
    path: 'amplifier.gain',
  });
  push({
    id: 'span-share',
    name: "share of the converter's range used by the span",
    status: share >= limits.minimumSpanShare ? 'pass' : 'warn',
    value: share,
    limit: limits.minimumSpanShare,
    unit: '',
    message:
      share >= limits.minimumSpanShare
        ? `the span uses ${percent(share)} of the converter's range (at least ${percent(limits.minimumSpanShare, 4)} advised)`
        : `the span uses ${percent(share)} of the converter's range (less than ${percent(limits.minimumSpanShare, 4)}): a higher amplifier.gain would resolve it better, if the noise allows`,
    path: 'amplifier.gain',
  });

  // The uncertainty and the noise against the span: a pass is judged against the warning
  // threshold (at most it), a warning against both, a failure against the limit.
  const expanded = x.combined.expandedUncertainty;
  const uShare = Math.abs(expanded) / width;
  const uStatus = !(uShare <= limits.uncertaintyShareLimit)
    ? 'fail'
    : uShare > limits.uncertaintyShareWarning
      ? 'warn'
      : 'pass';
  const uText = `U = ${value(expanded)} is ${percent(uShare)} of the span ${spanText}`;
  push({
    id: 'uncertainty',
    name: 'expanded uncertainty against the span',
    status: uStatus,
    value: uShare,
    limit: uStatus === 'fail' ? limits.uncertaintyShareLimit : limits.uncertaintyShareWarning,
    unit: '',
    message:
      uStatus === 'pass'
        ? `${uText} (at most ${percent(limits.uncertaintyShareWarning, 4)})`
        : uStatus === 'warn'
          ? `${uText} (above ${percent(limits.uncertaintyShareWarning, 4)}, within the ${percent(limits.uncertaintyShareLimit, 4)} limit); see the largest lines of the budget`
          : `${uText} (more than ${percent(limits.uncertaintyShareLimit, 4)}): the channel cannot measure its span as designed; see the largest lines of the budget`,
  });
  const nShare = x.noiseRms / width;
  const nStatus = !(nShare <= limits.noiseShareLimit)
    ? 'fail'
    : nShare > limits.noiseShareWarning
      ? 'warn'
      : 'pass';
  const nText = `the rms noise ${value(x.noiseRms)} is ${percent(nShare)} of the span`;
  const lower =
    "lower the amplifier's noise, the data rate (adc.filter.dataRateHertz) or raise the excitation";
  push({
    id: 'noise',
    name: 'rms noise against the span',
    status: nStatus,
    value: nShare,
    limit: nStatus === 'fail' ? limits.noiseShareLimit : limits.noiseShareWarning,
    unit: '',
    message:
      nStatus === 'pass'
        ? `${nText} (at most ${percent(limits.noiseShareWarning, 4)})`
        : nStatus === 'warn'
          ? `${nText} (above ${percent(limits.noiseShareWarning, 4)}, within the ${percent(limits.noiseShareLimit, 4)} limit): ${lower}`
          : `${nText} (more than ${percent(limits.noiseShareLimit, 4)}): ${lower}`,
    path: nStatus === 'pass' ? undefined : 'adc.filter.dataRateHertz',
  } as Omit<ChannelDesignCheck, 'ok'>);

  // Every figure finite.
  const figures = [
    expanded,
    x.combined.standardUncertainty,
    x.noiseRms,
    ...Object.values(x.resolution),
    ...x.lines.flatMap((l) => [l.value, l.standardUncertainty ?? 0]),
  ];
  const bad = figures.filter((v) => !Number.isFinite(v)).length;
  push({
    id: 'finite',
    name: 'every budget figure finite',
    status: bad === 0 ? 'pass' : 'fail',
    value: bad,
    limit: 0,
    unit: 'figures',
    message:
      bad === 0
        ? 'every figure of the budget is finite'
        : `${bad} figure${bad === 1 ? '' : 's'} of the budget are not finite: the design's numbers are out of any sensible range`,
  });

  // Headroom of the front end (chain), each at its worst operating point named by its value.
  const points = x.frontEnd.value.points;
  const pointText = (i: number): string => {
    const pt = points[i];
    if (pt === undefined) return '';
    try {
      // A point at zero comes back from the ratio with rounding dust (−3.6e−15 °C): below 10⁻¹²
      // of the span it is shown as 0, as the report shows dust (issue 15 item 21).
      const v = model.valueFromRatio(pt.ratio);
      return ` at ${value(Math.abs(v) < 1e-12 * Math.abs(width) ? 0 : v)}`;
    } catch {
      return ` at the bridge's ${i === 0 ? 'lower' : i === points.length - 1 ? 'upper' : 'zero'} point`;
    }
  };
  const issues = x.frontEnd.issues;
  for (const m of x.frontEnd.value.headroom.margins) {
    const failed = !m.ok || issues.some((i) => i.limit === m.limit);
    const name = headroomNames[m.limit] ?? m.limit;
    push({
      id: `headroom-${m.limit}`,
      name,
      status: failed ? 'fail' : 'pass',
      value: m.nodeVolts,
      limit: m.limitVolts,
      unit: 'V',
      message: `${figure(m.nodeVolts, 'V')} against ${figure(m.limitVolts, 'V')}${pointText(m.pointIndex)}, margin ${figure(m.marginVolts, 'V')}${failed ? `: the ${name} is reached; ${headroomWayOut(m.limit)}` : ''}`,
      ...(failed ? { path: headroomField(m.limit) } : {}),
    });
  }
  for (const issue of issues) {
    if (x.frontEnd.value.headroom.margins.some((m) => m.limit === issue.limit)) continue;
    push({
      id: issue.limit,
      name: issue.limit.replace(/-/g, ' '),
      status: 'fail',
      value: Number.NaN,
      limit: Number.NaN,
      unit: '',
      message: withMinus(issue.message),
    });
  }

  // What the budget holds of the sensor's own calibration, or lacks, as the sensor kind states it
  // (a warning when it lacks it: U then covers the electronics and the noise only). A calibration
  // against reference loads holds it in its fit; a bridge-ratio output has no sensor calibration.
  const spec = r.spec;
  if (spec.output.quantity !== 'ratio' && spec.calibration === undefined) {
    const c = budgetSideOf(r.kind).calibrationCheck?.(spec.sensor as never, spec);
    if (c !== undefined) {
      push({
        id: 'sensor-calibration',
        name: "the sensor's calibration uncertainty in the budget",
        status: c.holds ? 'pass' : 'warn',
        value: c.value,
        limit: 0,
        unit: c.unit,
        message: c.message,
        path: c.path,
      });
    }
  }

  // Inputs in the ranges a real design keeps them in (warnings).
  for (const p of [
    ...commonRanges(r),
    ...(budgetSideOf(r.kind).plausibleRanges?.(r.spec.sensor as never) ?? []),
  ]) {
    const inside = p.value >= p.range.min && p.value <= p.range.max;
    push({
      id: `plausible:${p.path}`,
      name: `${p.path} in its usual range`,
      status: inside ? 'pass' : 'warn',
      value: p.value,
      limit: p.value < p.range.min ? p.range.min : p.range.max,
      unit: p.unit,
      message: inside
        ? `${p.path} = ${figure(p.value, p.unit)}`
        : `${p.path} = ${figure(p.value, p.unit)} lies outside the usual ${figure(p.range.min, '')} … ${figure(p.range.max, p.unit)}; check the value`,
      path: p.path,
    });
  }
  return checks;
}
