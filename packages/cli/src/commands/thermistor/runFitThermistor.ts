import { resolve } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import { fitThermistor, type ThermistorFit } from '@bridgework/compensation';
import { parseQuantity, type Channel } from '@bridgework/channel';
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';
import { SAFETY_CAUTION } from '../../caution.js';
import { openChannelFileEditor, setChannelSection } from '../../channelFile/editChannelFile.js';
import { inChannel, loadChannels } from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { openAtomicFile, type AtomicFile } from '../../files/atomicFile.js';
import { linePlot } from '../../html/linePlot.js';
import { renderHtmlReport } from '../../html/renderHtmlReport.js';
import { readVersion } from '../../internal/readVersion.js';
import { wrapText } from '../../internal/wrapText.js';
import { formatNumber, formatStated } from '../../report/formatNumber.js';
import { reportJson } from '../../report/reportJson.js';
import { runDate } from '../../report/runDate.js';
import { formatTable } from '../../terminal/formatTable.js';
import { plainTextStyle, type TextStyle } from '../../terminal/textStyle.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import { readSmallTable, type SmallTable } from '../shunt/readSmallTable.js';
import { theChannel } from '../shunt/runShuntApply.js';
import type { ThermistorArgs } from './thermistorOptions.js';

/** A thermistor calibration point as read (°C, Ω). */
interface Point {
  readonly temperatureCelsius: number;
  readonly ohms: number;
}

/** Reads the points file in °C and Ω. */
function readThermistorPoints(table: SmallTable, temperatureUnit: string, resistanceUnit: string): Point[] {
  const t = table.column('temperature');
  const r = table.column('resistance');
  const convert = (option: string, x: number, unit: string, si: string, line: number) => {
    try {
      return parseQuantity(`${x} ${unit}`, si);
    } catch (e) {
      if (!isBridgeworkError(e)) throw e;
      throw new BridgeworkError(
        'invalid-option',
        `--${option} '${unit}' (${table.file}:${line}): ${e.message}`,
        {
          param: option,
          value: unit,
          cause: e,
        },
      );
    }
  };
  return table.rows.map((row) => ({
    temperatureCelsius: convert('temperature-unit', table.number(row, t), temperatureUnit, '°C', row.line),
    ohms: convert('resistance-unit', table.number(row, r), resistanceUnit, 'Ω', row.line),
  }));
}

/** The sensor keys a fit sets, and the keys of the other model it removes. */
export function thermistorSensorKeys(fit: ThermistorFit): { set: Record<string, unknown>; remove: string[] } {
  return fit.beta !== undefined
    ? {
        set: {
          referenceOhms: fit.beta.referenceOhms,
          referenceCelsius: fit.beta.referenceCelsius,
          betaKelvin: fit.beta.betaKelvin,
        },
        remove: ['steinhartHart'],
      }
    : { set: { steinhartHart: { ...fit.steinhartHart } }, remove: ['betaKelvin', 'betaToleranceFraction'] };
}

function fitText(
  fit: ThermistorFit,
  points: readonly Point[],
  channel: Channel,
  file: string,
  maxResidual: number,
  style: TextStyle,
): string {
  const table = formatTable(
    [
      { header: 'temperature (°C)', align: 'right' },
      { header: 'resistance (Ω)', align: 'right' },
      { header: 'model (°C)', align: 'right' },
      { header: 'residual (K)', align: 'right' },
    ],
    points.map((p, i) => [
      formatStated(p.temperatureCelsius),
      formatStated(p.ohms),
      formatNumber(p.temperatureCelsius + (fit.residualsKelvin[i] as number), 6),
      formatNumber(fit.residualsKelvin[i] as number, 3),
    ]),
  );
  const model =
    fit.beta !== undefined
      ? `beta: R0 = ${formatNumber(fit.beta.referenceOhms, 8)} Ω at ${fit.beta.referenceCelsius} °C, B = ${formatNumber(fit.beta.betaKelvin, 8)} K`
      : `Steinhart–Hart: a = ${formatNumber(fit.steinhartHart?.a as number, 10)}, b = ${formatNumber(fit.steinhartHart?.b as number, 10)}, c = ${formatNumber(fit.steinhartHart?.c as number, 10)} (1/K)`;
  const ok = fit.largestResidualKelvin <= maxResidual;
  return [
    style.bold(`Thermistor fit — ${file}, channel ${channel.name}`),
    `${model}; ${points.length} points, ${fit.degreesOfFreedom} degrees of freedom`,
    '',
    table.replace(/\n$/, ''),
    '',
    `largest residual ${formatNumber(fit.largestResidualKelvin, 3)} K (limit ${maxResidual} K), rms ${formatNumber(fit.rmsResidualKelvin, 3)} K`,
    ...(ok
      ? []
      : [
          style.red(
            `check failed: a residual exceeds --max-residual ${maxResidual} K: ${fit.model === 'beta' ? 'try --model steinhart-hart, or ' : ''}check the points, or narrow the range`,
          ),
        ]),
  ].join('\n');
}

/**
 * The body of `bridgework fit-thermistor`: fits a thermistor channel's model to calibration
 * points (compensation `fitThermistor`), reports it as text or JSON (and HTML), and with `--write`
 * sets the channel's sensor section.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` for a residual past `--max-residual` (nothing written).
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel or points file, a channel that
 *   is not a thermistor, too few points, a file changed since it was read.
 */
