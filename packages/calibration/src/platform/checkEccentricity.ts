import {
  BridgeworkError,
  checkInteger,
  checkNonNegative,
  checkOneOf,
  checkOptions,
  checkPositive,
  checkRange,
} from '@bridgework/core';
import type { CheckResult } from '../checkResult.js';
import { MAGNITUDE_LIMIT, checkBoundedArray, finiteResult } from '../internal/checks.js';

/** An OIML R 76 accuracy class of a non-automatic weighing instrument. */
export type InstrumentAccuracyClass = 'I' | 'II' | 'III' | 'IIII';

/** Every {@link InstrumentAccuracyClass}. */
export const instrumentAccuracyClasses: readonly InstrumentAccuracyClass[] = ['I', 'II', 'III', 'IIII'];

/**
 * OIML R 76-1:2006, 3.5.1 Table 6: the mpe on initial verification is 0.5 e up to the first
 * edge, 1.0 e up to the second and 1.5 e above (loads in verification scale intervals e). From
 * memory; the same edges as R 60's classes A–D.
 */
const bands: Readonly<Record<InstrumentAccuracyClass, readonly [number, number]>> = {
  I: [50_000, 200_000],
  II: [5_000, 20_000],
  III: [500, 2_000],
  IIII: [50, 200],
};

/** A load at a band edge within this relative distance counts as on it (rounding of load/e). */
const EDGE_TOLERANCE = 1e-12;
/** An error within this relative distance above its mpe counts as on it. */
const LIMIT_TOLERANCE = 8 * Number.EPSILON;

/** Options of {@link checkEccentricity}. */
export interface EccentricityCheckOptions {
  /** The instrument's accuracy class. */
  readonly accuracyClass: InstrumentAccuracyClass;
  /** Max, the maximum capacity (> 0), load unit. */
  readonly maxCapacity: number;
  /** e, the verification scale interval (> 0), load unit. */
  readonly verificationInterval: number;
  /** The test load used (> 0, ≤ Max), load unit. */
  readonly testLoad: number;
  /** The indication with the test load at each position (a corner or segment), load unit. */
  readonly indications: readonly number[];
  /** The number of points of support of the load receptor (integer ≥ 1). Default 4. */
  readonly supportPoints?: number;
  /** The maximum additive tare effect T (≥ 0), load unit. Default 0. */
  readonly maxAdditiveTare?: number;
  /** `'initial'` (default) or `'in-service'` (mpe twice the initial one). */
  readonly verification?: 'initial' | 'in-service';
}

/** One position of an eccentricity test. */
export interface EccentricityRow {
  /** The position's index in `indications`. */
  readonly position: number;
  /** The indication, load unit. */
  readonly indication: number;
  /** indication − test load, load unit (the residual corner error). */
  readonly error: number;
  /** The mpe at the test load, load unit. */
  readonly mpe: number;
  /** |error|/mpe (≤ 1 passes). */
  readonly fractionOfMpe: number;
  /** Whether |error| ≤ mpe. */
  readonly ok: boolean;
}

/** The figures of an eccentricity check (see {@link checkEccentricity}). */
export interface EccentricityCheck {
  /** One row per position. */
  readonly rows: readonly EccentricityRow[];
  /** The mpe at the test load, load unit. */
  readonly mpe: number;
  /** The mpe in verification scale intervals. */
  readonly mpeInIntervals: number;
  /** The test load R 76 asks for with this many supports, load unit. */
  readonly recommendedTestLoad: number;
  /** Largest |error|/mpe over the positions. */
  readonly largestFractionOfMpe: number;
  /** Largest minus smallest indication, load unit. */
  readonly spread: number;
}

/** The most verification intervals in Max that the check accepts. */
const MAX_INTERVALS = 1e9;

/**
 * The OIML R 76 eccentricity test of a weighing instrument: every position's indication against
 * the mpe for the test load of the chosen accuracy class.
 *
 * @remarks
 * OIML R 76-1:2006 (_Non-automatic weighing instruments_; clause numbers and values from memory,
 * to be confirmed against the standard before they decide anything):
 * - 3.6.2 eccentric loading: the indications with the same load at different positions shall meet
 *   the mpe for that load. The test load is 1/3 of (Max + maximum additive tare effect) on a load
 *   receptor with at most four points of support, each quarter of the receptor loaded in turn
 *   (3.6.2.1), and 1/(n − 1) of it over each support when there are n > 4 (3.6.2.2); `supportPoints`
 *   gives n and `recommendedTestLoad` the figure, and a test load more than 10 % from it is flagged;
 * - 3.5.1, Table 6, the mpe on initial verification for a load m in verification scale intervals e:
 *
 *   | class | 0.5 e for m up to | 1.0 e up to | 1.5 e above |
 *   |---|---|---|---|
 *   | I | 50 000 | 200 000 | 200 000 |
 *   | II | 5 000 | 20 000 | 20 000 (to 100 000) |
 *   | III | 500 | 2 000 | 2 000 (to 10 000) |
 *   | IIII | 50 | 200 | 200 (to 1 000) |
 *
 * - 3.5.2: in service, twice the mpe on initial verification.
 *
 * A band edge belongs to the lower band (within 1e-12 relative of m), and an error equal to the
 * mpe passes (within 8ε). The errors are the indications minus the test load, as read (R 76's
 * changeover-point correction E = I + e/2 − ΔL − L, A.4.4.3, is the caller's, before this check).
 *
 * @param options - Class, Max, e, test load, indications, supports, tare, verification.
 * @returns `{ ok, value, issues }`: per-position errors against the mpe; not ok when any exceeds it
 *   or the test load is not the one 3.6.2 asks for.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` by the options
 *   rule; `invalid-option` for an unknown class or verification; `not-positive`, `not-finite`,
 *   `out-of-range`, `not-integer` for bad numbers (test load above Max, more than 10⁹ intervals
 *   e in Max, an indication whose error in multiples of the mpe overflows); `too-few-points` for no
 *   indication.
 * @example
 * ```ts
 * const c = checkEccentricity({
 *   accuracyClass: 'III', maxCapacity: 3000, verificationInterval: 1, testLoad: 1000,
 *   indications: [1000.5, 999.6, 1000, 1001.2],
 * });
 * c.value.mpe; // 1 (1000 e is in the 1.0 e band of class III)
 * c.ok; // false: 1001.2 is 1.2 e off
 * ```
 */
