/**
 * Opens a report page built from synthetic plot data in headless Chromium (Debian's chromium,
 * driven by playwright-core; no browser is ever downloaded) and checks that every plot renders
 * with the expected number of series and labelled axes, then saves a screenshot into
 * test-results/. Without chromium the test is skipped locally and fails under CI.
 */
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { syntheticReport } from './support/syntheticReport.js';

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

describe('HTML report in a browser', () => {
  it.skipIf(!haveChromium && !ci)(
    'renders every plot with its series and labelled axes (headless Chromium)',
    async () => {
      if (!haveChromium)
        throw new Error(`${executablePath} is missing: install the Debian package chromium (.ci/run does)`);
      const { chromium } = await import('playwright-core');
      const { html, plots } = syntheticReport();
      mkdirSync(results, { recursive: true });
      writeFileSync(`${results}cli-report-synthetic.html`, html);
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
        expect(requests).toEqual([]); // self-contained: nothing fetched
        await page.screenshot({ path: `${results}cli-report.png`, fullPage: true });
        for (const p of plots)
          await page.locator(`figure#${p.id}`).screenshot({ path: `${results}cli-plot-${p.id}.png` });
        expect(existsSync(`${results}cli-report.png`)).toBe(true);
      } finally {
        await browser.close();
      }
    },
  );
});
