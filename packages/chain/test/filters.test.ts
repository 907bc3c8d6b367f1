import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  bandNoiseRms,
  filterGain,
  mainsRejection,
  noiseBandwidth,
  rejectionDecibels,
  type NoiseFilter,
} from '@bridgework/chain';
import { adaptiveSimpson, piecewise, sinc } from './support/integrate.js';
import { sincKernel } from './support/sincKernel.js';

/** C(2k, k)/4^k: the mean of sin^(2k). */
const centralMean = (k: number): number => {
  let c = 1;
  for (let i = 1; i <= k; i++) c = (c * (k + i)) / i;
  return c / 4 ** k;
};

/** ∫₀^∞ sinc^(2k)(x) dx numerically: 2000 unit pieces plus the mean-value tail. */
function sincPowerIntegral(k: number): number {
  const X = 2000;
  const body = piecewise((x) => sinc(x) ** (2 * k), 0, X, X);
  return body + centralMean(k) / (Math.PI ** (2 * k) * (2 * k - 1) * X ** (2 * k - 1));
}

/** ∫₀^∞ g(f) df for a rational |H|² decaying at least as 1/f²: [0, X] in pieces plus a series tail. */
function rationalIntegral(g: (f: number) => number, X: number, tail: number): number {
  return piecewise(g, 0, X, 400) + tail;
}

