import { dirname, relative, sep } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import { fitPolynomial, type PolynomialFit } from '@bridgework/calibration';
import { createChannel, parseQuantity, type Channel, type ChannelSpec } from '@bridgework/channel';
import { BridgeworkError, formatValue, isBridgeworkError } from '@bridgework/core';
import { SAFETY_CAUTION } from '../../caution.js';
import { openChannelFileEditor, setChannelSection } from '../../channelFile/editChannelFile.js';
import { inChannel, loadChannels } from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { readVersion } from '../../internal/readVersion.js';
import { wrapText } from '../../internal/wrapText.js';
import { displayUnit } from '../../report/displayUnit.js';
import { formatNumber, formatPercent, formatStated } from '../../report/formatNumber.js';
import { reportJson } from '../../report/reportJson.js';
import { runDate } from '../../report/runDate.js';
import { formatTable } from '../../terminal/formatTable.js';
import type { TextStyle } from '../../terminal/textStyle.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import { codeRatioMap } from '../shunt/codeRatioMap.js';
import { readSmallTable, type SmallTable } from '../shunt/readSmallTable.js';
import { theChannel } from '../shunt/runShuntApply.js';
import type { FitArgs } from './fitOptions.js';
import { loadCellErrors, type CalibrationPoint, type ErrorTerm } from './loadCellErrors.js';

/** One point of the fit report. */
export interface FittedPoint extends CalibrationPoint {
  /** The reading as written in the points file. */
  readonly given: number;
  /** Reading minus fitted reading, V/V. */
  readonly residual: number;
  /**
   * The load the calibrated channel indicates for this reading minus the load applied (channel
   * unit); for a fit without an inverse, the residual over the fit's slope, or undefined where the
   * slope vanishes.
   */
  readonly error: number | undefined;
  /** Standard uncertainty of the fitted curve at this load, in load (channel unit). */
  readonly fitUncertainty: number;
}

/** An error term in the reading's unit, in load and as a fraction of the span. */
export interface ErrorFigure extends ErrorTerm {
  /** In load (channel unit): the reading's value over the mean slope of the span. */
  readonly load: number;
  /** As a fraction of the span's reading. */
  readonly fractionOfSpan: number;
}

/** The fit of one channel's calibration (the JSON payload). */
export interface CalibrationFit {
  /** The channel. */
  readonly channel: string;
  /** The channel's unit (loads, errors). */
  readonly unit: string;
  /** The polynomial degree. */
  readonly degree: number;
  /** What the reading column held. */
  readonly reading: 'codes' | 'mV/V' | 'V/V';
  /** The points file and its SHA-256. */
  readonly pointsFile: string;
  /** SHA-256 of its bytes. */
  readonly pointsSha256: string;
  /** Coefficients c0…cd: bridge ratio (V/V) against load (channel unit). */
  readonly coefficients: readonly number[];
  /** Their covariance. */
  readonly covariance: readonly (readonly number[])[];
  /** Their standard uncertainties. */
  readonly standardUncertainties: readonly number[];
  /** Residual standard deviation, V/V (undefined with no degree of freedom). */
  readonly residualStandardDeviation: number | undefined;
  /** Degrees of freedom. */
  readonly degreesOfFreedom: number;
  /** The reference loads' span. */
  readonly range: { readonly min: number; readonly max: number };
  /** Loads over which the fit has an inverse (undefined: it turns inside the span). */
  readonly inverseRange: { readonly min: number; readonly max: number } | undefined;
  /** The points. */
  readonly points: readonly FittedPoint[];
  /** Largest |error| of the calibrated channel at the points, channel unit. */
  readonly largestError: number;
  /** Largest standard uncertainty of the fitted curve over the span, in load. */
  readonly largestFitUncertainty: number;
  /** OIML R 60 error terms of the readings. */
  readonly nonlinearity: ErrorFigure;
  /** Hysteresis error (undefined without unloading points). */
  readonly hysteresis: ErrorFigure | undefined;
  /** Repeatability error (undefined without repeated loads). */
  readonly repeatability: ErrorFigure | undefined;
}

const finiteOrUndefined = (x: number): number | undefined => (Number.isFinite(x) ? x : undefined);

