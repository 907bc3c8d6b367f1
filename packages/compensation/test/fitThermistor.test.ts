/**
 * fitThermistor: the least-squares beta and Steinhart–Hart fits against 40-digit normal
 * equations of the same weighted problems (decimal.js), the exact cases against fitBeta and
 * fitSteinhartHart, and the refusals.
 */
import { describe, expect, it } from 'vitest';
import {
  createSteinhartHartThermistor,
  fitBeta,
  fitSteinhartHart,
  fitThermistor,
} from '@bridgework/compensation';
import { D, X, type Dec } from './support/decimal.js';

const K0 = '273.15';

/** Solves the n×n system M·x = v in 40 digits by Gaussian elimination with partial pivoting. */
function solve(m: Dec[][], v: Dec[]): Dec[] {
  const n = v.length;
  const a = m.map((row, i) => [...row, v[i]!]);
  for (let k = 0; k < n; k++) {
    let p = k;
    for (let i = k + 1; i < n; i++) if (a[i]![k]!.abs().gt(a[p]![k]!.abs())) p = i;
    [a[k], a[p]] = [a[p]!, a[k]!];
    for (let i = k + 1; i < n; i++) {
      const f = a[i]![k]!.div(a[k]![k]!);
      for (let j = k; j <= n; j++) a[i]![j] = a[i]![j]!.minus(f.times(a[k]![j]!));
    }
  }
  const x: Dec[] = new Array(n);
  for (let k = n - 1; k >= 0; k--) {
    let s = a[k]![n]!;
    for (let j = k + 1; j < n; j++) s = s.minus(a[k]![j]!.times(x[j]!));
    x[k] = s.div(a[k]![k]!);
  }
  return x;
}

/** Weighted normal equations (AᵀW²A)x = AᵀW²y in 40 digits. */
function normalEquations(rows: Dec[][], y: Dec[], w: Dec[]): Dec[] {
  const n = rows[0]!.length;
  const m = Array.from({ length: n }, (_, i) =>
    Array.from({ length: n }, (_, j) =>
      rows.reduce((s, r, k) => s.plus(w[k]!.pow(2).times(r[i]!).times(r[j]!)), new D(0)),
    ),
  );
  const v = Array.from({ length: n }, (_, i) =>
    rows.reduce((s, r, k) => s.plus(w[k]!.pow(2).times(r[i]!).times(y[k]!)), new D(0)),
  );
  return solve(m, v);
}

// A 10 kΩ NTC measured in a bath (invented points, scattered by a few mK about a real curve).
const bath = [
  { temperatureCelsius: -10, ohms: 55285.4 },
  { temperatureCelsius: 0, ohms: 32656.6 },
  { temperatureCelsius: 10, ohms: 19899.7 },
  { temperatureCelsius: 20, ohms: 12494.3 },
  { temperatureCelsius: 25, ohms: 9997.8 },
  { temperatureCelsius: 30, ohms: 8058.2 },
  { temperatureCelsius: 40, ohms: 5324.9 },
  { temperatureCelsius: 50, ohms: 3601.9 },
];

