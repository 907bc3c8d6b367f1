import { BridgeworkError } from '@bridgework/core';
import type { Channel, CodeBuffer, ConversionTransformer } from './Channel.js';
import { convertInterleavedLinearFractional } from './convert/kernel.js';
import {
  newTally,
  readConversionArguments,
  statusOf,
  throwIfRejected,
  type ConversionStatus,
  type ConvertOptions,
} from './convert/ConversionStatus.js';
import { checkConvertOptions } from './internal/convertOptions.js';
import { channelInternals, convertLane } from './internal/makeChannel.js';

/** Options of an interleaved conversion: as for one channel, with one temperature per channel. */
export interface InterleavedConvertOptions extends Omit<ConvertOptions, 'temperatureCelsius'> {
  /** Sensor temperature of each channel for this block, °C (`undefined` entries keep the channel's). */
  readonly temperaturesCelsius?: readonly (number | undefined)[];
}

/** The result of converting an interleaved buffer. */
export interface InterleavedConversionResult {
  /** Quantities, interleaved like the input (frame-major: sample k of channel j at k·N + j). */
  readonly values: Float64Array;
  /** One status per channel, in the channels' order. */
  readonly statuses: readonly ConversionStatus[];
}

/** Converts buffers that interleave N channels (see {@link createInterleavedConverter}). */
export interface InterleavedConverter {
  /** The channels, in buffer order. */
  readonly channels: readonly Channel[];
  /**
   * Converts a buffer of whole frames (N codes per frame).
   *
   * @param codes - Interleaved codes; the length must be a multiple of the channel count.
   * @param out - Output buffer of at least `codes.length` (default: a new one).
   * @param options - Per-channel temperatures, invalid-code policy, locations recorded.
   * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for a partial frame or a short `out`;
   *   `clipped` under the 'throw' policy.
   */
  convert(
    codes: CodeBuffer,
    out?: Float64Array,
    options?: InterleavedConvertOptions,
  ): InterleavedConversionResult;
  /**
   * A transformer for `new TransformStream(...)` converting each chunk of whole frames.
   *
   * @param options - As for `convert`, applied to every chunk (checked now).
   */
  transformer(options?: InterleavedConvertOptions): ConversionTransformer<InterleavedConversionResult>;
}

/**
 * Creates a converter for buffers that interleave several channels (one code per channel per
 * frame, frame after frame), as multi-channel converters and recorders deliver them.
 *
 * @remarks
 * Each channel's lane is converted with that channel's own kernel (stride N), so the result
 * equals converting each channel's codes separately, bit for bit. No allocation per sample.
 *
 * @param channels - The channels in buffer order (at least one), each made by `createChannel`.
 * @returns The converter.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for an empty list; `wrong-type` for a
 *   channel not made by `createChannel` (naming it, `channels[2]`).
 * @example
 * ```ts
 * const converter = createInterleavedConverter([hangerA, hangerB]);
 * const { values, statuses } = converter.convert(new Int32Array([120, -40, 121, -41]));
 * ```
 */
export function createInterleavedConverter(channels: readonly Channel[]): InterleavedConverter {
  if (!Array.isArray(channels) || channels.length === 0) {
    throw new BridgeworkError('invalid-shape', '`channels` must be a non-empty array of channels', {
      param: 'channels',
    });
  }
  const parts = channels.map((c, j) => channelInternals(c, `channels[${j}]`));
  const n = channels.length;
  const checkInterleavedOptions = (options: unknown) => {
    const o = checkConvertOptions(options, true);
    const ts = o['temperaturesCelsius'] as readonly unknown[] | undefined;
    if (ts !== undefined && ts.length > n) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`options.temperaturesCelsius\` must hold at most one temperature per channel (${n}); got ${ts.length}`,
        {
          param: 'options.temperaturesCelsius',
          limit: n,
        },
      );
    }
    return o;
  };

  function convert(
    codes: CodeBuffer,
    out?: Float64Array,
    options?: InterleavedConvertOptions,
  ): InterleavedConversionResult {
    const opts = checkInterleavedOptions(options);
    const { values, maxLocations } = readConversionArguments(codes, out, opts);
    if (codes.length % n !== 0) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`codes\` must hold whole frames of ${n} codes; got ${codes.length}`,
        {
          param: 'codes',
          limit: n,
        },
      );
    }
    const frames = codes.length / n;
    const temperatures = opts['temperaturesCelsius'] as readonly (number | undefined)[] | undefined;
    const mappings = parts.map((part, j) => part.mappingAt(temperatures?.[j]));
    const tallies = mappings.map((m) => newTally(maxLocations, m.model.adc.codeMin, m.model.adc.codeMax));
    const kernels = mappings.map((m) => m.kernel ?? m.partialKernel);
    let methods: ('kernel' | 'exact')[];
    if (kernels.every((k) => k !== undefined)) {
      // Every lane has a Möbius kernel (a partial one takes its edge codes per sample): one pass.
      convertInterleavedLinearFractional(codes, values, kernels, tallies, frames);
      methods = kernels.map(() => 'kernel');
    } else {
      methods = mappings.map((m, j) => convertLane(m, codes, values, tallies[j]!, j, n, frames));
    }
    const statuses = mappings.map((_, j) => statusOf(tallies[j]!, frames, methods[j]!));
    if (opts['onInvalid'] === 'throw') statuses.forEach((s, j) => throwIfRejected(s, channels[j]!.name));
    return { values, statuses };
  }

  return {
    channels,
    convert,
    transformer(options?: InterleavedConvertOptions) {
      checkInterleavedOptions(options);
      return {
        transform(chunk, controller) {
          controller.enqueue(convert(chunk, undefined, options));
        },
      };
    },
  };
}
