import { readFile } from 'node:fs/promises';
import { BridgeworkError } from '@bridgework/core';
import { describeFsError } from '../internal/fileErrors.js';
import { parseChannelDocument, type ChannelDocument } from './parseChannelDocument.js';

/**
 * Reads and parses a channel file (see {@link parseChannelDocument}).
 *
 * @param file - The path; `.json` files are JSON, anything else YAML.
 * @returns The parsed document.
 * @throws {@link @bridgework/core!BridgeworkError} `io-error` (missing or unreadable file, not UTF-8 text),
 * `parse-error` (malformed YAML or JSON, with line and column).
 * @example
 * ```ts
 * const doc = await readChannelDocument('hopper.yaml');
 * ```
 */
export async function readChannelDocument(file: string): Promise<ChannelDocument> {
  let bytes: Buffer;
  try {
    bytes = await readFile(file);
  } catch (e) {
    throw new BridgeworkError('io-error', `cannot read ${file}: ${describeFsError(e)}`, {
      param: file,
      cause: e,
    });
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch (e) {
    throw new BridgeworkError('parse-error', `${file} is not UTF-8 text`, { param: file, cause: e });
  }
  return parseChannelDocument(text, file);
}
