import { resolve } from 'node:path';
import { parseQuantity, type Channel } from '@bridgework/channel';
import { BridgeworkError } from '@bridgework/core';
import { openAtomicFile, type AtomicFile } from '../../files/atomicFile.js';
import { runDate } from '../../report/runDate.js';
import { shuntPlanHtml } from './shuntHtml.js';
import type { BridgeArm, PreferredSeries, ShuntPlacement } from '@bridgework/calibration';
import { SAFETY_CAUTION } from '../../caution.js';
import { inChannel, loadChannels } from '../../channels/loadChannels.js';
import { exitCodes } from '../../exitCodes.js';
import { readVersion } from '../../internal/readVersion.js';
import { wrapText } from '../../internal/wrapText.js';
import { formatCode, formatNumber, formatPercent, formatStated } from '../../report/formatNumber.js';
import { reportJson } from '../../report/reportJson.js';
import { formatTable } from '../../terminal/formatTable.js';
import type { TextStyle } from '../../terminal/textStyle.js';
import type { CommandContext } from '../CommandContext.js';
import { openResultOutput } from '../resultOutput.js';
import { channelShunt, preferredShunt, shuntForQuantity, type ShuntStep } from './channelShunt.js';
import type { ShuntPlanArgs } from './shuntOptions.js';
import type { ShuntPlan } from './shuntTypes.js';

export type { ShuntPlan } from './shuntTypes.js';

/**
 * The shunt plan of one channel.
 *
 * @param channel - The channel.
 * @param options - Arm, placement, the quantity to simulate (or a resistor) and the series.
 */
export function planShunt(
  channel: Channel,
  options: {
    arm: BridgeArm;
    placement: ShuntPlacement;
    simulate: string | undefined;
    shuntOhms: number | undefined;
    series: PreferredSeries;
  },
): ShuntPlan {
  const shunt = channelShunt(channel, { arm: options.arm, placement: options.placement });
  const d = channel.display;
  const describe = (q: number) => `${formatNumber(q * d.factor, 4)} ${d.unit}`;
  let simulate: number | undefined;
  let exact: ShuntStep;
  if (options.shuntOhms !== undefined) {
    exact = shunt.step(options.shuntOhms);
  } else {
    if (options.simulate === undefined) {
      const direction = Math.sign(shunt.step(1e9 * 350).indicated);
      const largest = Math.max(Math.abs(channel.span.min), Math.abs(channel.span.max));
      simulate = direction * 0.8 * largest;
    } else {
      simulate = parseQuantity(options.simulate, channel.unit);
    }
    exact = shuntForQuantity(shunt, simulate, describe);
  }
  const value = preferredShunt(exact.shuntOhms, options.series);
  return {
    channel: channel.name,
    unit: channel.unit,
    arm: options.arm,
    placement: options.placement,
    simulate,
    exact,
    preferred: {
      ...shunt.step(value),
      series: options.series,
      deviationFraction: (value - exact.shuntOhms) / exact.shuntOhms,
    },
  };
}

function planText(plan: ShuntPlan, channel: Channel, style: TextStyle): string {
  const d = channel.display;
  const q = (x: number) => `${formatNumber(x * d.factor, 5)} ${d.unit}`;
  const ohms = (x: number) => `${formatStated(x)} Ω`;
  const head = [
    style.bold(`Channel ${plan.channel}`),
    `  shunt across arm ${plan.arm}, ${plan.placement === 'gauge' ? 'at the gauge' : 'at the instrument end of the cable'}` +
      (plan.simulate === undefined ? '' : `, to simulate ${q(plan.simulate)}`),
  ];
  const p = plan.preferred;
  const exactHeader = plan.simulate === undefined ? 'given resistor' : 'exact shunt';
  const table = formatTable(
    [
      { header: '' },
      { header: exactHeader, align: 'right' },
      { header: `${p.series} resistor`, align: 'right' },
    ],
    [
      [
        'shunt',
        ohms(plan.exact.shuntOhms),
        `${ohms(p.shuntOhms)} (${p.deviationFraction >= 0 ? '+' : ''}${formatPercent(p.deviationFraction)})`,
      ],
      [
        'bridge ratio step',
        `${formatNumber((plan.exact.shuntedRatio - plan.exact.zeroRatio) * 1e3, 6)} mV/V`,
        `${formatNumber((p.shuntedRatio - p.zeroRatio) * 1e3, 6)} mV/V`,
      ],
      ['converter step', `${formatCode(plan.exact.stepCodes)} codes`, `${formatCode(p.stepCodes)} codes`],
      ['channel indicates', q(plan.exact.indicated), q(p.indicated)],
    ],
  );
  return `${head.join('\n')}\n${table
    .replace(/\n$/, '')
    .split('\n')
    .map((l) => `  ${l}`)
    .join('\n')}`;
}

