import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  channelSpecFields,
  channelSpecJsonSchema,
  validateChannelSpec,
  type ChannelSpec,
} from '@bridgework/channel';
import { defaultKit } from '../src/internal/defaultKit.js';
import { builtInFieldDocs } from '../src/spec/fieldDocs.js';
import type { AnyNode } from '../src/spec/schema.js';
import { normalizedRows, unitTableMarkdown } from './support/unitTableDocs.js';

const full: ChannelSpec = {
  name: 'every field',
  sensor: {
    kind: 'strain-gauge',
    gaugeFactor: 2.1,
    gaugeOhms: 350,
    transverseSensitivity: 0.01,
    gaugeFactorTemperatureCoefficientPerKelvin: 1e-4,
    gaugeFactorReferenceCelsius: 24,
    gaugeFactorToleranceFraction: 0.005,
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
    ratiometric: false, // an absolute reference: it sees excitation.sourceOhms (refused with a ratiometric one)
    filter: { kind: 'sinc', order: 3, dataRateHertz: 10 },
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
    completionOhmsFraction: 0.0001,
    ohmsPerLead: 0.05,
    excitationVoltsFraction: 0,
    gainFraction: 0.001,
    referenceVoltsFraction: 0,
    offsetVolts: 1e-6,
    temperatureKelvin: 1,
    coverageProbability: 0.95,
  },
  output: {
    quantity: 'force',
    unit: 'N',
    range: [-50e3, 50e3],
    modulusPascals: 205e9,
    areaSquareMeters: 1.2e-3,
    firmwareResolution: 1,
  },
  spanCorrection: {
    factor: 1.002,
    factorStandardUncertainty: 1e-4,
    shuntOhms: 59_000,
    arm: 1,
    placement: 'gauge',
    expectedStepCodes: -1000,
    measuredStepCodes: -998,
    readings: 10,
    date: '2026-12-05',
    note: 'shunt box 3',
  },
  calibration: {
    unit: 'N',
    coefficients: [1e-6, 4e-8],
    covariance: [1e-18, 0, 0, 1e-24],
    range: [-50e3, 50e3],
    extrapolationFraction: 0.05,
    residualStandardDeviation: 1e-7,
    points: 11,
    pointsFile: 'points.csv',
    pointsSha256: '0123456789abcdef0123456789abcdef0123456789abcdef0123456789abcdef',
    date: '2026-12-05',
    note: 'reference machine 2',
  },
};

