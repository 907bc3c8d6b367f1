import { BridgeworkError, formatValue } from '@bridgework/core';

/** Letters that Unicode decomposition does not reduce to ASCII, with their usual transliteration. */
const TRANSLITERATION: Readonly<Record<string, string>> = {
  ß: 'ss',
  æ: 'ae',
  Æ: 'AE',
  œ: 'oe',
  Œ: 'OE',
  ø: 'o',
  Ø: 'O',
  ł: 'l',
  Ł: 'L',
  đ: 'd',
  Đ: 'D',
  þ: 'th',
  Þ: 'Th',
  µ: 'u',
  μ: 'u',
  ε: 'e',
  Ω: 'Ohm',
  '°': 'deg',
  '·': '.',
  '−': '-',
};

/** Decomposes accented letters (NFKD), drops the combining marks and transliterates the rest. */
export function asciiFold(text: string): string {
  return [...text.normalize('NFKD').replace(/\p{M}/gu, '')].map((ch) => TRANSLITERATION[ch] ?? ch).join('');
}

/**
 * Text that is safe inside a C block comment: printable ASCII without `*` (so neither a comment end
 * nor a nested comment start can form), `\` (line splices) or `?` (trigraphs such as `??/`);
 * anything else becomes `_`, and runs of blanks one space.
 */
export function commentText(text: string, maxLength = 120): string {
  const safe = asciiFold(text)
    .replace(/\s+/g, ' ')
    .replace(/[^ !"#$%&'()+,\-./0-9:;<=>@A-Z[\]^_`a-z{|}~]/g, '_')
    .trim();
  return safe.length > maxLength ? `${safe.slice(0, maxLength - 3)}...` : safe;
}

/** Checks an optional unit label. */
export function checkQuantityUnit(value: unknown, param = 'quantityUnit'): string {
  if (value === undefined) return '';
  if (typeof value !== 'string') {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be a string; got ${formatValue(value)}`, {
      param,
      value,
    });
  }
  return value;
}
