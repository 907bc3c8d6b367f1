/**
 * The fields every channel has, whatever its sensor: bridge and cable, excitation, amplifier,
 * converter, zero, polarity, environment, tolerances and output. The sensor's own fields come
 * from its kind module (kinds/). Defaults live here and only here.
 */
import { leadWirings } from '@bridgework/core';
import {
  defaultOutputUnit,
  outputQuantities,
  outputQuantityTable,
  type OutputQuantity,
} from '../outputQuantities.js';
import { formatValue } from '@bridgework/core';
import { findUnit, unitSymbols } from '../units/quantity.js';
import { dimensionTable } from '../units/unitTable.js';
import {
  INVALID,
  report,
  booleanField,
  choiceField,
  intervalField,
  numberField,
  objectField,
  textField,
  type ObjectOut,
  type ParseContext,
  type UnitRule,
} from './schema.js';
import { renamedCommonFields } from './renamedFields.js';
import { testDayFields } from './testDaySpec.js';

const ohms = { dimension: 'resistance' } as const;
const volts = { dimension: 'voltage' } as const;
const hertz = { dimension: 'frequency' } as const;
const meters = { dimension: 'length' } as const;
const celsius = { dimension: 'temperature' } as const;
/** The highest sensor temperature a channel file may state, °C: no bridge sensor works beyond it (high-temperature strain gauges end near 1000 °C, IEC 60751 at 850 °C). */
const MAX_CELSIUS = 2000;
const fraction = { dimension: 'fraction' } as const;

/** The output quantity, once `output.quantity` is parsed. */
function parsedQuantity(ctx: ParseContext): OutputQuantity | undefined {
  const q = ctx.parsed.get('output.quantity');
  return typeof q === 'string' && (outputQuantities as readonly string[]).includes(q)
    ? (q as OutputQuantity)
    : undefined;
}

/** The unit of the channel's values: `output.unit`, or the quantity's SI unit. */
export const outputUnitRule: UnitRule = {
  describe: 'output unit',
  dynamic(ctx) {
    const q = parsedQuantity(ctx);
    if (q === undefined) return undefined;
    const unit = ctx.parsed.get('output.unit');
    const dimension = outputQuantityTable[q].dimension;
    if (unit !== undefined && (typeof unit !== 'string' || findUnit(dimension, unit) === undefined))
      return undefined;
    return { dimension, unit: (unit as string | undefined) ?? defaultOutputUnit(q) };
  },
};

/** `output.unit`: a unit of the output quantity's dimension (checked once the quantity is known). */
function outputUnitField() {
  const node = textField({
    doc: `Unit of the channel's values, of range and of firmwareResolution: ${outputQuantities
      .filter(
        (q, i, all) =>
          all.findIndex((x) => outputQuantityTable[x].dimension === outputQuantityTable[q].dimension) === i,
      )
      .map((q) => unitSymbols(outputQuantityTable[q].dimension).join(', '))
      .join('; ')}`,
    derived: true,
    defaultText: 'the SI unit of the quantity (m/m, Pa, N, kg, N·m, °C, V/V)',
  });
  return {
    ...node,
    parse(value: unknown, path: string, ctx: ParseContext) {
      const text = node.parse(value, path, ctx);
      if (text === INVALID) return INVALID;
      const q = parsedQuantity(ctx);
      if (q === undefined) return INVALID; // output.quantity is invalid and reported
      const dimension = outputQuantityTable[q].dimension;
      const found = findUnit(dimension, text);
      if (found === undefined) {
        const units = unitSymbols(dimension)
          .map((x) => `'${x}'`)
          .join(', ');
        return report(
          ctx,
          path,
          'invalid-option',
          `must be a unit of ${dimensionTable[dimension].what} for output '${q}': one of ${units}; got ${formatValue(text)}`,
          {
            expected: `one of ${units}`,
          },
        );
      }
      return found.unit.symbol;
    },
  };
}

const relative = (doc: string) =>
  numberField({ doc, unit: fraction, min: 0, max: 1, maxExclusive: true, default: 0 });

