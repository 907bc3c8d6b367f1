import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { nearestPreferredValue, preferredSeries, preferredValues } from '@bridgework/calibration';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });
/** The generating formula of IEC 60063, round(10^(i/n)) to 2 (E3–E24) or 3 (E48–E192) figures. */
const formula = (i: number, n: number): number => {
  const digits = n <= 24 ? 2 : 3;
  const mantissa = new D(10).pow(new D(i).div(n)).times(10 ** (digits - 1));
  return mantissa.toDecimalPlaces(0).toNumber() / 10 ** (digits - 1);
};

describe('preferredValues: the tables of IEC 60063:2015', () => {
  it('have n values per decade and follow 10^(i/n) except where the standard keeps other values', () => {
    // IEC 60063:2015, Tables 1 and 2 (from memory): E24 keeps 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7
    // and 8.2 (the formula gives 2.6 … 4.6 and 8.3); E192 keeps 9.20 (the formula gives 9.19);
    // every other value is the formula's. E3–E12 inherit E24's exceptions.
    const exceptions: Record<string, readonly number[]> = {
      E3: [4.7],
      E6: [3.3, 4.7],
      E12: [2.7, 3.3, 3.9, 4.7, 8.2],
      E24: [2.7, 3, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2],
      E48: [],
      E96: [],
      E192: [9.2],
    };
    for (const series of preferredSeries) {
      const n = Number(series.slice(1));
      const values = preferredValues(series);
      expect(values).toHaveLength(n);
      const differing = values.filter((v, i) => v !== formula(i, n));
      expect(differing, series).toEqual(exceptions[series]);
    }
  });

  it('E96 is every second E192 value and E12 every second E24 value (IEC 60063 nesting)', () => {
    expect(preferredValues('E96')).toEqual(preferredValues('E192').filter((_, i) => i % 2 === 0));
    expect(preferredValues('E12')).toEqual(preferredValues('E24').filter((_, i) => i % 2 === 0));
    expect(preferredValues('E12')).toEqual([1, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]);
  });
});

describe('nearestPreferredValue', () => {
  it('picks shunt resistors (hand-checked against the tables)', () => {
    // 174 650 Ω (350 Ω, GF 2, 1000 µε): E96 neighbours 174 k and 178 k; E24 neighbours 160 k and 180 k.
    expect(nearestPreferredValue({ value: 174_650, series: 'E96' }).value).toBe(174_000);
    expect(nearestPreferredValue({ value: 174_650, series: 'E192' }).value).toBe(174_000);
    expect(nearestPreferredValue({ value: 174_650, series: 'E24' }).value).toBe(180_000);
    expect(nearestPreferredValue({ value: 174_650, series: 'E24', rounding: 'down' }).value).toBe(160_000);
    expect(nearestPreferredValue({ value: 43_575, series: 'E96' }).value).toBe(43_200);
    const p = nearestPreferredValue({ value: 59_000, series: 'E96' });
    expect(p.value).toBe(59_000);
    expect(p.index).toBe(74);
    expect(p.deviationFraction).toBe(0);
    // Across a decade end: 9.9 kΩ in E24 lies between 9.1 k and 10 k.
    expect(nearestPreferredValue({ value: 9_900, series: 'E24' }).value).toBe(10_000);
    expect(nearestPreferredValue({ value: 9.87e-3, series: 'E192', rounding: 'down' }).value).toBe(9.76e-3);
  });

  it('is the nearest by ratio, and up/down bracket the value (fast-check over 1e-200 … 1e200)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -200, max: 200, noNaN: true }),
        fc.constantFrom(...preferredSeries),
        (exponent, series) => {
          const value = 10 ** exponent;
          const near = nearestPreferredValue({ value, series });
          const up = nearestPreferredValue({ value, series, rounding: 'up' }).value;
          const down = nearestPreferredValue({ value, series, rounding: 'down' }).value;
          expect(down <= value && value <= up).toBe(true);
          expect([down, up]).toContain(near.value);
          const logDistance = (v: number): number => Math.abs(Math.log(v / value));
          // Nearer by ratio than the other bracket end (ties within rounding either way).
          expect(logDistance(near.value)).toBeLessThanOrEqual(
            Math.min(logDistance(up), logDistance(down)) + 1e-12,
          );
          // Every pick is a table value times a power of ten.
          const decade = near.value / 10 ** Math.floor(Math.log10(near.value) + 1e-12);
          expect(decade).toBeNear(preferredValues(series)[near.index]!, { rel: 1e-12 });
          expect(near.deviationFraction).toBeNear((near.value - value) / value, { rel: 1e-15, abs: 1e-300 });
        },
      ),
      { numRuns: 500 },
    );
  });

  it.each([
    ['options.valeu', { valeu: 1, series: 'E96' }, 'unknown-option'],
    ['options.series', { value: 1 }, 'missing-option'],
    ['series', { value: 1, series: 'E97' }, 'invalid-option'],
    ['rounding', { value: 1, series: 'E96', rounding: 'ceil' }, 'invalid-option'],
    ['value', { value: 0, series: 'E96' }, 'out-of-range'],
    ['value', { value: Number.NaN, series: 'E96' }, 'not-finite'],
    ['value', { value: 1e300, series: 'E96' }, 'out-of-range'],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => nearestPreferredValue(options as never)).toThrowBridgeworkError(code, { param });
  });
});
