import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseQuantity, siUnits, type SiUnit } from '../src/units/parseQuantity.js';
import { exited, spawnTs, waitForLine } from './support/spawnChild.js';

describe('parseQuantity: conversions checked against exact definitions', () => {
  // Exact definitions (NIST SP 811, 2008 edition, Appendix B; the inch since 1959, the pound-force
  // from the avoirdupois pound 0.45359237 kg and standard gravity 9.80665 m/s²).
  it.each([
    ['1 in', 'm', 0.0254],
    ['3 ft', 'm', 3 * 0.3048],
    ['1 lbf', 'N', 0.45359237 * 9.80665],
    ['2 kgf', 'N', 2 * 9.80665],
    ['1 lbm', 'kg', 0.45359237],
    ['1 h', 's', 3600],
    ['1.5 min', 's', 90],
  ] as const)('%s = %s %s', (text, unit, expected) => {
    // mathjs applies these factors in double precision: a few ulps.
    expect(parseQuantity(text, unit)).toBeNear(expected, { rel: 4e-16 });
  });

  it('psi against the exact 0.45359237 kg × 9.80665 m/s² / (0.0254 m)²', () => {
    // mathjs stores psi as 6894.75729276459 Pa, 6e-11 relative below the exact 6894.757293168361 Pa
    // (NIST SP 811 rounds it to 6.894 757 E+03): well inside 1e-10.
    expect(parseQuantity('30 psi', 'Pa')).toBeNear((30 * 0.45359237 * 9.80665) / 0.0254 ** 2, { rel: 1e-10 });
  });

  it('temperatures: Celsius, kelvin and Fahrenheit (t/°C = (t/°F − 32)/1.8)', () => {
    expect(parseQuantity('25 degC', 'degC')).toBe(25);
    expect(parseQuantity('25 degC', 'K')).toBe(25 + 273.15);
    expect(parseQuantity('300 K', 'degC')).toBe(300 - 273.15); // one subtraction: 26.850000000000023
    expect(parseQuantity('77 degF', 'degC')).toBeNear(25, { rel: 1e-15 });
    expect(parseQuantity('-40 degF', 'degC')).toBeNear(-40, { rel: 1e-15 });
    expect(parseQuantity('25 °C', 'degC')).toBe(25);
    expect(parseQuantity('0 K', 'degC')).toBe(-273.15);
    expect(parseQuantity('20 mK', 'K')).toBe(0.02);
  });
});

