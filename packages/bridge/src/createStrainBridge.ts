import {
  BridgeworkError,
  checkFinite,
  checkFiniteResult,
  checkOhms,
  checkOneOf,
  checkGaugeFactor,
  checkOptions,
  checkRange,
  formatValue,
  type Interval,
  type LeadWiring,
  type LeadsOptions,
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
  D0,
  D1,
  D2,
  quotient,
  K0,
  K1,
  M0,
  M1,
  N0,
  N1,
  N2,
  RATIONAL_LENGTH,
  fillRational,
  layoutVector,
  seriesOhmsOf,
  solveRational,
  strainLimits,
} from './internal/closedForm.js';

/** Options of {@link createStrainBridge}. */
export interface StrainBridgeOptions {
  /** The arrangement of gauges in the bridge (see {@link StrainArrangement}). */
  readonly arrangement: StrainArrangement;
  /** Gauge factor of every active gauge, in [0.01, 1000], as stated on the gauge package. */
  readonly gaugeFactor: number;
  /** Unstrained resistance of each gauge in Ω, in [1e-9, 1e15]. Default 350. */
  readonly gaugeOhms?: number;
  /** Resistance of each completion resistor in Ω, in [1e-9, 1e15]. Default `gaugeOhms`. */
  readonly completionOhms?: number;
  /**
   * Poisson ratio of the specimen, in (−1, 0.5]. Required by `'half-poisson'`, `'full-poisson'`
   * and `'full-bending-poisson'`; checked but not used by the others.
   */
  readonly poissonRatio?: number;
  /**
   * Lead wires: `'two-wire'` or `'three-wire'` for `'quarter'`; `'three-wire'` for
   * `'half-bending'` and `'half-poisson'`; `'two-wire'` (each gauge on its own pair) for
   * `'half-opposite'`; `'four-wire'` or `'six-wire'` (remote sense) for the full bridges.
   * Default: no lead resistance.
   */
  readonly leads?: LeadsOptions;
  /**
   * Series resistance of the excitation source in Ω (0 or in [1e-9, 1e15]). Default 0. With
   * `'six-wire'` leads the excitation is sensed at the bridge, so it has no effect.
   */
  readonly sourceOhms?: number;
}

/** Options of a strain bridge's `strainFromRatio`. */
export interface StrainFromRatioOptions {
  /**
   * The reading (V/V) taken at zero load. When given, the exact two-reading method is used: the
   * active gauge is solved at zero and at load, and the result is its strain change relative to
   * its resistance at zero, rather than a difference of ratios.
   */
  readonly zeroRatio?: number;
}

