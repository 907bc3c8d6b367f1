/**
 * Footbridge hanger: choose a bridge arrangement for a strain-gauged tension rod, then turn a
 * logged reading into strain and force with the exact inverse.
 *
 * Scenario (invented for this example): the hangers of a timber footbridge over a river are M30
 * steel rods. One hanger is gauged to confirm the load share during a crowd test. The logger
 * excites at 5 V, reads with a 1 MΩ input, and sits 35 m away on a 4-core screened cable of
 * 0.93 Ω per conductor.
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/footbridge-hanger.ts
 * (`pnpm demo` runs the command's demo on packages/cli/demo/footbridge-monitoring.yaml, the same bridge.)
 */
import { createStrainBridge, solveBridge, type StrainBridgeOptions } from '@bridgework/bridge';
import { microstrainFromStrain, millivoltsPerVoltFromRatio, strainFromMicrostrain } from '@bridgework/core';

// --- The hanger and its instrumentation -----------------------------------------------------
const modulusPascals = 205e9; // structural steel, as used in the design calculation
const poissonRatio = 0.3;
const areaSquareMeters = 561e-6; // tensile stress area of an M30 rod
const designForceNewtons = 84e3; // hanger force under the crowd load case
const gaugeFactor = 2.09;
const gaugeOhms = 350;
const excitationVolts = 5;
const ohmsPerLead = 0.93;
const loggerInputOhms = 1e6;

const designStrain = designForceNewtons / (modulusPascals * areaSquareMeters);

// --- 1. Compare arrangements at the design strain -------------------------------------------
const candidates: { label: string; options: StrainBridgeOptions }[] = [
  {
    label: 'quarter, three-wire',
    options: { arrangement: 'quarter', gaugeFactor, gaugeOhms, leads: { ohmsPerLead, wiring: 'three-wire' } },
  },
  {
    label: 'half-poisson, three-wire',
    options: {
      arrangement: 'half-poisson',
      gaugeFactor,
      gaugeOhms,
      poissonRatio,
      leads: { ohmsPerLead, wiring: 'three-wire' },
    },
  },
  {
    label: 'full-poisson, four-wire',
    options: {
      arrangement: 'full-poisson',
      gaugeFactor,
      gaugeOhms,
      poissonRatio,
      leads: { ohmsPerLead, wiring: 'four-wire' },
    },
  },
  {
    label: 'full-poisson, six-wire',
    options: {
      arrangement: 'full-poisson',
      gaugeFactor,
      gaugeOhms,
      poissonRatio,
      leads: { ohmsPerLead, wiring: 'six-wire' },
    },
  },
];

const fmt = (x: number, digits: number): string => x.toFixed(digits).padStart(10);
const lines: string[] = [];
lines.push('bridgework demo: strain-gauged footbridge hanger (M30 rod, invented scenario)');
lines.push('');
lines.push(
  `Design load ${(designForceNewtons / 1e3).toFixed(1)} kN on ${(areaSquareMeters * 1e6).toFixed(0)} mm² of steel ` +
    `(E = ${(modulusPascals / 1e9).toFixed(0)} GPa) gives ${microstrainFromStrain(designStrain).toFixed(1)} µε.`,
);
lines.push(
  `Gauges ${gaugeOhms} Ω, GF ${gaugeFactor}; ${excitationVolts} V excitation; ${ohmsPerLead} Ω per lead.`,
);
lines.push('');
lines.push('arrangement                  output     output   lead loss  nonlinearity  gauge power');
lines.push('                              mV/V         mV          %            %           mW');
for (const { label, options } of candidates) {
  const bridge = createStrainBridge(options);
  const ratio = bridge.ratioFromStrain(designStrain);
  const { leads: _cable, ...withoutLeads } = options;
  const ideal = createStrainBridge(withoutLeads);
  const leadLoss = 1 - bridge.sensitivity / ideal.sensitivity;
  // Self-heating: solve the real network (source = four-wire excitation leads, logger input).
  const network = solveBridge({
    armsOhms: bridge.armsOhms(designStrain),
    excitationVolts,
    sourceOhms: bridge.seriesOhms,
    meterOhms: loggerInputOhms,
  });
  lines.push(
    `${label.padEnd(26)}${fmt(millivoltsPerVoltFromRatio(ratio), 4)} ${fmt(ratio * excitationVolts * 1e3, 4)} ` +
      `${fmt(leadLoss * 100, 3)}   ${fmt(bridge.nonlinearity(designStrain) * 100, 4)}   ${fmt(network.armWatts[0] * 1e3, 2)}`,
  );
}

// --- 2. Solve a logged reading exactly ---------------------------------------------------------
// Chosen: full-poisson on six wires (largest signal, rejects bending and temperature, no lead loss).
const chosen = createStrainBridge({
  arrangement: 'full-poisson',
  gaugeFactor,
  gaugeOhms,
  poissonRatio,
  leads: { ohmsPerLead, wiring: 'six-wire' },
});
const zeroMillivoltsPerVolt = 0.0412; // hanger unloaded (deck propped), logged before the test
const loadedMillivoltsPerVolt = 0.9718; // crowd load, logged at peak
const strain = chosen.strainFromRatio(loadedMillivoltsPerVolt / 1e3, {
  zeroRatio: zeroMillivoltsPerVolt / 1e3,
});
const naive =
  (4 * (loadedMillivoltsPerVolt - zeroMillivoltsPerVolt)) / 1e3 / (chosen.bridgeFactor * gaugeFactor);
const force = modulusPascals * areaSquareMeters * strain;

lines.push('');
lines.push('Logged reading, full-poisson six-wire bridge:');
lines.push(`  zero ${zeroMillivoltsPerVolt} mV/V, loaded ${loadedMillivoltsPerVolt} mV/V`);
lines.push(`  exact two-reading strain   ${microstrainFromStrain(strain).toFixed(2)} µε`);
lines.push(
  `  linear estimate            ${microstrainFromStrain(naive).toFixed(2)} µε ` +
    `(off by ${microstrainFromStrain(naive - strain).toFixed(2)} µε)`,
);
lines.push(
  `  hanger force               ${(force / 1e3).toFixed(2)} kN (${((100 * force) / designForceNewtons).toFixed(1)} % of design)`,
);
lines.push(
  `  check: 1 µε reads ${millivoltsPerVoltFromRatio(chosen.ratioFromStrain(strainFromMicrostrain(1))).toExponential(4)} mV/V`,
);
lines.push('');
lines.push(
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes and licensed practice.',
);

console.log(lines.join('\n'));
