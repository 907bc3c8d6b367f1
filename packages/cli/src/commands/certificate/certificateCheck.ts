/**
 * The check of a load cell's test certificate against an OIML R 60 accuracy class (the payload of
 * `bridgework check-certificate`), from readings already in the channel's unit: the load cell
 * error at every reading against the mpe, repeatability, creep, the minimum dead load output
 * return, the zero's change with temperature, and the certificate's characteristics.
 */
import {
  createLoadCellClass,
  evaluateCertificate,
  type CertificateEvaluation,
  type LoadCellAccuracyClass,
  type LoadCellClass,
} from '@bridgework/calibration';
import { BridgeworkError, formatValue, isBridgeworkError } from '@bridgework/core';

/** One row of a certificate file, loads in the channel's unit. */
export interface CertificateRow {
  /** What the row belongs to: a loading test, the creep record, the return to the minimum load. */
  readonly test: 'load' | 'creep' | 'return';
  /** Temperature, °C. */
  readonly temperatureCelsius: number;
  /** The applied load, channel unit. */
  readonly load: number;
  /** The reading: V/V, or an indication in the channel's unit. */
  readonly reading: number;
  /** Loading or unloading. */
  readonly direction: 'up' | 'down';
  /** Cycle 1, 2, …. */
  readonly cycle: number;
  /** Minutes since the creep load was applied (creep rows). */
  readonly minutes: number | undefined;
  /** The line in the file (for messages). */
  readonly line: number;
}

/** Options of {@link checkCertificate}. */
export interface CertificateCheckOptions {
  /** The certificate file (for messages). */
  readonly file: string;
  /** The rows. */
  readonly rows: readonly CertificateRow[];
  /** What the readings are: a bridge ratio (V/V), or an indication in load. */
  readonly reading: 'ratio' | 'load';
  /** OIML R 60 class. */
  readonly accuracyClass: LoadCellAccuracyClass;
  /** nLC. */
  readonly intervals: number;
  /** pLC. */
  readonly apportionment: number;
  /** Emax, channel unit. */
  readonly capacity: number;
  /** Dmin, channel unit (default: the smallest load). */
  readonly minLoad: number | undefined;
  /** Dmax, channel unit (default: the largest load). */
  readonly maxLoad: number | undefined;
  /** Y = Emax/vmin. */
  readonly capacityPerVmin: number | undefined;
  /** The reference temperature, °C. */
  readonly referenceCelsius: number;
}

/** One reading's load cell error. */
export interface ErrorReading {
  /** The run (index into `runs`). */
  readonly run: number;
  /** The applied load. */
  readonly load: number;
  /** Loading or unloading. */
  readonly direction: 'up' | 'down';
  /** The cycle. */
  readonly cycle: number;
  /** Indication minus applied load, both from the run's minimum-load reading, channel unit. */
  readonly error: number;
  /** The class's mpe at the load. */
  readonly mpe: number;
  /** |error|/mpe. */
  readonly fractionOfMpe: number;
  /** |error| ≤ mpe. */
  readonly ok: boolean;
}

/** One check with its figure, limit, margin and verdict. */
export interface CertificateVerdict {
  /** What is checked. */
  readonly name: string;
  /** The figure (magnitude), channel unit (or as stated in `detail`). */
  readonly value: number;
  /** Its limit. */
  readonly limit: number;
  /** limit − value (≥ 0 passes). */
  readonly margin: number;
  /** Whether it passes. */
  readonly ok: boolean;
  /** Where, at what load, the clause. */
  readonly detail: string;
}

/** A run of loading readings at one temperature (consecutive rows of the file). */
export interface CertificateRun {
  /** Its temperature, °C. */
  readonly temperatureCelsius: number;
  /** Label: the temperature, with a count when it repeats. */
  readonly label: string;
  /** Mean loading reading at the run's smallest load (the zero the run's errors are taken from). */
  readonly zeroReading: number;
  /** The run's terminal slope, reading per load (loading means at its smallest and largest load). */
  readonly slope: number;
  /** Largest |error|/mpe of its readings. */
  readonly largestFractionOfMpe: number;
}