/** A configured strain bridge: exact maps between strain and output ratio (see {@link createStrainBridge}). */
export interface StrainBridge {
  /** The arrangement. */
  readonly arrangement: StrainArrangement;
  /** Gauge factor used. */
  readonly gaugeFactor: number;
  /** Gauge resistance in Ω. */
  readonly gaugeOhms: number;
  /** Completion resistance in Ω. */
  readonly completionOhms: number;
  /** Poisson ratio used (`undefined` when the arrangement has no transverse gauge). */
  readonly poissonRatio: number | undefined;
  /** Resistance in series with the excitation (source plus four-wire excitation leads) in Ω. */
  readonly seriesOhms: number;
  /** Nominal bridge factor N: Vout/Vexc ≈ N·GF·ε/4 for small strain, equal arms and no leads. */
  readonly bridgeFactor: number;
  /** Exact slope d(ratio)/d(strain) at zero strain, leads and completion included, in V/V per m/m. */
  readonly sensitivity: number;
  /** Output ratio at zero strain (non-zero with two-wire leads or unequal completion), V/V. */
  readonly offsetRatio: number;
  /** Strains for which every gauge resistance stays positive (open interval), m/m. */
  readonly strainRange: Interval;
  /** Ratios the bridge can produce over `strainRange` (open interval), V/V. */
  readonly ratioRange: Interval;
  /**
   * The exact map as a ratio of quadratics in strain ε:
   * ratio = (n0 + n1·ε + n2·ε²)/(d0 + d1·ε + d2·ε²). Both polynomials are in Ω².
   */
  readonly rational: {
    /** Numerator coefficients `[n0, n1, n2]`. */
    readonly numerator: readonly [number, number, number];
    /** Denominator coefficients `[d0, d1, d2]`. */
    readonly denominator: readonly [number, number, number];
  };
  /**
   * The same exact map in lowest terms when it is a linear-fractional (Möbius) function of strain,
   * ratio = (m0 + m1·ε)/(k0 + k1·ε), so that ε = (m0 − k0·r)/(k1·r − m1); `undefined` for
   * `'full-bending-poisson'`, whose map is a true ratio of quadratics. Every other arrangement,
   * with any leads, is linear-fractional (for `'half-opposite'` and the full bridges with equal
   * halves a common factor R1 + R2 cancels). Batch converters fold these four numbers into
   * their per-sample coefficients.
   */
  readonly linearFractional:
    | {
        /** Numerator coefficients `[m0, m1]`. */
        readonly numerator: readonly [number, number];
        /** Denominator coefficients `[k0, k1]`. */
        readonly denominator: readonly [number, number];
      }
    | undefined;
  /**
   * Exact output ratio Vout/Vexc (V/V) for a strain; with `zeroRatio`, the ratio at which the
   * two-reading method returns this strain (the inverse of `strainFromRatio` with the same zero).
   *
   * @param strain - Strain in m/m (from zero, when `zeroRatio` is given), inside `strainRange`.
   * @param options - `zeroRatio`: the reading at zero load, V/V.
   * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`, `out-of-range`;
   *   `ratio-out-of-range` for a bad `zeroRatio`.
   */
  ratioFromStrain(strain: number, options?: StrainFromRatioOptions): number;
  /**
   * Exact strain (m/m) for an output ratio, optionally referenced to a zero reading.
   *
   * @param ratio - Vout/Vexc in V/V, inside `ratioRange`.
   * @param options - `zeroRatio` for the two-reading method.
   * @throws {@link @bridgework/core!BridgeworkError} `not-finite`, `wrong-type`, `ratio-out-of-range`.
   */
  strainFromRatio(ratio: number, options?: StrainFromRatioOptions): number;
  /**
   * Fractional shortfall of the exact output against the tangent line at zero strain:
   * 1 − (ratio(ε) − ratio(0))/(sensitivity·ε); 0 at ε = 0, positive when the bridge reads low.
   *
   * @param strain - Strain in m/m, inside `strainRange`.
   */
  nonlinearity(strain: number): number;
  /**
   * The linear approximation `offsetRatio + sensitivity·ε` (a named extra, not the exact map).
   *
   * @param strain - Strain in m/m.
   */
  linearRatioFromStrain(strain: number): number;
  /**
   * The four arm resistances in Ω at a strain, including lead resistance inside the arms (but not
   * the series excitation resistance), for a cross-check with `solveBridge`.
   *
   * @param strain - Strain in m/m, inside `strainRange`.
   */
  armsOhms(strain: number): [number, number, number, number];
}

type Quad = readonly [number, number, number];

/** Limit of n(x)/d(x) as x → ±∞ (sign = ±1), or the value at a finite x. */
const POISSON_LIMITS = { min: -1, max: 0.5, minExclusive: true } as const;
const ZERO_OK = { allowZero: true } as const;

function readZeroRatio(options: unknown): unknown {
  if (options === undefined) return undefined;
  return checkOptions('options', options, { known: ['zeroRatio'] })['zeroRatio'];
}

function ratioAt(n: Quad, d: Quad, x: number): number {
  if (Number.isFinite(x)) return quotient(n, d, x);
  if (d[2] !== 0) return n[2] / d[2];
  if (d[1] !== 0 && n[2] === 0) return n[1] / d[1];
  return Math.sign(x) * Infinity;
}

