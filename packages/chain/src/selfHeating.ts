import { solveBridge } from '@bridgework/bridge';
import {
  BridgeworkError,
  checkLength,
  checkOneOf,
  checkOptions,
  checkPositive,
  checkRange,
} from '@bridgework/core';
import type { DesignCheck } from './DesignCheck.js';
import { checkBoolean } from './internal/checkBoolean.js';
import { finiteFigures } from './internal/finiteFigures.js';

/** Upper limits of the self-heating options (far beyond any gauge), which keep every figure finite. */
const MAX_WATTS_PER_GAUGE = 1e6;
const MAX_GRID_AREA_SQUARE_METERS = 1;
const MAX_POWER_DENSITY_WATTS_PER_SQUARE_METER = 1e9;

/** How well the specimen under a gauge conducts heat away, in the classes of common practice. */
export type HeatSink = 'excellent' | 'good' | 'fair' | 'poor' | 'very-poor';

/** A range of allowable grid power densities for one heat-sink class. */
export interface PowerDensityRange {
  /** Lower end in W/m² (for static, high-accuracy work). */
  readonly minWattsPerSquareMeter: number;
  /** Upper end in W/m² (dynamic or short-term work, tolerant of some drift). */
  readonly maxWattsPerSquareMeter: number;
  /** The specimens the class stands for. */
  readonly description: string;
}

const SQUARE_METERS_PER_SQUARE_INCH = 0.0254 * 0.0254; // exact: 1 in = 25.4 mm
const perSquareInch = (lo: number, hi: number, description: string): PowerDensityRange => ({
  minWattsPerSquareMeter: lo / SQUARE_METERS_PER_SQUARE_INCH,
  maxWattsPerSquareMeter: hi / SQUARE_METERS_PER_SQUARE_INCH,
  description,
});

/**
 * Allowable grid power density by heat-sink class (common practice, from memory), in W/m².
 *
 * @remarks
 * The figures traditionally quoted in W/in² of active grid area, converted exactly
 * (1 in² = 6.4516 × 10⁻⁴ m²):
 *
 * | class | W/in² | W/m² | specimens |
 * |---|---|---|---|
 * | `excellent` | 5–10 | 7750–15 500 | heavy copper or aluminium sections |
 * | `good` | 2–5 | 3100–7750 | thick steel |
 * | `fair` | 0.5–2 | 775–3100 | thin steel, stainless steel, titanium |
 * | `poor` | 0.1–0.5 | 155–775 | filled plastics, fibre composites |
 * | `very-poor` | 0.01–0.05 | 15.5–77.5 | unfilled plastics, foams |
 *
 * These are guidance, not limits: the right level depends on the gauge backing, adhesive,
 * coating, ambient and the drift the test can accept. {@link selfHeatingLimit} uses the lower end
 * (static, high-accuracy work) unless a density is given. Lower the excitation until the zero no
 * longer shifts when the excitation is switched on (common practice).
 */
export const heatSinkPowerDensity: Readonly<Record<HeatSink, PowerDensityRange>> = {
  excellent: perSquareInch(5, 10, 'heavy copper or aluminium sections'),
  good: perSquareInch(2, 5, 'thick steel'),
  fair: perSquareInch(0.5, 2, 'thin steel, stainless steel, titanium'),
  poor: perSquareInch(0.1, 0.5, 'filled plastics, fibre composites'),
  'very-poor': perSquareInch(0.01, 0.05, 'unfilled plastics, foams'),
};

const heatSinks = Object.keys(heatSinkPowerDensity) as HeatSink[];

/** The power allowed in one gauge, from a power limit, a grid power density, or both (the smaller wins). */
export interface SelfHeatingOptions {
  /** A direct limit on the power in each gauge in W (> 0), e.g. from the gauge's data sheet. */
  readonly maxWattsPerGauge?: number;
  /** Active grid area of one gauge in m² (> 0): grid length × grid width. Needed with a density or heat sink. */
  readonly gridAreaSquareMeters?: number;
  /** Allowed power density over the grid in W/m² (> 0); overrides the heat-sink class. */
  readonly powerDensityWattsPerSquareMeter?: number;
  /** Heat-sink class; its lower density is used (see {@link heatSinkPowerDensity}). */
  readonly heatSink?: HeatSink;
}