/**
 * The body of `bridgework shunt-plan`: for each selected strain-gauge or transducer channel, the
 * shunt that simulates the chosen quantity and the step it gives ({@link planShunt}), as text or
 * JSON.
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file, a channel without shunt
 *   calibration, a quantity no shunt on that arm can simulate.
 */
export async function run(args: ShuntPlanArgs, context: CommandContext): Promise<number> {
  const { options } = args;
  const loaded = await loadChannels(
    args.positionals.channelFile,
    options.channel === undefined ? undefined : [options.channel],
  );
  const selected =
    options.channel === undefined
      ? loaded.channels.filter((c) => c.channel.kind === 'strain-gauge' || c.channel.kind === 'transducer')
      : loaded.channels;
  const out = options.out === '-' ? undefined : options.out;
  if (options.html !== undefined && out !== undefined && resolve(options.html) === resolve(out)) {
    throw new BridgeworkError('conflicting-options', '`--html` and `--out` must name different files', {
      param: 'html',
      value: options.html,
    });
  }
  const output = await openResultOutput(context, options.out, options.force);
  let html: AtomicFile | undefined;
  try {
    const plans = selected.map((c) =>
      inChannel(loaded, c, () =>
        planShunt(c.channel, {
          arm: options.arm as BridgeArm,
          placement: options.placement,
          simulate: options.simulate,
          shuntOhms: options.shuntOhms,
          series: options.series,
        }),
      ),
    );
    const file = loaded.file.file;
    if (options.html !== undefined) {
      html = await openAtomicFile(options.html, { force: options.force });
      await html.write(
        shuntPlanHtml(
          selected.map((c, i) => {
            const shunt = channelShunt(c.channel, {
              arm: options.arm as BridgeArm,
              placement: options.placement,
            });
            return {
              plan: plans[i] as ShuntPlan,
              channel: c.channel,
              step: (ohms: number) => shunt.step(ohms),
            };
          }),
          {
            channelFile: file,
            date: runDate(context.io.env),
            generator: `bridgework ${await readVersion()}`,
          },
        ),
      );
    }
    if (options.json) {
      await output.write(reportJson({ file, plans }, { generator: `bridgework ${await readVersion()}` }));
    } else {
      const skipped = loaded.channels.length - selected.length;
      const text = [
        output.style.bold(`Shunt calibration plan — ${file}`),
        ...selected.map((c, i) => planText(plans[i] as ShuntPlan, c.channel, output.style)),
        ...(skipped > 0
          ? [`(${skipped} channel${skipped === 1 ? '' : 's'} without shunt calibration: RTD or thermistor)`]
          : []),
        wrapText(SAFETY_CAUTION, 100).join('\n'),
      ];
      await output.write(`${text.join('\n\n')}\n`);
    }
    if (html !== undefined) {
      await html.commit();
      context.io.stderr.write(`wrote the HTML page to ${options.html}\n`);
    }
    await output.commit('the shunt plan');
    return exitCodes.ok;
  } finally {
    await html?.abort();
    await output.abort();
  }
}
