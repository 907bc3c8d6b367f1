/**
 * The limits a channel file must keep, checked while it is read so that a crafted or broken file
 * is refused at once with a position, never after minutes of work or with a crash.
 *
 * @remarks
 * A real channel file is a few kilobytes, a handful of levels deep, and uses an anchor now and
 * then to share a block between channels; these limits sit far above that:
 * - `maxBytes`: 1 MiB (1 048 576 bytes), checked before the file is read;
 * - `maxChannels`: 1000 channels under `channels`;
 * - `maxDepth`: 32 levels of nested mappings and lists (a channel file needs six), checked on the
 *   syntax tree before any value is built, so nesting cannot exhaust the stack;
 * - `maxAliasNodes`: 10 000 nodes copied by aliases in all (`*name`), so a chain of aliases of
 *   aliases (a "billion laughs" file) cannot expand without bound.
 *
 * docs/channel-file.md states them; a test keeps the two in step.
 */
export const channelFileLimits = {
  maxBytes: 1_048_576,
  maxChannels: 1000,
  maxDepth: 32,
  maxAliasNodes: 10_000,
} as const;