describe('parseQuantity: exact decimal scaling for power-of-ten units', () => {
  it('gives the double nearest the exact value, not a product with rounding error', () => {
    // What a naive factor gives: 2.3 × 1e-6 = 2.2999999999999996e-6 and 1.1 × 0.01 = 0.011000000000000001.
    expect(2.3 * 1e-6).not.toBe(2.3e-6);
    expect(parseQuantity('2.3 uA', 'A')).toBe(2.3e-6);
    expect(parseQuantity('1.1 cm', 'm')).toBe(0.011);
    expect(parseQuantity('1.1 kohm', 'ohm')).toBe(1100);
    expect(parseQuantity('4.7 kΩ', 'ohm')).toBe(4700);
    expect(parseQuantity('2 mV/V', 'V/V')).toBe(0.002);
    expect(parseQuantity('0.1 mV / V', 'V/V')).toBe(0.0001);
    expect(parseQuantity('561 mm^2', 'm^2')).toBe(0.000561);
    expect(parseQuantity('205 GPa', 'Pa')).toBe(205e9);
    expect(parseQuantity('235 N/mm^2', 'Pa')).toBe(235e6);
    expect(parseQuantity('2.5 bar', 'Pa')).toBe(250000);
    expect(parseQuantity('350 g', 'kg')).toBe(0.35);
    expect(parseQuantity('2.5 µV', 'V')).toBe(2.5e-6);
    expect(parseQuantity('2.5 μV', 'V')).toBe(2.5e-6); // Greek small mu (U+03BC) as well as the micro sign
    expect(parseQuantity('2.5 uV', 'V')).toBe(2.5e-6);
    expect(parseQuantity('1e3 mA', 'A')).toBe(1);
    expect(parseQuantity('4 mA*V', 'W')).toBe(0.004);
    expect(parseQuantity('10 kHz', 'Hz')).toBe(1e4);
    expect(parseQuantity('100 ms', 's')).toBe(0.1);
    expect(parseQuantity('5%', '1')).toBe(0.05);
    expect(parseQuantity('250 ppm', '1')).toBe(0.00025);
  });

  it('matches Number() of the shifted decimal for any mantissa and SI prefix (property)', () => {
    // ECMAScript's Number() of a decimal string is correctly rounded: an independent reference.
    const prefixes = [
      ['G', 9],
      ['M', 6],
      ['k', 3],
      ['', 0],
      ['m', -3],
      ['u', -6],
      ['n', -9],
      ['p', -12],
    ] as const;
    fc.assert(
      fc.property(
        fc.integer({ min: -999_999_999, max: 999_999_999 }),
        fc.integer({ min: 0, max: 9 }),
        fc.integer({ min: -20, max: 20 }),
        fc.constantFrom(...prefixes),
        fc.constantFrom(
          ['ohm', 'ohm'],
          ['V', 'V'],
          ['A', 'A'],
          ['Pa', 'Pa'],
          ['N', 'N'],
          ['Hz', 'Hz'],
          ['W', 'W'],
        ),
        (digits, point, exp, [prefix, k], [unitName, unit]) => {
          const s = String(Math.abs(digits)).padStart(point + 1, '0');
          const mantissa = `${digits < 0 ? '-' : ''}${s.slice(0, s.length - point)}.${s.slice(s.length - point)}`;
          const text = `${mantissa}e${exp} ${prefix}${unitName}`;
          expect(parseQuantity(text, unit as SiUnit)).toBe(Number(`${mantissa}e${exp + k}`));
        },
      ),
      { numRuns: 400 },
    );
  });

  it('passes plain numbers through unchanged, as SI (property over all finite doubles)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e300, max: 1e300 }), (x) => {
        expect(parseQuantity(String(x), 'V')).toBe(x === 0 ? 0 : x);
      }),
      { numRuns: 300 },
    );
  });

  it('does not load mathjs for plain numbers (fresh process)', async () => {
    const p = spawnTs(fileURLToPath(new URL('./support/lazyMathChild.ts', import.meta.url)), []);
    const m = await waitForLine(p, /^(\{.*\})$/);
    await exited(p);
    expect(JSON.parse(m[1] as string)).toEqual({
      plain: [350, -0.0025, 25],
      afterPlain: false,
      withUnit: 350,
      afterUnit: true,
    });
  });
});

describe('parseQuantity: dimension checks', () => {
  it.each([
    ['5 m', 'ohm', "'5 m' is a length; expected a resistance, such as '350 ohm'"],
    ['100 kg', 'N', "'100 kg' is a mass; expected a force, such as '84 kN'"],
    ['2 mV/V', 'V', "'2 mV/V' is a dimensionless ratio; expected a voltage, such as '5 V'"],
    ['5 V', 'V/V', "'5 V' is a voltage; expected a dimensionless ratio, such as '2 mV/V'"],
    ['3 m/s', 'm', "'3 m/s' is a velocity; expected a length, such as '12 m'"],
    ['12 kg/m', 'kg', "'12 kg/m' is a quantity in kg / m; expected a mass, such as '500 kg'"],
    ['25 degC', 's', "'25 degC' is a temperature; expected a time, such as '100 ms'"],
    ['5 %', 'V', "'5 %' is a plain fraction; expected a voltage, such as '5 V'"],
    ['1 ohm', '1', "'1 ohm' is a resistance; expected a plain number, such as '0.3'"],
    ['561 mm', 'm^2', "'561 mm' is a length; expected an area, such as '561 mm^2'"],
  ] as const)('%s as %s', (text, unit, message) => {
    expect(() => parseQuantity(text, unit)).toThrowBridgeworkError('wrong-type');
    expect(() => parseQuantity(text, unit)).toThrow(message);
  });

  it('accepts every SI unit it names, given in that unit', () => {
    for (const u of siUnits) {
      const text = u === '1' ? '2' : u === 'V/V' ? '2 V/V' : `2 ${u}`;
      expect(parseQuantity(text, u), u).toBe(2);
    }
  });
});

