import {
  BridgeworkError,
  checkFinite,
  checkObject,
  checkOneOf,
  checkOptions,
  checkRange,
  checkStrain,
  formatValue,
} from '@bridgework/core';
import {
  checkExclusive,
  checkGeometry,
  checkModulus,
  checkPoissonRatio,
  shearModulusOf,
} from './internal/inputs.js';
import { leastSquaresOperator } from './internal/leastSquares.js';
import { sectionProperties, type Section } from './sectionProperties.js';

/** The section resultants {@link createMemberReduction} can solve for. */
export const memberResultants = ['axial', 'bending-y', 'bending-z', 'torsion'] as const;

/**
 * A section resultant: `'axial'` force N, `'bending-y'` moment My (about y: stress varies with
 * z), `'bending-z'` moment Mz (about z: stress varies with y), `'torsion'` torque T.
 */
export type MemberResultant = (typeof memberResultants)[number];

/** One gauge of a member: where it sits on the section and which way its grid points. */
export interface MemberGauge {
  /** y coordinate of the gauge on the cross-section, from the centroid, m. */
  readonly yMeters: number;
  /** z coordinate of the gauge on the cross-section, from the centroid, m. */
  readonly zMeters: number;
  /**
   * Direction of the grid on the surface, rad, from the member axis (+x) toward the
   * circumferential direction s = (−z, y)/r (the sense of a positive torque). Default 0: along
   * the axis. ±π/4 for a torsion gauge; π/2 for a Poisson (hoop) gauge. Within ±2π.
   */
  readonly angleRadians?: number;
}

/** Options of {@link createMemberReduction}. */
export interface MemberReductionOptions {
  /** Young's modulus E of the member, Pa (> 0). */
  readonly modulusPascals: number;
  /** Poisson ratio ν of the member, in (−1, 0.5]: the hoop strain −ν·εx and G = E/(2(1 + ν)). */
  readonly poissonRatio: number;
  /**
   * The cross-section: `{ shape: 'circular', diameterMeters, innerDiameterMeters? }` (round bar
   * or tube) or `{ shape: 'rectangular', widthMeters, depthMeters, wallThicknessMeters? }` (solid
   * or a box; width along y, depth along z). Give this, or the three properties below.
   */
  readonly section?: Section;
  /** Area A, m², for another shape (with the two second moments, instead of `section`). */
  readonly areaSquareMeters?: number;
  /** Second moment of area Iy = ∫z² dA about the y axis, m⁴ (instead of `section`). */
  readonly secondMomentYMeters4?: number;
  /** Second moment of area Iz = ∫y² dA about the z axis, m⁴ (instead of `section`). */
  readonly secondMomentZMeters4?: number;
  /**
   * Torsion modulus Wt, m³: the surface shear stress at every angled gauge is τ = T/Wt. Computed
   * for a circular section (τ = T·r/J at each gauge's radius r; not accepted with it) and, by
   * default, for a rectangular hollow section by Bredt's thin-walled formula Wt = 2·Am·t with
   * Am = (b − t)(h − t) (its error grows with t/b: give Wt for a thick wall); required to solve for
   * torsion on a solid rectangle or a section given by its properties.
   */
  readonly torsionModulusCubicMeters?: number;
  /** The gauges, in the order of the strains given to `reduce`; at least as many as resultants. */
  readonly gauges: readonly MemberGauge[];
  /**
   * The resultants to solve for. Default: axial and both bending moments, and torsion when any
   * gauge is angled to the axis.
   */
  readonly resultants?: readonly MemberResultant[];
}

/** The loads at a gauged section (SI; a resultant not solved for is `undefined`). */
export interface MemberLoads {
  /** Axial force N, N (tension positive). */
  readonly axialForceNewtons?: number | undefined;
  /** Bending moment My about y, N·m (positive: tension at +z). */
  readonly bendingMomentYNewtonMeters?: number | undefined;
  /** Bending moment Mz about z, N·m (positive: tension at −y). */
  readonly bendingMomentZNewtonMeters?: number | undefined;
  /** Torque T about x, N·m (right-hand rule about +x). */
  readonly torqueNewtonMeters?: number | undefined;
}

