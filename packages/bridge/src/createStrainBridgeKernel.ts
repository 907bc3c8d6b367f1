import {
  BridgeworkError,
  checkFinite,
  checkGaugeFactor,
  checkInteger,
  checkOhms,
  checkOneOf,
  checkOptions,
  checkRange,
  formatValue,
  leadWirings,
  OHMS_LIMITS,
  type Interval,
  type LeadWiring,
} from '@bridgework/core';
import {
  arrangementTable,
  needsPoissonRatio,
  strainArrangements,
  type StrainArrangement,
} from './arrangements.js';
import {
  armLayout,
  COMPLETION_OHMS,
  OHMS_PER_LEAD,
  SERIES_OHMS,
  RATIONAL_LENGTH,
  fillRational,
  layoutVector,
  ratioOfRational,
  seriesOhmsOf,
  solveRational,
  strainLimits,
} from './internal/closedForm.js';

/** Options of {@link createStrainBridgeKernel}. */
export interface StrainBridgeKernelOptions {
  /** The arrangement of gauges in the bridge (a row of {@link arrangementTable}). */
  readonly arrangement: StrainArrangement;
  /** Gauge factor of every active gauge, in [0.01, 1000]. */
  readonly gaugeFactor: number;
  /** Unstrained resistance of each gauge in Ω, in [1e-9, 1e15]. Default 350. */
  readonly gaugeOhms?: number;
  /** Poisson ratio of the specimen, in (−1, 0.5]; required by the arrangements with a transverse gauge. */
  readonly poissonRatio?: number;
  /** The lead wiring (one the arrangement accepts, see `StrainBridgeOptions.leads`). Default: no leads. */
  readonly wiring?: LeadWiring;
  /** Series resistance of the excitation source in Ω (0 or in [1e-9, 1e15]). Default 0. */
  readonly sourceOhms?: number;
}

/**
 * A strain bridge whose completion and lead resistances are arguments of each call (see
 * {@link createStrainBridgeKernel}).
 */
export interface StrainBridgeKernel {
  /** The arrangement. */
  readonly arrangement: StrainArrangement;
  /** Strains for which every gauge resistance stays positive (open interval), m/m. */
  readonly strainRange: Interval;
  /**
   * Exact strain (m/m) for an output ratio: `createStrainBridge({ …, completionOhms, leads: {
   * ohmsPerLead, wiring } }).strainFromRatio(ratio)`, bit for bit, without building anything.
   *
   * @param ratio - Vout/Vexc in V/V.
   * @param completionOhms - Completion resistance in Ω, in [1e-9, 1e15].
   * @param ohmsPerLead - Resistance of one lead in Ω, in [0, 1e15] (ignored without a wiring).
   * @throws {@link @bridgework/core!BridgeworkError} `ratio-out-of-range` when no strain inside
   *   `strainRange` gives the ratio; `not-finite`, `wrong-type`, `out-of-range`, `negative` for a
   *   bad argument.
   */
  strainFromRatio(ratio: number, completionOhms: number, ohmsPerLead: number): number;
  /**
   * Exact output ratio Vout/Vexc (V/V) for a strain: `createStrainBridge(…).ratioFromStrain(strain)`.
   *
   * @param strain - Strain in m/m, inside `strainRange`.
   * @param completionOhms - Completion resistance in Ω, in [1e-9, 1e15].
   * @param ohmsPerLead - Resistance of one lead in Ω, in [0, 1e15].
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` for a strain outside
   *   `strainRange`; `not-finite`, `wrong-type`, `negative` for a bad argument.
   */
  ratioFromStrain(strain: number, completionOhms: number, ohmsPerLead: number): number;
  /**
   * The resistance of one arm at a strain, Ω, its leads included: the arm of
   * `createStrainBridge(…).armsOhms(strain)`.
   *
   * @param arm - The arm, 1 to 4 (ring order).
   * @param strain - Strain in m/m, inside `strainRange`.
   * @param completionOhms - Completion resistance in Ω, in [1e-9, 1e15].
   * @param ohmsPerLead - Resistance of one lead in Ω, in [0, 1e15].
   */
  armOhms(arm: 1 | 2 | 3 | 4, strain: number, completionOhms: number, ohmsPerLead: number): number;
  /**
   * The resistance in series with the excitation that the ratio sees, Ω: the source plus the two
   * excitation leads of a four-wire bridge; 0 with remote sense (six-wire).
   *
   * @param ohmsPerLead - Resistance of one lead in Ω, in [0, 1e15].
   */
  seriesOhms(ohmsPerLead: number): number;
}

