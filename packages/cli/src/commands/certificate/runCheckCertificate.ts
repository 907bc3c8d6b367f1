import { resolve } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import type { LoadCellAccuracyClass } from '@bridgework/calibration';
import {
  dimensionTable,
  outputQuantityTable,
  parseQuantity,
  type Channel,
  type OutputQuantity,
} from '@bridgework/channel';
import { BridgeworkError, formatValue, isBridgeworkError } from '@bridgework/core';
import { SAFETY_CAUTION } from '../../caution.js';
import { openChannelFileEditor, setChannelSection } from '../../channelFile/editChannelFile.js';
import { inChannel, loadChannels } from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { openAtomicFile, type AtomicFile } from '../../files/atomicFile.js';
import { readVersion } from '../../internal/readVersion.js';
import { wrapText } from '../../internal/wrapText.js';
import { formatNumber, formatPercent, formatStated } from '../../report/formatNumber.js';
import { reportJson } from '../../report/reportJson.js';
import { runDate } from '../../report/runDate.js';
import { formatTable } from '../../terminal/formatTable.js';
import type { TextStyle } from '../../terminal/textStyle.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import { readSmallTable, type SmallTable } from '../shunt/readSmallTable.js';
import { theChannel } from '../shunt/runShuntApply.js';
import { certificateHtml } from './certificateHtml.js';
import { checkCertificate, type CertificateCheck, type CertificateRow } from './certificateCheck.js';
import type { CertificateArgs } from './certificateOptions.js';

/** A quantity option in the channel's unit, or a typed error naming the option. */
function quantityOption(option: string, text: string, unit: string): number {
  try {
    return parseQuantity(text, unit);
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    throw new BridgeworkError('invalid-option', `--${option} '${text}': ${e.message}`, {
      param: option,
      value: text,
      cause: e,
    });
  }
}

/**
 * The transducer's capacity in the channel's unit, when the channel is a transducer whose capacity
 * is of the channel's quantity; else undefined.
 */
export function sensorCapacity(channel: Channel): number | undefined {
  const sensor = channel.spec.sensor as { kind: string; capacity?: number; ratedQuantity?: OutputQuantity };
  if (sensor.kind !== 'transducer' || sensor.capacity === undefined || sensor.ratedQuantity === undefined) {
    return undefined;
  }
  const dimension = outputQuantityTable[sensor.ratedQuantity].dimension;
  if (dimension !== outputQuantityTable[channel.quantity].dimension) return undefined;
  return parseQuantity(`${sensor.capacity} ${dimensionTable[dimension].si}`, channel.unit);
}

/** Reads a certificate file's rows, loads (and load readings) in the channel's unit. */
export function readCertificateRows(
  table: SmallTable,
  options: {
    channelUnit: string;
    loadUnit: string;
    reading: 'mV/V' | 'V/V' | 'load';
    referenceCelsius: number;
  },
): CertificateRow[] {
  const c = {
    test: table.column('test'),
    temperature: table.column('temperature'),
    load: table.column('load'),
    reading: table.column('reading'),
    direction: table.column('direction'),
    cycle: table.column('cycle'),
    minutes: table.column('minutes'),
  };
  const toChannel = (x: number) =>
    quantityOption('load-unit', `${x} ${options.loadUnit}`, options.channelUnit);
  const bad = (line: number, message: string) =>
    new BridgeworkError('parse-error', `${table.file}:${line}: ${message}`, { param: table.file });
  return table.rows.map((row) => {
    const test = table.text(row, c.test).toLowerCase() || 'load';
    if (test !== 'load' && test !== 'creep' && test !== 'return') {
      throw bad(row.line, `column 'test' must be load, creep or return; got '${test}'`);
    }
    const direction = table.text(row, c.direction).toLowerCase();
    if (direction !== '' && direction !== 'up' && direction !== 'down') {
      throw bad(row.line, `column 'direction' must be up or down; got '${direction}'`);
    }
    const cycle = table.text(row, c.cycle) === '' ? 1 : table.number(row, c.cycle);
    if (!Number.isInteger(cycle) || cycle < 1) {
      throw bad(row.line, `column 'cycle' must be a whole number from 1; got ${formatValue(cycle)}`);
    }
    const temperature =
      table.text(row, c.temperature) === '' ? options.referenceCelsius : table.number(row, c.temperature);
    if (temperature < -273.15 || temperature > 1000) {
      throw bad(
        row.line,
        `column 'temperature' must be in °C between −273.15 and 1000; got ${formatValue(temperature)}`,
      );
    }
    const minutes = table.text(row, c.minutes) === '' ? undefined : table.number(row, c.minutes);
    const raw = table.number(row, c.reading);
    return {
      test,
      temperatureCelsius: temperature,
      load: toChannel(table.number(row, c.load)),
      reading: options.reading === 'mV/V' ? raw / 1000 : options.reading === 'V/V' ? raw : toChannel(raw),
      direction: direction === 'down' ? 'down' : 'up',
      cycle,
      minutes,
      line: row.line,
    };
  });
}

