import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { IEC_60751_COEFFICIENTS, createRtd } from '@bridgework/compensation';
import { D, X, bisect, type Dec } from './support/decimal.js';

const pt100 = createRtd();

/** IEC 60751 restated in 40-digit decimal arithmetic, with the standard's exact coefficients. */
const A = new D('3.9083e-3');
const B = new D('-5.775e-7');
const C = new D('-4.183e-12');
function referenceRatio(t: Dec): Dec {
  const quadratic = A.times(t).plus(B.times(t).times(t)).plus(1);
  return t.isNegative() ? quadratic.plus(C.times(t.minus(100)).times(t.pow(3))) : quadratic;
}
function referenceTemperature(ohms: number, r0 = 100): Dec {
  const target = X(ohms).div(r0);
  return bisect((t) => referenceRatio(t).minus(target), new D(-200), new D(850));
}

describe('createRtd: IEC 60751 table values', () => {
  it('Pt100 at −200, −100, 0, 100, 200, 500 and 850 °C matches the table to its two decimals', () => {
    // IEC 60751:2008, table of reference values for Pt100 (from memory):
    const table: [number, number][] = [
      [-200, 18.52],
      [-100, 60.26],
      [-50, 80.31],
      [0, 100.0],
      [50, 119.4],
      [100, 138.51],
      [200, 175.86],
      [300, 212.05],
      [500, 280.98],
      [850, 390.48],
    ];
    for (const [t, ohms] of table) {
      expect(pt100.ohmsAt(t)).toBeNear(ohms, { abs: 0.005 }); // the table rounds to 0.01 Ω
      // The inverse of the table value lies within half a table digit (0.005 Ω / slope) of t
      // (18.52 Ω itself is just below R(−200 °C) = 18.52008 Ω, outside the standard's range).
      if (t > -200) expect(pt100.temperatureAt(ohms)).toBeNear(t, { abs: 0.005 / pt100.slopeAt(t) });
    }
  });

  it('equals the Callendar–Van Dusen equation in 40-digit arithmetic (forward within 2e-15 relative)', () => {
    fc.assert(
      fc.property(fc.double({ min: -200, max: 850, noNaN: true }), (t) => {
        expect(pt100.ohmsAt(t)).toBeNear(referenceRatio(X(t)).times(100).toNumber(), { rel: 2e-15 });
      }),
      { numRuns: 500 },
    );
  });

  it('inverts to within 1e-9 K of a 40-digit bisection, above and below 0 °C', () => {
    for (const t of [
      -200, -199.99, -150, -100, -37.5, -1e-6, 0, 1e-6, 0.01, 100, 419.527, 660.323, 849.9, 850,
    ]) {
      const ohms = pt100.ohmsAt(t);
      // 1e-9 K is the stated tolerance; the method actually reaches ~1e-13 K here.
      expect(pt100.temperatureAt(ohms)).toBeNear(referenceTemperature(ohms).toNumber(), { abs: 1e-9 });
      expect(pt100.temperatureAt(ohms)).toBeNear(referenceTemperature(ohms).toNumber(), { abs: 1e-12 });
    }
  });

  it('shows why the iteration is needed: the quadratic inverse alone is 2.4 K off at −200 °C', () => {
    const x = pt100.ohmsAt(-200) / 100 - 1;
    const a = IEC_60751_COEFFICIENTS.a;
    const b = IEC_60751_COEFFICIENTS.b;
    const quadraticOnly = (2 * x) / (a + Math.sqrt(a * a + 4 * b * x));
    expect(quadraticOnly + 200).toBeNear(-2.4, { abs: 0.05 });
    expect(pt100.temperatureAt(pt100.ohmsAt(-200))).toBeNear(-200, { abs: 1e-12 });
  });

  it('slope dR/dt equals the derivative of the equation (0.3851 Ω/K mean over 0–100 °C, the α of the standard)', () => {
    // α = (R100 − R0)/(100·R0) = 0.00385055 /K (IEC 60751; from memory).
    expect((pt100.ohmsAt(100) - pt100.ohmsAt(0)) / 100 / 100).toBeNear(0.00385055, { abs: 5e-9 });
    for (const t of [-200, -150, -1, 0, 1, 100, 850]) {
      const h = new D('1e-12');
      const dref = referenceRatio(X(t).plus(h))
        .minus(referenceRatio(X(t).minus(h)))
        .div(h.times(2))
        .times(100);
      const inRange = t > -200 && t < 850;
      if (inRange || t === 0) expect(pt100.slopeAt(t)).toBeNear(dref.toNumber(), { rel: 1e-12 });
    }
    expect(pt100.slopeAt(-200)).toBeNear(
      100 * (3.9083e-3 + 400 * 5.775e-7 + 4.183e-12 * (4 * 8e6 + 300 * 4e4)),
      { rel: 1e-14 },
    );
    expect(pt100.slopeAt(850)).toBeNear(100 * (3.9083e-3 - 2 * 850 * 5.775e-7), { rel: 1e-14 });
  });

  it('is continuous with continuous slope at 0 °C', () => {
    expect(pt100.ohmsAt(0)).toBe(100);
    expect(pt100.ohmsAt(-1e-9)).toBeNear(100 - 3.9083e-10, { rel: 1e-15 });
    expect(pt100.slopeAt(-1e-12)).toBeNear(pt100.slopeAt(0), { rel: 1e-12 });
  });

  it('scales with R0 (Pt1000) and exposes its range', () => {
    const pt1000 = createRtd({ r0Ohms: 1000 });
    expect(pt1000.ohmsAt(100)).toBeNear(1385.055, { rel: 1e-15 });
    expect(pt1000.temperatureAt(1385.055)).toBeNear(100, { abs: 1e-10 });
    expect(pt100.rangeCelsius).toEqual([-200, 850]);
    expect(pt100.rangeOhms[0]).toBeNear(18.52008, { rel: 1e-14 });
    expect(pt100.rangeOhms[1]).toBeNear(390.481125, { rel: 1e-14 });
  });
});