/** One reduction: the resultants and how well they explain the gauges. */
export interface MemberReductionResult extends MemberLoads {
  /**
   * εi − (the strain the solved resultants give at gauge i), m/m, per gauge. All zero (to
   * rounding) when there are as many gauges as resultants.
   */
  readonly residualStrains: readonly number[];
  /** The largest |residual|, m/m: a gauge that disagrees with the others (damaged, misplaced, hot). */
  readonly maxResidualStrain: number;
}

/** A configured reduction (see {@link createMemberReduction}). */
export interface MemberReduction {
  /** The resultants solved for, in the order of {@link memberResultants}. */
  readonly resultants: readonly MemberResultant[];
  /** Number of gauges. */
  readonly gaugeCount: number;
  /**
   * Condition number (2-norm) of the gauge equations with each column scaled to unit length: how
   * many times a relative error of the strains may grow in the resultants. 1 for an ideal layout.
   */
  readonly conditionNumber: number;
  /** Degrees of freedom left for the residuals: gauges − resultants. */
  readonly redundancy: number;
  /**
   * Solves the least-squares resultants from the gauges' strains.
   *
   * @param strains - One strain per gauge, m/m, each in (−1, 1), in the order of `gauges`.
   * @returns The resultants solved for and the residuals.
   * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` (wrong count), `wrong-type`,
   *   `not-finite`, `out-of-range`.
   */
  reduce(strains: readonly number[]): MemberReductionResult;
  /**
   * The strain each gauge reads under given loads (the forward model; a load not given is 0).
   *
   * @param loads - Any of the resultants solved for, SI.
   * @returns One strain per gauge, m/m.
   * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `invalid-option` (a load of
   *   a resultant not solved for), `not-finite`.
   */
  gaugeStrains(loads: MemberLoads): number[];
}

const loadKeys = {
  axial: 'axialForceNewtons',
  'bending-y': 'bendingMomentYNewtonMeters',
  'bending-z': 'bendingMomentZNewtonMeters',
  torsion: 'torqueNewtonMeters',
} as const satisfies Record<MemberResultant, keyof MemberLoads>;

/** The largest condition number accepted, as for rosettes (see `maxRosetteConditionNumber`). */
const MAX_CONDITION = 1000;

/**
 * Creates the reduction of a member's gauge strains to its section resultants: axial force,
 * bending moments about two axes and torque.
 *
 * @remarks
 * A prismatic, linear-elastic member (Euler–Bernoulli bending about principal axes y, z through
 * the centroid; Gere & Goodno, _Mechanics of Materials_, doubly symmetric beams with inclined
 * loads; from memory): the axial stress at (y, z) is
 *
 *   σx = N/A + My·z/Iy − Mz·y/Iz,
 *
 * uniaxial, so the surface strains are εx = σx/E along the axis and εs = −ν·εx across it. Torsion
 * adds the surface shear strain γxs = τ/G with τ = T·r/J on a circular section (Coulomb; J = 2I)
 * or τ = T/Wt at the angled gauges of another section. A gauge at angle θ from the axis reads
 * (strain transformation)
 *
 *   εθ = εx·cos²θ + εs·sin²θ + γxs·sinθ·cosθ.
 *
 * With gauges at known (y, z, θ) this is a linear system in (N, My, Mz, T). It is solved by least
 * squares (Householder QR of the columns scaled to unit length; Golub & Van Loan, _Matrix
 * Computations_, §5.3; from memory), so a redundant gauge set also gives residuals that expose a
 * gauge disagreeing with the rest. Four axial gauges at 90° around a tube give the textbook
 * N = E·A·(ε1 + ε2 + ε3 + ε4)/4 and My = E·Iy·(ε+z − ε−z)/(2c).
 *
 * Not modelled: shear from transverse force (zero strain at 0° and 90°; it adds to γxs at ±45°
 * gauges near the neutral axis of a shear-carrying member), warping of non-circular sections,
 * gauge transverse sensitivity (correct the strains first), temperature (a uniform apparent
 * strain reads as axial force: use compensated gauges or subtract it). Valid away from load
 * introductions, supports, welds and holes (Saint-Venant).
 *
 * @param options - Material, section, gauges and the resultants to solve for.
 * @returns A reduction with `reduce(strains)`, the forward `gaugeStrains(loads)` and the
 *   layout's condition number.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option`, `conflicting-options`,
 *   `unknown-option`, `invalid-option` (unknown resultant; a gauge outside the section; torsion
 *   without a torsion modulus on a non-circular section), `invalid-shape` (fewer gauges than
 *   resultants), `singular` (the gauges cannot separate the resultants: the message names them),
 *   `wrong-type`, `not-finite`, `not-positive`, `out-of-range`.
 * @example
 * ```ts
 * // A tube, four axial gauges at the top, bottom and sides.
 * const tube = createMemberReduction({
 *   modulusPascals: 200e9,
 *   poissonRatio: 0.3,
 *   section: { shape: 'circular', diameterMeters: 0.06, innerDiameterMeters: 0.05 },
 *   gauges: [
 *     { yMeters: 0, zMeters: 0.03 },
 *     { yMeters: 0, zMeters: -0.03 },
 *     { yMeters: 0.03, zMeters: 0 },
 *     { yMeters: -0.03, zMeters: 0 },
 *   ],
 * });
 * tube.reduce([300e-6, 100e-6, 200e-6, 200e-6]).axialForceNewtons; // 34557.5… N (E·A·200 µε)
 * ```
 */
