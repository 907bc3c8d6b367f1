/**
 * Resolves a validated spec into the values the model needs: defaults that depend on other
 * fields (wiring, completion, temperatures, capacity unit), and the lead resistance of a cable.
 */
import type { LeadWiring } from '@bridgework/core';
import type { StrainArrangement } from '@bridgework/bridge';
import { wireOhms } from '@bridgework/compensation';
import type { ChannelSpec, OutputSpec, TolerancesSpec } from '../spec/ChannelSpec.js';
import type { ModelParameters } from './model.js';

/** A strain-gauge sensor with every default applied. */
export interface ResolvedStrainGauge {
  readonly kind: 'strain-gauge';
  readonly gaugeFactor: number;
  readonly gaugeOhms: number;
  readonly transverseSensitivity: number;
  readonly gaugeFactorTemperatureCoefficientPerKelvin: number;
  readonly gaugeFactorReferenceCelsius: number;
  readonly thermalOutput:
    | {
        readonly coefficientsMicrostrain: readonly number[];
        readonly gaugeFactor: number;
        readonly rangeCelsius: readonly [number, number];
      }
    | undefined;
}

/** A transducer with every default applied. */
export interface ResolvedTransducer {
  readonly kind: 'transducer';
  readonly capacity: number;
  readonly capacityUnit: 'newton' | 'kilogram-force' | 'kilogram';
  readonly ratedOutputVoltsPerVolt: number;
  readonly zeroBalanceVoltsPerVolt: number;
  readonly inputOhms: number;
  readonly outputOhms: number;
  readonly calibrationGravityMetersPerSecondSquared: number;
  readonly localGravityMetersPerSecondSquared: number;
  readonly zeroTemperatureCoefficientPerKelvin: number;
  readonly spanTemperatureCoefficientPerKelvin: number;
  readonly certificateCelsius: number;
}

/** An RTD with every default applied. */
export interface ResolvedRtd {
  readonly kind: 'rtd';
  readonly r0Ohms: number;
  readonly a: number;
  readonly b: number;
  readonly c: number;
  readonly toleranceClass: 'AA' | 'A' | 'B' | 'C' | undefined;
}

/** Everything the model and the budget need, with defaults resolved. */
export interface ResolvedChannel {
  readonly name: string;
  readonly sensor: ResolvedStrainGauge | ResolvedTransducer | ResolvedRtd;
  /** Arrangement of the bridge (RTD: quarter; transducer: its own full bridge, reported as 'full-bending'). */
  readonly arrangement: StrainArrangement;
  readonly poissonRatio: number | undefined;
  /** Nominal gauge factor: the setting the bridge map uses (strain gauges; 1 otherwise). */
  readonly nominalGaugeFactor: number;
  /** Lead wiring, or undefined when no lead resistance is modelled. */
  readonly wiring: LeadWiring | undefined;
  /** How the lead resistance was obtained. */
  readonly leadSource: 'none' | 'given' | 'cable';
  readonly sourceOhms: number;
  readonly remoteSense: boolean;
  readonly adc: {
    readonly bits: number;
    readonly referenceVolts: number;
    readonly bipolar: boolean;
    readonly ratiometric: boolean;
    readonly dataRateHertz: number;
    readonly filterOrder: number;
    readonly noiseRmsVolts: number | undefined;
  };
  readonly amplifier: Required<Omit<NonNullable<ChannelSpec['amplifier']>, 'limits'>> & {
    readonly limits: NonNullable<NonNullable<ChannelSpec['amplifier']>['limits']>;
  };
  readonly zeroCode: number | undefined;
  readonly polarity: 'normal' | 'inverted';
  readonly zeroTemperatureCelsius: number;
  readonly cableTemperatureCelsius: number;
  readonly rangeCelsius: readonly [number, number];
  readonly tolerances: Required<TolerancesSpec>;
  readonly output: OutputSpec;
  /** Conductors and length of the cable, when one was given (for the lead-temperature budget line). */
  readonly cable: NonNullable<NonNullable<ChannelSpec['bridge']>['cable']> | undefined;
  /** The nominal parameters of the model. */
  readonly nominal: ModelParameters;
}

