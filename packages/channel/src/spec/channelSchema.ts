import { leadWirings } from '@bridgework/core';
import { needsPoissonRatio, strainArrangements, type StrainArrangement } from '@bridgework/bridge';
import type { ChannelSpec } from './ChannelSpec.js';
import {
  booleanField,
  choiceField,
  numberField,
  numberListField,
  objectField,
  taggedField,
  textField,
  type SchemaNode,
} from './schema.js';

const ohms = (doc: string, dflt?: number) =>
  numberField({
    doc,
    unit: 'ohm',
    min: 0,
    minExclusive: true,
    ...(dflt === undefined ? {} : { default: dflt }),
  });
const optionalOhms = (doc: string) =>
  numberField({ doc, unit: 'ohm', min: 0, minExclusive: true, optional: true });
const relative = (doc: string) => numberField({ doc, unit: '1', min: 0, max: 1, default: 0 });
const celsius = (doc: string, optional = true) =>
  numberField({ doc, unit: 'degC', min: -273.15, minExclusive: true, optional });
const voltRange = (doc: string) =>
  numberListField(numberField({ doc: 'V', unit: 'V' }), { doc, minLength: 2, maxLength: 2, optional: true });

const strainGauge = objectField(
  {
    gaugeFactor: numberField({
      doc: 'Gauge factor at the reference temperature',
      unit: '1',
      min: 0,
      minExclusive: true,
    }),
    gaugeOhms: ohms('Gauge resistance', 350),
    transverseSensitivity: numberField({
      doc: 'Transverse sensitivity Kt (ν0 = 0.285)',
      unit: '1',
      min: -1,
      max: 1,
      minExclusive: true,
      maxExclusive: true,
      default: 0,
    }),
    gaugeFactorTemperatureCoefficientPerKelvin: numberField({
      doc: 'Gauge-factor temperature coefficient β, 1/K',
      default: 0,
      min: -0.1,
      max: 0.1,
    }),
    gaugeFactorReferenceCelsius: numberField({
      doc: 'Reference temperature of the gauge factor (data-sheet practice: 24 °C)',
      unit: 'degC',
      default: 24,
    }),
    thermalOutput: objectField(
      {
        coefficientsMicrostrain: numberListField(numberField({ doc: 'µε/°Cⁱ' }), {
          doc: 'Thermal-output polynomial coefficients a0…a4 in µε/°Cⁱ',
          minLength: 1,
          maxLength: 5,
        }),
        gaugeFactor: numberField({
          doc: 'Gauge-factor setting of the curve',
          unit: '1',
          min: 0,
          minExclusive: true,
          default: 2,
        }),
        rangeCelsius: numberListField(numberField({ doc: '°C', unit: 'degC' }), {
          doc: 'Temperatures [min, max] over which the curve holds',
          minLength: 2,
          maxLength: 2,
        }),
      },
      { doc: 'Thermal output (apparent strain) of the gauge lot on the specimen', optional: true },
    ),
  },
  { doc: 'Strain gauges' },
);

const transducer = objectField(
  {
    capacity: numberField({ doc: 'Rated capacity, in capacityUnit', min: 0, minExclusive: true }),
    capacityUnit: choiceField(['newton', 'kilogram-force', 'kilogram'] as const, {
      doc: "Unit of the capacity (default 'kilogram' for a mass output, else 'newton')",
      optional: true,
    }),
    calibrationGravityMetersPerSecondSquared: numberField({
      doc: "Gravity where the certificate's weights acted",
      unit: 'm/s^2',
      min: 0,
      minExclusive: true,
      default: 9.80665,
    }),
    localGravityMetersPerSecondSquared: numberField({
      doc: 'Gravity where the transducer is used (mass output)',
      unit: 'm/s^2',
      min: 0,
      minExclusive: true,
      default: 9.80665,
    }),
    zeroTemperatureCoefficientPerKelvin: numberField({
      doc: 'Zero drift, fraction of rated output per K',
      min: -0.01,
      max: 0.01,
      default: 0,
    }),
    spanTemperatureCoefficientPerKelvin: numberField({
      doc: 'Span drift, fraction per K',
      min: -0.01,
      max: 0.01,
      default: 0,
    }),
    certificateCelsius: numberField({
      doc: "Temperature of the certificate's rated output",
      unit: 'degC',
      default: 23,
    }),
    ratedOutputVoltsPerVolt: numberField({
      doc: 'Rated output at capacity, V/V (2 mV/V = 0.002)',
      unit: 'V/V',
      min: 0,
      minExclusive: true,
      max: 1,
    }),
    zeroBalanceVoltsPerVolt: numberField({
      doc: 'Zero balance, V/V',
      unit: 'V/V',
      min: -1,
      max: 1,
      default: 0,
    }),
    inputOhms: ohms('Input (excitation) resistance', 350),
    outputOhms: ohms('Output resistance', 350),
  },
  { doc: 'Full-bridge transducer with a certificate' },
);

