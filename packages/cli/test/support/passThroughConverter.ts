/**
 * TEST ONLY. A stand-in for the channel package's interleaved converter, so that the streaming
 * machinery can be tested before that package exists. It is not a channel model and computes
 * nothing physical: each code becomes its own value as a double (exact for every int32), and,
 * when `railCodes` is given, codes at those values are flagged as clipped (NaN), the way the
 * channel's converter flags codes at the ADC rails.
 */
import type { InterleavedConverter } from '../../src/data/clipCounter.js';

export function passThroughConverter(railCodes: readonly number[] = []): InterleavedConverter {
  const rails = new Set(railCodes);
  return (codes, _channels, out) => {
    let clipped = 0;
    for (let i = 0; i < codes.length; i++) {
      const c = codes[i] as number;
      if (rails.has(c)) {
        out[i] = NaN;
        clipped++;
      } else {
        out[i] = c;
      }
    }
    return { clipped };
  };
}