describe('noiseBandwidth: closed forms against direct integration of |H(f)|² (adaptive Simpson)', () => {
  it('single pole: (π/2)·fc (textbook), and numerically', () => {
    const fc = 7.3;
    const enbw = noiseBandwidth({ kind: 'single-pole', cutoffHertz: fc });
    expect(enbw).toBeNear((Math.PI / 2) * fc, { ulps: 2 });
    const X = 1e5 * fc; // tail ∫_X^∞ df/(1 + (f/fc)²) = fc·(fc/X − (fc/X)³/3 + …)
    const numeric = rationalIntegral((f) => 1 / (1 + (f / fc) ** 2), X, fc * (fc / X - (fc / X) ** 3 / 3));
    expect(enbw).toBeNear(numeric, { rel: 1e-10 });
  });

  it.each([1, 2, 3, 4, 6, 10])(
    'Butterworth order %i: fc·(π/2n)/sin(π/2n); order 2 is π/(2√2)·fc ≈ 1.1107·fc',
    (n) => {
      const fc = 3;
      const enbw = noiseBandwidth({ kind: 'butterworth', cutoffHertz: fc, order: n });
      const X = 200 * fc; // tail fc·(fc/X)^(2n−1)/(2n − 1), next term (fc/X)^(4n−1)/(4n − 1)
      const r = fc / X;
      const numeric = rationalIntegral(
        (f) => 1 / (1 + (f / fc) ** (2 * n)),
        X,
        fc * (r ** (2 * n - 1) / (2 * n - 1) - r ** (4 * n - 1) / (4 * n - 1)),
      );
      expect(enbw).toBeNear(numeric, { rel: 1e-10 });
      if (n === 2) expect(enbw).toBeNear((Math.PI / (2 * Math.SQRT2)) * fc, { ulps: 4 }); // from memory: 1.11·fc
      expect(noiseBandwidth({ kind: 'butterworth', cutoffHertz: fc })).toBe(
        noiseBandwidth({ kind: 'butterworth', cutoffHertz: fc, order: 2 }),
      );
    },
  );

  it('two real poles: (π/2)·f1f2/(f1 + f2); equal poles (π/4)·fc', () => {
    for (const [f1, f2] of [
      [2, 2],
      [1, 30],
      [45, 0.5],
    ] as const) {
      const enbw = noiseBandwidth({ kind: 'two-real-poles', poleHertz: [f1, f2] });
      const X = 2e4 * Math.max(f1, f2);
      const numeric = rationalIntegral(
        (f) => 1 / ((1 + (f / f1) ** 2) * (1 + (f / f2) ** 2)),
        X,
        (f1 * f1 * f2 * f2) / (3 * X ** 3),
      );
      expect(enbw).toBeNear(numeric, { rel: 1e-10 });
    }
    expect(noiseBandwidth({ kind: 'two-real-poles', poleHertz: [5, 5] })).toBeNear((Math.PI / 4) * 5, {
      ulps: 2,
    });
  });

  it('brick wall: fc', () => {
    expect(noiseBandwidth({ kind: 'brick-wall', cutoffHertz: 12.5 })).toBe(12.5);
  });

  it('sinc1 = 0.5·fODR and sinc3 = 0.275·fODR (issue #4; derived, see below)', () => {
    // Derived: ENBW/fODR = ∫₀^∞ sinc^(2k)(x) dx = ½·M_2k(0), the centred B-spline of order 2k at 0;
    // k = 1: ½·1, k = 3: ½·66/120 = 11/40. Confirmed here by direct integration.
    expect(noiseBandwidth({ kind: 'sinc', order: 1, dataRateHertz: 10 })).toBe(5);
    expect(noiseBandwidth({ kind: 'sinc', order: 3, dataRateHertz: 10 })).toBeNear(2.75, { ulps: 1 });
  });

  it.each([
    [1, 1 / 2],
    [2, 1 / 3],
    [3, 11 / 40],
    [4, 151 / 630],
    [5, 15619 / 72576],
  ])('sinc%i: exact rational %d·fODR, and by direct integration of sinc^(2k)', (k, exact) => {
    const enbw = noiseBandwidth({ kind: 'sinc', order: k, dataRateHertz: 1 });
    // The rationals: ∫₀^∞ (sin x/x)^n dx = π/(2^n (n−1)!)·Σ_j (−1)^j C(n, j)(n − 2j)^(n−1) with n = 2k,
    // divided by π (the classical closed form; Gradshteyn & Ryzhik 3.836 — from memory).
    expect(enbw).toBeNear(exact, { ulps: 1 });
    expect(enbw).toBeNear(sincPowerIntegral(k), { rel: 1e-10 });
  });

  it('sinc^k with decimation N equals N·Σh²/(2·(Σh)²) of the brute-force integer kernel', () => {
    for (const k of [1, 2, 3, 4, 5]) {
      for (const n of [1, 2, 3, 4, 7, 16, 64]) {
        const h = sincKernel(k, n);
        const sumSq = h.reduce((s, v) => s + v * v, 0n);
        const sum = h.reduce((s, v) => s + v, 0n);
        // N·Σh²/(2(Σh)²), converted with 30 extra bits before the final rounding
        const ref = Number((BigInt(n) * sumSq * 2n ** 60n) / (2n * sum * sum)) / 2 ** 60;
        const enbw = noiseBandwidth({ kind: 'sinc', order: k, dataRateHertz: 1, decimation: n });
        expect(enbw).toBeNear(ref, { ulps: 1 });
      }
    }
  });

  it('the discrete sinc^k bandwidth tends to the continuous one as the decimation grows', () => {
    for (const k of [2, 3, 5]) {
      const continuous = noiseBandwidth({ kind: 'sinc', order: k, dataRateHertz: 1 });
      const at = (n: number) => noiseBandwidth({ kind: 'sinc', order: k, dataRateHertz: 1, decimation: n });
      expect(at(64)).toBeNear(continuous, { rel: 1e-3 });
      expect(at(2 ** 20)).toBeNear(continuous, { rel: 1e-11 });
      expect(Math.abs(at(1024) - continuous)).toBeLessThan(Math.abs(at(64) - continuous));
    }
  });
});

