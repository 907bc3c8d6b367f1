import { createChannelKit } from '../channelKit.js';
import { builtInSensorKinds } from '../kinds/registry.js';

/** The kit of the built-in sensor kinds: the package's validateChannelSpec, createChannel and spec reference. */
export const defaultKit = createChannelKit({ sensorKinds: builtInSensorKinds });
