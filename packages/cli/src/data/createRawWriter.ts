import { checkOneOf } from '@bridgework/core';
import { float32Overflow } from './clipCounter.js';
import type { ConvertedBlock, RecordingWriter } from './pipelineTypes.js';
import { createWriteQueue, type OutputSink } from './outputSink.js';
import { rawOutputFormats, type RawOutputFormat } from './outputFormats.js';

const littleEndianHost = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/**
 * A writer of raw IEEE 754 values: frame after frame, one value per channel in channel order
 * (the input's interleaving), nothing else (no header, no time column).
 *
 * @remarks
 * Each block's lanes are interleaved into one of two output buffers of `blockFrames × channels`
 * values, whose write is queued: the next block is converted and interleaved into the other buffer
 * while this one is written (a buffer is reused only once its write has finished). float64 keeps
 * every value exactly; float32 rounds each to the nearest float32 (ties to even, as a
 * `Float32Array` store does: a relative error of at most 2^-24, about 6e-8, for values of float32's
 * normal range), NaN stays NaN, and a value beyond float32's range (one that rounds to 2^128 or more in
 * magnitude) is
 * refused (`out-of-range`), never written as ±∞. The
 * byte order is the format's (`le`: least significant byte first); on a host of that order the
 * values are written as they lie in memory. The pipeline may instead fill the two buffers itself,
 * frame after frame (`frames`: no lanes and no interleaving pass; see
 * {@link RecordingWriter.frames}). Memory: the two buffers.
 *
 * @param sink - Where the bytes go.
 * @param format - The value type and byte order.
 * @param channels - Values per frame.
 * @param blockFrames - Frames of the largest block.
 * @returns The writer.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown format; from
 * writing, `out-of-range` (param `--to`) for a value beyond float32's range.
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
  const queue = createWriteQueue(sink);
  const make = (): Float64Array | Float32Array =>
    wide ? new Float64Array(blockFrames * channels) : new Float32Array(blockFrames * channels);
  const outs = [make(), make()];
  const written: Promise<void>[] = [Promise.resolve(), Promise.resolve()];
  let slot = 0;
  /** Puts the first `count` values of `out` in the format's byte order, and queues them. */
  const queueValues = (out: Float64Array | Float32Array, count: number): Promise<void> => {
    if (little !== littleEndianHost) {
      const view = new DataView(out.buffer, out.byteOffset);
      if (wide) for (let i = 0; i < count; i++) view.setFloat64(8 * i, out[i] as number, little);
      else for (let i = 0; i < count; i++) view.setFloat32(4 * i, out[i] as number, little);
    }
    const written = queue.write(new Uint8Array(out.buffer, out.byteOffset, count * (wide ? 8 : 4)));
    written.catch(() => undefined); // met when the buffer is asked for again, or at finish
    return written;
  };
  return {
    frames: {
      type: wide ? 'float64' : 'float32',
      async next() {
        await written[slot];
        return outs[slot] as Float64Array | Float32Array;
      },
      write(buffer, count) {
        if (buffer !== outs[slot]) throw new Error('createRawWriter: write a buffer from next(), in turn');
        written[slot] = queueValues(buffer, count);
        slot ^= 1;
      },
      writeValues(values, count) {
        return queueValues(values, count);
      },
    },
    async writeBlock(block) {
      const { values, laneStride, frames } = block;
      if (channels === 1 && wide && little === littleEndianHost) {
        // The lane is the output: write it as it lies (and wait, the block's memory is the caller's).
        await queue.write(new Uint8Array(values.buffer, values.byteOffset, frames * 8));
        return;
      }
      await written[slot];
      const out = outs[slot] as Float64Array | Float32Array;
      interleave(values, laneStride, frames, channels, out);
      if (!wide) checkFloat32(block, channels, out as Float32Array);
      written[slot] = queueValues(out, frames * channels);
      slot ^= 1;
    },
    async finish() {
      await queue.flush();
    },
  };
}

/** Frame by frame: sequential writes, one sequential read stream per lane. */
function interleave(
  values: Float64Array,
  laneStride: number,
  frames: number,
  channels: number,
  out: Float64Array | Float32Array,
): void {
  if (channels === 8) {
    // The common logger width, unrolled.
    for (let f = 0, o = 0; f < frames; f++, o += 8) {
      out[o] = values[f] as number;
      out[o + 1] = values[f + laneStride] as number;
      out[o + 2] = values[f + 2 * laneStride] as number;
      out[o + 3] = values[f + 3 * laneStride] as number;
      out[o + 4] = values[f + 4 * laneStride] as number;
      out[o + 5] = values[f + 5 * laneStride] as number;
      out[o + 6] = values[f + 6 * laneStride] as number;
      out[o + 7] = values[f + 7 * laneStride] as number;
    }
    return;
  }
  for (let f = 0, o = 0; f < frames; f++) {
    for (let j = 0, i = f; j < channels; j++, i += laneStride) out[o++] = values[i] as number;
  }
}

/**
 * Refuses a block whose float32 frames hold ±∞ where its lanes held a finite value (beyond
 * float32's range): the frames may hold no more non-finite values than the block's flagged samples.
 */
function checkFloat32(block: ConvertedBlock, channels: number, out: Float32Array): void {
  const count = block.frames * channels;
  let flagged = 0;
  for (let i = 0; i < count; i++) {
    const s = out[i] as number;
    if (s - s !== 0) flagged++;
  }
  let expected = 0;
  for (const r of block.rejected) expected += r;
  if (flagged === expected) return;
  for (let i = 0; i < count; i++) {
    const s = out[i] as number;
    if (s === Infinity || s === -Infinity) {
      const channel = i % channels;
      const frame = (i - channel) / channels;
      throw float32Overflow(
        channel,
        block.firstFrame + frame,
        block.values[channel * block.laneStride + frame] as number,
      );
    }
  }
}
