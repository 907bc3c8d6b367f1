/**
 * Silo support leg: correct a day's strain readings for the cable, the gauge temperature and the
 * transverse sensitivity of a rosette, with an RTD on the leg for the temperature.
 *
 * Scenario (invented for this example): a steel grain silo stands on four tubular legs. One leg is
 * gauged to check its load share while the silo is filled. A quarter-bridge gauge (350 Ω, lot
 * gauge factor 2.11, self-compensated for steel) reads the axial strain; a rectangular rosette on
 * the same leg measures the strain state for a check of the principal directions; a class A
 * Pt100 on three wires measures the leg temperature. The logger is in the control room, 40 m of
 * AWG 26 three-wire cable away; its bridge channels are set to GF 2.00. The channel was zeroed with
 * the silo empty on a cool morning (leg 12 °C, cable 15 °C) and read full in the afternoon
 * (leg 38 °C, cable lying in the sun at 45 °C).
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/silo-leg-corrections.ts
 */
import { createStrainBridge } from '@bridgework/bridge';
import {
  correctRosetteTransverse,
  correctTemperatureEffects,
  createRtd,
  createThermalOutput,
  leadDesensitization,
  leadTemperatureEffect,
  rtdLeadError,
  wireOhms,
} from '@bridgework/compensation';
import { microstrainFromStrain } from '@bridgework/core';

// --- The installation -------------------------------------------------------------------------
const gaugeOhms = 350;
const lotGaugeFactor = 2.11; // from the gauge package
const setting = 2; // the logger's gauge-factor setting
const cable = { awg: 26, lengthMeters: 40 };
const zero = { legCelsius: 12, cableCelsius: 15 };
const reading = { legCelsius: 38, cableCelsius: 45 };

// The lot's thermal output on steel, printed on the gauge package (invented values), at GF 2.00.
const thermalOutput = createThermalOutput({
  coefficientsMicrostrain: [-22.4, 1.83, -4.6e-2, 2.4e-4, -3.6e-7],
  gaugeFactor: 2,
  rangeCelsius: [-30, 200],
});

const lines: string[] = [];
const us = (strain: number, digits = 1): string => `${microstrainFromStrain(strain).toFixed(digits)} µε`;
lines.push('bridgework example: silo support leg, corrections of a day’s readings (invented scenario)');
lines.push('');

// --- 1. The cable -------------------------------------------------------------------------------
const leadAtZero = wireOhms({ ...cable, temperatureCelsius: zero.cableCelsius });
const leadNow = wireOhms({ ...cable, temperatureCelsius: reading.cableCelsius });
lines.push(
  `Cable: ${cable.lengthMeters} m of AWG ${cable.awg} copper, ${leadAtZero.toFixed(4)} Ω per lead at ` +
    `${zero.cableCelsius} °C, ${leadNow.toFixed(4)} Ω at ${reading.cableCelsius} °C.`,
);
const desens = leadDesensitization({ wiring: 'three-wire', gaugeOhms, ohmsPerLead: leadAtZero });
lines.push(`  three-wire desensitization Rg/(Rg + RL) at zeroing: ${desens.toFixed(6)}`);
const twoWire = leadTemperatureEffect({
  gaugeFactor: setting,
  gaugeOhms,
  wiring: 'two-wire',
  referenceOhmsPerLead: leadAtZero,
  ohmsPerLead: leadNow,
});
const threeWire = leadTemperatureEffect({
  gaugeFactor: setting,
  gaugeOhms,
  wiring: 'three-wire',
  referenceOhmsPerLead: leadAtZero,
  ohmsPerLead: leadNow,
  strain: 6e-4,
});
lines.push(`  the cable warming by 30 K would read ${us(twoWire.apparentStrain)} on two wires;`);
lines.push(
  `  on three wires it reads ${us(threeWire.apparentStrain, 2)} at 600 µε (span change ` +
    `${(threeWire.spanChange * 100).toFixed(3)} %).`,
);

// --- 2. The leg temperature from the RTD -------------------------------------------------------
const pt100 = createRtd();
const rtdNow = rtdLeadError({
  rtd: pt100,
  temperatureCelsius: reading.legCelsius,
  ohmsPerLead: leadNow,
  leadMismatchOhms: 0.01, // measured loop difference of the two current leads
  wiring: 'three-wire',
});
const tolerance = pt100.toleranceAt({ toleranceClass: 'A', temperatureCelsius: reading.legCelsius });
lines.push('');
lines.push(
  `Leg temperature: Pt100 class A reads ${rtdNow.indicatedCelsius.toFixed(3)} °C ` +
    `(lead mismatch adds ${rtdNow.errorCelsius.toFixed(3)} K; class A allows ±${tolerance.celsius.toFixed(3)} °C = ` +
    `±${tolerance.ohms.toFixed(4)} Ω).`,
);

// --- 3. The axial gauge: exact inverse, then the temperature correction ------------------------
// The logger's bridge model knows the cable as it was at zeroing.
const bridge = createStrainBridge({
  arrangement: 'quarter',
  gaugeFactor: setting,
  gaugeOhms,
  leads: { ohmsPerLead: leadAtZero, wiring: 'three-wire' },
});
const zeroRatio = 2.6e-6; // logged at zeroing, V/V
const loadedRatio = 3.114e-4; // logged full, V/V
const indicated = bridge.strainFromRatio(loadedRatio, { zeroRatio });
const corrected = correctTemperatureEffects({
  indicatedStrain: indicated,
  gaugeFactorSetting: setting,
  zeroCelsius: zero.legCelsius,
  temperatureCelsius: rtdNow.indicatedCelsius,
  thermalOutput,
  gaugeFactor: lotGaugeFactor,
  gaugeFactorTemperatureCoefficientPerKelvin: 1.0e-4,
  gaugeFactorReferenceCelsius: 24,
});
const thermal =
  thermalOutput.apparentStrainAt(rtdNow.indicatedCelsius, setting) -
  thermalOutput.apparentStrainAt(zero.legCelsius, setting);
lines.push('');
lines.push('Axial gauge (quarter bridge, three-wire):');
lines.push(`  indicated at GF ${setting.toFixed(2)} (exact two-reading inverse)  ${us(indicated, 2)}`);
lines.push(
  `  thermal output from ${zero.legCelsius} to ${rtdNow.indicatedCelsius.toFixed(1)} °C at GF ${setting.toFixed(2)}     ${us(thermal, 2)}`,
);
lines.push(`  corrected (thermal output, GF(T) of the lot)    ${us(corrected, 2)}`);

// --- 4. The rosette: transverse sensitivity -----------------------------------------------------
const legs = [5.412e-4, 1.097e-4, -1.524e-4] as const; // temperature-corrected legs a, b, c, m/m
const rosette = correctRosetteTransverse({
  layout: 'rectangular',
  strains: legs,
  transverseSensitivity: [0.012, 0.009, 0.012],
});
lines.push('');
lines.push('Rectangular rosette, Kt 1.2 / 0.9 / 1.2 %:');
for (const [i, name] of ['a (0°)', 'b (45°)', 'c (90°)'].entries()) {
  lines.push(
    `  leg ${name.padEnd(8)} read ${us(legs[i]!, 2).padStart(11)}   corrected ${us(rosette[i]!, 2).padStart(11)}`,
  );
}
lines.push('  (the corrected legs go on to a rosette reduction with the same layout)');
lines.push('');
lines.push(
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes and licensed practice.',
);

console.log(lines.join('\n'));
