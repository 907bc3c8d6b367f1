/**
 * The channel object: exact maps, the readings a report needs, and fast conversion, over a
 * prepared channel (validated spec, resolved, nominal mapping, span).
 */
import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  isBridgeworkError,
  type Interval,
} from '@bridgework/core';
import type { Channel, ChannelCurve, ChannelInput, ChannelMap, CodeBuffer } from '../Channel.js';
import { convertCallendarVanDusen, convertQuadratic } from '../convert/curveKernels.js';
import { convertLinearFractional, convertScalar } from '../convert/kernel.js';
import {
  newTally,
  readConversionArguments,
  statusOf,
  throwIfRejected,
  type ConversionResult,
  type ConvertOptions,
} from '../convert/ConversionStatus.js';
import { Parameter } from '../kinds/SensorKind.js';
import { defaultOutputUnit, displayUnitFor } from '../outputQuantities.js';
import type { ValidChannelSpec } from '../spec/ChannelSpec.js';
import { checkConvertOptions } from './convertOptions.js';
import { createMapping, type Mapping } from './mapping.js';
import type { PreparedChannel } from './prepare.js';

/** What other modules of the package read from a channel (budget, constants, interleaved conversion). */
export interface ChannelInternals {
  /** The prepared channel. */
  readonly prepared: PreparedChannel;
  /** The mapping at a sensor temperature (the nominal one for `undefined`). */
  mappingAt(temperatureCelsius: number | undefined): Mapping;
}

const internals = new WeakMap<Channel, ChannelInternals>();

/** The internals of a channel made by `createChannel`. */
export function channelInternals(channel: unknown, param = 'channel'): ChannelInternals {
  const i = typeof channel === 'object' && channel !== null ? internals.get(channel as Channel) : undefined;
  if (i === undefined) {
    throw new BridgeworkError('wrong-type', `\`${param}\` must be a channel made by createChannel`, {
      param,
    });
  }
  return i;
}

/** Converts with a mapping's fastest path into `values`; returns the status method. */
function convertWith(
  m: Mapping,
  codes: CodeBuffer,
  values: Float64Array,
  tally: ReturnType<typeof newTally>,
  start: number,
  stride: number,
  count: number,
): 'kernel' | 'exact' {
  if (m.kernel !== undefined) {
    convertLinearFractional(codes, values, m.kernel, tally, start, stride, count, start, stride);
    return 'kernel';
  }
  if (m.partialKernel !== undefined) {
    convertLinearFractional(codes, values, m.partialKernel, tally, start, stride, count, start, stride);
    return 'kernel';
  }
  if (m.quadraticKernel !== undefined) {
    convertQuadratic(codes, values, m.quadraticKernel, tally, start, stride, count, start, stride);
    return 'kernel';
  }
  const rc = m.resistanceCurve;
  if (rc?.kernel !== undefined) {
    convertCallendarVanDusen(codes, values, rc.kernel, tally, start, stride, count, start, stride);
    return 'exact';
  }
  const map =
    rc === undefined
      ? m.valueOrNaN
      : (code: number) => {
          try {
            return rc.evaluate(code);
          } catch (e) {
            if (isBridgeworkError(e)) return Number.NaN;
            throw e;
          }
        };
  convertScalar(codes, values, map, m.lo, m.hi, tally, start, stride, count, start, stride);
  return 'exact';
}

/** @internal Converts one lane of a (possibly interleaved) buffer with a mapping. */
export const convertLane = convertWith;

