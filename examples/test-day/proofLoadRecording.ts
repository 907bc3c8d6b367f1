/**
 * The proof-load recording of the slipway test day (invented): the rope pulled from 0 to 50 kN
 * and back in 2.5 kN steps, one row per step, with the converter codes the two channels give.
 *
 * The codes come from what the instruments really do in this scenario, which the channel file
 * does not know before the test day: the load cell's true curve (2.0016 mV/V at 50 kN, a slight
 * bow and a little hysteresis) and a tie channel whose span is 0.9962 of its model (what the shunt
 * calibration finds). `bridgework convert`, with the sections the test day writes, turns the codes
 * back into the loads and strains below.
 */
import { createChannel, type ChannelSpec } from '@bridgework/channel';

/** The tie's strain per kN of rope force in this scenario, µε/kN. */
export const TIE_MICROSTRAIN_PER_KN = 12;

/** The tie channel as built: its real span is 0.9962 of the model's. */
const tieAsBuilt: ChannelSpec = {
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.08, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', cable: { awg: 24, lengthMeters: 25 } },
  excitation: { volts: 2.5 },
  amplifier: { gain: 128 * 0.9962 },
  adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
  output: { quantity: 'strain', unit: 'µε', range: [-1500, 1500] },
};

/** The load cell's true bridge ratio at a force in kN, loading or unloading (V/V). */
export function ropeRatio(kilonewtons: number, unloading: boolean): number {
  const x = kilonewtons / 50;
  return 4.1e-6 + 2.0016e-3 * x - 1.6e-6 * x * (1 - x) + (unloading ? 1.2e-6 * x * (1 - x) : 0);
}

/** The rows: time in s, the applied force in kN, and the two channels' codes. */
export function proofLoadRows(): { time: number; force: number; rope: number; tie: number }[] {
  const tie = createChannel(tieAsBuilt);
  const rows: { time: number; force: number; rope: number; tie: number }[] = [];
  for (let i = 0; i <= 40; i++) {
    const force = 2.5 * (i <= 20 ? i : 40 - i);
    rows.push({
      time: 10 * i,
      force,
      // Ratiometric 24-bit converter at gain 64: code = ratio · 64 · 2^23.
      rope: Math.round(ropeRatio(force, i > 20) * 64 * 2 ** 23),
      tie: Math.round(tie.exactCodeFromQuantity(TIE_MICROSTRAIN_PER_KN * force)),
    });
  }
  return rows;
}

/** The recording as CSV text (the file proof-load-recording.csv beside this one). */
export function proofLoadRecording(): string {
  return `time_s,rope,tie\n${proofLoadRows()
    .map((r) => `${r.time},${r.rope},${r.tie}`)
    .join('\n')}\n`;
}
