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
    derived: true,
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

const relative = () => numberField({ unit: fraction, min: 0, max: 1, maxExclusive: true, default: 0 });

/** The fields of a channel besides `sensor`, for the given strain arrangements (the bridge package's table). */
export function commonFields<const A extends string>(arrangements: readonly A[]) {
  return {
    name: textField({ default: 'channel', maxLength: 100 }),
    bridge: objectField(
      {
        arrangement: choiceField(arrangements, {
          optional: true,
        }),
        poissonRatio: numberField({
          min: -1,
          minExclusive: true,
          max: 0.5,
          optional: true,
        }),
        completionOhms: numberField({
          unit: ohms,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        wiring: choiceField(leadWirings, {
          derived: true,
        }),
        ohmsPerLead: numberField({
          unit: ohms,
          min: 0,
          optional: true,
        }),
        cable: objectField(
          {
            awg: numberField({
              integer: true,
              min: -3,
              max: 56,
              optional: true,
            }),
            diameterMeters: numberField({
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
              integer: true,
              min: 1,
              max: 100,
              default: 1,
            }),
          },
          {
            presence: 'optional',
          },
        ),
      },
      { presence: 'default' },
    ),
    excitation: objectField(
      {
        volts: numberField({ doc: 'Source EMF', unit: volts, min: 0, minExclusive: true }),
        sourceOhms: numberField({
          unit: ohms,
          min: 0,
          max: 1e12,
          default: 0,
        }),
        remoteSense: booleanField({
          derived: true,
        }),
      },
      { doc: 'Excitation source' },
    ),
    amplifier: objectField(
      {
        gain: numberField({
          min: 0,
          minExclusive: true,
          default: 1,
        }),
        inputVoltageNoiseVoltsPerRootHz: numberField({
          unit: { dimension: 'voltage-density' },
          min: 0,
          default: 0,
        }),
        voltageCornerHertz: numberField({
          unit: hertz,
          min: 0,
          default: 0,
        }),
        currentNoiseAmpsPerRootHz: numberField({
          unit: { dimension: 'current-density' },
          min: 0,
          default: 0,
        }),
        currentCornerHertz: numberField({
          unit: hertz,
          min: 0,
          default: 0,
        }),
        secondStageGain: numberField({
          min: 0,
          minExclusive: true,
          default: 1,
        }),
        outputReferenceVolts: numberField({ unit: volts, default: 0 }),
        excitationLowVolts: numberField({
          unit: volts,
          default: 0,
        }),
        limits: objectField(
          {
            inputCommonModeVolts: intervalField({
              unit: volts,
              optional: true,
            }),
            inputDifferentialVolts: numberField({
              unit: volts,
              min: 0,
              minExclusive: true,
              optional: true,
            }),
            firstStageVolts: intervalField({ unit: volts, optional: true }),
            outputVolts: intervalField({ unit: volts, optional: true }),
          },
          { presence: 'optional' },
        ),
      },
      { presence: 'default' },
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
        bipolar: booleanField({ default: true }),
        ratiometric: booleanField({ default: false }),
        filter: objectField(
          {
            kind: choiceField(['sinc'] as const, {
              default: 'sinc',
            }),
            order: numberField({
              integer: true,
              min: 1,
              max: 5,
              default: 3,
            }),
            dataRateHertz: numberField({
              unit: hertz,
              min: 1e-9,
              max: 1e12,
              default: 10,
            }),
          },
          { presence: 'default' },
        ),
        noiseRmsVolts: numberField({
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
      { presence: 'optional' },
    ),
    polarity: choiceField(['normal', 'inverted'] as const, {
      default: 'normal',
    }),
    environment: objectField(
      {
        temperatureCelsius: numberField({
          unit: celsius,
          max: MAX_CELSIUS,
          default: 20,
        }),
        zeroTemperatureCelsius: numberField({
          unit: celsius,
          max: MAX_CELSIUS,
          derived: true,
        }),
        cableTemperatureCelsius: numberField({
          unit: celsius,
          min: -100,
          max: 300,
          derived: true,
        }),
        rangeCelsius: intervalField({
          unit: celsius,
          max: MAX_CELSIUS,
          allowEqual: true,
          derived: true,
        }),
      },
      { presence: 'default' },
    ),
    tolerances: objectField(
      {
        completionOhmsFraction: relative(),
        ohmsPerLead: numberField({ unit: ohms, min: 0, default: 0 }),
        excitationVoltsFraction: relative(),
        gainFraction: relative(),
        referenceVoltsFraction: relative(),
        offsetVolts: numberField({
          unit: volts,
          min: 0,
          default: 0,
        }),
        temperatureKelvin: numberField({
          unit: { dimension: 'temperature-difference' },
          min: 0,
          default: 0,
        }),
        coverageProbability: numberField({
          unit: fraction,
          min: 0.5,
          max: 0.9999,
          default: 0.95,
        }),
      },
      {
        presence: 'default',
        renamed: renamedCommonFields.tolerances,
      },
    ),
    output: objectField(
      {
        quantity: choiceField(outputQuantities, { doc: 'Measured quantity' }),
        unit: outputUnitField(),
        range: intervalField({
          unit: outputUnitRule,
          optional: true,
        }),
        firmwareResolution: numberField({
          unit: outputUnitRule,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        modulusPascals: numberField({
          unit: { dimension: 'pressure' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        shearModulusPascals: numberField({
          unit: { dimension: 'pressure' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        areaSquareMeters: numberField({
          unit: { dimension: 'area' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        sectionModulusCubicMeters: numberField({
          unit: { dimension: 'volume' },
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        leverArmMeters: numberField({
          unit: meters,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        shaftDiameterMeters: numberField({
          unit: meters,
          min: 0,
          minExclusive: true,
          optional: true,
        }),
        shaftBoreMeters: numberField({
          unit: meters,
          min: 0,
          optional: true,
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