/** Resistance of one lead of a cable at a temperature, Ω (compensation `wireOhms`, IEC 60028 copper). */
export function cableOhmsPerLead(
  cable: NonNullable<ResolvedChannel['cable']>,
  temperatureCelsius: number,
): number {
  return wireOhms({
    ...(cable.awg === undefined ? {} : { awg: cable.awg }),
    ...(cable.diameterMeters === undefined ? {} : { diameterMeters: cable.diameterMeters }),
    lengthMeters: cable.lengthMeters,
    temperatureCelsius,
    conductors: cable.conductorsPerLead ?? 1,
  });
}

/** Default lead wiring for an arrangement (see `BridgeSpec.wiring`). */
function defaultWiring(
  kind: string,
  arrangement: StrainArrangement,
  remoteSense: boolean | undefined,
): LeadWiring {
  if (kind === 'transducer' || arrangement.startsWith('full'))
    return remoteSense === true ? 'six-wire' : 'four-wire';
  return arrangement === 'half-opposite' ? 'two-wire' : 'three-wire';
}

/** Resolves a validated spec (schema defaults already applied). */
export function resolveChannel(spec: ChannelSpec): ResolvedChannel {
  const sensorSpec = spec.sensor;
  const bridge = spec.bridge ?? {};
  const environment = spec.environment ?? {};
  const temperatureCelsius = environment.temperatureCelsius ?? 20;
  const cableTemperatureCelsius = environment.cableTemperatureCelsius ?? temperatureCelsius;
  const kind = sensorSpec.kind;
  const arrangement: StrainArrangement =
    kind === 'strain-gauge' ? (bridge.arrangement ?? 'quarter') : kind === 'rtd' ? 'quarter' : 'full-bending';
  const wiringGiven = bridge.wiring ?? defaultWiring(kind, arrangement, spec.excitation.remoteSense);
  const remoteSense = spec.excitation.remoteSense ?? wiringGiven === 'six-wire';

  let ohmsPerLead = bridge.ohmsPerLead ?? 0;
  let leadSource: ResolvedChannel['leadSource'] = bridge.ohmsPerLead === undefined ? 'none' : 'given';
  if (bridge.cable !== undefined) {
    ohmsPerLead = cableOhmsPerLead(bridge.cable, cableTemperatureCelsius);
    leadSource = 'cable';
  }

  let sensor: ResolvedChannel['sensor'];
  let nominalGaugeFactor = 1;
  let nominalResistance: number;
  let ratedOutput = 0;
  if (sensorSpec.kind === 'strain-gauge') {
    const t = sensorSpec.thermalOutput;
    sensor = {
      kind: 'strain-gauge',
      gaugeFactor: sensorSpec.gaugeFactor,
      gaugeOhms: sensorSpec.gaugeOhms ?? 350,
      transverseSensitivity: sensorSpec.transverseSensitivity ?? 0,
      gaugeFactorTemperatureCoefficientPerKelvin: sensorSpec.gaugeFactorTemperatureCoefficientPerKelvin ?? 0,
      gaugeFactorReferenceCelsius: sensorSpec.gaugeFactorReferenceCelsius ?? 24,
      thermalOutput:
        t === undefined
          ? undefined
          : {
              coefficientsMicrostrain: t.coefficientsMicrostrain,
              gaugeFactor: t.gaugeFactor ?? 2,
              rangeCelsius: t.rangeCelsius,
            },
    };
    nominalGaugeFactor = sensor.gaugeFactor;
    nominalResistance = sensor.gaugeOhms;
  } else if (sensorSpec.kind === 'transducer') {
    sensor = {
      kind: 'transducer',
      capacity: sensorSpec.capacity,
      capacityUnit: sensorSpec.capacityUnit ?? (spec.output.quantity === 'mass' ? 'kilogram' : 'newton'),
      ratedOutputVoltsPerVolt: sensorSpec.ratedOutputVoltsPerVolt,
      zeroBalanceVoltsPerVolt: sensorSpec.zeroBalanceVoltsPerVolt ?? 0,
      inputOhms: sensorSpec.inputOhms ?? 350,
      outputOhms: sensorSpec.outputOhms ?? 350,
      calibrationGravityMetersPerSecondSquared:
        sensorSpec.calibrationGravityMetersPerSecondSquared ?? 9.80665,
      localGravityMetersPerSecondSquared: sensorSpec.localGravityMetersPerSecondSquared ?? 9.80665,
      zeroTemperatureCoefficientPerKelvin: sensorSpec.zeroTemperatureCoefficientPerKelvin ?? 0,
      spanTemperatureCoefficientPerKelvin: sensorSpec.spanTemperatureCoefficientPerKelvin ?? 0,
      certificateCelsius: sensorSpec.certificateCelsius ?? 23,
    };
    nominalResistance = sensor.outputOhms;
    ratedOutput = sensor.ratedOutputVoltsPerVolt;
  } else {
    sensor = {
      kind: 'rtd',
      r0Ohms: sensorSpec.r0Ohms ?? 100,
      a: sensorSpec.a ?? 3.9083e-3,
      b: sensorSpec.b ?? -5.775e-7,
      c: sensorSpec.c ?? -4.183e-12,
      toleranceClass: sensorSpec.toleranceClass,
    };
    nominalResistance = sensor.r0Ohms;
  }

  const adc = spec.adc;
  const amp = spec.amplifier ?? {};
  const tol = spec.tolerances ?? {};
  return {
    name: spec.name ?? 'channel',
    sensor,
    arrangement,
    poissonRatio: bridge.poissonRatio,
    nominalGaugeFactor,
    wiring: wiringGiven,
    leadSource,
    sourceOhms: spec.excitation.sourceOhms ?? 0,
    remoteSense,
    adc: {
      bits: adc.bits,
      referenceVolts: adc.referenceVolts,
      bipolar: adc.bipolar ?? true,
      ratiometric: adc.ratiometric ?? false,
      dataRateHertz: adc.dataRateHertz ?? 10,
      filterOrder: Number((adc.filter ?? 'sinc3').slice(4)),
      noiseRmsVolts: adc.noiseRmsVolts,
    },
    amplifier: {
      gain: amp.gain ?? 1,
      inputVoltageNoiseVoltsPerRootHz: amp.inputVoltageNoiseVoltsPerRootHz ?? 0,
      voltageCornerHertz: amp.voltageCornerHertz ?? 0,
      currentNoiseAmpsPerRootHz: amp.currentNoiseAmpsPerRootHz ?? 0,
      currentCornerHertz: amp.currentCornerHertz ?? 0,
      secondStageGain: amp.secondStageGain ?? 1,
      outputReferenceVolts: amp.outputReferenceVolts ?? 0,
      excitationLowVolts: amp.excitationLowVolts ?? 0,
      limits: amp.limits ?? {},
    },
    zeroCode: spec.zero?.code,
    polarity: spec.polarity ?? 'normal',
    zeroTemperatureCelsius: environment.zeroTemperatureCelsius ?? temperatureCelsius,
    cableTemperatureCelsius,
    rangeCelsius: environment.rangeCelsius ?? [temperatureCelsius, temperatureCelsius],
    tolerances: {
      gaugeFactor: tol.gaugeFactor ?? 0,
      ratedOutput: tol.ratedOutput ?? 0,
      completionOhms: tol.completionOhms ?? 0,
      ohmsPerLead: tol.ohmsPerLead ?? 0,
      excitationVolts: tol.excitationVolts ?? 0,
      gain: tol.gain ?? 0,
      referenceVolts: tol.referenceVolts ?? 0,
      offsetVolts: tol.offsetVolts ?? 0,
      temperatureCelsius: tol.temperatureCelsius ?? 0,
      coverageProbability: tol.coverageProbability ?? 0.95,
    },
    output: spec.output,
    cable: bridge.cable,
    nominal: {
      gaugeFactor: nominalGaugeFactor,
      completionOhms: bridge.completionOhms ?? nominalResistance,
      ohmsPerLead,
      excitationVolts: spec.excitation.volts,
      gain: amp.gain ?? 1,
      referenceVolts: adc.referenceVolts,
      offsetVolts: 0,
      temperatureCelsius,
      ratedOutputVoltsPerVolt: ratedOutput,
    },
  };
}
