import { BridgeworkError, checkOptions, formatValue } from '@bridgework/core';
import type { HeadroomIssue } from './checkHeadroom.js';
import type { DesignCheck } from './DesignCheck.js';
import { GAIN_LIMITS, checkGain } from './internal/domain.js';
import { nextDown } from './internal/rounding.js';

/** The most gains a list may hold (the budget is computed at every one). */
const MAX_GAIN_CANDIDATES = 4096;
import {
  adcAt,
  budgetAt,
  budgetContext,
  headroomAt,
  type BudgetContext,
  type BudgetIssue,
  type ResolutionBudget,
  type ResolutionBudgetOptions,
} from './resolutionBudget.js';

/** A continuous range of gains `[min, max]` (an amplifier set by a resistor, or a DAC-trimmed PGA). */
export interface GainRange {
  /** Smallest gain, in [1e-9, 1e9]. */
  readonly min: number;
  /** Largest gain (≥ min), in [1e-9, 1e9]. */
  readonly max: number;
}

/** Options of {@link selectGain}: those of {@link resolutionBudget} with the gains to choose from. */
export interface GainSelectionOptions extends Omit<ResolutionBudgetOptions, 'gain'> {
  /** The available gains: a list of 1 to 4096 (a PGA's settings) or a continuous range. */
  readonly gains: readonly number[] | GainRange;
}

/** One gain considered by {@link selectGain}. */
export interface GainCandidate {
  /** The gain. */
  readonly gain: number;
  /** True when no headroom limit is violated at this gain. */
  readonly fitsHeadroom: boolean;
  /** rms resolution at this gain, in measurand units (m/m or V/V). */
  readonly rmsResolution: number;
  /** The headroom limits violated at this gain. */
  readonly issues: readonly HeadroomIssue[];
}

/** What {@link selectGain} chose, and why. */
export interface GainSelection {
  /** The gain chosen. */
  readonly gain: number;
  /** The full budget at that gain. */
  readonly budget: ResolutionBudget;
  /** Every gain considered (a list: all of them; a range: the one chosen). */
  readonly candidates: readonly GainCandidate[];
  /** For a range: the gains that fit every headroom limit, `undefined` when none do or for a list. */
  readonly feasibleGains: GainRange | undefined;
}

function candidate(b: DesignCheck<ResolutionBudget, BudgetIssue>): GainCandidate {
  const issues = b.issues.filter((i): i is HeadroomIssue => i.limit !== 'self-heating');
  return {
    gain: b.value.gain,
    fitsHeadroom: issues.length === 0,
    rmsResolution: b.value.resolution.rms,
    issues,
  };
}

/**
 * Per operating point and limit, margin(G) = c + d·G exactly (every node is affine in the gain),
 * recovered from two headroom evaluations; returns the interval of G where every margin ≥ 0.
 */
function feasibleInterval(ctx: BudgetContext, range: GainRange): GainRange | undefined {
  let lo = range.min;
  let hi = range.max;
  const g1 = range.min;
  // A second gain inside the accepted gains (a point range's double, or its half at the top).
  const g2 = range.max > range.min ? range.max : range.min * (2 * range.min <= GAIN_LIMITS.max ? 2 : 0.5);
  for (let i = 0; i < ctx.operating.points.length; i++) {
    const one = { ...ctx, operating: { ...ctx.operating, points: [ctx.operating.points[i]!] } };
    const m1 = headroomAt(one, g1, adcAt(one, g1)).value.margins;
    const m2 = headroomAt(one, g2, adcAt(one, g2)).value.margins;
    m1.forEach((a, k) => {
      const b = m2[k]!;
      const d = (b.marginVolts - a.marginVolts) / (g2 - g1);
      const c = a.marginVolts - d * g1;
      if (Math.abs(d) <= 1e-15 * Math.abs(c)) {
        if (c < 0) hi = -Infinity; // violated whatever the gain
      } else if (d < 0) hi = Math.min(hi, -c / d);
      else lo = Math.max(lo, -c / d);
    });
  }
  return lo <= hi ? { min: lo, max: hi } : undefined;
}

