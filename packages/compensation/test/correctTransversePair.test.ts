import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  correctTransverseGauge,
  correctTransversePair,
  indicatedTransverseStrain,
} from '@bridgework/compensation';

const strain = fc.double({ min: -0.01, max: 0.01, noNaN: true });
const kt = fc.double({ min: -0.1, max: 0.1, noNaN: true });

describe('correctTransversePair', () => {
  it('returns εx = 1000 µε, εy = −300 µε from 999.69828 / −281.60515 µε to 1e-9 relative', () => {
    // Issue #3: the indicated values are those of the forward relation (see transverseGauge.test.ts).
    const [ex, ey] = correctTransversePair({
      strains: [9.996982801971236e-4, -2.8160514935130243e-4],
      transverseSensitivity: 0.02,
    });
    expect(ex).toBeNear(1e-3, { rel: 1e-9 });
    expect(ey).toBeNear(-3e-4, { rel: 1e-9 });
    // In fact to a few ulps:
    expect(ex).toBeNear(1e-3, { ulps: 4 });
    expect(ey).toBeNear(-3e-4, { ulps: 4 });
  });

  it('inverts the forward relation for any strains and per-gauge Kt (round trip)', () => {
    fc.assert(
      fc.property(
        strain,
        strain,
        kt,
        kt,
        fc.double({ min: 0.2, max: 0.35, noNaN: true }),
        (ex, ey, kx, ky, nu0) => {
          const strains = [
            indicatedTransverseStrain({
              axialStrain: ex,
              transverseStrain: ey,
              transverseSensitivity: kx,
              poissonRatio0: nu0,
            }),
            indicatedTransverseStrain({
              axialStrain: ey,
              transverseStrain: ex,
              transverseSensitivity: ky,
              poissonRatio0: nu0,
            }),
          ] as const;
          const [cx, cy] = correctTransversePair({
            strains,
            transverseSensitivity: [kx, ky],
            poissonRatio0: nu0,
          });
          const scale = Math.max(Math.abs(ex), Math.abs(ey));
          expect(cx).toBeNear(ex, { abs: 2e-15 * scale + 1e-300 });
          expect(cy).toBeNear(ey, { abs: 2e-15 * scale + 1e-300 });
          // Each corrected strain is consistent with the single-gauge correction given the other.
          expect(
            correctTransverseGauge({
              strain: strains[0],
              transverseStrain: cy,
              transverseSensitivity: kx,
              poissonRatio0: nu0,
            }),
          ).toBeNear(cx, {
            abs: 2e-15 * scale + 1e-300,
          });
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('matches the textbook closed form for equal Kt: εx = (1 − ν0·K)(ε̂x − K·ε̂y)/(1 − K²)', () => {
    // Dally & Riley, Experimental Stress Analysis, strain-gauge chapter (from memory).
    const k = 0.035;
    const nu0 = 0.285;
    const [cx, cy] = correctTransversePair({ strains: [1.5e-3, 4e-4], transverseSensitivity: k });
    expect(cx).toBeNear(((1 - nu0 * k) * (1.5e-3 - k * 4e-4)) / (1 - k * k), { rel: 1e-15 });
    expect(cy).toBeNear(((1 - nu0 * k) * (4e-4 - k * 1.5e-3)) / (1 - k * k), { rel: 1e-15 });
  });

  it.each([
    ['one strain', { strains: [1e-3], transverseSensitivity: 0.02 }, 'invalid-shape', 'strains'],
    [
      'a NaN strain',
      { strains: [1e-3, Number.NaN], transverseSensitivity: 0.02 },
      'not-finite',
      'strains[1]',
    ],
    [
      'three Kt',
      { strains: [1e-3, 0], transverseSensitivity: [0.02, 0.02, 0.02] },
      'invalid-shape',
      'transverseSensitivity',
    ],
    [
      'Kt −1 for gauge y',
      { strains: [1e-3, 0], transverseSensitivity: [0.02, -1] },
      'out-of-range',
      'transverseSensitivity[1]',
    ],
    ['missing Kt', { strains: [1e-3, 0] }, 'missing-option', 'options.transverseSensitivity'],
    [
      'ν0 0.51',
      { strains: [1e-3, 0], transverseSensitivity: 0.02, poissonRatio0: 0.51 },
      'out-of-range',
      'poissonRatio0',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => correctTransversePair(options as never)).toThrowBridgeworkError(code, { param });
  });
});
