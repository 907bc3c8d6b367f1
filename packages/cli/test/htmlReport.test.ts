import { describe, expect, it } from 'vitest';
import { SAFETY_CAUTION } from '../src/caution.js';
import { renderHtmlReport } from '../src/html/renderHtmlReport.js';
import { appendCaution, reportJson } from '../src/report/reportJson.js';
import { syntheticReport } from './support/syntheticReport.js';

describe('renderHtmlReport', () => {
  const { html } = syntheticReport();

  it('is self-contained: no scripts, no external style sheets, images, fonts or frames', () => {
    expect(html.startsWith('<!DOCTYPE html>\n<html lang="en">')).toBe(true);
    expect(html).not.toMatch(/<script|<link|<img|<iframe|<object|@import|url\((?!#)/i); // url(#clip) is in-page
    expect(html).not.toMatch(/\b(src|href)="(?!#)/); // only in-page links
    // The only URL is the SVG namespace, which is an identifier, not a resource.
    expect(
      [...html.matchAll(/https?:\/\/[^"'\s)]+/g)]
        .map((m) => m[0])
        .filter((u) => u !== 'http://www.w3.org/2000/svg'),
    ).toEqual([]);
    expect(html).toContain('<meta charset="utf-8">');
  });

  it('carries the safety caution at the top and in the footer', () => {
    const escaped = SAFETY_CAUTION.replace(/'/g, '&#39;');
    expect(html.split(escaped).length - 1).toBe(2);
    expect(html).toMatch(
      /<aside class="caution" role="note"><strong>Caution\.<\/strong> Results support, and do not replace, qualified engineering judgement/,
    );
  });

  it('renders checks, tables, plots and inputs', () => {
    expect(html).toContain(
      '<li class="pass"><span class="badge">pass</span> <strong>amplifier headroom</strong>',
    );
    expect(html).toContain(
      '<li class="fail"><span class="badge">fail</span> <strong>converter headroom</strong>',
    );
    expect(html.match(/<svg [^>]*class="bw-plot/g)?.length).toBe(4);
    expect(html).toContain('<th class="num">u (µε)</th>');
    expect(html).toContain(
      '<td data-label="input">gaugeOhms</td><td class="num" data-label="value">350</td><td data-label="unit">Ω</td><td data-label="note">from the file</td>',
    );
    expect(html).toMatch(/<figure id="output"><svg/);
  });

  it('escapes every text and adds a table of contents only for several sections', () => {
    const page = renderHtmlReport({
      title: 'A <b>bold</b> title & more',
      generator: 'bridgework "x"',
      meta: [{ label: '<i>', value: "it's" }],
      sections: [
        { title: 'first <section>', blocks: [{ kind: 'text', text: '<script>alert(1)</script>' }] },
        { title: 'second', blocks: [{ kind: 'table', columns: [{ header: '<th>' }], rows: [['<td>']] }] },
      ],
    });
    expect(page).not.toMatch(/<b>|<i>|<script>|<section>(?!\n)|<th><th>|<td><td>/);
    expect(page).toContain('<title>A &lt;b&gt;bold&lt;/b&gt; title &amp; more</title>');
    expect(page).toContain('<meta name="generator" content="bridgework &quot;x&quot;">');
    expect(page).toContain('<dd>it&#39;s</dd>');
    expect(page).toContain(
      '<nav aria-label="Contents"><ol><li><a href="#s1-first-section">first &lt;section&gt;</a></li><li><a href="#s2-second">second</a></li></ol></nav>',
    );
    expect(page).toContain('<section id="s1-first-section">');
    const single = renderHtmlReport({
      title: 't',
      generator: 'g',
      sections: [{ title: 'only', blocks: [] }],
    });
    expect(single).not.toContain('<nav');
  });

  it('gives the same bytes for the same input (no clock, no randomness)', () => {
    expect(syntheticReport().html).toBe(html);
  });
});

describe('JSON and text reports carry the caution', () => {
  it('reportJson puts generator and caution first', () => {
    const text = reportJson({ channels: [{ name: 'hook', budget: [] }] }, { generator: 'bridgework 0.1.0' });
    expect(text.endsWith('}\n')).toBe(true);
    const parsed = JSON.parse(text) as Record<string, unknown>;
    expect(Object.keys(parsed)).toEqual(['generator', 'caution', 'channels']);
    expect(parsed['caution']).toBe(SAFETY_CAUTION);
  });

  it('rejects NaN and ±Infinity (JSON.stringify would write null) and reserved keys', () => {
    expect(() => reportJson({ a: { b: [1, NaN] } }, { generator: 'g' })).toThrowBridgeworkError(
      'not-finite',
      { param: 'a.b[1]' },
    );
    expect(() => reportJson({ x: -Infinity }, { generator: 'g' })).toThrowBridgeworkError('not-finite', {
      param: 'x',
    });
    expect(() => reportJson({ caution: 'none' }, { generator: 'g' })).toThrowBridgeworkError(
      'conflicting-options',
      { param: 'payload.caution' },
    );
  });

  it('appendCaution ends a text report with the caution after a blank line', () => {
    expect(appendCaution('table\n')).toBe(`table\n\n${SAFETY_CAUTION}\n`);
    expect(appendCaution('table')).toBe(`table\n\n${SAFETY_CAUTION}\n`);
    expect(SAFETY_CAUTION).toMatch(
      /support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice/,
    );
  });
});
