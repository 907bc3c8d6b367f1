import * as compensation from '@bridgework/compensation';
import type { BaseCall } from '../harness.js';
import { fn, method } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall =>
  fn('compensation', compensation, name, args, extra);
const m = (creator: string, make: () => unknown, name: string, args: () => unknown[], extra = {}): BaseCall =>
  method('compensation', creator, make, name, args, extra);

const lotOptions = () => ({
  coefficientsMicrostrain: [-30.5, 2.61, -5.7e-2, 2.9e-4, -4.1e-7],
  gaugeFactor: 2,
  rangeCelsius: [-30, 200],
});
const lot = () => compensation.createThermalOutput(lotOptions() as never);
const pt100 = () => compensation.createRtd();
const beta = () => compensation.createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977 });
const steinhart = () =>
  compensation.createSteinhartHartThermistor({
    a: 1.129241e-3,
    b: 2.341077e-4,
    c: 8.775468e-8,
    rangeCelsius: [-40, 125],
  });
const temperatureBase = {
  gaugeFactorSetting: 2,
  zeroCelsius: 20,
  temperatureCelsius: 80,
  gaugeFactor: 2.08,
  gaugeFactorTemperatureCoefficientPerKelvin: 1e-4,
  gaugeFactorReferenceCelsius: 24,
};

