/**
 * The exact physical model of one channel, composed from the packages that own each stage:
 * converter coding (chain), bridge network and leads (bridge), cable and temperature effects and
 * transverse sensitivity (compensation), certificate scaling (calibration), RTD curve
 * (compensation), member conversion (mechanics). No stage's formula is written here.
 *
 * The model is built from a resolved spec plus a set of numeric parameters, so the budget can
 * rebuild it with perturbed parameters (gauge factor, gain, lead resistance, temperature...).
 */
import { BridgeworkError, formatValue, microstrainFromStrain, strainFromMicrostrain } from '@bridgework/core';
import { createStrainBridge, type StrainBridge } from '@bridgework/bridge';
import { createAdc, type Adc, type RatiometricAdc } from '@bridgework/chain';
import {
  correctTemperatureEffects,
  createRtd,
  createThermalOutput,
  indicatedStrainWithTemperatureEffects,
  indicatedTransverseStrain,
  leadDesensitization,
  type Rtd,
  type ThermalOutput,
} from '@bridgework/compensation';
import { createCertificateScale, type CertificateScale } from '@bridgework/calibration';
import { createAxialMember } from '@bridgework/mechanics';
import type { ResolvedChannel } from './resolve.js';

/** The numeric inputs of the model: nominal values, or perturbed ones in the budget. */
export interface ModelParameters {
  /** Gauge factor (strain gauges), at its reference temperature. */
  readonly gaugeFactor: number;
  /** Completion resistance, Ω. */
  readonly completionOhms: number;
  /** Resistance of one lead, Ω. */
  readonly ohmsPerLead: number;
  /** Excitation EMF, V. */
  readonly excitationVolts: number;
  /** Total gain. */
  readonly gain: number;
  /** Converter reference, V. */
  readonly referenceVolts: number;
  /** Input-referred offset remaining after zeroing, V (0 nominal). */
  readonly offsetVolts: number;
  /** Gauge temperature during the measurement, °C. */
  readonly temperatureCelsius: number;
  /** Transducer rated output, V/V. */
  readonly ratedOutputVoltsPerVolt: number;
}

/** The model: exact maps code ↔ ratio ↔ quantity. */
export interface ChannelModel {
  readonly adc: Adc;
  /** The bridge used for strain gauges and RTDs (undefined for transducers). */
  readonly bridge: StrainBridge | undefined;
  /** Measured ratio for a code (affine, exact coding), V/V, polarity applied. */
  ratioFromCode(code: number): number;
  /** Code for a ratio: nearest code, ties to even, clipped; `clipped` flags a rail. */
  codeFromRatio(ratio: number): { readonly code: number; readonly clipped: boolean };
  /** The exact (fractional, unrounded, unclipped) code of a ratio: the inverse of `ratioFromCode`. */
  exactCodeFromRatio(ratio: number): number;
  /** Quantity for a measured ratio (exact; throws for an impossible ratio). */
  quantityFromRatio(ratio: number): number;
  /** Measured ratio for a quantity (exact inverse). */
  ratioFromQuantity(quantity: number): number;
  /** Ratios the sensor can produce, open interval (measured ratio, polarity applied). */
  readonly ratioRange: { readonly min: number; readonly max: number };
  /** Whether quantity(ratio) is linear-fractional, so a code → quantity kernel is one division. */
  readonly linearFractional: boolean;
}

const celsiusOf = (r: ResolvedChannel, p: ModelParameters) => ({
  zero: r.zeroTemperatureCelsius,
  now: p.temperatureCelsius,
});