/** The power limit of one gauge (see {@link selfHeatingLimit}). */
export interface SelfHeatingLimit {
  /** The allowed power per gauge in W. */
  readonly maxWattsPerGauge: number;
  /** Whether the direct power limit or the grid power density set it. */
  readonly basis: 'power' | 'power-density';
  /** The density used in W/m², when a density (given or from the heat sink) took part. */
  readonly powerDensityWattsPerSquareMeter: number | undefined;
}

/**
 * The allowed power per gauge, from a direct limit or a grid power density times grid area.
 *
 * @remarks
 * P_max = min(maxWattsPerGauge, density × gridArea), with the density given or the lower end of a
 * heat-sink class (common practice; see {@link heatSinkPowerDensity}). The power in a gauge of
 * resistance R carrying the voltage V is V²/R, so the allowed gauge voltage is √(P_max·R); in an
 * equal-arm bridge each arm carries half the excitation, so E_max = 2·√(P_max·R). Exact.
 *
 * @param options - A power limit, or a grid area with a density or heat-sink class, or both.
 * @returns The allowed power per gauge and what set it.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` when no limit can be formed
 *   (`gridAreaSquareMeters` with a density or heat sink, or `maxWattsPerGauge`);
 *   `conflicting-options` for both a density and a heat sink; `invalid-option` for an unknown heat
 *   sink; `not-positive`, `not-finite`, `wrong-type` for bad numbers; `out-of-range` for a power
 *   above 1e6 W, a grid area above 1 m² or a density above 1e9 W/m²; `unknown-option` for a key
 *   it does not know (naming the closest).
 * @example
 * ```ts
 * // A 3.2 mm × 3.2 mm grid on thick steel:
 * selfHeatingLimit({ gridAreaSquareMeters: 3.2e-3 * 3.2e-3, heatSink: 'good' }).maxWattsPerGauge; // 0.03174…
 * ```
 */
export function selfHeatingLimit(options: SelfHeatingOptions): SelfHeatingLimit {
  return checkSelfHeatingLimit('', options);
}

/** @internal {@link selfHeatingLimit} with option names prefixed (`limit.`, `selfHeating.`) in errors. */
export function checkSelfHeatingLimit(prefix: string, options: unknown): SelfHeatingLimit {
  const o = checkOptions(prefix === '' ? 'options' : prefix.slice(0, -1), options, {
    known: ['maxWattsPerGauge', 'gridAreaSquareMeters', 'powerDensityWattsPerSquareMeter', 'heatSink'],
  });
  const name = (key: string): string => `${prefix}${key}`;
  const bounded = (key: string, max: number): number =>
    checkRange(name(key), checkPositive(name(key), o[key]), { max });
  const direct =
    o['maxWattsPerGauge'] === undefined ? undefined : bounded('maxWattsPerGauge', MAX_WATTS_PER_GAUGE);
  if (o['powerDensityWattsPerSquareMeter'] !== undefined && o['heatSink'] !== undefined) {
    throw new BridgeworkError(
      'conflicting-options',
      `\`${name('powerDensityWattsPerSquareMeter')}\` and \`${name('heatSink')}\` must not both be given; got both`,
      { param: name('powerDensityWattsPerSquareMeter'), value: o['powerDensityWattsPerSquareMeter'] },
    );
  }
  let density: number | undefined;
  if (o['powerDensityWattsPerSquareMeter'] !== undefined) {
    density = bounded('powerDensityWattsPerSquareMeter', MAX_POWER_DENSITY_WATTS_PER_SQUARE_METER);
  } else if (o['heatSink'] !== undefined) {
    density =
      heatSinkPowerDensity[checkOneOf(name('heatSink'), o['heatSink'], heatSinks)].minWattsPerSquareMeter;
  }
  let fromDensity: number | undefined;
  if (density !== undefined || o['gridAreaSquareMeters'] !== undefined) {
    if (o['gridAreaSquareMeters'] === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `\`${name('gridAreaSquareMeters')}\` must be given with a power density or heat sink; got undefined`,
        { param: name('gridAreaSquareMeters') },
      );
    }
    const area = bounded('gridAreaSquareMeters', MAX_GRID_AREA_SQUARE_METERS);
    if (density === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `\`${name('powerDensityWattsPerSquareMeter')}\` or \`${name('heatSink')}\` must be given with a grid area; got neither`,
        { param: name('powerDensityWattsPerSquareMeter') },
      );
    }
    fromDensity = density * area;
  }
  if (direct === undefined && fromDensity === undefined) {
    throw new BridgeworkError(
      'missing-option',
      `\`${name('maxWattsPerGauge')}\` or \`${name('gridAreaSquareMeters')}\` with a density must be given; got neither`,
      { param: name('maxWattsPerGauge') },
    );
  }
  if (fromDensity !== undefined && (direct === undefined || fromDensity < direct)) {
    return {
      maxWattsPerGauge: fromDensity,
      basis: 'power-density',
      powerDensityWattsPerSquareMeter: density,
    };
  }
  return { maxWattsPerGauge: direct as number, basis: 'power', powerDensityWattsPerSquareMeter: density };
}

