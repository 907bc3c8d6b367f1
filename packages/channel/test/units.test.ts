import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  defaultOutputUnit,
  dimensionTable,
  dimensions,
  formatQuantity,
  outputQuantities,
  parseQuantity,
} from '@bridgework/channel';
import { findUnit } from '../src/units/quantity.js';

describe('parseQuantity: the channel package’s table-driven units', () => {
  it('reads exact decimal factors exactly (one rounding of the exact product)', () => {
    // Definitions (NIST SP 811 appendix B, from memory): 1 lb = 0.45359237 kg, 1 lbf = 4.4482216152605 N,
    // 1 in = 0.0254 m, 1 bar = 1e5 Pa, 1 t = 1000 kg, 1 kgf = 9.80665 N (standard gravity, CGPM 1901).
    expect(parseQuantity('20 t', 'kg')).toBe(20_000);
    expect(parseQuantity('100 lbf', 'N')).toBe(444.82216152605);
    expect(parseQuantity('2 lb', 'kg')).toBe(0.90718474);
    expect(parseQuantity('3 in', 'm')).toBe(0.0762);
    expect(parseQuantity('2.5 bar', 'Pa')).toBe(250_000);
    expect(parseQuantity('1000 kgf', 'N')).toBe(9806.65);
    expect(parseQuantity('2.3 µA', 'A')).toBe(2.3e-6); // not 2.3 × 1e-6 = 2.2999999999999996e-6
    expect(parseQuantity('2 mV/V', 'V/V')).toBe(0.002);
    expect(parseQuantity('561 mm²', 'm²')).toBe(0.000561);
    expect(parseQuantity('561 mm^2', 'm²')).toBe(0.000561);
    expect(parseQuantity('1200 µε', 'm/m')).toBe(0.0012);
    expect(parseQuantity('1200 ue', 'm/m')).toBe(0.0012);
    expect(parseQuantity('0.5 %', '')).toBe(0.005);
    expect(parseQuantity('20 ppm/K', '1/K')).toBe(2e-5);
    expect(parseQuantity('8 nV/√Hz', 'V/√Hz')).toBe(8e-9);
    expect(parseQuantity('12 kN·m', 'N·m')).toBe(12_000);
    expect(parseQuantity('12 kN*m', 'N·m')).toBe(12_000);
    // lbf·ft = 4.4482216152605 × 0.3048 = 1.35581794833140040 N·m exactly.
    expect(parseQuantity('100 lbf·ft', 'N·m')).toBe(135.58179483314004);
    // Into a unit of the same table: kN from N is a power of ten, one rounding.
    expect(parseQuantity('84000 N', 'kN')).toBe(84);
    expect(parseQuantity('350', 'Ω')).toBe(350);
    expect(parseQuantity(350, 'kΩ')).toBe(350);
  });

  it('psi and ksi (no finite decimal factor) within an ulp or two of a 40-digit product', () => {
    // 1 psi = 4.4482216152605 N / 0.00064516 m² = 6894.757293168361336… Pa.
    expect(parseQuantity('1 psi', 'Pa')).toBeNear(6894.757293168361, { ulps: 1 });
    expect(parseQuantity('14.5 psi', 'Pa')).toBeNear(99973.98075094124, { ulps: 2 });
    expect(parseQuantity('2 ksi', 'MPa')).toBeNear(13.789514586336722, { ulps: 2 });
  });

  it('temperatures are absolute and never below absolute zero; differences are kelvins', () => {
    expect(parseQuantity('300 K', '°C')).toBe(26.85);
    expect(parseQuantity('-40 °F', '°C')).toBe(-40);
    expect(parseQuantity('212 degF', '°C')).toBe(100);
    expect(parseQuantity('25 °C', 'K')).toBe(298.15);
    expect(parseQuantity('2 K', 'K')).toBe(2);
    expect(() => parseQuantity('-300 °C', '°C')).toThrowBridgeworkError('out-of-range');
    expect(() => parseQuantity('-1 K', '°C')).toThrowBridgeworkError('out-of-range');
  });

  it('refuses other dimensions, unknown units, expressions and overflow in the user’s terms', () => {
    expect(() => parseQuantity('5 m', 'V')).toThrowBridgeworkError('wrong-type');
    expect(() => parseQuantity('5 m', 'V')).toThrow("'5 m' is a length; expected a voltage, such as '5 V'");
    expect(() => parseQuantity('5 Vv', 'V')).toThrowBridgeworkError('parse-error');
    expect(() => parseQuantity('2*2.5 V', 'V')).toThrow(/no expressions/);
    expect(() => parseQuantity('1e400 V', 'V')).toThrowBridgeworkError('not-finite');
    expect(() => parseQuantity('five volts', 'V')).toThrowBridgeworkError('parse-error');
    expect(() => parseQuantity('5 V', 'furlong')).toThrowBridgeworkError('invalid-option', { param: 'unit' });
    expect(() => parseQuantity(Number.NaN, 'V')).toThrowBridgeworkError('not-finite');
  });

  it('round trip: a value written in any unit of its dimension reads back (within one rounding)', () => {
    // A symbol names the first dimension of the table that has it ('K' is a temperature, not a difference).
    const first = (symbol: string) =>
      dimensions.find((d) =>
        dimensionTable[d].units.some((u) => u.symbol === symbol || u.aliases.includes(symbol)),
      );
    for (const d of dimensions) {
      if (d === 'temperature') continue;
      const si = dimensionTable[d].si;
      if (si === '' || first(si) !== d) continue; // a plain number is read in the unit asked for
      for (const unit of dimensionTable[d].units) {
        if (unit.symbol !== '' && first(unit.symbol) !== d) continue;
        fc.assert(
          fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (x) => {
            // Written in the unit, read in the dimension's own unit, written again there and read back.
            const inSi = parseQuantity(`${String(x)} ${unit.symbol}`, si);
            const back = parseQuantity(`${String(inSi)}${si === '' ? '' : ` ${si}`}`, unit.symbol);
            expect(back).toBeNear(x, { ulps: 4, abs: 1e-290 });
          }),
          { numRuns: 20 },
        );
      }
    }
  });

  it('formats figures for messages with four significant digits and the unit', () => {
    expect(formatQuantity(181.23456, '°C')).toBe('181.2 °C');
    expect(formatQuantity(30926.4, 'µε')).toBe('30926 µε');
    expect(formatQuantity(1.5e-7, 'V')).toBe('1.5e-7 V');
    expect(formatQuantity(0.35, '')).toBe('0.35');
  });
});

