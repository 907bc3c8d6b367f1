/**
 * A channel's shunt calibration, exact through the network: the bridge ratios without and with a
 * shunt come from the calibration package's solvers (`shuntRatios` for a strain-gauge bridge with
 * its leads and placement, `ratioChangeFromShunt` for a transducer's full bridge), and the channel
 * turns them into converter codes and into the quantity it would indicate.
 */
import {
  nearestPreferredValue,
  ratioChangeFromShunt,
  shuntRatios,
  type BridgeArm,
  type PreferredSeries,
  type ShuntPlacement,
} from '@bridgework/calibration';
import { createChannel, type Channel, type ChannelSpec, type ValidChannelSpec } from '@bridgework/channel';
import { wireOhms } from '@bridgework/compensation';
import { BridgeworkError, formatValue, isBridgeworkError, type LeadWiring } from '@bridgework/core';
import { codeRatioMap } from './codeRatioMap.js';

/** Where the shunt goes. */
export interface ShuntPosition {
  /** The bridge arm (ring numbering of docs/conventions.md). */
  readonly arm: BridgeArm;
  /** Across the gauge, or at the instrument end of the cable (strain-gauge bridges only). */
  readonly placement: ShuntPlacement;
}

/** What a shunt does to a channel. */
export interface ShuntStep {
  /** The shunt, Ω. */
  readonly shuntOhms: number;
  /** Bridge ratio without the shunt, V/V. */
  readonly zeroRatio: number;
  /** Bridge ratio with the shunt, V/V. */
  readonly shuntedRatio: number;
  /** Converter code without the shunt (exact, fractional). */
  readonly zeroCode: number;
  /** The step in codes: with minus without. */
  readonly stepCodes: number;
  /** The change of the quantity the channel indicates, in the channel's unit. */
  readonly indicated: number;
}

/** The shunt model of one channel (see {@link channelShunt}). */
export interface ChannelShunt {
  /** The channel without a span correction (the model the expected step comes from). */
  readonly model: Channel;
  /** Codes per unit of bridge ratio (the converter's affine map; polarity and gain included). */
  readonly codesPerRatio: number;
  /** The step a shunt gives. */
  step(shuntOhms: number): ShuntStep;
}

/** The lead resistance the channel uses, Ω (compensation `wireOhms` for a cable, as the channel does). */
function ohmsPerLeadOf(spec: ValidChannelSpec): number {
  const cable = spec.bridge.cable;
  if (cable === undefined) return spec.bridge.ohmsPerLead ?? 0;
  return wireOhms({
    ...(cable.awg === undefined ? {} : { awg: cable.awg }),
    ...(cable.diameterMeters === undefined ? {} : { diameterMeters: cable.diameterMeters }),
    lengthMeters: cable.lengthMeters,
    temperatureCelsius: spec.environment.cableTemperatureCelsius,
    conductors: cable.conductorsPerLead,
  });
}

/**
 * The shunt model of a channel: strain-gauge and transducer channels (an RTD or thermistor
 * channel is refused: a shunt there simulates a temperature, which their calibration does not use).
 *
 * @param channel - The channel as loaded (its span correction, if any, is left out of the model).
 * @param position - Arm and placement.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a sensor kind without shunt
 *   calibration, or placement at the instrument for a transducer.
 */
export function channelShunt(channel: Channel, position: ShuntPosition): ChannelShunt {
  const spec = channel.spec;
  const { spanCorrection: _ignored, ...rest } = spec as ValidChannelSpec & { spanCorrection?: unknown };
  const model = spec.spanCorrection === undefined ? channel : createChannel(rest as ChannelSpec);
  const { codesPerRatio, codeOf } = codeRatioMap(model);
  const sourceOhms = spec.adc.ratiometric ? 0 : spec.excitation.sourceOhms;
  const wiring = spec.bridge.wiring as LeadWiring;
  const ohmsPerLead = ohmsPerLeadOf(spec);
  let ratios: (shuntOhms: number) => { zeroRatio: number; shuntedRatio: number };
  const sensor = spec.sensor as unknown as Record<string, unknown> & { kind: string };
  if (sensor.kind === 'strain-gauge') {
    ratios = (shuntOhms) =>
      shuntRatios({
        gaugeOhms: sensor['gaugeOhms'] as number,
        gaugeFactor: sensor['gaugeFactor'] as number,
        arm: position.arm,
        arrangement: (spec.bridge.arrangement ?? 'quarter') as never,
        completionOhms: spec.bridge.completionOhms as number,
        ...(spec.bridge.poissonRatio === undefined ? {} : { poissonRatio: spec.bridge.poissonRatio }),
        leads: { ohmsPerLead, wiring },
        sourceOhms,
        placement: position.placement,
        shuntOhms,
      });
  } else if (sensor.kind === 'transducer') {
    if (position.placement !== 'gauge') {
      throw new BridgeworkError(
        'invalid-option',
        `--placement instrument applies to strain-gauge bridges; channel '${channel.name}' is a transducer, whose shunt is across an arm inside it`,
        { param: 'placement', value: position.placement },
      );
    }
    const zero = model.inputAt(0).bridgeRatio;
    const r = sensor['outputOhms'] as number;
    ratios = (shuntOhms) => ({
      zeroRatio: zero,
      shuntedRatio:
        zero +
        ratioChangeFromShunt({
          bridgeOhms: r,
          arm: position.arm,
          leads: { ohmsPerLead, wiring },
          sourceOhms,
          shuntOhms,
        }),
    });
  } else {
    throw new BridgeworkError(
      'invalid-option',
      `channel '${channel.name}' has a '${sensor.kind}' sensor: shunt calibration applies to strain-gauge and transducer channels`,
      { param: 'channel', value: channel.name },
    );
  }
  return {
    model,
    codesPerRatio,
    step(shuntOhms) {
      const { zeroRatio, shuntedRatio } = ratios(shuntOhms);
      const zeroCode = codeOf(zeroRatio);
      const shuntedCode = codeOf(shuntedRatio);
      const indicated = model.quantityFromCode(shuntedCode) - model.quantityFromCode(zeroCode);
      return { shuntOhms, zeroRatio, shuntedRatio, zeroCode, stepCodes: shuntedCode - zeroCode, indicated };
    },
  };
}