/** The sensor characteristics of the reference run (readings in V/V only). */
export interface CertificateCharacteristics {
  /** Reading per load at the reference temperature, V/V per channel unit. */
  readonly sensitivity: number;
  /** Output at zero load (extrapolated along the line), V/V. */
  readonly zeroBalanceVoltsPerVolt: number;
  /** Temperature of the reference run, °C. */
  readonly certificateCelsius: number;
  /**
   * Change of the zero per kelvin as a fraction of the output over Emax: the largest magnitude
   * over the other temperatures, against the reference run (undefined with one temperature).
   */
  readonly zeroTemperatureCoefficientPerKelvin: number | undefined;
  /** Relative change of the slope per kelvin, the largest magnitude likewise. */
  readonly spanTemperatureCoefficientPerKelvin: number | undefined;
  /** The calibration package's certificate figures of the reference run, when its layout allows. */
  readonly certificate: CertificateEvaluation | undefined;
}

/** The check of a certificate (the JSON payload's core). */
export interface CertificateCheck {
  /** Class, nLC, pLC, Emax, Dmin, Dmax, v, vmin. */
  readonly accuracyClass: LoadCellAccuracyClass;
  readonly intervals: number;
  readonly apportionment: number;
  readonly capacity: number;
  readonly minLoad: number;
  readonly maxLoad: number;
  readonly verificationInterval: number;
  readonly vmin: number | undefined;
  /** The runs. */
  readonly runs: readonly CertificateRun[];
  /** Every loading reading's error. */
  readonly errors: readonly ErrorReading[];
  /** The checks. */
  readonly checks: readonly CertificateVerdict[];
  /** The characteristics (undefined for readings in load). */
  readonly characteristics: CertificateCharacteristics | undefined;
  /** The ±mpe envelope over the measuring range (401 loads), for plots. */
  readonly envelope: readonly { readonly load: number; readonly mpe: number }[];
  /** Every check passed. */
  readonly ok: boolean;
}

/** The temperature step over which R 60 limits the zero's change: 2 K for class A, 5 K otherwise (from memory). */
const zeroTemperatureStep = (c: LoadCellAccuracyClass): number => (c === 'A' ? 2 : 5);

const mean = (xs: readonly number[]): number => xs.reduce((s, x) => s + x, 0) / xs.length;

function fileError(file: string, line: number | undefined, message: string): BridgeworkError {
  return new BridgeworkError('parse-error', `${file}${line === undefined ? '' : `:${line}`}: ${message}`, {
    param: file,
  });
}

/** Splits the loading rows into runs of consecutive rows at one temperature. */
function splitRuns(rows: readonly CertificateRow[]): CertificateRow[][] {
  const runs: CertificateRow[][] = [];
  let last: number | undefined;
  for (const r of rows) {
    if (r.test !== 'load') continue;
    if (last !== r.temperatureCelsius) runs.push([]);
    last = r.temperatureCelsius;
    (runs[runs.length - 1] as CertificateRow[]).push(r);
  }
  return runs;
}

/** Mean loading readings at the run's smallest and largest load, and those loads. */
function terminal(file: string, run: readonly CertificateRow[]) {
  const up = run.filter((r) => r.direction === 'up');
  const loads = up.map((r) => r.load);
  const lo = Math.min(...loads);
  const hi = Math.max(...loads);
  if (up.length === 0 || !(hi > lo)) {
    throw fileError(
      file,
      run[0]?.line,
      `the loading run at ${formatValue(run[0]?.temperatureCelsius)} °C must hold loading (up) readings at two or more loads`,
    );
  }
  const r0 = mean(up.filter((r) => r.load === lo).map((r) => r.reading));
  const r1 = mean(up.filter((r) => r.load === hi).map((r) => r.reading));
  return { lo, hi, r0, r1, slope: (r1 - r0) / (hi - lo) };
}

/** The calibration package's certificate figures of a run, when its loads start at 0 and every cycle has every load. */
function certificateFigures(run: readonly CertificateRow[]): CertificateEvaluation | undefined {
  const loads = [...new Set(run.filter((r) => r.direction === 'up').map((r) => r.load))].sort(
    (a, b) => a - b,
  );
  const cycles = [...new Set(run.map((r) => r.cycle))].sort((a, b) => a - b);
  const top = loads[loads.length - 1];
  const find = (cycle: number, direction: 'up' | 'down', q: number) =>
    run.find((r) => r.cycle === cycle && r.direction === direction && r.load === q)?.reading;
  // The largest load is where loading turns into unloading: without its own unloading reading, the
  // loading one is both.
  const pick = (cycle: number, direction: 'up' | 'down') =>
    loads.map((q) => find(cycle, direction, q) ?? (q === top ? find(cycle, 'up', q) : undefined));
  const runs = cycles.map((c) => ({ ascending: pick(c, 'up'), descending: pick(c, 'down') }));
  const complete = (xs: readonly (number | undefined)[]): xs is number[] => xs.every((x) => x !== undefined);
  const withDown = runs.every((r) => complete(r.descending));
  if (loads[0] !== 0 || loads.length < 3 || !runs.every((r) => complete(r.ascending))) return undefined;
  try {
    return evaluateCertificate({
      loads,
      runs: runs.map((r) => ({
        ascending: r.ascending as number[],
        ...(withDown ? { descending: r.descending as number[] } : {}),
      })),
    });
  } catch (e) {
    if (isBridgeworkError(e)) return undefined;
    throw e;
  }
}

