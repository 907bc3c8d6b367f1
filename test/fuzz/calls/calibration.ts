import * as calibration from '@bridgework/calibration';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('calibration', calibration, name, args, extra);
const m = (creator: string, make: () => unknown, name: string, args: () => unknown[], extra = {}): BaseCall =>
  method('calibration', creator, make, name, args, extra);

const scaleOptions = () => ({
  capacity: 1000,
  capacityUnit: 'kilogram',
  ratedOutputVoltsPerVolt: 2.0012e-3,
  calibrationGravityMetersPerSecondSquared: 9.8119,
  localGravityMetersPerSecondSquared: 9.8062,
});
const loadCellOptions = () => ({ accuracyClass: 'C', nLC: 3000, maxCapacity: 3000 });
const polynomialOptions = () => ({ loads: [0, 1, 2, 3, 4], readings: [0.1, 2.1, 3.9, 6.1, 8.0], degree: 1 });
const twoPointOptions = () => ({ zeroReading: 1.2e-5, spanLoad: 1000, spanReading: 2.0012e-3 });
// A two-component sensor with a little cross-talk and reading noise, on a 3 × 3 loading grid.
const multiPoints = () => {
  const points: { loads: number[]; readings: number[] }[] = [];
  let k = 0;
  for (const fx of [-1000, 0, 1000]) {
    for (const fy of [-1000, 0, 1000]) {
      const noise = ((k++ * 7919) % 13) * 1e-9 - 6e-9;
      points.push({
        loads: [fx, fy],
        readings: [1e-6 * fx + 1e-8 * fy + noise, 2e-8 * fx + 1e-6 * fy - noise],
      });
    }
  }
  return points;
};
const multiOptions = () => ({ components: ['Fx', 'Fy'], bridges: ['A', 'B'], points: multiPoints() });
const multi = () => calibration.fitMultiComponent(multiOptions() as never);
const storedOptions = () => ({
  components: ['Fx', 'Fy'],
  bridges: ['A', 'B'],
  terms: ['1', 'Fx', 'Fy', 'Fx*Fy'],
  coefficients: [
    [1e-5, 1e-6, 1e-8, 2e-12],
    [-2e-5, 2e-8, 1e-6, -1e-12],
  ],
  fullScale: [1000, 1000],
  covariance: {
    unitCovariance: [
      [0.2, 0, 0, 0],
      [0, 1e-7, 0, 0],
      [0, 0, 1e-7, 0],
      [0, 0, 0, 1e-13],
    ],
    readingCovariance: [
      [1e-17, 0],
      [0, 1e-17],
    ],
    degreesOfFreedom: 5,
  },
});
const stored = () => calibration.createMultiComponentModel(storedOptions() as never);
const bridgeShunt = { gaugeOhms: 350, gaugeFactor: 2 };