describe('parseQuantity: only a number and a unit, never an expression', () => {
  it.each([
    ['', /not a quantity/],
    ['abc', /not a quantity/],
    ['ohm', /not a quantity/],
    ['5 + 3 ohm', /only a unit/],
    ['2*3 V', /only a unit/],
    ['(5) V', /not a quantity/],
    ['5 (V)', /only a unit/],
    ['sqrt(4) V', /not a quantity/],
    ['5 V; 6 V', /only a unit/],
    ['5 ohm ohm', /only a unit/],
    ['1,5 V', /only a unit/],
    ['NaN', /not a quantity/],
    ['Infinity V', /not a quantity/],
    ['0x10 V', /only a unit/],
    ['5 foo', /unknown unit 'foo'/],
    ['5 Ohm', /unit names are case-sensitive: write ohm, kohm, Mohm or Ω/],
    ['5 V^x', /only a unit/],
  ])('%j', (text, message) => {
    expect(() => parseQuantity(text, 'V')).toThrowBridgeworkError('parse-error');
    expect(() => parseQuantity(text, 'V')).toThrow(message);
  });

  it('rejects numbers beyond the double range and temperatures below absolute zero', () => {
    expect(() => parseQuantity('1e999 V', 'V')).toThrowBridgeworkError('not-finite');
    expect(() => parseQuantity('1e999', 'V')).toThrowBridgeworkError('not-finite');
    expect(() => parseQuantity('1e300 GV', 'V')).toThrowBridgeworkError('not-finite');
    expect(() => parseQuantity('-274 degC', 'degC')).toThrowBridgeworkError('out-of-range');
    expect(() => parseQuantity('-1 K', 'degC')).toThrowBridgeworkError('out-of-range');
    expect(() => parseQuantity('-500', 'degC')).toThrowBridgeworkError('out-of-range');
    expect(() => parseQuantity('-1', 'K')).toThrowBridgeworkError('out-of-range');
    expect(() => parseQuantity('-500 degF', 'degC')).toThrowBridgeworkError('out-of-range');
  });

  it('takes plain numbers as SI, but never NaN, ±Infinity or a temperature below absolute zero', () => {
    expect(parseQuantity(350, 'ohm')).toBe(350);
    expect(parseQuantity(-273.15, 'degC')).toBe(-273.15);
    expect(() => parseQuantity(NaN, 'ohm')).toThrowBridgeworkError('not-finite');
    expect(() => parseQuantity(-Infinity, 'V')).toThrowBridgeworkError('not-finite');
    expect(() => parseQuantity(-274, 'degC')).toThrowBridgeworkError('out-of-range');
    // Fits a converter slot typed (text: string, unit: string) => number.
    const slot: (text: string, unit: string) => number = parseQuantity;
    expect(slot('2 mV/V', 'V/V')).toBe(0.002);
  });

  it('rejects other types and an unknown target unit', () => {
    expect(() => parseQuantity(true as unknown as string, 'ohm')).toThrowBridgeworkError('wrong-type');
    expect(() => parseQuantity(null as unknown as string, 'ohm')).toThrowBridgeworkError('wrong-type');
    expect(() => parseQuantity('5 V', 'volt' as SiUnit)).toThrowBridgeworkError('invalid-option', {
      param: 'unit',
    });
  });

  it('keeps negative values (sign checks are the schema’s job)', () => {
    expect(parseQuantity('-350 ohm', 'ohm')).toBe(-350);
    expect(parseQuantity('+5 V', 'V')).toBe(5);
  });
});
