import type { ChannelBudget, ChannelSpec } from '@bridgework/channel';
import { formatNumber } from './formatNumber.js';

const sig = (x: number): string =>
  formatNumber(x, 4)
    .replace(/(\.\d*?)0+$/, '$1')
    .replace(/\.$/, '');

function sensorText(spec: ChannelSpec): string {
  const s = spec.sensor;
  const arrangement = spec.bridge?.arrangement ?? 'quarter';
  switch (s.kind) {
    case 'strain-gauge':
      return `${arrangement} bridge of ${sig(s.gaugeOhms ?? 350)} Ω strain gauges, gauge factor ${sig(s.gaugeFactor)}`;
    case 'transducer':
      return `bridge transducer, capacity ${sig(s.capacity)} ${s.capacityUnit ?? (spec.output.quantity === 'mass' ? 'kilogram' : 'newton')}, rated output ${sig(s.ratedOutputVoltsPerVolt * 1e3)} mV/V`;
    case 'rtd':
      return `platinum RTD, R0 ${sig(s.r0Ohms ?? 100)} Ω${s.toleranceClass === undefined ? '' : ` (IEC 60751 class ${s.toleranceClass})`}, in a quarter bridge`;
  }
}

function wiringText(spec: ChannelSpec, budget: ChannelBudget): string {
  const leads = budget.lines.find((l) => l.kind === 'leads' && l.inputs['wiring'] !== undefined);
  const wiring = spec.bridge?.wiring ?? (leads?.inputs['wiring'] as string | undefined);
  const cable = spec.bridge?.cable;
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
 * @param spec - The validated spec.
 * @param budget - Its budget (for the lead resistance computed from a cable).
 * @returns The two lines, without line ends.
 */
export function describeChannel(spec: ChannelSpec, budget: ChannelBudget): readonly [string, string] {
  const wiring = wiringText(spec, budget);
  const adc = spec.adc;
  const front = [
    `${sig(spec.excitation.volts)} V excitation${spec.excitation.remoteSense === true ? ' with remote sense' : ''}`,
    `gain ${sig(spec.amplifier?.gain ?? 1)}`,
    `${adc.bits}-bit ${adc.ratiometric === true ? 'ratiometric ' : ''}converter at ${sig(adc.dataRateHertz ?? 10)} Hz (${adc.filter ?? 'sinc3'})`,
  ];
  if (spec.zero !== undefined) front.push(`zero reading at code ${String(spec.zero.code).replace('-', '−')}`);
  return [`${sensorText(spec)}${wiring === '' ? '' : `; ${wiring}`}`, front.join(', ')];
}