const POISSON_LIMITS = { min: -1, max: 0.5, minExclusive: true } as const;
const ZERO_OK = { allowZero: true } as const;
const OHMS_MIN = OHMS_LIMITS.min;
const OHMS_MAX = OHMS_LIMITS.max;

/**
 * Creates a strain bridge whose completion and lead resistances are given per call: the exact
 * closed form of {@link createStrainBridge} (the same code), for a Monte Carlo trial or a sweep
 * where those resistances change from call to call and nothing may be built per call.
 *
 * @remarks
 * The arrangement's arms and accepted wirings are read from {@link arrangementTable}, as
 * `createStrainBridge` reads them, so a new row of the table serves both. Each call forms the
 * coefficients of ratio(ε) from the resistances (a few dozen flops, no allocation) and solves
 * the inverse exactly as `createStrainBridge` does, so the two agree bit for bit. Arguments are
 * checked on every call (a comparison each while they are in range); out of range they throw the
 * error the corresponding `createStrainBridge` option would.
 *
 * @param options - Arrangement, gauge factor, gauge resistance, Poisson ratio, wiring, source resistance.
 * @returns The kernel.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an arrangement or wiring
 *   the table does not list for it; `missing-option` without `arrangement`, `gaugeFactor`, or a
 *   Poisson ratio the arrangement needs; `out-of-range`, `not-finite`, `wrong-type` for bad
 *   numbers; `unknown-option` naming the closest key.
 * @example
 * ```ts
 * const kernel = createStrainBridgeKernel({ arrangement: 'quarter', gaugeFactor: 2, wiring: 'three-wire' });
 * kernel.strainFromRatio(4.995e-4, 350, 0.5); // the strain with 0.5 Ω leads and 350 Ω completion
 * ```
 */
