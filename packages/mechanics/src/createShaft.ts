import { checkFinite, checkFiniteResult, checkOptions, checkStrain, requireOption } from '@bridgework/core';
import { checkExclusive, checkModulus, checkPoissonRatio, shearModulusOf } from './internal/inputs.js';
import { checkDiameters, circularSectionProperties } from './sectionProperties.js';

/** Options of {@link createShaft}: the shaft's diameters and its material. */
export interface ShaftOptions {
  /** Outside diameter D at the gauges, m (> 0). */
  readonly diameterMeters: number;
  /** Bore d of a hollow shaft, m, 0 ≤ d < D. Default 0 (solid). */
  readonly innerDiameterMeters?: number;
  /** Young's modulus E in Pa (> 0); with `poissonRatio`, instead of `shearModulusPascals`. */
  readonly modulusPascals?: number;
  /** Poisson ratio ν in (−1, 0.5]; with `modulusPascals`. */
  readonly poissonRatio?: number;
  /** Shear modulus G in Pa (> 0), instead of `modulusPascals` and `poissonRatio`. */
  readonly shearModulusPascals?: number;
}

/** A circular shaft in torsion: torque ↔ ±45° gauge strain (see {@link createShaft}). */
export interface Shaft {
  /** Shear modulus G = E/(2(1 + ν)) (or as given), Pa. */
  readonly shearModulusPascals: number;
  /** Polar moment of area J = π(D⁴ − d⁴)/32, m⁴. */
  readonly polarMomentOfAreaMeters4: number;
  /** Polar section modulus J/(D/2) = π(D⁴ − d⁴)/(16D), m³. */
  readonly polarSectionModulusCubicMeters: number;
  /**
   * Torque T = 2G·ε45·J/(D/2) from the strain of a gauge at +45° to the shaft axis, N·m.
   *
   * @param strain45 - The +45° gauge strain in m/m, in (−1, 1); equally the strain a
   *   `'full-shear'` bridge returns.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `out-of-range`.
   */
  torqueFromStrain(strain45: number): number;
  /**
   * Torque from a +45°/−45° gauge pair, T = G·(ε+45 − ε−45)·J/(D/2), N·m. Axial and bending
   * strains, which both gauges read alike, cancel.
   *
   * @param strainPlus45 - Strain of the +45° gauge, m/m, in (−1, 1).
   * @param strainMinus45 - Strain of the −45° gauge, m/m, in (−1, 1).
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `out-of-range`.
   */
  torqueFromGaugePair(strainPlus45: number, strainMinus45: number): number;
  /**
   * The +45° gauge strain ε45 = T·(D/2)/(2G·J) a torque produces, m/m.
   *
   * @param torqueNewtonMeters - Torque in N·m, finite.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`.
   */
  strainFromTorque(torqueNewtonMeters: number): number;
}

/**
 * Creates the torque–strain map of a solid or hollow circular shaft in elastic torsion.
 *
 * @remarks
 * Torsion of a circular shaft (Coulomb; any strength-of-materials text, e.g. Gere & Goodno,
 * _Mechanics of Materials_, torsion chapter; from memory): the surface shear stress is
 * τ = T·r/J with r = D/2 and J = π(D⁴ − d⁴)/32. The surface is in pure shear, so gauges at ±45°
 * to the axis read ε±45 = ±γ/2 with γ = τ/G. Hence
 *
 *   T = G·γ·J/r = 2G·ε45·J/r,
 *
 * which for a solid shaft (G = E/(2(1 + ν))) is T = E·ε45/(1 + ν)·πD³/16, and for a hollow one
 * T = E·ε45/(1 + ν)·π(D⁴ − d⁴)/(16D). A `'full-shear'` bridge (two ±45° pairs on opposite sides)
 * returns ε45 itself. J = 2I is taken from the section properties ({@link sectionProperties}) (perpendicular-axis theorem).
 *
 * Sign: the torque has the sign of the +45° gauge strain; the positive sense of rotation is the
 * one that stretches the +45° gauge (arm 1 of a `'full-shear'` bridge). Valid in the elastic
 * range, away from keyways, shoulders and load introductions.
 *
 * @param options - Diameters and either `modulusPascals` with `poissonRatio` or `shearModulusPascals`.
 * @returns An evaluator with `torqueFromStrain`, `torqueFromGaugePair`, `strainFromTorque`, G and J.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option`, `conflicting-options`
 *   (`shearModulusPascals` with `modulusPascals` or `poissonRatio`), `wrong-type`, `not-finite`,
 *   `not-positive`, `negative`, `out-of-range` (ν, or a bore not smaller than the diameter).
 * @example
 * ```ts
 * const shaft = createShaft({ diameterMeters: 0.025, modulusPascals: 200e9, poissonRatio: 0.3 });
 * shaft.torqueFromStrain(500e-6); // 235.99704… N·m
 * ```
 */
export function createShaft(options: ShaftOptions): Shaft {
  const o = checkOptions('options', options, {
    known: ['diameterMeters', 'innerDiameterMeters', 'modulusPascals', 'poissonRatio', 'shearModulusPascals'],
    required: ['diameterMeters'],
  });
  const [outer, inner] = checkDiameters('', o['diameterMeters'], o['innerDiameterMeters']);
  const section = circularSectionProperties(outer, inner);
  let shearModulusPascals: number;
  if (o['shearModulusPascals'] !== undefined) {
    checkExclusive(o, ['shearModulusPascals', 'modulusPascals']);
    checkExclusive(o, ['shearModulusPascals', 'poissonRatio']);
    shearModulusPascals = checkModulus('shearModulusPascals', o['shearModulusPascals']);
  } else {
    const e = checkModulus(
      'modulusPascals',
      requireOption('modulusPascals', o['modulusPascals'], 'or `shearModulusPascals`'),
    );
    const nu = checkPoissonRatio(
      'poissonRatio',
      requireOption('poissonRatio', o['poissonRatio'], 'with `modulusPascals`'),
    );
    shearModulusPascals = shearModulusOf(e, nu);
  }
  const polarMomentOfAreaMeters4 = 2 * section.secondMomentOfAreaMeters4;
  const polarSectionModulusCubicMeters = 2 * section.sectionModulusCubicMeters;
  const torquePerShearStrain = shearModulusPascals * polarSectionModulusCubicMeters; // T = this·γ
  return {
    shearModulusPascals,
    polarMomentOfAreaMeters4,
    polarSectionModulusCubicMeters,
    torqueFromStrain: (strain45) => torquePerShearStrain * (2 * checkStrain('strain45', strain45)),
    torqueFromGaugePair: (strainPlus45, strainMinus45) =>
      torquePerShearStrain *
      (checkStrain('strainPlus45', strainPlus45) - checkStrain('strainMinus45', strainMinus45)),
    strainFromTorque: (torqueNewtonMeters) =>
      checkFiniteResult(checkFinite('torqueNewtonMeters', torqueNewtonMeters) / (2 * torquePerShearStrain), {
        what: 'the strain',
        param: 'torqueNewtonMeters',
        value: torqueNewtonMeters,
      }),
  };
}
