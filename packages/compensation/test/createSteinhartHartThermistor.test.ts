import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createBetaThermistor, createSteinhartHartThermistor } from '@bridgework/compensation';
import { D, X, bisect, type Dec } from './support/decimal.js';

// Coefficients commonly quoted for a 10 kΩ (at 25 °C) NTC (from memory).
const classic = { a: 1.129241e-3, b: 2.341077e-4, c: 8.775468e-8 };
const ntc = createSteinhartHartThermistor(classic);

function referenceInverseKelvin(u: Dec, k: { a: number; b: number; c: number }): Dec {
  return X(k.a)
    .plus(X(k.b).times(u))
    .plus(X(k.c).times(u.pow(3)));
}
/** ln R for a temperature by 40-digit bisection on the cubic (over the monotone band). */
function referenceLnOhms(t: number, k: { a: number; b: number; c: number }, lo = -20, hi = 40): Dec {
  const y = new D(1).div(X(t).plus('273.15'));
  return bisect((u) => referenceInverseKelvin(u, k).minus(y), new D(lo), new D(hi));
}

const families = fc.constantFrom(
  classic,
  { a: 1.1e-3, b: 2.4e-4, c: -1.2e-8 }, // c < 0: the trigonometric branch
  { a: 1.1e-3, b: 2.4e-4, c: 0 }, // c = 0: the beta model in disguise
  { a: 1.4e-3, b: 2.37e-4, c: 9.9e-8 },
);

