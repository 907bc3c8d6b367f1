import { resolve } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import { openAtomicFile, type AtomicFile } from '../../files/atomicFile.js';
import { shuntApplyHtml } from './shuntHtml.js';
import { spanCorrectionFromShunt, type BridgeArm, type SpanCorrection } from '@bridgework/calibration';
import type { Channel } from '@bridgework/channel';
import { BridgeworkError } from '@bridgework/core';
import { SAFETY_CAUTION } from '../../caution.js';
import { openChannelFileEditor, setChannelSection } from '../../channelFile/editChannelFile.js';
import {
  inChannel,
  loadChannels,
  type LoadedChannel,
  type LoadedChannels,
} from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { readVersion } from '../../internal/readVersion.js';
import { wrapText } from '../../internal/wrapText.js';
import { formatCode, formatNumber, formatPercent } from '../../report/formatNumber.js';
import { reportJson } from '../../report/reportJson.js';
import { runDate } from '../../report/runDate.js';
import { formatTable } from '../../terminal/formatTable.js';
import type { TextStyle } from '../../terminal/textStyle.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import { channelShunt } from './channelShunt.js';
import { readSmallTable } from './readSmallTable.js';
import type { ShuntApplyArgs } from './shuntOptions.js';
import type { ShuntApplication, ShuntReadings } from './shuntTypes.js';

export type { ShuntApplication, ShuntReadings } from './shuntTypes.js';

const mean = (xs: readonly number[]): number => xs.reduce((s, x) => s + x / xs.length, 0);

/**
 * The span correction of one channel from its shunt readings.
 *
 * @param channel - The channel (its current span correction is left out of the model and reported).
 * @param options - Shunt, arm, placement, tolerance, readings and the plausible span error.
 */
export function applyShunt(
  channel: Channel,
  options: {
    shuntOhms: number;
    arm: BridgeArm;
    placement: 'gauge' | 'instrument';
    tolerancePercent: number;
    plausibleFraction: number;
    readings: ShuntReadings;
  },
): { application: ShuntApplication; correction: SpanCorrection } {
  const shunt = channelShunt(channel, { arm: options.arm, placement: options.placement });
  const expected = shunt.step(options.shuntOhms);
  // The shunt's tolerance: rectangular ±a (u = a/√3, JCGM 100 4.3.7) through the step's slope.
  let uExpected = 0;
  if (options.tolerancePercent > 0) {
    const rs = options.shuntOhms;
    const h = 1e-6 * rs;
    const slope = (shunt.step(rs + h).stepCodes - shunt.step(rs - h).stepCodes) / (2 * h);
    uExpected = (Math.abs(slope) * ((options.tolerancePercent / 100) * rs)) / Math.sqrt(3);
  }
  const r = options.readings;
  const samples = 'zeroReadings' in r;
  const result = spanCorrectionFromShunt({
    expectedStep: expected.stepCodes,
    ...(uExpected > 0 ? { expectedStepStandardUncertainty: uExpected } : {}),
    ...(samples
      ? { zeroReadings: r.zeroReadings, shuntedReadings: r.shuntedReadings }
      : { measuredStep: r.shuntedCode - r.zeroCode }),
    plausibleSpanErrorFraction: options.plausibleFraction,
  });
  const zeroCode = samples ? mean(r.zeroReadings) : r.zeroCode;
  const shuntedCode = samples ? mean(r.shuntedReadings) : r.shuntedCode;
  const c = result.value;
  let indicated: number | undefined;
  try {
    indicated =
      shunt.model.quantityFromCode(zeroCode + c.measuredStep) - shunt.model.quantityFromCode(zeroCode);
  } catch {
    indicated = undefined;
  }
  return {
    correction: c,
    application: {
      channel: channel.name,
      unit: channel.unit,
      shunt: {
        ohms: options.shuntOhms,
        arm: options.arm,
        placement: options.placement,
        tolerancePercent: options.tolerancePercent,
      },
      expected: { ...expected, standardUncertaintyCodes: uExpected },
      measured: {
        zeroCode,
        shuntedCode,
        readings: samples ? [r.zeroReadings.length, r.shuntedReadings.length] : [1, 1],
        stepCodes: c.measuredStep,
        standardUncertaintyCodes: c.measuredStepStandardUncertainty,
        indicated,
      },
      spanErrorFraction: c.spanErrorFraction,
      factor: c.factor,
      factorStandardUncertainty: c.factorStandardUncertainty,
      previousFactor: channel.spec.spanCorrection?.factor,
      ok: result.ok,
      issues: result.issues,
    },
  };
}