export function createMemberReduction(options: MemberReductionOptions): MemberReduction {
  const o = checkOptions('options', options, {
    known: [
      'modulusPascals',
      'poissonRatio',
      'section',
      'areaSquareMeters',
      'secondMomentYMeters4',
      'secondMomentZMeters4',
      'torsionModulusCubicMeters',
      'gauges',
      'resultants',
    ],
    required: ['modulusPascals', 'poissonRatio', 'gauges'],
  });
  const e = checkModulus('modulusPascals', o['modulusPascals']);
  const nu = checkPoissonRatio('poissonRatio', o['poissonRatio']);
  const g = shearModulusOf(e, nu);
  const geometry = readGeometry(o);
  const gauges = readGauges(o['gauges'], geometry);
  const angled = gauges.some((x) => Math.abs(Math.sin(2 * x.angle)) > 1e-12);
  const resultants = readResultants(o['resultants'], angled);
  if (resultants.includes('torsion') && geometry.torsion === undefined) {
    throw new BridgeworkError(
      'missing-option',
      '`torsionModulusCubicMeters` must be given to solve for torsion on a non-circular section (τ = T/Wt at the angled gauges; Bredt: Wt = 2·Am·t for a thin-walled closed section); got undefined',
      { param: 'torsionModulusCubicMeters', value: undefined },
    );
  }
  if (gauges.length < resultants.length) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`gauges\` must hold at least one gauge per resultant (${resultants.length}: ${resultants.join(', ')}); got ${gauges.length}`,
      { param: 'gauges', value: gauges.length, limit: resultants.length },
    );
  }

  // Strain at gauge i per unit of each resultant (the columns of the gauge equations).
  const column = (r: MemberResultant): number[] =>
    gauges.map(({ y, z, angle }) => {
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      const longitudinal = c * c - nu * s * s; // εθ per unit εx (εs = −ν·εx)
      switch (r) {
        case 'axial':
          return longitudinal / (e * geometry.area);
        case 'bending-y':
          return (longitudinal * z) / (e * geometry.iy);
        case 'bending-z':
          return (-longitudinal * y) / (e * geometry.iz);
        case 'torsion':
          return (s * c * (geometry.torsion as (y: number, z: number) => number)(y, z)) / g;
      }
    });
  const columns = resultants.map(column);
  const solver = leastSquaresOperator(columns);
  if (!(solver.conditionNumber <= MAX_CONDITION)) {
    const names = solver.involved.map((j) => resultants[j] as MemberResultant);
    const kappa = solver.conditionNumber;
    throw new BridgeworkError(
      'singular',
      names.length === 1 && !Number.isFinite(kappa)
        ? `\`gauges\` cannot measure ${names[0]}: no gauge reads it (${suggestion(names[0] as MemberResultant)}); add such a gauge or leave ${names[0]} out of \`resultants\``
        : `\`gauges\` cannot separate ${names.join(' from ')} (condition number ${Number.isFinite(kappa) ? formatValue(kappa) : '∞'}, above ${MAX_CONDITION}): ${names.map(suggestion).join('; ')}; add such gauges or leave one out of \`resultants\``,
      { param: 'gauges', value: kappa, limit: MAX_CONDITION },
    );
  }
  const pseudoInverse = solver.pseudoInverse;
  const n = gauges.length;
  const k = resultants.length;

  function model(x: readonly number[]): number[] {
    const out = new Array<number>(n).fill(0);
    for (let j = 0; j < k; j++) {
      const col = columns[j] as number[];
      const xj = x[j] as number;
      for (let i = 0; i < n; i++) out[i] = (out[i] as number) + (col[i] as number) * xj;
    }
    return out;
  }

  return {
    resultants,
    gaugeCount: n,
    conditionNumber: solver.conditionNumber,
    redundancy: n - k,
    reduce(strains) {
      if (!Array.isArray(strains) || strains.length !== n) {
        throw new BridgeworkError(
          'invalid-shape',
          `\`strains\` must hold one strain per gauge (${n}); got ${Array.isArray(strains) ? strains.length : typeof strains}`,
          { param: 'strains', value: strains, limit: n },
        );
      }
      for (let i = 0; i < n; i++) checkStrain(`strains[${i}]`, strains[i]);
      const x = new Array<number>(k);
      for (let j = 0; j < k; j++) {
        const row = pseudoInverse[j] as number[];
        let sum = 0;
        for (let i = 0; i < n; i++) sum += (row[i] as number) * (strains[i] as number);
        x[j] = sum;
      }
      const fitted = model(x);
      const residualStrains = strains.map((s, i) => s - (fitted[i] as number));
      let maxResidualStrain = 0;
      for (const r of residualStrains) maxResidualStrain = Math.max(maxResidualStrain, Math.abs(r));
      const result: Record<string, unknown> = { residualStrains, maxResidualStrain };
      for (const name of memberResultants) result[loadKeys[name]] = undefined;
      resultants.forEach((name, j) => (result[loadKeys[name]] = x[j]));
      return result as unknown as MemberReductionResult;
    },
    gaugeStrains(loads) {
      const l = checkOptions('loads', loads, { known: Object.values(loadKeys) });
      for (const name of memberResultants) {
        const key = loadKeys[name];
        if (l[key] !== undefined && !resultants.includes(name)) {
          throw new BridgeworkError(
            'invalid-option',
            `\`${key}\` belongs to ${name}, which this reduction does not solve for (resultants: ${resultants.join(', ')}); got ${formatValue(l[key])}`,
            { param: key, value: l[key] },
          );
        }
      }
      return model(
        resultants.map((name) =>
          l[loadKeys[name]] === undefined ? 0 : checkFinite(loadKeys[name], l[loadKeys[name]]),
        ),
      );
    },
  };
}

