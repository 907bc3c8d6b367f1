import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateCertificate, fitPolynomial } from '@bridgework/calibration';

/**
 * A synthetic load cell (invented): zero z, rated output RO, a parabolic bow a·u(u − 1) on the way up
 * and an extra h·sin(πu) on the way down, u = load/capacity. Every certificate figure then has a
 * closed form, derived below by hand.
 */
const capacity = 2000;
const loads = [0, 500, 1000, 1500, 2000];
const z = 1.5e-5;
const ro = 2e-3;
const a = -4e-7; // ascending bulges above the terminal line by −a/4 = 1e-7 at mid-range
const h = 6e-7; // descending lies above ascending by h at mid-range
const u = loads.map((x) => x / capacity);
const ascending = u.map((v) => z + ro * v + a * v * (v - 1));
const descending = u.map((v, i) => (ascending[i] as number) + h * Math.sin(Math.PI * v));

describe('evaluateCertificate: closed-form figures of a synthetic cell', () => {
  const e = evaluateCertificate({ loads, runs: [{ ascending, descending }] });

  it('rated output, zero balance and the terminal line', () => {
    expect(e.capacity).toBe(2000);
    expect(e.ratedOutput).toBeNear(ro, { rel: 1e-13 });
    expect(e.zeroBalance).toBe(z);
    expect(e.zeroBalanceFraction).toBeNear(z / ro, { rel: 1e-12 });
    expect(e.terminalLine.offset).toBe(z);
    expect(e.terminalLine.slope).toBeNear(ro / capacity, { rel: 1e-13 });
  });

  it('terminal nonlinearity = |a|/4 / RO at mid-range', () => {
    // a·u(u − 1) is largest in magnitude at u = 1/2: |a|/4 = 1e-7 → 100·1e-7/2e-3 = 0.005 %.
    // Absolute 1e-10 %: the deviations are differences of readings of 2e-3 (ulp 4e-19 → 2e-14 %).
    expect(e.terminalNonlinearityFraction).toBeNear(0.005 / 100, { abs: 1e-10 / 100 });
    expect(e.points[2]!.terminalDeviationFraction).toBeNear(0.005 / 100, { abs: 1e-10 / 100 });
  });

  it('best-fit nonlinearity = half the terminal one for a symmetric bow on five equal steps', () => {
    // u(u − 1) at u = 0, ¼, ½, ¾, 1 is 0, −3/16, −1/4, −3/16, 0: by symmetry the least-squares line
    // is flat at the mean −1/8, so the largest deviation is |a|/8 (at u = 0, ½ and 1) = 0.0025 %.
    expect(e.bestFitNonlinearityFraction).toBeNear(0.0025 / 100, { abs: 1e-10 / 100 });
    expect(e.bestFitLine.slope).toBeNear(ro / capacity, { rel: 1e-9 });
    expect(e.bestFitLine.offset).toBeNear(z - a / 8, { rel: 1e-9 });
  });

  it('hysteresis = h / RO at mid-range; combined error = (|a|/4 + h)/RO', () => {
    // Descending − ascending = h·sin(πu): largest at u = ½, 100·6e-7/2e-3 = 0.03 %. Descending minus
    // the terminal line = a·u(u − 1) + h·sin(πu), also largest at ½: 1e-7 + 6e-7 → 0.035 %
    // (at u = ¼: 0.75e-7 + 4.24e-7 = 4.99e-7, smaller).
    expect(e.hysteresisFraction!).toBeNear(0.03 / 100, { abs: 1e-10 / 100 });
    expect(e.combinedErrorFraction).toBeNear(0.035 / 100, { abs: 1e-10 / 100 });
    expect(e.points[0]!.hysteresisFraction).toBe(0);
    expect(e.repeatabilityFraction).toBeUndefined();
  });

  it('the best-fit line equals the QR least-squares fit of the same points (a different method)', () => {
    const fit = fitPolynomial({ loads, readings: ascending, degree: 1 });
    expect(e.bestFitLine.offset).toBeNear(fit.coefficients[0]!, { rel: 1e-13 });
    expect(e.bestFitLine.slope).toBeNear(fit.coefficients[1]!, { rel: 1e-13 });
  });
});

