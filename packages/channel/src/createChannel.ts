import type { Channel } from './Channel.js';
import { defaultKit } from './internal/defaultKit.js';
import type { ChannelSpec, ValidChannelSpec } from './spec/ChannelSpec.js';

/**
 * Creates one measurement channel: exact maps between converter codes and the measured quantity,
 * the readings a report needs, and fast batch conversion.
 *
 * @remarks
 * A spec from {@link validateChannelSpec} is taken as it is; anything else is validated first
 * (an invalid spec throws `invalid-spec` with every problem in `issues`). The map is composed
 * from the packages that own each stage, exactly: the converter's coding (chain `createAdc`),
 * the bridge with its leads and source resistance (bridge `createStrainBridge`, the two-reading
 * method for a zero reading), the sensor kind's own stages (compensation, calibration,
 * mechanics), and the output unit. Nothing is linearised. The channel's budget and firmware
 * constants are separate functions ({@link channelBudget}, {@link channelConstants}), so an
 * application that only converts does not carry them.
 *
 * When the map is a Möbius function of the code (every linear-fractional bridge, transducers),
 * `convert` uses one fitted Möbius kernel, checked against the exact map at 65 codes (within
 * 1e-12 of the largest value); RTDs and thermistors use a fitted Möbius map to the element's
 * resistance and the element's curve (`method: 'exact'`, `map.form: 'resistance-curve'`).
 *
 * @param spec - A channel spec (see {@link ChannelSpec}) or a validated one.
 * @returns The channel.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-spec` with every problem in `issues`.
 * @example
 * ```ts
 * const channel = createChannel({
 *   sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: '350 Ω' },
 *   bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
 *   excitation: { volts: 5 },
 *   amplifier: { gain: 128 },
 *   adc: { bits: 24, referenceVolts: 5, ratiometric: true },
 *   output: { quantity: 'strain', unit: 'µε' },
 * });
 * channel.quantityFromCode(563_000); // ≈ 1003 (µε)
 * ```
 */
export function createChannel(spec: ChannelSpec | ValidChannelSpec): Channel {
  return defaultKit.createChannel(spec);
}