/** The sensor keys written with --write. */
export function certificateSensorKeys(check: CertificateCheck, capacity: number): Record<string, number> {
  const c = check.characteristics;
  if (c === undefined) return {};
  return {
    ratedOutputVoltsPerVolt: c.sensitivity * capacity,
    zeroBalanceVoltsPerVolt: c.zeroBalanceVoltsPerVolt,
    certificateCelsius: c.certificateCelsius,
    ...(c.zeroTemperatureCoefficientPerKelvin === undefined
      ? {}
      : { zeroTemperatureCoefficientPerKelvin: c.zeroTemperatureCoefficientPerKelvin }),
    ...(c.spanTemperatureCoefficientPerKelvin === undefined
      ? {}
      : { spanTemperatureCoefficientPerKelvin: c.spanTemperatureCoefficientPerKelvin }),
  };
}

function certificateText(check: CertificateCheck, channel: Channel, file: string, style: TextStyle): string {
  const d = channel.display;
  const q = (x: number, digits = 3) => formatNumber(x * d.factor, digits);
  const loads = [...new Set(check.errors.map((e) => e.load))].sort((a, b) => a - b);
  const rows = loads.map((load) => {
    const cells = check.runs.map((_, run) => {
      const here = check.errors.filter((e) => e.run === run && e.load === load);
      if (here.length === 0) return '—';
      const worst = here.reduce((a, b) => (Math.abs(b.error) > Math.abs(a.error) ? b : a));
      return `${q(worst.error)}${worst.ok ? '' : ' ✗'}`;
    });
    const mpe = check.errors.find((e) => e.load === load)?.mpe as number;
    return [formatStated(load * d.factor), ...cells, `±${q(mpe)}`];
  });
  const errorTable = formatTable(
    [
      { header: `load (${d.unit})`, align: 'right' },
      ...check.runs.map((r) => ({ header: r.label, align: 'right' as const })),
      { header: `mpe (${d.unit})`, align: 'right' },
    ],
    rows,
  );
  const checkTable = formatTable(
    [
      { header: 'check' },
      { header: `value (${d.unit})`, align: 'right' },
      { header: `limit (${d.unit})`, align: 'right' },
      { header: 'margin', align: 'right' },
      { header: 'result' },
    ],
    check.checks.map((c) =>
      c.name === 'class declaration'
        ? [c.name, '', '', '', style.red('fail')]
        : [c.name, q(c.value), q(c.limit), q(c.margin), c.ok ? 'pass' : style.red('fail')],
    ),
  );
  const ch = check.characteristics;
  const cert = ch?.certificate;
  return [
    style.bold(`Load cell certificate — ${file}, channel ${channel.name}`),
    `OIML R 60 class ${check.accuracyClass}, nLC ${check.intervals}, pLC ${check.apportionment}: Emax ${formatStated(check.capacity * d.factor)} ${d.unit}, measuring range ${formatStated(check.minLoad * d.factor)} to ${formatStated(check.maxLoad * d.factor)} ${d.unit}, v = ${q(check.verificationInterval, 4)} ${d.unit}${check.vmin === undefined ? '' : `, vmin = ${q(check.vmin, 4)} ${d.unit}`}`,
    ...(ch === undefined
      ? ['readings are indications in load']
      : [
          `reading to load: the ${ch.certificateCelsius} °C loading line, ${formatNumber((ch.sensitivity * 1e3) / d.factor, 6)} mV/V per ${d.unit}; errors from each run's minimum-load reading`,
        ]),
    '',
    'Load cell error (largest magnitude over directions and cycles; ✗ past the mpe):',
    errorTable.replace(/\n$/, ''),
    '',
    checkTable.replace(/\n$/, ''),
    ...check.checks.filter((c) => !c.ok).map((c) => style.red(`check failed: ${c.name}: ${c.detail}`)),
    ...(ch === undefined
      ? []
      : [
          '',
          `Characteristics at ${ch.certificateCelsius} °C: zero balance ${formatNumber(ch.zeroBalanceVoltsPerVolt * 1e3, 4)} mV/V` +
            (ch.zeroTemperatureCoefficientPerKelvin === undefined
              ? ''
              : `; zero ${formatNumber(ch.zeroTemperatureCoefficientPerKelvin * 1e6, 3)} ppm of Emax output per K, span ${formatNumber((ch.spanTemperatureCoefficientPerKelvin as number) * 1e6, 3)} ppm per K (largest over the temperatures)`),
          ...(cert === undefined
            ? []
            : [
                `certificate figures (calibration evaluateCertificate): rated output ${formatNumber(cert.ratedOutput * 1e3, 6)} mV/V at ${formatStated(cert.capacity * d.factor)} ${d.unit}, nonlinearity ${formatPercent(cert.terminalNonlinearityFraction)}${cert.hysteresisFraction === undefined ? '' : `, hysteresis ${formatPercent(cert.hysteresisFraction)}`}${cert.repeatabilityFraction === undefined ? '' : `, repeatability ${formatPercent(cert.repeatabilityFraction)}`} of rated output`,
              ]),
        ]),
  ].join('\n');
}

