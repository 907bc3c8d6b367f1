import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  channelSpecFields,
  channelSpecJsonSchema,
  validateChannelSpec,
  type ChannelSpec,
} from '@bridgework/channel';
import { fieldTable, normalizedRows } from './support/fieldTable.js';

const full: ChannelSpec = {
  name: 'every field',
  sensor: {
    kind: 'strain-gauge',
    gaugeFactor: 2.1,
    gaugeOhms: 350,
    transverseSensitivity: 0.01,
    gaugeFactorTemperatureCoefficientPerKelvin: 1e-4,
    gaugeFactorReferenceCelsius: 24,
    thermalOutput: { coefficientsMicrostrain: [-20, 1.5, -0.02], gaugeFactor: 2, rangeCelsius: [-30, 100] },
  },
  bridge: {
    arrangement: 'full-poisson',
    poissonRatio: 0.3,
    completionOhms: 350,
    wiring: 'four-wire',
    cable: { awg: 26, lengthMeters: 30, conductorsPerLead: 2 },
  },
  excitation: { volts: 5, sourceOhms: 0.5, remoteSense: false },
  amplifier: {
    gain: 64,
    inputVoltageNoiseVoltsPerRootHz: 8e-9,
    voltageCornerHertz: 0,
    currentNoiseAmpsPerRootHz: 1e-13,
    currentCornerHertz: 0,
    secondStageGain: 1,
    outputReferenceVolts: 2.5,
    excitationLowVolts: 0,
    limits: {
      inputCommonModeVolts: [0.1, 4.9],
      inputDifferentialVolts: 0.1,
      firstStageVolts: [0.05, 4.95],
      outputVolts: [0.05, 4.95],
    },
  },
  adc: {
    bits: 24,
    referenceVolts: 5,
    bipolar: true,
    ratiometric: true,
    dataRateHertz: 10,
    filter: 'sinc3',
    noiseRmsVolts: 2e-8,
  },
  zero: { code: 120 },
  polarity: 'normal',
  environment: {
    temperatureCelsius: 30,
    zeroTemperatureCelsius: 20,
    cableTemperatureCelsius: 25,
    rangeCelsius: [10, 40],
  },
  tolerances: {
    gaugeFactor: 0.005,
    ratedOutput: 0,
    completionOhms: 0.0001,
    ohmsPerLead: 0.05,
    excitationVolts: 0,
    gain: 0.001,
    referenceVolts: 0,
    offsetVolts: 1e-6,
    temperatureCelsius: 1,
    coverageProbability: 0.95,
  },
  output: {
    quantity: 'force',
    range: [-50e3, 50e3],
    modulusPascals: 205e9,
    areaSquareMeters: 1.2e-3,
    firmwareResolution: 1,
  },
};

describe('the channel spec schema', () => {
  it('accepts a spec with every field of the types, unchanged where given', () => {
    const r = validateChannelSpec(full);
    expect(r.issues).toEqual([]);
    expect(r.value).toMatchObject(full as unknown as Record<string, unknown>);
  });

  it('converts quantities written with units only through the converter it is given', () => {
    const withUnits = { ...full, excitation: { volts: '5 V' } } as unknown as ChannelSpec;
    expect(validateChannelSpec(withUnits).issues[0]?.message).toBe(
      "`excitation.volts` must be a number in V; got '5 V'",
    );
    const converted = validateChannelSpec(withUnits, {
      convertUnit: (text, unit) => (unit === 'V' && text === '5 V' ? 5 : Number.NaN),
    });
    expect(converted.ok).toBe(true);
    const failing = validateChannelSpec(withUnits, {
      convertUnit: () => {
        throw new Error('`5 V` is not a resistance');
      },
    });
    expect(failing.issues[0]?.message).toBe(
      '`excitation.volts` must be a quantity in V: `5 V` is not a resistance',
    );
  });

  it('prefixes field paths when asked (files with several channels)', () => {
    const r = validateChannelSpec(
      { ...full, adc: { bits: 0, referenceVolts: 5 } },
      { path: 'channels.north' },
    );
    expect(r.issues[0]?.path).toBe('channels.north.adc.bits');
  });

  it('gives a JSON Schema whose properties mirror the field table, units under x-unit', () => {
    const schema = channelSpecJsonSchema() as {
      properties: Record<string, { properties?: Record<string, unknown> }>;
    };
    expect(Object.keys(schema.properties)).toEqual(Object.keys(full));
    const volts = schema.properties['excitation']!.properties!['volts'] as { 'x-unit': string };
    expect(volts['x-unit']).toBe('V');
    const rows = channelSpecFields();
    expect(rows.find((r) => r.path === 'excitation.volts')).toMatchObject({
      unit: 'V',
      presence: 'required',
    });
    expect(rows.find((r) => r.path === 'adc.filter')).toMatchObject({ presence: "'sinc3'" });
    expect(JSON.parse(JSON.stringify(schema))).toEqual(schema);
  });

  it('docs/channel.md holds the field table exactly as the schema defines it', () => {
    const doc = readFileSync(new URL('../../../docs/channel.md', import.meta.url), 'utf8');
    expect(normalizedRows(doc), 'run pnpm run docs:channel').toEqual(normalizedRows(fieldTable()));
    expect(normalizedRows(fieldTable()).length).toBeGreaterThan(60);
  });
});
