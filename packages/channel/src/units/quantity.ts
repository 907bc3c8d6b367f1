/**
 * Reading and writing quantities with units, from one table (unitTable.ts). No expression is
 * ever evaluated: a quantity is a decimal literal and a unit name, nothing else.
 */
import { BridgeworkError, ZERO_CELSIUS_KELVIN, checkInteger, formatValue } from '@bridgework/core';
import { addDecimal, decimalToNumber, multiplyDecimal, parseDecimal, type Decimal } from './decimal.js';
import { dimensionTable, dimensions, type Dimension, type UnitDefinition } from './unitTable.js';

/** A unit found in the table, with its dimension and its factor as an exact decimal when it has one. */
interface FoundUnit {
  readonly dimension: Dimension;
  readonly unit: UnitDefinition;
  readonly decimal: Decimal | undefined;
}

/** Spelling variants that mean the same unit text: µ/μ, the product signs, spaces around '/'. */
function normalizeUnitText(text: string): string {
  return text
    .trim()
    .replace(/μ/g, 'µ')
    .replace(/\s*[*⋅·×]\s*/g, '·')
    .replace(/\s*\/\s*/g, '/')
    .replace(/\s+/g, ' ');
}

const byDimension = new Map<Dimension, Map<string, FoundUnit>>();
const anywhere = new Map<string, FoundUnit>();
for (const dimension of dimensions) {
  const names = new Map<string, FoundUnit>();
  for (const unit of dimensionTable[dimension].units) {
    const found: FoundUnit = {
      dimension,
      unit,
      decimal: typeof unit.factor === 'string' ? parseDecimal(unit.factor) : undefined,
    };
    for (const name of [unit.symbol, ...unit.aliases]) {
      const key = normalizeUnitText(name);
      if (!names.has(key)) names.set(key, found);
      if (key !== '' && !anywhere.has(key)) anywhere.set(key, found);
    }
  }
  byDimension.set(dimension, names);
}

/** The unit named `text` in a dimension, or undefined. */
export function findUnit(dimension: Dimension, text: string): FoundUnit | undefined {
  const names = byDimension.get(dimension);
  // A name already in normal form (a table symbol, as channels store their units) is found
  // without normalizing it again: normalizeUnitText leaves its own results unchanged.
  return names?.get(text) ?? names?.get(normalizeUnitText(text));
}

/** The symbols of a dimension's units, as reports print them (the dimension's own unit first). */
export function unitSymbols(dimension: Dimension): string[] {
  return dimensionTable[dimension].units.map((x) => x.symbol);
}

/** What went wrong reading a quantity, as a message in the user's terms. */
export interface QuantityProblem {
  /** `'parse-error'` (not a quantity, unknown unit), `'wrong-type'` (another dimension, not a number or text), `'not-finite'`, `'out-of-range'` (below absolute zero). */
  readonly code: 'parse-error' | 'wrong-type' | 'not-finite' | 'out-of-range';
  /** The problem, naming the text as written. */
  readonly message: string;
  /** What was expected, e.g. `a resistance such as '350 Ω'`. */
  readonly expected: string;
}

/** A quantity read from a number or a text. */
export type QuantityReading =
  | {
      readonly ok: true;
      /** The value in the unit asked for. */
      readonly value: number;
      /** The unit the input was written in (its table symbol), or `''` for a plain number. */
      readonly writtenUnit: string;
    }
  | { readonly ok: false; readonly problem: QuantityProblem };

const NUMBER_AND_UNIT = /^\s*([+\-−]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+\-−]?\d+)?)\s*(.*?)\s*$/;

function problem(code: QuantityProblem['code'], message: string, dimension: Dimension): QuantityReading {
  const d = dimensionTable[dimension];
  return {
    ok: false,
    problem: { code, message, expected: `${d.what}, such as '${d.example}'` },
  };
}

/** Temperature in °C from a value in °C, K or °F, as exactly as the unit allows. */
function celsiusFrom(x: Decimal, symbol: string): number {
  if (symbol === 'K') return decimalToNumber(addDecimal(x, { digits: -27315n, exponent: -2 }));
  if (symbol === '°F')
    return (
      decimalToNumber(
        multiplyDecimal(addDecimal(x, { digits: -32n, exponent: 0 }), { digits: 5n, exponent: 0 }),
      ) / 9
    );
  return decimalToNumber(x);
}

/** A temperature in °C expressed in °C, K or °F. */
function celsiusTo(celsius: number, symbol: string): number {
  if (symbol === 'K') return celsius + ZERO_CELSIUS_KELVIN;
  if (symbol === '°F') return (celsius * 9) / 5 + 32;
  return celsius;
}

