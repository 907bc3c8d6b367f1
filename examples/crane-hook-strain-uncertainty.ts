/**
 * Crane hook proof test: the uncertainty of a quarter-bridge strain reading, by the GUM law of
 * propagation and by Monte Carlo, side by side.
 *
 * Scenario (invented for this example): the shank of a 5 t crane hook carries one 350 Ω foil
 * gauge (gauge factor 2.05 ± 1 % from the package label) in a three-wire quarter bridge on 8 m of
 * cable (0.26 Ω per conductor). A ratiometric logger averages 20 readings at proof load and 10
 * with the hook unloaded. What is the strain, and how well is it known?
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/crane-hook-strain-uncertainty.ts
 */
import { createStrainBridge } from '@bridgework/bridge';
import { microstrainFromStrain } from '@bridgework/core';
import { monteCarlo, propagate, typeAEvaluation, type InputQuantities } from '@bridgework/uncertainty';

// --- The measurement -----------------------------------------------------------------------------
const leads = { ohmsPerLead: 0.26, wiring: 'three-wire' } as const;
// Logged bridge ratios (V/V): 20 readings under proof load, 10 unloaded (invented data).
const loaded = [
  256.9, 255.6, 257.8, 256.5, 256.0, 257.3, 256.7, 255.7, 257.1, 256.4, 258.0, 256.2, 256.8, 255.8, 257.4,
  256.6, 256.3, 257.2, 255.9, 257.0,
].map((microVoltsPerVolt) => microVoltsPerVolt * 1e-6);
const unloaded = [2.9, 1.6, 3.3, 2.0, 3.1, 1.8, 2.7, 2.2, 3.0, 1.7].map((uvv) => uvv * 1e-6);

// Type A evaluations of the two means (JCGM 100 4.2): u = s/√n with n − 1 degrees of freedom.
const loadedA = typeAEvaluation({ ratio: loaded }).inputs['ratio']!;
const unloadedA = typeAEvaluation({ zeroRatio: unloaded }).inputs['zeroRatio']!;

const inputs: InputQuantities = {
  ratio: loadedA,
  zeroRatio: unloadedA,
  // The package tolerance ±1 % taken as the bounds of a rectangular distribution (common practice).
  gaugeFactor: { value: 2.05, distribution: 'rectangular', halfWidth: 0.0205 },
};

// --- The model: the exact two-reading inverse of the bridge package ----------------------------
// Every arm of a strain bridge is Rg(1 + GF·s·ε) plus its leads, so the output depends on GF·ε only:
// the strain for gauge factor GF is the strain of a GF = 1 bridge divided by GF, exactly. One
// bridge is therefore built once, and the model stays cheap enough for 10⁶ trials.
const unitBridge = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 1, leads });
const model = ({ ratio, zeroRatio, gaugeFactor }: Readonly<Record<string, number>>): number =>
  unitBridge.strainFromRatio(ratio!, { zeroRatio: zeroRatio! }) / gaugeFactor!;

// The identity, checked at the estimates against a bridge built with the nominal gauge factor:
const nominal = createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2.05, leads });
const direct = nominal.strainFromRatio(loadedA.value, { zeroRatio: unloadedA.value });

// --- GUM and Monte Carlo -----------------------------------------------------------------------------
const gum = propagate({ model, inputs });
const mcm = monteCarlo({ model, inputs, trials: 1_000_000, seed: 2026 });

const ue = (strain: number, digits = 2): string => microstrainFromStrain(strain).toFixed(digits).padStart(9);
const lines: string[] = [];
lines.push(
  'bridgework example: crane hook proof test, quarter-bridge strain uncertainty (invented scenario)',
);
lines.push('');
lines.push(
  `Load reading ${(loadedA.value * 1e6).toFixed(3)} µV/V (u ${(loadedA.standardUncertainty * 1e6).toFixed(4)}, ν ${loadedA.degreesOfFreedom}), zero ${(unloadedA.value * 1e6).toFixed(3)} µV/V (u ${(unloadedA.standardUncertainty * 1e6).toFixed(4)}, ν ${unloadedA.degreesOfFreedom})`,
);
lines.push(`Gauge factor 2.05 ± 1 % (rectangular); three-wire leads ${leads.ohmsPerLead} Ω; 350 Ω gauge`);
lines.push(
  `Check: GF = 1 bridge / GF equals the GF = 2.05 bridge to ${Math.abs(gum.value / direct - 1).toExponential(1)} (relative)`,
);
lines.push('');
lines.push('Uncertainty budget (law of propagation, JCGM 100)');
lines.push('  input          estimate        u(xᵢ)    cᵢ (µε per unit)   uᵢ(y) µε     ν');
for (const l of gum.budget) {
  const estimate = l.name === 'gaugeFactor' ? l.value.toFixed(4) : `${(l.value * 1e6).toFixed(3)} µV/V`;
  const u =
    l.name === 'gaugeFactor'
      ? l.standardUncertainty.toExponential(3)
      : `${(l.standardUncertainty * 1e6).toFixed(4)} µV/V`;
  lines.push(
    `  ${l.name.padEnd(12)} ${estimate.padStart(14)} ${u.padStart(14)} ${(l.sensitivity * 1e6).toExponential(4).padStart(14)} ${microstrainFromStrain(l.contribution).toFixed(4).padStart(11)} ${(l.degreesOfFreedom === Infinity ? '∞' : String(l.degreesOfFreedom)).padStart(5)}`,
  );
}
lines.push('');
lines.push('                               GUM (JCGM 100)   Monte Carlo (JCGM 101)');
lines.push(`  strain, µε                   ${ue(gum.value)}        ${ue(mcm.value)}`);
lines.push(
  `  standard uncertainty, µε     ${ue(gum.standardUncertainty, 3)}        ${ue(mcm.standardUncertainty, 3)}`,
);
lines.push(`  effective degrees of freedom ${gum.effectiveDegreesOfFreedom.toPrecision(3).padStart(9)}`);
lines.push(`  coverage factor (95 %)       ${gum.coverageFactor.toFixed(3).padStart(9)}`);
lines.push(
  `  95 % interval, µε            [${ue(gum.interval.min).trim()}, ${ue(gum.interval.max).trim()}]   [${ue(mcm.interval.min).trim()}, ${ue(mcm.interval.max).trim()}] (symmetric)`,
);
lines.push(
  `  shortest 95 % interval, µε                     [${ue(mcm.shortestInterval.min).trim()}, ${ue(mcm.shortestInterval.max).trim()}]`,
);
lines.push(`  trials                                         ${mcm.trials}`);
const v = mcm.gumValidation!;
lines.push('');
lines.push(
  `GUM validated by Monte Carlo (JCGM 101 clause 8, ndig = ${v.significantDigits}): ${v.validated ? 'yes' : 'no'} ` +
    `(d_low ${microstrainFromStrain(v.dLow).toFixed(4)} µε, d_high ${microstrainFromStrain(v.dHigh).toFixed(4)} µε, δ ${microstrainFromStrain(v.tolerance).toFixed(4)} µε)`,
);
lines.push(
  'The gauge-factor tolerance dominates: its rectangular distribution makes the output flat-topped, not',
);
lines.push(
  'Gaussian, so the true 95 % interval is narrower than the GUM’s ±1.96·u. Report the Monte Carlo one.',
);
lines.push('');
lines.push(
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.',
);
console.log(lines.join('\n'));
