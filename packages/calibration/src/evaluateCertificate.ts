import { BridgeworkError, checkOptions, formatValue } from '@bridgework/core';
import { checkBoundedArray } from './internal/checks.js';

/** One loading run of a transducer calibration: readings at each reference load, up then down. */
export interface CertificateRun {
  /** Readings with increasing load, one per entry of `loads` (V/V, or any unit). */
  readonly ascending: readonly number[];
  /**
   * Readings with decreasing load, listed in the same order as `loads` (so `descending[i]` was
   * taken at `loads[i]` on the way down). Give it for every run or for none.
   */
  readonly descending?: readonly number[];
}

/** Options of {@link evaluateCertificate}. */
export interface CertificateOptions {
  /**
   * Reference loads, strictly increasing, starting at 0 (no load) and ending at the rated
   * capacity; any unit. At least three.
   */
  readonly loads: readonly number[];
  /** One or more runs; two or more give the repeatability. */
  readonly runs: readonly CertificateRun[];
}

/** A straight line `reading = offset + slope·load`. */
export interface StraightLine {
  /** Reading at zero load. */
  readonly offset: number;
  /** Reading per unit load. */
  readonly slope: number;
}

/** The evaluation at one reference load (deviations as fractions of rated output). */
export interface CertificatePoint {
  /** The reference load. */
  readonly load: number;
  /** Mean ascending reading over the runs. */
  readonly ascending: number;
  /** Mean descending reading over the runs (`undefined` without descending runs). */
  readonly descending: number | undefined;
  /** Ascending mean minus the terminal line, as a fraction of rated output. */
  readonly terminalDeviationFraction: number;
  /** Descending mean minus the terminal line, as a fraction of rated output (`undefined` without descending runs). */
  readonly descendingTerminalDeviationFraction: number | undefined;
  /** Ascending mean minus the best-fit line, as a fraction of rated output. */
  readonly bestFitDeviationFraction: number;
  /** Descending minus ascending mean, as a fraction of rated output (`undefined` without descending runs). */
  readonly hysteresisFraction: number | undefined;
  /** Largest minus smallest ascending reading over the runs, as a fraction of rated output (`undefined` for one run). */
  readonly repeatabilityFraction: number | undefined;
}

/** The evaluation of a transducer calibration (see {@link evaluateCertificate}). */
export interface CertificateEvaluation {
  /** Rated capacity: the last reference load. */
  readonly capacity: number;
  /** Rated output: mean over runs of (ascending reading at capacity − ascending reading at zero), reading unit. */
  readonly ratedOutput: number;
  /** Zero balance: mean ascending reading at zero load, reading unit. */
  readonly zeroBalance: number;
  /** Zero balance as a fraction of rated output. */
  readonly zeroBalanceFraction: number;
  /** Largest |ascending − terminal line|, as a fraction of rated output. */
  readonly terminalNonlinearityFraction: number;
  /** Largest |ascending − least-squares line|, as a fraction of rated output. */
  readonly bestFitNonlinearityFraction: number;
  /** Largest |descending − ascending|, as a fraction of rated output (`undefined` without descending runs). */
  readonly hysteresisFraction: number | undefined;
  /** Largest deviation of any ascending or descending mean from the terminal line, as a fraction of rated output. */
  readonly combinedErrorFraction: number;
  /** Largest spread of ascending readings between runs at one load, as a fraction of rated output (`undefined` for one run). */
  readonly repeatabilityFraction: number | undefined;
  /** The terminal line through the mean ascending readings at zero and at capacity. */
  readonly terminalLine: StraightLine;
  /** The least-squares line through the mean ascending readings. */
  readonly bestFitLine: StraightLine;
  /** The per-load table. */
  readonly points: readonly CertificatePoint[];
}

const mean = (xs: readonly number[]): number => xs.reduce((s, x) => s + x, 0) / xs.length;
const largestMagnitude = (xs: readonly number[]): number => Math.max(...xs.map(Math.abs));

/**
 * Least-squares straight line by centred sums: slope = Σ(x − x̄)(y − ȳ)/Σ(x − x̄)², offset = ȳ − slope·x̄.
 * Centring makes this the QR solution of the straight-line problem on centred data, without
 * needing a linear-algebra library here (the tests compare it with the QR fit).
 */
function leastSquaresLine(x: readonly number[], y: readonly number[]): StraightLine {
  const xm = mean(x);
  const ym = mean(y);
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < x.length; i++) {
    const dx = (x[i] as number) - xm;
    sxy += dx * ((y[i] as number) - ym);
    sxx += dx * dx;
  }
  const slope = sxy / sxx;
  return { offset: ym - slope * xm, slope };
}