const rtd = objectField(
  {
    r0Ohms: ohms('Resistance at 0 °C', 100),
    a: numberField({ doc: 'Callendar–Van Dusen A, 1/°C', default: 3.9083e-3 }),
    b: numberField({ doc: 'Callendar–Van Dusen B, 1/°C²', default: -5.775e-7 }),
    c: numberField({ doc: 'Callendar–Van Dusen C, 1/°C⁴ (below 0 °C)', default: -4.183e-12 }),
    toleranceClass: choiceField(['AA', 'A', 'B', 'C'] as const, {
      doc: 'IEC 60751 tolerance class',
      optional: true,
    }),
  },
  { doc: 'Platinum RTD (IEC 60751) in arm 1 of a quarter bridge' },
);

const schemaRoot = objectField<ChannelSpec>(
  {
    name: textField({ doc: 'Name for reports and generated code', default: 'channel' }),
    sensor: taggedField('kind', { 'strain-gauge': strainGauge, transducer, rtd }, { doc: 'Sensor kind' }),
    bridge: objectField(
      {
        arrangement: choiceField(strainArrangements, { doc: 'Strain-gauge arrangement', optional: true }),
        poissonRatio: numberField({
          doc: 'Poisson ratio of the specimen',
          unit: '1',
          min: -1,
          minExclusive: true,
          max: 0.5,
          optional: true,
        }),
        completionOhms: optionalOhms('Completion resistors (default: the sensor resistance)'),
        wiring: choiceField(leadWirings, { doc: 'Lead wiring (default by arrangement)', optional: true }),
        ohmsPerLead: numberField({
          doc: 'Resistance of one lead conductor',
          unit: 'ohm',
          min: 0,
          optional: true,
        }),
        cable: objectField(
          {
            awg: numberField({
              doc: 'AWG size of each conductor',
              integer: true,
              min: -3,
              max: 56,
              optional: true,
            }),
            diameterMeters: numberField({
              doc: 'Conductor diameter',
              unit: 'm',
              min: 0,
              minExclusive: true,
              optional: true,
            }),
            lengthMeters: numberField({ doc: 'Cable length', unit: 'm', min: 0, minExclusive: true }),
            conductorsPerLead: numberField({
              doc: 'Conductors in parallel per lead',
              integer: true,
              min: 1,
              default: 1,
            }),
          },
          { doc: 'Copper cable from which the lead resistance is computed (IEC 60028)', optional: true },
        ),
      },
      { doc: 'Bridge arrangement, completion and cable', optional: true },
    ),
    excitation: objectField(
      {
        volts: numberField({ doc: 'Source EMF', unit: 'V', min: 0, minExclusive: true }),
        sourceOhms: numberField({
          doc: 'Internal resistance of the source',
          unit: 'ohm',
          min: 0,
          default: 0,
        }),
        remoteSense: booleanField({ doc: 'Excitation sensed at the bridge (six-wire)', optional: true }),
      },
      { doc: 'Excitation source' },
    ),
    amplifier: objectField(
      {
        gain: numberField({
          doc: 'Total gain from bridge to quantizer',
          unit: '1',
          min: 0,
          minExclusive: true,
          default: 1,
        }),
        inputVoltageNoiseVoltsPerRootHz: numberField({
          doc: 'Input voltage noise density, V/√Hz',
          min: 0,
          default: 0,
        }),
        voltageCornerHertz: numberField({
          doc: '1/f corner of the voltage noise',
          unit: 'Hz',
          min: 0,
          default: 0,
        }),
        currentNoiseAmpsPerRootHz: numberField({
          doc: 'Input current noise density, A/√Hz',
          min: 0,
          default: 0,
        }),
        currentCornerHertz: numberField({
          doc: '1/f corner of the current noise',
          unit: 'Hz',
          min: 0,
          default: 0,
        }),
        secondStageGain: numberField({
          doc: 'Gain of the second (difference) stage',
          unit: '1',
          min: 0,
          minExclusive: true,
          default: 1,
        }),
        outputReferenceVolts: numberField({ doc: 'Output reference voltage', unit: 'V', default: 0 }),
        excitationLowVolts: numberField({
          doc: 'Potential of E− relative to amplifier ground',
          unit: 'V',
          default: 0,
        }),
        limits: objectField(
          {
            inputCommonModeVolts: voltRange('Input common-mode range [min, max]'),
            inputDifferentialVolts: numberField({
              doc: 'Largest differential input magnitude',
              unit: 'V',
              min: 0,
              minExclusive: true,
              optional: true,
            }),
            firstStageVolts: voltRange('First-stage output range [min, max]'),
            outputVolts: voltRange('Output swing [min, max]'),
          },
          { doc: 'Amplifier limits for the headroom check', optional: true },
        ),
      },
      { doc: 'Amplifier', optional: true },
    ),
    adc: objectField(
      {
        bits: numberField({ doc: 'Resolution in bits', integer: true, min: 2, max: 32 }),
        referenceVolts: numberField({
          doc: 'Reference voltage (ratiometric: nominal excitation)',
          unit: 'V',
          min: 0,
          minExclusive: true,
        }),
        bipolar: booleanField({ doc: "Two's complement ±full scale", default: true }),
        ratiometric: booleanField({ doc: 'Reference is the excitation', default: false }),
        dataRateHertz: numberField({
          doc: 'Output data rate',
          unit: 'Hz',
          min: 0,
          minExclusive: true,
          default: 10,
        }),
        filter: choiceField(['sinc1', 'sinc2', 'sinc3', 'sinc4', 'sinc5'] as const, {
          doc: 'Digital filter',
          default: 'sinc3',
        }),
        noiseRmsVolts: numberField({
          doc: "Converter's input-referred rms noise",
          unit: 'V',
          min: 0,
          minExclusive: true,
          optional: true,
        }),
      },
      { doc: 'Analog-to-digital converter' },
    ),
    zero: objectField(
      {
        code: numberField({
          doc: 'Converter code at zero load (an average of codes need not be an integer)',
        }),
      },
      { doc: 'Zero reading for the two-reading method', optional: true },
    ),
    polarity: choiceField(['normal', 'inverted'] as const, { doc: 'Signal polarity', default: 'normal' }),
    environment: objectField(
      {
        temperatureCelsius: numberField({
          doc: 'Sensor temperature during the measurement',
          unit: 'degC',
          default: 20,
        }),
        zeroTemperatureCelsius: celsius('Sensor temperature at zeroing (default: temperatureCelsius)'),
        cableTemperatureCelsius: celsius('Cable temperature (default: temperatureCelsius)'),
        rangeCelsius: numberListField(numberField({ doc: '°C', unit: 'degC' }), {
          doc: 'Temperature range [min, max] the budget covers (default: the measurement temperature)',
          minLength: 2,
          maxLength: 2,
          optional: true,
        }),
      },
      { doc: 'Temperatures of the installation', optional: true },
    ),
    tolerances: objectField(
      {
        gaugeFactor: relative('Gauge factor, relative'),
        ratedOutput: relative('Transducer rated output, relative'),
        completionOhms: relative('Completion resistors, relative'),
        ohmsPerLead: numberField({ doc: 'Lead resistance', unit: 'ohm', min: 0, default: 0 }),
        excitationVolts: relative('Excitation EMF, relative (absolute reference only)'),
        gain: relative('Amplifier gain, relative'),
        referenceVolts: relative('Converter reference, relative (absolute reference only)'),
        offsetVolts: numberField({
          doc: 'Input-referred offset after zeroing',
          unit: 'V',
          min: 0,
          default: 0,
        }),
        temperatureCelsius: numberField({
          doc: 'Gauge temperature used in corrections',
          unit: 'K',
          min: 0,
          default: 0,
        }),
        coverageProbability: numberField({
          doc: 'Coverage probability of the expanded uncertainty',
          min: 0.5,
          max: 0.9999,
          default: 0.95,
        }),
      },
      { doc: 'Tolerance half-widths (rectangular) for the budget', optional: true },
    ),
    output: objectField(
      {
        quantity: choiceField(
          ['strain', 'microstrain', 'stress', 'force', 'mass', 'temperature', 'ratio'] as const,
          {
            doc: 'Measured quantity',
          },
        ),
        range: numberListField(numberField({ doc: 'output unit' }), {
          doc: 'Span of interest [min, max] in the output unit (default: converter full scale within the sensor range)',
          minLength: 2,
          maxLength: 2,
          optional: true,
        }),
        modulusPascals: numberField({
          doc: "Young's modulus of the specimen (stress, force)",
          unit: 'Pa',
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        areaSquareMeters: numberField({
          doc: 'Cross-section of an axial member (force)',
          unit: 'm^2',
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        firmwareResolution: numberField({
          doc: 'Output LSB of fixed-point constants, in the output unit',
          min: 0,
          minExclusive: true,
          optional: true,
        }),
      },
      { doc: 'Measured quantity and span' },
    ),
  },
  { doc: 'Channel', check: crossCheck },
);

const quantitiesBySensor: Record<string, readonly string[]> = {
  'strain-gauge': ['strain', 'microstrain', 'stress', 'force', 'ratio'],
  transducer: ['force', 'mass', 'ratio'],
  rtd: ['temperature', 'ratio'],
};

const wiringsByArrangement: Record<StrainArrangement, readonly string[]> = {
  quarter: ['two-wire', 'three-wire'],
  'half-bending': ['three-wire'],
  'half-poisson': ['three-wire'],
  'half-opposite': ['two-wire'],
  'full-bending': ['four-wire', 'six-wire'],
  'full-poisson': ['four-wire', 'six-wire'],
  'full-shear': ['four-wire', 'six-wire'],
  'full-bending-poisson': ['four-wire', 'six-wire'],
};

/** Rules that involve more than one field; each failure names the field to change. */
function crossCheck(spec: ChannelSpec, _path: string, report: (path: string, message: string) => void): void {
  const kind = spec.sensor.kind;
  const bridge = spec.bridge ?? {};
  if (!(quantitiesBySensor[kind] ?? []).includes(spec.output.quantity)) {
    report(
      'output.quantity',
      `must be one of ${quantitiesBySensor[kind]!.map((q) => `'${q}'`).join(', ')} for a '${kind}' sensor; got '${spec.output.quantity}'`,
    );
  }
  if (
    kind !== 'strain-gauge' &&
    bridge.arrangement !== undefined &&
    !(kind === 'rtd' && bridge.arrangement === 'quarter')
  ) {
    report(
      'bridge.arrangement',
      `must be absent for a '${kind}' sensor (${kind === 'rtd' ? 'an RTD sits in a quarter bridge' : 'a transducer has its own full bridge'}); got '${bridge.arrangement}'`,
    );
  }
  if (kind === 'transducer' && bridge.completionOhms !== undefined) {
    report('bridge.completionOhms', 'must be absent for a transducer (it has no completion resistors)');
  }
  const arrangement =
    kind === 'strain-gauge' ? (bridge.arrangement ?? 'quarter') : kind === 'rtd' ? 'quarter' : 'full-bending';
  if (kind === 'strain-gauge' && needsPoissonRatio(arrangement) && bridge.poissonRatio === undefined) {
    report('bridge.poissonRatio', `is required for a '${arrangement}' bridge (it has a transverse gauge)`);
  }
  if (
    kind === 'strain-gauge' &&
    (spec.sensor.transverseSensitivity ?? 0) !== 0 &&
    bridge.poissonRatio === undefined
  ) {
    report(
      'bridge.poissonRatio',
      'is required to correct transverse sensitivity (the transverse strain is −ν·ε)',
    );
  }
  if (bridge.wiring !== undefined && !wiringsByArrangement[arrangement].includes(bridge.wiring)) {
    report(
      'bridge.wiring',
      `must be one of ${wiringsByArrangement[arrangement].map((w) => `'${w}'`).join(', ')} for ${kind === 'transducer' ? 'a transducer' : `a '${arrangement}' bridge`}; got '${bridge.wiring}'`,
    );
  }
  if (bridge.ohmsPerLead !== undefined && bridge.cable !== undefined) {
    report('bridge.cable', 'must not be given together with `bridge.ohmsPerLead` (give one of them)');
  }
  if (
    bridge.cable !== undefined &&
    (bridge.cable.awg === undefined) === (bridge.cable.diameterMeters === undefined)
  ) {
    report('bridge.cable', 'must give exactly one of `awg` and `diameterMeters`');
  }
  const remote = spec.excitation.remoteSense;
  if (remote === true && bridge.wiring !== undefined && bridge.wiring !== 'six-wire') {
    report(
      'excitation.remoteSense',
      `needs \`bridge.wiring\` 'six-wire' (sense conductors); got '${bridge.wiring}'`,
    );
  }
  if (remote === false && bridge.wiring === 'six-wire') {
    report('excitation.remoteSense', "must not be false with `bridge.wiring` 'six-wire'");
  }
  if (remote === true && !['transducer'].includes(kind) && !arrangement.startsWith('full')) {
    report('excitation.remoteSense', 'applies to full bridges and transducers only');
  }
  if (spec.adc.ratiometric === true && spec.adc.referenceVolts !== spec.excitation.volts) {
    report(
      'adc.referenceVolts',
      `must equal \`excitation.volts\` (${spec.excitation.volts} V) for a ratiometric converter, whose reference is the excitation; got ${spec.adc.referenceVolts}`,
    );
  }
  const q = spec.output.quantity;
  if (
    kind === 'strain-gauge' &&
    (q === 'stress' || q === 'force') &&
    spec.output.modulusPascals === undefined
  ) {
    report('output.modulusPascals', `is required for output '${q}' from strain gauges`);
  }
  if (kind === 'strain-gauge' && q === 'force' && spec.output.areaSquareMeters === undefined) {
    report('output.areaSquareMeters', "is required for output 'force' from strain gauges (axial member)");
  }
  const range = spec.output.range;
  if (range !== undefined && !(range[0] < range[1]))
    report('output.range', `must have min < max; got [${range.join(', ')}]`);
  const tr = spec.environment?.rangeCelsius;
  if (tr !== undefined && !(tr[0] <= tr[1]))
    report('environment.rangeCelsius', `must have min <= max; got [${tr.join(', ')}]`);
  const to = kind === 'strain-gauge' ? spec.sensor.thermalOutput : undefined;
  if (to !== undefined && !(to.rangeCelsius[0] < to.rangeCelsius[1])) {
    report('sensor.thermalOutput.rangeCelsius', `must have min < max; got [${to.rangeCelsius.join(', ')}]`);
  }
  if (spec.zero !== undefined && kind === 'rtd') {
    report('zero', 'must be absent for an RTD (its temperature is absolute; there is no zero reading)');
  }
  if (spec.zero !== undefined) {
    const bits = spec.adc.bits;
    const lo = spec.adc.bipolar === false ? 0 : -(2 ** (bits - 1));
    const hi = spec.adc.bipolar === false ? 2 ** bits - 1 : 2 ** (bits - 1) - 1;
    if (spec.zero.code <= lo || spec.zero.code >= hi) {
      report(
        'zero.code',
        `must lie strictly inside the converter's codes (${lo}, ${hi}); got ${spec.zero.code}`,
      );
    }
  }
}

/** The schema of a channel specification: validation with defaults, JSON Schema and field table. */
export const channelSchema: SchemaNode<ChannelSpec> = schemaRoot;
