import type { SpecValidation, ValidateChannelSpecOptions } from './channelKit.js';
import { defaultKit as kit } from './internal/defaultKit.js';
import type { ValidChannelSpec } from './spec/ChannelSpec.js';

/** The outcome of {@link validateChannelSpec}. */
export type ChannelSpecValidation = SpecValidation<ValidChannelSpec>;

/**
 * Validates a channel spec once: every problem at once, each with its field path, its code and a
 * message in the user's terms; or the spec with every default applied.
 *
 * @remarks
 * Unknown fields are problems, with the closest known name suggested (a key named like an object
 * prototype member, such as `constructor`, is unknown like any other); numbers must be finite and
 * inside their documented ranges; quantities may be written with units (`'350 Ω'`, `'20 t'`,
 * `'2 mV/V'`: see docs/channel-file.md for every unit); the rules across fields are checked; and
 * the channel's model is built, so a span it cannot read is reported against `output.range` in
 * the channel's unit, with the limit and a way out ("lower amplifier.gain to 8 or narrow
 * output.range"). A message is final text: print `path: message`. Never throws for a bad spec.
 *
 * @param spec - The candidate spec (any value).
 * @param options - `path`: a prefix for every issue's path (`channels.hanger-3`).
 * @returns `{ ok: true, value }` (deeply frozen; `createChannel` takes it without checking it again) or `{ ok: false, issues }`.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `wrong-type` for bad `options`.
 * @example
 * ```ts
 * validateChannelSpec({ sensor: { kind: 'rtd' }, excitation: { volts: 0 }, adc: { bits: 24, referenceVolts: 1 }, output: { quantity: 'temperature' } }).issues;
 * // [{ code: 'not-positive', path: 'excitation.volts', message: 'must be > 0 V; got 0 V', expected: '> 0 V', limit: '0' }]
 * ```
 */
export function validateChannelSpec(
  spec: unknown,
  options?: ValidateChannelSpecOptions,
): ChannelSpecValidation {
  return kit.validateChannelSpec(spec, options) as ChannelSpecValidation;
}
