import { BridgeworkError, ZERO_CELSIUS_KELVIN } from '@bridgework/core';
import { parseUnit, type ParsedUnit } from '../internal/mathUnits.js';

/**
 * The SI units (with °C as the trade's temperature unit) that quantities in channel files are
 * converted to: `'ohm'`, `'V'`, `'A'`, `'W'`, `'m'`, `'m^2'`, `'m/s^2'`, `'Pa'`, `'N'`, `'kg'`, `'Hz'`,
 * `'s'`, `'degC'`, `'K'`, `'V/V'` (a dimensionless ratio such as a bridge output) and `'1'` (a
 * plain dimensionless number).
 */
export type SiUnit =
  | 'ohm'
  | 'V'
  | 'A'
  | 'W'
  | 'm'
  | 'm^2'
  | 'm/s^2'
  | 'Pa'
  | 'N'
  | 'kg'
  | 'Hz'
  | 's'
  | 'degC'
  | 'K'
  | 'V/V'
  | '1';

interface Target {
  readonly kind: string;
  readonly example: string;
}

const targets: Readonly<Record<SiUnit, Target>> = {
  ohm: { kind: 'a resistance', example: '350 ohm' },
  V: { kind: 'a voltage', example: '5 V' },
  A: { kind: 'a current', example: '10 mA' },
  W: { kind: 'a power', example: '0.25 W' },
  m: { kind: 'a length', example: '12 m' },
  'm^2': { kind: 'an area', example: '561 mm^2' },
  'm/s^2': { kind: 'an acceleration', example: '9.8127 m/s^2' },
  Pa: { kind: 'a pressure or stress', example: '205 GPa' },
  N: { kind: 'a force', example: '84 kN' },
  kg: { kind: 'a mass', example: '500 kg' },
  Hz: { kind: 'a frequency', example: '10 Hz' },
  s: { kind: 'a time', example: '100 ms' },
  degC: { kind: 'a temperature', example: '25 degC' },
  K: { kind: 'a temperature', example: '298.15 K' },
  'V/V': { kind: 'a dimensionless ratio', example: '2 mV/V' },
  '1': { kind: 'a plain number', example: '0.3' },
};

/** Every {@link SiUnit}, in the order of the type. */
export const siUnits: readonly SiUnit[] = Object.freeze(Object.keys(targets) as SiUnit[]);

/** Known kinds of quantity, to name what a wrong unit measures. */
const kinds: readonly (readonly [string, string])[] = [
  ['a resistance', 'ohm'],
  ['a voltage', 'V'],
  ['a current', 'A'],
  ['a power', 'W'],
  ['a length', 'm'],
  ['an area', 'm^2'],
  ['a volume', 'm^3'],
  ['a pressure or stress', 'Pa'],
  ['a force', 'N'],
  ['a mass', 'kg'],
  ['a frequency', 'Hz'],
  ['a temperature', 'K'],
  ['an energy or torque', 'J'],
  ['a velocity', 'm/s'],
  ['an acceleration', 'm/s^2'],
  ['a charge', 'C'],
  ['a capacitance', 'F'],
  ['an inductance', 'H'],
  ['a conductance', 'S'],
  ['an angle', 'rad'],
  ['a density', 'kg/m^3'],
];

const numberPattern = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+))(?:[eE]([+-]?\d+))?\s*(.*?)\s*$/;
const unitWord = '[A-Za-zµμΩ°]+(?:\\^[+-]?\\d+)?';
const unitPattern = new RegExp(`^${unitWord}(?:\\s*[*/·]\\s*${unitWord})*$`);

function fail(
  code: 'parse-error' | 'wrong-type' | 'not-finite' | 'out-of-range',
  text: string,
  message: string,
): never {
  throw new BridgeworkError(code, message, { value: text });
}

function normalizeUnit(unit: string): string {
  return unit
    .replace(/°C/g, 'degC')
    .replace(/°F/g, 'degF')
    .replace(/[µμ]/g, 'u')
    .replace(/Ω/g, 'ohm')
    .replace(/\s*·\s*/g, '*')
    .replace(/\s*([*/])\s*/g, '$1');
}

function kindOf(u: ParsedUnit): string {
  if (u.dimensionless) return 'a dimensionless ratio';
  for (const [phrase, ref] of kinds) if (u.sameDimension(ref)) return phrase;
  return `a quantity in ${u.siText()}`;
}

