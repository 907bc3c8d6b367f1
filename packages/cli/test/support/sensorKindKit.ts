/**
 * TEST ONLY: the channel package's kit with one more sensor kind, for the test that runs every
 * command on a kind the command cannot know by name. The kind is the channel package's test kind
 * (an invented resistive film, R = R0·(1 + k·ε), in arm 1 of a quarter bridge; written against
 * the `SensorKind` contract only), with a plausible range of its own for its sensitivity. The
 * channel package exports neither the kit nor the contract publicly yet: both are imported from
 * its sources.
 */
import { createChannelKit } from '../../../channel/src/channelKit.js';
import { builtInSensorKinds } from '../../../channel/src/kinds/registry.js';
import { fakeKind } from '../../../channel/test/support/fakeKind.js';

/** The invented kind, with its sensitivity's usual range (1 … 10) checked by the budget. */
const filmKind: typeof fakeKind = {
  ...fakeKind,
  budget: {
    ...fakeKind.budget!,
    plausibleRanges: (s) => [
      { path: 'sensor.sensitivity', value: s.sensitivity, range: { min: 1, max: 10 }, unit: '' },
    ],
  },
};

/** The built-in kinds and the invented one: validation and creation as the command uses them. */
export const filmKit = createChannelKit({ sensorKinds: [...builtInSensorKinds, filmKind] });
