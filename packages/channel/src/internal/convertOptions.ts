/**
 * The checks of conversion options, at the channel's call sites (the kernels and their argument
 * reader live in convert/).
 */
import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkOneOf,
  checkOptions,
  formatValue,
} from '@bridgework/core';

/** The most rejected-sample indices a conversion records (4 MB of Int32). */
export const MAX_LOCATIONS = 1_048_576;

/** Checks the options of `convert` (and of the interleaved converter when `interleaved`). */
export function checkConvertOptions(options: unknown, interleaved = false): Record<string, unknown> {
  if (options === undefined) return {};
  const known = interleaved
    ? ['temperaturesCelsius', 'onInvalid', 'maxLocations']
    : ['temperatureCelsius', 'onInvalid', 'maxLocations'];
  const o = checkOptions('options', options, { known });
  if (o['onInvalid'] !== undefined) checkOneOf('options.onInvalid', o['onInvalid'], ['nan', 'throw']);
  if (o['maxLocations'] !== undefined)
    checkInteger('options.maxLocations', o['maxLocations'], { min: 0, max: MAX_LOCATIONS });
  if (o['temperatureCelsius'] !== undefined)
    checkFinite('options.temperatureCelsius', o['temperatureCelsius']);
  const ts = o['temperaturesCelsius'];
  if (ts !== undefined) {
    if (!Array.isArray(ts)) {
      throw new BridgeworkError(
        'wrong-type',
        `\`options.temperaturesCelsius\` must be an array (one temperature or undefined per channel); got ${formatValue(ts)}`,
        {
          param: 'options.temperaturesCelsius',
          value: ts,
        },
      );
    }
    ts.forEach((t: unknown, i) => {
      if (t !== undefined) checkFinite(`options.temperaturesCelsius[${i}]`, t);
    });
  }
  return o;
}