/**
 * Evaluates a transducer calibration run (or several) the way a load-cell certificate reports it.
 *
 * @remarks
 * Definitions (common practice for strain-gauge load cells and force transducers; every figure in
 * fraction of rated output RO):
 * - rated output RO: the output at capacity minus the output at zero load (ascending, averaged
 *   over runs); zero balance: the output at zero load;
 * - terminal-line nonlinearity: the largest deviation of the mean ascending curve from the straight
 *   line through its zero and capacity points;
 * - best-fit nonlinearity: the largest deviation of the mean ascending curve from its
 *   least-squares straight line (the "best-fit straight line"; an equal-weight fit to the run
 *   means, the same as to all runs' points when every load has the same number of runs);
 * - hysteresis: the largest difference between descending and ascending mean readings at the same
 *   load (including the zero return);
 * - combined error: the largest deviation of any ascending or descending mean from the terminal
 *   line (nonlinearity and hysteresis together);
 * - repeatability: the largest difference between the ascending readings of different runs at
 *   the same load.
 * Deviations are signed in the per-load table (positive = beyond the line in the direction of the
 * output) and the summary figures are their largest magnitudes. Plain double arithmetic; the
 * readings' own resolution, not rounding, limits these figures.
 *
 * @param options - Reference loads and runs.
 * @returns The certificate figures and the per-load table.
 * @throws {@link @bridgework/core!BridgeworkError} `too-few-points` for fewer than three loads or no
 *   run; `invalid-shape` when `runs` is not an array, a run's readings do not match the loads, or descending readings are
 *   given for some runs only; `out-of-range` when the loads do not start at 0 or do not increase,
 *   the rated output is zero, a load or reading lies beyond ±1e100, or the rated output is so small
 *   against the readings that a fraction would overflow; `not-finite`, `wrong-type` for a bad
 *   reading; `unknown-option`, `missing-option` by the options rule (also for each run).
 * @example
 * ```ts
 * const e = evaluateCertificate({
 *   loads: [0, 500, 1000],
 *   runs: [{ ascending: [0, 1.0004e-3, 2e-3], descending: [0.0002e-3, 1.0008e-3, 2e-3] }],
 * });
 * e.terminalNonlinearityFraction; // ≈ 2e-4 (0.02 % of rated output in a report)
 * e.hysteresisFraction; // ≈ 2e-4 (and combinedErrorFraction ≈ 4e-4)
 * ```
 */
