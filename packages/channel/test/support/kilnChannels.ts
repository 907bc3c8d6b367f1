import type { ChannelSpec } from '@bridgework/channel';

/**
 * A Pt100 in a three-wire quarter bridge on a 24-bit ratiometric converter (an invented kiln's
 * return-air probe): the RTD channel the curve-kernel and polynomial tests share.
 */
export const kilnPt100: ChannelSpec = {
  name: 'kiln return air',
  sensor: { kind: 'rtd', r0Ohms: 100 },
  bridge: { wiring: 'three-wire', ohmsPerLead: 0.4 },
  excitation: { volts: 1 },
  amplifier: { gain: 8 },
  adc: { bits: 24, referenceVolts: 1, ratiometric: true },
  output: { quantity: 'temperature' },
};
