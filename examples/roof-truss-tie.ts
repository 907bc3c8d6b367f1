/**
 * Roof-truss tie: size a strain channel from the bridge to the counts before building it.
 *
 * Scenario (invented for this example): the steel tie rods of a sports-hall roof truss are gauged
 * to watch the snow load through a winter. Each tie carries a full-Poisson bridge (axial gauges on
 * opposite faces, transverse gauges beside them), wired back to a logger 25 m away on a four-core
 * cable. The logger has a ratiometric 24-bit sigma-delta converter with a PGA (gains 1 to 128) and
 * a sinc3 filter at 10 samples per second, which nulls 50 Hz and 60 Hz mains.
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/roof-truss-tie.ts
 */
import { createStrainBridge } from '@bridgework/bridge';
import {
  inputNoiseDensity,
  mainsRejection,
  noiseBandwidth,
  selectGain,
  type AmplifierNoiseOptions,
  type BudgetAmplifierOptions,
  type SincFilter,
} from '@bridgework/chain';
import { microstrainFromStrain, strainFromMicrostrain } from '@bridgework/core';

// --- The measurement ---------------------------------------------------------------------------
const bridge = createStrainBridge({
  arrangement: 'full-poisson',
  gaugeFactor: 2.11,
  gaugeOhms: 350,
  poissonRatio: 0.3,
  leads: { ohmsPerLead: 0.55, wiring: 'four-wire' }, // 25 m of 0.34 mm² copper per conductor
});
// Snow load takes the tie to about +800 µε; allow for overload and for reading below the
// installation zero: −300 … +1200 µε.
const strainRange = { min: strainFromMicrostrain(-300), max: strainFromMicrostrain(1200) };
const excitationVolts = 5;

// --- The logger front end (a PGA with RFI filter resistors, from its data sheet) ---------------
const amplifierNoise: AmplifierNoiseOptions = {
  inputVoltageNoiseVoltsPerRootHz: 15e-9,
  voltageCornerHertz: 10,
  currentNoiseAmpsPerRootHz: 0.2e-12,
};
const amplifier: BudgetAmplifierOptions = {
  ...amplifierNoise,
  inputSeriesOhms: [499, 499],
  limits: {
    inputCommonModeVolts: { min: 0.1, max: 3.9 },
    firstStageVolts: { min: 0.2, max: 4.8 },
  },
};
const filter: SincFilter = { kind: 'sinc', order: 3, dataRateHertz: 10 };
const lowHertz = 1 / 1000; // readings compared over about a quarter of an hour

const lines: string[] = [];
const fmt = (x: number, digits: number): string => x.toFixed(digits);
lines.push('bridgework example: sizing a strain channel on a roof-truss tie (invented scenario)');
lines.push('');
lines.push(
  `Bridge: full-poisson, GF 2.11, 350 Ω, four-wire leads 0.55 Ω; slope ${fmt(bridge.sensitivity, 6)} V/V per m/m ` +
    `(${fmt(bridge.sensitivity * excitationVolts, 4)} µV per µε at ${excitationVolts} V)`,
);

// 1. Noise density at the amplifier input (white floors).
const density = inputNoiseDensity({
  armsOhms: bridge.armsOhms(0),
  sourceOhms: bridge.seriesOhms,
  inputSeriesOhms: [499, 499],
  amplifier: amplifierNoise,
});
lines.push(`Input noise density ${fmt(density.totalVoltsPerRootHz * 1e9, 3)} nV/√Hz (white floors):`);
for (const t of density.terms) {
  lines.push(
    `  ${t.name.padEnd(18)} ${fmt(t.value * 1e9, 3).padStart(8)} nV/√Hz  ${fmt(100 * t.fractionOfPower, 1).padStart(5)} %`,
  );
}

