import { BridgeworkError } from '@bridgework/core';

/**
 * Splits a comma-separated option value (`--channels a,b`, `--columns 2,4`, `--types fixed,float32`)
 * into trimmed entries.
 *
 * @param list - The option's text.
 * @param option - The option as written (`'--channels'`), for the message.
 * @returns The entries, in order.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an empty entry.
 */
export function splitOptionList(list: string, option: string): string[] {
  return list.split(',').map((entry) => {
    const t = entry.trim();
    if (t === '') {
      throw new BridgeworkError('invalid-option', `\`${option}\` has an empty entry; got '${list}'`, {
        param: option,
        value: list,
      });
    }
    return t;
  });
}
