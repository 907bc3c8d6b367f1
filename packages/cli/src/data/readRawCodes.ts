import { BridgeworkError } from '@bridgework/core';
import { checkBlock } from '../internal/checkBlock.js';
import { openInput, statInput } from '../internal/fileErrors.js';
import type { CodeSource, RecordingBlock } from './codeSource.js';
import { decodeFrames, decodeTimeStamps, timeStampArray } from './decodeFrames.js';
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
 * any output is written, and again while reading in case the file changed. Each block is read into
 * one reused byte buffer and decoded into one lane per channel (one loop per stored type); a time
 * stamp in the frame header is decoded into the block's `timeStamps`. Memory: the byte buffer
 * (`blockFrames × frameBytes`), the lanes (4 or 8 bytes per code) and the stamps, allocated once.
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
      const blockBytes = blockFrames * frameBytes;
      const bytes = new Uint8Array(blockBytes);
      const codes = fitsInt32(layout.sample)
        ? new Int32Array(blockFrames * channels)
        : new Float64Array(blockFrames * channels);
      const stamps = timeStamp === undefined ? undefined : timeStampArray(timeStamp.type, blockFrames);
      const handle = await openInput(file);
      try {
        let position = fileHeaderBytes;
        let frame = 0;
        for (;;) {
          let filled = 0;
          while (filled < blockBytes) {
            const { bytesRead } = await handle.read(bytes, filled, blockBytes - filled, position + filled);
            if (bytesRead === 0) break;
            filled += bytesRead;
          }
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
          decodeFrames(bytes, frames, geometry, codes, blockFrames);
          if (stamps !== undefined && timeStamp !== undefined) {
            decodeTimeStamps(bytes, frames, frameBytes, timeStamp.offsetBytes, timeStamp.type, stamps);
          }
          yield {
            frames,
            firstFrame: frame,
            bytesRead: position,
            codes,
            laneStride: blockFrames,
            timeStamps: stamps,
            passThrough: undefined,
          } satisfies RecordingBlock;
          frame += frames;
          if (frames < blockFrames) return;
        }
      } finally {
        await handle.close();
      }
    },
  };
}
