/**
 * Opens the real HTML report, written by `bridgework report --html` for the example channel file,
 * in headless Chromium (Debian's chromium, driven by playwright-core; no browser is ever
 * downloaded) and checks that every plot renders with the expected number of series and labelled
 * axes with units, then saves screenshots into test-results/. Without chromium the test is
 * skipped locally and fails under CI.
 */
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { checkRows } from '../src/report/checkRows.js';
import { runCli } from '../src/runCli.js';
import { channelBudget, createChannel } from '@bridgework/channel';
import { exampleShown, footbridgeNames, footbridgeSpecs } from './support/footbridge.js';
import { memoryIo } from './support/memoryIo.js';

const executablePath = '/usr/bin/chromium';
const haveChromium = existsSync(executablePath);
const ci = process.env['CI'] !== undefined;
const results = fileURLToPath(new URL('../../../test-results/', import.meta.url));

interface RenderedPlot {
  id: string;
  seriesCount: number;
  series: string[];
  legend: string[];
  axisLabels: string[];
  nonEmptySeries: number;
  tickOverlaps: number;
  labelClearOfTicks: boolean;
  wellFormed: boolean;
}

interface PlotExpectation {
  readonly id: string;
  readonly series: readonly string[];
  readonly axes: readonly string[];
}

/** Four plots per channel of the example, with their series and axis titles (units in parentheses). */
function expectedPlots(): PlotExpectation[] {
  const quantity: Record<string, readonly [string, string]> = {
    'hanger-h3': ['Force', 'kN'],
    'gusset-g2': ['Strain', 'µε'],
    'deck-temp': ['Temperature', '°C'],
  };
  return footbridgeNames.flatMap((name) => {
    const [label, unit] = quantity[name]!;
    return [
      {
        id: `${name}-output`,
        series: ['exact map', 'terminal line'],
        axes: [`${label} (${unit})`, 'Converter input (mV/V)'],
      },
      {
        id: `${name}-nonlinearity`,
        series: ['nonlinearity error'],
        axes: [`${label} (${unit})`, `Exact map − terminal line (${unit})`],
      },
      { id: `${name}-budget`, series: ['u'], axes: [`Standard uncertainty (${unit})`] },
      {
        id: `${name}-noise`,
        series: ['rms', 'peak-to-peak'],
        axes: [`Noise referred to the output (${unit})`],
      },
    ];
  });
}