describe('filterGain', () => {
  const sincAt = (k: number) => ({ kind: 'sinc', order: k, dataRateHertz: 1 }) as const;

  it('sinc1 at fODR/2 is 2/π (−3.92 dB); nulls at every multiple of fODR are exactly 0', () => {
    expect(filterGain(sincAt(1), 0.5)).toBeNear(2 / Math.PI, { ulps: 2 });
    for (const k of [1, 3, 5]) for (const m of [1, 2, 5, 50, 1e6]) expect(filterGain(sincAt(k), m)).toBe(0);
    expect(filterGain({ kind: 'sinc', order: 3, dataRateHertz: 10 }, 50)).toBe(0);
    expect(filterGain({ kind: 'sinc', order: 3, dataRateHertz: 10 }, 60)).toBe(0);
  });

  it.each([
    [1, 0.443, 0.0005],
    [3, 0.262, 0.0005],
    [4, 0.23, 0.005],
  ])('sinc%i has its −3 dB point at %d·fODR (data-sheet figure, common practice)', (k, f3, tol) => {
    let lo = 0.01;
    let hi = 0.99;
    for (let i = 0; i < 80; i++) {
      const m = (lo + hi) / 2;
      if (filterGain(sincAt(k), m) > Math.SQRT1_2) lo = m;
      else hi = m;
    }
    expect(lo).toBeNear(f3, { abs: tol });
  });

  it('with a decimation equals the DFT of the brute-force kernel, and is 1 at the modulator rate', () => {
    for (const [k, n] of [
      [1, 8],
      [3, 16],
      [4, 5],
    ] as const) {
      const h = sincKernel(k, n).map(Number);
      const sum = h.reduce((s, v) => s + v, 0);
      for (const x of [0.1, 0.37, 1.5, 2.25, n / 2 - 0.3]) {
        const w = (2 * Math.PI * x) / n; // radians per modulator sample at f = x·fODR
        let re = 0;
        let im = 0;
        h.forEach((v, i) => {
          re += v * Math.cos(w * i);
          im -= v * Math.sin(w * i);
        });
        const dft = Math.hypot(re, im) / sum;
        expect(filterGain({ kind: 'sinc', order: k, dataRateHertz: 1, decimation: n }, x)).toBeNear(dft, {
          abs: 1e-13, // DFT summation error over ≤ 70 terms
        });
      }
      expect(filterGain({ kind: 'sinc', order: k, dataRateHertz: 1, decimation: n }, n)).toBe(1);
    }
  });

  it('the analog filters: −3 dB at their cut-off, symmetric in frequency, brick wall 1 then 0', () => {
    expect(filterGain({ kind: 'single-pole', cutoffHertz: 10 }, 10)).toBeNear(Math.SQRT1_2, { ulps: 1 });
    expect(filterGain({ kind: 'butterworth', cutoffHertz: 10, order: 4 }, 10)).toBeNear(Math.SQRT1_2, {
      ulps: 1,
    });
    expect(filterGain({ kind: 'butterworth', cutoffHertz: 10, order: 4 }, 20)).toBeNear(
      1 / Math.sqrt(1 + 256),
      {
        ulps: 2,
      },
    );
    expect(filterGain({ kind: 'two-real-poles', poleHertz: [4, 4] }, 4)).toBeNear(0.5, { ulps: 1 });
    expect(filterGain({ kind: 'single-pole', cutoffHertz: 10 }, -3)).toBe(
      filterGain({ kind: 'single-pole', cutoffHertz: 10 }, 3),
    );
    expect(filterGain({ kind: 'brick-wall', cutoffHertz: 10 }, 10)).toBe(1);
    expect(filterGain({ kind: 'brick-wall', cutoffHertz: 10 }, 10.000001)).toBe(0);
    expect(rejectionDecibels({ kind: 'brick-wall', cutoffHertz: 10 }, 11)).toBe(Infinity);
  });
});