/** Options of {@link checkSelfHeating}. */
export interface SelfHeatingCheckOptions {
  /** The four arms `[R1, R2, R3, R4]` in Ω (each > 0). */
  readonly armsOhms: readonly [number, number, number, number];
  /** Excitation EMF in V (> 0). */
  readonly excitationVolts: number;
  /** Resistance in series with the excitation in Ω (≥ 0). Default 0. */
  readonly sourceOhms?: number;
  /** Which arms hold gauges (the others are completion resistors). Default: all four. */
  readonly gaugeArms?: readonly [boolean, boolean, boolean, boolean];
  /** The allowed power per gauge. */
  readonly limit: SelfHeatingOptions;
}

/** What {@link checkSelfHeating} found. */
export interface SelfHeatingValue {
  /** Power in each arm R1…R4 in W (from `solveBridge`). */
  readonly armWatts: readonly [number, number, number, number];
  /** The largest power in any gauge, in W. */
  readonly gaugeWatts: number;
  /** The allowed power per gauge in W. */
  readonly limitWatts: number;
  /** limitWatts − gaugeWatts in W (negative when exceeded). */
  readonly marginWatts: number;
  /** The excitation at which the hottest gauge reaches the limit, in V (power scales with E²). */
  readonly maxExcitationVolts: number;
  /** How the limit was formed. */
  readonly limit: SelfHeatingLimit;
}

/** An exceeded self-heating limit. */
export interface SelfHeatingIssue {
  /** Always `'self-heating'`. */
  readonly limit: 'self-heating';
  /** limitWatts − gaugeWatts in W (negative). */
  readonly marginWatts: number;
  /** What is exceeded and the excitation that would meet the limit. */
  readonly message: string;
}

/** @internal The self-heating verdict from the hottest gauge's power at `excitationVolts`. */
export function selfHeatingVerdict(
  armWatts: readonly [number, number, number, number],
  gaugeWatts: number,
  excitationVolts: number,
  limit: SelfHeatingLimit,
): DesignCheck<SelfHeatingValue, SelfHeatingIssue> {
  const marginWatts = limit.maxWattsPerGauge - gaugeWatts;
  const maxExcitationVolts = excitationVolts * Math.sqrt(limit.maxWattsPerGauge / gaugeWatts);
  const issues: SelfHeatingIssue[] =
    marginWatts < 0
      ? [
          {
            limit: 'self-heating',
            marginWatts,
            message: `a gauge dissipates ${Number((gaugeWatts * 1e3).toPrecision(4))} mW against ${Number((limit.maxWattsPerGauge * 1e3).toPrecision(4))} mW allowed; reduce the excitation to ${Number(maxExcitationVolts.toPrecision(4))} V or less`,
          },
        ]
      : [];
  const value = {
    armWatts,
    gaugeWatts,
    limitWatts: limit.maxWattsPerGauge,
    marginWatts,
    maxExcitationVolts,
    limit,
  };
  // A check whose figure is not finite is never ok (NaN compares false, so test finiteness too).
  return { ok: issues.length === 0 && finiteFigures(value), value, issues };
}

