import { describe, expect, it } from 'vitest';
import { formatTable } from '../src/terminal/formatTable.js';
import { createProgressBar } from '../src/terminal/progressBar.js';
import { colorEnabled, createTextStyle, visibleWidth } from '../src/terminal/textStyle.js';
import { memoryStream } from './support/memoryIo.js';

const tty = memoryStream({ isTTY: true });
const pipe = memoryStream({ isTTY: false });

describe('colours', () => {
  it('only on a terminal', () => {
    expect(colorEnabled(tty, {})).toBe(true);
    expect(colorEnabled(pipe, {})).toBe(false);
    expect(colorEnabled({ write: () => true }, {})).toBe(false); // isTTY absent, as on a file stream
  });

  it('never when NO_COLOR is set to anything non-empty (no-color.org), nor with TERM=dumb', () => {
    expect(colorEnabled(tty, { NO_COLOR: '1' })).toBe(false);
    expect(colorEnabled(tty, { NO_COLOR: 'false' })).toBe(false);
    expect(colorEnabled(tty, { NO_COLOR: '' })).toBe(true); // the convention: an empty value does not count
    expect(colorEnabled(tty, { TERM: 'dumb' })).toBe(false);
  });

  it('styles with SGR codes when enabled and returns the text unchanged otherwise', () => {
    const on = createTextStyle(tty, {});
    expect(on.red('fail')).toBe('\u001b[31mfail\u001b[39m');
    expect(on.bold('x')).toBe('\u001b[1mx\u001b[22m');
    const off = createTextStyle(tty, { NO_COLOR: '1' });
    for (const f of [off.red, off.green, off.yellow, off.bold, off.dim]) expect(f('text')).toBe('text');
    expect(off.enabled).toBe(false);
  });

  it('measures printed width without colour codes', () => {
    const on = createTextStyle(tty, {});
    expect(visibleWidth(on.red('µε'))).toBe(2);
    expect(visibleWidth('Ω\u0301')).toBe(1); // a combining mark takes no column
  });
});

describe('progress bar', () => {
  it('writes nothing when standard error is not a terminal', () => {
    const s = memoryStream({ isTTY: false });
    const bar = createProgressBar(s, { label: 'converting', total: 1000 });
    for (let i = 0; i <= 1000; i += 10) bar.update(i);
    bar.finish();
    expect(bar.active).toBe(false);
    expect(s.chunks).toEqual([]);
  });

  it('redraws in place on a terminal, at most once per 0.1 %, and erases itself', () => {
    const s = memoryStream({ isTTY: true, columns: 100 });
    const bar = createProgressBar(s, { label: 'converting', total: 50e6 });
    for (let i = 0; i <= 50e6; i += 5000) bar.update(i); // 10 001 updates
    expect(s.chunks.length).toBe(1001); // 0.0 % … 100.0 %
    for (const c of s.chunks) {
      expect(c.startsWith('\r')).toBe(true);
      expect(c.endsWith('\u001b[K')).toBe(true);
      expect(visibleWidth(c.replace(/\r|\u001b\[K/g, ''))).toBeLessThanOrEqual(100);
    }
    expect(s.chunks[500]).toContain(' 50.0 %  25.0 MB / 50.0 MB');
    expect(s.chunks[1000]).toContain('[' + '█'.repeat(40) + ']');
    bar.finish();
    expect(s.chunks.at(-1)).toBe('\r\u001b[K');
  });

  it('shows counts in other units and ignores a zero total', () => {
    const s = memoryStream({ isTTY: true });
    const bar = createProgressBar(s, { label: 'trials', total: 2_000_000, unit: 'trials' });
    bar.update(500_000);
    expect(s.text()).toContain('25.0 %  500.0 k trials / 2.00 M trials');
    const none = createProgressBar(s, { label: 'x', total: 0 });
    expect(none.active).toBe(false);
  });
});

describe('text tables', () => {
  it('aligns columns, right-aligns numbers and rules the header', () => {
    const text = formatTable(
      [{ header: 'source' }, { header: 'u (µε)', align: 'right' }, { header: 'model' }],
      [
        ['amplifier noise', '0.42', 'rms over 10 Hz'],
        ['resolution', '0.031', 'LSB/√12'],
      ],
    );
    expect(text).toBe(
      [
        'source           u (µε)  model',
        '───────────────  ──────  ──────────────',
        'amplifier noise    0.42  rms over 10 Hz',
        'resolution        0.031  LSB/√12',
        '',
      ].join('\n'),
    );
  });

  it('keeps alignment with coloured cells and rejects rows wider than the columns', () => {
    const red = createTextStyle(tty, {}).red;
    const text = formatTable(
      [{ header: 'check' }, { header: 'ok' }],
      [
        [red('headroom'), 'no'],
        ['class', 'yes'],
      ],
    );
    const lines = text.split('\n').map((l) => visibleWidth(l));
    expect(lines[2]).toBe(lines[3]! - 1);
    expect(() => formatTable([{ header: 'a' }], [['1', '2']])).toThrowBridgeworkError('invalid-shape', {
      param: 'rows[0]',
    });
  });
});
