/**
 * The sensor kinds a channel knows, in one list: adding a kind is its module and one line here.
 */
import { rtdKind } from './rtd.js';
import { strainGaugeKind } from './strainGauge.js';
import { thermistorKind } from './thermistor.js';
import { transducerKind } from './transducer.js';

/** Every built-in sensor kind, in the order the field reference lists them. */
export const builtInSensorKinds = [strainGaugeKind, transducerKind, rtdKind, thermistorKind] as const;
