/**
 * The command's internal helpers take checked inputs (issue 15 item 11): every bad value in every
 * field of the plot functions' options, and bad arguments to the number formatting and batching
 * helpers, give a `BridgeworkError` (or a valid result), never a TypeError, a RangeError or a hang.
 */
import { isBridgeworkError } from '@bridgework/core';
import { describe, expect, it } from 'vitest';
import { barChart, type BarChartOptions } from '../src/html/barChart.js';
import { linePlot, type LinePlotOptions } from '../src/html/linePlot.js';
import { niceTicks } from '../src/html/niceTicks.js';
import { formatCode, formatNumber, formatPercent, formatStated } from '../src/report/formatNumber.js';
import { batchSizes } from '../src/uncertainty/batchedMonteCarlo.js';

const bad: readonly unknown[] = [
  NaN,
  Infinity,
  -Infinity,
  -1,
  0,
  1e308,
  -1e308,
  1e-308,
  'text',
  '',
  null,
  undefined,
  {},
  [],
  Array.from({ length: 1_000_000 }, (_, i) => i),
  'x'.repeat(100_000),
  Symbol('s'),
  () => 1,
  true,
];

/** Every path of an options object (nested objects and arrays down to their leaves). */
function paths(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  const out: (string | number)[][] = prefix.length > 0 ? [prefix] : [];
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...paths(v, [...prefix, i])));
  else if (typeof value === 'object' && value !== null)
    for (const [k, v] of Object.entries(value)) out.push(...paths(v, [...prefix, k]));
  return out;
}

function withValue<T>(base: T, path: readonly (string | number)[], v: unknown): T {
  const copy = structuredClone(base) as Record<string | number, unknown>;
  let x = copy as Record<string | number, unknown>;
  for (const k of path.slice(0, -1)) x = x[k] as Record<string | number, unknown>;
  x[path[path.length - 1] as string | number] = v;
  return copy as T;
}

/** A short description of a test value. */
const describeValue = (v: unknown): string =>
  Array.isArray(v) ? `an array of ${v.length}` : typeof v === 'symbol' ? 'a symbol' : String(v).slice(0, 40);

/** Calls `f` and returns 'ok' or the error's code; anything but a BridgeworkError fails. */
function outcome(f: () => unknown, what: () => string): string {
  try {
    f();
    return 'ok';
  } catch (e) {
    if (!isBridgeworkError(e)) expect.fail(`${what()}: ${String(e)}`);
    return (e as { code: string }).code;
  }
}

const line: LinePlotOptions = {
  id: 'p',
  title: 'Output',
  x: { label: 'Load', unit: 'kN', min: 0, max: 10 },
  y: { label: 'Ratio', unit: 'mV/V' },
  series: [
    { name: 'exact', x: [0, 5, 10], y: [0, 1, 2], dashed: false, color: '#000' },
    { name: 'line', x: [0, 10], y: [0, 2] },
  ],
  width: 560,
  height: 340,
};

const bars: BarChartOptions = {
  id: 'b',
  title: 'Budget',
  categories: ['noise', 'gauge factor', 'combined'],
  value: { label: 'Standard uncertainty', unit: 'µε' },
  series: [
    { name: 'u', values: [0.4, 0.05, 0.6], color: '#123' },
    { name: 'v', values: [-0.4, 1e-9, 3] },
  ],
  emphasize: [2],
  width: 560,
};

describe('CLI helpers take checked inputs', () => {
  it('the base options draw', () => {
    expect(linePlot(line).seriesCount).toBe(2);
    expect(barChart(bars).seriesCount).toBe(2);
  });

  it.each([
    ['linePlot', line, (o: unknown) => linePlot(o as LinePlotOptions)],
    ['barChart', bars, (o: unknown) => barChart(o as BarChartOptions)],
  ] as const)('%s: every bad value in every field is a BridgeworkError or a drawing', (name, base, draw) => {
    let calls = 0;
    const codes = new Set<string>();
    for (const path of paths(base)) {
      for (const v of bad) {
        const o = withValue(base, path, v);
        codes.add(
          outcome(
            () => draw(o),
            () => `${name} ${path.join('.')} = ${describeValue(v)}`,
          ),
        );
        calls++;
      }
    }
    // Unknown and misspelt options, and not an object at all.
    for (const v of [null, undefined, 5, 'x', []])
      codes.add(
        outcome(
          () => draw(v),
          () => `${name}(${describeValue(v)})`,
        ),
      );
    expect(
      outcome(
        () => draw({ ...base, widht: 600 }),
        () => `${name} misspelt`,
      ),
    ).toBe('unknown-option');
    expect(calls).toBeGreaterThan(300);
    expect(codes.has('ok')).toBe(true);
    expect(codes.size).toBeGreaterThan(3);
  });

  it('barChart refuses 10⁶ categories at once (at most 200)', () => {
    const n = 1_000_000;
    const big = {
      ...bars,
      categories: Array.from({ length: n }, (_, i) => `c${i}`),
      series: [{ name: 'u', values: new Float64Array(n) }],
      emphasize: [],
    } as unknown as BarChartOptions;
    expect(() => barChart(big)).toThrowBridgeworkError('out-of-range', { param: 'categories' });
  });

  it('barChart shortens a very long category label without a search', () => {
    const chart = barChart({ ...bars, categories: ['x'.repeat(500), 'b', 'c'] });
    expect(chart.svg).toContain(`<title>${'x'.repeat(500)}</title>`);
    expect(chart.svg).toMatch(/>x+…<\/text>/);
  });

  it('formatCode, formatNumber, formatStated and formatPercent never throw an untyped error', () => {
    for (const v of bad) {
      for (const [name, f] of [
        ['formatCode', formatCode],
        ['formatNumber', formatNumber],
        ['formatStated', formatStated],
        ['formatPercent', formatPercent],
      ] as const) {
        const r = outcome(
          () => f(v as number),
          () => `${name}(${describeValue(v)})`,
        );
        if (typeof v === 'number') expect(r, `${name}(${v})`).toBe('ok');
      }
    }
    expect(formatCode(-13339.47)).toBe('−13339.5');
    expect(formatCode(1e21)).toBe('1.00000e21');
    expect(formatCode(NaN)).toBe('NaN');
  });

  it('batchSizes and niceTicks refuse what they cannot do', () => {
    expect(() => batchSizes(Infinity)).toThrowBridgeworkError('not-finite');
    expect(() => batchSizes(1e12)).toThrowBridgeworkError('out-of-range');
    expect(batchSizes(25_000)).toEqual([8334, 8333, 8333]);
    for (const [lo, hi] of [
      [NaN, 1],
      [0, Infinity],
      [1, 0],
      [-1e308, 1e308],
    ] as const)
      outcome(
        () => niceTicks(lo, hi),
        () => `niceTicks(${lo}, ${hi})`,
      );
  });
});
