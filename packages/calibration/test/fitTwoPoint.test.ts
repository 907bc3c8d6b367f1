import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitTwoPoint } from '@bridgework/calibration';

describe('fitTwoPoint', () => {
  it('passes through both points: zero 0.012 mV/V, span 2.0012 mV/V at 1000 kg (invented hopper cell)', () => {
    // slope = (2.0012 − 0.012)e-3/1000 = 1.9892e-6 V/V per kg; offset = the zero reading (by hand).
    const line = fitTwoPoint({ zeroReading: 1.2e-5, spanLoad: 1000, spanReading: 2.0012e-3 });
    expect(line.slope).toBeNear(1.9892e-6, { rel: 1e-14 });
    expect(line.offset).toBe(1.2e-5);
    expect(line.readingAt(0)).toBe(1.2e-5);
    expect(line.loadAt(1.2e-5)).toBe(0);
    expect(line.readingAt(1000)).toBeNear(2.0012e-3, { ulps: 2 });
    expect(line.loadAt(2.0012e-3)).toBeNear(1000, { rel: 1e-14 });
    expect(line.loadAt((1.2e-5 + 2.0012e-3) / 2)).toBeNear(500, { rel: 1e-14 });
  });

  it('works with a zero point away from zero load and a falling line', () => {
    // Line through (200, 5) and (700, −5): slope −0.02, reading 0 at load 450, offset 9 (by hand).
    const line = fitTwoPoint({ zeroLoad: 200, zeroReading: 5, spanLoad: 700, spanReading: -5 });
    expect(line.slope).toBeNear(-0.02, { ulps: 1 });
    expect(line.offset).toBeNear(9, { ulps: 2 });
    expect(line.loadAt(0)).toBeNear(450, { ulps: 2 });
  });

  it('round trip load → reading → load (fast-check over wide ranges)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.double({ min: 1e-3, max: 1e4, noNaN: true }),
        fc.double({ min: 1e-6, max: 10, noNaN: true }),
        fc.boolean(),
        fc.double({ min: -0.5, max: 1.5, noNaN: true }),
        (x0, y0, span, rise, falling, where) => {
          const line = fitTwoPoint({
            zeroLoad: x0,
            zeroReading: y0,
            spanLoad: x0 + span,
            spanReading: y0 + (falling ? -rise : rise),
          });
          const load = x0 + where * span;
          // Two roundings each way, relative to the larger of the load and the span (the zero point
          // is subtracted): 8ε of that scale.
          expect(line.loadAt(line.readingAt(load))).toBeNear(load, {
            abs: 8 * Number.EPSILON * (Math.abs(x0) + span) * (1 + Math.abs(y0) / rise),
          });
        },
      ),
      { numRuns: 2000 },
    );
  });

  it.each([
    ['spanLoad', { zeroReading: 0, spanLoad: 0, spanReading: 1 }, 'singular'],
    ['spanReading', { zeroReading: 1, spanLoad: 10, spanReading: 1 }, 'singular'],
    ['zeroReading', { zeroReading: Number.NaN, spanLoad: 10, spanReading: 1 }, 'not-finite'],
    ['spanLoad', { zeroReading: 0, spanLoad: '10', spanReading: 1 }, 'wrong-type'],
    ['options.spanReading', { zeroReading: 0, spanLoad: 10 }, 'missing-option'],
    ['options.spanReadng', { zeroReading: 0, spanLoad: 10, spanReadng: 1 }, 'unknown-option'],
    ['zeroLoad', { zeroLoad: -Infinity, zeroReading: 0, spanLoad: 10, spanReading: 1 }, 'not-finite'],
    ['options', 'line', 'wrong-type'],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => fitTwoPoint(options as never)).toThrowBridgeworkError(code, { param });
  });

  // Issue 15 (fuzz): a span load of 5e-324 gave slope = Infinity, a reading of 1e308 a load of Infinity.
  it('refuses a line whose slope or offset lies beyond the double range, naming the option', () => {
    const base = { zeroReading: 1.2e-5, spanLoad: 1000, spanReading: 2.0012e-3 };
    expect(() => fitTwoPoint({ ...base, spanLoad: 5e-324 })).toThrowBridgeworkError('out-of-range', {
      param: 'spanLoad',
    });
    expect(() => fitTwoPoint({ ...base, zeroLoad: -1e308, spanLoad: 1e308 })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'spanLoad' },
    );
    expect(() =>
      fitTwoPoint({ zeroReading: -1e308, spanReading: 1e308, spanLoad: 1 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'spanReading' });
    // The slope underflows to 0: no inverse.
    expect(() =>
      fitTwoPoint({ zeroReading: 0, spanReading: 1e-300, spanLoad: 1e300 }),
    ).toThrowBridgeworkError('out-of-range', { param: 'spanReading' });
  });

  it('refuses a reading or load beyond the double range, naming the argument', () => {
    const line = fitTwoPoint({ zeroReading: 1.2e-5, spanLoad: 1000, spanReading: 2.0012e-3 });
    expect(() => line.loadAt(1e308)).toThrowBridgeworkError('out-of-range', { param: 'reading' });
    expect(() => line.readingAt(-1e308)).not.toThrow(); // 2e-6·(−1e308) is finite
    const steep = fitTwoPoint({ zeroReading: 0, spanLoad: 1, spanReading: 1e300 });
    expect(() => steep.readingAt(1e10)).toThrowBridgeworkError('out-of-range', { param: 'load' });
  });

  it('rejects a non-finite load or reading in the maps', () => {
    const line = fitTwoPoint({ zeroReading: 0, spanLoad: 10, spanReading: 1 });
    expect(() => line.readingAt(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'load' });
    expect(() => line.loadAt(Infinity)).toThrowBridgeworkError('not-finite', { param: 'reading' });
  });
});
