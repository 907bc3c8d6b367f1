import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { barChart } from '../src/html/barChart.js';
import { linePlot } from '../src/html/linePlot.js';
import { formatTick, niceTicks } from '../src/html/niceTicks.js';

const attr = (svg: string, name: string): string[] =>
  [...svg.matchAll(new RegExp(`${name}="([^"]*)"`, 'g'))].map((m) => m[1] as string);
const texts = (svg: string, cls: string): string[] =>
  [...svg.matchAll(new RegExp(`<text class="${cls}"[^>]*>(?:<title>[^<]*</title>)?([^<]*)</text>`, 'g'))].map(
    (m) => m[1] as string,
  );

describe('niceTicks (Heckbert, "Nice numbers for graph labels", Graphics Gems 1990)', () => {
  it.each([
    // Derived by hand from the algorithm: range → nice(hi − lo), step → nice(range/(count − 1), rounded).
    [0, 1, 6, 0.2, 0, 1], // nice(1) = 1; 1/5 = 0.2 → 0.2
    [0, 100, 6, 20, 0, 100], // nice(100) = 100; 20 → 20
    [0.13, 9.7, 6, 2, 0, 10], // nice(9.57) = 10; 2 → 2
    [-0.0031, 0.0042, 6, 0.002, -0.004, 0.006], // nice(0.0073) = 0.01; 0.002 → 0.002
    [-1.3, 2.7, 6, 1, -2, 3], // nice(4) = 5; 1 → 1
    [3e6, 7.2e6, 7, 1e6, 3e6, 8e6], // nice(4.2e6) = 5e6; 5e6/6 = 8.3e5 → 1e6
    [0, 0, 6, 0.5, -1, 1], // zero width at 0: widened to ±1; nice(2) = 2; 0.4 → 0.5
  ])('niceTicks(%d, %d, %d): step %d over [%d, %d]', (lo, hi, count, step, min, max) => {
    const t = niceTicks(lo, hi, count);
    expect(t.step).toBe(step);
    expect([t.min, t.max]).toEqual([min, max]);
  });

  it('covers the data with evenly spaced 1-2-5 steps whose labels print exactly (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.double({ min: 1e-6, max: 1e9, noNaN: true }),
        fc.integer({ min: 2, max: 12 }),
        (lo, width, count) => {
          const hi = lo + width;
          const t = niceTicks(lo, hi, count);
          // Covered up to the documented slack of 1e-9 of a step (rounding noise is not a new tick),
          // plus the rounding of lo/step itself (an ulp of lo/step, at most ~1e-10 of a step here).
          expect(t.min).toBeLessThanOrEqual(lo + 2e-9 * t.step);
          expect(t.max).toBeGreaterThanOrEqual(hi - 2e-9 * t.step);
          const mantissa = t.step / 10 ** Math.floor(Math.log10(t.step));
          expect([1, 2, 5, 10].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
          expect(t.values.length).toBeGreaterThanOrEqual(2);
          expect(t.values.length).toBeLessThanOrEqual(2 * count + 2);
          t.values.forEach((v, i) => {
            expect(v).toBeNear(t.min + i * t.step, { rel: 1e-12, abs: 1e-12 * t.step });
            // No floating-point noise such as 0.30000000000000004 in a label.
            if (t.step >= 1e-4 && Math.abs(v) < 1e6) {
              expect(Number(v.toFixed(t.decimals))).toBe(v);
              expect((String(v).split('.')[1] ?? '').length).toBeLessThanOrEqual(t.decimals);
            }
          });
        },
      ),
      { numRuns: 500 },
    );
  });

  it('never gives 0.30000000000000004 or −0', () => {
    expect(niceTicks(0.1, 0.9).values).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(0.3, 0.7, 5).values).toEqual([0.3, 0.4, 0.5, 0.6, 0.7]);
    expect(Object.is(niceTicks(-1, 1).values[2], 0)).toBe(true);
  });

  it('rejects non-finite and reversed ranges', () => {
    expect(() => niceTicks(NaN, 1)).toThrowBridgeworkError('not-finite', { param: 'lo' });
    expect(() => niceTicks(0, Infinity)).toThrowBridgeworkError('not-finite', { param: 'hi' });
    expect(() => niceTicks(2, 1)).toThrowBridgeworkError('out-of-range', { param: 'hi' });
    expect(() => niceTicks(0, 1, 1)).toThrowBridgeworkError('out-of-range', { param: 'count' });
  });

  it('formats tick labels with a true minus and exponents for extreme ranges', () => {
    const t = niceTicks(-1, 1);
    expect(t.values.map((v) => formatTick(v, t))).toEqual(['−1.0', '−0.5', '0', '0.5', '1.0']);
    const big = niceTicks(0, 5e7);
    expect(formatTick(2e7, big)).toBe('2e+7');
    const small = niceTicks(0, 4e-6);
    expect(formatTick(small.values[1] as number, small)).toBe('1e-6');
  });
});

