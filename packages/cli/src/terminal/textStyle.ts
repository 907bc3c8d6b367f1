import type { CliStream } from '../cliIo.js';

/** ANSI styling for one output stream; every function is the identity when colour is off. */
export interface TextStyle {
  /** Whether colour codes are written. */
  readonly enabled: boolean;
  /** Bold text (headings). */
  bold(text: string): string;
  /** Dim text (notes, units). */
  dim(text: string): string;
  /** Red text (failed checks, errors). */
  red(text: string): string;
  /** Green text (passed checks). */
  green(text: string): string;
  /** Yellow text (warnings). */
  yellow(text: string): string;
}

/**
 * Whether colour may be written to a stream.
 *
 * @remarks
 * Colour only on an interactive terminal (`stream.isTTY`), never when the `NO_COLOR` environment
 * variable is set to a non-empty value (the no-color.org convention), and never when `TERM` is
 * `dumb`.
 *
 * @param stream - The output stream.
 * @param env - The environment.
 * @returns True when colour codes may be written.
 */
export function colorEnabled(stream: CliStream, env: Readonly<Record<string, string | undefined>>): boolean {
  const noColor = env['NO_COLOR'];
  if (noColor !== undefined && noColor !== '') return false;
  if (env['TERM'] === 'dumb') return false;
  return stream.isTTY === true;
}

function sgr(on: number, off: number): (text: string) => string {
  return (text) => `\u001b[${on}m${text}\u001b[${off}m`;
}

const identity = (text: string): string => text;

/** The style without colours, for text written to files. */
export const plainTextStyle: TextStyle = Object.freeze({
  enabled: false,
  bold: identity,
  dim: identity,
  red: identity,
  green: identity,
  yellow: identity,
});

/**
 * The text style for a stream: ANSI colours when {@link colorEnabled} allows them, plain text
 * otherwise.
 *
 * @param stream - The output stream.
 * @param env - The environment.
 * @returns The style.
 * @example
 * ```ts
 * const style = createTextStyle(process.stdout, process.env);
 * console.log(style.red('headroom check failed'));
 * ```
 */
export function createTextStyle(
  stream: CliStream,
  env: Readonly<Record<string, string | undefined>>,
): TextStyle {
  if (!colorEnabled(stream, env)) return plainTextStyle;
  return {
    enabled: true,
    bold: sgr(1, 22),
    dim: sgr(2, 22),
    red: sgr(31, 39),
    green: sgr(32, 39),
    yellow: sgr(33, 39),
  };
}

/**
 * The printed width of a text in terminal columns, ignoring ANSI colour codes (each code point
 * counts one column; combining marks count none).
 *
 * @param text - The text.
 * @returns Its width in columns.
 */
export function visibleWidth(text: string): number {
  // eslint-disable-next-line no-control-regex
  const plain = text.replace(/\u001b\[[0-9;]*m/g, '').replace(/\p{M}/gu, '');
  return [...plain].length;
}
