import {
  BridgeworkError,
  OHMS_LIMITS,
  ZERO_CELSIUS_KELVIN,
  checkFiniteResult,
  checkOhms,
  checkOptions,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { checkInterval } from './interval.js';

/** Checks an optional `rangeCelsius` option (above absolute zero). */
export function checkOptionalRange(value: unknown): readonly [number, number] | undefined {
  if (value === undefined) return undefined;
  const range = checkInterval('rangeCelsius', value);
  if (!(range[0] > -ZERO_CELSIUS_KELVIN)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`rangeCelsius\` must lie above −273.15 °C; got [${range[0]}, ${range[1]}]`,
      {
        param: 'rangeCelsius',
        value,
      },
    );
  }
  return range;
}

/** Checks a temperature: above absolute zero and inside the range when one is set. */
export function checkTemperature(
  value: unknown,
  range: readonly [number, number] | undefined,
  param = 'temperatureCelsius',
): number {
  if (range !== undefined) return checkRange(param, value, { min: range[0], max: range[1] });
  return checkRange(param, value, { min: -ZERO_CELSIUS_KELVIN, minExclusive: true });
}

/** The `out-of-range` error of a temperature at which the model's resistance leaves `OHMS_LIMITS`. */
export function beyondOhms(temperatureCelsius: number, ohms: number, domain: string): BridgeworkError {
  return new BridgeworkError(
    'out-of-range',
    `\`temperatureCelsius\` must be one at which the model's resistance lies within [${OHMS_LIMITS.min}, ${OHMS_LIMITS.max}] Ω${domain}; got ${formatValue(temperatureCelsius)} (${formatValue(ohms)} Ω)`,
    { param: 'temperatureCelsius', value: temperatureCelsius, limit: [OHMS_LIMITS.min, OHMS_LIMITS.max] },
  );
}

/** Checks that a computed temperature lies inside the range (when one is set); returns it. */
export function checkComputedTemperature(
  ohms: number,
  temperatureCelsius: number,
  range: readonly [number, number] | undefined,
): number {
  if (range !== undefined && !(temperatureCelsius >= range[0] && temperatureCelsius <= range[1])) {
    throw new BridgeworkError(
      'out-of-range',
      `\`ohms\` must correspond to a temperature in [${range[0]}, ${range[1]}] °C; got ${formatValue(ohms)} Ω (${temperatureCelsius} °C)`,
      { param: 'ohms', value: ohms, limit: [range[0], range[1]] },
    );
  }
  return checkFiniteResult(temperatureCelsius, { what: 'the temperature', param: 'ohms', value: ohms });
}

/** The `no-solution` error of a resistance the model cannot reach at any positive temperature. */
export function unreachableOhms(ohms: number, why: string): BridgeworkError {
  return new BridgeworkError(
    'no-solution',
    `\`ohms\` must be reachable by the model (${why}); got ${formatValue(ohms)}`,
    {
      param: 'ohms',
      value: ohms,
    },
  );
}

/** Checks a list of thermistor points (count, numbers) and returns them as ln R and 1/T. */
export function checkPoints(value: unknown, count: number): { u: number[]; y: number[] } {
  if (!Array.isArray(value)) {
    throw new BridgeworkError(
      'wrong-type',
      `\`points\` must be an array of { ohms, temperatureCelsius }; got ${formatValue(value)}`,
      {
        param: 'points',
        value,
      },
    );
  }
  if (value.length < count) {
    throw new BridgeworkError('too-few-points', `\`points\` must hold ${count} points; got ${value.length}`, {
      param: 'points',
      value,
      limit: count,
    });
  }
  if (value.length > count) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`points\` must hold exactly ${count} points; got ${value.length}`,
      {
        param: 'points',
        value,
        limit: count,
      },
    );
  }
  const u: number[] = [];
  const y: number[] = [];
  value.forEach((point: unknown, i) => {
    const p = checkOptions(`points[${i}]`, point, {
      known: ['ohms', 'temperatureCelsius'],
      required: ['ohms', 'temperatureCelsius'],
    });
    u.push(Math.log(checkOhms(`points[${i}].ohms`, p['ohms'])));
    const t = checkRange(`points[${i}].temperatureCelsius`, p['temperatureCelsius'], {
      min: -ZERO_CELSIUS_KELVIN,
      minExclusive: true,
    });
    y.push(1 / (t + ZERO_CELSIUS_KELVIN));
  });
  return { u, y };
}