describe('mainsRejection', () => {
  const sinc3 = { kind: 'sinc', order: 3, dataRateHertz: 10 } as const;

  /** The largest gain on a dense grid of the band: an independent (brute-force) worst case. */
  function sampledWorst(filter: NoiseFilter, lo: number, hi: number): number {
    let worst = 0;
    for (let i = 0; i <= 20000; i++)
      worst = Math.max(worst, filterGain(filter, lo + ((hi - lo) * i) / 20000));
    return worst;
  }

  /**
   * The largest gain at 2001 points of [mains − δ, mains + δ], clamped to the band's ends as
   * doubles: (mains − δ) + 2δ may round past mains + δ, and next to a null that one ulp matters.
   */
  function denseScan(filter: NoiseFilter, mains: number, delta: number): number {
    const lo = mains - delta;
    const hi = mains + delta;
    let scan = 0;
    for (let i = 0; i <= 2000; i++)
      scan = Math.max(scan, filterGain(filter, Math.min(hi, Math.max(lo, lo + (2 * delta * i) / 2000))));
    return scan;
  }

  it('a 10 Hz sinc3 nulls 50 and 60 Hz and rejects ±1 Hz around both by more than 100 dB (data sheets: ≥ 100 dB, common practice)', () => {
    for (const mains of [50, 60]) {
      const r = mainsRejection({ filter: sinc3, mainsHertz: mains });
      expect(r.nominalDecibels).toBe(Infinity);
      expect(r.worstDecibels).toBeGreaterThan(100);
      const worstGain = sampledWorst(sinc3, mains - 1, mains + 1);
      expect(10 ** (-r.worstDecibels / 20)).toBeNear(worstGain, { rel: 1e-9 });
      expect(r.worstFrequencyHertz).toBe(mains - 1); // the response falls with frequency: the low edge
    }
    // At 49 Hz, x = 4.9: |sin(4.9π)/(4.9π)|³ = (sin(0.1π)/(4.9π))³ by hand.
    expect(rejectionDecibels(sinc3, 49)).toBeNear(
      -60 * Math.log10(Math.sin(0.1 * Math.PI) / (4.9 * Math.PI)),
      {
        rel: 1e-13,
      },
    );
  });

  it('finds a lobe peak inside the band (golden section), matching a dense scan', () => {
    const filter = { kind: 'sinc', order: 3, dataRateHertz: 1 } as const;
    const r = mainsRejection({ filter, mainsHertz: 50, deviationHertz: 0.8 });
    expect(r.worstFrequencyHertz).toBeGreaterThan(49.2);
    expect(r.worstFrequencyHertz).toBeLessThan(49.6);
    expect(10 ** (-r.worstDecibels / 20)).toBeNear(sampledWorst(filter, 49.2, 50.8), { rel: 1e-7 }); // grid step 8e-5
    // The lobe peak of |sinc| between 49 and 50 solves tan(πx) = πx, i.e. πx·cos(πx) = sin(πx),
    // just below 49.5 (≈ 49.5 − 1/(π²·49.5)); solved here by bisection.
    const h = (x: number) => Math.PI * x * Math.cos(Math.PI * x) - Math.sin(Math.PI * x);
    let lo = 49.4;
    let hi = 49.5;
    for (let i = 0; i < 60; i++) {
      const m = (lo + hi) / 2;
      if (Math.sign(h(m)) === Math.sign(h(lo))) lo = m;
      else hi = m;
    }
    expect(lo).toBeNear(49.5 - 1 / (Math.PI ** 2 * 49.5), { abs: 1e-6 });
    expect(r.worstFrequencyHertz).toBeNear(lo, { abs: 1e-6 }); // golden section to 1e-12·f; flat peak
  });

  it('property: the reported worst case is never beaten by a dense scan, for any sinc filter', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5 }),
        fc.double({ min: 1, max: 120, noNaN: true }),
        fc.constantFrom(50, 60),
        fc.double({ min: 0, max: 3, noNaN: true }),
        (k, odr, mains, delta) => {
          const filter = { kind: 'sinc', order: k, dataRateHertz: odr } as const;
          const r = mainsRejection({ filter, mainsHertz: mains, deviationHertz: delta });
          expect(10 ** (-r.worstDecibels / 20)).toBeGreaterThanOrEqual(
            denseScan(filter, mains, delta) * (1 - 1e-12),
          );
        },
      ),
      { numRuns: 60 },
    );
  });

  it('property counterexample [1, 1, 50, 1.72e-9]: the scan stays inside the band (it once stepped one ulp past it)', () => {
    // The band is [mains − δ, mains + δ] as doubles. The scan's last point (mains − δ) + 2δ rounds
    // to one ulp of 50 (7.1e-15 Hz) above mains + δ; next to the null at 50 Hz the gain grows as
    // |f − 50|, so that ulp is 4e-6 of the gain there: the scan saw a frequency outside the band,
    // not a worse one inside it. The scan now clamps to the band's ends.
    const filter = { kind: 'sinc', order: 1, dataRateHertz: 1 } as const;
    const delta = 1.7228547477543545e-9;
    expect(50 - delta + 2 * delta).toBeGreaterThan(50 + delta); // the rounding that misled the scan
    const r = mainsRejection({ filter, mainsHertz: 50, deviationHertz: delta });
    // |sinc(f)| next to its null at 50 Hz is |sin(π(f − 50))|/(πf) = (|f − 50|/f)·(1 − O(1e-17)),
    // worst at the band end farther from 50 as doubles (f − 50 is exact there: Sterbenz).
    const lo = 50 - delta;
    const hi = 50 + delta;
    const worst = Math.max((50 - lo) / lo, (hi - 50) / hi);
    expect(10 ** (-r.worstDecibels / 20)).toBeNear(worst, { rel: 1e-12 });
    expect(10 ** (-r.worstDecibels / 20)).toBeGreaterThanOrEqual(denseScan(filter, 50, delta) * (1 - 1e-12));
  });

  it('a single pole is worst at the low band edge', () => {
    const r = mainsRejection({
      filter: { kind: 'single-pole', cutoffHertz: 1 },
      mainsHertz: 60,
      deviationHertz: 2,
    });
    expect(r.worstFrequencyHertz).toBe(58);
    expect(r.worstDecibels).toBeNear(10 * Math.log10(1 + 58 ** 2), { rel: 1e-14 });
    expect(r.nominalDecibels).toBeNear(10 * Math.log10(1 + 60 ** 2), { rel: 1e-14 });
  });
});