describe('fitThermistor', () => {
  it('Steinhart–Hart over eight points: the T²-weighted least squares of 40-digit normal equations', () => {
    const fit = fitThermistor({ model: 'steinhart-hart', points: bath });
    const u = bath.map((p) => X(p.ohms).ln());
    const T = bath.map((p) => X(p.temperatureCelsius).plus(K0));
    const [a, b, c] = normalEquations(
      u.map((ui) => [new D(1), ui, ui.pow(3)]),
      T.map((t) => new D(1).div(t)),
      T.map((t) => t.pow(2)),
    ) as [Dec, Dec, Dec];
    // The columns 1, ln R, (ln R)³ are nearly parallel: QR in binary64 keeps the fitted curve to
    // about 1e-12 of 1/T, the coefficients to the conditioning (c least well).
    expect(fit.steinhartHart!.a).toBeNear(a.toNumber(), { rel: 1e-9 });
    expect(fit.steinhartHart!.b).toBeNear(b.toNumber(), { rel: 1e-9 });
    expect(fit.steinhartHart!.c).toBeNear(c.toNumber(), { rel: 1e-7 });
    bath.forEach((p, i) => {
      const model = new D(1).div(a.plus(b.times(u[i]!)).plus(c.times(u[i]!.pow(3)))).minus(K0);
      expect(fit.residualsKelvin[i]).toBeNear(model.minus(p.temperatureCelsius).toNumber(), { abs: 1e-9 });
    });
    // The points scatter by a few mK about a Steinhart–Hart curve.
    expect(fit.largestResidualKelvin).toBeLessThan(0.01);
    expect(fit.degreesOfFreedom).toBe(5);
    // The residuals are those of the compensation package's own model at the points.
    const m = createSteinhartHartThermistor(fit.steinhartHart!);
    bath.forEach((p, i) =>
      expect(m.temperatureAt(p.ohms) - p.temperatureCelsius).toBeNear(fit.residualsKelvin[i]!, { abs: 1e-9 }),
    );
  });

  it('Steinhart–Hart through three points is fitSteinhartHart (the curve through them)', () => {
    const three = [bath[1]!, bath[4]!, bath[7]!];
    const fit = fitThermistor({ model: 'steinhart-hart', points: three });
    expect(fit.steinhartHart).toEqual(fitSteinhartHart({ points: three }));
    expect(fit.largestResidualKelvin).toBeLessThan(1e-9);
    expect(fit.degreesOfFreedom).toBe(0);
  });

  it('beta over eight points: the straight line of ln R against 1/T − 1/T0 by 40-digit normal equations', () => {
    const fit = fitThermistor({ model: 'beta', points: bath, referenceCelsius: 25 });
    const T0 = X(25).plus(K0);
    const x = bath.map((p) => new D(1).div(X(p.temperatureCelsius).plus(K0)).minus(new D(1).div(T0)));
    const [lnR0, B] = normalEquations(
      x.map((xi) => [new D(1), xi]),
      bath.map((p) => X(p.ohms).ln()),
      bath.map(() => new D(1)),
    ) as [Dec, Dec];
    expect(fit.beta!.betaKelvin).toBeNear(B.toNumber(), { rel: 1e-12 });
    expect(fit.beta!.referenceOhms).toBeNear(lnR0.exp().toNumber(), { rel: 1e-12 });
    expect(fit.beta!.referenceCelsius).toBe(25);
    // A beta curve cannot follow the part over 60 K: residuals of tenths of a kelvin.
    expect(fit.largestResidualKelvin).toBeGreaterThan(0.05);
  });

  it('beta through two points is the data-sheet B of fitBeta', () => {
    const two = [bath[4]!, bath[7]!];
    const fit = fitThermistor({ model: 'beta', points: two, referenceCelsius: 25 });
    const sheet = fitBeta({
      points: [
        { ohms: 9997.8, temperatureCelsius: 25 },
        { ohms: 3601.9, temperatureCelsius: 50 },
      ],
    });
    expect(fit.beta!.betaKelvin).toBeNear(sheet.betaKelvin, { rel: 1e-12 });
    expect(fit.beta!.referenceOhms).toBeNear(9997.8, { rel: 1e-13 });
    expect(fit.largestResidualKelvin).toBeLessThan(1e-9);
  });

  it('refuses too few points, repeated temperatures, a PTC curve and unknown options', () => {
    expect(() => fitThermistor({ model: 'steinhart-hart', points: bath.slice(0, 2) })).toThrowBridgeworkError(
      'too-few-points',
      { param: 'points' },
    );
    expect(() => fitThermistor({ model: 'beta', points: bath.slice(0, 1) })).toThrowBridgeworkError(
      'too-few-points',
      { param: 'points' },
    );
    expect(() =>
      fitThermistor({ model: 'beta', points: [bath[0]!, { ohms: 1000, temperatureCelsius: -10 }] }),
    ).toThrowBridgeworkError('singular', { param: 'points[1].temperatureCelsius' });
    const ptc = bath.map((p, i) => ({ ...p, ohms: 1000 + 10 * i }));
    expect(() => fitThermistor({ model: 'beta', points: ptc })).toThrowBridgeworkError('no-solution', {
      param: 'points',
    });
    expect(() => fitThermistor({ model: 'steinhart-hart', points: ptc })).toThrowBridgeworkError(
      'no-solution',
      { param: 'points' },
    );
    expect(() => fitThermistor({ model: 'cubic' as 'beta', points: bath })).toThrowBridgeworkError(
      'invalid-option',
      { param: 'model' },
    );
    expect(() =>
      fitThermistor({ model: 'beta', points: bath, referenceCelcius: 25 } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'options.referenceCelcius' });
  });
});
