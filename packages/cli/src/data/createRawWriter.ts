import { checkOneOf } from '@bridgework/core';
import type { RecordingWriter } from './convertRecording.js';
import type { OutputSink } from './outputSink.js';
import { rawOutputFormats, type RawOutputFormat } from './outputFormats.js';

const littleEndianHost = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/**
 * A writer of raw IEEE 754 values: frame after frame, one value per channel in channel order
 * (the input's interleaving), nothing else (no header, no time column).
 *
 * @remarks
 * Each block's lanes are interleaved into one reused buffer of `blockFrames × channels` values
 * and written in one call. float64 keeps every value exactly; float32 rounds each to the nearest
 * float32 (`Math.fround`, ties to even: a relative error of at most 2^-24, about 6e-8), NaN stays
 * NaN. The byte order is the format's (`le`: least significant byte first); on a host of that
 * order the values are written as they lie in memory.
 *
 * @param sink - Where the bytes go.
 * @param format - The value type and byte order.
 * @param channels - Values per frame.
 * @param blockFrames - Frames of the largest block.
 * @returns The writer.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown format.
 * @example
 * ```ts
 * const writer = createRawWriter(file, 'float32le', 8, 65_536);
 * ```
 */
export function createRawWriter(
  sink: OutputSink,
  format: RawOutputFormat,
  channels: number,
  blockFrames: number,
): RecordingWriter {
  checkOneOf('format', format, rawOutputFormats);
  const wide = format.startsWith('float64');
  const little = format.endsWith('le');
  const out = wide ? new Float64Array(blockFrames * channels) : new Float32Array(blockFrames * channels);
  const bytes = new Uint8Array(out.buffer);
  const view = new DataView(out.buffer);
  return {
    async writeBlock(block) {
      const { values, laneStride, frames } = block;
      if (channels === 1 && wide && little === littleEndianHost) {
        await sink.write(new Uint8Array(values.buffer, values.byteOffset, frames * 8));
        return;
      }
      // Frame by frame: sequential writes, one read stream per lane.
      for (let f = 0, o = 0; f < frames; f++) {
        for (let j = 0, i = f; j < channels; j++, i += laneStride) out[o++] = values[i] as number;
      }
      const count = frames * channels;
      if (little !== littleEndianHost) {
        if (wide) for (let i = 0; i < count; i++) view.setFloat64(8 * i, out[i] as number, little);
        else for (let i = 0; i < count; i++) view.setFloat32(4 * i, out[i] as number, little);
      }
      await sink.write(bytes.subarray(0, count * (wide ? 8 : 4)));
    },
    async finish() {},
  };
}