/** The channel without its calibration (what converts codes to bridge ratios). */
function uncalibrated(channel: Channel): Channel {
  if (channel.spec.calibration === undefined) return channel;
  const { calibration: _old, ...rest } = channel.spec;
  return createChannel(rest as ChannelSpec);
}

/** Reads the points of a table in the channel's unit and as bridge ratios. */
export function readPoints(
  table: SmallTable,
  channel: Channel,
  reading: 'codes' | 'mV/V' | 'V/V',
  loadUnit: string,
): { points: CalibrationPoint[]; given: number[] } {
  const map = reading === 'codes' ? codeRatioMap(uncalibrated(channel)) : undefined;
  const load = table.column('load');
  const value = table.column('reading');
  const direction = table.column('direction');
  const cycle = table.column('cycle');
  const points: CalibrationPoint[] = [];
  const given: number[] = [];
  for (const row of table.rows) {
    const x = table.number(row, load);
    let q: number;
    try {
      q = parseQuantity(`${x} ${loadUnit}`, channel.unit);
    } catch (e) {
      if (!isBridgeworkError(e)) throw e;
      throw new BridgeworkError('invalid-option', `--load-unit '${loadUnit}': ${e.message}`, {
        param: 'load-unit',
        cause: e,
      });
    }
    const r = table.number(row, value);
    const d = table.text(row, direction).toLowerCase();
    if (d !== '' && d !== 'up' && d !== 'down') {
      throw new BridgeworkError(
        'parse-error',
        `${table.file}:${row.line}: column 'direction' must be up or down; got '${d}'`,
        {
          param: table.file,
        },
      );
    }
    const c = cycle < 0 || table.text(row, cycle) === '' ? 1 : table.number(row, cycle);
    if (!Number.isInteger(c) || c < 1) {
      throw new BridgeworkError(
        'parse-error',
        `${table.file}:${row.line}: column 'cycle' must be a whole number from 1; got ${formatValue(c)}`,
        {
          param: table.file,
        },
      );
    }
    given.push(r);
    points.push({
      load: q,
      reading: map !== undefined ? map.ratioOf(r) : reading === 'mV/V' ? r / 1000 : r,
      direction: d === 'down' ? 'down' : 'up',
      cycle: c,
    });
  }
  return { points, given };
}

/**
 * The calibration fit of one channel from its points: the least-squares polynomial (calibration
 * `fitPolynomial`), the errors of the calibrated channel at the points, the fit's uncertainty and
 * the OIML R 60 error terms of the readings.
 *
 * @param channel - The channel.
 * @param table - The points file.
 * @param options - Degree, what the readings are, the load unit.
 */
