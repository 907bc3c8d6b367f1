import { BridgeworkError, formatValue } from '@bridgework/core';
import { asciiFold } from './internal/text.js';

/** The longest identifier fragment made from a channel name (C99 guarantees 63 significant characters). */
export const C_NAME_MAX_LENGTH = 32;

/**
 * Turns a channel name into the lower-case identifier fragment used in generated C names.
 *
 * @remarks
 * Accented letters are decomposed and stripped of their marks (Unicode NFKD: `ä` → `a`), a few
 * letters without a decomposition are transliterated (`ß` → `ss`, `ø` → `o`, `µ` → `u`), every run
 * of anything but ASCII letters and digits becomes one `_`, leading and trailing `_` are dropped
 * (so no reserved `_X` or `__` form can arise), and the result is cut to {@link C_NAME_MAX_LENGTH}
 * characters. Nothing of the name can reach C except `[a-z0-9_]`, so no name can break out of an
 * identifier or a comment. The fragment may start with a digit: the generator always puts the
 * prefix and `_` before it.
 *
 * @param name - A channel name (any Unicode text with at least one letter or digit).
 * @param param - The option path named in errors. Default `'name'`.
 * @returns The identifier fragment, matching `[a-z0-9]([a-z0-9_]*[a-z0-9])?`.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` for a non-string; `invalid-option`
 *   when nothing of the name survives (no letter or digit).
 * @example
 * ```ts
 * cIdentifierFromName('Wägezelle 2 "links"'); // 'wagezelle_2_links'
 * cIdentifierFromName('Øresund µε gauge'); // 'oresund_ue_gauge'
 * ```
 */
export function cIdentifierFromName(name: string, param = 'name'): string {
  if (typeof name !== 'string') {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be a string; got ${formatValue(name)}`, {
      param,
      value: name,
    });
  }
  const fragment = asciiFold(name)
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '')
    .slice(0, C_NAME_MAX_LENGTH)
    .replace(/_+$/, '');
  if (fragment === '') {
    throw new BridgeworkError(
      'invalid-option',
      `\`${param}\` must contain at least one letter or digit; got ${formatValue(name)}`,
      { param, value: name },
    );
  }
  return fragment;
}