/**
 * Creates an exact strain bridge for one of the standard arrangements, with leads.
 *
 * @remarks
 * Each arm is affine in strain, Ri = pi + gi·ε (pi the unstrained arm with its leads, gi = Rg·GF·si
 * with si the arm's strain multiplier from {@link StrainArrangement}), so the unloaded bridge with
 * a series excitation resistance Rser gives exactly
 *
 *   ratio = (R1R3 − R2R4) / ((R1 + R2)(R3 + R4) + Rser·(R1 + R2 + R3 + R4)),
 *
 * a ratio of two quadratics in ε (the same closed form as {@link solveBridge} with an infinite
 * meter resistance). The inverse solves the quadratic (r·d2 − n2)ε² + (r·d1 − n1)ε + (r·d0 − n0) = 0
 * in closed form with the cancellation-free root formula and picks the root inside `strainRange`
 * (n2 = d2 = 0, a Möbius map, for all but `'half-opposite'`, `'full-poisson'` and
 * `'full-bending-poisson'`; the first two still reduce to Möbius maps, their second root lying
 * outside `strainRange`). The round trip is exact to a few ulps. Lead wiring: two-wire puts both
 * leads in series with the quarter-bridge gauge (arm 1); three-wire puts one lead in arm 1 and one
 * in arm 2 and the sense lead carries no current; four-wire puts both excitation leads in series
 * with the excitation; six-wire senses the excitation at the bridge. Equations and their sources
 * are in docs/bridge.md. The meter is taken as ideal (infinite input resistance); use
 * {@link solveBridge} for meter loading.
 *
 * The two-reading method (`zeroRatio`): with ε0 and ε1 the strains solved from the zero and load
 * readings, the gauge of arm 1 has resistance Rg(1 + GF·ε0) at zero and Rg(1 + GF·ε1) at load, so
 * the strain from zero is (ε1 − ε0)/(1 + GF·ε0). This is exact for a quarter bridge whose zero
 * offset comes from the gauge itself; for the other arrangements the zero offset is attributed to
 * the same strain pattern.
 *
 * Resistances lie in `OHMS_LIMITS` of the core package (1 nΩ … 1 PΩ) and the gauge factor in
 * [0.01, 1000], so every coefficient is finite; the maps are evaluated in powers of 1/ε beyond
 * |ε| = 1e100, so every strain inside `strainRange` gives a finite ratio.
 *
 * @param options - Arrangement, gauge factor, resistances, Poisson ratio, leads, source resistance.
 * @returns An evaluator: exact forward and inverse maps, sensitivity, ranges and nonlinearity.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown arrangement or a wiring
 *   the arrangement cannot take; `missing-option` when a Poisson arrangement has no `poissonRatio`
 *   (or without `arrangement`, `gaugeFactor`, `leads.ohmsPerLead` or `leads.wiring`);
 *   `out-of-range` for a Poisson ratio outside (−1, 0.5], a gauge factor outside [0.01, 1000] or a
 *   resistance outside [1e-9, 1e15] Ω; `not-positive`, `not-finite`, `negative`, `wrong-type` for
 *   bad numbers; `unknown-option` for a key it does not know (naming the closest).
 * @example
 * ```ts
 * const bridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
 * bridge.ratioFromStrain(1e-3); // 4.995004995004995e-4 (0.4995 mV/V)
 * bridge.strainFromRatio(4.995004995004995e-4); // 0.001
 * ```
 */
