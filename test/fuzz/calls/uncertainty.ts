import * as uncertainty from '@bridgework/uncertainty';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('uncertainty', uncertainty, name, args, extra);

// `inputs` and `observations` are records keyed by the user's own quantity names, not options.
const inputs = () => ({
  V: { value: 5, standardUncertainty: 0.002, degreesOfFreedom: 12 },
  W: { value: 1, standardUncertainty: 0.01 },
  I: { value: 0.02, distribution: 'rectangular', halfWidth: 2e-5 },
  R: { value: 100, expandedUncertainty: 0.02, coverageFactor: 2 },
  T: { value: 20, distribution: 't', scale: 0.1, degreesOfFreedom: 9 },
});
const model = ({ V, W, I, R, T }: Readonly<Record<string, number>>) => (V! * W!) / I! + R! * 1e-3 + T! * 1e-3;
// Degrees of freedom are ∞ for a Type B input without doubt about its uncertainty, and ν_eff is
// ∞ when every component is (JCGM 100 G.4, G.6.6): documented values.
const dof = { nonFinite: ['**.degreesOfFreedom', '**.effectiveDegreesOfFreedom'] };
const maps = { maps: ['0.inputs'], ...dof };

const line = () =>
  uncertainty.fitLine({ x: [1, 2, 3, 4], y: [2.1, 3.9, 6.0, 8.1], x0: 2, yStandardUncertainties: 0.05 });

/** Base calls of @bridgework/uncertainty. */
export const uncertaintyCalls: readonly BaseCall[] = [
  f('normalQuantile', () => [0.975]),
  f('studentTQuantile', () => [0.975, 9]),
  f('coverageFactor', () => [0.95, 4]),
  // ν_eff is documented as Infinity when every component is exact (or u_c = 0).
  f(
    'welchSatterthwaite',
    () => [
      {
        components: [
          { contribution: 0.3, degreesOfFreedom: 4 },
          { contribution: 0.4, degreesOfFreedom: 30 },
        ],
        combinedStandardUncertainty: 0.5,
      },
    ],
    { nonFinite: [''] },
  ),
  f(
    'fitLine',
    () => [{ x: [1, 2, 3, 4], y: [2.1, 3.9, 6.0, 8.1], x0: 2, yStandardUncertainties: 0.05 }],
    dof,
  ),
  method('uncertainty', 'fitLine', line, 'predict', () => [2.5], dof),
  method('uncertainty', 'fitLine', line, 'quantities', () => [], dof),
  f('standardUncertaintyOf', () => [{ value: 2.1, distribution: 'rectangular', halfWidth: 0.021 }]),
  f('standardUncertaintyOf', () => [{ value: 10, expandedUncertainty: 0.02, coverageFactor: 2 }], {
    variant: 'certificate',
  }),
  f('typeAEvaluation', () => [{ V: [5.007, 4.994, 5.005, 4.99, 4.999] }], { maps: ['0'], ...dof }),
  f('sampleCoverageIntervals', () => [
    [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20, 21],
    0.9,
  ]),
  f('numericalTolerance', () => [0.00035, 2]),
  f('validateGum', () => [
    {
      gum: { value: 0, expandedUncertainty: 3.92 },
      monteCarlo: { standardUncertainty: 2.0, interval: { min: -3.88, max: 3.88 } },
      significantDigits: 2,
    },
  ]),
  f(
    'propagate',
    () => [
      {
        model,
        inputs: inputs(),
        correlations: [{ between: ['W', 'R'], coefficient: 0.3 }],
        secondOrder: false,
        coverage: 0.95,
        degreesOfFreedom: 50,
      },
    ],
    maps,
  ),
  f(
    'propagate',
    () => [
      {
        model: { order: ['a', 'b'], evaluate: (x: Float64Array) => [x[0]! + x[1]!, x[0]! - x[1]!] },
        inputs: { a: { value: 1, standardUncertainty: 0.1 }, b: { value: 2, standardUncertainty: 0.1 } },
      },
    ],
    { variant: 'vector, positional', ...maps },
  ),
  f(
    'monteCarlo',
    () => [
      {
        model,
        inputs: inputs(),
        correlations: [{ between: ['W', 'R'], coefficient: 0.3 }],
        trials: 2000,
        seed: 7,
        coverage: 0.95,
        significantDigits: 2,
        compareWithGum: true,
        returnValues: false,
        onProgress: () => undefined,
      },
    ],
    maps,
  ),
  f(
    'monteCarlo',
    () => [
      {
        model: { order: ['a', 'b'], evaluate: (x: Float64Array) => x[0]! * x[1]! },
        inputs: { a: { value: 1, standardUncertainty: 0.1 }, b: { value: 2, standardUncertainty: 0.1 } },
        seed: 3,
        adaptive: { interval: 'symmetric', maxTrials: 200_000 },
        significantDigits: 1,
      },
    ],
    { variant: 'adaptive, positional', ...maps },
  ),
];

/** Exports of @bridgework/uncertainty that are not fuzzed as calls. */
export const uncertaintyNotCalled: Readonly<Record<string, string>> = {};