/** `mantissa × 10^(exponent + shift)` as the double nearest the exact decimal. */
function shifted(mantissa: string, exponent: number, shift: number): number {
  return Number(`${mantissa}e${exponent + shift}`);
}

/** The power of ten that a factor is exactly, or undefined. */
function decimalExponent(x: number): number | undefined {
  if (!(x > 0)) return undefined;
  const k = Math.round(Math.log10(x));
  return Number(`1e${k}`) === x ? k : undefined;
}

function convertTemperature(
  u: ParsedUnit,
  mantissa: string,
  exponent: number,
  unit: 'degC' | 'K',
): number | undefined {
  if (u.factors.length !== 1) return undefined;
  const f = u.factors[0] as ParsedUnit['factors'][number];
  const k = decimalExponent(f.prefixValue);
  if (f.power !== 1 || k === undefined || (f.name !== 'degC' && f.name !== 'K')) return undefined;
  const x = shifted(mantissa, exponent, k);
  if (f.name === unit) return x;
  return unit === 'K' ? x + ZERO_CELSIUS_KELVIN : x - ZERO_CELSIUS_KELVIN;
}

/** A plain number: SI as it is, but finite and, for temperatures, not below absolute zero. */
function checkPlain(x: number, text: string, unit: SiUnit): number {
  if (!Number.isFinite(x)) fail('not-finite', text, `${text} is not a finite number`);
  if ((unit === 'K' && x < 0) || (unit === 'degC' && x < -ZERO_CELSIUS_KELVIN)) {
    fail('out-of-range', text, `'${text}' is below absolute zero`);
  }
  return x;
}

/**
 * Converts a quantity written with a unit (`"350 ohm"`, `"2 mV/V"`, `"25 degC"`) to the number in
 * the given SI unit, checking that the dimension is the expected one.
 *
 * @remarks
 * **Accepted text**: a decimal number (`350`, `-0.5`, `.5`, `2.5e-3`), optionally followed by a
 * unit; nothing else. The unit is one or more unit names, each optionally with an integer power
 * (`mm^2`), joined by `*`, `·` or `/` (`N/mm^2`, `mV/V`, `V*A`): no parentheses, no arithmetic,
 * no functions, no variables. Expressions are never evaluated: the number is read by `Number`
 * and only the unit text is handed to mathjs's unit parser (never to `evaluate`). Unit names
 * are mathjs's and case-sensitive (`mV` is millivolts, `MV` megavolts), with the conveniences
 * `Ω` for `ohm`, `µ` for the micro prefix and `°C`/`°F`. `%` and `ppm` are accepted for plain
 * numbers (`'1'`).
 *
 * **Plain numbers** (a number, or a text without a unit) are returned as they are: they are
 * already SI (°C for temperatures, as everywhere in bridgework). mathjs is not even loaded for
 * them. NaN and ±Infinity are rejected.
 *
 * **Exactness**: when the unit's factor to SI is an exact power of ten (SI prefixes, `mV/V`,
 * `N/mm^2`, `bar`, `g`), the result is the double nearest the exact decimal value (the text's
 * exponent is shifted before `Number` reads it, so `"2.3 uA"` is 2.3e-6, not the
 * 2.2999999999999996e-6 of 2.3 × 1e-6). Other factors (`psi`, `lbf`, `in`, `degF`) are applied
 * by mathjs in double precision (a few ulps). Between `degC` and `K` the offset 273.15 K is added or
 * subtracted once.
 *
 * **Temperatures** are absolute: `"300 K"` for `'degC'` is 26.85. A temperature below absolute
 * zero is rejected.
 *
 * @param text - The quantity, e.g. `"350 ohm"`, or a plain number (already SI).
 * @param unit - The SI unit wanted: one of {@link SiUnit}. Typed as a string too, so the function
 * fits a `(text: string, unit: string) => number` converter slot; another string is an error.
 * @returns The value in `unit`.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` (text neither a string nor a
 * number, or a unit of another dimension: "'5 m' is a length; expected a resistance, such as '350 ohm'"), `parse-error`
 * (not a number followed by a unit, or an unknown unit), `not-finite` (NaN, ±Infinity, or a number beyond
 * the double range), `out-of-range` (below absolute zero), `invalid-option` (`unit` not an
 * {@link SiUnit}).
 * @example
 * ```ts
 * parseQuantity('350 ohm', 'ohm'); // 350
 * parseQuantity('1.2 kohm', 'ohm'); // 1200
 * parseQuantity('2 mV/V', 'V/V'); // 0.002
 * parseQuantity('561 mm^2', 'm^2'); // 0.000561
 * parseQuantity('300 K', 'degC'); // 26.850000000000023
 * parseQuantity('5', 'V'); // 5
 * ```
 */
