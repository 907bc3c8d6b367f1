import { createStrainBridge } from '@bridgework/bridge';
import * as chain from '@bridgework/chain';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('chain', chain, name, args, extra);
const m = (make: () => unknown, variant: string, name: string, args: () => unknown[], extra = {}): BaseCall =>
  method('chain', 'createAdc', make, name, args, { variant, ...extra });

const sinc = () => ({ kind: 'sinc', order: 3, dataRateHertz: 10, decimation: 64 });
const quarter = () => createStrainBridge({ arrangement: 'quarter', gaugeFactor: 2 });
const amplifier = () => ({
  inputVoltageNoiseVoltsPerRootHz: 10e-9,
  voltageCornerHertz: 1,
  currentNoiseAmpsPerRootHz: 1e-12,
  currentCornerHertz: 10,
  outputVoltageNoiseVoltsPerRootHz: 100e-9,
  secondStageGain: 1,
  outputReferenceVolts: 2.5,
  inputSeriesOhms: [100, 100],
  limits: {
    inputCommonModeVolts: { min: 0.2, max: 4.8 },
    inputDifferentialVolts: 0.5,
    firstStageVolts: { min: 0.1, max: 4.9 },
    outputVolts: { min: 0.05, max: 4.95 },
  },
});
const budget = () => ({
  span: { bridge: quarter(), strainRange: { min: -2e-3, max: 2e-3 } },
  excitationVolts: 5,
  excitationLowVolts: 0,
  temperatureCelsius: 25,
  amplifier: amplifier(),
  adc: { bits: 24, referenceVolts: 5, bipolar: true, ratiometric: true, noiseRmsVolts: 50e-9 },
  filter: sinc(),
  lowHertz: 0.01,
  peakToPeakFactor: 6.6,
  selfHeating: { maxWattsPerGauge: 0.05, gridAreaSquareMeters: 1e-5, powerDensityWattsPerSquareMeter: 3100 },
});
const adc = () =>
  chain.createAdc({ bits: 24, referenceVolts: 2.5, gain: 64, bipolar: true, ratiometric: true });