describe('1/f noise through each filter: closed forms against direct integration of |H|²/f', () => {
  /** F = ∫_{fL}^∞ |H|²/f df from bandNoiseRms with S₀ = 1 and a large corner: rms² = ENBW + fc·F. */
  function flickerFactor(filter: NoiseFilter, lowHertz: number): number {
    const corner = 1e3;
    const rms = bandNoiseRms({ whiteDensity: 1, cornerHertz: corner, filter, lowHertz });
    return (rms * rms - noiseBandwidth(filter)) / corner;
  }
  /** ∫_{fL}^∞ g(f)/f df numerically: log-substitution f = e^u over [fL, X] plus a tail. */
  function logIntegral(g: (f: number) => number, fL: number, X: number, tail: number): number {
    return piecewise((u) => g(Math.exp(u)), Math.log(fL), Math.log(X), 200) + tail;
  }

  it('brick wall: ln(fc/fL), and 0 when fL is above the cut-off', () => {
    expect(flickerFactor({ kind: 'brick-wall', cutoffHertz: 10 }, 0.01)).toBeNear(Math.log(1000), {
      rel: 1e-12,
    });
    expect(flickerFactor({ kind: 'brick-wall', cutoffHertz: 10 }, 20)).toBeNear(0, { abs: 1e-15 });
  });

  it.each([1, 2, 5])('Butterworth order %i: ln(1 + (fc/fL)^(2n))/(2n)', (n) => {
    const fc = 4;
    for (const fL of [1e-4, 0.3, 4, 40]) {
      const X = 1e3 * fc;
      const numeric = logIntegral((f) => 1 / (1 + (f / fc) ** (2 * n)), fL, X, (fc / X) ** (2 * n) / (2 * n));
      expect(flickerFactor({ kind: 'butterworth', cutoffHertz: fc, order: n }, fL)).toBeNear(numeric, {
        rel: 1e-9,
        abs: 1e-12, // fL = 10·fc: F ≈ 1e-2/(2n)^…, absolute floor from rms² − ENBW
      });
    }
  });

  it('two real poles, including equal and nearly equal poles', () => {
    for (const [f1, f2] of [
      [2, 2],
      [2, 2 * (1 + 1e-9)],
      [0.5, 40],
    ] as const) {
      for (const fL of [1e-3, 0.7]) {
        const X = 1e4 * Math.max(f1, f2);
        const g = (f: number) => 1 / ((1 + (f / f1) ** 2) * (1 + (f / f2) ** 2));
        const numeric = logIntegral(g, fL, X, (f1 * f1 * f2 * f2) / (4 * X ** 4));
        expect(flickerFactor({ kind: 'two-real-poles', poleHertz: [f1, f2] }, fL)).toBeNear(numeric, {
          rel: 1e-9,
        });
      }
    }
  });

  it.each([1, 2, 3, 4, 5])('sinc%i (Gauss–Legendre panels) against adaptive Simpson', (k) => {
    const odr = 10;
    for (const fL of [1e-3, 0.05, 3, 12.5]) {
      const xL = fL / odr;
      const X = 3000;
      let numeric = 0;
      // Absolute tolerances far below the smallest F here (~1e-6 for sinc5 above f_ODR).
      if (xL < 1) {
        numeric += adaptiveSimpson((u) => sinc(Math.exp(u)) ** (2 * k), Math.log(xL), 0, 1e-16);
        numeric += piecewise((x) => sinc(x) ** (2 * k) / x, 1, X, 2 * (X - 1), 1e-18);
      } else {
        numeric += piecewise((x) => sinc(x) ** (2 * k) / x, xL, X, 2 * (X - 1), 1e-18);
      }
      numeric += centralMean(k) / (Math.PI ** (2 * k) * 2 * k * X ** (2 * k));
      expect(flickerFactor({ kind: 'sinc', order: k, dataRateHertz: odr }, fL)).toBeNear(numeric, {
        rel: 1e-9,
      });
    }
  });
});

