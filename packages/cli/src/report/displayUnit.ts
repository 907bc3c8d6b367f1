import type { Channel } from '@bridgework/channel';

/** The unit a report shows a channel's quantity in: `shown = value × factor`. */
export interface DisplayUnit {
  /** The unit's symbol (`'µε'`, `'kN'`, `'mV/V'`). */
  readonly unit: string;
  /** Multiplier from the channel's own unit to the shown unit. */
  readonly factor: number;
}

/**
 * The unit in which people read a channel's quantity: strain in µε, bridge ratios in mV/V,
 * stress in MPa, large forces in kN (or MN), large masses in t; others as the channel has them.
 *
 * @remarks
 * Only reports for people use it (text and HTML); JSON, CSV and firmware constants keep the
 * channel's unit (see `Channel.unit`). The choice depends on the span's largest magnitude, so one
 * channel is shown in one unit throughout a report.
 *
 * @param channel - The channel.
 * @returns The shown unit and its factor.
 * @example
 * ```ts
 * displayUnit(strainChannel); // { unit: 'µε', factor: 1e6 }
 * ```
 */
export function displayUnit(channel: Pick<Channel, 'unit' | 'span'>): DisplayUnit {
  const largest = Math.max(Math.abs(channel.span.min), Math.abs(channel.span.max));
  switch (channel.unit) {
    case 'm/m':
      return { unit: 'µε', factor: 1e6 };
    case 'V/V':
      return { unit: 'mV/V', factor: 1e3 };
    case 'Pa':
      return largest >= 1e9 ? { unit: 'GPa', factor: 1e-9 } : { unit: 'MPa', factor: 1e-6 };
    case 'N':
      if (largest >= 1e7) return { unit: 'MN', factor: 1e-6 };
      return largest >= 1e4 ? { unit: 'kN', factor: 1e-3 } : { unit: 'N', factor: 1 };
    case 'kg':
      return largest >= 1e4 ? { unit: 't', factor: 1e-3 } : { unit: 'kg', factor: 1 };
    default:
      return { unit: channel.unit, factor: 1 };
  }
}
