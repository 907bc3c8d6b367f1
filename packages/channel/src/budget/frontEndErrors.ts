/**
 * Errors of the chain package's front-end budget restated against the channel-file field the user
 * can change (`filter.dataRateHertz` → `adc.filter.dataRateHertz`, `excitationVolts` →
 * `excitation.volts`).
 */
import { BridgeworkError, isBridgeworkError } from '@bridgework/core';

/** Exact parameter names of `resolutionBudget` and the channel field each comes from. */
const EXACT: Readonly<Record<string, string>> = {
  excitationVolts: 'excitation.volts',
  excitationLowVolts: 'amplifier.excitationLowVolts',
  temperatureCelsius: 'environment.temperatureCelsius',
  gain: 'amplifier.gain',
  lowHertz: 'amplifier.voltageCornerHertz',
};

/** Prefixes of `resolutionBudget`'s parameter paths and the channel section they come from. */
const PREFIXES: readonly (readonly [string, string])[] = [
  ['filter.', 'adc.filter.'],
  ['filter', 'adc.filter'],
  ['amplifier.', 'amplifier.'],
  ['adc.', 'adc.'],
  ['span', 'output.range'],
];

/** The channel field for a parameter of the chain package's `resolutionBudget`, or `undefined`. */
export function frontEndField(param: string | undefined): string | undefined {
  if (param === undefined) return undefined;
  const exact = EXACT[param];
  if (exact !== undefined) return exact;
  for (const [from, to] of PREFIXES) {
    if (param === from || (from.endsWith('.') && param.startsWith(from)))
      return to.endsWith('.') ? to + param.slice(from.length) : to;
  }
  if (param.startsWith('span.')) return 'output.range';
  return undefined;
}

/**
 * Runs `f` (a call of the chain package's front-end budget built from the channel's spec) and
 * restates a typed error's `param`, and the parameter named at the start of its message, as the
 * channel field it comes from.
 */
export function inChannelTerms<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    const field = frontEndField(e.param);
    if (field === undefined || field === e.param) throw e;
    const message = e.message.startsWith(`\`${e.param}\``)
      ? `\`${field}\`${e.message.slice(e.param!.length + 2)}`
      : `${field}: ${e.message}`;
    throw new BridgeworkError(e.code, message, {
      param: field,
      ...(e.value === undefined ? {} : { value: e.value }),
      ...(e.limit === undefined ? {} : { limit: e.limit }),
    });
  }
}