describe('HTML report in a browser', () => {
  it.skipIf(!haveChromium && !ci)(
    'renders every plot of the real report with its series and labelled axes (headless Chromium)',
    async () => {
      if (!haveChromium)
        throw new Error(`${executablePath} is missing: install the Debian package chromium (.ci/run does)`);
      const { chromium } = await import('playwright-core');
      mkdirSync(results, { recursive: true });
      const htmlPath = `${results}cli-report.html`;
      const io = memoryIo();
      const code = await runCli(['report', exampleShown, '--html', htmlPath, '--force'], io);
      expect(code, io.stderr.text()).toBe(0);
      const html = readFileSync(htmlPath, 'utf8');
      const plots = expectedPlots();
      const browser = await chromium.launch({
        executablePath,
        args: [
          '--headless',
          '--no-sandbox',
          '--disable-gpu',
          '--disable-quic',
          '--no-first-run',
          '--disable-background-networking',
          '--disable-component-update',
          '--disable-sync',
        ],
      });
      try {
        const page = await browser.newPage({ viewport: { width: 1180, height: 900 } });
        const requests: string[] = [];
        page.on('request', (r) => {
          if (!r.url().startsWith('data:') && r.url() !== 'about:blank') requests.push(r.url());
        });
        await page.setContent(html, { waitUntil: 'load' });
        const rendered = await page.evaluate((): RenderedPlot[] => {
          const boxesOverlap = (a: DOMRect, b: DOMRect): boolean =>
            a.left < b.right - 0.5 &&
            b.left < a.right - 0.5 &&
            a.top < b.bottom - 0.5 &&
            b.top < a.bottom - 0.5;
          return Array.from(document.querySelectorAll<SVGSVGElement>('svg.bw-plot')).map((svg) => {
            const series = Array.from(svg.querySelectorAll('g.bw-series'));
            const xTicks = Array.from(svg.querySelectorAll('g.bw-axis-x text.bw-tick')).map((t) =>
              t.getBoundingClientRect(),
            );
            let tickOverlaps = 0;
            for (let i = 1; i < xTicks.length; i++)
              if (boxesOverlap(xTicks[i - 1] as DOMRect, xTicks[i] as DOMRect)) tickOverlaps++;
            const yLabel = svg.querySelector('g.bw-axis-y text.bw-axis-label')?.getBoundingClientRect();
            const yTicks = Array.from(svg.querySelectorAll('g.bw-axis-y text.bw-tick')).map((t) =>
              t.getBoundingClientRect(),
            );
            const parsed = new DOMParser().parseFromString(svg.outerHTML, 'image/svg+xml');
            return {
              id: svg.dataset['plot'] ?? '',
              seriesCount: Number(svg.dataset['seriesCount']),
              series: series.map((g) => (g as SVGGElement).dataset['series'] ?? ''),
              legend: Array.from(svg.querySelectorAll('g.bw-legend-item')).map(
                (g) => (g as SVGGElement).dataset['series'] ?? '',
              ),
              axisLabels: Array.from(svg.querySelectorAll('text.bw-axis-label')).map(
                (t) => t.textContent ?? '',
              ),
              nonEmptySeries: series.filter((g) => {
                const r = g.getBoundingClientRect();
                return r.width > 10 && r.height > 1;
              }).length,
              tickOverlaps,
              labelClearOfTicks: yLabel === undefined || yTicks.every((t) => yLabel.right <= t.left),
              wellFormed: parsed.querySelector('parsererror') === null,
            };
          });
        });
        expect(rendered.map((p) => p.id)).toEqual(plots.map((p) => p.id));
        for (const [i, expected] of plots.entries()) {
          const p = rendered[i] as RenderedPlot;
          expect(p.seriesCount, p.id).toBe(expected.series.length);
          expect(p.series, p.id).toEqual(expected.series);
          expect(p.nonEmptySeries, p.id).toBe(expected.series.length);
          if (expected.series.length > 1) expect(p.legend, p.id).toEqual(expected.series);
          expect(p.axisLabels, p.id).toEqual(expected.axes);
          expect(p.tickOverlaps, p.id).toBe(0);
          expect(p.labelClearOfTicks, p.id).toBe(true);
          expect(p.wellFormed, p.id).toBe(true);
        }
        expect(await page.locator('aside.caution').textContent()).toContain(
          'do not replace, qualified engineering judgement',
        );
        expect(await page.locator('footer').textContent()).toContain(
          'do not replace, qualified engineering judgement',
        );
        // A summary and one section per channel, each with its checks and its inputs.
        expect(await page.locator('main > section').count()).toBe(1 + footbridgeNames.length);
        // Every design check of the channel package's budgets, each with its mark (the
        // plausible-input checks that pass share one row per channel).
        const checks = footbridgeNames.flatMap((n) =>
          checkRows(channelBudget(createChannel(footbridgeSpecs[n])).checks),
        );
        expect(checks.filter((k) => k.name === 'inputs in their usual ranges')).toHaveLength(3);
        for (const status of ['pass', 'warn', 'fail'] as const)
          expect(await page.locator(`ul.checks li.${status}`).count(), status).toBe(
            checks.filter((k) => k.status === status).length,
          );
        expect(await page.locator('ul.checks li.warn').count()).toBe(1); // the gusset's share of the range
        expect(await page.locator('div.inputs').count()).toBe(footbridgeNames.length);
        expect(requests).toEqual([]); // self-contained: nothing fetched
        await page.screenshot({ path: `${results}cli-report.png`, fullPage: true });
        // One channel's plots on their own, for a closer look.
        for (const p of plots.filter((x) => x.id.startsWith('hanger-h3-')))
          await page.locator(`figure#${p.id}`).screenshot({ path: `${results}cli-plot-${p.id}.png` });
        expect(existsSync(`${results}cli-report.png`)).toBe(true);
      } finally {
        await browser.close();
      }
    },
  );
});
