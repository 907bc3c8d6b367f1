import { chromium } from 'playwright-core';
import { readFileSync } from 'node:fs';
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu'],
});
const page = await browser.newPage({ viewport: { width: 1180, height: 900 } });
await page.setContent(readFileSync(process.argv[2]!, 'utf8'), { waitUntil: 'load' });
await page.screenshot({ path: process.argv[3]!, fullPage: true });
const h = await page.evaluate(() => document.body.scrollHeight);
console.log('height', h);
await browser.close();
