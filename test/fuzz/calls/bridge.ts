import * as bridge from '@bridgework/bridge';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('bridge', bridge, name, args, extra);

// A strain bridge's strain range is open-ended on the side where no gauge loses resistance
// (documented: `strainRange` is the open interval of strains keeping every gauge positive).
const ranges = { nonFinite: ['strainRange.min', 'strainRange.max'] };

const quarter = () =>
  bridge.createStrainBridge({
    arrangement: 'quarter',
    gaugeFactor: 2,
    leads: { ohmsPerLead: 1.2, wiring: 'three-wire' },
  });
const bendingPoisson = () =>
  bridge.createStrainBridge({ arrangement: 'full-bending-poisson', gaugeFactor: 2.1, poissonRatio: 0.3 });
const kernel = () =>
  bridge.createStrainBridgeKernel({
    arrangement: 'quarter',
    gaugeFactor: 2,
    wiring: 'three-wire',
    sourceOhms: 0.5,
  });
const k = (name: string, args: () => unknown[]): BaseCall =>
  method('bridge', 'createStrainBridgeKernel', kernel, name, args, { variant: 'quarter' });
const m = (make: () => unknown, variant: string, name: string, args: () => unknown[], extra = {}): BaseCall =>
  method('bridge', 'createStrainBridge', make, name, args, { variant, ...extra });

/** Base calls of @bridgework/bridge. */
export const bridgeCalls: readonly BaseCall[] = [
  f('needsPoissonRatio', () => ['half-poisson']),
  f('solveBridge', () => [
    { armsOhms: [350.7, 350, 350, 350], excitationVolts: 10, sourceOhms: 50, meterOhms: 10_000 },
  ]),
  f('solveArm', () => [
    {
      armsOhms: [null, 350, 350, 350],
      excitationVolts: 10,
      outputVolts: 0.004223022653,
      sourceOhms: 50,
      meterOhms: 10_000,
    },
  ]),
  f(
    'createStrainBridge',
    () => [
      {
        arrangement: 'quarter',
        gaugeFactor: 2,
        gaugeOhms: 350,
        completionOhms: 350,
        leads: { ohmsPerLead: 1.2, wiring: 'two-wire' },
        sourceOhms: 1,
      },
    ],
    { variant: 'quarter', ...ranges },
  ),
  f(
    'createStrainBridge',
    () => [
      {
        arrangement: 'full-poisson',
        gaugeFactor: 2,
        poissonRatio: 0.3,
        leads: { ohmsPerLead: 1, wiring: 'four-wire' },
      },
    ],
    { variant: 'full-poisson', ...ranges },
  ),
  f(
    'createStrainBridge',
    () => [{ arrangement: 'full-bending-poisson', gaugeFactor: 2.1, poissonRatio: 0.3 }],
    {
      variant: 'full-bending-poisson',
      ...ranges,
    },
  ),
  f(
    'createStrainBridgeKernel',
    () => [
      { arrangement: 'full-poisson', gaugeFactor: 2, poissonRatio: 0.3, wiring: 'four-wire', sourceOhms: 1 },
    ],
    { variant: 'full-poisson', ...ranges },
  ),
  k('strainFromRatio', () => [4.98e-4, 350.1, 0.8]),
  k('ratioFromStrain', () => [1e-3, 350.1, 0.8]),
  k('armOhms', () => [2, 1e-3, 350.1, 0.8]),
  k('seriesOhms', () => [0.8]),
  m(quarter, 'quarter', 'ratioFromStrain', () => [1e-3, { zeroRatio: 1e-6 }]),
  m(quarter, 'quarter', 'strainFromRatio', () => [4.98e-4, { zeroRatio: 1.2e-6 }]),
  m(quarter, 'quarter', 'nonlinearity', () => [2e-3]),
  m(quarter, 'quarter', 'linearRatioFromStrain', () => [1e-3]),
  m(quarter, 'quarter', 'armsOhms', () => [1e-3]),
  m(bendingPoisson, 'full-bending-poisson', 'ratioFromStrain', () => [1e-3]),
  m(bendingPoisson, 'full-bending-poisson', 'strainFromRatio', () => [2e-3]),
];

/** Exports of @bridgework/bridge that are not functions. */
export const bridgeNotCalled: Readonly<Record<string, string>> = {};
