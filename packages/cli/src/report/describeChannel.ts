import type { Channel, ChannelBudget } from '@bridgework/channel';
import { formatNumber } from './formatNumber.js';

const sig = (x: number): string =>
  formatNumber(x, 4)
    .replace(/(\.\d*?)0+$/, '$1')
    .replace(/\.$/, '');

function wiringText(spec: Channel['spec'], budget: ChannelBudget): string {
  const leads = budget.lines.find((l) => l.kind === 'leads' && l.inputs['wiring'] !== undefined);
  const wiring = spec.bridge.wiring;
  const cable = spec.bridge.cable;
  void leads;
  const parts: string[] = [];
  if (wiring !== undefined) parts.push(wiring);
  if (cable !== undefined) {
    const size = cable.awg !== undefined ? `AWG ${cable.awg}` : `${sig(cable.diameterMeters! * 1e3)} mm`;
    parts.push(`${sig(cable.lengthMeters)} m of ${size} cable`);
  }
  const ohms = leads?.inputs['ohmsPerLead'];
  if (typeof ohms === 'number' && ohms > 0) parts.push(`${sig(ohms)} Ω per lead`);
  return parts.join(', ');
}

/**
 * A channel's hardware in two short lines of words: sensor and bridge, wiring and cable; then
 * excitation, amplifier and converter (and the zero reading, when there is one).
 *
 * @param channel - The channel (its sensor's description comes from its kind).
 * @param budget - Its budget (for the lead resistance computed from a cable).
 * @returns The two lines, without line ends.
 */
export function describeChannel(channel: Channel, budget: ChannelBudget): readonly [string, string] {
  const spec = channel.spec;
  const wiring = wiringText(spec, budget);
  const adc = spec.adc;
  const front = [
    `${sig(spec.excitation.volts)} V excitation${spec.excitation.remoteSense === true ? ' with remote sense' : ''}`,
    `gain ${sig(spec.amplifier.gain)}`,
    `${adc.bits}-bit ${adc.ratiometric ? 'ratiometric ' : ''}converter at ${sig(adc.filter.dataRateHertz)} Hz (sinc${adc.filter.order})`,
  ];
  if (spec.zero !== undefined) front.push(`zero reading at code ${String(spec.zero.code).replace('-', '−')}`);
  return [`${channel.description}${wiring === '' ? '' : `; ${wiring}`}`, front.join(', ')];
}
