/**
 * A strict JSON syntax check (RFC 8259) that finds the offset of the first error, because V8's
 * `JSON.parse` messages name a position only for some errors and change between versions.
 * Returns `undefined` for valid JSON, else the offset and what was expected there. Objects and
 * arrays nested more than `maxDepth` levels are an error (the check recurses once per level).
 */
export function checkJsonSyntax(
  text: string,
  maxDepth = 512,
): { offset: number; message: string } | undefined {
  let i = 0;
  const n = text.length;
  class Stop {
    constructor(
      readonly offset: number,
      readonly message: string,
    ) {}
  }
  const fail = (message: string, at = i): never => {
    throw new Stop(at, message);
  };
  const space = (): void => {
    while (i < n && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  const literal = (word: string): void => {
    if (text.startsWith(word, i)) i += word.length;
    else fail('expected a value (an object, array, string, number, true, false or null)');
  };
  const string = (): void => {
    const start = i;
    i++; // opening quote
    for (;;) {
      if (i >= n) fail('unterminated string', start);
      const c = text.charCodeAt(i);
      if (c === 0x22) {
        i++;
        return;
      }
      if (c < 0x20) fail('control character in a string (write it as an escape such as \\n)');
      if (c === 0x5c) {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) fail('invalid \\u escape');
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else fail('invalid escape in a string');
      } else i++;
    }
  };
  const number = (): void => {
    const m = /^-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
    if (m === null || m[0] === '-') fail('invalid number');
    i += (m as RegExpExecArray)[0].length;
  };
  const value = (depth: number): void => {
    space();
    const c = text[i];
    if ((c === '{' || c === '[') && depth >= maxDepth) fail(`nested more than ${maxDepth} levels deep`);
    if (c === '{') {
      i++;
      space();
      if (text[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        space();
        if (text[i] !== '"') fail('expected a double-quoted key');
        string();
        space();
        if (text[i] !== ':') fail("expected ':' after the key");
        i++;
        value(depth + 1);
        space();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === '}') {
          i++;
          return;
        }
        fail("expected ',' or '}'");
      }
    } else if (c === '[') {
      i++;
      space();
      if (text[i] === ']') {
        i++;
        return;
      }
      for (;;) {
        value(depth + 1);
        space();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === ']') {
          i++;
          return;
        }
        fail("expected ',' or ']'");
      }
    } else if (c === '"') string();
    else if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) number();
    else if (c === 't') literal('true');
    else if (c === 'f') literal('false');
    else if (c === 'n') literal('null');
    else
      fail(
        i >= n
          ? 'unexpected end of the file; expected a value'
          : 'expected a value (an object, array, string, number, true, false or null)',
      );
  };
  try {
    value(0);
    space();
    if (i < n) fail('unexpected text after the end of the JSON value');
    return undefined;
  } catch (e) {
    if (e instanceof Stop) return { offset: e.offset, message: e.message };
    throw e;
  }
}
