import * as channel from '@bridgework/channel';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('channel', channel, name, args, extra);

// The channel README's quarter-bridge strain channel (units written as text, as a channel file has them).
const strainSpec = () => ({
  name: 'web stiffener',
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: '350 Ω', gaugeFactorToleranceFraction: '1 %' },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: '1.2 Ω' },
  excitation: { volts: '5 V' },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: '5 V', ratiometric: true },
  output: { quantity: 'strain', unit: 'µε', range: [-2000, 2000] },
});
// A load cell on a four-wire cable, numbers in SI (an invented hopper).
const loadCellSpec = () => ({
  name: 'hopper cell',
  sensor: {
    kind: 'transducer',
    capacity: 5000,
    ratedOutputVoltsPerVolt: 2e-3,
    zeroBalanceVoltsPerVolt: 1.5e-5,
    inputOhms: 400,
    outputOhms: 350,
  },
  bridge: { wiring: 'four-wire', ohmsPerLead: 2.2 },
  excitation: { volts: 10 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 10, ratiometric: true },
  output: { quantity: 'force' },
});
// A Pt1000 on two wires (a resistance-curve map).
const rtdSpec = () => ({
  sensor: { kind: 'rtd', r0Ohms: 1000 },
  bridge: { wiring: 'two-wire', ohmsPerLead: 0.3 },
  excitation: { volts: 2.5 },
  amplifier: { gain: 4 },
  adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
  output: { quantity: 'temperature' },
});

const strain = () => channel.createChannel(strainSpec() as never);
const loadCell = () => channel.createChannel(loadCellSpec() as never);
const rtd = () => channel.createChannel(rtdSpec() as never);
// The same channel on a 16-bit converter: its firmware constants are verified over every code in milliseconds.
const strain16 = () =>
  channel.createChannel({
    ...strainSpec(),
    adc: { bits: 16, referenceVolts: '5 V', ratiometric: true },
  } as never);
const interleaved = () => channel.createInterleavedConverter([strain(), loadCell()]);
// Codes across the span, one at each rail (a rail code is a counted rejection, not an error).
const codes = () => Int32Array.of(0, 150_000, 563_000, -8_388_608, 8_388_607);

const m = (
  creator: string,
  make: () => unknown,
  variant: string | undefined,
  name: string,
  args: () => unknown[],
  extra = {},
): BaseCall =>
  method('channel', creator, make, name, args, variant === undefined ? extra : { variant, ...extra });

// A converted buffer holds NaN where a code was refused (documented, counted in the status).
const converted = { nonFinite: ['values.*'] };
// A channel's budget states the design checks' limits; an unlimited check has `limit` +∞.
const budgetExtra = { nonFinite: ['**.limit', '**.degreesOfFreedom', '**.effectiveDegreesOfFreedom'] };

/** The channel methods, each called on the strain channel (and the map-specific ones on the others). */
const channelMethods = (make: () => unknown, variant: string, at: number): BaseCall[] => [
  m('createChannel', make, variant, 'quantityFromCode', () => [150_000]),
  m('createChannel', make, variant, 'codeFromQuantity', () => [at]),
  m('createChannel', make, variant, 'exactCodeFromQuantity', () => [at]),
  m('createChannel', make, variant, 'inputAt', () => [at]),
  m('createChannel', make, variant, 'curve', () => [33]),
  m('createChannel', make, variant, 'operatingPoints', () => []),
  m(
    'createChannel',
    make,
    variant,
    'convert',
    () => [codes(), new Float64Array(5), { maxLocations: 4 }],
    converted,
  ),
  m('createChannel', make, variant, 'transformer', () => [{ onInvalid: 'nan' }]),
];

/** Base calls of @bridgework/channel. */
export const channelCalls: readonly BaseCall[] = [
  f('createChannel', () => [strainSpec()], { variant: 'strain', spec: true }),
  f('createChannel', () => [loadCellSpec()], { variant: 'load cell', spec: true }),
  f('createChannel', () => [rtdSpec()], { variant: 'rtd', spec: true }),
  f('validateChannelSpec', () => [strainSpec(), { path: 'channels.0' }], { spec: true }),
  f('channelSpecFields', () => []),
  f('channelSpecJsonSchema', () => []),
  f('defaultOutputUnit', () => ['pressure']),
  f('parseQuantity', () => ['350 Ω', 'Ω']),
  f('formatQuantity', () => [1.2345e-3, 'V', 3]),
  f('channelBudget', () => [strain(), { at: 1000, coverageProbability: 0.95, peakToPeakFactor: 6.6 }], {
    variant: 'strain',
    ...budgetExtra,
  }),
  f(
    'channelBudget',
    () => [loadCell(), { monteCarlo: { trials: 2000, seed: 7 }, limits: { uncertaintyShareWarning: 0.05 } }],
    { variant: 'load cell, Monte Carlo', ...budgetExtra },
  ),
  f('channelConstants', () => [strain16(), { outputResolution: 1e-2, verification: 'exhaustive' }]),
  f('createInterleavedConverter', () => [[strain(), loadCell()]]),
  ...channelMethods(strain, 'strain', 1000),
  ...channelMethods(rtd, 'rtd', 100).filter((c) => !c.name.endsWith('.operatingPoints')),
  m(
    'createInterleavedConverter',
    interleaved,
    undefined,
    'convert',
    () => [
      Int32Array.of(0, 0, 150_000, 150_000, 8_388_607, -8_388_608),
      new Float64Array(6),
      { temperaturesCelsius: [20, undefined], maxLocations: 4 },
    ],
    converted,
  ),
  m('createInterleavedConverter', interleaved, undefined, 'transformer', () => [{ onInvalid: 'nan' }]),
];

/** Exports of @bridgework/channel that are not fuzzed as calls. */
export const channelNotCalled: Readonly<Record<string, string>> = {
  createWasmConverter:
    'asynchronous (loads a WebAssembly module); its inputs and results are checked in packages/channel/test/wasmKernel.test.ts',
};
