/**
 * The error terms of a load cell's calibration readings, as OIML R 60 names them: nonlinearity,
 * hysteresis error and repeatability error.
 */

/** One calibration point. */
export interface CalibrationPoint {
  /** The applied load, in the channel's unit. */
  readonly load: number;
  /** The reading, as a bridge ratio (V/V). */
  readonly reading: number;
  /** Loading (`'up'`) or unloading (`'down'`); a point without a direction counts as loading. */
  readonly direction: 'up' | 'down';
  /** The loading cycle (1, 2, …). */
  readonly cycle: number;
}

/** One error term: its largest magnitude and where. */
export interface ErrorTerm {
  /** The signed value with the largest magnitude, in the reading's unit (V/V). */
  readonly value: number;
  /** The load where it occurs. */
  readonly atLoad: number;
}

/** The error terms of a set of points (see {@link loadCellErrors}). */
export interface LoadCellErrors {
  /** Mean loading reading at the largest load minus that at the smallest, V/V. */
  readonly spanReading: number;
  /** The smallest and largest load. */
  readonly loads: readonly [number, number];
  /** Largest deviation of the mean loading readings from the terminal straight line (through the mean loading readings at the smallest and largest load). */
  readonly nonlinearity: ErrorTerm;
  /** Largest difference, unloading minus loading mean reading at one load (undefined without unloading points at a load that also has loading points). */
  readonly hysteresis: ErrorTerm | undefined;
  /** Largest spread (largest minus smallest) of the readings of one load in one direction over the cycles (undefined when no load is repeated). */
  readonly repeatability: ErrorTerm | undefined;
}

const mean = (xs: readonly number[]): number => xs.reduce((s, x) => s + x, 0) / xs.length;

function largest(terms: readonly ErrorTerm[]): ErrorTerm | undefined {
  let best: ErrorTerm | undefined;
  for (const t of terms) if (best === undefined || Math.abs(t.value) > Math.abs(best.value)) best = t;
  return best;
}

/**
 * The error terms of calibration readings.
 *
 * @remarks
 * Following the terms of OIML R 60 (clause 3, terminology; the wording here is ours, from memory):
 * - nonlinearity: the deviation of the increasing-load calibration curve from a straight line; the
 *   line here is the terminal line through the mean loading readings at the smallest and the
 *   largest load (common practice for load-cell data sheets);
 * - hysteresis error: the difference between readings at the same load, one reached by increasing
 *   the load, the other by decreasing it (here: unloading mean minus loading mean);
 * - repeatability error: the difference between readings for repeated applications of the same
 *   load under the same conditions (here: the spread over the cycles, per load and direction).
 * Means are taken over the cycles. Plain arithmetic on the readings; no fit is involved.
 *
 * @param points - The points (at least two distinct loads with loading readings).
 * @returns The error terms, in the reading's unit.
 */
export function loadCellErrors(points: readonly CalibrationPoint[]): LoadCellErrors {
  const groups = new Map<string, { load: number; direction: 'up' | 'down'; readings: number[] }>();
  for (const p of points) {
    const key = `${p.direction}:${p.load}`;
    const g = groups.get(key) ?? { load: p.load, direction: p.direction, readings: [] };
    g.readings.push(p.reading);
    groups.set(key, g);
  }
  const up = [...groups.values()].filter((g) => g.direction === 'up').sort((a, b) => a.load - b.load);
  const first = up[0] as (typeof up)[number];
  const last = up[up.length - 1] as (typeof up)[number];
  const r0 = mean(first.readings);
  const r1 = mean(last.readings);
  const slope = (r1 - r0) / (last.load - first.load);
  const nonlinearity = largest(
    up.map((g) => ({ value: mean(g.readings) - (r0 + slope * (g.load - first.load)), atLoad: g.load })),
  ) as ErrorTerm;
  const hysteresis = largest(
    [...groups.values()].flatMap((g) => {
      if (g.direction !== 'down') return [];
      const u = groups.get(`up:${g.load}`);
      return u === undefined ? [] : [{ value: mean(g.readings) - mean(u.readings), atLoad: g.load }];
    }),
  );
  const repeatability = largest(
    [...groups.values()].flatMap((g) =>
      g.readings.length < 2
        ? []
        : [{ value: Math.max(...g.readings) - Math.min(...g.readings), atLoad: g.load }],
    ),
  );
  return { spanReading: r1 - r0, loads: [first.load, last.load], nonlinearity, hysteresis, repeatability };
}
