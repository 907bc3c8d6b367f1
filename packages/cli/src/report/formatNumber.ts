import { checkFinite, checkInteger } from '@bridgework/core';

/**
 * A number for people to read: `digits` significant digits (default 3), never fewer integer
 * digits than the value has, an exponent only for very large or very small magnitudes, and a
 * true minus sign (U+2212).
 *
 * @remarks
 * `346.41` → `346`, `0.07896` → `0.0790`, `1520872.4` → `1520872`, `-0.02686` → `−0.0269`,
 * `4.4e-11` → `4.37e−11`, `0` → `0`. Machine-readable outputs (JSON, CSV) never use it.
 *
 * @param x - The value (NaN and ±Infinity are shown as `NaN`, `∞`, `−∞`).
 * @param digits - Significant digits, 1 to 15.
 * @returns The text.
 */
export function formatNumber(x: number, digits = 3): string {
  if (typeof x !== 'number') checkFinite('value', x);
  checkInteger('digits', digits, { min: 1, max: 15 });
  if (Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '−∞';
  if (x === 0) return '0';
  const a = Math.abs(x);
  let text: string;
  if (a >= 1e15 || a < 1e-4) {
    const [m, e] = a.toExponential(digits - 1).split('e') as [string, string];
    text = `${m}e${e.replace(/^\+/, '').replace('-', '−')}`;
  } else if (a >= 10 ** digits) {
    text = Math.round(a).toString();
  } else {
    text = a.toPrecision(digits);
    if (text.includes('e')) text = Math.round(a).toString();
  }
  return x < 0 ? `−${text}` : text;
}

/**
 * A percentage with sensible digits: `0.9983` → `99.8 %`, `0.00012` → `0.012 %`, `0` → `0 %`.
 *
 * @param fraction - The fraction (0.5 is 50 %).
 * @returns The text.
 */
export function formatPercent(fraction: number): string {
  if (typeof fraction !== 'number') checkFinite('fraction', fraction);
  const p = fraction * 100;
  if (p === 0) return '0 %';
  if (Math.abs(p) >= 10) return `${p.toFixed(1)} %`;
  return `${formatNumber(p, 2)} %`;
}

/**
 * A coverage probability as people write it: `0.95` → `95 %`, `0.9545` → `95.45 %`.
 *
 * @param p - The probability, in (0, 1).
 * @returns The text.
 */
export function formatProbability(p: number): string {
  return `${formatNumber(p * 100, 4).replace(/\.?0+$/, '')} %`;
}

/**
 * A number as stated in an input (a span's end, a budget point): up to 6 significant digits with
 * trailing zeros removed: `120000` → `120000`, `-10` → `−10`, `0.12` → `0.12`.
 *
 * @param x - The value.
 * @returns The text.
 */
export function formatStated(x: number): string {
  return formatNumber(x, 6)
    .replace(/(\.\d*?)0+(?=$|e)/, '$1')
    .replace(/\.(?=$|e)/, '');
}

/**
 * A (fractional) converter code: one decimal and a true minus sign, `-13339.47` → `−13339.5`.
 *
 * @param code - The code.
 * @returns The text.
 */
export function formatCode(code: number): string {
  if (typeof code !== 'number') checkFinite('code', code);
  if (!Number.isFinite(code)) return formatNumber(code);
  // toFixed writes exponents from 1e21 on: such a code is shown as a number like any other.
  return Math.abs(code) >= 1e21 ? formatNumber(code, 6) : code.toFixed(1).replace('-', '−');
}
