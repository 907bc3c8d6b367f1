import { SAFETY_CAUTION } from '../caution.js';
import { wrapText } from '../internal/wrapText.js';
import type { DisplayUnit } from '../report/displayUnit.js';
import { formatNumber, formatProbability, formatStated } from '../report/formatNumber.js';
import { formatTable } from '../terminal/formatTable.js';
import type { TextStyle } from '../terminal/textStyle.js';
import type { BatchedMonteCarloResult } from './batchedMonteCarlo.js';

/** One channel's Monte Carlo run, for the text and JSON outputs. */
export interface ChannelUncertainty {
  /** The channel's name. */
  readonly name: string;
  /** Its quantity (`'force'`). */
  readonly quantity: string;
  /** Its own unit (`'N'`). */
  readonly unit: string;
  /** The unit people read it in. */
  readonly display: DisplayUnit;
  /** The run. */
  readonly result: BatchedMonteCarloResult;
}

/** Decimals that show a value to the resolution of its uncertainty's third significant digit. */
function decimalsFor(u: number): number {
  if (!(u > 0)) return 3;
  return Math.min(12, Math.max(0, 2 - Math.floor(Math.log10(u))));
}

function fixed(x: number, decimals: number): string {
  return x.toFixed(decimals).replace(/^-/, '−');
}

function channelText(c: ChannelUncertainty, style: TextStyle): string {
  const { result, display } = c;
  const f = display.factor;
  const u = display.unit;
  const gum = result.budget.combined;
  const d = decimalsFor(Math.min(result.standardUncertainty, gum.standardUncertainty) * f);
  const at = `${formatStated(result.budget.at * f)} ${u}`;
  const p = formatProbability(result.coverage);
  const rows = [
    [
      'Monte Carlo (JCGM 101), symmetric',
      fixed(result.value * f, d),
      formatNumber(result.standardUncertainty * f),
      fixed(result.interval.min * f, d),
      fixed(result.interval.max * f, d),
    ],
    [
      'Monte Carlo (JCGM 101), shortest',
      '',
      '',
      fixed(result.shortestInterval.min * f, d),
      fixed(result.shortestInterval.max * f, d),
    ],
    [
      `GUM (JCGM 100), k = ${formatNumber(gum.coverageFactor)}`,
      fixed(gum.value * f, d),
      formatNumber(gum.standardUncertainty * f),
      fixed(gum.interval.min * f, d),
      fixed(gum.interval.max * f, d),
    ],
  ];
  const table = formatTable(
    [
      { header: 'method' },
      { header: `estimate (${u})`, align: 'right' },
      { header: `u (${u})`, align: 'right' },
      { header: `${p} interval from`, align: 'right' },
      { header: 'to', align: 'right' },
    ],
    rows,
  );
  const v = result.gumValidation;
  const verdict = v.validated
    ? style.green('the GUM interval is validated')
    : style.yellow('the GUM interval is not validated: use the Monte Carlo interval');
  const comparison =
    `JCGM 101 clause 8: |y − U − y_low| = ${formatNumber(v.dLow * f)} ${u} and |y + U − y_high| = ` +
    `${formatNumber(v.dHigh * f)} ${u} against δ = ${formatNumber(v.tolerance * f)} ${u} (u(y) to ` +
    `${v.significantDigits} significant digits): ${verdict}.`;
  return [
    `${style.bold(c.name)}: ${c.quantity} at ${at}`,
    ...table
      .trimEnd()
      .split('\n')
      .map((l) => `  ${l}`),
    ...wrapText(comparison, 98, '  '),
  ].join('\n');
}

/**
 * The text output of `bridgework uncertainty`: what was run (trials, batches, seed), then per
 * channel the Monte Carlo estimate, standard uncertainty and both coverage intervals beside the
 * GUM result, and the JCGM 101 clause 8 comparison; then the safety caution.
 *
 * @param file - The channel file, as given.
 * @param channels - The runs.
 * @param style - Colours.
 * @returns The text, ending with a newline.
 */
export function formatUncertainty(
  file: string,
  channels: readonly ChannelUncertainty[],
  style: TextStyle,
): string {
  const first = channels[0]?.result;
  const head = [
    style.bold(`Monte Carlo uncertainty (JCGM 101): ${file}`),
    ...wrapText(
      first === undefined
        ? ''
        : `${first.trials} trials per channel in ${first.batches.length} batch${first.batches.length === 1 ? '' : 'es'}; ` +
            `seed ${first.seeds[0]} (batch i runs with seed + i·2³²): the same seed and trials give the same result. ` +
            'Each channel is evaluated at its budget point, with the distributions of its budget: the reading ' +
            '(normal, the noise) and every stated tolerance (rectangular).',
      100,
      '  ',
    ),
  ];
  return `${[head.join('\n'), ...channels.map((c) => channelText(c, style))].join('\n\n')}\n\n${wrapText(SAFETY_CAUTION, 100).join('\n')}\n`;
}

/**
 * The JSON payload of `bridgework uncertainty` (wrapped by `reportJson`): per channel, in the
 * channel's own unit, the Monte Carlo result, the GUM result and the clause 8 comparison.
 *
 * @param file - The channel file.
 * @param channels - The runs.
 * @returns The payload.
 */
export function uncertaintyPayload(
  file: string,
  channels: readonly ChannelUncertainty[],
): Record<string, unknown> {
  return {
    file,
    seedRule: 'batch i runs with seed + i * 2^32',
    channels: channels.map(({ name, quantity, unit, result }) => {
      const gum = result.budget.combined;
      return {
        name,
        quantity,
        unit,
        at: result.budget.at,
        coverage: result.coverage,
        trials: result.trials,
        batches: result.batches,
        seeds: result.seeds,
        monteCarlo: {
          value: result.value,
          standardUncertainty: result.standardUncertainty,
          interval: result.interval,
          shortestInterval: result.shortestInterval,
        },
        gum: {
          value: gum.value,
          standardUncertainty: gum.standardUncertainty,
          coverageFactor: gum.coverageFactor,
          expandedUncertainty: gum.expandedUncertainty,
          interval: gum.interval,
        },
        gumValidation: result.gumValidation,
      };
    }),
  };
}