/** Builds the exact model for the resolved channel and the given parameter values. */
export function createModel(r: ResolvedChannel, p: ModelParameters): ChannelModel {
  const adc = createAdc({
    bits: r.adc.bits,
    referenceVolts: r.adc.ratiometric ? p.excitationVolts : p.referenceVolts,
    bipolar: r.adc.bipolar,
    gain: p.gain,
    ratiometric: r.adc.ratiometric,
  });
  const sign = r.polarity === 'inverted' ? -1 : 1;
  // Ratio relative to the excitation reference: ratiometric converters measure it directly; an
  // absolute reference gives volts, divided by the EMF. The offset is input-referred.
  // The converter's own constants (chain: ratioFromCode is exactly code/countsPerRatio and
  // voltsFromCode exactly code·lsbVolts); used directly because averaged codes are fractional.
  const countsPerRatio = r.adc.ratiometric ? (adc as RatiometricAdc).countsPerRatio : Number.NaN;
  const lsbVolts = adc.lsbVolts;
  const ratioFromCode = r.adc.ratiometric
    ? (code: number) => sign * (code / countsPerRatio - p.offsetVolts / p.excitationVolts)
    : (code: number) => sign * ((code * lsbVolts - p.offsetVolts) / p.excitationVolts);
  const codeFromRatio = (ratio: number) => {
    const c = r.adc.ratiometric
      ? (adc as RatiometricAdc).codeFromRatio(sign * ratio + p.offsetVolts / p.excitationVolts)
      : adc.codeFromVolts(sign * ratio * p.excitationVolts + p.offsetVolts);
    return { code: c.code, clipped: c.clipped || c.atRail };
  };
  // ratioFromCode is affine in the code, so two evaluations give its exact inverse.
  const ratioAtZeroCode = ratioFromCode(0);
  const ratioPerCode = ratioFromCode(1) - ratioAtZeroCode;
  const exactCodeFromRatio = (ratio: number) => (ratio - ratioAtZeroCode) / ratioPerCode;
  // With a ratiometric converter the reference is the excitation at the instrument terminals (or
  // at the bridge with remote sense), so the source resistance drops out of the ratio.
  const sourceOhms = r.adc.ratiometric ? 0 : r.sourceOhms;

  if (r.sensor.kind === 'transducer') {
    const s = r.sensor;
    // Excitation-lead (and source) drop of a four-wire connection: span factor Rin/(Rin + Rser).
    const span =
      r.wiring === 'six-wire'
        ? 1
        : leadDesensitization({
            wiring: 'four-wire',
            inputOhms: s.inputOhms,
            ohmsPerLead: p.ohmsPerLead + sourceOhms / 2,
          });
    // Data-sheet temperature effects: the zero moves by TK0·RO·(T − T_zero) since zeroing, the
    // rated output scales by 1 + TKC·(T − T_certificate).
    const t = celsiusOf(r, p);
    const zeroDrift = s.zeroTemperatureCoefficientPerKelvin * p.ratedOutputVoltsPerVolt * (t.now - t.zero);
    const ratedOutput =
      p.ratedOutputVoltsPerVolt *
      (1 + s.spanTemperatureCoefficientPerKelvin * (t.now - s.certificateCelsius));
    const scaleFor = (zeroVoltsPerVolt: number): CertificateScale =>
      createCertificateScale({
        capacity: s.capacity,
        capacityUnit: s.capacityUnit,
        ratedOutputVoltsPerVolt: ratedOutput,
        zeroVoltsPerVolt,
        outputUnit: r.output.quantity === 'mass' ? 'kilogram' : 'newton',
        calibrationGravityMetersPerSecondSquared: s.calibrationGravityMetersPerSecondSquared,
        localGravityMetersPerSecondSquared: s.localGravityMetersPerSecondSquared,
      });
    const zero =
      (r.zeroCode === undefined ? s.zeroBalanceVoltsPerVolt : ratioFromCode(r.zeroCode) / span) + zeroDrift;
    const scale = scaleFor(zero);
    const asQuantity = r.output.quantity !== 'ratio';
    return {
      adc,
      bridge: undefined,
      ratioFromCode,
      codeFromRatio,
      exactCodeFromRatio,
      quantityFromRatio: (ratio) => (asQuantity ? scale.loadFromRatio(ratio / span) : ratio),
      ratioFromQuantity: (q) => (asQuantity ? scale.ratioFromLoad(q) * span : q),
      ratioRange: { min: -span, max: span },
      linearFractional: true,
    };
  }

  const leads = r.wiring === undefined ? undefined : { ohmsPerLead: p.ohmsPerLead, wiring: r.wiring };

  if (r.sensor.kind === 'rtd') {
    const s = r.sensor;
    const rtd: Rtd = createRtd({ r0Ohms: s.r0Ohms, a: s.a, b: s.b, c: s.c });
    // The RTD's relative resistance change x = (R − R0)/R0 enters arm 1 exactly as a gauge's
    // GF·ε does: a quarter bridge with gauge factor 1 and "gauge" resistance R0 solves it.
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 1,
      gaugeOhms: s.r0Ohms,
      completionOhms: p.completionOhms,
      sourceOhms,
      ...(leads === undefined ? {} : { leads }),
    });
    const asTemperature = r.output.quantity === 'temperature';
    return {
      adc,
      bridge,
      ratioFromCode,
      codeFromRatio,
      exactCodeFromRatio,
      quantityFromRatio: (ratio) =>
        asTemperature ? rtd.temperatureAt(s.r0Ohms * (1 + bridge.strainFromRatio(ratio))) : ratio,
      ratioFromQuantity: (q) => (asTemperature ? bridge.ratioFromStrain(rtd.ohmsAt(q) / s.r0Ohms - 1) : q),
      // The sensor's range is the curve's (−200…850 °C for IEC 60751), inside the bridge's.
      ratioRange: {
        min: bridge.ratioFromStrain(rtd.rangeOhms[0] / s.r0Ohms - 1),
        max: bridge.ratioFromStrain(rtd.rangeOhms[1] / s.r0Ohms - 1),
      },
      linearFractional: !asTemperature,
    };
  }

  // Strain gauges.
  const s = r.sensor;
  const bridge = createStrainBridge({
    arrangement: r.arrangement,
    gaugeFactor: r.nominalGaugeFactor,
    gaugeOhms: s.gaugeOhms,
    completionOhms: p.completionOhms,
    sourceOhms,
    ...(r.poissonRatio === undefined ? {} : { poissonRatio: r.poissonRatio }),
    ...(leads === undefined ? {} : { leads }),
  });
  const thermalOutput: ThermalOutput | undefined =
    s.thermalOutput === undefined ? undefined : createThermalOutput(s.thermalOutput);
  const t = celsiusOf(r, p);
  const temperature = {
    gaugeFactorSetting: r.nominalGaugeFactor,
    zeroCelsius: t.zero,
    temperatureCelsius: t.now,
    ...(thermalOutput === undefined ? {} : { thermalOutput }),
    gaugeFactor: p.gaugeFactor,
    gaugeFactorTemperatureCoefficientPerKelvin: s.gaugeFactorTemperatureCoefficientPerKelvin,
    gaugeFactorReferenceCelsius: s.gaugeFactorReferenceCelsius,
  };
  // Transverse sensitivity in a uniaxial stress field: the gauge reads ε·s with
  // s = indicated(axial 1, transverse −ν), so the true strain is the reading divided by s.
  const transverseScale =
    s.transverseSensitivity === 0
      ? 1
      : indicatedTransverseStrain({
          axialStrain: 1,
          transverseStrain: -(r.poissonRatio as number),
          transverseSensitivity: s.transverseSensitivity,
        });
  const zeroRatio = r.zeroCode === undefined ? undefined : ratioFromCode(r.zeroCode);
  const zeroOption = zeroRatio === undefined ? {} : { zeroRatio };
  const member =
    r.output.quantity === 'force'
      ? createAxialMember({
          modulusPascals: r.output.modulusPascals as number,
          areaSquareMeters: r.output.areaSquareMeters as number,
        })
      : undefined;

  const quantityFromStrain = (strain: number): number => {
    switch (r.output.quantity) {
      case 'microstrain':
        return microstrainFromStrain(strain);
      case 'stress':
        return (r.output.modulusPascals as number) * strain; // uniaxial Hooke's law
      case 'force':
        return (member as NonNullable<typeof member>).forceFromStrain(strain);
      default:
        return strain;
    }
  };
  const strainFromQuantity = (q: number): number => {
    switch (r.output.quantity) {
      case 'microstrain':
        return strainFromMicrostrain(q);
      case 'stress':
        return q / (r.output.modulusPascals as number);
      case 'force':
        return (member as NonNullable<typeof member>).strainFromForce(q);
      default:
        return q;
    }
  };
  const asRatio = r.output.quantity === 'ratio';
  return {
    adc,
    bridge,
    ratioFromCode,
    codeFromRatio,
    exactCodeFromRatio,
    quantityFromRatio(ratio) {
      if (asRatio) return ratio;
      const indicated = bridge.strainFromRatio(ratio, zeroOption);
      const strain =
        correctTemperatureEffects({ ...temperature, indicatedStrain: indicated }) / transverseScale;
      return quantityFromStrain(strain);
    },
    ratioFromQuantity(q) {
      if (asRatio) return q;
      const strain = strainFromQuantity(q) * transverseScale;
      const indicated = indicatedStrainWithTemperatureEffects({ ...temperature, strain });
      return bridge.ratioFromStrain(indicated, zeroOption);
    },
    ratioRange: bridge.ratioRange,
    linearFractional: asRatio || bridge.linearFractional !== undefined,
  };
}

/** Throws the channel's error for a code that cannot be converted. */
export function rejectCode(code: number, adc: Adc, lo: number, hi: number): never {
  if (code <= adc.codeMin || code >= adc.codeMax) {
    throw new BridgeworkError(
      'clipped',
      `\`code\` must lie strictly inside the converter's rails (${adc.codeMin}, ${adc.codeMax}); got ${formatValue(code)}`,
      {
        param: 'code',
        value: code,
        limit: [adc.codeMin, adc.codeMax],
      },
    );
  }
  throw new BridgeworkError(
    'ratio-out-of-range',
    `\`code\` must be in (${lo}, ${hi}) for a ratio the sensor can produce; got ${formatValue(code)}`,
    {
      param: 'code',
      value: code,
      limit: [lo, hi],
    },
  );
}
