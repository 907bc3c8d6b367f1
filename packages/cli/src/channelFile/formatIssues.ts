import type { SpecIssue } from '@bridgework/core';
import type { SourcePosition } from './parseChannelDocument.js';

/**
 * Formats validation problems one per line, as `file: field.path: message`, with the line and
 * column after the file name when the field can be located (`file:12:5: field.path: message`, the
 * form editors and terminals turn into links).
 *
 * @param file - The file name.
 * @param issues - The problems, in the order they should be read.
 * @param locate - Maps a field path to its place in the file (a document's `locate`).
 * @returns One line per issue, each ending with a newline.
 * @example
 * ```ts
 * formatIssues('hopper.yaml', [{ path: 'channels.north.sensor.gaugeOhms', message: 'must be > 0; got -350' }]);
 * // 'hopper.yaml: channels.north.sensor.gaugeOhms: must be > 0; got -350\n'
 * ```
 */
export function formatIssues(
  file: string,
  issues: readonly SpecIssue[],
  locate?: (path: string) => SourcePosition | undefined,
): string {
  return issues
    .map((issue) => {
      const p = locate?.(issue.path);
      const where = p === undefined ? file : `${file}:${p.line}:${p.column}`;
      return `${where}: ${issue.path === '' ? '' : `${issue.path}: `}${issue.message}\n`;
    })
    .join('');
}
