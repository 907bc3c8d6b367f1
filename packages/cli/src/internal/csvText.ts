/** Parses a 32-bit two's-complement integer written in decimal (spaces around allowed), else `undefined`. */
export function parseInt32Text(text: string): number | undefined {
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
    if (v > 2147483648) return undefined;
  }
  if (negative) return v === 0 ? 0 : -v;
  return v > 2147483647 ? undefined : v;
}

const decimal = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/;

/** True when a CSV field holds a decimal number. */
export function isNumberText(text: string): boolean {
  return decimal.test(text);
}

/**
 * Splits one CSV line into fields, honouring double-quoted fields (RFC 4180: a quote inside a
 * quoted field is doubled). Fields are trimmed of surrounding spaces.
 */
export function splitCsvLine(line: string, delimiter: string | undefined): string[] {
  if (delimiter === undefined) return [line.trim()];
  const fields: string[] = [];
  let i = 0;
  for (;;) {
    while (line[i] === ' ' || line[i] === '\t') i++;
    let field = '';
    if (line[i] === '"') {
      i++;
      for (;;) {
        const q = line.indexOf('"', i);
        if (q < 0) {
          field += line.slice(i);
          i = line.length;
          break;
        }
        field += line.slice(i, q);
        if (line[q + 1] === '"') {
          field += '"';
          i = q + 2;
        } else {
          i = q + 1;
          break;
        }
      }
      const next = line.indexOf(delimiter, i);
      i = next < 0 ? line.length : next;
    } else {
      const next = line.indexOf(delimiter, i);
      field = (next < 0 ? line.slice(i) : line.slice(i, next)).trim();
      i = next < 0 ? line.length : next;
    }
    fields.push(field);
    if (i >= line.length) return fields;
    i += delimiter.length;
  }
}

/** Quotes a CSV field when it holds a comma, a quote, a line break or surrounding spaces. */
export function quoteCsvField(text: string): string {
  return /[",\r\n]|^\s|\s$/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
