import type { OutputSpec } from '../spec/ChannelSpec.js';

/** The unit of each output quantity, as reports show it. */
export const outputUnits: Readonly<Record<OutputSpec['quantity'], string>> = {
  strain: 'm/m',
  microstrain: 'µε',
  stress: 'Pa',
  force: 'N',
  mass: 'kg',
  temperature: '°C',
  ratio: 'V/V',
};
