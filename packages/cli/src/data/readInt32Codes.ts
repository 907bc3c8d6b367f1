import { BridgeworkError } from '@bridgework/core';
import type { CodeBlock, CodeSource } from './codeSource.js';
import { checkBlock } from '../internal/checkBlock.js';
import { openInput, statInput } from '../internal/fileErrors.js';

/** Options of {@link openInt32Codes}. */
export interface Int32CodeOptions {
  /** Interleaved channels per frame (integer in [1, 4096]). */
  readonly channels: number;
  /** Frames per block (integer ≥ 1; at most 2^24 codes per block). Default 65 536. */
  readonly blockFrames?: number;
}

const littleEndianHost = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/**
 * Decodes little-endian 32-bit two's-complement integers byte by byte (for big-endian hosts, and
 * as an independent check of the direct view used on little-endian hosts).
 *
 * @param bytes - The raw bytes (at least `4 × count`).
 * @param out - Receives `count` codes.
 * @param count - Number of codes.
 */
export function decodeInt32LittleEndian(bytes: Uint8Array, out: Int32Array, count: number): void {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  for (let i = 0; i < count; i++) out[i] = view.getInt32(4 * i, true);
}

/**
 * Opens a raw file of little-endian int32 converter codes, `channels` interleaved per frame, for
 * reading in fixed-size blocks.
 *
 * @remarks
 * The file is a plain sequence of frames; each frame holds one 4-byte little-endian two's-
 * complement code per channel, in channel order (the layout of a converter's sample buffer dumped
 * to disk). Its size must be a whole number of frames: this is checked here, before any output is
 * written, and again at the end of reading in case the file changed. On a little-endian host the
 * block's `Int32Array` is a view of the read buffer (no copy); on a big-endian host the bytes are
 * decoded byte by byte.
 *
 * @param file - The file path.
 * @param options - Channels per frame and block size.
 * @returns The opened source; read it with `blocks()`.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable file), `parse-error` (size not
 * a whole number of frames), `not-integer` or `out-of-range` (channels, block size).
 * @example
 * ```ts
 * const source = await openInt32Codes('hopper-codes.bin', { channels: 4 });
 * for await (const block of source.blocks()) console.log(block.firstFrame, block.frames);
 * ```
 */
export async function openInt32Codes(file: string, options: Int32CodeOptions): Promise<CodeSource> {
  const { channels } = options;
  const blockFrames = checkBlock(channels, options.blockFrames);
  const totalBytes = await statInput(file);
  const frameBytes = 4 * channels;
  if (totalBytes % frameBytes !== 0) {
    throw new BridgeworkError(
      'parse-error',
      `${file} holds ${totalBytes} bytes, which is not a whole number of frames of ${channels} channel${channels === 1 ? '' : 's'} × 4 bytes (${frameBytes} bytes per frame)`,
      { param: file, value: totalBytes, limit: frameBytes },
    );
  }
  return {
    file,
    format: 'int32le',
    channels,
    columnNames: undefined,
    blockFrames,
    totalBytes,
    totalFrames: totalBytes / frameBytes,
    async *blocks() {
      const blockBytes = blockFrames * frameBytes;
      const buffer = new ArrayBuffer(blockBytes);
      const bytes = new Uint8Array(buffer);
      const codes = littleEndianHost ? new Int32Array(buffer) : new Int32Array(blockFrames * channels);
      const handle = await openInput(file);
      try {
        let position = 0;
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
          if (!littleEndianHost) decodeInt32LittleEndian(bytes, codes, frames * channels);
          yield {
            codes: frames === blockFrames ? codes : codes.subarray(0, frames * channels),
            frames,
            firstFrame: frame,
            bytesRead: position,
          } satisfies CodeBlock;
          frame += frames;
          if (frames < blockFrames) return;
        }
      } finally {
        await handle.close();
      }
    },
  };
}