/** What a user can do about a resultant the gauges do not determine. */
function suggestion(r: MemberResultant): string {
  switch (r) {
    case 'axial':
      return 'axial force needs gauges whose bending strains cancel (opposite faces)';
    case 'bending-y':
      return 'bending-y needs gauges at different z (the ±z faces)';
    case 'bending-z':
      return 'bending-z needs gauges at different y (the ±y faces)';
    case 'torsion':
      return 'torsion needs gauges angled to the axis (±45°)';
  }
}

interface Geometry {
  readonly area: number;
  readonly iy: number;
  readonly iz: number;
  /** τ per unit torque at (y, z), 1/m³; undefined when torsion cannot be solved. */
  readonly torsion: ((y: number, z: number) => number) | undefined;
  /** Whether a point lies on or inside the section (undefined: not checked). */
  readonly contains: ((y: number, z: number) => boolean) | undefined;
}

function readGeometry(o: Record<string, unknown>): Geometry {
  const direct = ['areaSquareMeters', 'secondMomentYMeters4', 'secondMomentZMeters4'] as const;
  for (const d of direct) checkExclusive(o, ['section', d]);
  const wt =
    o['torsionModulusCubicMeters'] === undefined
      ? undefined
      : checkGeometry('torsionModulusCubicMeters', o['torsionModulusCubicMeters'], 3, 'm³');
  if (o['section'] !== undefined) {
    const shape = checkOneOf('section.shape', checkObject('section', o['section'])['shape'], [
      'rectangular',
      'circular',
    ] as const);
    const p = sectionProperties(o['section'] as Section);
    const slack = 1 + 1e-9;
    if (shape === 'circular') {
      checkExclusive(o, ['section', 'torsionModulusCubicMeters']);
      const j = 2 * p.secondMomentOfAreaMeters4;
      const radius = p.extremeFibreMeters;
      return {
        area: p.areaSquareMeters,
        iy: p.secondMomentOfAreaMeters4,
        iz: p.secondMomentOfAreaMeters4,
        torsion: (y, z) => Math.hypot(y, z) / j,
        contains: (y, z) => Math.hypot(y, z) <= radius * slack,
      };
    }
    const s = o['section'] as { widthMeters: number; depthMeters: number; wallThicknessMeters?: number };
    const b = s.widthMeters;
    const h = s.depthMeters;
    const t = s.wallThicknessMeters;
    // Bredt's thin-walled closed section: τ = T/(2·Am·t), Am = (b − t)(h − t) inside the mid-wall line.
    const bredt = t === undefined ? undefined : 2 * (b - t) * (h - t) * t;
    const torsionModulus = wt ?? bredt;
    return {
      area: p.areaSquareMeters,
      iy: p.secondMomentOfAreaMeters4,
      iz: t === undefined ? (h * b * b * b) / 12 : (h * b * b * b - (h - 2 * t) * (b - 2 * t) ** 3) / 12,
      torsion: torsionModulus === undefined ? undefined : () => 1 / torsionModulus,
      contains: (y, z) => Math.abs(y) <= (b / 2) * slack && Math.abs(z) <= (h / 2) * slack,
    };
  }
  const missing = direct.filter((d) => o[d] === undefined);
  if (missing.length > 0) {
    throw new BridgeworkError(
      'missing-option',
      `\`section\`, or \`${direct.join('`, `')}\` together, must be given; got no \`${missing.join('`, `')}\``,
      { param: missing[0] as string, value: undefined },
    );
  }
  return {
    area: checkGeometry('areaSquareMeters', o['areaSquareMeters'], 2, 'm²'),
    iy: checkGeometry('secondMomentYMeters4', o['secondMomentYMeters4'], 4, 'm⁴'),
    iz: checkGeometry('secondMomentZMeters4', o['secondMomentZMeters4'], 4, 'm⁴'),
    torsion: wt === undefined ? undefined : () => 1 / wt,
    contains: undefined,
  };
}

