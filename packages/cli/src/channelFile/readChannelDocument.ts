import { open } from 'node:fs/promises';
import { BridgeworkError } from '@bridgework/core';
import { describeFsError } from '../internal/fileErrors.js';
import { channelFileLimits } from './channelFileLimits.js';
import type { ChannelDocument } from './channelFileText.js';
import { parseJsonChannelDocument } from './jsonChannelDocument.js';

/** Reads at most `limit + 1` bytes, so a file past the limit is refused without reading it all. */
async function readBounded(file: string, limit: number): Promise<Buffer> {
  const handle = await open(file, 'r');
  try {
    const { size } = await handle.stat();
    if (size > limit) return Buffer.alloc(limit + 1);
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const chunk = Buffer.alloc(Math.min(65_536, limit + 1 - total));
      const { bytesRead } = await handle.read(chunk, 0, chunk.length, null);
      if (bytesRead === 0) break;
      chunks.push(chunk.subarray(0, bytesRead));
      total += bytesRead;
      if (total > limit) break;
    }
    return Buffer.concat(chunks, total);
  } finally {
    await handle.close();
  }
}

/**
 * Reads and parses a channel file (see {@link parseChannelDocument}).
 *
 * @remarks
 * A file larger than `channelFileLimits.maxBytes` (1 MiB) is refused at once, before it is read.
 *
 * @param file - The path; `.json` files are JSON, anything else YAML.
 * @returns The parsed document.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable file),
 * `parse-error` (larger than 1 MiB, not UTF-8 text, malformed YAML or JSON with line and column).
 * @example
 * ```ts
 * const doc = await readChannelDocument('hopper.yaml');
 * ```
 */
export async function readChannelDocument(file: string): Promise<ChannelDocument> {
  let bytes: Buffer;
  try {
    bytes = await readBounded(file, channelFileLimits.maxBytes);
  } catch (e) {
    throw new BridgeworkError('io-error', `cannot read ${file}: ${describeFsError(e)}`, {
      param: file,
      cause: e,
    });
  }
  if (bytes.length > channelFileLimits.maxBytes) {
    throw new BridgeworkError(
      'parse-error',
      `${file} is larger than a channel file may be (${channelFileLimits.maxBytes} bytes, 1 MiB); split it into several files`,
      { param: file, limit: channelFileLimits.maxBytes },
    );
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch (e) {
    throw new BridgeworkError('parse-error', `${file} is not UTF-8 text`, { param: file, cause: e });
  }
  if (/\.json$/i.test(file)) return parseJsonChannelDocument(text, file);
  // The YAML reader (and the yaml package) is loaded only for a YAML file.
  const { parseChannelDocument } = await import('./parseChannelDocument.js');
  return parseChannelDocument(text, file);
}