/** Base calls of @bridgework/compensation. */
export const compensationCalls: readonly BaseCall[] = [
  f('awgDiameterMeters', () => [26]),
  f('wireOhms', () => [
    { awg: 26, lengthMeters: 10, temperatureCelsius: 45, material: 'copper', conductors: 2 },
  ]),
  f(
    'wireOhms',
    () => [
      {
        diameterMeters: 0.5e-3,
        lengthMeters: 1,
        resistivityOhmMeters: 2.8e-8,
        temperatureCoefficientPerKelvin: 0.004,
      },
    ],
    {
      variant: 'own material',
    },
  ),
  f('leadDesensitization', () => [
    { wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead: 1.339, completionOhms: 350 },
  ]),
  f('leadDesensitization', () => [{ wiring: 'four-wire', inputOhms: 700, ohmsPerLead: 2 }], {
    variant: 'four-wire',
  }),
  f('leadZeroOffset', () => [
    { gaugeFactor: 2, gaugeOhms: 350, completionOhms: 350, ohmsPerLead: 1, wiring: 'two-wire' },
  ]),
  f('leadTemperatureEffect', () => [
    {
      gaugeFactor: 2,
      gaugeOhms: 350,
      wiring: 'two-wire',
      referenceOhmsPerLead: 1.339,
      ohmsPerLead: 1.418,
      strain: 1e-3,
    },
  ]),
  f('leadSpanDrift', () => [
    { wiring: 'four-wire', inputOhms: 350, referenceOhmsPerLead: 2, ohmsPerLead: 2.2 },
  ]),
  f('rescaleGaugeFactor', () => [{ strain: 1.2e-3, fromGaugeFactor: 2, toGaugeFactor: 2.11 }]),
  f('gaugeFactorAt', () => [
    {
      gaugeFactor: 2.05,
      temperatureCoefficientPerKelvin: 1.1e-4,
      referenceCelsius: 24,
      temperatureCelsius: 124,
    },
  ]),
  f('createThermalOutput', () => [lotOptions()]),
  f('correctTemperatureEffects', () => [
    { ...temperatureBase, indicatedStrain: 512e-6, thermalOutput: lot() },
  ]),
  f('indicatedStrainWithTemperatureEffects', () => [
    { ...temperatureBase, strain: 500e-6, thermalOutput: lot() },
  ]),
  f('indicatedTransverseStrain', () => [
    { axialStrain: 1e-3, transverseStrain: -3e-4, transverseSensitivity: 0.02, poissonRatio0: 0.285 },
  ]),
  f('correctTransverseGauge', () => [
    {
      strain: 9.996982801971236e-4,
      transverseStrain: -3e-4,
      transverseSensitivity: 0.02,
      poissonRatio0: 0.285,
    },
  ]),
  f('correctTransversePair', () => [
    {
      strains: [9.996982801971236e-4, -2.8160514935130243e-4],
      transverseSensitivity: [0.02, 0.03],
      poissonRatio0: 0.285,
    },
  ]),
  f('correctRosetteTransverse', () => [
    {
      layout: 'rectangular',
      strains: [9.996982801971236e-4, 3.5e-4, -2.8160514935130243e-4],
      transverseSensitivity: [0.02, 0.01, 0.03],
      poissonRatio0: 0.285,
    },
  ]),
  f(
    'correctRosetteTransverse',
    () => [
      { layout: { anglesRadians: [0, 1, 2] }, strains: [1e-3, 3.5e-4, -3e-4], transverseSensitivity: 0.02 },
    ],
    { variant: 'angles' },
  ),
  f('createRtd', () => [{ r0Ohms: 100, a: 3.9083e-3, b: -5.775e-7, c: -4.183e-12 }]),
  f('rtdToleranceCelsius', () => [{ toleranceClass: 'A', temperatureCelsius: 100, element: 'film' }]),
  f('rtdLeadError', () => [
    {
      rtd: pt100(),
      temperatureCelsius: 60,
      ohmsPerLead: 2.105,
      wiring: 'three-wire',
      leadMismatchOhms: 0.02,
    },
  ]),
  f(
    'rtdLeadError',
    () => [
      {
        rtd: pt100(),
        temperatureCelsius: 60,
        ohmsPerLead: 2.105,
        wiring: 'two-wire',
        readout: 'quarter-bridge',
        completionOhms: 100,
      },
    ],
    { variant: 'quarter-bridge' },
  ),
  f('createBetaThermistor', () => [
    { referenceOhms: 10e3, referenceCelsius: 25, betaKelvin: 3977, rangeCelsius: [-40, 125] },
  ]),
  f('createSteinhartHartThermistor', () => [
    { a: 1.129241e-3, b: 2.341077e-4, c: 8.775468e-8, rangeCelsius: [-40, 125] },
  ]),
  f('fitSteinhartHart', () => [
    {
      points: [
        { ohms: 32650, temperatureCelsius: 0 },
        { ohms: 10000, temperatureCelsius: 25 },
        { ohms: 1752, temperatureCelsius: 70 },
      ],
    },
  ]),
  f('fitThermistor', () => [
    {
      model: 'steinhart-hart',
      points: [
        { ohms: 32650, temperatureCelsius: 0 },
        { ohms: 10000, temperatureCelsius: 25 },
        { ohms: 4917, temperatureCelsius: 45 },
        { ohms: 1752, temperatureCelsius: 70 },
      ],
    },
  ]),
  f('fitBeta', () => [
    {
      points: [
        { ohms: 10000, temperatureCelsius: 25 },
        { ohms: 1070.3, temperatureCelsius: 85 },
      ],
    },
  ]),
  m('createThermalOutput', lot, 'apparentStrainAt', () => [100, 2.1]),
  m('createThermalOutput', lot, 'slopeAt', () => [100, 2.1]),
  m('createRtd', pt100, 'ohmsAt', () => [100]),
  m('createRtd', pt100, 'temperatureAt', () => [60.25584]),
  m('createRtd', pt100, 'slopeAt', () => [100]),
  m('createRtd', pt100, 'toleranceAt', () => [
    { toleranceClass: 'A', temperatureCelsius: 100, element: 'wire-wound' },
  ]),
  m('createBetaThermistor', beta, 'ohmsAt', () => [0]),
  m('createBetaThermistor', beta, 'temperatureAt', () => [10e3]),
  m('createBetaThermistor', beta, 'slopeAt', () => [25]),
  m('createSteinhartHartThermistor', steinhart, 'ohmsAt', () => [25]),
  m('createSteinhartHartThermistor', steinhart, 'temperatureAt', () => [10e3]),
  m('createSteinhartHartThermistor', steinhart, 'slopeAt', () => [25]),
];

/** Exports of @bridgework/compensation that are not functions. */
export const compensationNotCalled: Readonly<Record<string, string>> = {};