describe('createSteinhartHartThermistor', () => {
  it('the classic 10 kΩ coefficients give 25.00 °C at 10 kΩ', () => {
    expect(ntc.temperatureAt(10e3)).toBeNear(25, { abs: 5e-3 });
  });

  it('temperatureAt is the Steinhart–Hart equation (40-digit check, 1e-12 K)', () => {
    fc.assert(
      fc.property(families, fc.double({ min: 100, max: 1e6, noNaN: true }), (k, ohms) => {
        const m = createSteinhartHartThermistor(k);
        const ref = new D(1).div(referenceInverseKelvin(X(ohms).ln(), k)).minus('273.15');
        expect(m.temperatureAt(ohms)).toBeNear(ref.toNumber(), { abs: 1e-12 });
      }),
      { numRuns: 400 },
    );
  });

  it('ohmsAt solves the cubic in closed form: equals a 40-digit bisection to 1e-14 relative, every branch', () => {
    fc.assert(
      fc.property(families, fc.double({ min: -50, max: 150, noNaN: true }), (k, t) => {
        const m = createSteinhartHartThermistor(k);
        const ref = referenceLnOhms(t, k).exp().toNumber();
        // After the polish step the root is within an ulp or two of ln R; exp keeps that relative.
        expect(m.ohmsAt(t)).toBeNear(ref, { rel: 1e-14 });
      }),
      { numRuns: 120 },
    );
  });

  it('round-trips t → R → t within 1e-11 K over −80…250 °C for every branch', () => {
    fc.assert(
      fc.property(families, fc.double({ min: -80, max: 250, noNaN: true }), (k, t) => {
        const m = createSteinhartHartThermistor(k);
        expect(m.temperatureAt(m.ohmsAt(t))).toBeNear(t, { abs: 1e-11 });
      }),
      { numRuns: 2000 },
    );
  });

  it('round-trips R → t → R within 1e-13 relative over 10 Ω … 10 MΩ for every branch', () => {
    fc.assert(
      fc.property(families, fc.double({ min: 1, max: 7, noNaN: true }), (k, decade) => {
        const m = createSteinhartHartThermistor(k);
        const ohms = 10 ** decade;
        // ln R carries an absolute error of ~u, so R comes back within a few ulps of exp.
        expect(m.ohmsAt(m.temperatureAt(ohms))).toBeNear(ohms, { rel: 1e-13 });
      }),
      { numRuns: 2000 },
    );
  });

  it('with c = 0 agrees with the beta model B = 1/b, R0 = exp((1/T0 − a)/b)', () => {
    const b = 2.5e-4;
    const a = 1 / 298.15 - b * Math.log(1e4);
    const sh = createSteinhartHartThermistor({ a, b, c: 0 });
    const beta = createBetaThermistor({ referenceOhms: 1e4, betaKelvin: 1 / b });
    for (const t of [-40, 0, 25, 85, 125]) expect(sh.ohmsAt(t)).toBeNear(beta.ohmsAt(t), { rel: 1e-12 });
  });

  it('tiny c of either sign (as a fit of beta-model data gives) stays accurate', () => {
    for (const c of [1e-18, -1e-18, 1e-12, -1e-12]) {
      const m = createSteinhartHartThermistor({ a: 1.1e-3, b: 2.4e-4, c });
      for (const t of [-40, 25, 120]) {
        expect(m.ohmsAt(t)).toBeNear(referenceLnOhms(t, { a: 1.1e-3, b: 2.4e-4, c }).exp().toNumber(), {
          rel: 1e-14,
        });
      }
    }
  });

  it('slope is −R/(T²·(b + 3c·u²)): 40-digit central difference', () => {
    for (const t of [-20, 25, 100]) {
      const h = new D('1e-10');
      const lnAt = (tk: Dec) =>
        bisect((u) => referenceInverseKelvin(u, classic).minus(new D(1).div(tk)), new D(-20), new D(40), 160);
      const tk = X(t).plus('273.15');
      const dref = lnAt(tk.plus(h))
        .exp()
        .minus(lnAt(tk.minus(h)).exp())
        .div(h.times(2));
      expect(ntc.slopeAt(t)).toBeNear(dref.toNumber(), { rel: 1e-12 });
    }
  });

  it('with c < 0 uses only the monotone band |ln R| < √(−b/3c)', () => {
    const m = createSteinhartHartThermistor({ a: 1.1e-3, b: 2.4e-4, c: -1e-6 }); // band |u| < 8.94
    expect(() => m.temperatureAt(Math.exp(9))).toThrowBridgeworkError('no-solution', { param: 'ohms' });
    expect(m.temperatureAt(Math.exp(8))).toBeNear(1 / (1.1e-3 + 2.4e-4 * 8 - 1e-6 * 512) - 273.15, {
      abs: 1e-9,
    });
    // A temperature that needs ln R beyond the band has no solution on the monotone branch.
    expect(() => m.ohmsAt(-250)).toThrowBridgeworkError('no-solution', { param: 'temperatureCelsius' });
  });

  it('rejects resistances that would need T ≤ 0 K, and respects its range', () => {
    // 1 mΩ: y = a + b·ln R + c·ln³R < 0, so 1/T would be negative.
    expect(() => ntc.temperatureAt(1e-3)).toThrowBridgeworkError('no-solution', { param: 'ohms' });
    expect(() => ntc.temperatureAt(1e-300)).toThrowBridgeworkError('out-of-range', { param: 'ohms' });
    const ranged = createSteinhartHartThermistor({ ...classic, rangeCelsius: [0, 70] });
    expect(() => ranged.ohmsAt(71)).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
    expect(() => ranged.temperatureAt(1e6)).toThrowBridgeworkError('out-of-range', { param: 'ohms' });
    expect(ranged.rangeCelsius).toEqual([0, 70]);
  });

  it.each([
    ['b = 0', { a: 1e-3, b: 0, c: 1e-7 }, 'not-positive', 'b'],
    ['negative b', { a: 1e-3, b: -2e-4, c: 1e-7 }, 'not-positive', 'b'],
    ['NaN a', { a: Number.NaN, b: 2e-4, c: 1e-7 }, 'not-finite', 'a'],
    ['missing c', { a: 1e-3, b: 2e-4 }, 'missing-option', 'options.c'],
    ['a bad range', { a: 1e-3, b: 2e-4, c: 1e-7, rangeCelsius: [10, 10] }, 'out-of-range', 'rangeCelsius'],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => createSteinhartHartThermistor(options as never)).toThrowBridgeworkError(code, { param });
  });

  it('evaluators reject bad arguments', () => {
    expect(() => ntc.temperatureAt(-5)).toThrowBridgeworkError('not-positive', { param: 'ohms' });
    expect(() => ntc.ohmsAt(Number.NaN)).toThrowBridgeworkError('not-finite', {
      param: 'temperatureCelsius',
    });
    expect(() => ntc.ohmsAt(-274)).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
  });
});
