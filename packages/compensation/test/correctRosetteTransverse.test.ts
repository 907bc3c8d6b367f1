import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { correctRosetteTransverse } from '@bridgework/compensation';
import { rosetteLegAngles, type RosetteLayout } from '@bridgework/core';

const strain = fc.double({ min: -0.005, max: 0.005, noNaN: true });
const kt = fc.double({ min: -0.1, max: 0.1, noNaN: true });

/** Strain along θ from the strain state: ε(θ) = εx·cos²θ + εy·sin²θ + γ·sinθ·cosθ (Mohr). */
function along(ex: number, ey: number, gamma: number, theta: number): number {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  return ex * c * c + ey * s * s + gamma * s * c;
}

/** The forward transverse relation restated here: ε̂ = (ε(θ) + K·ε(θ + 90°))/(1 − ν0·K). */
function indicated(
  layout: RosetteLayout,
  state: [number, number, number],
  k: readonly number[],
  nu0 = 0.285,
): [number, number, number] {
  return rosetteLegAngles(layout).map((theta, i) => {
    const ki = k[i]!;
    return (along(...state, theta) + ki * along(...state, theta + Math.PI / 2)) / (1 - nu0 * ki);
  }) as [number, number, number];
}

describe('correctRosetteTransverse', () => {
  it('rectangular rosette: matches the closed form for equal Kt (derived below)', () => {
    // With ε̂' = (1 − ν0·K)·ε̂: ε̂a' = εa + K·εc, ε̂c' = εc + K·εa, ε̂b' = εb + K·(εa + εc − εb), so
    // εa = (ε̂a' − K·ε̂c')/(1 − K²), εc = (ε̂c' − K·ε̂a')/(1 − K²),
    // εb = [(1 + K)·ε̂b' − K·(ε̂a' + ε̂c')]/(1 − K²) (the rectangular correction of Dally & Riley,
    // Experimental Stress Analysis, from memory).
    const k = 0.03;
    const nu0 = 0.285;
    const legs = [8e-4, -1.2e-4, -2.5e-4] as const;
    const [a, b, c] = legs.map((e) => e * (1 - nu0 * k)) as [number, number, number];
    const got = correctRosetteTransverse({ layout: 'rectangular', strains: legs, transverseSensitivity: k });
    expect(got).toBeNear(
      [(a - k * c) / (1 - k * k), ((1 + k) * b - k * (a + c)) / (1 - k * k), (c - k * a) / (1 - k * k)],
      { rel: 1e-14 },
    );
  });

  it('delta rosette: matches the closed form for equal Kt (derived below)', () => {
    // ε(θ) + ε(θ + 90°) = εx + εy = S and εa + εb + εc = 1.5·S for a delta rosette, so
    // Σε̂' = (1 + K)·1.5·S and εi = (ε̂i' − K·S)/(1 − K).
    const k = -0.015;
    const nu0 = 0.285;
    const legs = [3e-4, 9e-4, -4e-4] as const;
    const scaled = legs.map((e) => e * (1 - nu0 * k));
    const s = (2 * scaled.reduce((p, q) => p + q, 0)) / (3 * (1 + k));
    const got = correctRosetteTransverse({ layout: 'delta', strains: legs, transverseSensitivity: k });
    expect(got).toBeNear(
      scaled.map((e) => (e - k * s) / (1 - k)),
      { rel: 1e-14 },
    );
  });

  it('returns the true legs for the issue strain state (εx 1000, εy −300 µε, γ 0) on a rectangular rosette', () => {
    const k = [0.02, 0.02, 0.02];
    const legs = indicated('rectangular', [1e-3, -3e-4, 0], k);
    expect(legs[0] * 1e6).toBeNear(999.69828, { abs: 5e-6 });
    expect(legs[2] * 1e6).toBeNear(-281.60515, { abs: 5e-6 });
    expect(
      correctRosetteTransverse({ layout: 'rectangular', strains: legs, transverseSensitivity: 0.02 }),
    ).toBeNear([1e-3, 3.5e-4, -3e-4], { rel: 1e-9 });
  });

  it('round-trips any strain state, layout and per-leg Kt (the 3×3 solve)', () => {
    const layouts = fc.oneof(
      fc.constantFrom<RosetteLayout>('rectangular', 'delta'),
      fc
        .tuple(
          fc.double({ min: -0.2, max: 0.2, noNaN: true }),
          fc.double({ min: 0.5, max: 1.2, noNaN: true }),
          fc.double({ min: 1.7, max: 2.8, noNaN: true }),
        )
        .map((anglesRadians): RosetteLayout => ({ anglesRadians })),
    );
    fc.assert(
      fc.property(
        layouts,
        strain,
        strain,
        strain,
        fc.tuple(kt, kt, kt),
        fc.double({ min: 0.2, max: 0.35, noNaN: true }),
        (layout, ex, ey, gamma, k, nu0) => {
          const legs = indicated(layout, [ex, ey, gamma], k, nu0);
          const truth = rosetteLegAngles(layout).map((theta) => along(ex, ey, gamma, theta));
          const got = correctRosetteTransverse({
            layout,
            strains: legs,
            transverseSensitivity: k,
            poissonRatio0: nu0,
          });
          // Relative to the largest strain: the forward model's own rounding and the solve
          // (condition number ≤ ~10 for these layouts) stay below 1e-14 of max|ε|.
          const scale = Math.max(Math.abs(ex), Math.abs(ey), Math.abs(gamma));
          expect(got).toBeNear(truth, { abs: 1e-14 * scale + 1e-300 });
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('with Kt = 0 returns the readings', () => {
    const legs = [1e-4, 2e-4, 3e-4] as const;
    expect(correctRosetteTransverse({ layout: 'delta', strains: legs, transverseSensitivity: 0 })).toBeNear(
      [...legs],
      { ulps: 2 },
    );
  });

  it('rejects legs that are (nearly) parallel as singular', () => {
    for (const anglesRadians of [
      [0, 0.001, 0.002],
      [0, Math.PI, Math.PI / 2],
      [0.3, 0.3, 1],
    ] as const) {
      expect(() =>
        correctRosetteTransverse({
          layout: { anglesRadians },
          strains: [0, 0, 0],
          transverseSensitivity: 0.02,
        }),
      ).toThrowBridgeworkError('singular', { param: 'layout' });
    }
  });

  it.each([
    [
      'unknown layout',
      { layout: 'tee', strains: [0, 0, 0], transverseSensitivity: 0 },
      'invalid-option',
      'layout',
    ],
    [
      'two angles',
      { layout: { anglesRadians: [0, 1] }, strains: [0, 0, 0], transverseSensitivity: 0 },
      'invalid-shape',
      'layout.anglesRadians',
    ],
    [
      'two strains',
      { layout: 'delta', strains: [0, 0], transverseSensitivity: 0 },
      'invalid-shape',
      'strains',
    ],
    [
      'a NaN strain',
      { layout: 'delta', strains: [0, Number.NaN, 0], transverseSensitivity: 0 },
      'not-finite',
      'strains[1]',
    ],
    [
      'Kt pair',
      { layout: 'delta', strains: [0, 0, 0], transverseSensitivity: [0, 0] },
      'invalid-shape',
      'transverseSensitivity',
    ],
    [
      'Kt 1 on leg c',
      { layout: 'delta', strains: [0, 0, 0], transverseSensitivity: [0, 0, 1] },
      'out-of-range',
      'transverseSensitivity[2]',
    ],
    [
      'ν0 ∞',
      { layout: 'delta', strains: [0, 0, 0], transverseSensitivity: 0, poissonRatio0: Infinity },
      'not-finite',
      'poissonRatio0',
    ],
    ['no layout', { strains: [0, 0, 0], transverseSensitivity: 0 }, 'missing-option', 'options.layout'],
  ] as const)('rejects %s', (_name, options, code, param) => {
    expect(() => correctRosetteTransverse(options as never)).toThrowBridgeworkError(code, { param });
  });
});
