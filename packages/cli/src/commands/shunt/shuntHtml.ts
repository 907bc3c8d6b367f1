/**
 * The HTML pages of `bridgework shunt-plan --html` and `bridgework shunt-apply --html`: the
 * figures of the text report as tables, and plots (the indicated quantity against the shunt
 * resistor around the design point; the readings without and with the shunt against the step
 * the model expects).
 */
import type { Channel } from '@bridgework/channel';
import { linePlot } from '../../html/linePlot.js';
import { renderHtmlReport, type ReportSection } from '../../html/renderHtmlReport.js';
import { formatCode, formatNumber, formatPercent, formatStated } from '../../report/formatNumber.js';
import type { ShuntStep } from './channelShunt.js';
import type { ShuntApplication, ShuntPlan } from './shuntTypes.js';

/** Page facts shared by both pages. */
export interface ShuntPageOptions {
  /** The channel file. */
  readonly channelFile: string;
  /** The run's date. */
  readonly date: string;
  /** `bridgework <version>`. */
  readonly generator: string;
}

/**
 * The page of `shunt-plan --html`: per channel, the plan's table and the quantity the channel
 * indicates against the shunt resistor from half to twice the exact shunt (61 resistors, each
 * through the exact network), with the exact and the preferred resistor marked.
 *
 * @param plans - The plans, with their channels and a function giving the step of any resistor.
 * @param options - Channel file, date, generator.
 * @returns The page.
 */
export function shuntPlanHtml(
  plans: readonly { plan: ShuntPlan; channel: Channel; step: (ohms: number) => ShuntStep }[],
  options: ShuntPageOptions,
): string {
  const sections: ReportSection[] = plans.map(({ plan, channel, step }) => {
    const d = channel.display;
    const q = (x: number) => `${formatNumber(x * d.factor, 5)} ${d.unit}`;
    const rs = plan.exact.shuntOhms;
    const grid = Array.from({ length: 61 }, (_, i) => rs * 2 ** ((i - 30) / 30));
    const curve = grid.map((r) => step(r).indicated * d.factor);
    const p = plan.preferred;
    const plot = linePlot({
      id: `shunt-plan-${plan.channel}`,
      title: `Channel ${plan.channel}: what the channel indicates with a shunt across arm ${plan.arm}`,
      x: { label: 'Shunt resistor', unit: 'kΩ' },
      y: { label: 'Indicated', unit: d.unit },
      series: [
        { name: 'exact network', x: grid.map((r) => r / 1e3), y: curve },
        {
          name: `exact shunt ${formatStated(rs)} Ω`,
          x: [rs / 1e3, rs / 1e3],
          y: [0, plan.exact.indicated * d.factor],
          dashed: true,
        },
        {
          name: `${p.series} ${formatStated(p.shuntOhms)} Ω`,
          x: [p.shuntOhms / 1e3, p.shuntOhms / 1e3],
          y: [0, p.indicated * d.factor],
          dashed: true,
        },
      ],
    });
    return {
      title: `Channel ${plan.channel}`,
      blocks: [
        {
          kind: 'text',
          text: `Shunt across arm ${plan.arm}, ${plan.placement === 'gauge' ? 'at the gauge' : 'at the instrument end of the cable'}${plan.simulate === undefined ? '' : `, to simulate ${q(plan.simulate)}`}; every step through the exact bridge network with its leads.`,
        },
        {
          kind: 'table',
          columns: [
            { header: '' },
            { header: plan.simulate === undefined ? 'given resistor' : 'exact shunt', align: 'right' },
            { header: `${p.series} resistor`, align: 'right' },
          ],
          rows: [
            [
              'shunt',
              `${formatStated(rs)} Ω`,
              `${formatStated(p.shuntOhms)} Ω (${p.deviationFraction >= 0 ? '+' : ''}${formatPercent(p.deviationFraction)})`,
            ],
            [
              'bridge ratio step',
              `${formatNumber((plan.exact.shuntedRatio - plan.exact.zeroRatio) * 1e3, 6)} mV/V`,
              `${formatNumber((p.shuntedRatio - p.zeroRatio) * 1e3, 6)} mV/V`,
            ],
            [
              'converter step',
              `${formatCode(plan.exact.stepCodes)} codes`,
              `${formatCode(p.stepCodes)} codes`,
            ],
            ['channel indicates', q(plan.exact.indicated), q(p.indicated)],
          ],
        },
        { kind: 'plots', plots: [plot] },
      ],
    };
  });
  return renderHtmlReport({
    title: 'Shunt calibration plan',
    subtitle: options.channelFile,
    meta: [
      { label: 'channel file', value: options.channelFile },
      { label: 'date', value: options.date },
    ],
    sections,
    generator: options.generator,
  });
}

