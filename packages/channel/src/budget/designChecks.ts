/**
 * The design checks of a channel's budget: what a reviewing engineer would check before trusting
 * the channel, each with its figure, its threshold and a message naming the field to change.
 */
import { checkOptions, checkPositive, checkRange, type Interval } from '@bridgework/core';
import type { BudgetIssue, DesignCheck, ResolutionBudget } from '@bridgework/chain';
import type { Propagation } from '@bridgework/uncertainty';
import type { Mapping } from '../internal/mapping.js';
import type { ResolvedChannel } from '../internal/resolve.js';
import type { PlausibleRange } from '../kinds/SensorKind.js';
import { formatQuantity, formatSignificant } from '../units/quantity.js';
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
}

/** The design checks of a budget. */
export function designChecks(x: DesignCheckInput): ChannelDesignCheck[] {
  const limits = readDesignLimits(x.limits);
  const r = x.resolved;
  const unit = r.unit;
  const width = x.span.max - x.span.min;
  const checks: ChannelDesignCheck[] = [];
  const push = (c: Omit<ChannelDesignCheck, 'ok'>) => checks.push({ ...c, ok: c.status !== 'fail' });
  const spanText = `[${formatQuantity(x.span.min, unit)}, ${formatQuantity(x.span.max, unit)}]`;

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
        ? `the span ${spanText} covers ${formatSignificant(codes, 6)} converter codes`
        : `the span ${spanText} covers only ${formatSignificant(codes)} converter codes (at least ${limits.minimumSpanCodes} are needed to measure it); raise amplifier.gain or adc.bits, or check excitation and the sensor's output`,
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
        ? `the span uses ${formatSignificant(share * 100, 3)} % of the converter's range`
        : `the span uses ${formatSignificant(share * 100, 3)} % of the converter's range (less than ${formatSignificant(limits.minimumSpanShare * 100)} %): a higher amplifier.gain would resolve it better, if the noise allows`,
    path: 'amplifier.gain',
  });

  // The uncertainty and the noise against the span.
  const expanded = x.combined.expandedUncertainty;
  const uShare = Math.abs(expanded) / width;
  const uStatus = !(uShare <= limits.uncertaintyShareLimit)
    ? 'fail'
    : uShare > limits.uncertaintyShareWarning
      ? 'warn'
      : 'pass';
  push({
    id: 'uncertainty',
    name: 'expanded uncertainty against the span',
    status: uStatus,
    value: uShare,
    limit:
      uStatus === 'pass' || uStatus === 'warn'
        ? uStatus === 'warn'
          ? limits.uncertaintyShareWarning
          : limits.uncertaintyShareLimit
        : limits.uncertaintyShareLimit,
    unit: '',
    message:
      uStatus === 'pass'
        ? `U = ${formatQuantity(expanded, unit)} is ${formatSignificant(uShare * 100, 3)} % of the span`
        : `U = ${formatQuantity(expanded, unit)} is ${formatSignificant(uShare * 100, 3)} % of the span ${spanText} (${uStatus === 'fail' ? 'more than' : 'above'} ${formatSignificant((uStatus === 'fail' ? limits.uncertaintyShareLimit : limits.uncertaintyShareWarning) * 100)} %)${uStatus === 'fail' ? ': the channel cannot measure its span as designed' : ''}; see the largest lines of the budget`,
  });
  const nShare = x.noiseRms / width;
  const nStatus = !(nShare <= limits.noiseShareLimit)
    ? 'fail'
    : nShare > limits.noiseShareWarning
      ? 'warn'
      : 'pass';
  push({
    id: 'noise',
    name: 'rms noise against the span',
    status: nStatus,
    value: nShare,
    limit: nStatus === 'warn' ? limits.noiseShareWarning : limits.noiseShareLimit,
    unit: '',
    message:
      nStatus === 'pass'
        ? `the rms noise ${formatQuantity(x.noiseRms, unit)} is ${formatSignificant(nShare * 100, 3)} % of the span`
        : `the rms noise ${formatQuantity(x.noiseRms, unit)} is ${formatSignificant(nShare * 100, 3)} % of the span (${nStatus === 'fail' ? 'more than' : 'above'} ${formatSignificant((nStatus === 'fail' ? limits.noiseShareLimit : limits.noiseShareWarning) * 100)} %): lower the amplifier's noise, the data rate (adc.filter.dataRateHertz) or raise the excitation`,
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

  // Headroom of the front end (chain).
  const issues = x.frontEnd.issues;
  for (const m of x.frontEnd.value.headroom.margins) {
    const issue = issues.find((i) => i.limit === m.limit);
    push({
      id: `headroom-${m.limit}`,
      name: headroomNames[m.limit] ?? m.limit,
      status: m.ok ? 'pass' : 'fail',
      value: m.nodeVolts,
      limit: m.limitVolts,
      unit: 'V',
      message: `${formatQuantity(m.nodeVolts, 'V')} against ${formatQuantity(m.limitVolts, 'V')}, margin ${formatQuantity(m.marginVolts, 'V')}${issue === undefined ? '' : `: ${issue.message}`}`,
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
      message: issue.message,
    });
  }

  // Inputs in the ranges a real design keeps them in (warnings).
  for (const p of [...commonRanges(r), ...(r.kind.plausibleRanges?.(r.spec.sensor as never) ?? [])]) {
    const inside = p.value >= p.range.min && p.value <= p.range.max;
    push({
      id: `plausible:${p.path}`,
      name: `${p.path} in its usual range`,
      status: inside ? 'pass' : 'warn',
      value: p.value,
      limit: p.value < p.range.min ? p.range.min : p.range.max,
      unit: p.unit,
      message: inside
        ? `${p.path} = ${formatQuantity(p.value, p.unit)}`
        : `${p.path} = ${formatQuantity(p.value, p.unit)} lies outside the usual ${formatQuantity(p.range.min, '')} … ${formatQuantity(p.range.max, p.unit)}; check the value`,
      path: p.path,
    });
  }
  return checks;
}
