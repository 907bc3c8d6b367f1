/**
 * The exact model of one channel at one parameter vector: the converter's coding (chain
 * `createAdc`), polarity and input-referred offset, then the sensor kind's exact map (composed
 * from the packages that own each stage), then the output unit. No stage's formula is written
 * here.
 */
import type { Interval } from '@bridgework/core';
import { createAdc, type Adc, type RatiometricAdc } from '@bridgework/chain';
import { Parameter, type KindMap } from '../kinds/SensorKind.js';
import { fromBaseUnit, toBaseUnit } from '../units/quantity.js';
import { calibratedKindMap } from './calibrationMap.js';
import type { ResolvedChannel } from './resolve.js';

/** The exact maps code ↔ bridge ratio ↔ value at one parameter vector. */
export interface ChannelModel {
  /** The converter (chain). */
  readonly adc: Adc;
  /** The kind's exact map. */
  readonly kindMap: KindMap;
  /** The bridge ratio of the zero reading, when the spec has one. */
  readonly zeroRatio: number | undefined;
  /** The bridge ratio for a (possibly fractional) code: affine, polarity and offset removed. */
  ratioFromCode(code: number): number;
  /** The code for a bridge ratio: nearest, ties to even, clipped; `clipped` flags a rail. */
  codeFromRatio(ratio: number): { readonly code: number; readonly clipped: boolean };
  /** The exact (fractional, unrounded) code for a bridge ratio: the inverse of `ratioFromCode`. */
  exactCodeFromRatio(ratio: number): number;
  /** The voltage at the amplifier's input for a bridge ratio (polarity and offset applied), V. */
  inputVoltsFromRatio(ratio: number): number;
  /** The channel's value (in its unit) for a bridge ratio; throws for a ratio the sensor cannot give. */
  valueFromRatio(ratio: number): number;
  /** The bridge ratio for a value (exact inverse). */
  ratioFromValue(value: number): number;
  /** Bridge ratios the sensor can produce (open interval). */
  readonly ratioRange: Interval;
  /** Whether the value is a linear-fractional function of the code. */
  readonly linearFractional: boolean;
}

/** Builds the exact model at the parameter vector `p`. */
export function createChannelModel(r: ResolvedChannel, p: Float64Array): ChannelModel {
  const spec = r.spec;
  const ratiometric = spec.adc.ratiometric;
  const excitationVolts = p[Parameter.excitationVolts] as number;
  const offsetVolts = p[Parameter.offsetVolts] as number;
  const adc = createAdc({
    bits: spec.adc.bits,
    referenceVolts: ratiometric ? excitationVolts : (p[Parameter.referenceVolts] as number),
    bipolar: spec.adc.bipolar,
    gain: p[Parameter.gain] as number,
    ratiometric,
  });
  const sign = r.sign;
  // The converter's own constants (chain: ratioFromCode is exactly code/countsPerRatio and
  // voltsFromCode exactly code·lsbVolts); used directly because averaged codes are fractional.
  const countsPerRatio = ratiometric ? (adc as RatiometricAdc).countsPerRatio : Number.NaN;
  const lsbVolts = adc.lsbVolts;
  const ratioFromCode = ratiometric
    ? (code: number) => sign * (code / countsPerRatio - offsetVolts / excitationVolts)
    : (code: number) => sign * ((code * lsbVolts - offsetVolts) / excitationVolts);
  const codeFromRatio = (ratio: number) => {
    const c = ratiometric
      ? (adc as RatiometricAdc).codeFromRatio(sign * ratio + offsetVolts / excitationVolts)
      : adc.codeFromVolts(sign * ratio * excitationVolts + offsetVolts);
    return { code: c.code, clipped: c.clipped || c.atRail };
  };
  // ratioFromCode is affine in the code, so two evaluations give its exact inverse.
  const ratioAtZeroCode = ratioFromCode(0);
  const ratioPerCode = ratioFromCode(1) - ratioAtZeroCode;
  const exactCodeFromRatio = (ratio: number) => (ratio - ratioAtZeroCode) / ratioPerCode;
  const zeroCode = spec.zero?.code;
  const zeroRatio = zeroCode === undefined ? undefined : ratioFromCode(zeroCode);
  const sensorMap = r.kind.exactMap(r.context as never, p, zeroRatio);
  // A calibration against reference loads replaces the sensor's ratio ↔ quantity map.
  const calibration = spec.calibration;
  const kindMap =
    calibration === undefined || r.calibrationSlot === undefined
      ? sensorMap
      : calibratedKindMap(sensorMap, calibration, r.dimension, zeroRatio, p[r.calibrationSlot] as number);
  const asRatio = spec.output.quantity === 'ratio';
  const unit = r.unit;
  const dimension = r.dimension;
  return {
    adc,
    kindMap,
    zeroRatio,
    ratioFromCode,
    codeFromRatio,
    exactCodeFromRatio,
    inputVoltsFromRatio: (ratio) => sign * ratio * excitationVolts + offsetVolts,
    valueFromRatio: asRatio
      ? (ratio) => fromBaseUnit(ratio, 'ratio', unit)
      : (ratio) => fromBaseUnit(kindMap.quantityFromRatio(ratio), dimension, unit),
    ratioFromValue: asRatio
      ? (value) => toBaseUnit(value, 'ratio', unit)
      : (value) => kindMap.ratioFromQuantity(toBaseUnit(value, dimension, unit)),
    ratioRange: kindMap.ratioRange,
    linearFractional: asRatio || kindMap.linearFractional,
  };
}
