import { BridgeworkError, checkOptions, checkPositive, checkRange, formatValue } from '@bridgework/core';
import { MAGNITUDE_LIMIT, checkBoundedArray } from '../internal/checks.js';
import { designCondition, factorDesign, solveDesign } from '../internal/leastSquares.js';

/** Options of {@link fitCornerFactors}. */
export interface CornerFactorsOptions {
  /**
   * The eccentricity test: for each position of the test load (a corner or segment), every cell's
   * reading with the zero subtracted (positions × cells; V/V or codes). At least as many positions
   * as cells.
   */
  readonly cellReadings: readonly (readonly number[])[];
  /** The indication the test load must give (> 0), in the unit the platform shows (kg, N…). */
  readonly testLoad: number;
  /** Further positions (the centre, say) to evaluate with the fitted factors, not used to fit them. */
  readonly checkReadings?: readonly (readonly number[])[];
}

/** One position's indication with the fitted factors. */
export interface CornerIndication {
  /** Σ k_i·r_i, the platform's indication, in the unit of `testLoad`. */
  readonly indication: number;
  /** indication − testLoad. */
  readonly error: number;
  /** error/testLoad, as a fraction. */
  readonly errorFraction: number;
}

/** Per-cell factors of a digitally summed platform (see {@link fitCornerFactors}). */
export interface CornerFactors {
  /** k_i, the load per unit reading of each cell, in `testLoad` unit per reading unit. */
  readonly factors: readonly number[];
  /** Each test position's indication with the factors. */
  readonly positions: readonly CornerIndication[];
  /** Each check position's indication (from `checkReadings`). */
  readonly checks: readonly CornerIndication[];
  /** The 2-norm condition of the test's reading matrix with unit-norm columns. */
  readonly condition: number;
  /**
   * The platform's indication for one set of cell readings, Σ k_i·r_i.
   *
   * @param readings - One reading per cell, zero subtracted.
   */
  sum(readings: readonly number[]): number;
}

function checkMatrix(param: string, value: unknown, cells?: number): number[][] {
  if (!Array.isArray(value) || value.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}\` must be a non-empty array of rows; got ${formatValue(value)}`,
      {
        param,
        value,
      },
    );
  }
  const width = cells ?? (Array.isArray(value[0]) ? (value[0] as unknown[]).length : 0);
  return value.map((row, p) => checkBoundedArray(`${param}[${p}]`, row, width));
}

/**
 * Per-cell factors for a digitally summed multi-cell platform from an eccentricity test (corner
 * adjustment): the factors that make the same test load indicate the same at every position.
 *
 * @remarks
 * A platform on N load cells indicates W = Σ k_i·r_i with r_i each cell's reading (zero
 * subtracted). The test puts one load L at each of P ≥ N positions; the factors solve
 * Σ_i k_i·r_pi = L for every position p, in the least-squares sense when P > N (Householder QR of
 * the reading matrix with unit-norm columns; exact when P = N and the matrix is regular). A cell
 * whose readings cannot be told apart from the others' (never loaded, or loaded only in
 * proportion to another) makes the factors undetermined and is refused. The residual errors at
 * the positions are reported (zero to rounding for P = N), and check positions are evaluated with
 * the factors. Digital summing is linear in the readings, so a centre load reads the same as the
 * corners whenever the cells themselves are linear.
 *
 * @param options - The test's cell readings, the test load and optional check positions.
 * @returns The factors, the indications and errors at every position, the condition.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` by the
 *   options rule; `invalid-shape` for rows of unequal length; `too-few-points` for fewer positions
 *   than cells; `singular` (param `cellReadings`) when a cell is undetermined; `not-positive`,
 *   `not-finite`, `out-of-range` for bad numbers.
 * @example
 * ```ts
 * const f = fitCornerFactors({
 *   cellReadings: [[1.01e-3, 0, 0, 0], [0, 0.99e-3, 0, 0], [0, 0, 1e-3, 0], [0, 0, 0, 1.02e-3]],
 *   testLoad: 1000,
 * });
 * f.factors; // ≈ [990099, 1010101, 1000000, 980392] (kg per V/V)
 * ```
 */
export function fitCornerFactors(options: CornerFactorsOptions): CornerFactors {
  const o = checkOptions('options', options, {
    known: ['cellReadings', 'testLoad', 'checkReadings'],
    required: ['cellReadings', 'testLoad'],
  });
  const readings = checkMatrix('cellReadings', o['cellReadings']);
  const cells = (readings[0] as number[]).length;
  if (cells === 0) {
    throw new BridgeworkError('invalid-shape', '`cellReadings[0]` must hold one reading per cell; got none', {
      param: 'cellReadings[0]',
    });
  }
  const testLoad = checkRange('testLoad', checkPositive('testLoad', o['testLoad']), { max: MAGNITUDE_LIMIT });
  const checks =
    o['checkReadings'] === undefined ? [] : checkMatrix('checkReadings', o['checkReadings'], cells);
  const p = readings.length;
  if (p < cells) {
    throw new BridgeworkError(
      'too-few-points',
      `\`cellReadings\` must hold at least as many test positions as cells (${cells}); got ${p}`,
      { param: 'cellReadings', value: p, limit: cells },
    );
  }
  const a = Float64Array.from(readings.flat());
  const factor = factorDesign(a, p, cells, 64 * p * Number.EPSILON);
  if (factor.accepted.length < cells) {
    const missing = [...Array(cells).keys()].find((i) => !factor.accepted.includes(i)) as number;
    throw new BridgeworkError(
      'singular',
      `\`cellReadings\` must load every cell independently: cell ${missing} ${factor.norms[missing] === 0 ? 'reads zero at every position' : 'reads in fixed proportion to the other cells'}; add positions over or near it`,
      { param: 'cellReadings', value: missing },
    );
  }
  const factors = Array.from(solveDesign(factor, new Array<number>(p).fill(testLoad)));
  const sum = (r: readonly number[]): number => r.reduce((s, x, i) => s + x * (factors[i] as number), 0);
  const indicate = (r: readonly number[]): CornerIndication => {
    const indication = sum(r);
    return { indication, error: indication - testLoad, errorFraction: (indication - testLoad) / testLoad };
  };
  const result = {
    factors,
    positions: readings.map(indicate),
    checks: checks.map(indicate),
    condition: designCondition(factor),
  };
  if (![...factors, ...result.positions.map((x) => x.indication)].every(Number.isFinite)) {
    throw new BridgeworkError(
      'out-of-range',
      '`cellReadings` must not be vanishingly small against `testLoad` (the factors overflow)',
      { param: 'cellReadings' },
    );
  }
  return {
    ...result,
    sum(r: readonly number[]): number {
      return sum(checkBoundedArray('readings', r, cells));
    },
  };
}