function verdict(name: string, value: number, limit: number, detail: string): CertificateVerdict {
  // A figure equal to its limit passes (within the rounding of pLC·factor·v, as the class does).
  const ok = Number.isFinite(value) && value <= limit * (1 + 8 * Number.EPSILON);
  return { name, value, limit, margin: limit - value, ok, detail };
}

/**
 * Checks a certificate against an OIML R 60 class.
 *
 * @remarks
 * The class's limits are those of the calibration package's `createLoadCellClass` (OIML R 60 mpe
 * table; see its documentation and docs/test-day.md). Readings in V/V become indications in load
 * through the terminal line of the reference run's loading readings (at its smallest and largest
 * load); the errors of every run are taken from that run's own minimum-load reading (the zero at
 * each temperature; its change is the separate zero-against-temperature check).
 *
 * @param options - Rows, class and measuring range.
 * @returns The check.
 * @throws {@link @bridgework/core!BridgeworkError} `parse-error` naming the file and line for a
 *   certificate that cannot be checked (no run at the reference temperature, a load outside the
 *   measuring range, a creep record without readings at 0, 20 and 30 minutes).
 */
export function checkCertificate(options: CertificateCheckOptions): CertificateCheck {
  const { file, rows } = options;
  const runs = splitRuns(rows);
  if (runs.length === 0) throw fileError(file, undefined, "no loading readings (rows with test 'load')");
  const reference = runs.find(
    (run) => (run[0] as CertificateRow).temperatureCelsius === options.referenceCelsius,
  );
  if (reference === undefined) {
    throw new BridgeworkError(
      'invalid-option',
      `--reference-celsius ${formatValue(options.referenceCelsius)}: ${file} has no loading run at that temperature; its runs are at ${[...new Set(runs.map((r) => (r[0] as CertificateRow).temperatureCelsius))].join(', ')} °C`,
      { param: 'reference-celsius', value: options.referenceCelsius },
    );
  }
  const ref = terminal(file, reference);
  const perLoad = options.reading === 'ratio' ? ref.slope : 1;
  if (!(Math.abs(perLoad) > 0) || !Number.isFinite(perLoad)) {
    throw fileError(
      file,
      reference[0]?.line,
      'the reference run reads the same at its smallest and largest load',
    );
  }
  const allLoads = rows.map((r) => r.load);
  const minLoad = options.minLoad ?? Math.min(...allLoads.filter((_, i) => rows[i]?.test === 'load'));
  const maxLoad = options.maxLoad ?? Math.max(...allLoads.filter((_, i) => rows[i]?.test === 'load'));
  let lc: LoadCellClass;
  try {
    lc = createLoadCellClass({
      accuracyClass: options.accuracyClass,
      nLC: options.intervals,
      maxCapacity: options.capacity,
      pLC: options.apportionment,
      minLoad,
      maxLoad,
      ...(options.capacityPerVmin === undefined ? {} : { y: options.capacityPerVmin }),
    });
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    const param =
      { minLoad: 'min-load', maxLoad: 'max-load', maxCapacity: 'capacity' }[e.param ?? ''] ?? 'capacity';
    throw new BridgeworkError(
      'invalid-option',
      `--${param}: the measuring range must satisfy 0 ≤ Dmin < Dmax ≤ Emax; got Dmin ${formatValue(minLoad)}, Dmax ${formatValue(maxLoad)}, Emax ${formatValue(options.capacity)} (${e.message})`,
      { param, cause: e },
    );
  }
  for (const r of rows) {
    if (r.test === 'load' && (r.load < minLoad || r.load > maxLoad)) {
      throw fileError(
        file,
        r.line,
        `load ${formatValue(r.load)} lies outside the measuring range [${formatValue(minLoad)}, ${formatValue(maxLoad)}]: give --min-load and --max-load to cover it`,
      );
    }
  }

  const checks: CertificateVerdict[] = [];
  const errors: ErrorReading[] = [];
  const runSummaries: CertificateRun[] = [];
  const seen = new Map<number, number>();
  const zeros: { t: number; zero: number; mdlo: number; slope: number }[] = [];
  runs.forEach((run, index) => {
    const t = (run[0] as CertificateRow).temperatureCelsius;
    const count = (seen.get(t) ?? 0) + 1;
    seen.set(t, count);
    const label = `${t} °C${count > 1 ? ` (${count})` : ''}`;
    const term = terminal(file, run);
    const rowsOfRun = run.map((r) => {
      const error = (r.reading - term.r0) / perLoad - (r.load - term.lo);
      const mpe = lc.mpe(r.load);
      return {
        run: index,
        load: r.load,
        direction: r.direction,
        cycle: r.cycle,
        error,
        mpe,
        fractionOfMpe: Math.abs(error) / mpe,
        ok: Math.abs(error) <= mpe * (1 + 8 * Number.EPSILON),
      };
    });
    errors.push(...rowsOfRun);
    const worst = rowsOfRun.reduce((a, b) => (b.fractionOfMpe > a.fractionOfMpe ? b : a));
    runSummaries.push({
      temperatureCelsius: t,
      label,
      zeroReading: term.r0,
      slope: term.slope,
      largestFractionOfMpe: worst.fractionOfMpe,
    });
    zeros.push({ t, zero: term.r0 - term.slope * term.lo, mdlo: term.r0, slope: term.slope });
    checks.push(
      verdict(
        `load cell error, ${label}`,
        Math.abs(worst.error),
        worst.mpe,
        `largest share of the mpe at ${formatValue(worst.load)} (${worst.direction === 'up' ? 'loading' : 'unloading'}, cycle ${worst.cycle}); OIML R 60 mpe = pLC × (0.5, 1.0 or 1.5) v by band`,
      ),
    );
    // Repeatability: the spread over the cycles of one load and direction, against the mpe there.
    let spread: { value: number; load: number; mpe: number } | undefined;
    const groups = new Map<string, number[]>();
    for (const e of rowsOfRun) {
      const key = `${e.direction}:${e.load}`;
      groups.set(key, [...(groups.get(key) ?? []), e.error]);
    }
    for (const [key, xs] of groups) {
      if (xs.length < 2) continue;
      const load = Number(key.slice(key.indexOf(':') + 1));
      const value = Math.max(...xs) - Math.min(...xs);
      const mpe = lc.mpe(load);
      if (spread === undefined || value / mpe > spread.value / spread.mpe) spread = { value, load, mpe };
    }
    if (spread !== undefined) {
      checks.push(
        verdict(
          `repeatability, ${label}`,
          spread.value,
          spread.mpe,
          `largest spread over the cycles at ${formatValue(spread.load)}, against |mpe| there (OIML R 60 repeatability error)`,
        ),
      );
    }
  });

  // Creep: a 30-minute record at one load.
  const creep = rows.filter((r) => r.test === 'creep');
  if (creep.length > 0) {
    const load = (creep[0] as CertificateRow).load;
    const other = creep.find((r) => r.load !== load || r.minutes === undefined);
    if (other !== undefined) {
      throw fileError(
        file,
        other.line,
        other.minutes === undefined
          ? "a creep row must give the minutes since the load was applied (column 'minutes')"
          : 'every creep row must be at the same load',
      );
    }
    let result;
    try {
      result = lc.checkCreep({
        load,
        minutes: creep.map((r) => r.minutes as number),
        readings: creep.map((r) => r.reading / perLoad),
      });
    } catch (e) {
      if (!isBridgeworkError(e)) throw e;
      throw fileError(
        file,
        creep[0]?.line,
        `the creep rows must start at 0 minutes, increase, include 20 and 30 and end by 30: ${e.message}`,
      );
    }
    const c = result.value;
    checks.push(
      verdict(
        'creep over 30 min',
        c.thirtyMinuteChange,
        c.limits.thirtyMinutes,
        `at ${formatValue(load)}: largest change from the initial reading, limit 0.7 × mpe (OIML R 60 creep)`,
      ),
      verdict(
        'creep 20 to 30 min',
        c.twentyToThirtyMinuteChange,
        c.limits.twentyToThirtyMinutes,
        `at ${formatValue(load)}: change between 20 and 30 minutes, limit 0.15 × mpe (OIML R 60 creep)`,
      ),
    );
    if (load < 0.9 * maxLoad) {
      checks.push(
        verdict(
          'creep load',
          0.9 * maxLoad - load,
          0,
          `the creep load ${formatValue(load)} is below 90 % of Dmax = ${formatValue(maxLoad)} (the test load is 90–100 % of Dmax)`,
        ),
      );
    }
  }

  // Minimum dead load output return: the reading at Dmin before the creep load and after it.
  const back = rows.filter((r) => r.test === 'return');
  if (back.length > 0) {
    if (back.length < 2) {
      throw fileError(
        file,
        back[0]?.line,
        'the return to the minimum load needs two rows: the reading before the creep load, then the reading after it was removed',
      );
    }
    const first = back[0] as CertificateRow;
    const last = back[back.length - 1] as CertificateRow;
    const value = Math.abs((last.reading - first.reading) / perLoad);
    checks.push(
      verdict(
        'minimum dead load output return',
        value,
        0.5 * lc.verificationInterval,
        'difference of the readings at the minimum load before and after the creep load, limit 0.5 v (OIML R 60 DR)',
      ),
    );
  }

  // The zero (minimum dead load output) against temperature, with vmin.
  if (lc.vmin !== undefined) {
    const step = zeroTemperatureStep(options.accuracyClass);
    let worst: { value: number; between: string } | undefined;
    for (let i = 1; i < zeros.length; i++) {
      const a = zeros[i - 1] as (typeof zeros)[number];
      const b = zeros[i] as (typeof zeros)[number];
      if (a.t === b.t) continue;
      const value = (Math.abs(b.mdlo - a.mdlo) / Math.abs(perLoad)) * (step / Math.abs(b.t - a.t));
      if (worst === undefined || value > worst.value) worst = { value, between: `${a.t} °C and ${b.t} °C` };
    }
    if (worst !== undefined) {
      checks.push(
        verdict(
          `zero against temperature, per ${step} K`,
          worst.value,
          lc.pLC * lc.vmin,
          `largest change of the minimum dead load output, between ${worst.between}, limit pLC × vmin per ${step} K (OIML R 60)`,
        ),
      );
    }
  }
  if (!lc.specification.ok) {
    checks.push({
      name: 'class declaration',
      value: options.intervals,
      limit: lc.specification.value.allowedIntervals[1],
      margin: Number.NaN,
      ok: false,
      detail: lc.specification.issues.join(' '),
    });
  }

  let characteristics: CertificateCharacteristics | undefined;
  if (options.reading === 'ratio') {
    const refZero = ref.r0 - ref.slope * ref.lo;
    let zeroTc: number | undefined;
    let spanTc: number | undefined;
    for (const z of zeros) {
      if (z.t === options.referenceCelsius) continue;
      const dz = (z.zero - refZero) / (z.t - options.referenceCelsius) / (ref.slope * options.capacity);
      const ds = (z.slope / ref.slope - 1) / (z.t - options.referenceCelsius);
      if (zeroTc === undefined || Math.abs(dz) > Math.abs(zeroTc)) zeroTc = dz;
      if (spanTc === undefined || Math.abs(ds) > Math.abs(spanTc)) spanTc = ds;
    }
    characteristics = {
      sensitivity: ref.slope,
      zeroBalanceVoltsPerVolt: refZero,
      certificateCelsius: options.referenceCelsius,
      zeroTemperatureCoefficientPerKelvin: zeroTc,
      spanTemperatureCoefficientPerKelvin: spanTc,
      certificate: certificateFigures(reference),
    };
  }
  return {
    accuracyClass: options.accuracyClass,
    intervals: options.intervals,
    apportionment: options.apportionment,
    capacity: options.capacity,
    minLoad,
    maxLoad,
    verificationInterval: lc.verificationInterval,
    vmin: lc.vmin,
    runs: runSummaries,
    errors,
    checks,
    characteristics,
    envelope: Array.from({ length: 401 }, (_, i) => {
      const load = i === 400 ? maxLoad : minLoad + ((maxLoad - minLoad) * i) / 400;
      return { load, mpe: lc.mpe(load) };
    }),
    ok: checks.every((c) => c.ok),
  };
}