describe('evaluateCertificate: repeated runs', () => {
  it('repeatability is the largest spread between runs at one load; means feed the other figures', () => {
    // Run 2 reads δ = 4e-7 higher at mid-range only: repeatability 100·δ/RO = 0.02 %; the mean
    // ascending curve rises by δ/2 there, so terminal nonlinearity becomes (1e-7 + 2e-7)/RO = 0.015 %.
    const delta = 4e-7;
    const run2 = ascending.map((r, i) => (i === 2 ? r + delta : r));
    const e = evaluateCertificate({ loads, runs: [{ ascending }, { ascending: run2 }] });
    expect(e.repeatabilityFraction!).toBeNear(0.02 / 100, { abs: 1e-10 / 100 });
    expect(e.points[2]!.repeatabilityFraction!).toBeNear(0.02 / 100, { abs: 1e-10 / 100 });
    expect(e.points[1]!.repeatabilityFraction).toBe(0);
    expect(e.terminalNonlinearityFraction).toBeNear(0.015 / 100, { abs: 1e-10 / 100 });
    expect(e.hysteresisFraction).toBeUndefined();
    expect(e.combinedErrorFraction).toBeNear(0.015 / 100, { abs: 1e-10 / 100 });
  });

  it('keeps its figures under a change of load unit and reading scale (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e3, noNaN: true }),
        fc.double({ min: 1e-2, max: 1e4, noNaN: true }),
        (k, m) => {
          const base = evaluateCertificate({ loads, runs: [{ ascending, descending }] });
          const scaled = evaluateCertificate({
            loads: loads.map((x) => x * k),
            runs: [{ ascending: ascending.map((r) => r * m), descending: descending.map((r) => r * m) }],
          });
          // Fractions are dimensionless: equal to rounding (absolute 1e-11 on figures of ~3e-4).
          expect(scaled.terminalNonlinearityFraction).toBeNear(base.terminalNonlinearityFraction, {
            abs: 1e-11,
          });
          expect(scaled.bestFitNonlinearityFraction).toBeNear(base.bestFitNonlinearityFraction, {
            abs: 1e-11,
          });
          expect(scaled.hysteresisFraction!).toBeNear(base.hysteresisFraction!, { abs: 1e-11 });
          expect(scaled.combinedErrorFraction).toBeNear(base.combinedErrorFraction, { abs: 1e-11 });
        },
      ),
      { numRuns: 200 },
    );
  });

  it('a cell whose output falls with load has a negative rated output and the same percentages', () => {
    const e = evaluateCertificate({
      loads,
      runs: [{ ascending: ascending.map((r) => -r), descending: descending.map((r) => -r) }],
    });
    expect(e.ratedOutput).toBeNear(-ro, { rel: 1e-13 });
    expect(e.terminalNonlinearityFraction).toBeNear(0.005 / 100, { abs: 1e-10 / 100 });
    expect(e.points[2]!.terminalDeviationFraction).toBeNear(0.005 / 100, { abs: 1e-10 / 100 });
  });
});

describe('evaluateCertificate: bad input', () => {
  const run = { ascending: [0, 1e-3, 2e-3] };
  it.each([
    ['loads', { loads: [0, 1], runs: [{ ascending: [0, 1] }] }, 'too-few-points'],
    ['loads[0]', { loads: [1, 2, 3], runs: [run] }, 'out-of-range'],
    ['loads[2]', { loads: [0, 2, 2], runs: [run] }, 'out-of-range'],
    ['loads[1]', { loads: [0, Number.NaN, 2], runs: [run] }, 'not-finite'],
    ['runs', { loads: [0, 1, 2], runs: [] }, 'too-few-points'],
    ['runs', { loads: [0, 1, 2], runs: 'many' }, 'invalid-shape'],
    ['runs[0].ascending', { loads: [0, 1, 2], runs: [{ ascending: [0, 1] }] }, 'invalid-shape'],
    ['runs[0].ascending[1]', { loads: [0, 1, 2], runs: [{ ascending: [0, Number.NaN, 2] }] }, 'not-finite'],
    [
      'runs[1].descending',
      { loads: [0, 1, 2], runs: [run, { ...run, descending: [0, 1] }] },
      'invalid-shape',
    ],
    ['runs', { loads: [0, 1, 2], runs: [run, { ...run, descending: [0, 1, 2] }] }, 'invalid-shape'],
    ['runs[0]', { loads: [0, 1, 2], runs: [7] }, 'wrong-type'],
    ['runs', { loads: [0, 1, 2], runs: [{ ascending: [1, 1, 1] }] }, 'out-of-range'],
  ] as const)('%s: %j → %s', (param, options, code) => {
    expect(() => evaluateCertificate(options as never)).toThrowBridgeworkError(code, { param });
  });
});

describe('evaluateCertificate: finite inputs never give NaN (issue 15)', () => {
  it('readings at ±1e308 are refused naming the reading; at the 1e100 limit the figures are finite', () => {
    expect(() =>
      evaluateCertificate({ loads: [0, 1, 2], runs: [{ ascending: [-1e308, 0, 1e308] }] }),
    ).toThrowBridgeworkError('out-of-range', { param: 'runs[0].ascending[0]' });
    const e = evaluateCertificate({ loads: [0, 1, 2], runs: [{ ascending: [-1e100, 0.1e100, 1e100] }] });
    // Rated output 2e100; the midpoint sits 0.1e100 above the terminal line: 0.05 of RO (by hand).
    expect(e.terminalNonlinearityFraction).toBeNear(0.05, { rel: 1e-14 });
    expect(Number.isFinite(e.bestFitLine.slope)).toBe(true);
  });

  it('a rated output vanishing against the readings is refused rather than returned as Infinity', () => {
    expect(() =>
      evaluateCertificate({ loads: [0, 1, 2], runs: [{ ascending: [0, -1e100, 1e-300] }] }),
    ).toThrowBridgeworkError('out-of-range', { param: 'runs' });
    expect(() =>
      evaluateCertificate({ loads: [0, 1, 2], runs: [{ ascending: [0, 1e100, 5e-324] }] }),
    ).toThrowBridgeworkError('out-of-range', { param: 'runs' });
  });

  it('misspelt options are unknown-option (the options rule)', () => {
    expect(() =>
      evaluateCertificate({
        loads: [0, 1, 2],
        runs: [{ ascending: [0, 1, 2], decending: [0, 1, 2] }],
      } as never),
    ).toThrowBridgeworkError('unknown-option', { param: 'runs[0].decending' });
  });
});