export function parseQuantity(text: string | number, unit: SiUnit | string): number {
  if (!Object.hasOwn(targets, unit)) {
    throw new BridgeworkError(
      'invalid-option',
      `\`unit\` must be one of ${siUnits.join(', ')}; got '${String(unit)}'`,
      {
        param: 'unit',
        value: unit,
        limit: siUnits,
      },
    );
  }
  const target = targets[unit as SiUnit];
  if (typeof text === 'number') return checkPlain(text, String(text), unit as SiUnit);
  if (typeof text !== 'string') {
    throw new BridgeworkError(
      'wrong-type',
      `expected ${target.kind} as a number or a text such as '${target.example}'; got ${typeof text}`,
      {
        value: text,
      },
    );
  }
  const m = numberPattern.exec(text);
  if (m === null) {
    fail(
      'parse-error',
      text,
      `'${text}' is not a quantity: expected a number and a unit, such as '${target.example}'`,
    );
  }
  const mantissa = m[1] as string;
  const exponent = m[2] === undefined ? 0 : Number(m[2]);
  const unitText = m[3] as string;
  const plain = shifted(mantissa, exponent, 0);
  if (!Number.isFinite(plain))
    fail('not-finite', text, `'${text}' is beyond the range of double-precision numbers`);
  if (unitText === '') return checkPlain(plain, text, unit as SiUnit);
  if (unitText === '%' || unitText === 'ppm') {
    if (unit !== '1')
      fail(
        'wrong-type',
        text,
        `'${text}' is a plain fraction; expected ${target.kind}, such as '${target.example}'`,
      );
    return shifted(mantissa, exponent, unitText === '%' ? -2 : -6);
  }
  if (!unitPattern.test(unitText)) {
    fail(
      'parse-error',
      text,
      `'${text}' is not a quantity: after the number, only a unit such as '${target.example}' may follow (unit names with ^, * or /; no expressions)`,
    );
  }
  const normalized = normalizeUnit(unitText);
  let u: ParsedUnit;
  try {
    u = parseUnit(normalized);
  } catch {
    const hint = /^[kKmMuG]?[Oo]hms?$/.test(unitText)
      ? ' (unit names are case-sensitive: write ohm, kohm, Mohm or Ω)'
      : '';
    fail('parse-error', text, `'${text}': unknown unit '${unitText}'${hint}`);
  }
  const dimensionless = unit === 'V/V' || unit === '1';
  if (dimensionless ? !u.dimensionless : u.dimensionless || !u.sameDimension(unit === 'degC' ? 'K' : unit)) {
    fail(
      'wrong-type',
      text,
      `'${text}' is ${kindOf(u)}; expected ${target.kind}, such as '${target.example}'`,
    );
  }

  let value: number;
  if (unit === 'degC' || unit === 'K') {
    value = convertTemperature(u, mantissa, exponent, unit) ?? u.convert(plain, unit);
    const kelvin = unit === 'K' ? value : value + ZERO_CELSIUS_KELVIN;
    if (kelvin < 0) fail('out-of-range', text, `'${text}' is below absolute zero`);
  } else {
    let shift: number | undefined = 0;
    for (const f of u.factors) {
      const k1 = f.unitValue === undefined ? undefined : decimalExponent(f.unitValue);
      const k2 = decimalExponent(f.prefixValue);
      if (k1 === undefined || k2 === undefined || f.offset !== 0) {
        shift = undefined;
        break;
      }
      shift += f.power * (k1 + k2);
    }
    if (shift !== undefined) value = shifted(mantissa, exponent, shift);
    else value = dimensionless ? u.toSi(plain) : u.convert(plain, unit);
  }
  if (!Number.isFinite(value))
    fail('not-finite', text, `'${text}' is beyond the range of double-precision numbers`);
  return value;
}
