import { BridgeworkError } from '@bridgework/core';
import { checkBlock } from '../internal/checkBlock.js';
import { openInput, statInput } from '../internal/fileErrors.js';
import type { CodeSource, FrameBlock, RecordingBlock } from './codeSource.js';
import {
  decodeFrames,
  decodeInterleaved,
  decodeTimeStamps,
  interleavedView,
  timeStampArray,
} from './decodeFrames.js';
import { checkRawLayout, fitsInt32, type RawLayout } from './recordingLayout.js';

/** Options of {@link openRawCodes}. */
export interface RawCodeOptions extends RawLayout {
  /** Frames per block (integer ≥ 1; at most 2^24 codes per block). Default 65 536. */
  readonly blockFrames?: number;
}

/**
 * Opens a raw recording (see {@link RawLayout}) for reading in fixed-size blocks of frames.
 *
 * @remarks
 * After the file header, the file must hold a whole number of frames: this is checked here, before
 * any output is written, and again while reading in case the file changed. Blocks are read ahead:
 * while one block is decoded and converted, the next is read into a second byte buffer. Each block
 * is decoded into one lane per channel (one loop per stored type); a time stamp in the frame
 * header is decoded into the block's `timeStamps`. `frames()` reads the same blocks with the codes
 * left interleaved: a view of the bytes read for int32le frames of codes only (no decoding at
 * all), else one sequential decoding pass. Memory: two byte buffers (`blockFrames × frameBytes`
 * each), the lanes or the interleaved codes (4 or 8 bytes per code, none for the view) and the
 * stamps, allocated once.
 *
 * @param file - The file path.
 * @param options - The layout and the block size.
 * @returns The opened source; read it with `blocks()`.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable file, with the
 * reason in words), `parse-error` (size not a whole number of frames), and the layout's checks
 * ({@link checkRawLayout}).
 * @example
 * ```ts
 * const source = await openRawCodes('rig.bin', { sample: 'int24be', channels: 8, frameHeaderBytes: 8, timeStamp: { type: 'uint64le' } });
 * for await (const block of source.blocks()) console.log(block.firstFrame, block.frames);
 * ```
 */
export async function openRawCodes(file: string, options: RawCodeOptions): Promise<CodeSource> {
  const { blockFrames: blockOption, ...layoutOptions } = options;
  const layout = checkRawLayout(layoutOptions);
  const { channels, frameBytes, fileHeaderBytes, timeStamp } = layout;
  const blockFrames = checkBlock(channels, blockOption);
  const totalBytes = await statInput(file);
  const dataBytes = totalBytes - fileHeaderBytes;
  const plural = channels === 1 ? '' : 's';
  if (dataBytes < 0 || dataBytes % frameBytes !== 0) {
    throw new BridgeworkError(
      'parse-error',
      `${file} holds ${totalBytes} bytes: after the file header of ${fileHeaderBytes} bytes that is not a whole number of frames of ${frameBytes} bytes (${layout.frameHeaderBytes} header + ${channels} channel${plural} × ${layout.sampleBytes} bytes ${layout.sample} + ${layout.frameTrailerBytes} trailer); check the channels, the sample type and the header sizes`,
      { param: file, value: totalBytes, limit: frameBytes },
    );
  }
  const geometry = { sample: layout.sample, channels, frameBytes, codeOffset: layout.frameHeaderBytes };
  return {
    file,
    format: layout.sample,
    channels,
    columnNames: undefined,
    timeColumn:
      timeStamp === undefined
        ? undefined
        : {
            name: 'time',
            type: timeStamp.type,
            ...(timeStamp.secondsPerTick === undefined ? {} : { secondsPerTick: timeStamp.secondsPerTick }),
          },
    passThroughNames: [],
    blockFrames,
    totalBytes,
    totalFrames: dataBytes / frameBytes,
    async *blocks() {
      const codes = fitsInt32(layout.sample)
        ? new Int32Array(blockFrames * channels)
        : new Float64Array(blockFrames * channels);
      const stamps = timeStamp === undefined ? undefined : timeStampArray(timeStamp.type, blockFrames);
      for await (const { bytes, frames, firstFrame, bytesRead } of readBlocks(file, layout, blockFrames)) {
        decodeFrames(bytes, frames, geometry, codes, blockFrames);
        if (stamps !== undefined && timeStamp !== undefined) {
          decodeTimeStamps(bytes, frames, frameBytes, timeStamp.offsetBytes, timeStamp.type, stamps);
        }
        yield {
          frames,
          firstFrame,
          bytesRead,
          codes,
          laneStride: blockFrames,
          timeStamps: stamps,
          passThrough: undefined,
        } satisfies RecordingBlock;
      }
    },
    async *frames() {
      // Frames of codes only, int32le on a little-endian host: the bytes read are the codes.
      let codes: Int32Array | Float64Array | undefined;
      for await (const { bytes, frames, firstFrame, bytesRead } of readBlocks(file, layout, blockFrames)) {
        let view: Int32Array | Float64Array | undefined = interleavedView(bytes, frames, geometry);
        if (view === undefined) {
          codes ??= fitsInt32(layout.sample)
            ? new Int32Array(blockFrames * channels)
            : new Float64Array(blockFrames * channels);
          decodeInterleaved(bytes, frames, geometry, codes);
          view = codes.subarray(0, frames * channels);
        }
        yield { frames, firstFrame, bytesRead, codes: view } satisfies FrameBlock;
      }
    },
  };
}