describe('the channel spec schema', () => {
  it('accepts a spec with every field of the types, unchanged where given (ranges become { min, max })', () => {
    const r = validateChannelSpec(full);
    expect(r.issues).toEqual([]);
    const interval = (x: readonly [number, number]) => ({ min: x[0], max: x[1] });
    expect(r.value).toMatchObject({
      ...full,
      sensor: {
        ...full.sensor,
        thermalOutput: {
          coefficientsMicrostrain: [-20, 1.5, -0.02],
          gaugeFactor: 2,
          rangeCelsius: interval([-30, 100]),
        },
      },
      amplifier: {
        ...full.amplifier,
        limits: {
          inputCommonModeVolts: interval([0.1, 4.9]),
          inputDifferentialVolts: 0.1,
          firstStageVolts: interval([0.05, 4.95]),
          outputVolts: interval([0.05, 4.95]),
        },
      },
      environment: { ...full.environment, rangeCelsius: interval([10, 40]) },
      output: { ...full.output, range: interval([-50e3, 50e3]) },
      calibration: { ...full.calibration, range: interval([-50e3, 50e3]) },
    } as unknown as Record<string, unknown>);
  });

  it("reads quantities written with units, exactly, and names a wrong unit in the user's terms", () => {
    const withUnits = {
      ...full,
      sensor: { ...full.sensor, gaugeOhms: '0.35 kΩ', gaugeFactorToleranceFraction: '0.5 %' },
      excitation: { volts: '5000 mV' },
      output: {
        ...full.output,
        unit: 'kN',
        range: ['-50 kN', '50000 N'],
        modulusPascals: '205 GPa',
        areaSquareMeters: '1200 mm²',
        firmwareResolution: 0.001,
      },
      // The calibration's span reads units in the output unit; its coefficients are per kN.
      calibration: {
        ...full.calibration,
        unit: 'kN',
        coefficients: [1e-6, 4e-5],
        range: ['-50 kN', '50000 N'],
      },
    } as unknown as ChannelSpec;
    const r = validateChannelSpec(withUnits);
    expect(r.issues).toEqual([]);
    expect(r.value?.sensor).toMatchObject({ gaugeOhms: 350, gaugeFactorToleranceFraction: 0.005 });
    expect(r.value?.excitation.volts).toBe(5);
    // The range is in the output unit, kN: '50000 N' is 50 kN.
    expect(r.value?.output.range).toEqual({ min: -50, max: 50 });
    expect(r.value?.calibration?.range).toEqual({ min: -50, max: 50 });
    expect(r.value?.output.modulusPascals).toBe(205e9);
    expect(r.value?.output.areaSquareMeters).toBe(1.2e-3); // the double nearest 1200e-6 (exact decimal product)
    const wrong = validateChannelSpec({ ...full, excitation: { volts: '5 m' } });
    expect(wrong.issues).toEqual([
      expect.objectContaining({
        code: 'wrong-type',
        path: 'excitation.volts',
        message: "'5 m' is a length; expected a voltage, such as '5 V'",
      }),
    ]);
  });

  it('treats keys named like prototype members as unknown fields, and non-finite numbers as field errors', () => {
    const renamed = JSON.parse(JSON.stringify(full).replace('"tolerances"', '"constructor"')) as unknown;
    const r = validateChannelSpec(renamed);
    expect(r.ok).toBe(false);
    expect(r.issues.map((i) => [i.code, i.path])).toEqual([['unknown-option', 'constructor']]);
    for (const key of ['__proto__', 'toString', 'hasOwnProperty', 'valueOf']) {
      const spec = JSON.parse(`{"${key}": 1, ${JSON.stringify(full).slice(1)}`) as unknown;
      expect(
        validateChannelSpec(spec).issues.map((i) => i.path),
        key,
      ).toEqual([key]);
    }
    const nan = validateChannelSpec({ ...full, amplifier: { gain: Number.POSITIVE_INFINITY } });
    expect(nan.issues).toEqual([expect.objectContaining({ code: 'not-finite', path: 'amplifier.gain' })]);
    const overflow = validateChannelSpec({ ...full, excitation: { volts: '1e400 V' } });
    expect(overflow.issues).toEqual([
      expect.objectContaining({ code: 'not-finite', path: 'excitation.volts' }),
    ]);
  });

  it('gives back a validated spec that validates again to itself (idempotent), and createChannel takes it as it is', () => {
    const first = validateChannelSpec(full);
    expect(first.ok).toBe(true);
    const again = validateChannelSpec(JSON.parse(JSON.stringify(first.value)) as unknown);
    expect(again.issues).toEqual([]);
    expect(again.value).toEqual(first.value);
    expect(Object.isFrozen(first.value)).toBe(true);
    expect(Object.isFrozen(first.value?.sensor)).toBe(true);
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
    expect(rows.find((r) => r.path === 'adc.filter.order')).toMatchObject({ presence: '3' });
    expect(JSON.parse(JSON.stringify(schema))).toEqual(schema);
  });

  it('states each field’s meaning in one place: a required field on itself (its missing message quotes it), any other in the reference table', () => {
    const rows = channelSpecFields();
    const fields = new Map<string, AnyNode>();
    const walk = (node: AnyNode, path: string): void => {
      fields.set(path, node);
      const shape = node.shape;
      if (shape.form === 'object')
        for (const [k, f] of Object.entries(shape.fields)) walk(f, path === '' ? k : `${path}.${k}`);
      if (shape.form === 'tagged')
        for (const [n, v] of Object.entries(shape.variants)) walk(v, `${path}<${n}>`);
    };
    walk(defaultKit.schema, '');
    // Every row of the reference has a meaning.
    for (const row of rows) expect(row.doc.trim(), row.path).not.toBe('');
    for (const [path, node] of fields) {
      const inTable = Object.hasOwn(builtInFieldDocs, path);
      const onField = node.doc !== undefined;
      // A required field of an object (not a tagged union's variant, not the whole spec) carries its own.
      const quoted = node.presence === 'required' && path !== '' && !path.endsWith('>');
      expect({ path, inTable, onField }).toEqual({ path, inTable: !quoted, onField: quoted });
    }
    // No entry of the table names a field the schema does not have.
    for (const path of Object.keys(builtInFieldDocs)) expect(fields.has(path), path).toBe(true);
    // The message for a missing required field quotes its meaning.
    const { volts: _volts, ...excitation } = full.excitation;
    const missing = validateChannelSpec({ ...full, excitation });
    expect(missing.issues).toContainEqual(
      expect.objectContaining({
        code: 'missing-option',
        path: 'excitation.volts',
        message: 'is required (Source EMF)',
        expected: 'Source EMF',
      }),
    );
  });

  it('docs/channel.md holds the unit table exactly as the unit table defines it', () => {
    const doc = readFileSync(new URL('../../../docs/channel.md', import.meta.url), 'utf8');
    expect(normalizedRows(doc), 'run pnpm run docs:channel').toEqual(normalizedRows(unitTableMarkdown()));
    expect(normalizedRows(unitTableMarkdown()).length).toBeGreaterThan(20);
  });
});