export function evaluateCertificate(options: CertificateOptions): CertificateEvaluation {
  const o = checkOptions('options', options, { known: ['loads', 'runs'], required: ['loads', 'runs'] });
  const loads = checkBoundedArray('loads', o['loads']);
  if (loads.length < 3) {
    throw new BridgeworkError(
      'too-few-points',
      `\`loads\` must hold at least 3 reference loads (zero, one or more between, capacity); got ${loads.length}`,
      { param: 'loads', value: loads.length, limit: 3 },
    );
  }
  if (loads[0] !== 0) {
    throw new BridgeworkError(
      'out-of-range',
      `\`loads[0]\` must be 0 (no load); got ${formatValue(loads[0])}`,
      {
        param: 'loads[0]',
        value: loads[0],
        limit: 0,
      },
    );
  }
  loads.forEach((x, i) => {
    if (i > 0 && !(x > (loads[i - 1] as number))) {
      throw new BridgeworkError(
        'out-of-range',
        `\`loads[${i}]\` must be greater than loads[${i - 1}] (loads increase strictly); got ${formatValue(x)}`,
        { param: `loads[${i}]`, value: x, limit: loads[i - 1] as number },
      );
    }
  });
  if (!Array.isArray(o['runs'])) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`runs\` must be an array of runs; got ${formatValue(o['runs'])}`,
      {
        param: 'runs',
        value: o['runs'],
      },
    );
  }
  if (o['runs'].length === 0) {
    throw new BridgeworkError('too-few-points', '`runs` must hold at least one run; got 0', {
      param: 'runs',
      value: 0,
      limit: 1,
    });
  }
  const runs = (o['runs'] as unknown[]).map((run, r) => {
    const ro = checkOptions(`runs[${r}]`, run, {
      known: ['ascending', 'descending'],
      required: ['ascending'],
    });
    return {
      ascending: checkBoundedArray(`runs[${r}].ascending`, ro['ascending'], loads.length),
      descending:
        ro['descending'] === undefined
          ? undefined
          : checkBoundedArray(`runs[${r}].descending`, ro['descending'], loads.length),
    };
  });
  const withDescending = runs.filter((run) => run.descending !== undefined).length;
  if (withDescending !== 0 && withDescending !== runs.length) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`runs\` must all have descending readings or none; got ${withDescending} of ${runs.length}`,
      { param: 'runs', value: withDescending, limit: runs.length },
    );
  }

  const last = loads.length - 1;
  const capacity = loads[last] as number;
  const column = (i: number, key: 'ascending' | 'descending'): number[] =>
    runs.map((run) => (run[key] as number[])[i] as number);
  const ascending = loads.map((_, i) => mean(column(i, 'ascending')));
  const descending = withDescending === 0 ? undefined : loads.map((_, i) => mean(column(i, 'descending')));
  const ratedOutput = mean(runs.map((run) => (run.ascending[last] as number) - (run.ascending[0] as number)));
  if (ratedOutput === 0) {
    throw new BridgeworkError('out-of-range', '`runs` must show a non-zero rated output; got 0', {
      param: 'runs',
      value: 0,
    });
  }
  const fraction = (deviation: number): number => deviation / ratedOutput;
  const zero = ascending[0] as number;
  const terminalLine: StraightLine = { offset: zero, slope: ((ascending[last] as number) - zero) / capacity };
  const onTerminal = (x: number): number => terminalLine.offset + terminalLine.slope * x;
  const bestFitLine = leastSquaresLine(loads, ascending);

  const points: CertificatePoint[] = loads.map((load, i) => {
    const asc = ascending[i] as number;
    const desc = descending?.[i];
    const spread = runs.length > 1 ? column(i, 'ascending') : undefined;
    return {
      load,
      ascending: asc,
      descending: desc,
      terminalDeviationFraction: fraction(asc - onTerminal(load)),
      descendingTerminalDeviationFraction: desc === undefined ? undefined : fraction(desc - onTerminal(load)),
      bestFitDeviationFraction: fraction(asc - (bestFitLine.offset + bestFitLine.slope * load)),
      hysteresisFraction: desc === undefined ? undefined : fraction(desc - asc),
      repeatabilityFraction:
        spread === undefined ? undefined : fraction(Math.max(...spread) - Math.min(...spread)),
    };
  });
  const terminal = points.map((pt) => pt.terminalDeviationFraction);
  const descendingTerminal = points.flatMap((pt) =>
    pt.descendingTerminalDeviationFraction === undefined ? [] : [pt.descendingTerminalDeviationFraction],
  );
  const hysteresis = points.flatMap((pt) =>
    pt.hysteresisFraction === undefined ? [] : [pt.hysteresisFraction],
  );
  const repeatability = points.flatMap((pt) =>
    pt.repeatabilityFraction === undefined ? [] : [pt.repeatabilityFraction],
  );
  const result: CertificateEvaluation = {
    capacity,
    ratedOutput,
    zeroBalance: zero,
    zeroBalanceFraction: fraction(zero),
    terminalNonlinearityFraction: largestMagnitude(terminal),
    bestFitNonlinearityFraction: largestMagnitude(points.map((pt) => pt.bestFitDeviationFraction)),
    hysteresisFraction: hysteresis.length === 0 ? undefined : largestMagnitude(hysteresis),
    combinedErrorFraction: largestMagnitude([...terminal, ...descendingTerminal]),
    repeatabilityFraction: repeatability.length === 0 ? undefined : largestMagnitude(repeatability),
    terminalLine,
    bestFitLine,
    points,
  };
  // Readings are bounded by 1e100, so sums stay finite; a rated output tiny against the readings
  // can still make a fraction overflow: refuse it rather than return ±Infinity.
  const figures = [
    result.zeroBalanceFraction,
    result.terminalNonlinearityFraction,
    result.bestFitNonlinearityFraction,
    result.combinedErrorFraction,
    result.hysteresisFraction ?? 0,
    result.repeatabilityFraction ?? 0,
    bestFitLine.offset,
    bestFitLine.slope,
    terminalLine.slope,
  ];
  if (!figures.every(Number.isFinite)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`runs\` must show a rated output that is not vanishingly small against the readings (the figures as fractions of it overflow); got a rated output of ${formatValue(ratedOutput)}`,
      { param: 'runs', value: ratedOutput },
    );
  }
  return result;
}
