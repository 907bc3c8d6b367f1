import type { ChannelBudgetLine } from '@bridgework/channel';
import type { ChannelDesign } from './designReport.js';
import { formatNumber } from './formatNumber.js';

/**
 * Figures smaller than this fraction of the span's width are numerical dust: the rounding left by
 * double-precision arithmetic (about 1e-16 of the values involved) in a difference that is zero
 * in exact arithmetic, such as the lead desensitization of six-wire sensing or the nonlinearity of
 * a linear map. Reports show them as `< limit` and draw no curve of them. A real effect this
 * small would be far below one code of a 32-bit converter (2.3e-10 of its full scale).
 */
export const DUST_FRACTION = 1e-12;

/** The dust limit of a channel, in its display unit: `DUST_FRACTION` × the span's width. */
export function dustLimit(c: ChannelDesign): number {
  const { span } = c.budget;
  return DUST_FRACTION * Math.abs(span.max - span.min) * c.display.factor;
}

/**
 * A figure in the display unit for people: three significant digits, or `< limit` for a non-zero
 * figure below the channel's dust limit (zero stays `0`).
 *
 * @param c - The channel.
 * @param value - The figure in the channel's unit.
 * @returns The text.
 */
export function shownFigure(c: ChannelDesign, value: number): string {
  const v = value * c.display.factor;
  const limit = dustLimit(c);
  if (v !== 0 && Math.abs(v) < limit) return `< ${formatNumber(limit, 2)}`;
  return formatNumber(v);
}

/** True when every value is below the channel's dust limit (in the channel's unit). */
export function allDust(c: ChannelDesign, values: ArrayLike<number>): boolean {
  const limit = dustLimit(c) / c.display.factor;
  for (let i = 0; i < values.length; i++) if (Math.abs(values[i] as number) >= limit) return false;
  return true;
}

/**
 * A budget line's name as a report shows it, saying what its figure is where that is not the
 * effect at the budget point: the resolution line is one code, the nonlinearity line the largest
 * deviation over the span.
 */
export function budgetLineName(line: ChannelBudgetLine): string {
  if (line.kind === 'resolution') return `${line.name} (one code)`;
  if (line.kind === 'nonlinearity') return `${line.name} (largest over the span)`;
  return line.name;
}

/**
 * What the gauge power figure is: the power in the hottest bridge arm that holds a gauge (or the
 * RTD), which includes the arm's lead wire when the channel has lead resistance.
 */
export function gaugePowerLabel(c: ChannelDesign): string {
  const leads = c.budget.lines.some(
    (l) => l.kind === 'leads' && typeof l.inputs['ohmsPerLead'] === 'number' && l.inputs['ohmsPerLead'] > 0,
  );
  const sensor = c.loaded.spec.sensor.kind === 'rtd' ? 'the RTD' : 'a gauge';
  return leads
    ? `largest power in one bridge arm holding ${sensor}, with its lead wire`
    : `largest power in one bridge arm holding ${sensor}`;
}

/**
 * The two resolution figures over the converter's full scale, named by what they are, with their
 * formulas: FSR is the converter's full-scale range and σ the total rms noise at its input.
 */
export const resolutionFormulas = {
  /** IEEE Std 1241's effective number of bits. */
  rms: {
    name: 'rms-based resolution',
    formula: 'log2(FSR / (√12·σ))',
    alias: 'effective number of bits, IEEE 1241',
  },
  /** The noise-free bits of converter data sheets (6.6·σ: the peak-to-peak span of 99.9 % of normal noise). */
  peakToPeak: {
    name: 'peak-to-peak-based resolution',
    formula: 'log2(FSR / (6.6·σ))',
    alias: 'noise-free bits',
  },
  where: "FSR is the converter's full-scale range and σ the total rms noise at its input",
} as const;
