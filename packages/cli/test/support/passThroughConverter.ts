/**
 * TEST ONLY. A stand-in for a channel, so that the streaming machinery can be tested apart from
 * the channel package. It is not a channel model and computes nothing physical: each code becomes
 * its own value as a double (exact for every 32-bit code), and, when `railCodes` is given, codes at
 * those values are flagged (NaN), the way a channel flags codes at the converter rails. It records
 * the temperature of each call.
 */
import type { ConvertingChannel } from '../../src/data/convertRecording.js';

export interface PassThroughChannel extends ConvertingChannel {
  /** The `temperatureCelsius` of each call, in call order. */
  readonly temperatures: (number | undefined)[];
}

export function passThroughChannel(name = 'code', railCodes: readonly number[] = []): PassThroughChannel {
  const rails = new Set(railCodes);
  const temperatures: (number | undefined)[] = [];
  return {
    name,
    temperatures,
    convert(codes, out, options) {
      temperatures.push(options.temperatureCelsius);
      let rejected = 0;
      for (let i = 0; i < codes.length; i++) {
        const c = codes[i] as number;
        if (rails.has(c)) {
          out[i] = NaN;
          rejected++;
        } else {
          out[i] = c;
        }
      }
      return { status: { rejected } };
    },
  };
}
