/**
 * Rosette on a gusset plate: correct each leg for transverse sensitivity, then reduce the
 * corrected legs to principal strains and stresses.
 *
 * Scenario (invented for this example): a rectangular rosette is bonded on the gusset plate of
 * a truss node of a pedestrian bridge, to confirm the stress direction assumed in design during a
 * static load test. The foil rosette's data sheet states a transverse sensitivity of +1.8 % for
 * legs a and c and +1.1 % for the centre leg b, measured on the usual ν0 = 0.285 calibration beam.
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/rosette-transverse.ts
 */
import { correctRosetteTransverse } from '@bridgework/compensation';
import { microstrainFromStrain, strainFromMicrostrain } from '@bridgework/core';
import { planeStress, reduceRosette } from '@bridgework/mechanics';

const layout = 'rectangular' as const; // legs a, b, c at 0°, 45°, 90° counterclockwise from a
const transverseSensitivity = [0.018, 0.011, 0.018] as const;
const modulusPascals = 200e9;
const poissonRatio = 0.3;

// Leg readings at peak load (zero-referenced, already scaled for the instrument's gauge factor).
const indicatedMicrostrain = [412.6, 118.3, -96.4] as const;
const indicated = indicatedMicrostrain.map(strainFromMicrostrain) as [number, number, number];

// 1. Correct the legs (compensation), 2. reduce them (mechanics), 3. stresses (mechanics).
const corrected = correctRosetteTransverse({ layout, strains: indicated, transverseSensitivity });
const uncorrected = reduceRosette({ layout, strains: indicated });
const reduced = reduceRosette({ layout, strains: corrected });
const stress = planeStress({
  principalStrains: [reduced.maxStrain, reduced.minStrain],
  modulusPascals,
  poissonRatio,
});

const ue = (x: number): string => microstrainFromStrain(x).toFixed(2).padStart(9);
const deg = (x: number): string => ((x * 180) / Math.PI).toFixed(2).padStart(9);
const mpa = (x: number): string => (x / 1e6).toFixed(2).padStart(9);
const lines = [
  'bridgework example: transverse-corrected rectangular rosette on a gusset plate (invented scenario)',
  '',
  'leg        indicated µε   corrected µε',
  ...['a', 'b', 'c'].map((leg, i) => `${leg.padEnd(10)} ${ue(indicated[i]!)}      ${ue(corrected[i]!)}`),
  '',
  '                      uncorrected   corrected',
  `max principal µε       ${ue(uncorrected.maxStrain)}   ${ue(reduced.maxStrain)}`,
  `min principal µε       ${ue(uncorrected.minStrain)}   ${ue(reduced.minStrain)}`,
  `angle a → ε1 (deg)     ${deg(uncorrected.angleRadians)}   ${deg(reduced.angleRadians)}`,
  '',
  `principal stresses ${mpa(stress.maxStressPascals)} MPa and ${mpa(stress.minStressPascals)} MPa`,
  `von Mises          ${mpa(stress.vonMisesPascals)} MPa (E = 200 GPa, ν = 0.3)`,
  '',
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes and licensed practice.',
];
console.log(lines.join('\n'));