export function createStrainBridgeKernel(options: StrainBridgeKernelOptions): StrainBridgeKernel {
  const o = checkOptions('options', options, {
    known: ['arrangement', 'gaugeFactor', 'gaugeOhms', 'poissonRatio', 'wiring', 'sourceOhms'],
    required: ['arrangement', 'gaugeFactor'],
  });
  const arrangement = checkOneOf('arrangement', o['arrangement'], strainArrangements);
  const gaugeFactor = checkGaugeFactor('gaugeFactor', o['gaugeFactor']);
  const gaugeOhms = o['gaugeOhms'] === undefined ? 350 : checkOhms('gaugeOhms', o['gaugeOhms']);
  const needsPoisson = needsPoissonRatio(arrangement);
  if (o['poissonRatio'] === undefined && needsPoisson) {
    throw new BridgeworkError(
      'missing-option',
      `\`poissonRatio\` must be given for '${arrangement}'; got undefined`,
      { param: 'poissonRatio', value: undefined },
    );
  }
  const checkedPoisson =
    o['poissonRatio'] === undefined
      ? undefined
      : checkRange('poissonRatio', o['poissonRatio'], POISSON_LIMITS);
  const info = arrangementTable[arrangement];
  const wiring =
    o['wiring'] === undefined
      ? undefined
      : checkOneOf('wiring', checkOneOf('wiring', o['wiring'], leadWirings), info.wirings);
  const sourceOhms = o['sourceOhms'] === undefined ? 0 : checkOhms('sourceOhms', o['sourceOhms'], ZERO_OK);
  const layout = armLayout(info, needsPoisson ? checkedPoisson : undefined, wiring);
  const [lo, hi] = strainLimits(layout, gaugeFactor);
  const c = new Float64Array(RATIONAL_LENGTH);
  const v = layoutVector(layout, gaugeOhms, gaugeFactor);
  const k = gaugeOhms * gaugeFactor;
  const m = layout.multipliers;
  const leads = layout.leadsInArms;

  /** The arguments' checks, on the slow path only (they throw what createStrainBridge would). */
  function checkResistances(completionOhms: unknown, ohmsPerLead: unknown): void {
    checkOhms('completionOhms', completionOhms);
    checkOhms('ohmsPerLead', ohmsPerLead, ZERO_OK);
  }
  const inRange = (completionOhms: number, ohmsPerLead: number): boolean =>
    typeof completionOhms === 'number' &&
    typeof ohmsPerLead === 'number' &&
    completionOhms >= OHMS_MIN &&
    completionOhms <= OHMS_MAX &&
    ohmsPerLead >= 0 &&
    ohmsPerLead <= OHMS_MAX;

  // The coefficients of the last resistances: a second call with the same ones (a zero reading
  // and a load reading of one trial) reuses them.
  // (Kept in a typed array: a double written to a closure variable is boxed, one allocation per write.)
  const last = Float64Array.of(Number.NaN, Number.NaN);
  function coefficients(completionOhms: number, ohmsPerLead: number): void {
    if (completionOhms === last[0] && ohmsPerLead === last[1]) return;
    if (!inRange(completionOhms, ohmsPerLead)) checkResistances(completionOhms, ohmsPerLead);
    c[COMPLETION_OHMS] = completionOhms;
    c[OHMS_PER_LEAD] = ohmsPerLead;
    c[SERIES_OHMS] = seriesOhmsOf(layout, sourceOhms, ohmsPerLead);
    fillRational(c, v);
    last[0] = completionOhms;
    last[1] = ohmsPerLead;
  }

  function checkStrain(strain: number): number {
    if (typeof strain === 'number' && strain > lo && strain < hi) return strain;
    const e = checkFinite('strain', strain);
    throw new BridgeworkError(
      'out-of-range',
      `\`strain\` must be in (${lo}, ${hi}) so that every gauge resistance stays positive; got ${formatValue(e)}`,
      { param: 'strain', value: e, limit: [lo, hi] },
    );
  }

  // Out of line, so the hot paths stay small enough to be inlined into their callers.
  function noStrain(ratio: number, completionOhms: number, ohmsPerLead: number): never {
    throw new BridgeworkError(
      'ratio-out-of-range',
      `\`ratio\` must be one a '${arrangement}' bridge gives with ${formatValue(completionOhms)} Ω completion and ${formatValue(ohmsPerLead)} Ω per lead (a strain in (${lo}, ${hi})); got ${formatValue(ratio)}`,
      { param: 'ratio', value: ratio },
    );
  }

  return {
    arrangement,
    strainRange: { min: lo, max: hi },
    strainFromRatio(ratio, completionOhms, ohmsPerLead) {
      coefficients(completionOhms, ohmsPerLead);
      if (typeof ratio !== 'number' || !Number.isFinite(ratio)) checkFinite('ratio', ratio);
      const strain = solveRational(c, ratio, lo, hi);
      if (strain > lo && strain < hi) return strain;
      return noStrain(ratio, completionOhms, ohmsPerLead);
    },
    ratioFromStrain(strain, completionOhms, ohmsPerLead) {
      coefficients(completionOhms, ohmsPerLead);
      const e = checkStrain(strain);
      return ratioOfRational(c, e);
    },
    armOhms(arm, strain, completionOhms, ohmsPerLead) {
      if (!inRange(completionOhms, ohmsPerLead)) checkResistances(completionOhms, ohmsPerLead);
      const i =
        (arm === 1 || arm === 2 || arm === 3 || arm === 4
          ? arm
          : checkInteger('arm', arm, { min: 1, max: 4 })) - 1;
      const e = checkStrain(strain);
      return (
        (layout.gauge[i] ? gaugeOhms : completionOhms) +
        (leads[i] as number) * ohmsPerLead +
        k * (m[i] as number) * e
      );
    },
    seriesOhms(ohmsPerLead) {
      if (!(typeof ohmsPerLead === 'number' && ohmsPerLead >= 0 && ohmsPerLead <= OHMS_MAX))
        checkOhms('ohmsPerLead', ohmsPerLead, ZERO_OK);
      return seriesOhmsOf(layout, sourceOhms, ohmsPerLead);
    },
  };
}
