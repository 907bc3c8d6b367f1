import * as core from '@bridgework/core';
import type { BaseCall } from '../harness.js';
import { fn } from './define.js';

const f = (name: string, args: () => unknown[], extra = {}): BaseCall => fn('core', core, name, args, extra);

/** Base calls of @bridgework/core. */
export const coreCalls: readonly BaseCall[] = [
  f('celsiusFromKelvin', () => [373.15]),
  f('kelvinFromCelsius', () => [25]),
  f('microstrainFromStrain', () => [1e-3]),
  f('strainFromMicrostrain', () => [1000]),
  f('millivoltsPerVoltFromRatio', () => [2e-3]),
  f('ratioFromMillivoltsPerVolt', () => [2]),
  f('checkFinite', () => ['strain', 1e-3]),
  f('checkPositive', () => ['gaugeOhms', 350, { allowInfinity: false }]),
  f('checkNonNegative', () => ['ohmsPerLead', 0.5]),
  f('checkRange', () => ['poissonRatio', 0.3, { min: -1, max: 0.5, minExclusive: true }]),
  f('checkInteger', () => ['bits', 24, { min: 1, max: 32 }]),
  f('checkOneOf', () => ['wiring', 'three-wire', ['two-wire', 'three-wire']]),
  f('requireOption', () => ['poissonRatio', 0.3, "for 'full-poisson'"], { passThrough: true }),
  // The checks below pass their argument through: only its shape is checked, its contents are
  // the caller's data (left alone).
  f('checkLength', () => ['armsOhms', [350, 350, 350, 350], 4], { fixed: ['1.*'] }),
  f('checkObject', () => ['options', { a: 1 }], { maps: ['1'], fixed: ['1.*'] }),
  f(
    'checkOptions',
    () => [
      'options',
      { whiteDensity: 1e-8 },
      { known: ['whiteDensity', 'cornerHertz'], required: ['whiteDensity'] },
    ],
    {
      // The second argument is the object under test: any key is data here.
      maps: ['1'],
      fixed: ['1.*'],
    },
  ),
  f('checkInterval', () => ['span', { min: -1, max: 1 }, { strict: true }]),
  f('describeRange', () => [{ min: -200, max: 850, minExclusive: false, maxExclusive: true }]),
  f('formatValue', () => [-5]),
  f('closestName', () => ['whiteDensty', ['whiteDensity', 'cornerHertz']]),
  f('editDistance', () => ['kitten', 'sitting']),
  f('isBridgeworkError', () => [new core.BridgeworkError('not-finite', 'x'), 'not-finite']),
  f('differenceOfProducts', () => [350.7, 350, 350, 350.7]),
  f('twoProduct', () => [0.1, 0.3]),
  f('exactDecimalString', () => [0.1]),
  f('checkOhms', () => ['gaugeOhms', 350, { allowZero: false, allowInfinity: false }]),
  f('checkVolts', () => ['commonModeVolts', -2.5, { signed: true }]),
  f('checkStrain', () => ['strain', 1e-3]),
  f('checkGaugeFactor', () => ['gaugeFactor', 2.1]),
  f('checkCelsius', () => ['temperatureCelsius', 25]),
  f('checkFiniteResult', () => [1.2, { what: 'the wire resistance', param: 'lengthMeters', value: 10 }]),
  // blameOption returns what its computation returns (a computation returning NaN gives NaN).
  f('blameOption', () => [{ param: 'ohmsPerLead', value: 1, requirement: 'must be small' }, () => 42], {
    nonFinite: [''],
  }),
  f('rosetteLegAngles', () => [{ anglesRadians: [0, 1, 2] }]),
  f('rosetteLegAngles', () => ['rectangular'], { variant: 'named' }),
];

/** Exports of @bridgework/core that are not fuzzed as calls, and why. */
export const coreNotCalled: Readonly<Record<string, string>> = {
  BridgeworkError: 'the error class itself: constructed by the library, never a computation',
};
