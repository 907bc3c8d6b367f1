/**
 * Batching-hopper load cell: prove a weighing channel by a shunt check, a five-point up/down run
 * and an OIML R 60 class check.
 *
 * Scenario (invented for this example): the aggregate hopper of a precast-concrete batching plant
 * stands on three 2000 kg compression load cells, class C3 (nLC 3000, pLC 0.7). Before the plant's
 * weighing is verified, the engineer proves one cell's channel on a test rig: 350 Ω bridge,
 * six-wire cable, shunt 59.0 kΩ across −signal/−excitation (arm 2), reference weights of
 * conventional mass in 500 kg steps, two runs up and down.
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/hopper-load-cell-calibration.ts
 */
import {
  createCertificateScale,
  createLoadCellClass,
  evaluateCertificate,
  fitPolynomial,
  ratioChangeFromShunt,
  shuntEquivalentLoad,
  shuntOhmsForRatioChange,
} from '@bridgework/calibration';
import { millivoltsPerVoltFromRatio, ratioFromMillivoltsPerVolt } from '@bridgework/core';

const capacityKilograms = 2000;
const loads = [0, 500, 1000, 1500, 2000];
const mvPerV = (values: number[]): number[] => values.map(ratioFromMillivoltsPerVolt);
// Logged readings in mV/V (the indicator shows six decimals).
const runs = [
  {
    ascending: mvPerV([0.0152, 0.51556, 1.01582, 1.51594, 2.016]),
    descending: mvPerV([0.01525, 0.51566, 1.01595, 1.51605, 2.016]),
  },
  {
    ascending: mvPerV([0.01521, 0.51558, 1.01583, 1.51595, 2.01602]),
    descending: mvPerV([0.01527, 0.51569, 1.01598, 1.51607, 2.01602]),
  },
];
const shuntOhms = 59_000;
const shuntReadingOnSite = ratioFromMillivoltsPerVolt(1.47832); // logged with the shunt in, minus zero

const lines: string[] = [];
// The library returns fractions of rated output; the report shows them in percent.
const pct = (x: number | undefined): string => (x === undefined ? '–' : `${(100 * x).toFixed(4)} %`);
lines.push('bridgework example: batching-hopper load cell, 2000 kg C3 (invented scenario)');
lines.push('');

// --- 1. The five-point up/down run -------------------------------------------------------------
const cert = evaluateCertificate({ loads, runs });
lines.push('1. Five-point up/down run, two runs');
lines.push(`   rated output             ${millivoltsPerVoltFromRatio(cert.ratedOutput).toFixed(6)} mV/V`);
lines.push(
  `   zero balance             ${millivoltsPerVoltFromRatio(cert.zeroBalance).toFixed(6)} mV/V (${pct(cert.zeroBalanceFraction)} RO)`,
);
lines.push(`   terminal nonlinearity    ${pct(cert.terminalNonlinearityFraction)} RO`);
lines.push(`   best-fit nonlinearity    ${pct(cert.bestFitNonlinearityFraction)} RO`);
lines.push(`   hysteresis               ${pct(cert.hysteresisFraction)} RO`);
lines.push(`   combined error           ${pct(cert.combinedErrorFraction)} RO`);
lines.push(`   repeatability            ${pct(cert.repeatabilityFraction)} RO`);

// A least-squares line with uncertainties, from all 20 readings.
const fit = fitPolynomial({
  loads: runs.flatMap(() => [...loads, ...loads]),
  readings: runs.flatMap((r) => [...r.ascending, ...r.descending]),
  degree: 1,
});
const [offset, slope] = fit.coefficients as [number, number];
const [uOffset, uSlope] = fit.standardUncertainties as [number, number];
lines.push(
  `   least-squares line       ${millivoltsPerVoltFromRatio(offset).toFixed(6)} mV/V + ${(millivoltsPerVoltFromRatio(slope) * 1000).toFixed(6)} mV/V per t`,
);
lines.push(
  `                            u = ${(millivoltsPerVoltFromRatio(uOffset) * 1e3).toFixed(2)} µV/V, ${(millivoltsPerVoltFromRatio(uSlope) * 1e6).toFixed(2)} µV/V per t; s = ${(millivoltsPerVoltFromRatio(fit.residualStandardDeviation!) * 1e3).toFixed(2)} µV/V`,
);
lines.push('');