describe('createRtd: the inverse below 0 °C (polynomial start, one Newton step under a proved bound)', () => {
  /** The exact root of the 40-digit equation for the double x = R/R0 − 1 the inverse sees (bisection). */
  const rootOf = (x: number): number =>
    bisect((t) => referenceRatio(t).minus(X(x).plus(1)), new D(-201), new D(851)).toNumber();

  it('is within 4 ulp of the exact root of x = R/R0 − 1 on both sides of 0 °C (40-digit bisection)', () => {
    // IEC 60751's equation restated above; x is the double temperatureAt computes from R.
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (u) => {
        const ohms = pt100.rangeOhms[0] + u * (pt100.rangeOhms[1] - pt100.rangeOhms[0]);
        if (!(ohms <= pt100.rangeOhms[1])) return;
        const x = ohms / 100 - 1;
        if (x === 0) return;
        expect(pt100.temperatureAt(ohms)).toBeNear(rootOf(x), { ulps: 4 });
      }),
      { numRuns: 300 },
    );
    for (const ohms of [pt100.rangeOhms[0], 99.99999999, 100 - 1e-9, 60.25584, 100 + 1e-9]) {
      expect(pt100.temperatureAt(ohms)).toBeNear(rootOf(ohms / 100 - 1), { ulps: 4 });
    }
  });

  it('inverseStart is the documented formula: start and step reproduce temperatureAt bit for bit', () => {
    // The contract conversion loops rely on (Rtd.inverseStart's TSDoc), restated here.
    const { xMin, scale, coefficients: p, guard } = pt100.inverseStart;
    const { a, b, c } = pt100;
    expect(p).toHaveLength(9);
    expect(Number.isFinite(guard) && guard > 0).toBe(true);
    expect(xMin).toBeNear(pt100.ohmsAt(-200) / 100 - 1, { ulps: 1 });
    let worstStart = 0;
    for (let i = 1; i < 4000; i++) {
      const ohms = pt100.rangeOhms[0] + ((100 - pt100.rangeOhms[0]) * i) / 4000;
      const x = ohms / 100 - 1;
      const u = (x - xMin) * scale - 1;
      const u2 = u * u;
      const u4 = u2 * u2;
      const t0 =
        x *
        (p[0]! +
          p[1]! * u +
          (p[2]! + p[3]! * u) * u2 +
          (p[4]! + p[5]! * u + (p[6]! + p[7]! * u) * u2) * u4 +
          p[8]! * (u4 * u4));
      const f = t0 * (a + t0 * (b + t0 * (c * (t0 - 100)))) - x;
      const delta = f / (a + t0 * (2 * b + t0 * (c * (4 * t0 - 300))));
      expect(delta * delta * guard <= Math.abs(t0) && t0 >= -201 && t0 < 0).toBe(true);
      expect(pt100.temperatureAt(ohms)).toBe(t0 - delta);
      worstStart = Math.max(worstStart, Math.abs(delta / t0));
    }
    // The start alone: about 1e-10 relative for IEC 60751's coefficients (the step then squares it).
    expect(worstStart).toBeNear(0, { abs: 1e-9 });
  });
});

