import * as mechanics from '@bridgework/mechanics';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('mechanics', mechanics, name, args, extra);
const m = (creator: string, make: () => unknown, name: string, args: () => unknown[], extra = {}): BaseCall =>
  method('mechanics', creator, make, name, args, extra);

const steel = { modulusPascals: 200e9, poissonRatio: 0.3 };
const axial = () => mechanics.createAxialMember({ modulusPascals: 200e9, areaSquareMeters: 1e-4 });
const bending = () =>
  mechanics.createBendingMember({
    modulusPascals: 200e9,
    section: { shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.01 },
    leverArmMeters: 0.5,
  });
const shaft = () => mechanics.createShaft({ diameterMeters: 0.05, innerDiameterMeters: 0.02, ...steel });
const memberOptions = () => ({
  ...steel,
  section: { shape: 'circular', diameterMeters: 0.06, innerDiameterMeters: 0.05 },
  gauges: [
    { yMeters: 0, zMeters: 0.03 },
    { yMeters: 0, zMeters: -0.03 },
    { yMeters: 0.03, zMeters: 0 },
    { yMeters: -0.03, zMeters: 0, angleRadians: 0.7853981633974483 },
  ],
});
const member = () => mechanics.createMemberReduction(memberOptions() as never);
const rosette = () => mechanics.createRosette({ layout: { anglesRadians: [0, 1, 2] } });
// The direction of the principal axes is undefined when the principal strains are equal; the
// reduction says so with `equalPrincipalStrains` (see the rosette's documentation).
const state = { strainX: 1e-3, strainY: -2e-4, shearStrainXY: 3e-4 };

/** Base calls of @bridgework/mechanics. */
export const mechanicsCalls: readonly BaseCall[] = [
  f('createAxialMember', () => [
    {
      modulusPascals: 200e9,
      section: { shape: 'circular', diameterMeters: 0.02, innerDiameterMeters: 0.01 },
    },
  ]),
  f('createBendingMember', () => [
    { modulusPascals: 200e9, sectionModulusCubicMeters: 3.3e-7, leverArmMeters: 0.5 },
  ]),
  f('createShaft', () => [{ diameterMeters: 0.05, shearModulusPascals: 79e9 }]),
  f('createShaft', () => [{ diameterMeters: 0.05, innerDiameterMeters: 0.02, ...steel }], {
    variant: 'E and ν',
  }),
  f('createRosette', () => [{ layout: { anglesRadians: [0, 1, 2] } }]),
  f('createRosette', () => [{ layout: 'delta' }], { variant: 'delta' }),
  f('reduceRosette', () => [{ layout: 'rectangular', strains: [1e-3, 3.5e-4, -3e-4] }]),
  f('planeStress', () => [{ ...steel, principalStrains: [1e-3, -3e-4] }]),
  f('planeStress', () => [{ ...steel, strainState: state }], { variant: 'strain state' }),
  f('sectionProperties', () => [{ shape: 'circular', diameterMeters: 0.05, innerDiameterMeters: 0.02 }]),
  f('sectionProperties', () => [{ shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.01 }], {
    variant: 'rectangular',
  }),
  f(
    'sectionProperties',
    () => [{ shape: 'rectangular', widthMeters: 0.08, depthMeters: 0.12, wallThicknessMeters: 0.006 }],
    { variant: 'box' },
  ),
  f('normalStrainAtAngle', () => [state, 0.3]),
  f('principalStrainsFromState', () => [state]),
  m('createAxialMember', axial, 'forceFromStrain', () => [1e-3]),
  m('createAxialMember', axial, 'strainFromForce', () => [2e4]),
  m('createBendingMember', bending, 'momentFromStrain', () => [1e-3]),
  m('createBendingMember', bending, 'strainFromMoment', () => [60]),
  m('createBendingMember', bending, 'forceFromStrain', () => [1e-3]),
  m('createBendingMember', bending, 'strainFromForce', () => [120]),
  m('createShaft', shaft, 'torqueFromStrain', () => [2e-4]),
  m('createShaft', shaft, 'torqueFromGaugePair', () => [2e-4, -2e-4]),
  m('createShaft', shaft, 'strainFromTorque', () => [500]),
  f('createMemberReduction', () => [memberOptions()]),
  m('createMemberReduction', member, 'reduce', () => [[3e-4, 1e-4, 2e-4, 5e-5]]),
  m('createMemberReduction', member, 'gaugeStrains', () => [
    { axialForceNewtons: 1e4, torqueNewtonMeters: 50 },
  ]),
  m('createRosette', rosette, 'reduce', () => [[1e-3, 3.5e-4, -3e-4]]),
  m('createRosette', rosette, 'legStrains', () => [state]),
];

/** Exports of @bridgework/mechanics that are not functions. */
export const mechanicsNotCalled: Readonly<Record<string, string>> = {};
