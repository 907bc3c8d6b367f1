/**
 * The per-row reduction of `bridgework reduce-rosette`: three indicated leg strains to the
 * principal strains, their direction and (with E and ν) the plane-stress state, through the
 * mechanics and compensation packages' own functions.
 */
import { correctRosetteTransverse } from '@bridgework/compensation';
import { createRosette, planeStress, type Rosette } from '@bridgework/mechanics';
import type { RosetteLayout } from '@bridgework/core';

/** Options of {@link createRowReducer}. */
export interface RowReducerOptions {
  /** The layout (as the core package's `RosetteLayout`). */
  readonly layout: RosetteLayout;
  /** Transverse sensitivity of legs a, b, c (undefined: no correction). */
  readonly transverseSensitivity: readonly [number, number, number] | undefined;
  /** ν0 of the gauge-factor calibration. */
  readonly poissonRatio0: number;
  /** E and ν for stresses (undefined: strains only). */
  readonly material: { readonly modulusPascals: number; readonly poissonRatio: number } | undefined;
}

/** One reduced row (SI: m/m, rad, Pa). */
export interface ReducedRow {
  /** The legs after the transverse-sensitivity correction (the indicated ones without it). */
  readonly legs: readonly [number, number, number];
  /** ε1 ≥ ε2. */
  readonly strain1: number;
  readonly strain2: number;
  /** γmax = ε1 − ε2. */
  readonly maxShearStrain: number;
  /** Direction of ε1 from leg a, counterclockwise, rad; NaN when ε1 = ε2 (every direction is principal). */
  readonly angleRadians: number;
  /** σ1, σ2, in-plane τmax, von Mises, Tresca (Pa); undefined without a material. */
  readonly stresses:
    | {
        readonly stress1: number;
        readonly stress2: number;
        readonly maxShear: number;
        readonly vonMises: number;
        readonly tresca: number;
      }
    | undefined;
}

/** A reducer of rows with its layout's condition number. */
export interface RowReducer {
  /** The rosette (its condition number and angles). */
  readonly rosette: Rosette;
  /**
   * Reduces one row.
   *
   * @param legs - Indicated leg strains a, b, c, m/m.
   * @returns The row, or throws the library's error for legs no strain state explains.
   */
  reduce(legs: readonly [number, number, number]): ReducedRow;
}

/**
 * Creates the reducer: `createRosette` once (it refuses a layout whose condition number exceeds
 * the mechanics package's limit), then per row `correctRosetteTransverse` (when Kt is given),
 * `Rosette.reduce` and `planeStress` from the reduced strain state.
 *
 * @param options - Layout, Kt, ν0, material.
 * @returns The reducer.
 */
export function createRowReducer(options: RowReducerOptions): RowReducer {
  const rosette = createRosette({ layout: options.layout });
  const kt = options.transverseSensitivity;
  const material = options.material;
  return {
    rosette,
    reduce(indicated) {
      const legs =
        kt === undefined
          ? indicated
          : correctRosetteTransverse({
              layout: options.layout,
              strains: indicated,
              transverseSensitivity: kt,
              poissonRatio0: options.poissonRatio0,
            });
      const r = rosette.reduce(legs);
      const s =
        material === undefined
          ? undefined
          : planeStress({
              strainState: { strainX: r.strainX, strainY: r.strainY, shearStrainXY: r.shearStrainXY },
              modulusPascals: material.modulusPascals,
              poissonRatio: material.poissonRatio,
            });
      return {
        legs,
        strain1: r.maxStrain,
        strain2: r.minStrain,
        maxShearStrain: r.maxShearStrain,
        angleRadians: r.equalPrincipalStrains ? Number.NaN : r.angleRadians,
        stresses:
          s === undefined
            ? undefined
            : {
                stress1: s.maxStressPascals,
                stress2: s.minStressPascals,
                maxShear: s.maxShearPascals,
                vonMises: s.vonMisesPascals,
                tresca: s.trescaPascals,
              },
      };
    },
  };
}