/**
 * The page of `shunt-apply --html`: the expected and measured steps, the span error and factor,
 * and the readings without and with the shunt (in the order given) against the levels the model
 * expects (the mean without, plus the expected step).
 *
 * @param a - The application.
 * @param readings - The readings per state (one each for two codes).
 * @param channel - The channel.
 * @param options - Channel file, date, generator.
 * @returns The page.
 */
export function shuntApplyHtml(
  a: ShuntApplication,
  readings: { readonly zero: readonly number[]; readonly shunted: readonly number[] },
  channel: Channel,
  options: ShuntPageOptions,
): string {
  const d = channel.display;
  const q = (x: number | undefined) => (x === undefined ? '—' : `${formatNumber(x * d.factor, 5)} ${d.unit}`);
  const u = (x: number | undefined) => (x === undefined || x === 0 ? '' : ` ± ${formatNumber(x, 2)}`);
  const n0 = readings.zero.length;
  const all = [...readings.zero, ...readings.shunted];
  const index = all.map((_, i) => i + 1);
  const expectedLevel = a.measured.zeroCode + a.expected.stepCodes;
  const plot = linePlot({
    id: `shunt-readings-${a.channel}`,
    title: `Channel ${a.channel}: readings without and with the shunt`,
    x: { label: 'Reading' },
    y: { label: 'Converter code' },
    series: [
      { name: 'without the shunt', x: index.slice(0, n0), y: readings.zero },
      { name: 'with the shunt', x: index.slice(n0), y: readings.shunted },
      {
        name: 'expected with the shunt (model)',
        x: [1, all.length],
        y: [expectedLevel, expectedLevel],
        dashed: true,
        color: '#777',
      },
    ],
  });
  return renderHtmlReport({
    title: 'Shunt calibration',
    subtitle: `channel ${a.channel}`,
    meta: [
      { label: 'channel file', value: options.channelFile },
      { label: 'date', value: options.date },
      { label: 'result', value: a.ok ? 'plausible: span factor computed' : 'check failed' },
    ],
    sections: [
      {
        title: `Channel ${a.channel}: shunt ${formatStated(a.shunt.ohms)} Ω across arm ${a.shunt.arm}`,
        blocks: [
          {
            kind: 'table',
            columns: [
              { header: '' },
              { header: 'codes', align: 'right' },
              { header: 'channel indicates', align: 'right' },
            ],
            rows: [
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
          },
          {
            kind: 'checks',
            checks: [
              {
                name: 'span error',
                status: a.ok ? 'pass' : 'fail',
                detail: `${a.spanErrorFraction >= 0 ? '+' : ''}${formatPercent(a.spanErrorFraction)}; span factor k = ${a.factor.toFixed(6)}${a.factorStandardUncertainty === undefined ? '' : ` (standard uncertainty ${formatNumber(a.factorStandardUncertainty, 2)})`}${a.issues.length > 0 ? `: ${a.issues.join(' ')}` : ''}`,
              },
            ],
          },
          { kind: 'plots', plots: [plot] },
        ],
      },
    ],
    generator: options.generator,
  });
}
