import { BridgeworkError, checkInteger } from '@bridgework/core';
import { DEFAULT_BLOCK_FRAMES } from '../data/codeSource.js';

/** Largest block: 2^24 codes (64 MiB as int32, 128 MiB as float64 output). */
export const MAX_BLOCK_CODES = 2 ** 24;

/** Checks the channel count and block size; returns the block size in frames. */
export function checkBlock(channels: number, blockFrames: number | undefined): number {
  checkInteger('channels', channels, { min: 1, max: 4096 });
  const frames = checkInteger('blockFrames', blockFrames ?? DEFAULT_BLOCK_FRAMES, { min: 1 });
  if (frames * channels > MAX_BLOCK_CODES) {
    throw new BridgeworkError(
      'out-of-range',
      `\`blockFrames\` × channels must be <= ${MAX_BLOCK_CODES} codes; got ${frames} × ${channels}`,
      { param: 'blockFrames', value: frames, limit: [1, Math.floor(MAX_BLOCK_CODES / channels)] },
    );
  }
  return frames;
}
