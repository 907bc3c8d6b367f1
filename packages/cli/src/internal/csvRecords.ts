/**
 * A streaming reader of CSV records per RFC 4180: fields separated by a delimiter, records by
 * CRLF or LF; a field may be enclosed in double quotes, and then holds delimiters, line breaks and
 * doubled quotes (`""` for one `"`). Unquoted fields are trimmed of surrounding spaces and tabs
 * (loggers often write `1, 2`); quoted fields are kept exactly, spaces outside the quotes are
 * ignored. Blank records are skipped.
 */

/** One record: its fields and the line (1-based) on which it starts. */
export interface CsvRecord {
  readonly fields: string[];
  readonly line: number;
}

/** A problem in the text, with the line on which it was found. */
export class CsvSyntaxError extends Error {
  constructor(
    message: string,
    readonly line: number,
  ) {
    super(message);
  }
}

/** Longest record accepted, in characters (bounds memory on a file with an unclosed quote). */
export const MAX_RECORD_CHARS = 1 << 20;

/**
 * Splits text fed in chunks into records.
 *
 * @remarks
 * `push(chunk)` returns the records completed by the chunk; `end()` returns the last one. The
 * delimiter is fixed at construction (or `undefined` for a single column, where a line is one
 * field unless quoted).
 */
export class CsvRecordReader {
  private rest = '';
  private line = 1;

  constructor(private readonly delimiter: string | undefined) {}

  /** The line number where the next record starts. */
  get nextLine(): number {
    return this.line;
  }

  /** Feeds a chunk of text; returns the records it completes. */
  push(chunk: string): CsvRecord[] {
    const text = this.rest + chunk;
    const out: CsvRecord[] = [];
    const consumed = this.parse(text, false, out);
    this.rest = text.slice(consumed);
    if (this.rest.length > MAX_RECORD_CHARS) {
      throw new CsvSyntaxError(
        `a record longer than ${MAX_RECORD_CHARS} characters (an unclosed quote?)`,
        this.line,
      );
    }
    return out;
  }

  /** Ends the text; returns the last record if the text did not end with a line break. */
  end(): CsvRecord[] {
    const out: CsvRecord[] = [];
    const text = this.rest;
    this.rest = '';
    if (text.length > 0) this.parse(text, true, out);
    return out;
  }

  /** Parses whole records from `text`; returns how many characters were consumed. */
  private parse(text: string, final: boolean, out: CsvRecord[]): number {
    let pos = 0;
    const n = text.length;
    // The next quote at or after pos (−1: none in the rest of the text), found once and reused
    // until passed, so that a text without quotes is not searched to its end for every line.
    let quote = -2;
    while (pos < n) {
      const nl = text.indexOf('\n', pos);
      const lineEnd = nl < 0 ? n : nl;
      if (nl < 0 && !final) return pos;
      if (quote !== -1 && quote < pos) quote = text.indexOf('"', pos);
      if (quote < 0 || quote > lineEnd) {
        // Fast path: a record on one line without quotes.
        const end = lineEnd > pos && text.charCodeAt(lineEnd - 1) === 13 ? lineEnd - 1 : lineEnd;
        const raw = text.slice(pos, end);
        if (raw.trim() !== '') {
          const fields = this.delimiter === undefined ? [raw] : raw.split(this.delimiter);
          for (let i = 0; i < fields.length; i++) fields[i] = (fields[i] as string).trim();
          out.push({ fields, line: this.line });
        }
        this.line++;
        pos = nl < 0 ? n : nl + 1;
        continue;
      }
      const parsed = this.parseQuoted(text, pos, final);
      if (parsed === undefined) return pos;
      out.push({ fields: parsed.fields, line: this.line });
      this.line += parsed.lines;
      pos = parsed.end;
    }
    return pos;
  }

  /**
   * Parses one record that holds a quote, starting at `start`; `undefined` when the text ends
   * before the record does (and more text may follow).
   */
  private parseQuoted(
    text: string,
    start: number,
    final: boolean,
  ): { fields: string[]; end: number; lines: number } | undefined {
    const d = this.delimiter;
    const fields: string[] = [];
    let lines = 1;
    let i = start;
    const n = text.length;
    for (;;) {
      while (i < n && (text[i] === ' ' || text[i] === '\t') && text[i] !== d) i++;
      let field: string;
      if (text[i] === '"') {
        const fieldLine = this.line + lines - 1;
        i++;
        field = '';
        for (;;) {
          const q = text.indexOf('"', i);
          if (q < 0) {
            if (!final) return undefined;
            throw new CsvSyntaxError('a quoted field is not closed before the end of the file', fieldLine);
          }
          const part = text.slice(i, q);
          lines += countLineBreaks(part);
          field += part;
          if (q + 1 >= n && !final) return undefined;
          if (text[q + 1] === '"') {
            field += '"';
            i = q + 2;
          } else {
            i = q + 1;
            break;
          }
        }
        while (i < n && (text[i] === ' ' || text[i] === '\t') && text[i] !== d) i++;
        if (i < n && text[i] !== d && text[i] !== '\n' && text[i] !== '\r') {
          throw new CsvSyntaxError(
            `text after a closing quote: '${text.slice(i, i + 10)}' (a quote inside a quoted field is written "")`,
            this.line + lines - 1,
          );
        }
      } else {
        let j = i;
        while (j < n && text[j] !== '\n' && (d === undefined || !text.startsWith(d, j))) {
          if (text[j] === '"') {
            throw new CsvSyntaxError(
              'a quote inside an unquoted field; enclose the field in quotes and write the quote as ""',
              this.line + lines - 1,
            );
          }
          j++;
        }
        if (j >= n && !final) return undefined;
        field = text.slice(i, j).replace(/\r$/, '').trim();
        i = j;
      }
      fields.push(field);
      if (i >= n) {
        if (!final) return undefined;
        return { fields, end: n, lines };
      }
      if (text[i] === '\r' && text[i + 1] === '\n') i++;
      else if (text[i] === '\r' && i + 1 >= n && !final) return undefined;
      if (text[i] === '\n' || text[i] === '\r') return { fields, end: i + 1, lines };
      i += (d as string).length;
    }
  }
}

function countLineBreaks(text: string): number {
  let k = 0;
  for (let p = text.indexOf('\n'); p >= 0; p = text.indexOf('\n', p + 1)) k++;
  return k;
}