describe('typed errors at the unit helpers (issue 15, fuzz findings)', () => {
  it('parseQuantity: a unit that is not a string is wrong-type naming unit', () => {
    for (const unit of [1, null, undefined, {}, [], Number.NaN]) {
      expect(() => parseQuantity('350 Ω', unit as unknown as string)).toThrowBridgeworkError('wrong-type', {
        param: 'unit',
      });
    }
    expect(() => parseQuantity({} as unknown as string, 'Ω')).toThrowBridgeworkError('wrong-type', {
      param: 'text',
    });
  });

  it('formatQuantity: digits outside the integers 1…100 are typed errors naming digits', () => {
    expect(() => formatQuantity(1, 'V', 0)).toThrowBridgeworkError('out-of-range', { param: 'digits' });
    expect(() => formatQuantity(1, 'V', 101)).toThrowBridgeworkError('out-of-range', { param: 'digits' });
    expect(() => formatQuantity(1, 'V', 2.5)).toThrowBridgeworkError('not-integer', { param: 'digits' });
    expect(() => formatQuantity(1, 'V', Number.NaN)).toThrowBridgeworkError('not-finite', {
      param: 'digits',
    });
    expect(() => formatQuantity(1, 'V', '3' as unknown as number)).toThrowBridgeworkError('wrong-type', {
      param: 'digits',
    });
    expect(() => formatQuantity('1' as unknown as number, 'V')).toThrowBridgeworkError('wrong-type', {
      param: 'value',
    });
    expect(() => formatQuantity(1, 3 as unknown as string)).toThrowBridgeworkError('wrong-type', {
      param: 'unit',
    });
    // The ends of the range are accepted (toPrecision's own limits).
    expect(formatQuantity(1.25, 'V', 1)).toBe('1 V');
    expect(formatQuantity(0.5, 'V', 100)).toBe('0.5 V');
  });

  it('defaultOutputUnit: an unknown quantity is invalid-option naming quantity, listing the choices', () => {
    expect(() => defaultOutputUnit('presure' as never)).toThrowBridgeworkError('invalid-option', {
      param: 'quantity',
    });
    expect(() => defaultOutputUnit(0 as never)).toThrowBridgeworkError('invalid-option', {
      param: 'quantity',
    });
    // Every listed quantity has a unit of its dimension.
    for (const q of outputQuantities) expect(typeof defaultOutputUnit(q)).toBe('string');
    expect(defaultOutputUnit('pressure')).toBe('Pa');
    expect(defaultOutputUnit('temperature')).toBe('°C');
  });
});

describe('findUnit: a name already in normal form is found without normalizing it again', () => {
  it('finds every symbol and alias, as written and with spacing and look-alike signs, as the same unit', () => {
    // The fast path looks the text up as it is first; it must agree with the normalized lookup.
    const variants = (name: string): string[] => [
      name,
      ` ${name} `,
      name.replace(/·/g, ' * '),
      name.replace(/·/g, '×'),
      name.replace(/\//g, ' / '),
      name.replace(/µ/g, 'μ'), // U+03BC for U+00B5
    ];
    let checked = 0;
    for (const dimension of dimensions) {
      for (const unit of dimensionTable[dimension].units) {
        const expected = findUnit(dimension, unit.symbol);
        expect(expected?.unit.symbol, `${dimension} ${unit.symbol}`).toBe(unit.symbol);
        for (const name of [unit.symbol, ...unit.aliases]) {
          const found = findUnit(dimension, name);
          for (const v of variants(name)) {
            expect(findUnit(dimension, v), `${dimension} '${v}'`).toBe(found);
            checked++;
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(300);
    expect(findUnit('resistance', 'kΩ ')?.unit.symbol).toBe('kΩ');
    expect(findUnit('resistance', 'furlong')).toBeUndefined();
  });
});
