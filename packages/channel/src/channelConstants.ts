import type { Channel } from './Channel.js';
import {
  createChannelConstants,
  type ChannelConstants,
  type ConstantsOptions,
} from './constants/createChannelConstants.js';
import { channelInternals } from './internal/makeChannel.js';

/**
 * Firmware constants for a channel's map: fixed-point and float maps with proved bounds, from
 * the firmware package, verified against the channel's exact map.
 *
 * @remarks
 * A separate function (not a method of the channel), so an application that only converts does
 * not carry the firmware package and decimal.js. See docs/channel.md for what the constants are.
 *
 * @param channel - A channel made by `createChannel`.
 * @param options - Word sizes, rounding, polynomial degree, verification mode.
 * @returns The constants.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` (not a channel), `out-of-range` (a span of fewer than two codes), and the firmware package's errors.
 * @example
 * ```ts
 * const constants = channelConstants(channel, { verification: 'sampled' });
 * emitCHeader({ channels: [constants.firmwareChannel] });
 * ```
 */
export function channelConstants(channel: Channel, options?: ConstantsOptions): ChannelConstants {
  const { prepared } = channelInternals(channel);
  return createChannelConstants(prepared.resolved, prepared.nominal, prepared.span, options);
}