export function fitCalibration(
  channel: Channel,
  table: SmallTable,
  options: { degree: number; reading: 'codes' | 'mV/V' | 'V/V'; loadUnit: string },
): { fit: CalibrationFit; polynomial: PolynomialFit } {
  const { points, given } = readPoints(table, channel, options.reading, options.loadUnit);
  const loadsUp = new Set(points.filter((p) => p.direction === 'up').map((p) => p.load));
  if (loadsUp.size < 2) {
    throw new BridgeworkError(
      'too-few-points',
      `${table.file} must hold loading (up) readings at two or more loads; got ${loadsUp.size}`,
      {
        param: table.file,
        value: loadsUp.size,
        limit: 2,
      },
    );
  }
  const polynomial = fitPolynomial({
    loads: points.map((p) => p.load),
    readings: points.map((p) => p.reading),
    degree: options.degree,
  });
  const slope = (q: number) => {
    let s = 0;
    for (let k = polynomial.coefficients.length - 1; k >= 1; k--)
      s = s * q + k * (polynomial.coefficients[k] as number);
    return s;
  };
  const fitted: FittedPoint[] = points.map((p, i) => {
    let error = Number.NaN;
    if (polynomial.inverseRange !== undefined) {
      try {
        error = polynomial.loadAt(p.reading) - p.load;
      } catch {
        error = Number.NaN;
      }
    }
    return {
      ...p,
      given: given[i] as number,
      residual: polynomial.residuals[i] as number,
      error: Number.isNaN(error)
        ? finiteOrUndefined((polynomial.residuals[i] as number) / slope(p.load))
        : error,
      fitUncertainty: polynomial.readingUncertaintyAt(p.load) / Math.abs(slope(p.load)),
    };
  });
  const { min, max } = polynomial.calibratedRange;
  let largestFitUncertainty = 0;
  for (let i = 0; i <= 200; i++) {
    const q = min + ((max - min) * i) / 200;
    largestFitUncertainty = Math.max(
      largestFitUncertainty,
      polynomial.readingUncertaintyAt(q) / Math.abs(slope(q)),
    );
  }
  const errors = loadCellErrors(points);
  const perLoad = errors.spanReading / (errors.loads[1] - errors.loads[0]);
  const figure = (t: ErrorTerm | undefined): ErrorFigure | undefined =>
    t === undefined
      ? undefined
      : { ...t, load: t.value / perLoad, fractionOfSpan: t.value / errors.spanReading };
  return {
    polynomial,
    fit: {
      channel: channel.name,
      unit: channel.unit,
      degree: options.degree,
      reading: options.reading,
      pointsFile: table.file,
      pointsSha256: table.sha256,
      coefficients: polynomial.coefficients,
      covariance: polynomial.covariance,
      standardUncertainties: polynomial.standardUncertainties,
      residualStandardDeviation: polynomial.residualStandardDeviation,
      degreesOfFreedom: polynomial.degreesOfFreedom,
      range: { min, max },
      inverseRange: polynomial.inverseRange,
      points: fitted,
      largestError: Math.max(...fitted.map((p) => (p.error === undefined ? 0 : Math.abs(p.error)))),
      largestFitUncertainty,
      nonlinearity: figure(errors.nonlinearity) as ErrorFigure,
      hysteresis: figure(errors.hysteresis),
      repeatability: figure(errors.repeatability),
    },
  };
}

/**
 * The `calibration` section written for a fit.
 *
 * @param fit - The fit.
 * @param date - The date recorded.
 * @param pointsFile - The points file as recorded (relative to the channel file's folder).
 */
export function calibrationSection(
  fit: CalibrationFit,
  date: string,
  pointsFile: string,
): Record<string, unknown> {
  return {
    unit: fit.unit,
    coefficients: fit.coefficients,
    covariance: fit.covariance.flat(),
    range: [fit.range.min, fit.range.max],
    ...(fit.residualStandardDeviation === undefined
      ? {}
      : { residualStandardDeviation: fit.residualStandardDeviation }),
    points: fit.points.length,
    pointsFile,
    pointsSha256: fit.pointsSha256,
    date,
  };
}

function fitText(fit: CalibrationFit, channel: Channel, style: TextStyle): string {
  const d = displayUnit(channel);
  const q = (x: number, digits = 4) => `${formatNumber(x * d.factor, digits)}`;
  const rows = fit.points.map((p) => [
    `${formatStated(p.load * d.factor)}`,
    p.direction,
    String(p.cycle),
    formatStated(p.given),
    formatNumber(p.residual * 1e3, 3),
    p.error === undefined ? '—' : q(p.error, 3),
    q(p.fitUncertainty, 2),
  ]);
  const table = formatTable(
    [
      { header: `load (${d.unit})`, align: 'right' },
      { header: 'run' },
      { header: 'cycle', align: 'right' },
      { header: `reading (${fit.reading})`, align: 'right' },
      { header: 'residual (mV/V)', align: 'right' },
      { header: `error (${d.unit})`, align: 'right' },
      { header: `u(fit) (${d.unit})`, align: 'right' },
    ],
    rows,
  );
  const term = (name: string, t: ErrorFigure | undefined, missing: string) =>
    t === undefined
      ? `${name.padEnd(16)}${missing}`
      : `${name.padEnd(16)}${q(t.load, 3)} ${d.unit} (${formatPercent(t.fractionOfSpan)} of span) at ${formatStated(t.atLoad * d.factor)} ${d.unit}`;
  const coefficients = fit.coefficients
    .map(
      (c, k) => `c${k} = ${formatNumber(c, 8)} ± ${formatNumber(fit.standardUncertainties[k] as number, 2)}`,
    )
    .join(', ');
  return [
    style.bold(`Calibration against reference loads — channel ${fit.channel}`),
    `points: ${fit.pointsFile} (${fit.points.length} points, sha256 ${fit.pointsSha256.slice(0, 16)}…)`,
    `fit: degree ${fit.degree}, bridge ratio (V/V) against load (${fit.unit}): ${coefficients}`,
    `residual standard deviation ${fit.residualStandardDeviation === undefined ? '— (no degree of freedom)' : `${formatNumber(fit.residualStandardDeviation * 1e3, 3)} mV/V`}, ${fit.degreesOfFreedom} degrees of freedom`,
    '',
    table.replace(/\n$/, ''),
    '',
    `Over the span ${formatStated(fit.range.min * d.factor)} to ${formatStated(fit.range.max * d.factor)} ${d.unit} (OIML R 60 error terms of the readings):`,
    term('nonlinearity', fit.nonlinearity, ''),
    term('hysteresis', fit.hysteresis, '— (no unloading readings)'),
    term('repeatability', fit.repeatability, '— (no repeated loads)'),
    `${'largest error'.padEnd(16)}${q(fit.largestError, 3)} ${d.unit} (calibrated channel at the points)`,
    `${'u(fit), largest'.padEnd(16)}${q(fit.largestFitUncertainty, 3)} ${d.unit} (standard uncertainty of the fitted curve)`,
    ...(fit.inverseRange === undefined
      ? [
          style.red(
            'check failed: the fit turns inside the span (not monotone), so it has no inverse; fit a lower degree',
          ),
        ]
      : []),
  ].join('\n');
}

