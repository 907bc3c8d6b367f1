/**
 * Channel Monte Carlo at engine speed (issue 13 item 5): a channel budget's Monte Carlo (the
 * footbridge gusset channel of the demo: quarter bridge, three-wire cable, zero reading, thermal
 * output, gauge-factor temperature coefficient, five uncertain inputs besides the reading) against
 * the raw uncertainty engine on its 12-input arithmetic model (positional form), 10⁶ trials each,
 * GUM comparison and coverage intervals included in both. Target: the channel at ≥ 25 % of the
 * engine's throughput; 10⁶ trials well under a second. Ratios per round, medians.
 */
import { availableParallelism, loadavg } from 'node:os';
import { channelBudget, createChannel, type ChannelSpec } from '@bridgework/channel';
import { monteCarlo, type InputQuantities } from '@bridgework/uncertainty';
import { twelveInputPositional, twelveInputs } from '../../packages/uncertainty/test/support/benchModel.js';
import { compare, report } from './harness.js';

const short = process.argv.includes('--short');
const trials = short ? 100_000 : 1_000_000;

const gusset = {
  name: 'gusset-g2',
  sensor: {
    kind: 'strain-gauge',
    gaugeFactor: 2.11,
    gaugeOhms: 350,
    gaugeFactorToleranceFraction: 0.01,
    gaugeFactorTemperatureCoefficientPerKelvin: 1e-4,
    thermalOutput: {
      coefficientsMicrostrain: [-32.5, 2.75, -0.063, 0.000345],
      gaugeFactor: 2,
      rangeCelsius: [-30, 120],
    },
  },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', cable: { awg: 26, lengthMeters: 22 } },
  excitation: { volts: 2.5 },
  amplifier: { gain: 64, inputVoltageNoiseVoltsPerRootHz: 8e-9 },
  adc: { bits: 24, referenceVolts: 2.5, ratiometric: true, filter: { order: 4, dataRateHertz: 20 } },
  zero: { code: -18433 },
  environment: { temperatureCelsius: 15, rangeCelsius: [5, 25] },
  tolerances: { completionOhmsFraction: 0.0001, temperatureKelvin: 2, gainFraction: 0.0002 },
  output: { quantity: 'strain', unit: 'µε', range: [-300, 1200] },
} as const satisfies ChannelSpec;
const channel = createChannel(gusset);

let seed = 1;
const engine = (): number => {
  const r = monteCarlo({
    model: twelveInputPositional,
    inputs: twelveInputs as InputQuantities,
    trials,
    seed: seed++,
  });
  return r.value + r.interval.min;
};
const viaChannel = (): number => {
  const b = channelBudget(channel, { monteCarlo: { trials, seed: seed++ } });
  return (b.monteCarlo?.value ?? Number.NaN) + (b.monteCarlo?.interval.min ?? 0);
};

console.log(
  `machine: ${availableParallelism()} cores, load average ${loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);
const model = channelBudget(channel).model;
const results = compare(
  [
    { name: 'uncertainty engine, 12-input arithmetic model (positional)', opsPerCall: trials, run: engine },
    {
      name: `channelBudget Monte Carlo, gusset channel (${model} model)`,
      opsPerCall: trials,
      run: viaChannel,
    },
  ],
  short
    ? { rounds: 3, minMillisPerRound: 50, warmupCalls: 1 }
    : { rounds: 7, minMillisPerRound: 100, warmupCalls: 2 },
);
report(`channel Monte Carlo, ${trials.toExponential(0)} trials, per trial`, results);
const [raw, ours] = results as [(typeof results)[0], (typeof results)[0]];
console.log(
  `  engine: ${(1e3 / raw.nsPerOp).toFixed(2)} million trials/s; channel: ${(1e3 / ours.nsPerOp).toFixed(2)} million trials/s`,
);
console.log(`  channel / engine throughput: ${(100 / ours.ratioToBaseline).toFixed(0)} % (target ≥ 25 %)`);
console.log(`  10⁶ trials of the gusset channel: ${((ours.nsPerOp * 1e6) / 1e9).toFixed(2)} s`);