export async function run(args: ThermistorArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const path = args.positionals.channelFile;
  const loaded = await loadChannels(path, options.channel === undefined ? undefined : [options.channel]);
  const target = theChannel(loaded, options.channel);
  const channel = target.channel;
  const sensor = channel.spec.sensor as { kind: string; referenceCelsius?: number };
  if (sensor.kind !== 'thermistor') {
    throw new BridgeworkError(
      'invalid-option',
      `channel '${target.name}' is a ${sensor.kind} channel: fit-thermistor writes a thermistor's model (sensor.kind: thermistor)`,
      { param: 'channel', value: target.name },
    );
  }
  const out = options.out === '-' ? undefined : options.out;
  if (options.html !== undefined && out !== undefined && resolve(options.html) === resolve(out)) {
    throw new BridgeworkError('conflicting-options', '`--html` and `--out` must name different files', {
      param: 'html',
      value: options.html,
    });
  }
  if (options.model === 'steinhart-hart' && options.referenceCelsius !== undefined) {
    throw new BridgeworkError('conflicting-options', '--reference-celsius applies to --model beta only', {
      param: 'reference-celsius',
    });
  }
  const table = await readSmallTable(args.positionals.pointsFile, ['temperature', 'resistance']);
  const points = readThermistorPoints(table, options.temperatureUnit, options.resistanceUnit);
  const fit = inChannel(loaded, target, () => {
    try {
      return fitThermistor({
        model: options.model,
        points,
        ...(options.model === 'beta'
          ? { referenceCelsius: options.referenceCelsius ?? sensor.referenceCelsius ?? 25 }
          : {}),
      });
    } catch (e) {
      if (!isBridgeworkError(e)) throw e;
      const index = /^points\[(\d+)\]/.exec(e.param ?? '')?.[1];
      const where = index === undefined ? table.file : `${table.file}:${table.rows[Number(index)]?.line}`;
      throw new BridgeworkError(
        e.code,
        `${where}: ${e.message.replace(/`points(\[\d+\])?(\.\w+)?`/g, 'the point')}`,
        {
          param: table.file,
          cause: e,
        },
      );
    }
  });
  const ok = fit.largestResidualKelvin <= options.maxResidual;
  const date = runDate(context.io.env);
  let html: AtomicFile | undefined;
  let written = false;
  const keys = thermistorSensorKeys(fit);
  const output = await openResultOutput(context, options.out, options.force);
  try {
    if (options.html !== undefined) {
      html = await openAtomicFile(options.html, { force: options.force });
      const plot = linePlot({
        id: 'thermistor-residuals',
        title: `Residuals of the ${fit.model === 'beta' ? 'beta' : 'Steinhart–Hart'} fit`,
        x: { label: 'Temperature', unit: '°C' },
        y: { label: 'Model minus point', unit: 'K' },
        series: [{ name: 'residual', x: points.map((p) => p.temperatureCelsius), y: fit.residualsKelvin }],
      });
      await html.write(
        renderHtmlReport({
          title: 'Thermistor fit',
          subtitle: `channel ${target.name}`,
          meta: [
            { label: 'channel file', value: path },
            { label: 'points file', value: table.file },
            { label: 'date', value: date },
          ],
          sections: [
            {
              title: 'Fit and residuals',
              blocks: [
                {
                  kind: 'text',
                  text: fitText(fit, points, channel, table.file, options.maxResidual, plainTextStyle).split(
                    '\n',
                  )[1] as string,
                },
                { kind: 'plots', plots: [plot] },
              ],
            },
          ],
          generator: `bridgework ${await readVersion()}`,
        }),
      );
    }
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
      for (const key of keys.remove) editor.remove(['channels', target.name, 'sensor', key]);
      Object.entries(keys.set).forEach(([key, value], i) =>
        setChannelSection(editor, target.name, ['sensor', key], value, {
          ...(i === 0 ? { comment: `fitted to ${table.file} (bridgework fit-thermistor, ${date})` } : {}),
        }),
      );
      await editor.save();
      written = true;
    }
    if (options.json) {
      await output.write(
        reportJson(
          {
            file: path,
            channel: target.name,
            pointsFile: table.file,
            pointsSha256: table.sha256,
            points,
            ...fit,
            maxResidualKelvin: options.maxResidual,
            ok,
            sensor: keys.set,
            written,
            date,
          },
          { generator: `bridgework ${await readVersion()}` },
        ),
      );
    } else {
      const note = written
        ? `wrote the ${fit.model === 'beta' ? 'beta' : 'Steinhart–Hart'} model into the sensor section of ${path}`
        : options.write
          ? 'nothing written: the check failed'
          : 'not written (give --write to store the model in the channel file)';
      await output.write(
        `${fitText(fit, points, channel, table.file, options.maxResidual, output.style)}\n\n${note}\n\n${wrapText(SAFETY_CAUTION, 100).join('\n')}\n`,
      );
    }
    if (html !== undefined) {
      await html.commit();
      context.io.stderr.write(`wrote the HTML page to ${options.html}\n`);
    }
    await output.commit('the thermistor fit');
  } finally {
    await html?.abort();
    await output.abort();
  }
  return ok ? exitCodes.ok : exitCodes.failedCheck;
}
