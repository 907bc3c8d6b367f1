/**
 * From a validated spec (every default applied, derived ones too) to what the models need: the
 * kind module, the kind's context, the nominal parameter vector, and the lead resistance of a
 * cable (compensation `wireOhms`, IEC 60028 copper).
 */
import { wireOhms } from '@bridgework/compensation';
import type { KindContext, SensorKind } from '../kinds/SensorKind.js';
import { KIND_PARAMETERS_START, Parameter } from '../kinds/SensorKind.js';
import { outputQuantityTable } from '../outputQuantities.js';
import type { ChannelRules } from '../spec/channelSchema.js';
import type { CommonSpec } from '../spec/commonSpec.js';
import type { Dimension } from '../units/unitTable.js';

/** A validated spec, as the internals read it. */
export type AnySpec = CommonSpec & {
  readonly sensor: Readonly<Record<string, unknown>> & { readonly kind: string };
};

/** Everything the models and the budget need, resolved once. */
export interface ResolvedChannel {
  /** The validated spec. */
  readonly spec: AnySpec;
  /** The channel's name. */
  readonly name: string;
  /** The sensor kind's module. */
  readonly kind: SensorKind;
  /** The kind's context (nominal parameters included). */
  readonly context: KindContext;
  /** +1, or −1 for inverted polarity. */
  readonly sign: 1 | -1;
  /** The dimension of the output quantity. */
  readonly dimension: Dimension;
  /** The unit of the channel's values. */
  readonly unit: string;
  /** Where the lead resistance comes from. */
  readonly leadSource: 'none' | 'given' | 'cable';
  /** Names of the kind's own parameters, in vector order. */
  readonly kindParameters: readonly string[];
  /**
   * With a calibration against reference loads: the slot of the parameter vector that holds an
   * offset of the calibration's curve in bridge ratio (nominal 0; the budget varies it by the
   * fit's standard uncertainty at the budget point).
   */
  readonly calibrationSlot: number | undefined;
}

/** Resistance of one lead of a cable at a temperature, Ω (compensation `wireOhms`, IEC 60028 copper). */
export function cableOhmsPerLead(
  cable: NonNullable<CommonSpec['bridge']['cable']>,
  temperatureCelsius: number,
): number {
  return wireOhms({
    ...(cable.awg === undefined ? {} : { awg: cable.awg }),
    ...(cable.diameterMeters === undefined ? {} : { diameterMeters: cable.diameterMeters }),
    lengthMeters: cable.lengthMeters,
    temperatureCelsius,
    conductors: cable.conductorsPerLead,
  });
}

/** Resolves a validated spec. */
export function resolveChannel(spec: AnySpec, rules: ChannelRules): ResolvedChannel {
  const kind = rules.kinds.get(spec.sensor.kind) as SensorKind;
  const b = spec.bridge;
  const env = spec.environment;
  let ohmsPerLead = b.ohmsPerLead ?? 0;
  let leadSource: ResolvedChannel['leadSource'] = b.ohmsPerLead === undefined ? 'none' : 'given';
  if (b.cable !== undefined) {
    ohmsPerLead = cableOhmsPerLead(b.cable, env.cableTemperatureCelsius);
    leadSource = 'cable';
  }
  const kindParameters = kind.parameters(spec.sensor as never);
  const calibrated = spec.calibration !== undefined && spec.output.quantity !== 'ratio';
  const calibrationSlot = calibrated ? KIND_PARAMETERS_START + kindParameters.length : undefined;
  const nominal = new Float64Array(KIND_PARAMETERS_START + kindParameters.length + (calibrated ? 1 : 0));
  nominal[Parameter.excitationVolts] = spec.excitation.volts;
  // A shunt calibration's span factor k: the channel reads k·(code − zero-input code), the same as
  // converting with the gain the shunt measured, amplifier.gain / k.
  nominal[Parameter.gain] = spec.amplifier.gain / (spec.spanCorrection?.factor ?? 1);
  nominal[Parameter.referenceVolts] = spec.adc.referenceVolts;
  nominal[Parameter.offsetVolts] = 0;
  nominal[Parameter.completionOhms] = b.completionOhms ?? 0;
  nominal[Parameter.ohmsPerLead] = ohmsPerLead;
  nominal[Parameter.temperatureCelsius] = env.temperatureCelsius;
  kindParameters.forEach((x, i) => (nominal[KIND_PARAMETERS_START + i] = x.nominal));
  const arrangement = kind.placement === 'own-bridge' ? undefined : (b.arrangement ?? 'quarter');
  const context: KindContext = {
    sensor: spec.sensor,
    spec,
    arrangement,
    arms: arrangement === undefined ? [] : (rules.arrangements[arrangement]?.arms ?? []),
    poissonRatio: b.poissonRatio,
    wiring: b.wiring,
    // With a ratiometric converter the reference is the excitation at the instrument terminals
    // (or at the bridge with remote sense), so the source resistance drops out of the ratio; the
    // schema refuses one without remote sense (it would lower the bridge voltage, which the
    // budget takes as excitation.volts), so it is 0 here unless remote sense regulates it out.
    sourceOhms: spec.adc.ratiometric ? 0 : spec.excitation.sourceOhms,
    zeroTemperatureCelsius: env.zeroTemperatureCelsius,
    quantity: spec.output.quantity,
    nominal,
  };
  return {
    spec,
    name: spec.name,
    kind,
    context,
    sign: spec.polarity === 'inverted' ? -1 : 1,
    dimension: outputQuantityTable[spec.output.quantity].dimension,
    unit: spec.output.unit,
    leadSource,
    kindParameters: kindParameters.map((x) => x.key),
    calibrationSlot,
  };
}

/** Copper drift of one lead over the cable's temperature range, Ω (0 without a cable). */
export function leadDriftOhms(r: ResolvedChannel): number {
  const cable = r.spec.bridge.cable;
  if (cable === undefined) return 0;
  const nominal = r.context.nominal[Parameter.ohmsPerLead] as number;
  const range = r.spec.environment.rangeCelsius;
  return Math.max(
    Math.abs(cableOhmsPerLead(cable, range.min) - nominal),
    Math.abs(cableOhmsPerLead(cable, range.max) - nominal),
  );
}