/**
 * Checks the power in each gauge of a bridge against a self-heating limit, and gives the
 * excitation that would meet it.
 *
 * @remarks
 * Arm powers come from `solveBridge` (I²R of each arm, with the source resistance). They scale
 * with the square of the excitation, so the excitation at which the hottest gauge reaches the
 * limit is E·√(P_max/P_gauge). Too much power in a gauge heats the grid above the specimen, which
 * shows as zero drift and creep, worst on poor heat sinks (plastics, composites, thin sections).
 * Exact.
 *
 * @param options - Arms, excitation, source resistance, which arms are gauges, and the limit.
 * @returns `{ ok, value, issues }` with every arm power, the margin and the maximum excitation.
 * @throws {@link @bridgework/core!BridgeworkError} as `solveBridge` and {@link selfHeatingLimit};
 *   `invalid-shape` for `gaugeArms` not of length 4 or without any gauge; `wrong-type` for a
 *   non-boolean entry; `unknown-option` for a key it does not know (naming the closest),
 *   `missing-option` without `armsOhms`, `excitationVolts` or `limit`. A check whose figure is not
 *   finite is never `ok` (the arm and excitation limits of `solveBridge` keep them finite).
 * @example
 * ```ts
 * const r = checkSelfHeating({
 *   armsOhms: [350, 350, 350, 350],
 *   excitationVolts: 10,
 *   gaugeArms: [true, false, false, false],
 *   limit: { maxWattsPerGauge: 0.05 },
 * });
 * r.value.gaugeWatts; // 0.07142857142857142 (25 V²/350 Ω)
 * r.value.maxExcitationVolts; // 8.366600265340756
 * ```
 */
export function checkSelfHeating(
  options: SelfHeatingCheckOptions,
): DesignCheck<SelfHeatingValue, SelfHeatingIssue> {
  const o = checkOptions('options', options, {
    known: ['armsOhms', 'excitationVolts', 'sourceOhms', 'gaugeArms', 'limit'],
    required: ['armsOhms', 'excitationVolts', 'limit'],
  });
  const limit = checkSelfHeatingLimit('limit.', o['limit']);
  const gauges = checkGaugeArms(o['gaugeArms']);
  // solveBridge checks the arms, excitation and source resistance under the same names.
  const solution = solveBridge({
    armsOhms: o['armsOhms'] as readonly [number, number, number, number],
    excitationVolts: o['excitationVolts'] as number,
    ...(o['sourceOhms'] === undefined ? {} : { sourceOhms: o['sourceOhms'] as number }),
  });
  const gaugeWatts = Math.max(...solution.armWatts.filter((_, i) => gauges[i]));
  return selfHeatingVerdict(solution.armWatts, gaugeWatts, o['excitationVolts'] as number, limit);
}

function checkGaugeArms(value: unknown): readonly boolean[] {
  if (value === undefined) return [true, true, true, true];
  const arms = checkLength<unknown>('gaugeArms', value, 4);
  arms.forEach((a, i) => checkBoolean(`gaugeArms[${i}]`, a));
  if (!arms.includes(true)) {
    throw new BridgeworkError('invalid-shape', '`gaugeArms` must mark at least one gauge; got none', {
      param: 'gaugeArms',
      value,
    });
  }
  return arms as readonly boolean[];
}