/** Base calls of @bridgework/calibration. */
export const calibrationCalls: readonly BaseCall[] = [
  f('createCertificateScale', () => [scaleOptions()]),
  f('createLoadCellClass', () => [loadCellOptions()]),
  f('evaluateCertificate', () => [
    {
      loads: [0, 500, 1000],
      runs: [{ ascending: [0, 1.0004e-3, 2e-3], descending: [0.0002e-3, 1.0008e-3, 2e-3] }],
    },
  ]),
  f('fitPolynomial', () => [polynomialOptions()]),
  f('fitTwoPoint', () => [twoPointOptions()]),
  f('checkEccentricity', () => [
    {
      accuracyClass: 'III',
      maxCapacity: 3000,
      verificationInterval: 1,
      testLoad: 1000,
      indications: [1000.5, 999.6, 1000, 1000.4],
    },
  ]),
  f('fitCornerFactors', () => [
    {
      cellReadings: [
        [1.01e-3, 0, 0, 0],
        [0, 0.99e-3, 0, 0],
        [0, 0, 1e-3, 0],
        [0, 0, 0, 1.02e-3],
      ],
      testLoad: 1000,
    },
  ]),
  f('summingNetworkRatio', () => [{ cellOhms: [350, 350], trimsOhms: [0, 0], cellRatios: [2e-3, 0] }]),
  f('fitSummingTrims', () => [
    {
      cellOhms: [350, 350, 350, 350],
      cellRatios: [
        [2.02e-3, 0, 0, 0],
        [0, 2e-3, 0, 0],
        [0, 0, 1.99e-3, 0],
        [0, 0, 0, 2.01e-3],
      ],
    },
  ]),
  f('fitMultiComponent', () => [multiOptions()]),
  f('nearestPreferredValue', () => [{ value: 174_650, series: 'E24', rounding: 'up' }]),
  f('preferredValues', () => ['E12']),
  f('shuntRatios', () => [{ ...bridgeShunt, shuntOhms: 174_650 }]),
  f('strainFromShunt', () => [{ ...bridgeShunt, shuntOhms: 174_650, arm: 2 }]),
  f('shuntOhmsForStrain', () => [{ ...bridgeShunt, strain: -1e-3 }]),
  f('spanCorrectionFromShunt', () => [{ expectedStep: -1e-3, measuredStep: -0.9915e-3 }]),
  f('ratioChangeFromShunt', () => [{ bridgeOhms: 350, shuntOhms: 43_575 }]),
  f('shuntOhmsForRatioChange', () => [{ bridgeOhms: 350, ratioChange: -0.002 }]),
  f('shuntEquivalentLoad', () => [
    { capacity: 5000, ratedOutputVoltsPerVolt: 2.0012e-3, ratioChange: -1.4979e-3 },
  ]),
  m(
    'createCertificateScale',
    () => calibration.createCertificateScale(scaleOptions() as never),
    'loadFromRatio',
    () => [1.0006e-3],
  ),
  m(
    'createCertificateScale',
    () => calibration.createCertificateScale(scaleOptions() as never),
    'ratioFromLoad',
    () => [500],
  ),
  m(
    'createLoadCellClass',
    () => calibration.createLoadCellClass(loadCellOptions() as never),
    'mpe',
    () => [1500],
  ),
  m(
    'createLoadCellClass',
    () => calibration.createLoadCellClass(loadCellOptions() as never),
    'mpeInIntervals',
    () => [1500],
  ),
  m(
    'createLoadCellClass',
    () => calibration.createLoadCellClass(loadCellOptions() as never),
    'checkErrors',
    () => [{ loads: [0, 1500, 3000], errors: [0, 0.3, -0.5] }],
  ),
  m(
    'createLoadCellClass',
    () => calibration.createLoadCellClass(loadCellOptions() as never),
    'creepLimits',
    () => [3000],
  ),
  m(
    'createLoadCellClass',
    () => calibration.createLoadCellClass(loadCellOptions() as never),
    'checkCreep',
    () => [{ load: 3000, minutes: [0, 10, 20, 30], readings: [3000, 3000.1, 3000.2, 3000.2] }],
  ),
  m(
    'fitPolynomial',
    () => calibration.fitPolynomial(polynomialOptions() as never),
    'readingAt',
    () => [2.5],
  ),
  m(
    'fitPolynomial',
    () => calibration.fitPolynomial(polynomialOptions() as never),
    'readingUncertaintyAt',
    () => [2.5],
  ),
  m(
    'fitPolynomial',
    () => calibration.fitPolynomial(polynomialOptions() as never),
    'loadAt',
    () => [4],
  ),
  m(
    'fitTwoPoint',
    () => calibration.fitTwoPoint(twoPointOptions() as never),
    'readingAt',
    () => [500],
  ),
  m(
    'fitTwoPoint',
    () => calibration.fitTwoPoint(twoPointOptions() as never),
    'loadAt',
    () => [1.0066e-3],
  ),
  m(
    'fitCornerFactors',
    () =>
      calibration.fitCornerFactors({
        cellReadings: [
          [1.01e-3, 0, 0, 0],
          [0, 0.99e-3, 0, 0],
          [0, 0, 1e-3, 0],
          [0, 0, 0, 1.02e-3],
        ],
        testLoad: 1000,
      }),
    'sum',
    () => [[2.5e-4, 2.5e-4, 2.5e-4, 2.5e-4]],
  ),
  // Degrees of freedom are ∞ for a stored covariance without them (JCGM 100 G.4).
  f('createMultiComponentModel', () => [storedOptions()], {
    nonFinite: ['degreesOfFreedom', '**.degreesOfFreedom'],
  }),
  m('createMultiComponentModel', stored, 'readingsAt', () => [[300, -200]]),
  m('createMultiComponentModel', stored, 'createInverse', () => [{ tolerance: 1e-12, maxIterations: 50 }]),
  m('createMultiComponentModel', stored, 'uncertaintyAt', () => [
    { loads: [300, -200], readingStandardUncertainties: [1e-9, 1e-9], includeCalibration: true },
  ]),
  m(
    'createMultiComponentModel',
    stored,
    'monteCarloAt',
    () => [{ loads: [300, -200], readingStandardUncertainties: [1e-9, 1e-9], trials: 2000, seed: 5 }],
    { nonFinite: ['**.degreesOfFreedom', '**.effectiveDegreesOfFreedom'] },
  ),
  m('fitMultiComponent', multi, 'readingsAt', () => [[300, -200]]),
  m('fitMultiComponent', multi, 'createInverse', () => [{ tolerance: 1e-12, maxIterations: 50 }]),
  m('fitMultiComponent', multi, 'uncertaintyAt', () => [
    { loads: [300, -200], readingStandardUncertainties: [1e-9, 1e-9], includeCalibration: true },
  ]),
  // Degrees of freedom are ∞ for inputs without doubt about their uncertainty (JCGM 100 G.4).
  m(
    'fitMultiComponent',
    multi,
    'monteCarloAt',
    () => [
      {
        readings: [3e-4, -2e-4],
        readingStandardUncertainties: [1e-9, 1e-9],
        trials: 2000,
        seed: 5,
        coverage: 0.95,
      },
    ],
    { nonFinite: ['**.degreesOfFreedom', '**.effectiveDegreesOfFreedom'] },
  ),
];

/** Exports of @bridgework/calibration that are not fuzzed as calls. */
export const calibrationNotCalled: Readonly<Record<string, string>> = {};
