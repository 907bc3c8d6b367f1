/**
 * Data of the worked examples of JCGM 100:2008 (GUM) and JCGM 101:2008, as used by several test
 * files. All recalled from memory; each is validated by reproducing the published results.
 */
import type { InputQuantities } from '@bridgework/uncertainty';

/** JCGM 100 H.2, Table H.2: five sets of simultaneous observations of V (V), I (A) and φ (rad). */
export const h2Observations = {
  V: [5.007, 4.994, 5.005, 4.99, 4.999],
  I: [19.663e-3, 19.639e-3, 19.64e-3, 19.685e-3, 19.678e-3],
  phi: [1.0456, 1.0438, 1.0468, 1.0428, 1.0433],
};

/** JCGM 100 H.2: resistance, reactance and impedance R = (V/I)cos φ, X = (V/I)sin φ, Z = V/I. */
export const impedance = ({ V, I, phi }: Readonly<Record<string, number>>): number[] => [
  (V! / I!) * Math.cos(phi!),
  (V! / I!) * Math.sin(phi!),
  V! / I!,
];

/** JCGM 100 H.3, Table H.6: thermometer readings t_k (°C) and observed corrections b_k (°C). */
export const h3 = {
  t: [21.521, 22.012, 22.512, 23.003, 23.507, 23.999, 24.513, 25.002, 25.503, 26.01, 26.511],
  b: [-0.171, -0.169, -0.166, -0.159, -0.164, -0.165, -0.156, -0.157, -0.159, -0.161, -0.16],
  t0: 20,
};

/**
 * JCGM 101 9.3 (mass calibration): δm = (m_Rc + δm_Rc)(1 + (ρa − ρa0)(1/ρW − 1/ρR)) − m_nom in mg,
 * with ρa0 = 1.2 kg/m³ and m_nom = 100 g.
 */
export const massCalibration = {
  model: ({ mRc, dmRc, rhoA, rhoW, rhoR }: Readonly<Record<string, number>>): number =>
    (mRc! + dmRc!) * (1 + (rhoA! - 1.2) * (1 / rhoW! - 1 / rhoR!)) - 100000,
  inputs: {
    mRc: { value: 100000, standardUncertainty: 0.05 },
    dmRc: { value: 1.234, standardUncertainty: 0.02 },
    rhoA: { value: 1.2, distribution: 'rectangular', halfWidth: 0.1 },
    rhoW: { value: 8000, distribution: 'rectangular', halfWidth: 1000 },
    rhoR: { value: 8000, distribution: 'rectangular', halfWidth: 50 },
  } satisfies InputQuantities,
};