/** The fields of a channel besides `sensor`, for the given strain arrangements (the bridge package's table). */
export function commonFields<const A extends string>(arrangements: readonly A[]) {
  return {
    name: textField({ doc: 'Name for reports and generated code', default: 'channel', maxLength: 100 }),
    bridge: objectField(
      {
        arrangement: choiceField(arrangements, {
          doc: "Strain-gauge arrangement (the bridge package's table); a single element sits in arm 1 of a quarter bridge",
          optional: true,
          defaultText: "'quarter' (strain gauges, RTDs, thermistors); absent for transducers",
        }),
        poissonRatio: numberField({
          doc: 'Poisson ratio of the specimen (Poisson arrangements, transverse sensitivity, shear modulus from E)',
          min: -1,
          minExclusive: true,
          max: 0.5,
          optional: true,
        }),
        completionOhms: numberField({
          doc: 'Completion resistors',
          unit: ohms,
          min: 0,
          minExclusive: true,
          optional: true,
          defaultText: "the sensor's nominal resistance (absent for transducers)",
        }),
        wiring: choiceField(leadWirings, {
          doc: 'Lead wiring',
          derived: true,
          defaultText:
            "'three-wire' where the arrangement allows it, else 'four-wire' ('six-wire' with excitation.remoteSense), else the arrangement's one wiring",
        }),
        ohmsPerLead: numberField({
          doc: 'Resistance of one lead conductor',
          unit: ohms,
          min: 0,
          optional: true,
          defaultText: '0, or from cable',
        }),
        cable: objectField(
          {
            awg: numberField({
              doc: 'AWG size of each conductor (ASTM B258)',
              integer: true,
              min: -3,
              max: 56,
              optional: true,
            }),
            diameterMeters: numberField({
              doc: 'Conductor diameter (instead of awg)',
              unit: meters,
              min: 0,
              minExclusive: true,
              optional: true,
            }),
            lengthMeters: numberField({
              doc: 'Cable length (one conductor)',
              unit: meters,
              min: 0,
              minExclusive: true,
              max: 100_000,
            }),
            conductorsPerLead: numberField({
              doc: 'Conductors in parallel per lead',
              integer: true,
              min: 1,
              max: 100,
              default: 1,
            }),
          },
          {
            doc: 'Copper cable from which the lead resistance is computed (IEC 60028)',
            presence: 'optional',
          },
        ),
      },
      { doc: 'Bridge arrangement, completion and cable', presence: 'default' },
    ),
    excitation: objectField(
      {
        volts: numberField({ doc: 'Source EMF', unit: volts, min: 0, minExclusive: true }),
        sourceOhms: numberField({
          doc: 'Internal resistance of the source (absolute reference only)',
          unit: ohms,
          min: 0,
          max: 1e12,
          default: 0,
        }),
        remoteSense: booleanField({
          doc: 'Excitation sensed at the bridge (six-wire)',
          derived: true,
          defaultText: "true when bridge.wiring is 'six-wire'",
        }),
      },
      { doc: 'Excitation source' },
    ),
    amplifier: objectField(
      {
        gain: numberField({
          doc: 'Total gain from bridge to quantizer',
          min: 0,
          minExclusive: true,
          default: 1,
        }),
        inputVoltageNoiseVoltsPerRootHz: numberField({
          doc: 'Input voltage noise density (white)',
          unit: { dimension: 'voltage-density' },
          min: 0,
          default: 0,
        }),
        voltageCornerHertz: numberField({
          doc: '1/f corner of the voltage noise',
          unit: hertz,
          min: 0,
          default: 0,
        }),
        currentNoiseAmpsPerRootHz: numberField({
          doc: 'Input current noise density (white)',
          unit: { dimension: 'current-density' },
          min: 0,
          default: 0,
        }),
        currentCornerHertz: numberField({
          doc: '1/f corner of the current noise',
          unit: hertz,
          min: 0,
          default: 0,
        }),
        secondStageGain: numberField({
          doc: 'Gain of the second (difference) stage',
          min: 0,
          minExclusive: true,
          default: 1,
        }),
        outputReferenceVolts: numberField({ doc: 'Output reference voltage', unit: volts, default: 0 }),
        excitationLowVolts: numberField({
          doc: 'Potential of E− relative to the amplifier ground',
          unit: volts,
          default: 0,
        }),
        limits: objectField(
          {
            inputCommonModeVolts: intervalField({
              doc: 'Input common-mode range',
              unit: volts,
              optional: true,
            }),
            inputDifferentialVolts: numberField({
              doc: 'Largest differential input magnitude',
              unit: volts,
              min: 0,
              minExclusive: true,
              optional: true,
            }),
            firstStageVolts: intervalField({ doc: 'First-stage output range', unit: volts, optional: true }),
            outputVolts: intervalField({ doc: 'Output swing', unit: volts, optional: true }),
          },
          { doc: 'Amplifier limits for the headroom check', presence: 'optional' },
        ),
      },
      { doc: 'Amplifier (instrumentation amplifier or the converter’s PGA)', presence: 'default' },
    ),
    adc: objectField(
      {
        bits: numberField({ doc: 'Resolution in bits', integer: true, min: 2, max: 32 }),
        referenceVolts: numberField({
          doc: 'Reference voltage (ratiometric: the excitation)',
          unit: volts,
          min: 0,
          minExclusive: true,
        }),
        bipolar: booleanField({ doc: "Two's complement ±full scale", default: true }),
        ratiometric: booleanField({ doc: 'The reference is the excitation', default: false }),
        filter: objectField(
          {
            kind: choiceField(['sinc'] as const, {
              doc: 'Filter kind (a sinc filter, as the chain package names it)',
              default: 'sinc',
            }),
            order: numberField({
              doc: 'Order of the sinc filter',
              integer: true,
              min: 1,
              max: 5,
              default: 3,
            }),
            dataRateHertz: numberField({
              doc: 'Output data rate',
              unit: hertz,
              min: 1e-9,
              max: 1e12,
              default: 10,
            }),
          },
          { doc: "The converter's digital filter and data rate", presence: 'default' },
        ),
        noiseRmsVolts: numberField({
          doc: "The converter's own input-referred rms noise at this gain and rate (default: ideal quantization)",
          unit: volts,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
      },
      { doc: 'Analog-to-digital converter', renamed: renamedCommonFields.adc },
    ),
    zero: objectField(
      {
        code: numberField({
          doc: 'Converter code read at zero load (a mean of codes need not be an integer)',
        }),
      },
      { doc: 'Zero reading, for the exact two-reading method', presence: 'optional' },
    ),
    polarity: choiceField(['normal', 'inverted'] as const, {
      doc: "'inverted' when the signal leads are swapped (tension reads negative codes)",
      default: 'normal',
    }),
    environment: objectField(
      {
        temperatureCelsius: numberField({
          doc: 'Sensor temperature during the measurement',
          unit: celsius,
          max: MAX_CELSIUS,
          default: 20,
        }),
        zeroTemperatureCelsius: numberField({
          doc: 'Sensor temperature when the zero was taken',
          unit: celsius,
          max: MAX_CELSIUS,
          derived: true,
          defaultText: 'temperatureCelsius',
        }),
        cableTemperatureCelsius: numberField({
          doc: 'Cable temperature (for its resistance)',
          unit: celsius,
          min: -100,
          max: 300,
          derived: true,
          defaultText: 'temperatureCelsius',
        }),
        rangeCelsius: intervalField({
          doc: 'Temperature range the budget covers',
          unit: celsius,
          max: MAX_CELSIUS,
          allowEqual: true,
          derived: true,
          defaultText: '[temperatureCelsius, temperatureCelsius]',
        }),
      },
      { doc: 'Temperatures of the installation', presence: 'default' },
    ),
    tolerances: objectField(
      {
        completionOhmsFraction: relative('Completion resistors, relative'),
        ohmsPerLead: numberField({ doc: 'Lead resistance (absolute)', unit: ohms, min: 0, default: 0 }),
        excitationVoltsFraction: relative('Excitation EMF, relative (absolute reference only)'),
        gainFraction: relative('Amplifier gain, relative'),
        referenceVoltsFraction: relative('Converter reference, relative (absolute reference only)'),
        offsetVolts: numberField({
          doc: 'Input-referred offset left after zeroing',
          unit: volts,
          min: 0,
          default: 0,
        }),
        temperatureKelvin: numberField({
          doc: 'Sensor temperature used in corrections',
          unit: { dimension: 'temperature-difference' },
          min: 0,
          default: 0,
        }),
        coverageProbability: numberField({
          doc: 'Coverage probability of the expanded uncertainty',
          unit: fraction,
          min: 0.5,
          max: 0.9999,
          default: 0.95,
        }),
      },
      {
        doc: 'Tolerance half-widths (rectangular limits) for the budget',
        presence: 'default',
        renamed: renamedCommonFields.tolerances,
      },
    ),
    output: objectField(
      {
        quantity: choiceField(outputQuantities, { doc: 'Measured quantity' }),
        unit: outputUnitField(),
        range: intervalField({
          doc: 'Span of interest, in the output unit',
          unit: outputUnitRule,
          optional: true,
          defaultText: "the sensor's usual span, narrowed to what the channel can read",
        }),
        firmwareResolution: numberField({
          doc: 'Output LSB of fixed-point firmware constants, in the output unit',
          unit: outputUnitRule,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        modulusPascals: numberField({
          doc: "Young's modulus E of the specimen (stress, force, bending moment; shear modulus with poissonRatio)",
          unit: { dimension: 'pressure' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        shearModulusPascals: numberField({
          doc: 'Shear modulus G of the specimen (shear stress, torque); default E/(2(1 + ν))',
          unit: { dimension: 'pressure' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        areaSquareMeters: numberField({
          doc: 'Cross-section of an axial member (force)',
          unit: { dimension: 'area' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        sectionModulusCubicMeters: numberField({
          doc: 'Elastic section modulus W = I/c at the gauges (bending moment; force at a lever arm)',
          unit: { dimension: 'volume' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        leverArmMeters: numberField({
          doc: 'Distance from the line of the force to the gauged section (force from a bending bridge)',
          unit: meters,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        shaftDiameterMeters: numberField({
          doc: 'Outside diameter of the shaft at the gauges (torque)',
          unit: meters,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        shaftBoreMeters: numberField({
          doc: 'Bore of a hollow shaft (torque)',
          unit: meters,
          min: 0,
          optional: true,
          defaultText: '0 (solid)',
        }),
      },
      { doc: 'Measured quantity, its unit and span' },
    ),
    ...testDayFields(outputUnitRule),
  };
}

/** The fields of a channel besides `sensor`. */
export type CommonFields = ReturnType<typeof commonFields>;

/** A validated channel spec, seen without its sensor's own fields (what every kind may read). */
export type CommonSpec = ObjectOut<CommonFields> & { readonly sensor: { readonly kind: string } };
