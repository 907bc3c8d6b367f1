/**
 * The hopper-scale scenario (invented): the constants of examples/hopper-scale.ts, shared with the
 * tests that build and run the C program examples/hopper-scale/hopper-scale.c.
 *
 * A feed-mill batching hopper hangs on three 1 t shear-beam load cells wired in parallel through a
 * summing box: 3000 kg capacity, combined rated output 2.0013 mV/V (from the cells' certificates).
 * The weighing front end is a 24-bit bipolar converter, ratiometric (its reference is the
 * excitation), behind a gain of 128. The dead load of the empty hopper reads 8421.37 codes (the
 * mean of a commissioning run). Firmware shows the net weight in 0.01 kg.
 */
import { Decimal } from 'decimal.js';
import { fixedPointMap, floatMap, type FixedPointMap, type FloatMap } from '@bridgework/firmware';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });

export const capacityKg = '3000';
export const ratedOutputMillivoltsPerVolt = '2.0013';
export const gain = 128;
export const converterBits = 24;
export const deadLoadCode = '8421.37';
export const displayStepKg = '0.01';

/** Codes per V/V of bridge output: gain · 2^(bits − 1) for a bipolar ratiometric converter. */
export const codesPerRatio = gain * 2 ** (converterBits - 1); // 2^30
/** Codes at full load, exactly (decimal arithmetic on exact inputs): 0.0020013 · 2^30. */
export const fullScaleCodes = new D(ratedOutputMillivoltsPerVolt).div(1000).times(codesPerRatio).toString();
/** kg per code, as an exact ratio. */
export const scaleKgPerCode = `${capacityKg}/${fullScaleCodes}`;

/** The code at full load, to the nearest code: 8421.37 + 2148879.5123712 = 2157300.88 → 2157301. */
export const fullLoadCode = new D(deadLoadCode).plus(fullScaleCodes).toDecimalPlaces(0).toNumber();

export const codeRange = { codeMin: -(2 ** (converterBits - 1)), codeMax: 2 ** (converterBits - 1) - 1 };

/** The net-weight channel's maps (a `FirmwareChannel` for the emitters). */
export interface HopperChannel {
  readonly name: string;
  readonly fixed: FixedPointMap;
  readonly float32: FloatMap;
}

/** The net-weight channel: int32 output in 0.01 kg, and a float32 version for comparison. */
export function hopperChannel(): HopperChannel {
  const common = { scale: scaleKgPerCode, offset: deadLoadCode, ...codeRange, quantityUnit: 'kg' };
  return {
    name: 'Net weight',
    fixed: fixedPointMap({ ...common, outputUnit: displayStepKg }),
    float32: floatMap({ kind: 'affine', ...common, precision: 'float32' }),
  };
}