/** The `spanCorrection` section written for an application. */
export function spanCorrectionSection(a: ShuntApplication, date: string): Record<string, unknown> {
  return {
    factor: a.factor,
    ...(a.factorStandardUncertainty === undefined
      ? {}
      : { factorStandardUncertainty: a.factorStandardUncertainty }),
    shuntOhms: a.shunt.ohms,
    arm: a.shunt.arm,
    placement: a.shunt.placement,
    expectedStepCodes: a.expected.stepCodes,
    measuredStepCodes: a.measured.stepCodes,
    readings: Math.min(...a.measured.readings),
    date,
  };
}

async function readReadings(args: ShuntApplyArgs): Promise<ShuntReadings> {
  const o = args.options;
  const codes = o.zeroCode !== undefined || o.shuntedCode !== undefined;
  if (codes && o.readings !== undefined) {
    throw new BridgeworkError(
      'conflicting-options',
      '--readings must not be given with --zero-code and --shunted-code (give one or the other)',
      {
        param: 'readings',
      },
    );
  }
  if (o.readings === undefined) {
    if (o.zeroCode === undefined || o.shuntedCode === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `--${o.zeroCode === undefined ? 'zero-code' : 'shunted-code'} is required: give the readings without and with the shunt (--zero-code and --shunted-code), or a recording (--readings)`,
        { param: o.zeroCode === undefined ? 'zero-code' : 'shunted-code' },
      );
    }
    return { zeroCode: o.zeroCode, shuntedCode: o.shuntedCode };
  }
  const table = await readSmallTable(o.readings, ['state', 'code']);
  const state = table.column('state');
  const code = table.column('code');
  const zero: number[] = [];
  const shunted: number[] = [];
  for (const row of table.rows) {
    const s = table.text(row, state).toLowerCase();
    if (s !== 'without' && s !== 'with') {
      throw new BridgeworkError(
        'parse-error',
        `${table.file}:${row.line}: column 'state' must be without or with; got '${s}'`,
        {
          param: table.file,
        },
      );
    }
    (s === 'with' ? shunted : zero).push(table.number(row, code));
  }
  for (const [name, xs] of [
    ['without', zero],
    ['with', shunted],
  ] as const) {
    if (xs.length === 0) {
      throw new BridgeworkError('parse-error', `${table.file}: no reading in state '${name}'`, {
        param: table.file,
      });
    }
  }
  return { zeroReadings: zero, shuntedReadings: shunted };
}

/** The one channel a command that writes works on: `--channel`, or the file's only channel. */
export function theChannel(loaded: LoadedChannels, option: string | undefined): LoadedChannel {
  if (option === undefined && loaded.channels.length !== 1) {
    throw new BridgeworkError(
      'missing-option',
      `--channel is required: ${loaded.file.file} has ${loaded.channels.length} channels (${loaded.channels.map((c) => c.name).join(', ')})`,
      { param: 'channel' },
    );
  }
  return loaded.channels[0] as LoadedChannel;
}

function applicationText(a: ShuntApplication, channel: Channel, file: string, style: TextStyle): string {
  const d = channel.display;
  const q = (x: number | undefined) => (x === undefined ? '—' : `${formatNumber(x * d.factor, 5)} ${d.unit}`);
  const u = (x: number | undefined) => (x === undefined || x === 0 ? '' : ` ± ${formatNumber(x, 2)}`);
  const table = formatTable(
    [{ header: '' }, { header: 'codes', align: 'right' }, { header: 'channel indicates', align: 'right' }],
    [
      [
        'expected step (model)',
        `${formatCode(a.expected.stepCodes)}${u(a.expected.standardUncertaintyCodes)}`,
        q(a.expected.indicated),
      ],
      [
        'measured step',
        `${formatCode(a.measured.stepCodes)}${u(a.measured.standardUncertaintyCodes)}`,
        q(a.measured.indicated),
      ],
    ],
  );
  const lines = [
    style.bold(`Shunt calibration — ${file}, channel ${a.channel}`),
    `shunt ${formatNumber(a.shunt.ohms, 6)} Ω across arm ${a.shunt.arm}, ${a.shunt.placement === 'gauge' ? 'at the gauge' : 'at the instrument end of the cable'}${a.shunt.tolerancePercent > 0 ? ` (±${formatNumber(a.shunt.tolerancePercent, 3)} %)` : ''}`,
    `readings: without ${formatCode(a.measured.zeroCode)}, with ${formatCode(a.measured.shuntedCode)} (means of ${a.measured.readings[0]} and ${a.measured.readings[1]})`,
    '',
    table.replace(/\n$/, ''),
    '',
    `span error     ${a.spanErrorFraction >= 0 ? '+' : ''}${formatPercent(a.spanErrorFraction)}`,
    `span factor k  ${a.factor.toFixed(6)}${a.factorStandardUncertainty === undefined ? '' : ` (standard uncertainty ${formatNumber(a.factorStandardUncertainty, 2)})`}`,
    ...(a.previousFactor === undefined
      ? []
      : [`in the file    ${a.previousFactor.toFixed(6)} (replaced on --write)`]),
    ...a.issues.map((i) => style.red(`check failed: ${i}`)),
  ];
  return lines.join('\n');
}

