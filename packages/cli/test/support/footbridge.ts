/**
 * The example channel file of the demo, packages/cli/demo/footbridge-monitoring.yaml, and its three
 * channels restated here by hand as channel specs in plain SI numbers. The file writes many of
 * these values with units ("35 m", "205 GPa", "0.5 %", "561 mm²", "15 °C"); the tests build
 * the channels from these specs with the channel package directly and compare, so a unit read
 * wrongly from the file would show as a different budget.
 */
import { fileURLToPath } from 'node:url';
import type { ChannelSpec } from '@bridgework/channel';

export const examplePath = fileURLToPath(new URL('../../demo/footbridge-monitoring.yaml', import.meta.url));

/** The path as the command shows it when run from the repository root. */
export const exampleShown = 'packages/cli/demo/footbridge-monitoring.yaml';

export const repoRoot = fileURLToPath(new URL('../../../../', import.meta.url));

export const footbridgeSpecs: Readonly<Record<'hanger-h3' | 'gusset-g2' | 'deck-temp', ChannelSpec>> = {
  'hanger-h3': {
    name: 'hanger-h3',
    sensor: { kind: 'strain-gauge', gaugeFactor: 2.09, gaugeOhms: 350, gaugeFactorToleranceFraction: 0.005 },
    bridge: {
      arrangement: 'full-poisson',
      poissonRatio: 0.3,
      wiring: 'six-wire',
      cable: { awg: 24, lengthMeters: 35 },
    },
    excitation: { volts: 5, remoteSense: true },
    amplifier: {
      gain: 128,
      inputVoltageNoiseVoltsPerRootHz: 8e-9,
      outputReferenceVolts: 2.5,
      limits: { inputCommonModeVolts: [0.3, 4.7], outputVolts: [0.1, 4.9] },
    },
    adc: {
      bits: 24,
      referenceVolts: 5,
      ratiometric: true,
      filter: { kind: 'sinc', order: 3, dataRateHertz: 10 },
    },
    environment: { temperatureCelsius: 15, rangeCelsius: [-5, 35] },
    tolerances: { gainFraction: 0.0002 },
    output: { quantity: 'force', modulusPascals: 205e9, areaSquareMeters: 561e-6, range: [-10000, 120000] },
  },
  'gusset-g2': {
    name: 'gusset-g2',
    sensor: {
      kind: 'strain-gauge',
      gaugeFactor: 2.11,
      gaugeOhms: 350,
      gaugeFactorTemperatureCoefficientPerKelvin: 1e-4,
      gaugeFactorToleranceFraction: 0.01,
      thermalOutput: {
        coefficientsMicrostrain: [-32.5, 2.75, -0.063, 0.000345],
        gaugeFactor: 2.0,
        rangeCelsius: [-30, 120],
      },
    },
    bridge: { arrangement: 'quarter', wiring: 'three-wire', cable: { awg: 26, lengthMeters: 22 } },
    excitation: { volts: 2.5 },
    amplifier: { gain: 64, inputVoltageNoiseVoltsPerRootHz: 8e-9 },
    adc: {
      bits: 24,
      referenceVolts: 2.5,
      ratiometric: true,
      filter: { kind: 'sinc', order: 4, dataRateHertz: 20 },
    },
    zero: { code: -18433 },
    environment: { temperatureCelsius: 15, rangeCelsius: [5, 25] },
    tolerances: { completionOhmsFraction: 0.0001, temperatureKelvin: 2 },
    output: { quantity: 'strain', unit: 'µε', range: [-300, 1200] },
  },
  'deck-temp': {
    name: 'deck-temp',
    sensor: { kind: 'rtd', r0Ohms: 1000, toleranceClass: 'A' },
    bridge: { wiring: 'three-wire', cable: { awg: 24, lengthMeters: 12 } },
    excitation: { volts: 1 },
    amplifier: { gain: 8 },
    adc: { bits: 24, referenceVolts: 1, ratiometric: true, filter: { dataRateHertz: 10 } },
    tolerances: { completionOhmsFraction: 0.0001 },
    output: { quantity: 'temperature', range: [-30, 60] },
  },
};

export const footbridgeNames = ['hanger-h3', 'gusset-g2', 'deck-temp'] as const;
