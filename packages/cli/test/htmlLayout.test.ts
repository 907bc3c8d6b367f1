/**
 * The HTML report's layout in a real browser (issue 15 item 23), on the example's report in
 * Debian's headless Chromium (playwright-core; no browser is downloaded):
 * - at 390, 800 and 1300 px nothing runs off the right edge (no horizontal scrolling, every
 *   element inside the viewport), wide tables fit, and the input tables never overlap;
 * - printed to Letter pages, no page ends with a heading (a section title, an input group's title
 *   or a table caption) whose content went to the next page (read back with poppler's pdftotext);
 * - screenshots of each width are compared with the reference images in
 *   test/fixtures/layout/ (at most 1 % of pixels may differ; BRIDGEWORK_UPDATE_SCREENSHOTS=1
 *   rewrites them) and saved into test-results/ for a look.
 * Without chromium (or pdftotext) the test is skipped locally and fails under CI.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../src/runCli.js';
import { exampleShown } from './support/footbridge.js';
import { memoryIo } from './support/memoryIo.js';

const executablePath = '/usr/bin/chromium';
const tools = existsSync(executablePath) && existsSync('/usr/bin/pdftotext');
const ci = process.env['CI'] !== undefined;
const update = process.env['BRIDGEWORK_UPDATE_SCREENSHOTS'] === '1';
const results = fileURLToPath(new URL('../../../test-results/', import.meta.url));
const references = fileURLToPath(new URL('./fixtures/layout/', import.meta.url));

interface Layout {
  viewport: number;
  scrollWidth: number;
  offRight: string[];
  tablesWiderThanBox: string[];
  inputOverlaps: number;
  plotsOutside: number;
}

describe('HTML report layout', () => {
  it.skipIf(!tools && !ci)(
    'fits 390, 800 and 1300 px screens and prints without stranded headings (headless Chromium)',
    { timeout: 180_000 },
    async () => {
      if (!tools)
        throw new Error(
          'chromium and pdftotext are needed: install the Debian packages chromium and poppler-utils',
        );
      const { chromium } = await import('playwright-core');
      mkdirSync(results, { recursive: true });
      const htmlPath = `${results}cli-layout.html`;
      const io = memoryIo({ env: { SOURCE_DATE_EPOCH: '1767225600' } });
      const code = await runCli(['report', exampleShown, '--html', htmlPath, '--force'], io);
      expect(code, io.stderr.text()).toBe(0);
      const html = readFileSync(htmlPath, 'utf8');
      const browser = await chromium.launch({
        executablePath,
        args: [
          '--headless',
          '--no-sandbox',
          '--disable-gpu',
          '--disable-background-networking',
          '--no-first-run',
        ],
      });
      try {
        for (const width of [390, 800, 1300]) {
          const page = await browser.newPage({ viewport: { width, height: 900 } });
          await page.setContent(html, { waitUntil: 'load' });
          const layout = await page.evaluate((): Layout => {
            const vw = document.documentElement.clientWidth;
            const name = (e: Element) => `${e.tagName.toLowerCase()}${e.id ? `#${e.id}` : ''}`;
            const offRight = Array.from(document.querySelectorAll('body *'))
              .filter((e) => e.getBoundingClientRect().right > vw + 0.5)
              .map(name);
            const tablesWiderThanBox = Array.from(document.querySelectorAll('.table-wrap'))
              .filter(
                (w) =>
                  (w.querySelector('table') as HTMLElement).scrollWidth >
                  (w as HTMLElement).clientWidth + 0.5,
              )
              .map((w) => w.querySelector('caption')?.textContent ?? name(w));
            let inputOverlaps = 0;
            for (const block of Array.from(document.querySelectorAll('div.inputs'))) {
              const boxes = Array.from(block.querySelectorAll('table')).map((t) => t.getBoundingClientRect());
              for (let i = 0; i < boxes.length; i++)
                for (let j = i + 1; j < boxes.length; j++) {
                  const a = boxes[i] as DOMRect;
                  const b = boxes[j] as DOMRect;
                  if (
                    a.left < b.right - 0.5 &&
                    b.left < a.right - 0.5 &&
                    a.top < b.bottom - 0.5 &&
                    b.top < a.bottom - 0.5
                  )
                    inputOverlaps++;
                }
            }
            const plotsOutside = Array.from(document.querySelectorAll('figure')).filter((f) => {
              const svg = f.querySelector('svg') as SVGSVGElement;
              return svg.getBoundingClientRect().right > f.getBoundingClientRect().right + 0.5;
            }).length;
            return {
              viewport: vw,
              scrollWidth: document.documentElement.scrollWidth,
              offRight,
              tablesWiderThanBox,
              inputOverlaps,
              plotsOutside,
            };
          });
          expect(layout.scrollWidth, `${width} px`).toBe(layout.viewport);
          expect(layout.offRight, `${width} px`).toEqual([]);
          expect(layout.tablesWiderThanBox, `${width} px`).toEqual([]);
          expect(layout.inputOverlaps, `${width} px`).toBe(0);
          expect(layout.plotsOutside, `${width} px`).toBe(0);

          // The first screen, against its reference image.
          const shot = await page.screenshot();
          writeFileSync(`${results}cli-layout-${width}.png`, shot);
          const reference = `${references}report-${width}.png`;
          if (update || !existsSync(reference)) {
            if (!update && ci)
              throw new Error(`${reference} is missing: run with BRIDGEWORK_UPDATE_SCREENSHOTS=1`);
            mkdirSync(references, { recursive: true });
            writeFileSync(reference, shot);
          }
          const differing = await page.evaluate(
            async ([a, b]) => {
              const load = (src: string) =>
                new Promise<HTMLImageElement>((resolve, reject) => {
                  const img = new Image();
                  img.onload = () => resolve(img);
                  img.onerror = reject;
                  img.src = src;
                });
              const [x, y] = await Promise.all([load(a as string), load(b as string)]);
              if (x.width !== y.width || x.height !== y.height) return 1;
              const pixels = (img: HTMLImageElement) => {
                const canvas = document.createElement('canvas');
                canvas.width = img.width;
                canvas.height = img.height;
                const ctx = canvas.getContext('2d') as CanvasRenderingContext2D;
                ctx.drawImage(img, 0, 0);
                return ctx.getImageData(0, 0, img.width, img.height).data;
              };
              const p = pixels(x);
              const q = pixels(y);
              let n = 0;
              for (let i = 0; i < p.length; i += 4)
                if (
                  Math.max(
                    Math.abs(p[i]! - q[i]!),
                    Math.abs(p[i + 1]! - q[i + 1]!),
                    Math.abs(p[i + 2]! - q[i + 2]!),
                  ) > 48
                )
                  n++;
              return n / (p.length / 4);
            },
            [
              `data:image/png;base64,${shot.toString('base64')}`,
              `data:image/png;base64,${readFileSync(reference).toString('base64')}`,
            ],
          );
          expect(differing, `${width} px: share of pixels that differ from ${reference}`).toBeLessThanOrEqual(
            0.01,
          );
          await page.close();
        }

        // Printed: no page ends with a heading.
        const page = await browser.newPage();
        await page.setContent(html, { waitUntil: 'load' });
        const headings = await page.evaluate(() =>
          Array.from(document.querySelectorAll('h2, h3, caption')).map((h) => (h.textContent ?? '').trim()),
        );
        const pdf = `${results}cli-layout.pdf`;
        await page.pdf({ path: pdf, format: 'Letter' });
        const text = execFileSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' });
        const pages = text.split('\f').filter((p) => p.trim() !== '');
        const stranded = pages
          .map(
            (p) =>
              p
                .split('\n')
                .filter((l) => l.trim() !== '')
                .pop()
                ?.trim() ?? '',
          )
          .filter((last) => headings.some((h) => h !== '' && last.toLowerCase() === h.toLowerCase()));
        expect(stranded).toEqual([]);
        // Two plots and two input tables side by side on paper: the example prints on 16 pages (22 before).
        expect(pages.length).toBeLessThanOrEqual(17);
      } finally {
        await browser.close();
      }
    },
  );
});