describe('linePlot', () => {
  const x = [0, 25, 50, 75, 100];
  const plot = linePlot({
    id: 'output',
    title: 'Output against load',
    x: { label: 'Load', unit: 'kN' },
    y: { label: 'Output', unit: 'mV/V' },
    series: [
      { name: 'exact', x, y: [0, 0.5, 1, 1.5, 2] },
      { name: 'linear', x, y: [0, 0.5, 1, 1.5, 2], dashed: true },
    ],
  });

  it('marks up its series, legend and labelled axes for scripts and tests', () => {
    expect(plot.seriesCount).toBe(2);
    expect(
      plot.svg.startsWith(
        '<svg xmlns="http://www.w3.org/2000/svg" class="bw-plot bw-line-plot" data-plot="output" data-series-count="2"',
      ),
    ).toBe(true);
    expect([...plot.svg.matchAll(/<g class="bw-series" data-series="([^"]*)"/g)].map((m) => m[1])).toEqual([
      'exact',
      'linear',
    ]);
    expect(
      [...plot.svg.matchAll(/<g class="bw-legend-item" data-series="([^"]*)"/g)].map((m) => m[1]),
    ).toEqual(['exact', 'linear']);
    expect(texts(plot.svg, 'bw-axis-label')).toEqual(['Load (kN)', 'Output (mV/V)']);
    expect(attr(plot.svg, 'data-unit')).toEqual(['kN', 'mV/V']);
    expect(texts(plot.svg, 'bw-tick').slice(0, 6)).toEqual(['0', '20', '40', '60', '80', '100']);
    expect(plot.svg).toContain('stroke-dasharray="6 4"');
    expect(plot.svg).toContain('<title id="output-title">Output against load</title>');
  });

  it('wraps a long legend within the plot and starts the plot area below its rows', () => {
    const names = [
      'circle',
      'principal diameter',
      'x–y diameter (0°, 90°)',
      'leg a (30°)',
      'leg b (75°)',
      'leg c (150°)',
    ];
    const wide = linePlot({
      id: 'wide',
      title: 'Many series',
      x: { label: 'x' },
      y: { label: 'y' },
      width: 480,
      height: 480,
      series: names.map((name) => ({ name, x: [0, 1], y: [0, 1] })),
    });
    const items = [
      ...wide.svg.matchAll(
        /<g class="bw-legend-item" data-series="([^"]*)">.*?<text x="([\d.]+)" y="([\d.]+)"/g,
      ),
    ].map((m) => ({ name: m[1] as string, x: Number(m[2]), y: Number(m[3]) }));
    expect(items.map((i) => i.name)).toEqual(names);
    // Every name ends inside the 480 px plot (text width as the plot estimates it: 0.58 em per character).
    for (const i of items) expect(i.x + [...i.name].length * 12 * 0.58).toBeLessThanOrEqual(480);
    const rows = new Set(items.map((i) => i.y)).size;
    expect(rows).toBe(2);
    // The y axis starts one legend row (18 px) lower than with a one-row legend (58 px).
    const yAxis = /<g class="bw-axis bw-axis-y"[^>]*>(?:<[^>]*>)*?<line x1="[\d.]+" y1="([\d.]+)"/.exec(
      wide.svg,
    );
    expect(Number(yAxis?.[1])).toBe(58 + 18);
  });

  it('maps data to the plot area exactly: the first point sits on the axis origin', () => {
    const xAxis = /<g class="bw-axis bw-axis-x"[^>]*><line x1="([\d.]+)" y1="([\d.]+)" x2="([\d.]+)"/.exec(
      plot.svg,
    );
    const path =
      /<g class="bw-series" data-series="exact"><path d="M([\d.]+) ([\d.]+)L[^"]*L([\d.]+) ([\d.]+)"/.exec(
        plot.svg,
      );
    expect(path?.[1]).toBe(xAxis?.[1]); // x = 0 at the left end of the axis
    expect(path?.[2]).toBe(xAxis?.[2]); // y = 0 on the axis line
    expect(path?.[3]).toBe(xAxis?.[3]); // x = 100 at the right end
  });

  it('breaks a curve at NaN (a gap, never a line to zero) and skips non-finite points', () => {
    const p = linePlot({
      id: 'gap',
      title: 'gap',
      x: { label: 'x' },
      y: { label: 'y' },
      series: [{ name: 's', x: [0, 1, 2, 3, 4], y: [1, 2, NaN, 4, Infinity] }],
    });
    const d = /<path d="([^"]*)"/.exec(p.svg)?.[1] ?? '';
    expect(d.match(/M/g)?.length).toBe(2);
    expect(d.match(/L/g)?.length).toBe(1);
    expect(texts(p.svg, 'bw-axis-label')).toEqual(['x', 'y']); // no unit, no parentheses
  });

  it('escapes every text', () => {
    const p = linePlot({
      id: 'esc',
      title: '<script>alert(1)</script>',
      x: { label: 'a & b', unit: '"q"' },
      y: { label: "it's" },
      series: [{ name: '<b>', x: [0, 1], y: [0, 1] }],
    });
    expect(p.svg).not.toContain('<script>');
    expect(p.svg).not.toContain('<b>');
    expect(p.svg).toContain('&lt;script&gt;');
    expect(p.svg).toContain('a &amp; b (&quot;q&quot;)');
    expect(p.svg).toContain('it&#39;s');
  });

  it('honours fixed axis ends', () => {
    const p = linePlot({
      id: 'fixed',
      title: 't',
      x: { label: 'x', min: 0, max: 10 },
      y: { label: 'y', min: -1, max: 1 },
      series: [{ name: 's', x: [2, 3], y: [0, 0.5] }],
    });
    expect(texts(p.svg, 'bw-tick')).toEqual([
      '0',
      '2',
      '4',
      '6',
      '8',
      '10',
      '−1.0',
      '−0.5',
      '0',
      '0.5',
      '1.0',
    ]);
  });

  it('rejects bad input', () => {
    const base = { id: 'p', title: 't', x: { label: 'x' }, y: { label: 'y' } };
    expect(() => linePlot({ ...base, series: [] })).toThrowBridgeworkError('too-few-points', {
      param: 'series',
    });
    expect(() => linePlot({ ...base, series: [{ name: 's', x: [1, 2], y: [1] }] })).toThrowBridgeworkError(
      'invalid-shape',
      { param: 'series[0].y' },
    );
    expect(() =>
      linePlot({ ...base, id: '1bad id', series: [{ name: 's', x: [1], y: [1] }] }),
    ).toThrowBridgeworkError('invalid-option', { param: 'id' });
    expect(() =>
      linePlot({ ...base, width: 100, series: [{ name: 's', x: [1], y: [1] }] }),
    ).toThrowBridgeworkError('out-of-range', { param: 'width' });
  });
});

