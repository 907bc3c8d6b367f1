import { formatQuantity, parseQuantity, type Channel, type ChannelBudget } from '@bridgework/channel';

/** A figure with its unit as the channel package writes it, with a true minus sign. */
const q = (value: number, unit: string): string => formatQuantity(value, unit).replace(/-/g, '−');

/** The wiring as written in the spec, the cable, and the lead resistance the budget used. */
function wiringText(channel: Channel, budget: ChannelBudget): string {
  const { wiring, cable } = channel.spec.bridge;
  const parts: string[] = [];
  if (wiring !== undefined) parts.push(wiring);
  if (cable !== undefined) {
    const size =
      cable.awg !== undefined
        ? `AWG ${cable.awg}`
        : `${q(parseQuantity(`${cable.diameterMeters as number} m`, 'mm'), 'mm')}`;
    parts.push(`${q(cable.lengthMeters, 'm')} of ${size} cable`);
  }
  const leads = budget.lines.find((l) => l.kind === 'leads' && typeof l.inputs['ohmsPerLead'] === 'number');
  const ohms = leads?.inputs['ohmsPerLead'];
  if (typeof ohms === 'number' && ohms > 0) parts.push(`${q(ohms, 'Ω')} per lead`);
  return parts.join(', ');
}

/**
 * A channel's hardware in two short lines of words: the channel's own description of its sensor
 * and bridge (`Channel.description`, written by its sensor kind) with the wiring and cable; then
 * excitation, amplifier and converter (and the zero reading, when there is one), as the spec
 * states them.
 *
 * @param channel - The channel.
 * @param budget - Its budget (for the lead resistance it used, computed from a cable).
 * @returns The two lines, without line ends.
 */
export function describeChannel(channel: Channel, budget: ChannelBudget): readonly [string, string] {
  const spec = channel.spec;
  const wiring = wiringText(channel, budget);
  const adc = spec.adc;
  const front = [
    `${q(spec.excitation.volts, 'V')} excitation${spec.excitation.remoteSense === true ? ' with remote sense' : ''}`,
    `gain ${q(spec.amplifier.gain, '')}`,
    `${adc.bits}-bit ${adc.ratiometric ? 'ratiometric ' : ''}converter at ${q(adc.filter.dataRateHertz, 'Hz')} (sinc${adc.filter.order})`,
  ];
  if (spec.zero !== undefined) front.push(`zero reading at code ${q(spec.zero.code, '')}`);
  return [`${channel.description}${wiring === '' ? '' : `; ${wiring}`}`, front.join(', ')];
}