// 2. Bandwidth and mains rejection of the filter.
const enbw = noiseBandwidth(filter);
const mains50 = mainsRejection({ filter, mainsHertz: 50 });
const mains60 = mainsRejection({ filter, mainsHertz: 60 });
lines.push(
  `sinc3 at 10 SPS: noise bandwidth ${fmt(enbw, 3)} Hz; mains rejection ±1 Hz at least ` +
    `${fmt(mains50.worstDecibels, 1)} dB (50 Hz), ${fmt(mains60.worstDecibels, 1)} dB (60 Hz)`,
);

// 3. Choose the PGA gain and get the budget.
const selection = selectGain({
  span: { bridge, strainRange },
  excitationVolts,
  gains: [1, 2, 4, 8, 16, 32, 64, 128],
  amplifier,
  adc: { bits: 24, ratiometric: true },
  filter,
  lowHertz,
  selfHeating: { gridAreaSquareMeters: 6e-3 * 3e-3, heatSink: 'good' },
});
const b = selection.value.budget;
lines.push('');
lines.push(
  `Gain chosen: ${selection.value.gain} (${selection.ok ? 'no limit violated' : 'LIMITS VIOLATED'})`,
);
for (const c of selection.value.candidates) {
  lines.push(
    `  gain ${String(c.gain).padStart(3)}: ${c.fitsHeadroom ? 'fits   ' : 'clips  '} rms ${fmt(microstrainFromStrain(c.rmsResolution), 4)} µε` +
      (c.issues.length > 0 ? `  (${c.issues.map((i) => i.limit).join(', ')})` : ''),
  );
}
lines.push('');
lines.push(`Budget at gain ${b.gain}:`);
lines.push(`  counts per µε            ${fmt(b.countsPerMicrostrain!, 3)}`);
lines.push(
  `  span codes               ${b.points[0]!.adcCode.code} … ${b.points[b.points.length - 1]!.adcCode.code}`,
);
lines.push(`  noise (input-referred, rms over the filter):`);
for (const t of b.noise.terms) {
  lines.push(
    `    ${t.name.padEnd(18)} ${fmt(t.rmsVolts * 1e9, 2).padStart(8)} nV  ${fmt(100 * t.fractionOfPower, 1).padStart(5)} %`,
  );
}
lines.push(
  `  total                    ${fmt(b.noise.totalRmsVolts * 1e9, 2)} nV rms, ${fmt(b.noise.totalPeakToPeakVolts * 1e9, 1)} nV p-p`,
);
lines.push(
  `  resolution               ${fmt(b.resolution.rmsMicrostrain!, 4)} µε rms, ${fmt(b.resolution.noiseFreeMicrostrain!, 4)} µε noise-free`,
);
lines.push(
  `  noise-free counts        ${fmt(b.resolution.noiseFreeCounts, 0)} over the span (${fmt(b.resolution.noiseFreeBitsOverSpan, 2)} bits)`,
);
const worst = [...b.headroom.margins].sort((x, y) => x.marginVolts - y.marginVolts)[0]!;
lines.push(`  tightest headroom        ${worst.limit}, ${fmt(worst.marginVolts, 3)} V`);
lines.push(
  `  gauge power              ${fmt(b.gaugeWatts * 1e3, 2)} mW of ${fmt(b.selfHeating!.limitWatts * 1e3, 1)} mW allowed ` +
    `(excitation could rise to ${fmt(b.selfHeating!.maxExcitationVolts, 2)} V)`,
);

// 4. What if the PGA were chopper-stabilised (no 1/f corner)?
const chopped = selectGain({
  span: { bridge, strainRange },
  excitationVolts,
  gains: [1, 2, 4, 8, 16, 32, 64, 128],
  amplifier: { ...amplifier, voltageCornerHertz: 0 },
  adc: { bits: 24, ratiometric: true },
  filter,
});
lines.push('');
lines.push(
  `With a chopper-stabilised PGA: gain ${chopped.value.gain}, ` +
    `${fmt(chopped.value.budget.resolution.rmsMicrostrain!, 4)} µε rms, ` +
    `${fmt(chopped.value.budget.resolution.noiseFreeCounts, 0)} noise-free counts over the span`,
);
lines.push('');
lines.push(
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.',
);
console.log(lines.join('\n'));