describe('barChart', () => {
  const chart = barChart({
    id: 'budget',
    title: 'Error budget',
    categories: [
      'noise',
      'lead desensitization',
      'a very long category name that cannot possibly fit in the label column',
      'combined',
    ],
    value: { label: 'Standard uncertainty', unit: 'µε' },
    series: [{ name: 'u', values: [0.42, -0.8, 1.9, 2.2] }],
    emphasize: [3],
  });

  it('draws one labelled bar per category and series, from zero', () => {
    expect(chart.seriesCount).toBe(1);
    expect(attr(chart.svg, 'data-value')).toEqual(['0.42', '-0.8', '1.9', '2.2']);
    expect(texts(chart.svg, 'bw-axis-label')).toEqual(['Standard uncertainty (µε)']);
    const zero = Number(/<line class="bw-zero" x1="([\d.]+)"/.exec(chart.svg)?.[1]);
    const bars = [...chart.svg.matchAll(/<rect class="bw-bar"[^>]* x="([\d.]+)"[^>]* width="([\d.]+)"/g)].map(
      (m) => [Number(m[1]), Number(m[2])],
    );
    expect(bars[0]?.[0]).toBeNear(zero, { abs: 0.01 }); // a positive bar starts at zero
    expect((bars[1]?.[0] as number) + (bars[1]?.[1] as number)).toBeNear(zero, { abs: 0.02 }); // a negative one ends there
    // Bar lengths are proportional to the values (coordinates are rounded to 0.01 px).
    expect((bars[3]?.[1] as number) / (bars[0]?.[1] as number)).toBeNear(2.2 / 0.42, { rel: 1e-3 });
    expect(texts(chart.svg, 'bw-value')).toEqual(['0.42', '−0.8', '1.9', '2.2']);
  });

  it('emphasises chosen categories and shortens labels that do not fit (full text kept as a tooltip)', () => {
    expect(chart.svg).toMatch(/font-weight="600">combined</);
    expect(chart.svg).toContain(
      '<title>a very long category name that cannot possibly fit in the label column</title>',
    );
    expect(texts(chart.svg, 'bw-category')[2]).toMatch(/…$/);
    expect(chart.svg).not.toContain('class="bw-legend"'); // one series: no legend
  });

  it('groups several series, with a legend', () => {
    const c = barChart({
      id: 'noise',
      title: 'Noise',
      categories: ['amplifier', 'bridge'],
      value: { label: 'Noise', unit: 'µε' },
      series: [
        { name: 'rms', values: [1, 2] },
        { name: 'peak-to-peak', values: [6.6, 13.2] },
      ],
    });
    expect(c.seriesCount).toBe(2);
    expect([...c.svg.matchAll(/<g class="bw-legend-item" data-series="([^"]*)"/g)].map((m) => m[1])).toEqual([
      'rms',
      'peak-to-peak',
    ]);
    expect(c.svg.match(/<rect class="bw-bar"/g)?.length).toBe(4);
  });

  it('rejects bad input', () => {
    const base = { id: 'b', title: 't', value: { label: 'v' } };
    expect(() =>
      barChart({ ...base, categories: [], series: [{ name: 's', values: [] }] }),
    ).toThrowBridgeworkError('too-few-points', { param: 'categories' });
    expect(() => barChart({ ...base, categories: ['a'], series: [] })).toThrowBridgeworkError(
      'too-few-points',
      { param: 'series' },
    );
    expect(() =>
      barChart({ ...base, categories: ['a'], series: [{ name: 's', values: [1, 2] }] }),
    ).toThrowBridgeworkError('invalid-shape', {
      param: 'series[0].values',
    });
    expect(() =>
      barChart({ ...base, categories: ['a'], series: [{ name: 's', values: [NaN] }] }),
    ).toThrowBridgeworkError('not-finite', {
      param: 'series[0].values[0]',
    });
    expect(() =>
      barChart({ ...base, categories: ['a'], series: [{ name: 's', values: [1] }], emphasize: [1] }),
    ).toThrowBridgeworkError('out-of-range', { param: 'emphasize[0]' });
  });
});