export function checkEccentricity(options: EccentricityCheckOptions): CheckResult<EccentricityCheck> {
  const o = checkOptions('options', options, {
    known: [
      'accuracyClass',
      'maxCapacity',
      'verificationInterval',
      'testLoad',
      'indications',
      'supportPoints',
      'maxAdditiveTare',
      'verification',
    ],
    required: ['accuracyClass', 'maxCapacity', 'verificationInterval', 'testLoad', 'indications'],
  });
  const accuracyClass = checkOneOf('accuracyClass', o['accuracyClass'], instrumentAccuracyClasses);
  const max = checkRange('maxCapacity', checkPositive('maxCapacity', o['maxCapacity']), {
    max: MAGNITUDE_LIMIT,
  });
  // At most 10⁹ verification intervals in Max (R 76 classes go to 10⁵ for class II and have no upper
  // limit for class I; 10⁹ keeps every mpe a normal number of the load's order).
  const e = checkRange(
    'verificationInterval',
    checkPositive('verificationInterval', o['verificationInterval']),
    { min: max / MAX_INTERVALS, max },
  );
  const testLoad = checkRange('testLoad', checkPositive('testLoad', o['testLoad']), { max });
  const indications = checkBoundedArray('indications', o['indications']);
  if (indications.length === 0) {
    throw new BridgeworkError('too-few-points', '`indications` must hold at least one position; got 0', {
      param: 'indications',
      value: 0,
      limit: 1,
    });
  }
  const supports =
    o['supportPoints'] === undefined
      ? 4
      : checkInteger('supportPoints', o['supportPoints'], { min: 1, max: 1000 });
  const tare =
    o['maxAdditiveTare'] === undefined
      ? 0
      : checkRange('maxAdditiveTare', checkNonNegative('maxAdditiveTare', o['maxAdditiveTare']), { max });
  const verification =
    o['verification'] === undefined
      ? 'initial'
      : checkOneOf('verification', o['verification'], ['initial', 'in-service'] as const);
  const [first, second] = bands[accuracyClass];
  const m = testLoad / e;
  const factor = m <= first * (1 + EDGE_TOLERANCE) ? 0.5 : m <= second * (1 + EDGE_TOLERANCE) ? 1 : 1.5;
  const mpeInIntervals = factor * (verification === 'in-service' ? 2 : 1);
  const mpe = mpeInIntervals * e;
  const recommendedTestLoad = (max + tare) / (supports <= 4 ? 3 : supports - 1);
  const rows = indications.map((indication, position) => {
    const error = indication - testLoad;
    return {
      position,
      indication,
      error,
      mpe,
      fractionOfMpe: finiteResult(
        `indications[${position}]`,
        indication,
        Math.abs(error) / mpe,
        'the error in multiples of the mpe',
      ),
      ok: Math.abs(error) <= mpe * (1 + LIMIT_TOLERANCE),
    };
  });
  const issues = rows
    .filter((r) => !r.ok)
    .map(
      (r) =>
        `position ${r.position}: error ${r.error} exceeds the class ${accuracyClass} mpe ±${mpe} at ${testLoad} (${mpeInIntervals} e, ${verification} verification).`,
    );
  if (Math.abs(testLoad - recommendedTestLoad) > 0.1 * recommendedTestLoad) {
    issues.push(
      `the test load ${testLoad} is not the ${supports <= 4 ? '(Max + T)/3' : `(Max + T)/${supports - 1}`} = ${recommendedTestLoad} that R 76-1 3.6.2 asks for with ${supports} supports (from memory).`,
    );
  }
  return {
    ok: issues.length === 0,
    issues,
    value: {
      rows,
      mpe,
      mpeInIntervals,
      recommendedTestLoad,
      largestFractionOfMpe: Math.max(...rows.map((r) => r.fractionOfMpe)),
      spread: Math.max(...indications) - Math.min(...indications),
    },
  };
}