/**
 * The body of `bridgework fit-calibration`: fits one channel's calibration from its points
 * ({@link fitCalibration}), reports it as text or JSON, and with `--write` sets the channel file's
 * `calibration` section.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` for a fit without an inverse (nothing written).
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel or points file, too few points,
 *   a file changed since it was read.
 */
export async function run(args: FitArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const path = args.positionals.channelFile;
  const loaded = await loadChannels(path, options.channel === undefined ? undefined : [options.channel]);
  const target = theChannel(loaded, options.channel);
  if (target.channel.quantity === 'ratio') {
    throw new BridgeworkError(
      'invalid-option',
      `channel '${target.name}' reads the bridge ratio itself (output 'ratio'): a calibration maps the ratio to a load`,
      {
        param: 'channel',
        value: target.name,
      },
    );
  }
  const table = await readSmallTable(args.positionals.pointsFile, ['load', 'reading']);
  const { fit } = inChannel(loaded, target, () =>
    fitCalibration(target.channel, table, {
      degree: options.degree,
      reading: options.reading,
      loadUnit: options.loadUnit ?? target.channel.unit,
    }),
  );
  const ok = fit.inverseRange !== undefined;
  const date = options.date ?? runDate(context.io.env);
  let written = false;
  if (options.write && ok) {
    const editor = await openChannelFileEditor(path);
    if (!isDeepStrictEqual(editor.original, loaded.document.data)) {
      throw new BridgeworkError(
        'io-error',
        `${path} changed since it was read; nothing was written: run the command again`,
        {
          param: path,
        },
      );
    }
    setChannelSection(
      editor,
      target.name,
      'calibration',
      calibrationSection(fit, date, relative(dirname(path), table.file).split(sep).join('/')),
      {
        comment: `calibration against reference loads (bridgework fit-calibration, ${date})`,
      },
    );
    await editor.save();
    written = true;
  }
  const output = await openResultOutput(context, options.out, options.force);
  try {
    if (options.json) {
      await output.write(
        reportJson({ file: path, ...fit, written, date }, { generator: `bridgework ${await readVersion()}` }),
      );
    } else {
      const note = written
        ? `wrote the calibration (degree ${fit.degree}) into ${path}; the channel now converts through it`
        : options.write
          ? 'nothing written: the check failed'
          : 'not written (give --write to store the calibration in the channel file)';
      await output.write(
        `${fitText(fit, target.channel, output.style)}\n\n${note}\n\n${wrapText(SAFETY_CAUTION, 100).join('\n')}\n`,
      );
    }
    await output.commit('the calibration fit');
  } finally {
    await output.abort();
  }
  return ok ? exitCodes.ok : exitCodes.failedCheck;
}
