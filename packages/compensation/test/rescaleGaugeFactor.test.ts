import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { rescaleGaugeFactor } from '@bridgework/compensation';

describe('rescaleGaugeFactor', () => {
  it('refers a reading taken at GF 2.00 to the lot factor 2.11: ε·2.00/2.11', () => {
    expect(rescaleGaugeFactor({ strain: 1.2e-3, fromGaugeFactor: 2, toGaugeFactor: 2.11 })).toBeNear(
      (1.2e-3 * 2) / 2.11,
      { ulps: 0 },
    );
    expect(rescaleGaugeFactor({ strain: -7e-4, fromGaugeFactor: 2.1, toGaugeFactor: 2.1 })).toBe(-7e-4);
  });

  it('matches two exact quarter bridges set to the two gauge factors reading one resistance change', () => {
    // Independent path: the two-reading inverse of createStrainBridge gives (ΔR/R0)/GF exactly, so a
    // reading under GF_a, rescaled to GF_b, must equal the reading under GF_b.
    fc.assert(
      fc.property(
        fc.double({ min: -0.02, max: 0.02, noNaN: true }),
        fc.double({ min: 1.8, max: 4.5, noNaN: true }),
        fc.double({ min: 1.8, max: 4.5, noNaN: true }),
        (relativeChange, gfA, gfB) => {
          const bridgeA = createStrainBridge({ arrangement: 'quarter', gaugeFactor: gfA });
          const bridgeB = createStrainBridge({ arrangement: 'quarter', gaugeFactor: gfB });
          const truth = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 1 });
          const ratio = truth.ratioFromStrain(relativeChange);
          const a = bridgeA.strainFromRatio(ratio);
          const b = bridgeB.strainFromRatio(ratio);
          // Floor 1e-17: both inverses round (1e-12 relative, see the bridge tests).
          expect(rescaleGaugeFactor({ strain: a, fromGaugeFactor: gfA, toGaugeFactor: gfB })).toBeNear(b, {
            rel: 1e-12,
            abs: 1e-17,
          });
        },
      ),
      { numRuns: 300 },
    );
  });

  it('round-trips: rescaling there and back returns the strain within 2 ulps', () => {
    fc.assert(
      fc.property(
        // Within (−1, 1) m/m after rescaling by up to 400×.
        fc.double({ min: -2e-3, max: 2e-3, noNaN: true }),
        fc.double({ min: 0.5, max: 200, noNaN: true }),
        fc.double({ min: 0.5, max: 200, noNaN: true }),
        (strain, from, to) => {
          const there = rescaleGaugeFactor({ strain, fromGaugeFactor: from, toGaugeFactor: to });
          // Four roundings: within 4 ulps (or the subnormal floor at zero).
          expect(rescaleGaugeFactor({ strain: there, fromGaugeFactor: to, toGaugeFactor: from })).toBeNear(
            strain,
            {
              ulps: 4,
              abs: 1e-300,
            },
          );
        },
      ),
      { numRuns: 500 },
    );
  });

  it.each([
    ['NaN strain', { strain: Number.NaN, fromGaugeFactor: 2, toGaugeFactor: 2 }, 'not-finite', 'strain'],
    ['missing strain', { fromGaugeFactor: 2, toGaugeFactor: 2 }, 'missing-option', 'options.strain'],
    ['zero from', { strain: 1e-3, fromGaugeFactor: 0, toGaugeFactor: 2 }, 'not-positive', 'fromGaugeFactor'],
    ['negative to', { strain: 1e-3, fromGaugeFactor: 2, toGaugeFactor: -2 }, 'not-positive', 'toGaugeFactor'],
    [
      'infinite to',
      { strain: 1e-3, fromGaugeFactor: 2, toGaugeFactor: Infinity },
      'not-finite',
      'toGaugeFactor',
    ],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => rescaleGaugeFactor(options as never)).toThrowBridgeworkError(code, { param });
  });
});
