import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createBetaThermistor, fitBeta } from '@bridgework/compensation';
import { D, X, type Dec } from './support/decimal.js';

const ntc = createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977 });

/** R0·exp(B·(1/T − 1/T0)) in 40-digit arithmetic. */
function referenceOhms(t: number | Dec, r0 = 10e3, beta = 3977, t0 = 25) {
  const k = (typeof t === 'number' ? X(t) : t).plus(new D('273.15'));
  const k0 = X(t0).plus(new D('273.15'));
  return X(r0).times(
    X(beta)
      .times(new D(1).div(k).minus(new D(1).div(k0)))
      .exp(),
  );
}

describe('createBetaThermistor', () => {
  it('gives R0 at t0 and the B25/85 ratio exp(B·(1/358.15 − 1/298.15)) at 85 °C', () => {
    expect(ntc.ohmsAt(25)).toBe(10e3);
    expect(ntc.temperatureAt(10e3)).toBe(25);
    // By hand: exp(3977·(1/358.15 − 1/298.15)) = exp(−2.2346374) = 0.1070309.
    expect(ntc.ohmsAt(85) / 10e3).toBeNear(0.1070309, { rel: 1e-6 });
  });

  it('equals the beta equation in 40-digit arithmetic, both ways (within 4e-15 relative and 1e-12 K)', () => {
    fc.assert(
      fc.property(fc.double({ min: -55, max: 150, noNaN: true }), (t) => {
        const ref = referenceOhms(t).toNumber();
        // exp amplifies the rounding of its argument (|B·ΔT/T²| ≤ 4): a few ulps of R.
        expect(ntc.ohmsAt(t)).toBeNear(ref, { rel: 4e-15 });
        expect(ntc.temperatureAt(ref)).toBeNear(t, { abs: 1e-12 });
      }),
      { numRuns: 500 },
    );
  });

  it('round-trips t → R → t to 1e-12 K and R → t → R to 1e-13 relative, −100…300 °C', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -100, max: 300, noNaN: true }),
        fc.double({ min: 2000, max: 5000, noNaN: true }),
        fc.constantFrom(1e3, 10e3, 100e3),
        (t, beta, r0) => {
          const m = createBetaThermistor({ referenceOhms: r0, betaKelvin: beta });
          expect(m.temperatureAt(m.ohmsAt(t))).toBeNear(t, { abs: 1e-12 });
          const r = r0 * Math.exp((beta * (25 - t)) / ((t + 273.15) * 298.15)) * 1.0001;
          expect(m.ohmsAt(m.temperatureAt(r))).toBeNear(r, { rel: 1e-13 });
        },
      ),
      { numRuns: 500 },
    );
  });

  it('slope is −B·R/T² (checked against a 40-digit central difference)', () => {
    for (const t of [-40, 0, 25, 100]) {
      const h = new D('1e-12');
      const ref = referenceOhms(X(t).plus(h))
        .minus(referenceOhms(X(t).minus(h)))
        .div(h.times(2));
      // Central difference in 40 digits with h = 1e-12 K: truncation O(h²) ≈ 1e-25 relative.
      expect(ntc.slopeAt(t)).toBeNear(ref.toNumber(), { rel: 4e-15 });
    }
  });

  it('honours a reference temperature other than 25 °C and a stated range', () => {
    const m = createBetaThermistor({
      referenceOhms: 5000,
      referenceCelsius: 0,
      betaKelvin: 3500,
      rangeCelsius: [-20, 60],
    });
    expect(m.ohmsAt(0)).toBe(5000);
    expect(m.rangeCelsius).toEqual([-20, 60]);
    expect(() => m.ohmsAt(61)).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
    expect(() => m.temperatureAt(100)).toThrowBridgeworkError('out-of-range', { param: 'ohms' });
    expect(ntc.rangeCelsius).toBeUndefined();
  });

  it('rejects resistances no positive temperature reaches', () => {
    // 1/T = 1/T0 + ln(R/R0)/B ≤ 0 when R ≤ R0·exp(−B/T0) = 10 kΩ·exp(−13.34) ≈ 0.016 Ω.
    expect(() => ntc.temperatureAt(0.01)).toThrowBridgeworkError('no-solution', { param: 'ohms' });
    expect(() => ntc.temperatureAt(0)).toThrowBridgeworkError('not-positive', { param: 'ohms' });
    expect(() => ntc.ohmsAt(-273.15)).toThrowBridgeworkError('out-of-range', { param: 'temperatureCelsius' });
    expect(() => ntc.ohmsAt(Number.NaN)).toThrowBridgeworkError('not-finite', {
      param: 'temperatureCelsius',
    });
  });

  it.each([
    ['zero R0', { referenceOhms: 0, betaKelvin: 3977 }, 'not-positive', 'referenceOhms'],
    ['negative B', { referenceOhms: 1e4, betaKelvin: -3977 }, 'not-positive', 'betaKelvin'],
    ['missing B', { referenceOhms: 1e4 }, 'missing-option', 'options.betaKelvin'],
    [
      't0 below absolute zero',
      { referenceOhms: 1e4, betaKelvin: 3977, referenceCelsius: -300 },
      'out-of-range',
      'referenceCelsius',
    ],
    [
      'a reversed range',
      { referenceOhms: 1e4, betaKelvin: 3977, rangeCelsius: [50, 0] },
      'out-of-range',
      'rangeCelsius',
    ],
    [
      'a range below absolute zero',
      { referenceOhms: 1e4, betaKelvin: 3977, rangeCelsius: [-300, 0] },
      'out-of-range',
      'rangeCelsius',
    ],
    [
      'a one-element range',
      { referenceOhms: 1e4, betaKelvin: 3977, rangeCelsius: [0] },
      'invalid-shape',
      'rangeCelsius',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => createBetaThermistor(options as never)).toThrowBridgeworkError(code, { param });
  });
});