/**
 * The shunt whose step the channel indicates as `target` (in the channel's unit): the inverse of
 * {@link ChannelShunt.step}, by bisection on log(Rs) (the step shrinks as Rs grows) to 1e-15 of
 * Rs, then checked: the step it gives must match the target within 1e-9 relative.
 *
 * @param shunt - The channel's shunt model.
 * @param target - The quantity to simulate, channel unit (non-zero, of the sign the arm gives).
 * @param describe - Formats a quantity for messages.
 * @returns The shunt's step (its `shuntOhms` is the exact shunt).
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (param `simulate`) for a target of
 *   the other sign or larger than a shunt can simulate on this channel.
 */
export function shuntForQuantity(
  shunt: ChannelShunt,
  target: number,
  describe: (q: number) => string,
): ShuntStep {
  const base = (shunt.model.spec.sensor as { gaugeOhms?: number; outputOhms?: number }).gaugeOhms ?? 350;
  const tryStep = (rs: number): ShuntStep | undefined => {
    try {
      return shunt.step(rs);
    } catch (e) {
      if (isBridgeworkError(e)) return undefined; // beyond what the channel reads
      throw e;
    }
  };
  const weak = tryStep(base * 1e9) as ShuntStep;
  const sign = Math.sign(weak.indicated);
  if (sign !== Math.sign(target)) {
    throw new BridgeworkError(
      'out-of-range',
      `--simulate ${describe(target)}: a shunt across this arm moves the channel the other way (${sign > 0 ? 'up' : 'down'}); choose an arm next to it (1 ↔ 2, 3 ↔ 4) or simulate ${describe(-target)}`,
      { param: 'simulate', value: target },
    );
  }
  let lo = Math.log(base * 1e-3);
  let hi = Math.log(base * 1e9);
  const strongest = tryStep(Math.exp(lo));
  if (strongest !== undefined && Math.abs(strongest.indicated) < Math.abs(target)) {
    throw new BridgeworkError(
      'out-of-range',
      `--simulate ${describe(target)} is more than a shunt can simulate on this channel (at most ${describe(strongest.indicated)})`,
      { param: 'simulate', value: target },
    );
  }
  for (let i = 0; i < 200 && hi - lo > 1e-15 * Math.abs(hi); i++) {
    const mid = 0.5 * lo + 0.5 * hi;
    const s = tryStep(Math.exp(mid));
    // Too strong (or beyond the channel's reach): the shunt must be larger.
    if (s === undefined || Math.abs(s.indicated) > Math.abs(target)) lo = mid;
    else hi = mid;
  }
  const found = tryStep(Math.exp(0.5 * lo + 0.5 * hi));
  if (found === undefined || !(Math.abs(found.indicated - target) <= 1e-9 * Math.abs(target))) {
    throw new BridgeworkError(
      'no-solution',
      `--simulate ${describe(target)}: no shunt gives this step on this channel (the channel cannot read the step of the strongest shunt that would)`,
      { param: 'simulate', value: target },
    );
  }
  return found;
}

/**
 * The preferred resistor nearest to a shunt (calibration `nearestPreferredValue`).
 *
 * @param ohms - The exact shunt.
 * @param series - E96 or E192 (or any series the calibration package has).
 */
export function preferredShunt(ohms: number, series: PreferredSeries): number {
  if (!(ohms >= 1e-250 && ohms <= 1e250)) {
    throw new BridgeworkError('out-of-range', `the shunt ${formatValue(ohms)} Ω has no preferred value`, {
      param: 'shuntOhms',
      value: ohms,
    });
  }
  return nearestPreferredValue({ value: ohms, series }).value;
}