/**
 * Picks the gain that maximises resolution without any stage clipping, and returns the resolution
 * budget at that gain.
 *
 * @remarks
 * A list of gains: the budget is computed at every gain; among those that fit every headroom
 * limit ({@link checkHeadroom}, converter code range included), the one with the finest rms
 * resolution wins (ties: the lower gain, which keeps more headroom). When none fits, the lowest
 * gain is returned with `ok: false` and its issues.
 *
 * A range: every node voltage is affine in the gain (first stage Vcm ± (G/G2)·Vd/2, output
 * Vref + G·Vd, quantizer G·Vd), so each limit at each operating point bounds G from one side; the
 * intersection of these bounds is the interval of feasible gains, and its top is chosen (stepped
 * down by ulps until the headroom check passes, so rounding cannot leave it a hair outside).
 * Choosing the top assumes that resolution does not get worse with gain, true when the
 * input-referred amplifier and converter noise do not grow with it (they fall: output noise and
 * quantization divide by the gain). With a gain-dependent `adc.noiseRmsVolts`, give a list.
 *
 * Self-heating does not depend on the gain; its issue, if any, is reported but does not change
 * the choice. The chosen gain sits exactly at the edge of the span given: include any overload
 * margin in the span.
 *
 * @param options - As {@link resolutionBudget}, with `gains` instead of `gain`.
 * @returns `{ ok, value: { gain, budget, candidates, feasibleGains }, issues }`.
 * The work grows with the list: at most 4096 gains (a PGA has a handful) are accepted.
 *
 * @throws {@link @bridgework/core!BridgeworkError} as {@link resolutionBudget}; `invalid-shape`
 *   for an empty gain list, `out-of-range` for one of more than 4096 gains; `not-positive`,
 *   `not-finite`, `wrong-type` for a bad gain, `out-of-range` for one outside [1e-9, 1e9];
 *   `out-of-range` for a range with max < min; `unknown-option` for a range key other than `min`
 *   and `max`, `missing-option`.
 * @example
 * ```ts
 * const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
 * const r = selectGain({
 *   span: { bridge, strainRange: { min: -3e-3, max: 3e-3 } },
 *   excitationVolts: 5,
 *   gains: [1, 2, 4, 8, 16, 32, 64, 128],
 *   adc: { bits: 24, ratiometric: true },
 *   filter: { kind: 'sinc', order: 3, dataRateHertz: 10 },
 * });
 * r.value.gain; // 128: ±3000 µε is ±1.5 mV/V, within ±1/128 V/V
 * ```
 */
export function selectGain(options: GainSelectionOptions): DesignCheck<GainSelection, BudgetIssue> {
  const ctx = budgetContext(options, 'gains');
  const gains = (options as unknown as Record<string, unknown>)['gains'];

  if (Array.isArray(gains)) {
    if (gains.length === 0 || gains.length > MAX_GAIN_CANDIDATES) {
      throw new BridgeworkError(
        gains.length === 0 ? 'invalid-shape' : 'out-of-range',
        `\`gains\` must be a list of 1 to ${MAX_GAIN_CANDIDATES} gains or a { min, max } range; got an array of length ${gains.length}`,
        { param: 'gains', value: gains.length, limit: [1, MAX_GAIN_CANDIDATES] },
      );
    }
    const list = gains.map((g: unknown, i) => checkGain(`gains[${i}]`, g));
    const budgets = list.map((g, i) => budgetAt(ctx, g, `gains[${i}]`));
    const candidates = budgets.map(candidate);
    let chosen: number | undefined;
    candidates.forEach((c, i) => {
      if (!c.fitsHeadroom) return;
      const best = chosen === undefined ? undefined : candidates[chosen]!;
      const better =
        best === undefined ||
        c.rmsResolution < best.rmsResolution * (1 - 1e-12) ||
        (Math.abs(c.rmsResolution - best.rmsResolution) <= 1e-12 * best.rmsResolution && c.gain < best.gain);
      if (better) chosen = i;
    });
    if (chosen === undefined) chosen = list.indexOf(Math.min(...list));
    const b = budgets[chosen]!;
    return {
      ok: b.ok,
      value: { gain: b.value.gain, budget: b.value, candidates, feasibleGains: undefined },
      issues: b.issues,
    };
  }

  const r = checkOptions('gains', gains, { known: ['min', 'max'], required: ['min', 'max'] });
  const min = checkGain('gains.min', r['min']);
  const max = checkGain('gains.max', r['max']);
  if (!(max >= min)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`gains.max\` must be >= \`gains.min\` (${min}); got ${formatValue(max)}`,
      {
        param: 'gains.max',
        value: max,
        limit: min,
      },
    );
  }
  const feasible = feasibleInterval(ctx, { min, max });
  let gain = feasible === undefined ? min : feasible.max;
  let b = budgetAt(ctx, gain);
  if (feasible !== undefined) {
    // Rounding in the bounds can leave the top a few ulps outside: step down (1, 2, 4, … ulps).
    for (let step = 0; step < 48 && !candidate(b).fitsHeadroom && gain > feasible.min; step++) {
      gain = Math.max(feasible.min, step === 0 ? nextDown(gain) : gain * (1 - 2 ** (step - 53)));
      b = budgetAt(ctx, gain);
    }
  }
  return {
    ok: b.ok,
    value: { gain, budget: b.value, candidates: [candidate(b)], feasibleGains: feasible },
    issues: b.issues,
  };
}