/** Base calls of @bridgework/chain. */
export const chainCalls: readonly BaseCall[] = [
  f('averagingGain', () => [{ samples: 16, filter: sinc() }]),
  f('noiseDensityAt', () => [{ whiteDensity: 10e-9, cornerHertz: 100, frequencyHertz: 1 }]),
  f('bandNoiseRms', () => [
    {
      whiteDensity: 10e-9,
      cornerHertz: 1,
      filter: { kind: 'butterworth', cutoffHertz: 100, order: 4 },
      lowHertz: 0.01,
    },
  ]),
  f(
    'bandNoiseRms',
    () => [
      {
        whiteDensity: 10e-9,
        cornerHertz: 1,
        filter: { kind: 'two-real-poles', poleHertz: [10, 100] },
        lowHertz: 0.01,
      },
    ],
    {
      variant: 'two real poles',
    },
  ),
  f('bandNoiseRms', () => [{ whiteDensity: 10e-9, cornerHertz: 1, filter: sinc(), lowHertz: 0.01 }], {
    variant: 'sinc',
  }),
  f('quantizationNoiseRms', () => [1e-6]),
  f('bridgeNoiseSource', () => [
    { armsOhms: [350, 350, 350, 350], sourceOhms: 1, inputSeriesOhms: [100, 100], temperatureCelsius: 25 },
  ]),
  f('bridgeOperatingPoints', () => [
    {
      span: { bridge: quarter(), strainRange: { min: -1e-3, max: 1e-3 } },
      excitationVolts: 5,
      excitationLowVolts: 0,
    },
  ]),
  f(
    'bridgeOperatingPoints',
    () => [
      {
        span: { armsOhms: [350, 350, 350, 350], ratioRange: { min: -2e-3, max: 2e-3 } },
        excitationVolts: 10,
      },
    ],
    {
      variant: 'ratio span',
    },
  ),
  f('checkHeadroom', () => [
    {
      points: [
        { differentialVolts: 0.02, commonModeVolts: 2.5 },
        { differentialVolts: -0.02, commonModeVolts: 2.5 },
      ],
      gain: 200,
      secondStageGain: 1,
      outputReferenceVolts: 0.5,
      limits: amplifier().limits,
      adc: chain.createAdc({ bits: 24, referenceVolts: 2.5, gain: 200 }),
    },
  ]),
  f('combineNoise', () => [
    [
      { name: 'a', value: 3 },
      { name: 'b', value: 4 },
    ],
  ]),
  f('createAdc', () => [{ bits: 24, referenceVolts: 2.5, gain: 64, bipolar: true, ratiometric: true }]),
  f('effectiveBits', () => [{ noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5 }]),
  f('effectiveResolutionBits', () => [{ noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5 }]),
  f('noiseFreeBits', () => [{ noiseRmsVolts: 1e-6, fullScaleRangeVolts: 5, peakToPeakFactor: 6.6 }]),
  f('enobFromSinad', () => [74]),
  f('idealSnrDecibels', () => [24]),
  f('noiseBandwidth', () => [sinc()]),
  f('noiseBandwidth', () => [{ kind: 'single-pole', cutoffHertz: 10 }], { variant: 'single pole' }),
  f('noiseBandwidth', () => [{ kind: 'brick-wall', cutoffHertz: 10 }], { variant: 'brick wall' }),
  f('filterGain', () => [sinc(), 7]),
  f('filterGain', () => [{ kind: 'butterworth', cutoffHertz: 10, order: 2 }, 7], { variant: 'butterworth' }),
  // rejectionDecibels is Infinity at an exact null of the response (documented).
  f('rejectionDecibels', () => [sinc(), 49], { nonFinite: [''] }),
  // Infinity dB at an exact null is the documented answer (nominal; worst when the band is a point).
  f('mainsRejection', () => [{ filter: sinc(), mainsHertz: 50, deviationHertz: 1 }], {
    nonFinite: ['nominalDecibels', 'worstDecibels'],
  }),
  f('inputNoiseDensity', () => [
    {
      armsOhms: [350, 350, 350, 350],
      sourceOhms: 1,
      inputSeriesOhms: [100, 100],
      temperatureCelsius: 25,
      amplifier: {
        inputVoltageNoiseVoltsPerRootHz: 10e-9,
        voltageCornerHertz: 1,
        currentNoiseAmpsPerRootHz: 1e-12,
        currentCornerHertz: 10,
        outputVoltageNoiseVoltsPerRootHz: 100e-9,
      },
      gain: 100,
      frequencyHertz: 1,
    },
  ]),
  f('johnsonNoiseDensity', () => [{ ohms: 350, temperatureCelsius: 25 }]),
  f('resolutionBudget', () => [{ ...budget(), gain: 64 }]),
  f('selectGain', () => [{ ...budget(), gains: [1, 2, 4, 8, 16, 32, 64, 128] }]),
  f('selectGain', () => [{ ...budget(), gains: { min: 1, max: 1000 } }], { variant: 'range' }),
  f('selfHeatingLimit', () => [{ maxWattsPerGauge: 0.05, gridAreaSquareMeters: 1e-5, heatSink: 'good' }]),
  f('checkSelfHeating', () => [
    {
      armsOhms: [350, 350, 350, 350],
      excitationVolts: 10,
      sourceOhms: 1,
      gaugeArms: [true, false, true, false],
      limit: { maxWattsPerGauge: 0.05 },
    },
  ]),
  m(adc, 'ratiometric', 'codeFromVolts', () => [1e-3]),
  m(adc, 'ratiometric', 'voltsFromCode', () => [12345]),
  m(adc, 'ratiometric', 'isRail', () => [12345]),
  m(adc, 'ratiometric', 'effectiveBits', () => [1e-7]),
  m(adc, 'ratiometric', 'noiseFreeBits', () => [1e-7, 6.6]),
  m(adc, 'ratiometric', 'codeFromRatio', () => [1e-3]),
  m(adc, 'ratiometric', 'ratioFromCode', () => [12345]),
];

/** Exports of @bridgework/chain that are not functions. */
export const chainNotCalled: Readonly<Record<string, string>> = {};
