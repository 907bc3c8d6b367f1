/** Largest code read from text: 2^32 − 1 (an unsigned 32-bit code). */
const MAX_CODE = 4294967295;
/** Smallest code read from text: −2^31. */
const MIN_CODE = -2147483648;

/**
 * Parses a converter code written in decimal: an integer in [−2^31, 2^32 − 1] (a signed or an
 * unsigned 32-bit code; a code ≥ 2^31 stays positive), spaces around allowed; else `undefined`.
 */
export function parseCodeText(text: string): number | undefined {
  let i = 0;
  let n = text.length;
  while (i < n && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
  while (n > i && (text.charCodeAt(n - 1) === 32 || text.charCodeAt(n - 1) === 9)) n--;
  let negative = false;
  const c = text.charCodeAt(i);
  if (c === 45 || c === 43) {
    negative = c === 45;
    i++;
  }
  if (i >= n) return undefined;
  let v = 0;
  for (; i < n; i++) {
    const d = text.charCodeAt(i) - 48;
    if (d < 0 || d > 9) return undefined;
    v = v * 10 + d;
    if (v > MAX_CODE) return undefined;
  }
  if (negative) return v === 0 ? 0 : -v < MIN_CODE ? undefined : -v;
  return v;
}

const decimal = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/;

/** True when a CSV field holds a decimal number. */
export function isNumberText(text: string): boolean {
  return decimal.test(text);
}

/** Parses a decimal number (the nearest double), or `undefined` when the text is not one. */
export function parseNumberText(text: string): number | undefined {
  if (!decimal.test(text)) return undefined;
  const v = Number(text);
  return Number.isFinite(v) ? v : undefined;
}

/** Quotes a CSV field (RFC 4180) when it holds a comma, a quote, a line break or surrounding spaces. */
export function quoteCsvField(text: string): string {
  return /[",\r\n]|^\s|\s$/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
