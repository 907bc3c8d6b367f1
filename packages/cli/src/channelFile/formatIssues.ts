import type { SpecIssue } from '@bridgework/core';
import type { SourcePosition } from './parseChannelDocument.js';

/**
 * One issue as a line: the message as the layer that found it wrote it, then its limit, what was
 * expected and the suggestion, each when present and not already in the message's text.
 */
function issueText(issue: SpecIssue): string {
  const extra: string[] = [];
  const has = (s: string | undefined): s is string =>
    s !== undefined && s !== '' && !issue.message.includes(s);
  if (has(issue.limit)) extra.push(`limit: ${issue.limit}`);
  if (has(issue.expected)) extra.push(`expected: ${issue.expected}`);
  const detail = extra.length === 0 ? '' : ` (${extra.join('; ')})`;
  return `${issue.message}${detail}${has(issue.suggestion) ? `; ${issue.suggestion}` : ''}`;
}

/**
 * Formats validation problems one per line, as `file: field.path: message`, with the line and
 * column after the file name when the field can be located (`file:12:5: field.path: message`, the
 * form editors and terminals turn into links).
 *
 * @remarks
 * Issues travel as data (`{ code, path, message, limit?, expected?, suggestion? }`, core's
 * `SpecIssue`). The message is printed exactly as the layer that found the problem wrote it; the
 * limit and what was expected follow in parentheses and the suggestion after a semicolon, each
 * only when present and not already part of the message.
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
      return `${where}: ${issue.path === '' ? '' : `${issue.path}: `}${issueText(issue)}\n`;
    })
    .join('');
}