/** Makes the channel of a prepared spec. */
export function makeChannel(prepared: PreparedChannel): Channel {
  const { resolved, nominal, span } = prepared;
  const spec = resolved.spec as unknown as ValidChannelSpec;
  const name = resolved.name;
  const model = nominal.model;
  const temperatureMatters = resolved.kind.temperatureLine !== undefined;
  const nominalTemperature = resolved.context.nominal[Parameter.temperatureCelsius] as number;
  const cache = new Map<number, Mapping>();
  const mappingAt = (temperatureCelsius: number | undefined): Mapping => {
    if (temperatureCelsius === undefined || temperatureCelsius === nominalTemperature) return nominal;
    if (!temperatureMatters) {
      throw new BridgeworkError(
        'invalid-option',
        `\`options.temperatureCelsius\` applies to channels whose map depends on the sensor's temperature (strain gauges, transducers); channel '${name}' is a '${resolved.kind.name}'`,
        { param: 'options.temperatureCelsius', value: temperatureCelsius },
      );
    }
    let m = cache.get(temperatureCelsius);
    if (m === undefined) {
      if (cache.size >= 16) cache.clear();
      const p = resolved.context.nominal.slice();
      p[Parameter.temperatureCelsius] = temperatureCelsius;
      try {
        m = createMapping(resolved, p);
      } catch (e) {
        if (!isBridgeworkError(e)) throw e;
        throw new BridgeworkError(
          'out-of-range',
          `\`options.temperatureCelsius\` ${temperatureCelsius} °C is outside what channel '${name}' can be corrected for: ${e.message}`,
          {
            param: 'options.temperatureCelsius',
            value: temperatureCelsius,
            cause: e,
          },
        );
      }
      cache.set(temperatureCelsius, m);
    }
    return m;
  };

  const checkQuantity = (quantity: unknown) => checkFinite('quantity', quantity);
  const exactCode = (q: number) => model.exactCodeFromRatio(model.ratioFromValue(q));
  const excitationVolts = resolved.context.nominal[Parameter.excitationVolts] as number;
  const gain = resolved.context.nominal[Parameter.gain] as number;
  const inputAt = (quantity: number): ChannelInput => {
    const q = checkQuantity(quantity);
    const bridgeRatio = model.ratioFromValue(q);
    const inputVolts = model.inputVoltsFromRatio(bridgeRatio);
    const nearest = model.codeFromRatio(bridgeRatio);
    return {
      quantity: q,
      bridgeRatio,
      inputVolts,
      inputRatio: inputVolts / excitationVolts,
      converterVolts: gain * inputVolts,
      code: model.exactCodeFromRatio(bridgeRatio),
      nearestCode: nearest.code,
      clipped: nearest.clipped,
    };
  };
  const codes = [exactCode(span.min), exactCode(span.max)];
  const spanCodes: Interval = {
    min: Math.min(...(codes as [number, number])),
    max: Math.max(...(codes as [number, number])),
  };
  const validCodes: Interval = { min: nominal.lo, max: nominal.hi };
  const map: ChannelMap =
    nominal.kernel !== undefined
      ? {
          form: 'mobius',
          coefficients: {
            a: nominal.kernel.a,
            b: nominal.kernel.b,
            c: nominal.kernel.c,
            d: nominal.kernel.d,
          },
          validCodes,
        }
      : nominal.resistanceCurve !== undefined
        ? {
            form: 'resistance-curve',
            resistance: nominal.resistanceCurve.resistance,
            curve: nominal.resistanceCurve.curve,
            unit: resolved.unit,
            validCodes,
          }
        : { form: 'exact', validCodes };
  const largest = Math.max(Math.abs(span.min), Math.abs(span.max));
  // People read the values in output.unit when it names one other than the quantity's SI unit;
  // for SI values the unit is chosen by the span's magnitude (µε, kN, MPa...).
  const display =
    resolved.unit !== defaultOutputUnit(resolved.spec.output.quantity)
      ? { unit: resolved.unit, factor: 1 }
      : displayUnitFor(resolved.spec.output.quantity, largest);

  function convert(buffer: CodeBuffer, out?: Float64Array, options?: ConvertOptions): ConversionResult {
    const o = checkConvertOptions(options);
    const { values, maxLocations } = readConversionArguments(buffer, out, o);
    const m = mappingAt(o['temperatureCelsius'] as number | undefined);
    const tally = newTally(maxLocations, m.model.adc.codeMin, m.model.adc.codeMax);
    const method = convertWith(m, buffer, values, tally, 0, 1, buffer.length);
    const status = statusOf(tally, buffer.length, method);
    if (o['onInvalid'] === 'throw') throwIfRejected(status, name);
    return { values, status };
  }

  const curve = (points: unknown = 201): ChannelCurve => {
    const n = checkInteger('points', points, { min: 11, max: 10_001 });
    const [c1, c2] = [exactCode(span.min), exactCode(span.max)] as [number, number];
    const q1 = nominal.valueFromCode(c1);
    const q2 = nominal.valueFromCode(c2);
    const codesOut = new Float64Array(n);
    const quantity = new Float64Array(n);
    const inputRatio = new Float64Array(n);
    const nonlinearity = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const c = i === n - 1 ? c2 : c1 + ((c2 - c1) * i) / (n - 1);
      const q = i === 0 ? q1 : i === n - 1 ? q2 : nominal.valueFromCode(c);
      codesOut[i] = c;
      quantity[i] = q;
      inputRatio[i] = model.inputVoltsFromRatio(model.ratioFromCode(c)) / excitationVolts;
      nonlinearity[i] = q - (q1 + ((q2 - q1) * (c - c1)) / (c2 - c1));
    }
    return { codes: codesOut, quantity, inputRatio, nonlinearity, spanCodes: [c1, c2] };
  };

  const channel: Channel = {
    name,
    spec,
    kind: resolved.kind.name,
    description: resolved.kind.describe(resolved.spec.sensor as never, resolved.spec),
    quantity: resolved.spec.output.quantity,
    unit: resolved.unit,
    display,
    adc: model.adc,
    validCodes,
    span,
    spanCodes,
    method:
      nominal.kernel !== undefined ||
      nominal.partialKernel !== undefined ||
      nominal.quadraticKernel !== undefined
        ? 'kernel'
        : 'exact',
    map,
    quantityFromCode: (code) => nominal.valueFromCode(checkFinite('code', code)),
    codeFromQuantity: (quantity) => model.codeFromRatio(model.ratioFromValue(checkQuantity(quantity))).code,
    exactCodeFromQuantity: (quantity) => exactCode(checkQuantity(quantity)),
    inputAt,
    curve,
    operatingPoints() {
      const qs = span.min < 0 && span.max > 0 ? [span.min, 0, span.max] : [span.min, span.max];
      return qs.map(inputAt);
    },
    convert,
    transformer(options?: ConvertOptions) {
      checkConvertOptions(options);
      return {
        transform(chunk, controller) {
          controller.enqueue(convert(chunk, undefined, options));
        },
      };
    },
  };
  internals.set(channel, { prepared, mappingAt });
  return Object.freeze(channel);
}
