import {
  BridgeworkError,
  checkNonNegative,
  checkObject,
  checkOneOf,
  checkOptions,
  formatValue,
} from '@bridgework/core';
import { checkGeometry } from './internal/inputs.js';

/** A solid or hollow rectangular section, bent about the axis parallel to its width. */
export interface RectangularSection {
  /** Discriminant. */
  readonly shape: 'rectangular';
  /** Width b in m (> 0), parallel to the neutral axis. */
  readonly widthMeters: number;
  /** Depth h in m (> 0), in the plane of bending (gauged face to opposite face). */
  readonly depthMeters: number;
  /**
   * Wall thickness t in m of a rectangular hollow section (a box of uniform wall), 0 < t < min(b, h)/2.
   * Default: solid.
   */
  readonly wallThicknessMeters?: number;
}

/** A solid or hollow circular section (round bar, shaft or tube). */
export interface CircularSection {
  /** Discriminant. */
  readonly shape: 'circular';
  /** Outside diameter D in m (> 0). */
  readonly diameterMeters: number;
  /** Bore d in m, 0 ≤ d < D. Default 0 (solid). */
  readonly innerDiameterMeters?: number;
}

/** A member cross-section: {@link RectangularSection} or {@link CircularSection}. */
export type Section = RectangularSection | CircularSection;

/** Elastic properties of a cross-section for bending about its neutral axis. */
export interface SectionProperties {
  /** Area A, m². */
  readonly areaSquareMeters: number;
  /** Second moment of area I about the neutral axis, m⁴. */
  readonly secondMomentOfAreaMeters4: number;
  /** Distance c from the neutral axis to the surface (the gauged fibre), m. */
  readonly extremeFibreMeters: number;
  /** Elastic section modulus S = I/c, m³. */
  readonly sectionModulusCubicMeters: number;
}

/**
 * Area, second moment of area and elastic section modulus of a rectangular or circular section.
 *
 * @remarks
 * Handbook formulas (for example Roark's _Formulas for Stress and Strain_, table of section
 * properties; from memory):
 *
 * | section | A | I | c | S = I/c |
 * |---|---|---|---|---|
 * | rectangle b × h (bending across h) | b·h | b·h³/12 | h/2 | b·h²/6 |
 * | box b × h, wall t (bᵢ = b − 2t, hᵢ = h − 2t) | b·h − bᵢ·hᵢ | (b·h³ − bᵢ·hᵢ³)/12 | h/2 | 2I/h |
 * | circle D, bore d | π(D² − d²)/4 | π(D⁴ − d⁴)/64 | D/2 | π(D⁴ − d⁴)/(32D) |
 *
 * D² − d² and D⁴ − d⁴ are evaluated as (D − d)(D + d) and (D − d)(D + d)(D² + d²), so a thin
 * tube keeps full relative precision (D − d is exact when d ≥ D/2). The polar moment of a
 * circular section is J = 2I (perpendicular-axis theorem), used by {@link createShaft}.
 *
 * @param section - `{ shape: 'rectangular', widthMeters, depthMeters, wallThicknessMeters? }` or
 *   `{ shape: 'circular', diameterMeters, innerDiameterMeters? }`.
 * @returns A (m²), I (m⁴), c (m) and S (m³).
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `invalid-option` (unknown shape),
 *   `not-finite`, `not-positive`, `negative`, `out-of-range` (bore not smaller than the diameter, a
 *   wall not thinner than half the smaller side).
 * @example
 * ```ts
 * sectionProperties({ shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.006 });
 * // { areaSquareMeters: 0.00012, secondMomentOfAreaMeters4: 3.6e-10,
 * //   extremeFibreMeters: 0.003, sectionModulusCubicMeters: 1.2e-7 }
 * ```
 */
export function sectionProperties(section: Section): SectionProperties {
  const shape = checkOneOf('section.shape', checkObject('section', section)['shape'], [
    'rectangular',
    'circular',
  ] as const);
  if (shape === 'rectangular') {
    const s = checkOptions('section', section, {
      known: ['shape', 'widthMeters', 'depthMeters', 'wallThicknessMeters'],
      required: ['widthMeters', 'depthMeters'],
    });
    const b = checkGeometry('section.widthMeters', s['widthMeters'], 1, 'm');
    const h = checkGeometry('section.depthMeters', s['depthMeters'], 1, 'm');
    const t = checkWall(s['wallThicknessMeters'], b, h);
    if (t === undefined) {
      return {
        areaSquareMeters: b * h,
        secondMomentOfAreaMeters4: (b * h * h * h) / 12,
        extremeFibreMeters: h / 2,
        sectionModulusCubicMeters: (b * h * h) / 6,
      };
    }
    const bi = b - 2 * t;
    const hi = h - 2 * t;
    const i = (b * h * h * h - bi * hi * hi * hi) / 12;
    return {
      areaSquareMeters: b * h - bi * hi,
      secondMomentOfAreaMeters4: i,
      extremeFibreMeters: h / 2,
      sectionModulusCubicMeters: i / (h / 2),
    };
  }
  const s = checkOptions('section', section, {
    known: ['shape', 'diameterMeters', 'innerDiameterMeters'],
    required: ['diameterMeters'],
  });
  const [outer, inner] = checkDiameters('section.', s['diameterMeters'], s['innerDiameterMeters']);
  return circularSectionProperties(outer, inner);
}

/** @internal Checks a box's wall thickness: undefined (solid) or 0 < t < min(b, h)/2. */
export function checkWall(wall: unknown, width: number, depth: number): number | undefined {
  if (wall === undefined) return undefined;
  const t = checkGeometry('section.wallThicknessMeters', wall, 1, 'm');
  const limit = Math.min(width, depth) / 2;
  if (!(t < limit)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`section.wallThicknessMeters\` must be below half the smaller side (${String(limit)} m), or the box has no hole; got ${formatValue(t)} (leave it out for a solid rectangle)`,
      { param: 'section.wallThicknessMeters', value: t, limit: [0, limit] },
    );
  }
  return t;
}

/** @internal Checks an outside diameter (> 0) and an optional bore (0 ≤ d < D, default 0). */
export function checkDiameters(prefix: string, diameter: unknown, bore: unknown): [number, number] {
  const outer = checkGeometry(`${prefix}diameterMeters`, diameter, 1, 'm');
  const param = `${prefix}innerDiameterMeters`;
  const inner = bore === undefined ? 0 : checkNonNegative(param, bore);
  if (!(inner < outer)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must be in [0, ${String(outer)}) (smaller than the diameter); got ${formatValue(inner)}`,
      { param, value: inner, limit: [0, outer] },
    );
  }
  return [outer, inner];
}

/** @internal Properties of a circular section of checked diameters D > d ≥ 0. */
export function circularSectionProperties(outer: number, inner: number): SectionProperties {
  const differenceOfSquares = (outer - inner) * (outer + inner);
  const differenceOfFourthPowers = differenceOfSquares * (outer * outer + inner * inner);
  return {
    areaSquareMeters: (Math.PI * differenceOfSquares) / 4,
    secondMomentOfAreaMeters4: (Math.PI * differenceOfFourthPowers) / 64,
    extremeFibreMeters: outer / 2,
    sectionModulusCubicMeters: (Math.PI * differenceOfFourthPowers) / (32 * outer),
  };
}