/**
 * The body of `bridgework check-certificate`: reads a certificate file, checks it against an OIML
 * R 60 class ({@link checkCertificate}), reports it as text or JSON (and HTML), and with `--write`
 * sets the characteristics in the channel's sensor section.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` when a check fails (nothing written).
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel or certificate file, a missing
 *   class or nLC, a load outside the measuring range, a file changed since it was read.
 */
export async function run(args: CertificateArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const path = args.positionals.channelFile;
  for (const name of ['class', 'intervals'] as const) {
    if (options[name] === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `--${name} is required: the OIML R 60 class and its nLC (C3 is --class C --intervals 3000)`,
        { param: name },
      );
    }
  }
  const loaded = await loadChannels(path, options.channel === undefined ? undefined : [options.channel]);
  const target = theChannel(loaded, options.channel);
  const channel = target.channel;
  const out = options.out === '-' ? undefined : options.out;
  if (options.html !== undefined && out !== undefined && resolve(options.html) === resolve(out)) {
    throw new BridgeworkError('conflicting-options', '`--html` and `--out` must name different files', {
      param: 'html',
      value: options.html,
    });
  }
  const table = await readSmallTable(args.positionals.certificateFile, ['load', 'reading']);
  const check = inChannel(loaded, target, () => {
    const unit = channel.unit;
    const capacity =
      options.capacity === undefined
        ? sensorCapacity(channel)
        : quantityOption('capacity', options.capacity, unit);
    if (capacity === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `--capacity is required: channel '${channel.name}' has no transducer capacity in ${unit} to take Emax from`,
        { param: 'capacity' },
      );
    }
    const rows = readCertificateRows(table, {
      channelUnit: unit,
      loadUnit: options.loadUnit ?? unit,
      reading: options.reading,
      referenceCelsius: options.referenceCelsius,
    });
    return checkCertificate({
      file: table.file,
      rows,
      reading: options.reading === 'load' ? 'load' : 'ratio',
      accuracyClass: options.class as LoadCellAccuracyClass,
      intervals: options.intervals as number,
      apportionment: options.apportionment,
      capacity,
      minLoad: options.minLoad === undefined ? undefined : quantityOption('min-load', options.minLoad, unit),
      maxLoad: options.maxLoad === undefined ? undefined : quantityOption('max-load', options.maxLoad, unit),
      capacityPerVmin: options.capacityPerVmin,
      referenceCelsius: options.referenceCelsius,
    });
  });
  let sensorKeys: Record<string, number> | undefined;
  if (options.write) {
    const capacity = sensorCapacity(channel);
    if (capacity === undefined || check.characteristics === undefined) {
      throw new BridgeworkError(
        'invalid-option',
        `--write: ${capacity === undefined ? `channel '${channel.name}' is not a transducer whose capacity is a ${channel.quantity}` : 'readings given as load carry no rated output in mV/V'}; the characteristics can only be written for a transducer channel from readings in mV/V or V/V`,
        { param: 'write' },
      );
    }
    sensorKeys = certificateSensorKeys(check, capacity);
    if (!((sensorKeys['ratedOutputVoltsPerVolt'] as number) > 0)) {
      throw new BridgeworkError(
        'invalid-option',
        `--write: the certificate's output falls with load (rated output ${formatNumber((sensorKeys['ratedOutputVoltsPerVolt'] as number) * 1e3, 4)} mV/V); a channel reads a rising output: swap the signal leads or set polarity: inverted, and give the readings with the sign the channel sees`,
        { param: 'write' },
      );
    }
  }
  const date = runDate(context.io.env);
  let html: AtomicFile | undefined;
  let written = false;
  const output = await openResultOutput(context, options.out, options.force);
  try {
    if (options.html !== undefined) {
      html = await openAtomicFile(options.html, { force: options.force });
      await html.write(
        certificateHtml(check, {
          channel: channel.name,
          display: channel.display,
          channelFile: path,
          certificateFile: table.file,
          date,
          generator: `bridgework ${await readVersion()}`,
        }),
      );
    }
    if (sensorKeys !== undefined && check.ok) {
      const editor = await openChannelFileEditor(path);
      if (!isDeepStrictEqual(editor.original, loaded.document.data)) {
        throw new BridgeworkError(
          'io-error',
          `${path} changed since it was read; nothing was written: run the command again`,
          { param: path },
        );
      }
      const keys = Object.entries(sensorKeys);
      keys.forEach(([key, value], i) =>
        setChannelSection(editor, target.name, ['sensor', key], value, {
          ...(i === 0
            ? { comment: `from the certificate ${table.file} (bridgework check-certificate, ${date})` }
            : {}),
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
            channel: channel.name,
            unit: channel.unit,
            certificateFile: table.file,
            certificateSha256: table.sha256,
            ...check,
            sensor: sensorKeys,
            written,
            date,
          },
          { generator: `bridgework ${await readVersion()}` },
        ),
      );
    } else {
      const note = written
        ? `wrote the certificate's characteristics (${Object.keys(sensorKeys ?? {}).join(', ')}) into the sensor section of ${path}`
        : options.write
          ? 'nothing written: a check failed'
          : 'not written (give --write to store the characteristics in the channel file)';
      await output.write(
        `${certificateText(check, channel, table.file, output.style)}\n\n${note}\n\n${wrapText(SAFETY_CAUTION, 100).join('\n')}\n`,
      );
    }
    if (html !== undefined) {
      await html.commit();
      context.io.stderr.write(`wrote the HTML page to ${options.html}\n`);
    }
    await output.commit('the certificate check');
  } finally {
    await html?.abort();
    await output.abort();
  }
  return check.ok ? exitCodes.ok : exitCodes.failedCheck;
}
