/**
 * Gantry crane proof load: reduce a rosette on the end-carriage web to principal stresses and von
 * Mises, and turn a full-shear bridge on the hoist drive shaft into torque.
 *
 * Scenario (invented for this example): a 20 t workshop gantry crane is proof loaded after a
 * repair. A rectangular rosette sits on the end-carriage web beside the repaired weld, gauge a
 * along the carriage; the hoist's hollow drive shaft carries a full-shear bridge (two ±45° pairs
 * on opposite sides). The logger reads the rosette legs in µε and the bridge in mV/V.
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/gantry-crane.ts
 */
import { createStrainBridge } from '@bridgework/bridge';
import { microstrainFromStrain, ratioFromMillivoltsPerVolt, strainFromMicrostrain } from '@bridgework/core';
import { createRosette, createShaft, planeStress } from '@bridgework/mechanics';

// --- Material: structural steel S355 ------------------------------------------------------------
const modulusPascals = 205e9;
const poissonRatio = 0.3;
const yieldPascals = 355e6; // nominal minimum yield strength used in the design check

// --- 1. Rosette on the end-carriage web ---------------------------------------------------------
// Legs a (0°, along the carriage), b (45°), c (90°, vertical), zeroed before the lift, at proof load.
const legsMicrostrain = [412, -118, -236] as const;
const rosette = createRosette({ layout: 'rectangular' });
const reduction = rosette.reduce([
  strainFromMicrostrain(legsMicrostrain[0]),
  strainFromMicrostrain(legsMicrostrain[1]),
  strainFromMicrostrain(legsMicrostrain[2]),
]);
const stress = planeStress({ strainState: reduction, modulusPascals, poissonRatio });

const mpa = (pascals: number): string => (pascals / 1e6).toFixed(1).padStart(7);
const ue = (strain: number): string => microstrainFromStrain(strain).toFixed(1).padStart(7);
const lines: string[] = [];
lines.push('bridgework example: gantry crane proof load (invented scenario)');
lines.push('');
lines.push(`Rectangular rosette on the end-carriage web, legs ${legsMicrostrain.join(' / ')} µε:`);
lines.push(
  `  strain state   εx ${ue(reduction.strainX)}  εy ${ue(reduction.strainY)}  γxy ${ue(reduction.shearStrainXY)} µε`,
);
lines.push(
  `  principal      ε1 ${ue(reduction.maxStrain)}  ε2 ${ue(reduction.minStrain)}  γmax ${ue(reduction.maxShearStrain)} µε`,
);
lines.push(
  `  direction of ε1 ${((reduction.angleRadians * 180) / Math.PI).toFixed(1)}° from gauge a, counterclockwise positive ` +
    `(condition number ${rosette.conditionNumber.toFixed(2)})`,
);
lines.push(`  stresses       σ1 ${mpa(stress.maxStressPascals)}  σ2 ${mpa(stress.minStressPascals)} MPa`);
lines.push(
  `                 σx ${mpa(stress.stressXPascals)}  σy ${mpa(stress.stressYPascals)}  τxy ${mpa(stress.shearStressXYPascals)} MPa`,
);
lines.push(
  `  von Mises      ${mpa(stress.vonMisesPascals)} MPa = ${((100 * stress.vonMisesPascals) / yieldPascals).toFixed(1)} % of ` +
    `the ${(yieldPascals / 1e6).toFixed(0)} MPa yield strength; Tresca ${mpa(stress.trescaPascals)} MPa`,
);

// --- 2. Full-shear bridge on the hoist drive shaft ----------------------------------------------
const gaugeFactor = 2.05;
const bridge = createStrainBridge({
  arrangement: 'full-shear',
  gaugeFactor,
  leads: { ohmsPerLead: 0.6, wiring: 'six-wire' },
});
const zeroMillivoltsPerVolt = 0.0093; // hook unloaded
const loadedMillivoltsPerVolt = 0.8537; // proof load lifting off the floor
const strain45 = bridge.strainFromRatio(ratioFromMillivoltsPerVolt(loadedMillivoltsPerVolt), {
  zeroRatio: ratioFromMillivoltsPerVolt(zeroMillivoltsPerVolt),
});
const shaft = createShaft({ diameterMeters: 0.07, innerDiameterMeters: 0.045, modulusPascals, poissonRatio });
const torque = shaft.torqueFromStrain(strain45);
const designTorqueNewtonMeters = 2900; // motor torque times gear ratio at the rated hoist load

lines.push('');
lines.push(`Hoist drive shaft, Ø70/45 mm, full-shear bridge (GF ${gaugeFactor}, six-wire):`);
lines.push(`  zero ${zeroMillivoltsPerVolt} mV/V, proof load ${loadedMillivoltsPerVolt} mV/V`);
lines.push(`  +45° gauge strain  ${microstrainFromStrain(strain45).toFixed(2)} µε`);
lines.push(
  `  shaft torque       ${torque.toFixed(0)} N·m (${((100 * torque) / designTorqueNewtonMeters).toFixed(1)} % of the ` +
    `${designTorqueNewtonMeters} N·m rated-load torque)`,
);
lines.push(`  surface shear      ${mpa((torque * 0.035) / shaft.polarMomentOfAreaMeters4)} MPa (τ = T·r/J)`);
lines.push('');
lines.push(
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes and licensed practice.',
);

console.log(lines.join('\n'));
