import { validateChannelSpec, type ChannelSpec } from '@bridgework/channel';
import type { SpecIssue } from '@bridgework/core';
import type { ChannelValidation, QuantityParser } from '../channelFile/loadChannelFile.js';
import { closestName } from '@bridgework/core';

/**
 * Removes the leading "`field.path` " that the channel schema puts at the start of each message,
 * and words an unknown field as the file loader does, with the closest known name suggested.
 */
function restate(issue: SpecIssue): SpecIssue {
  const prefix = `\`${issue.path === '' ? 'spec' : issue.path}\` `;
  const message = issue.message.startsWith(prefix) ? issue.message.slice(prefix.length) : issue.message;
  const unknown = /^is not a known field \(known: (.*)\)$/.exec(message);
  if (unknown === null) return { ...issue, message };
  const known = (unknown[1] as string).split(', ');
  const near = closestName(issue.path.split('.').pop() ?? '', known);
  return {
    ...issue,
    message: `unknown field${near === undefined ? `; expected one of ${known.join(', ')}` : `; did you mean '${near}'?`}`,
  };
}

/**
 * Validates one entry of a channel file's `channels` mapping with the channel package's schema
 * (the {@link ChannelValidator} that {@link loadChannelFile} takes).
 *
 * @remarks
 * Quantities written with units are converted by `parseQuantity` (mathjs's unit parser; no
 * expression is evaluated). The channel's name is its key in the file, so a `name` field inside
 * the entry is a problem. The schema's messages start with the field path in backticks
 * ("`adc.bits` must be an integer; got 24.5"); that prefix is removed here because the file
 * loader prints the full path in front of every message
 * (`file:line:column: channels.hanger.adc.bits: must be an integer; got 24.5`), and an unknown
 * field is worded as the loader words its own, with the closest known name suggested
 * (`excitation.volt: unknown field; did you mean 'volts'?`).
 *
 * @param raw - The entry as read from the file.
 * @param parseQuantity - Converts `"350 ohm"` to the SI number the field expects.
 * @returns The spec with defaults applied, or every problem with its path inside the channel.
 */
export function validateChannelEntry(
  raw: unknown,
  parseQuantity: QuantityParser,
): ChannelValidation<ChannelSpec> {
  const nameIssue: SpecIssue[] =
    typeof raw === 'object' && raw !== null && Object.hasOwn(raw, 'name')
      ? [{ path: 'name', message: "is not a field of a channel in a file: the channel's name is its key" }]
      : [];
  const entry =
    nameIssue.length === 0
      ? raw
      : Object.fromEntries(Object.entries(raw as object).filter(([k]) => k !== 'name'));
  // The channel package reads quantities with units itself (its unit table).
  void parseQuantity;
  const result = validateChannelSpec(entry);
  const issues = [...nameIssue, ...result.issues.map(restate)];
  return issues.length === 0 && result.ok ? { value: result.value, issues } : { issues };
}