export function createStrainBridge(options: StrainBridgeOptions): StrainBridge {
  const o = checkOptions('options', options, {
    known: [
      'arrangement',
      'gaugeFactor',
      'gaugeOhms',
      'completionOhms',
      'poissonRatio',
      'leads',
      'sourceOhms',
    ],
    required: ['arrangement', 'gaugeFactor'],
  });
  const arrangement = checkOneOf('arrangement', o['arrangement'], strainArrangements);
  const gaugeFactor = checkGaugeFactor('gaugeFactor', o['gaugeFactor']);
  const gaugeOhms = o['gaugeOhms'] === undefined ? 350 : checkOhms('gaugeOhms', o['gaugeOhms']);
  const completionOhms =
    o['completionOhms'] === undefined ? gaugeOhms : checkOhms('completionOhms', o['completionOhms']);
  if (o['poissonRatio'] === undefined && needsPoissonRatio(arrangement)) {
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
  const poissonRatio = needsPoissonRatio(arrangement) ? checkedPoisson : undefined;
  const sourceOhms = o['sourceOhms'] === undefined ? 0 : checkOhms('sourceOhms', o['sourceOhms'], ZERO_OK);
  const info = arrangementTable[arrangement];

  let wiring: LeadWiring | undefined;
  let ohmsPerLead = 0;
  if (o['leads'] !== undefined) {
    const l = checkOptions('leads', o['leads'], {
      known: ['ohmsPerLead', 'wiring'],
      required: ['ohmsPerLead', 'wiring'],
    });
    ohmsPerLead = checkOhms('leads.ohmsPerLead', l['ohmsPerLead'], ZERO_OK);
    wiring = checkOneOf('leads.wiring', l['wiring'], info.wirings);
  }

  // Arm i = p[i] + g[i]·ε: the closed form shared with createStrainBridgeKernel.
  const layout = armLayout(info, poissonRatio, wiring);
  const multipliers = layout.multipliers;
  const seriesOhms = seriesOhmsOf(layout, sourceOhms, ohmsPerLead);
  const c = new Float64Array(RATIONAL_LENGTH);
  c[COMPLETION_OHMS] = completionOhms;
  c[OHMS_PER_LEAD] = ohmsPerLead;
  c[SERIES_OHMS] = seriesOhms;
  fillRational(c, layoutVector(layout, gaugeOhms, gaugeFactor));
  const numerator: Quad = [c[N0] as number, c[N1] as number, c[N2] as number];
  const denominator: Quad = [c[D0] as number, c[D1] as number, c[D2] as number];
  const armOhms = (i: number, e: number): number =>
    (layout.gauge[i] ? gaugeOhms : completionOhms) +
    (layout.leadsInArms[i] as number) * ohmsPerLead +
    gaugeOhms * gaugeFactor * (multipliers[i] as number) * e;

  const [strainMin, strainMax] = strainLimits(layout, gaugeFactor);
  const strainRange: Interval = { min: strainMin, max: strainMax };
  const ratioEnds = [ratioAt(numerator, denominator, strainMin), ratioAt(numerator, denominator, strainMax)];
  const ratioRange: Interval = { min: Math.min(...ratioEnds), max: Math.max(...ratioEnds) };

  const [n0, n1, n2] = numerator;
  const [d0, d1, d2] = denominator;
  const linearFractional = Number.isNaN(c[M0])
    ? undefined
    : {
        numerator: [c[M0] as number, c[M1] as number] as const,
        denominator: [c[K0] as number, c[K1] as number] as const,
      };
  const a = n1 * d0 - n0 * d1;
  const b = n2 * d0 - n0 * d2;
  const sensitivity = a / (d0 * d0);
  const offsetRatio = n0 / d0;
  // 1 − (r(ε) − r(0))/(sensitivity·ε) = ε·(a·(d1 + ε·d2) − d0·b)/(a·d(ε)), a ratio of quadratics.
  const nonlinearityNumerator: Quad = [0, a * d1 - d0 * b, a * d2];
  const nonlinearityDenominator: Quad = [a * d0, a * d1, a * d2];

  function checkStrain(param: string, value: unknown): number {
    const strain = checkFinite(param, value);
    if (!(strain > strainMin && strain < strainMax)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`${param}\` must be in (${strainMin}, ${strainMax}) so that every gauge resistance stays positive; got ${formatValue(strain)}`,
        { param, value: strain, limit: [strainMin, strainMax] },
      );
    }
    return strain;
  }

  function solve(param: string, value: unknown): number {
    const r = checkFinite(param, value);
    const strain = solveRational(c, r, strainMin, strainMax);
    if (!(strain > strainMin && strain < strainMax && r > ratioRange.min && r < ratioRange.max)) {
      throw new BridgeworkError(
        'ratio-out-of-range',
        `\`${param}\` must be in (${ratioRange.min}, ${ratioRange.max}) for a '${arrangement}' bridge; got ${formatValue(r)}`,
        { param, value: r, limit: [ratioRange.min, ratioRange.max] },
      );
    }
    return strain;
  }

  return {
    arrangement,
    gaugeFactor,
    gaugeOhms,
    completionOhms,
    poissonRatio,
    seriesOhms,
    bridgeFactor: multipliers[0] + multipliers[2] - (multipliers[1] + multipliers[3]),
    sensitivity,
    offsetRatio,
    strainRange,
    ratioRange,
    rational: { numerator, denominator },
    linearFractional,
    ratioFromStrain(strain: number, opts?: StrainFromRatioOptions): number {
      const zeroRatio = readZeroRatio(opts);
      let e = checkFinite('strain', strain);
      if (zeroRatio !== undefined) {
        // Invert ε = (ε1 − ε0)/(1 + GF·ε0): the gauge's strain at load is ε1 = ε0 + ε·(1 + GF·ε0).
        const zero = solve('zeroRatio', zeroRatio);
        e = zero + e * (1 + gaugeFactor * zero);
        if (!Number.isFinite(e)) e = e > 0 ? strainMax : strainMin; // beyond the range: refused below
      }
      e = checkStrain('strain', e);
      return quotient(numerator, denominator, e);
    },
    strainFromRatio(ratio: number, opts?: StrainFromRatioOptions): number {
      const zeroRatio = readZeroRatio(opts);
      const strain = solve('ratio', ratio);
      if (zeroRatio === undefined) return strain;
      const zero = solve('zeroRatio', zeroRatio);
      return checkFiniteResult((strain - zero) / (1 + gaugeFactor * zero), {
        what: 'the strain from zero',
        param: 'ratio',
        value: ratio,
      });
    },
    nonlinearity(strain: number): number {
      const e = checkStrain('strain', strain);
      return checkFiniteResult(quotient(nonlinearityNumerator, nonlinearityDenominator, e), {
        what: 'the nonlinearity',
        param: 'strain',
        value: strain,
      });
    },
    linearRatioFromStrain(strain: number): number {
      return checkFiniteResult(offsetRatio + sensitivity * checkFinite('strain', strain), {
        what: 'the linear ratio',
        param: 'strain',
        value: strain,
      });
    },
    armsOhms(strain: number): [number, number, number, number] {
      const e = checkStrain('strain', strain);
      const arms: [number, number, number, number] = [
        armOhms(0, e),
        armOhms(1, e),
        armOhms(2, e),
        armOhms(3, e),
      ];
      for (const r of arms)
        checkFiniteResult(r, { what: 'every arm resistance', param: 'strain', value: strain });
      return arms;
    },
  };
}