/**
 * Reads a quantity written as a number (already in `plainUnit`) or as a text with a unit
 * (`"350 Ω"`, `"2 mV/V"`, `"20 t"`), and returns it in `unit` (default: the dimension's own unit).
 *
 * @remarks
 * Exact where the units allow: the text's decimal and the unit's decimal factor are multiplied
 * exactly (BigInt) and rounded once, so `"2.3 µA"` is the double nearest 2.3e-6 and `"100 lbf"`
 * the double nearest 444.82216152605 N. Into a unit whose factor is not a power of ten, one more
 * rounding (a division) follows; `psi`, `ksi` and `°F` steps round once more. Temperatures are
 * absolute (`"300 K"` is 26.85 °C) and never below absolute zero. A text without a unit is a plain
 * number in `plainUnit`.
 */
export function readQuantity(
  input: unknown,
  dimension: Dimension,
  options: { readonly plainUnit?: string; readonly unit?: string } = {},
): QuantityReading {
  const d = dimensionTable[dimension];
  const target = findUnit(dimension, options.unit ?? d.si);
  const plain = findUnit(dimension, options.plainUnit ?? d.si);
  if (target === undefined || plain === undefined) {
    throw new BridgeworkError(
      'invalid-option',
      `unit '${options.unit ?? options.plainUnit}' is not a unit of ${d.what}`,
      {
        param: 'unit',
        value: options.unit ?? options.plainUnit,
      },
    );
  }
  let decimal: Decimal | undefined;
  let written: FoundUnit;
  let text: string;
  if (typeof input === 'number') {
    if (!Number.isFinite(input))
      return problem('not-finite', `must be a finite number; got ${formatValue(input)}`, dimension);
    text = String(input);
    decimal = parseDecimal(text);
    written = plain;
  } else if (typeof input === 'string') {
    text = input;
    const m = NUMBER_AND_UNIT.exec(input.replace(/−/g, '-'));
    decimal = m === null ? undefined : parseDecimal((m[1] as string).replace(/−/g, '-'));
    if (m === null || decimal === undefined) {
      return problem(
        'parse-error',
        `'${input}' is not a quantity: write a number and a unit, such as '${d.example}'`,
        dimension,
      );
    }
    const unitText = m[2] as string;
    if (/^[*×·^+\-−(]|[()]\s*$|\*\*/.test(unitText) && !/^\/?√|sqrt\(Hz\)$/.test(unitText)) {
      return problem(
        'parse-error',
        `'${input}' is not a quantity: write a number and a unit, such as '${d.example}' (no expressions)`,
        dimension,
      );
    }
    if (unitText === '') written = plain;
    else {
      const found = findUnit(dimension, unitText);
      if (found === undefined) {
        const other = anywhere.get(normalizeUnitText(unitText));
        if (other !== undefined && other.dimension !== dimension) {
          return problem(
            'wrong-type',
            `'${input}' is ${dimensionTable[other.dimension].what}; expected ${d.what}, such as '${d.example}'`,
            dimension,
          );
        }
        const known = unitSymbols(dimension).filter((s) => s !== '');
        return problem(
          'parse-error',
          `'${input}': unknown unit '${unitText}' for ${d.what}; write ${known.length === 0 ? 'a plain number' : known.join(', ')}`,
          dimension,
        );
      }
      written = found;
    }
  } else {
    return problem(
      'wrong-type',
      `must be ${d.what} (a number, or a text such as '${d.example}'); got ${formatValue(input)}`,
      dimension,
    );
  }
  if (decimal === undefined) return problem('parse-error', `'${text}' is not a number`, dimension);

  let value: number;
  if (dimension === 'temperature') {
    const celsius = celsiusFrom(decimal, written.unit.symbol);
    if (!(celsius >= -ZERO_CELSIUS_KELVIN)) {
      return Number.isFinite(celsius)
        ? problem('out-of-range', `'${text}' is below absolute zero`, dimension)
        : problem('not-finite', `'${text}' is beyond the range of double-precision numbers`, dimension);
    }
    value = celsiusTo(celsius, target.unit.symbol);
  } else if (written.decimal !== undefined && target.decimal !== undefined && target.decimal.digits === 1n) {
    // Exact: text × factor / 10^k, rounded once.
    value = decimalToNumber(
      multiplyDecimal(multiplyDecimal(decimal, written.decimal), {
        digits: 1n,
        exponent: -target.decimal.exponent,
      }),
    );
  } else {
    const inBase =
      written.decimal !== undefined
        ? decimalToNumber(multiplyDecimal(decimal, written.decimal))
        : decimalToNumber(decimal) * (written.unit.factor as number);
    value =
      inBase /
      (target.decimal !== undefined ? decimalToNumber(target.decimal) : (target.unit.factor as number));
  }
  if (!Number.isFinite(value)) {
    return problem('not-finite', `'${text}' is beyond the range of double-precision numbers`, dimension);
  }
  return { ok: true, value, writtenUnit: written.unit.symbol };
}

/**
 * Converts a quantity written with a unit to a number in the unit asked for.
 *
 * @remarks
 * The table-driven parser of the channel package (see docs/channel-file.md for every unit):
 * a decimal number, optionally followed by a unit of the same dimension as `unit`; no
 * expressions. Exact where the units allow (see the guide): `"2.3 µA"` in `A` is the double
 * nearest 2.3e-6. A plain number, or a text without a unit, is taken as already in `unit`.
 *
 * @param text - The quantity (`"20 t"`, `"350 Ω"`, `"2 mV/V"`) or a number.
 * @param unit - The unit wanted (`'kg'`, `'Ω'`, `'V/V'`, `'°C'`...): any unit of the table.
 * @returns The value in `unit`.
 * @throws {@link @bridgework/core!BridgeworkError} `parse-error` (not a quantity, unknown unit),
 *   `wrong-type` (another dimension; `text` neither a number nor a string, or `unit` not a
 *   string), `not-finite`, `out-of-range` (below absolute zero), `invalid-option` (`unit` not in
 *   the table).
 * @example
 * ```ts
 * parseQuantity('20 t', 'kg'); // 20000
 * parseQuantity('100 lbf', 'N'); // 444.82216152605
 * parseQuantity('300 K', '°C'); // 26.850000000000023
 * ```
 */
export function parseQuantity(text: string | number, unit: string): number {
  const dimension = dimensionOfUnit(unit);
  const r = readQuantity(text, dimension, { unit, plainUnit: unit });
  if (!r.ok) throw new BridgeworkError(r.problem.code, r.problem.message, { param: 'text', value: text });
  return r.value;
}

/**
 * The dimension a unit symbol belongs to (the first in table order for symbols shared by two,
 * such as `K`: a temperature).
 *
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` for a unit that is not a string,
 *   `invalid-option` for a unit not in the table.
 */
export function dimensionOfUnit(unit: string): Dimension {
  if (typeof unit !== 'string') {
    throw new BridgeworkError('wrong-type', `\`unit\` must be a unit symbol; got ${formatValue(unit)}`, {
      param: 'unit',
      value: unit,
    });
  }
  const found = unit === '' ? byDimension.get('fraction')?.get('') : anywhere.get(normalizeUnitText(unit));
  if (found === undefined) {
    throw new BridgeworkError(
      'invalid-option',
      `\`unit\` must be a unit of the channel's unit table; got ${formatValue(unit)}`,
      {
        param: 'unit',
        value: unit,
      },
    );
  }
  return found.dimension;
}

/**
 * A value in the dimension's own unit, expressed in another of its units (temperatures with
 * their offsets). Powers of ten are applied by one exact multiplication or division.
 */
export function fromBaseUnit(value: number, dimension: Dimension, unit: string): number {
  const found = findUnit(dimension, unit);
  if (found === undefined)
    throw new BridgeworkError(
      'invalid-option',
      `unit '${unit}' is not a unit of ${dimensionTable[dimension].what}`,
      { param: 'unit', value: unit },
    );
  if (dimension === 'temperature') return celsiusTo(value, found.unit.symbol);
  const dec = found.decimal;
  if (dec !== undefined && dec.digits === 1n)
    return dec.exponent < 0 ? value * 10 ** -dec.exponent : value / 10 ** dec.exponent;
  return value / (dec !== undefined ? decimalToNumber(dec) : (found.unit.factor as number));
}

/** A value in one of a dimension's units, expressed in the dimension's own unit (the inverse of {@link fromBaseUnit}). */
export function toBaseUnit(value: number, dimension: Dimension, unit: string): number {
  const found = findUnit(dimension, unit);
  if (found === undefined)
    throw new BridgeworkError(
      'invalid-option',
      `unit '${unit}' is not a unit of ${dimensionTable[dimension].what}`,
      { param: 'unit', value: unit },
    );
  if (dimension === 'temperature') {
    if (found.unit.symbol === 'K') return value - ZERO_CELSIUS_KELVIN;
    if (found.unit.symbol === '°F') return ((value - 32) * 5) / 9;
    return value;
  }
  const dec = found.decimal;
  if (dec !== undefined && dec.digits === 1n)
    return dec.exponent < 0 ? value / 10 ** -dec.exponent : value * 10 ** dec.exponent;
  return value * (dec !== undefined ? decimalToNumber(dec) : (found.unit.factor as number));
}

/**
 * A number for a message or a report: four significant digits (or `digits`), trailing zeros
 * dropped, exponent form beyond 1e6 or below 1e-3.
 */
export function formatSignificant(value: number, digits = 4): string {
  if (value === 0 || !Number.isFinite(value)) return String(value);
  const a = Math.abs(value);
  if (a >= 1e6 || a < 1e-3) {
    const [m, e] = value.toExponential(digits - 1).split('e') as [string, string];
    return `${m.replace(/\.?0+$/, '')}e${e.replace('+', '')}`;
  }
  const text = value.toPrecision(Math.max(digits, Math.floor(Math.log10(a)) + 1));
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}

/**
 * A value with its unit for messages and reports: `digits` significant digits, trailing zeros
 * dropped, exponent form beyond 1e6 or below 1e-3 (`'181.2 °C'`, `'120 kN'`, `'0.35'`).
 *
 * @remarks
 * A value that is not finite is written as JavaScript prints it (`'NaN V'`, `'Infinity V'`), so a
 * message about a non-finite figure shows it as it is.
 *
 * @param value - The value, already in `unit`.
 * @param unit - The unit symbol to append (`''` for none).
 * @param digits - Significant digits, an integer in 1…100 (default 4).
 * @returns The text.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` (`value` not a number, `unit` not a
 *   string), `not-integer` or `out-of-range` (`digits` outside the integers 1…100).
 * @example
 * ```ts
 * formatQuantity(181.23456, '°C'); // '181.2 °C'
 * formatQuantity(1.2345e-3, 'V', 3); // '0.00123 V'
 * ```
 */
export function formatQuantity(value: number, unit: string, digits = 4): string {
  if (typeof value !== 'number') {
    throw new BridgeworkError('wrong-type', `\`value\` must be a number; got ${formatValue(value)}`, {
      param: 'value',
      value,
    });
  }
  if (typeof unit !== 'string') {
    throw new BridgeworkError('wrong-type', `\`unit\` must be a unit symbol; got ${formatValue(unit)}`, {
      param: 'unit',
      value: unit,
    });
  }
  checkInteger('digits', digits, { min: 1, max: 100 });
  const n = formatSignificant(value, digits);
  return unit === '' ? n : `${n} ${unit}`;
}

/**
 * A function converting values in the dimension's own unit to `unit`, for per-sample use (the
 * unit is looked up once): exactly {@link fromBaseUnit}.
 */
export function fromBaseUnitFunction(dimension: Dimension, unit: string): (value: number) => number {
  const found = findUnit(dimension, unit);
  if (found === undefined)
    throw new BridgeworkError(
      'invalid-option',
      `unit '${unit}' is not a unit of ${dimensionTable[dimension].what}`,
      { param: 'unit', value: unit },
    );
  if (dimension === 'temperature') {
    if (found.unit.symbol === 'K') return (x) => x + ZERO_CELSIUS_KELVIN;
    if (found.unit.symbol === '°F') return (x) => (x * 9) / 5 + 32;
    return (x) => x;
  }
  const dec = found.decimal;
  if (dec !== undefined && dec.digits === 1n) {
    if (dec.exponent === 0) return (x) => x;
    const k = 10 ** Math.abs(dec.exponent);
    return dec.exponent < 0 ? (x) => x * k : (x) => x / k;
  }
  const f = dec !== undefined ? decimalToNumber(dec) : (found.unit.factor as number);
  return (x) => x / f;
}

/** A difference (an uncertainty, a correction) in the dimension's own unit, expressed in `unit` (no temperature offset). */
export function differenceFromBaseUnit(value: number, dimension: Dimension, unit: string): number {
  if (dimension === 'temperature') return unit === '°F' ? (value * 9) / 5 : value;
  return fromBaseUnit(value, dimension, unit);
}

/** A unit symbol in ASCII, for generated code and headers (`µε` → `ue`, `°C` → `degC`, `Ω` → `ohm`, `N·m` → `N*m`). */
export function asciiUnit(unit: string): string {
  return unit
    .replace(/µ/g, 'u')
    .replace(/ε/g, 'e')
    .replace(/°/g, 'deg')
    .replace(/Ω/g, 'ohm')
    .replace(/·/g, '*')
    .replace(/²/g, '^2')
    .replace(/³/g, '^3')
    .replace(/√/g, 'sqrt')
    .replace(/‰/g, 'permille');
}