interface GaugeAt {
  readonly y: number;
  readonly z: number;
  readonly angle: number;
}

function readGauges(value: unknown, geometry: Geometry): GaugeAt[] {
  if (!Array.isArray(value) || value.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`gauges\` must be a non-empty array of gauges; got ${formatValue(value)}`,
      {
        param: 'gauges',
        value,
      },
    );
  }
  return value.map((raw, i) => {
    const param = `gauges[${i}]`;
    const x = checkOptions(param, raw, {
      known: ['yMeters', 'zMeters', 'angleRadians'],
      required: ['yMeters', 'zMeters'],
    });
    const y = checkRange(`${param}.yMeters`, x['yMeters'], { min: -1e3, max: 1e3 });
    const z = checkRange(`${param}.zMeters`, x['zMeters'], { min: -1e3, max: 1e3 });
    const angle =
      x['angleRadians'] === undefined
        ? 0
        : checkRange(`${param}.angleRadians`, x['angleRadians'], { min: -2 * Math.PI, max: 2 * Math.PI });
    if (geometry.contains !== undefined && !geometry.contains(y, z)) {
      throw new BridgeworkError(
        'invalid-option',
        `\`${param}\` at y = ${formatValue(y)} m, z = ${formatValue(z)} m lies outside the section: a gauge sits on its surface (coordinates from the centroid, in m)`,
        { param, value: [y, z] },
      );
    }
    return { y, z, angle };
  });
}

function readResultants(value: unknown, angled: boolean): MemberResultant[] {
  if (value === undefined) return angled ? [...memberResultants] : ['axial', 'bending-y', 'bending-z'];
  if (!Array.isArray(value) || value.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`resultants\` must be a non-empty array; got ${formatValue(value)}`,
      {
        param: 'resultants',
        value,
      },
    );
  }
  const chosen = new Set(value.map((r, i) => checkOneOf(`resultants[${i}]`, r, memberResultants)));
  if (chosen.size !== value.length) {
    throw new BridgeworkError(
      'invalid-option',
      `\`resultants\` names a resultant twice; got ${value.join(', ')}`,
      {
        param: 'resultants',
        value,
      },
    );
  }
  return memberResultants.filter((r) => chosen.has(r));
}
