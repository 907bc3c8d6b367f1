/**
 * Wraps a paragraph to lines of at most `width` characters (words longer than the width stay
 * whole), each prefixed by `indent`. A no-break space (U+00A0) keeps what it joins on one line
 * (a figure and its unit).
 */
export function wrapText(text: string, width: number, indent = ''): string[] {
  const words = text.split(/[ \t\n\r\f\v]+/).filter((w) => w.length > 0);
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if (line.length > 0 && indent.length + line.length + 1 + w.length > width) {
      lines.push(indent + line);
      line = w;
    } else {
      line = line.length === 0 ? w : `${line} ${w}`;
    }
  }
  if (line.length > 0) lines.push(indent + line);
  return lines;
}