/**
 * The body of `bridgework shunt-apply`: the span correction of one channel from its shunt
 * readings ({@link applyShunt}), reported as text or JSON, and with `--write` set in the channel
 * file's `spanCorrection` section.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` when the step is implausible (nothing written).
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file, missing or conflicting
 *   readings, a channel without shunt calibration, a file changed since it was read.
 */
export async function run(args: ShuntApplyArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const path = args.positionals.channelFile;
  if (options.shuntOhms === undefined) {
    throw new BridgeworkError(
      'missing-option',
      '--shunt-ohms is required: the shunt resistor that was connected',
      {
        param: 'shunt-ohms',
      },
    );
  }
  const readings = await readReadings(args);
  const loaded = await loadChannels(path, options.channel === undefined ? undefined : [options.channel]);
  const target = theChannel(loaded, options.channel);
  const shuntOhms = options.shuntOhms;
  const { application } = inChannel(loaded, target, () =>
    applyShunt(target.channel, {
      shuntOhms,
      arm: options.arm as BridgeArm,
      placement: options.placement,
      tolerancePercent: options.shuntTolerance,
      plausibleFraction: options.plausible / 100,
      readings,
    }),
  );
  const date = options.date ?? runDate(context.io.env);
  const out = options.out === '-' ? undefined : options.out;
  if (options.html !== undefined && out !== undefined && resolve(options.html) === resolve(out)) {
    throw new BridgeworkError('conflicting-options', '`--html` and `--out` must name different files', {
      param: 'html',
      value: options.html,
    });
  }
  const output = await openResultOutput(context, options.out, options.force);
  let html: AtomicFile | undefined;
  let written = false;
  try {
    if (options.html !== undefined) {
      html = await openAtomicFile(options.html, { force: options.force });
      await html.write(
        shuntApplyHtml(
          application,
          'zeroReadings' in readings
            ? { zero: readings.zeroReadings, shunted: readings.shuntedReadings }
            : { zero: [readings.zeroCode], shunted: [readings.shuntedCode] },
          target.channel,
          { channelFile: path, date, generator: `bridgework ${await readVersion()}` },
        ),
      );
    }
    // The output is open (an existing file without --force stops here): now the write-back.
    if (options.write && application.ok) {
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
      setChannelSection(editor, target.name, 'spanCorrection', spanCorrectionSection(application, date), {
        comment: `span correction from a shunt calibration (bridgework shunt-apply, ${date})`,
      });
      await editor.save();
      written = true;
    }
    if (options.json) {
      await output.write(
        reportJson(
          { file: path, ...application, written, date },
          { generator: `bridgework ${await readVersion()}` },
        ),
      );
    } else {
      const note = written
        ? `wrote spanCorrection (k = ${application.factor.toFixed(6)}) into ${path}`
        : options.write
          ? 'nothing written: the check failed'
          : 'not written (give --write to store the span correction in the channel file)';
      await output.write(
        `${applicationText(application, target.channel, path, output.style)}\n\n${note}\n\n${wrapText(SAFETY_CAUTION, 100).join('\n')}\n`,
      );
    }
    if (html !== undefined) {
      await html.commit();
      context.io.stderr.write(`wrote the HTML page to ${options.html}\n`);
    }
    await output.commit('the shunt calibration');
  } finally {
    await html?.abort();
    await output.abort();
  }
  return application.ok ? exitCodes.ok : exitCodes.failedCheck;
}
