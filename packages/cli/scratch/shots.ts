import { chromium } from 'playwright-core';
import { readFileSync } from 'node:fs';
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu'],
});
const page = await browser.newPage({ viewport: { width: 1180, height: 900 } });
await page.setContent(readFileSync(process.argv[2]!, 'utf8'), { waitUntil: 'load' });
const h = await page.evaluate(() => document.body.scrollHeight);
const step = Number(process.argv[4] ?? 1600);
for (let y = 0, i = 0; y < h && i < Number(process.argv[5] ?? 3); y += step, i++)
  await page.screenshot({
    path: `${process.argv[3]}-${i}.png`,
    clip: { x: 0, y, width: 1180, height: Math.min(step, h - y) },
    fullPage: true,
  });
console.log('height', h);
await browser.close();