describe('filters: bad inputs', () => {
  it.each([
    ['unknown kind', { kind: 'bessel', cutoffHertz: 1 }, 'invalid-option', 'filter.kind'],
    ['missing cutoff', { kind: 'single-pole' }, 'missing-option', 'filter.cutoffHertz'],
    ['negative cutoff', { kind: 'brick-wall', cutoffHertz: -1 }, 'not-positive', 'filter.cutoffHertz'],
    ['infinite cutoff', { kind: 'butterworth', cutoffHertz: Infinity }, 'not-finite', 'filter.cutoffHertz'],
    ['order 0', { kind: 'butterworth', cutoffHertz: 1, order: 0 }, 'out-of-range', 'filter.order'],
    ['order 2.5', { kind: 'butterworth', cutoffHertz: 1, order: 2.5 }, 'not-integer', 'filter.order'],
    ['one pole', { kind: 'two-real-poles', poleHertz: [1] }, 'invalid-shape', 'filter.poleHertz'],
    ['zero pole', { kind: 'two-real-poles', poleHertz: [1, 0] }, 'not-positive', 'filter.poleHertz[1]'],
    ['sinc6', { kind: 'sinc', order: 6, dataRateHertz: 10 }, 'out-of-range', 'filter.order'],
    ['sinc without rate', { kind: 'sinc', order: 3 }, 'missing-option', 'filter.dataRateHertz'],
    [
      'decimation 0',
      { kind: 'sinc', order: 3, dataRateHertz: 10, decimation: 0 },
      'out-of-range',
      'filter.decimation',
    ],
    ['null filter', null, 'wrong-type', 'filter'],
  ] as const)('%s → %s', (_name, filter, code, param) => {
    expect(() => noiseBandwidth(filter as never)).toThrowBridgeworkError(code, { param });
  });

  it('filterGain rejects a NaN frequency; mainsRejection its band', () => {
    const f = { kind: 'sinc', order: 3, dataRateHertz: 10 } as const;
    expect(() => filterGain(f, Number.NaN)).toThrowBridgeworkError('not-finite', { param: 'frequencyHertz' });
    expect(() => mainsRejection({ filter: f, mainsHertz: 0 })).toThrowBridgeworkError('not-positive', {
      param: 'mainsHertz',
    });
    expect(() => mainsRejection({ filter: f, mainsHertz: 50, deviationHertz: -1 })).toThrowBridgeworkError(
      'negative',
      {
        param: 'deviationHertz',
      },
    );
    expect(() => mainsRejection({ filter: f, mainsHertz: 50, deviationHertz: 50 })).toThrowBridgeworkError(
      'out-of-range',
      {
        param: 'deviationHertz',
      },
    );
  });
});