describe('createRtd: round trips', () => {
  it('t → R → t within 1e-9 K over −200…850 °C (Pt100 and Pt1000)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -200, max: 850, noNaN: true }),
        fc.constantFrom(100, 500, 1000),
        (t, r0) => {
          const rtd = createRtd({ r0Ohms: r0 });
          expect(rtd.temperatureAt(rtd.ohmsAt(t))).toBeNear(t, { abs: 1e-9 });
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('R → t → R within 1e-13 relative over the whole resistance range', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (u) => {
        const ohms = pt100.rangeOhms[0] + u * (pt100.rangeOhms[1] - pt100.rangeOhms[0]);
        if (ohms > pt100.rangeOhms[1]) return;
        expect(pt100.ohmsAt(pt100.temperatureAt(ohms))).toBeNear(ohms, { rel: 1e-13 });
      }),
      { numRuns: 2000 },
    );
  });

  it('works with custom coefficients (an invented curve of higher α: A 3.9739e-3, B −5.87e-7, C −4.4e-12)', () => {
    const rtd = createRtd({ a: 3.9739e-3, b: -5.87e-7, c: -4.4e-12 });
    fc.assert(
      fc.property(fc.double({ min: -200, max: 850, noNaN: true }), (t) => {
        expect(rtd.temperatureAt(rtd.ohmsAt(t))).toBeNear(t, { abs: 1e-9 });
      }),
      { numRuns: 500 },
    );
  });
});

describe('createRtd: bad inputs', () => {
  it('rejects temperatures and resistances outside the standard range', () => {
    expect(() => pt100.ohmsAt(-200.001)).toThrowBridgeworkError('out-of-range', {
      param: 'temperatureCelsius',
    });
    expect(() => pt100.ohmsAt(850.001)).toThrowBridgeworkError('out-of-range', {
      param: 'temperatureCelsius',
    });
    expect(() => pt100.slopeAt(900)).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
    expect(() => pt100.temperatureAt(18.5)).toThrowBridgeworkError('out-of-range', { param: 'ohms' });
    expect(() => pt100.temperatureAt(390.5)).toThrowBridgeworkError('out-of-range', { param: 'ohms' });
    expect(() => pt100.temperatureAt(Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'ohms' });
    expect(() => pt100.temperatureAt('100' as never)).toThrowBridgeworkError('wrong-type', { param: 'ohms' });
    expect(() => pt100.ohmsAt(Infinity)).toThrowBridgeworkError('not-finite', {
      param: 'temperatureCelsius',
    });
  });

  it('rejects a non-object', () => {
    expect(() => createRtd(null as never)).toThrowBridgeworkError('wrong-type', { param: 'options' });
  });

  it.each([
    ['zero R0', { r0Ohms: 0 }, 'not-positive', 'r0Ohms'],
    ['infinite R0', { r0Ohms: Infinity }, 'not-finite', 'r0Ohms'],
    ['negative A', { a: -3.9e-3 }, 'not-positive', 'a'],
    ['NaN B', { b: Number.NaN }, 'not-finite', 'b'],
    ['a B that turns R(t) down before 850 °C', { b: -3e-6 }, 'out-of-range', 'b'],
    ['a C that turns R(t) down below 0 °C', { c: 1e-9 }, 'out-of-range', 'c'],
    ['a C that makes R(−200 °C) negative', { c: -1e-10 }, 'out-of-range', 'c'],
    ['string C', { c: '0' }, 'wrong-type', 'c'],
  ] as const)('createRtd rejects %s', (_name, options, code, param) => {
    expect(() => createRtd(options as never)).toThrowBridgeworkError(code, { param });
  });
});
