/**
 * A load-cell channel end to end: spec → exact conversion of a recorded buffer → budget →
 * firmware constants.
 *
 * Scenario (invented for this example): a grain hopper on a farm co-operative's drying line hangs
 * from three 2 t S-beam load cells; this is one of them, on 12 m of six-core cable with remote
 * sense, read by a 24-bit ratiometric converter at gain 128 and 20 samples/s. The record below is
 * the hopper being filled, simulated with the channel's own forward map.
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/hopper-scale-channel.ts
 */
import { channelBudget, channelConstants, createChannel, type ChannelSpec } from '@bridgework/channel';

const spec: ChannelSpec = {
  name: 'hopper cell B',
  sensor: {
    kind: 'transducer',
    capacity: '2000 kg', // the conventional mass of the certificate's reference weights
    ratedOutputVoltsPerVolt: '2.0013 mV/V',
    ratedOutputToleranceFraction: '0.05 %',
    zeroBalanceVoltsPerVolt: 0.021e-3,
    inputOhms: 385,
    outputOhms: 350,
  },
  bridge: { wiring: 'six-wire', cable: { awg: 24, lengthMeters: 12 } },
  excitation: { volts: 5, remoteSense: true },
  amplifier: { gain: 128, inputVoltageNoiseVoltsPerRootHz: 6e-9 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true, filter: { order: 4, dataRateHertz: 20 } },
  tolerances: { gainFraction: 0.0002 },
  output: { quantity: 'mass', range: [0, 2000], firmwareResolution: 0.01 },
};
const channel = createChannel(spec);

// A filling record: 0 → 1650 kg over 600 samples, then a converter overload for 3 samples.
const codes = new Int32Array(603);
for (let i = 0; i < 600; i++) codes[i] = channel.codeFromQuantity((1650 * i) / 599);
codes.fill(2 ** 23 - 1, 600);
const { values, status } = channel.convert(codes);

const budget = channelBudget(channel, { at: 1650 });
// 'sampled' keeps the example quick; the default verifies all 4.3 million codes of the span.
const constants = channelConstants(channel, { verification: 'sampled' });
const fixedTotal = constants.totals.fixed!;
const f32Total = constants.totals.float32!;
const kg = (x: number, d = 3) => `${x.toFixed(d)} kg`;

const lines = [
  `bridgework example: ${channel.name}, one of three load cells under a grain hopper (invented scenario)`,
  '',
  `conversion: ${status.converted} samples converted, ${status.rejected} rejected (${status.railHigh} at the high rail, first at index ${status.locations[0]}); method: ${status.method}`,
  `  last good sample ${kg(values[599]!)}; sample 600 is ${String(values[600])} (never a plausible number)`,
  '',
  `budget at ${kg(budget.at, 0)}:`,
  `  one code                ${kg(budget.resolution.quantityPerCode, 5)}`,
  `  noise rms / noise-free  ${kg(budget.resolution.rms, 4)} / ${kg(budget.resolution.noiseFree, 4)}`,
  `  noise-free divisions    ${budget.resolution.noiseFreeCounts.toFixed(0)} over the span`,
  ...budget.lines
    .filter((l) => l.standardUncertainty !== undefined)
    .map((l) => `  u(${l.name})`.padEnd(26) + kg(l.standardUncertainty!, 4)),
  `  combined u = ${kg(budget.combined.standardUncertainty, 4)}, U = ${kg(budget.combined.expandedUncertainty, 4)} (k = ${budget.combined.coverageFactor.toFixed(2)}, p = 95 %)`,
  `  front end ${budget.ok ? 'within all limits' : 'VIOLATES a limit'}`,
  '',
  `firmware: codes ${constants.codeMin}…${constants.codeMax}, target total error ${kg(constants.targetError, 4)} (u/10 at the budget point, or one output step)`,
  `  fixed point (${constants.fixed!.kind}, steps of 0.01 kg): total error ≤ ${kg(fixedTotal.bound, 4)} against the exact map (${fixedTotal.proved ? 'proved' : 'measured'})`,
  `  float32 (${constants.float32!.kind}): total error ≤ ${kg(f32Total.bound, 6)} against the exact map (${f32Total.proved ? 'proved' : 'measured'})`,
  '',
  'Caution: results support, and do not replace, qualified engineering judgement; follow local codes, legal-metrology rules and licensed practice.',
];
console.log(lines.join('\n'));