// --- 2. The shunt check ----------------------------------------------------------------------
const shuntChange = ratioChangeFromShunt({
  bridgeOhms: 350,
  shuntOhms,
  arm: 2,
  leads: { ohmsPerLead: 0.9, wiring: 'six-wire' },
});
const scale = createCertificateScale({
  capacity: capacityKilograms,
  capacityUnit: 'kilogram',
  ratedOutputVoltsPerVolt: cert.ratedOutput,
  zeroVoltsPerVolt: cert.zeroBalance,
  // Rig and plant share one site, so one gravity: conventional-mass buoyancy then cancels.
  calibrationGravityMetersPerSecondSquared: 9.8094,
  localGravityMetersPerSecondSquared: 9.8094,
});
const equivalent = shuntEquivalentLoad({
  capacity: capacityKilograms,
  ratedOutputVoltsPerVolt: cert.ratedOutput,
  ratioChange: shuntReadingOnSite,
});
const shuntFor80 = shuntOhmsForRatioChange({ bridgeOhms: 350, arm: 2, ratioChange: 0.8 * cert.ratedOutput });
lines.push('2. Shunt check (59.0 kΩ across arm 2, ideal 350 Ω bridge)');
lines.push(`   computed shunt step      ${millivoltsPerVoltFromRatio(shuntChange).toFixed(5)} mV/V`);
lines.push(`   logged shunt step        ${millivoltsPerVoltFromRatio(shuntReadingOnSite).toFixed(5)} mV/V`);
lines.push(
  `   agreement                ${(((shuntReadingOnSite - shuntChange) / shuntChange) * 100).toFixed(3)} % (channel gain check)`,
);
lines.push(`   equivalent load          ${equivalent.toFixed(1)} kg`);
lines.push(`   shunt for 80 % of RO     ${(shuntFor80 / 1e3).toFixed(2)} kΩ`);
lines.push('');

// --- 3. The class check -----------------------------------------------------------------------
const c3 = createLoadCellClass({ accuracyClass: 'C', nLC: 3000, maxCapacity: capacityKilograms, y: 15_000 });
const checkLoads = runs.flatMap(() => [...loads, ...loads]);
const errors = runs
  .flatMap((r) => [...r.ascending, ...r.descending])
  .map((ratio, i) => scale.loadFromRatio(ratio) - checkLoads[i]!);
const check = c3.checkErrors({ loads: checkLoads, errors });
const creep = c3.checkCreep({
  minutes: [0, 5, 10, 20, 30],
  readings: [2000, 2000.12, 2000.2, 2000.27, 2000.31],
});
lines.push('3. OIML R 60 class C3 check (pLC 0.7; recalled tables, confirm against the standard)');
lines.push(`   v = ${c3.verificationInterval.toFixed(4)} kg, vmin = Emax/Y = ${c3.vmin!.toFixed(4)} kg`);
lines.push('   load kg   largest |error| kg   mpe kg   used');
for (const load of loads) {
  const rows = check.value.rows.filter((r) => r.load === load);
  const worst = rows.reduce((a, b) => (b.fractionOfMpe > a.fractionOfMpe ? b : a));
  lines.push(
    `   ${String(load).padStart(7)}   ${Math.abs(worst.error).toFixed(3).padStart(18)}   ${worst.mpe.toFixed(3).padStart(6)}   ${(worst.fractionOfMpe * 100).toFixed(0).padStart(3)} %`,
  );
}
lines.push(
  `   errors within mpe        ${check.ok ? 'yes' : 'no'} (largest ${(check.value.largestFractionOfMpe * 100).toFixed(0)} % of mpe)`,
);
lines.push(
  `   creep at Dmax            ${creep.value.thirtyMinuteChange.toFixed(2)} kg in 30 min (limit ${creep.value.limits.thirtyMinutes.toFixed(3)}), ` +
    `${creep.value.twentyToThirtyMinuteChange.toFixed(2)} kg from 20 to 30 min (limit ${creep.value.limits.twentyToThirtyMinutes.toFixed(3)}): ${creep.ok ? 'pass' : 'fail'}`,
);
for (const issue of [...check.issues, ...creep.issues, ...c3.specification.issues])
  lines.push(`   issue: ${issue}`);
lines.push('');
lines.push(
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice. A class check computed here is not a verification.',
);

console.log(lines.join('\n'));
