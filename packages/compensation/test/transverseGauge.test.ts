import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CALIBRATION_POISSON_RATIO,
  correctTransverseGauge,
  indicatedTransverseStrain,
} from '@bridgework/compensation';

const strain = fc.double({ min: -0.01, max: 0.01, noNaN: true });
const kt = fc.double({ min: -0.1, max: 0.1, noNaN: true });

describe('indicatedTransverseStrain and correctTransverseGauge', () => {
  it('Kt 0.02, εx 1000 µε, εy −300 µε: the gauges read 999.69828 and −281.60515 µε', () => {
    // Issue #3 check values, derived from ε̂ = (εa + Kt·εt)/(1 − ν0·Kt) with ν0 = 0.285:
    // (1000 − 0.02·300)/(1 − 0.0057) = 994/0.9943 = 999.698280…;
    // (−300 + 0.02·1000)/0.9943 = −280/0.9943 = −281.605149….
    const x = indicatedTransverseStrain({
      axialStrain: 1e-3,
      transverseStrain: -3e-4,
      transverseSensitivity: 0.02,
    });
    const y = indicatedTransverseStrain({
      axialStrain: -3e-4,
      transverseStrain: 1e-3,
      transverseSensitivity: 0.02,
    });
    expect(x * 1e6).toBeNear(999.69828, { abs: 5e-6 });
    expect(y * 1e6).toBeNear(-281.60515, { abs: 5e-6 });
    expect(x).toBeNear(994e-6 / 0.9943, { rel: 1e-15 });
    // …and the correction returns the true values to 1e-9 relative (in fact to a few ulps).
    expect(
      correctTransverseGauge({ strain: x, transverseStrain: -3e-4, transverseSensitivity: 0.02 }),
    ).toBeNear(1e-3, {
      rel: 1e-15,
    });
    expect(
      correctTransverseGauge({ strain: y, transverseStrain: 1e-3, transverseSensitivity: 0.02 }),
    ).toBeNear(-3e-4, {
      rel: 1e-15,
    });
  });

  it('a gauge on a uniaxial field in a material with ν = ν0 has no transverse error (the calibration condition)', () => {
    fc.assert(
      fc.property(strain, kt, (e, k) => {
        const indicated = indicatedTransverseStrain({
          axialStrain: e,
          transverseStrain: -CALIBRATION_POISSON_RATIO * e,
          transverseSensitivity: k,
        });
        expect(indicated).toBeNear(e, { rel: 1e-15, abs: 1e-300 });
      }),
      { numRuns: 200 },
    );
  });

  it('round-trips over the whole domain, any ν0', () => {
    fc.assert(
      fc.property(
        strain,
        strain,
        fc.double({ min: -0.99, max: 0.99, noNaN: true }),
        fc.double({ min: -0.99, max: 0.5, noNaN: true }),
        (ea, et, k, nu0) => {
          const indicated = indicatedTransverseStrain({
            axialStrain: ea,
            transverseStrain: et,
            transverseSensitivity: k,
            poissonRatio0: nu0,
          });
          const back = correctTransverseGauge({
            strain: indicated,
            transverseStrain: et,
            transverseSensitivity: k,
            poissonRatio0: nu0,
          });
          // Relative to the larger strain (k·εt may dominate εa): a few roundings of max|ε|.
          const scale = Math.max(Math.abs(ea), Math.abs(et));
          expect(back).toBeNear(ea, { abs: 8e-16 * scale + 1e-300 });
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('Kt = 0 leaves the reading unchanged', () => {
    expect(
      indicatedTransverseStrain({ axialStrain: 7e-4, transverseStrain: 0.01, transverseSensitivity: 0 }),
    ).toBe(7e-4);
    expect(correctTransverseGauge({ strain: 7e-4, transverseStrain: 0.01, transverseSensitivity: 0 })).toBe(
      7e-4,
    );
  });

  const good = { axialStrain: 1e-3, transverseStrain: 0, transverseSensitivity: 0.02 };
  it.each([
    ['Kt = 1', { ...good, transverseSensitivity: 1 }, 'out-of-range', 'transverseSensitivity'],
    ['Kt = −1', { ...good, transverseSensitivity: -1 }, 'out-of-range', 'transverseSensitivity'],
    ['Kt NaN', { ...good, transverseSensitivity: Number.NaN }, 'not-finite', 'transverseSensitivity'],
    ['ν0 = 0.6', { ...good, poissonRatio0: 0.6 }, 'out-of-range', 'poissonRatio0'],
    ['ν0 = −1', { ...good, poissonRatio0: -1 }, 'out-of-range', 'poissonRatio0'],
    ['axial ∞', { ...good, axialStrain: Infinity }, 'not-finite', 'axialStrain'],
    ['transverse a string', { ...good, transverseStrain: '0' }, 'wrong-type', 'transverseStrain'],
  ] as const)('indicatedTransverseStrain rejects %s', (_name, options, code, param) => {
    expect(() => indicatedTransverseStrain(options as never)).toThrowBridgeworkError(code, { param });
  });

  it.each([
    [
      'missing strain',
      { transverseStrain: 0, transverseSensitivity: 0.02 },
      'missing-option',
      'options.strain',
    ],
    [
      'missing transverse strain',
      { strain: 1e-3, transverseSensitivity: 0.02 },
      'missing-option',
      'options.transverseStrain',
    ],
    [
      'Kt 1.5',
      { strain: 1e-3, transverseStrain: 0, transverseSensitivity: 1.5 },
      'out-of-range',
      'transverseSensitivity',
    ],
    [
      'ν0 NaN',
      { strain: 1e-3, transverseStrain: 0, transverseSensitivity: 0.02, poissonRatio0: Number.NaN },
      'not-finite',
      'poissonRatio0',
    ],
  ] as const)('correctTransverseGauge rejects %s', (_name, options, code, param) => {
    expect(() => correctTransverseGauge(options as never)).toThrowBridgeworkError(code, { param });
  });
});