/**
 * The blocks of bytes of a raw recording, read ahead: while one block is used, the next is read
 * into a second buffer, so a block's bytes stay valid until the next block is requested.
 */
async function* readBlocks(
  file: string,
  layout: { readonly frameBytes: number; readonly fileHeaderBytes: number },
  blockFrames: number,
): AsyncGenerator<{ bytes: Uint8Array; frames: number; firstFrame: number; bytesRead: number }> {
  const { frameBytes, fileHeaderBytes } = layout;
  const blockBytes = blockFrames * frameBytes;
  // Two byte buffers: the next block is read into one while the other is decoded.
  const buffers = [new Uint8Array(blockBytes), new Uint8Array(blockBytes)];
  const handle = await openInput(file);
  const fill = async (bytes: Uint8Array, at: number): Promise<number> => {
    let filled = 0;
    while (filled < blockBytes) {
      const { bytesRead } = await handle.read(bytes, filled, blockBytes - filled, at + filled);
      if (bytesRead === 0) break;
      filled += bytesRead;
    }
    return filled;
  };
  let reading: Promise<number> | undefined;
  const readAhead = (bytes: Uint8Array, at: number): Promise<number> => {
    const p = fill(bytes, at);
    p.catch(() => undefined); // met when awaited; never an unhandled rejection meanwhile
    return p;
  };
  try {
    let position = fileHeaderBytes;
    let frame = 0;
    let slot = 0;
    reading = readAhead(buffers[0] as Uint8Array, position);
    for (;;) {
      const filled = await (reading as Promise<number>);
      reading = undefined;
      const bytes = buffers[slot] as Uint8Array;
      position += filled;
      if (filled % frameBytes !== 0) {
        throw new BridgeworkError(
          'parse-error',
          `${file} ends with a partial frame (${filled % frameBytes} of ${frameBytes} bytes); did the file change while it was read?`,
          { param: file },
        );
      }
      const frames = filled / frameBytes;
      if (frames === 0) return;
      slot ^= 1;
      if (frames === blockFrames) reading = readAhead(buffers[slot] as Uint8Array, position);
      yield { bytes, frames, firstFrame: frame, bytesRead: position };
      frame += frames;
      if (frames < blockFrames) return;
    }
  } finally {
    // A read still under way (the consumer stopped early, or failed) ends before the file closes.
    if (reading !== undefined) await reading.catch(() => undefined);
    await handle.close();
  }
}