describe('fitBeta', () => {
  it('recovers B from R25 and R85 and feeds createBetaThermistor', () => {
    const r85 = ntc.ohmsAt(85);
    const fit = fitBeta({
      points: [
        { ohms: 10e3, temperatureCelsius: 25 },
        { ohms: r85, temperatureCelsius: 85 },
      ],
    });
    expect(fit.betaKelvin).toBeNear(3977, { rel: 1e-13 });
    expect(fit.referenceOhms).toBe(10e3);
    expect(fit.referenceCelsius).toBe(25);
    const m = createBetaThermistor(fit);
    expect(m.temperatureAt(r85)).toBeNear(85, { abs: 1e-11 });
  });

  it('equals ln(R1/R2)/(1/T1 − 1/T2) in 40-digit arithmetic', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -40, max: 60, noNaN: true }),
        fc.double({ min: 5, max: 80, noNaN: true }),
        fc.double({ min: 2500, max: 4500, noNaN: true }),
        (t1, dt, beta) => {
          const t2 = t1 + dt;
          const m = createBetaThermistor({ referenceOhms: 1e4, betaKelvin: beta });
          const r1 = m.ohmsAt(t1);
          const r2 = m.ohmsAt(t2);
          const ref = X(r1)
            .div(X(r2))
            .ln()
            .div(new D(1).div(X(t1).plus('273.15')).minus(new D(1).div(X(t2).plus('273.15'))));
          const fit = fitBeta({
            points: [
              { ohms: r1, temperatureCelsius: t1 },
              { ohms: r2, temperatureCelsius: t2 },
            ],
          });
          // The data's conditioning: u·|B|/|ln(R1/R2)| per rounding; 1e-12 covers dt ≥ 5 K.
          expect(fit.betaKelvin).toBeNear(ref.toNumber(), { rel: 1e-12 });
          expect(fit.betaKelvin).toBeNear(beta, { rel: 1e-12 });
        },
      ),
      { numRuns: 300 },
    );
  });

  it.each([
    ['one point', { points: [{ ohms: 1e4, temperatureCelsius: 25 }] }, 'too-few-points', 'points'],
    [
      'three points',
      {
        points: [
          { ohms: 1e4, temperatureCelsius: 25 },
          { ohms: 2e3, temperatureCelsius: 60 },
          { ohms: 1e3, temperatureCelsius: 90 },
        ],
      },
      'invalid-shape',
      'points',
    ],
    [
      'equal temperatures',
      {
        points: [
          { ohms: 1e4, temperatureCelsius: 25 },
          { ohms: 2e3, temperatureCelsius: 25 },
        ],
      },
      'singular',
      'points',
    ],
    [
      'a PTC',
      {
        points: [
          { ohms: 1e3, temperatureCelsius: 25 },
          { ohms: 2e3, temperatureCelsius: 60 },
        ],
      },
      'no-solution',
      'points',
    ],
    [
      'a zero resistance',
      {
        points: [
          { ohms: 0, temperatureCelsius: 25 },
          { ohms: 2e3, temperatureCelsius: 60 },
        ],
      },
      'not-positive',
      'points[0].ohms',
    ],
    [
      'a point below absolute zero',
      {
        points: [
          { ohms: 1e4, temperatureCelsius: -300 },
          { ohms: 2e3, temperatureCelsius: 60 },
        ],
      },
      'out-of-range',
      'points[0].temperatureCelsius',
    ],
    ['not an array', { points: 3 }, 'wrong-type', 'points'],
    ['a null point', { points: [null, { ohms: 2e3, temperatureCelsius: 60 }] }, 'wrong-type', 'points[0]'],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => fitBeta(options as never)).toThrowBridgeworkError(code, { param });
  });
});
