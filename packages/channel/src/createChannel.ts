import { BridgeworkError, checkFinite } from '@bridgework/core';
import type { StrainBridge } from '@bridgework/bridge';
import type { Adc } from '@bridgework/chain';
import { convertLinearFractional, convertScalar } from './convert/kernel.js';
import {
  newTally,
  readConversionArguments,
  statusOf,
  throwIfRejected,
  type ConversionResult,
  type ConversionStatus,
  type ConvertOptions,
} from './convert/ConversionStatus.js';
import { asSpecError, createMapping, type Mapping } from './internal/mapping.js';
import { resolveChannel, type ResolvedChannel } from './internal/resolve.js';
import { outputUnits } from './internal/units.js';
import type { ChannelSpec, OutputSpec } from './spec/ChannelSpec.js';
import { validateChannelSpec } from './validateChannelSpec.js';
import { createChannelBudget, type BudgetOptions, type ChannelBudget } from './budget/createChannelBudget.js';
import {
  channelConstants,
  type ChannelConstants,
  type ConstantsOptions,
} from './constants/channelConstants.js';

// The WHATWG stream type named in this module's declarations. Browsers (lib "DOM") and Node
// (@types/node) declare it in full; this empty declaration merges with theirs, and lets a project
// with neither (lib ES2022 alone) type-check these declarations.
declare global {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any, @typescript-eslint/no-empty-object-type, @typescript-eslint/no-unused-vars
  interface TransformStream<I = any, O = any> {}
}
/** Codes accepted by the converters: integer codes, or codes already averaged to non-integers. */
export type CodeBuffer = Int32Array | Float64Array;

/** An open interval `(min, max)`. */
export interface Interval {
  /** Lower end. */
  readonly min: number;
  /** Upper end. */
  readonly max: number;
}

/** One measurement channel (see {@link createChannel}). */
export interface Channel {
  /** The channel's name. */
  readonly name: string;
  /** The validated spec with every default applied. */
  readonly spec: ChannelSpec;
  /** The output quantity. */
  readonly quantity: OutputSpec['quantity'];
  /** The output unit: 'm/m', 'µε', 'Pa', 'N', 'kg', '°C' or 'V/V'. */
  readonly unit: string;
  /** The converter model (chain). */
  readonly adc: Adc;
  /** The exact bridge model (strain gauges and RTDs; undefined for transducers). */
  readonly bridge: StrainBridge | undefined;
  /** Codes that convert: the open interval inside the rails whose ratio the sensor can produce. */
  readonly validCodes: Interval;
  /** The span of interest in the output unit (`output.range`, or the whole convertible range). */
  readonly span: Interval;
  /** How `convert` works: `'kernel'` (one division per sample) or `'exact'` (the scalar map per sample). */
  readonly method: 'kernel' | 'exact';
  /**
   * The exact quantity for a converter code.
   *
   * @param code - A code strictly inside `validCodes` (need not be an integer: averaged codes are accepted).
   * @throws {@link @bridgework/core!BridgeworkError} `clipped` at or beyond the rails; `ratio-out-of-range`
   *   for a code whose ratio the sensor cannot produce; `not-finite`, `wrong-type`.
   */
  quantityFromCode(code: number): number;
  /**
   * The code the converter gives for a quantity (nearest code, ties to even; clipped to the rails).
   *
   * @param quantity - In the output unit, inside the sensor's range.
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` or `ratio-out-of-range` for a quantity the
   *   sensor cannot reach; `not-finite`, `wrong-type`.
   */
  codeFromQuantity(quantity: number): number;
  /**
   * Converts a buffer of codes to quantities. Codes at or beyond the rails, or whose ratio the
   * sensor cannot produce, become NaN and are counted and located in the status (or throw with
   * `onInvalid: 'throw'`). No allocation per sample.
   *
   * @param codes - Codes (Int32Array, or Float64Array of possibly averaged codes).
   * @param out - Output buffer of at least `codes.length` (default: a new one).
   * @param options - Block temperature, invalid-code policy, how many locations to record.
   * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` for a short `out`; `clipped` under the
   *   'throw' policy.
   */
  convert(codes: CodeBuffer, out?: Float64Array, options?: ConvertOptions): ConversionResult;
  /**
   * A WHATWG `TransformStream` that converts each chunk of codes (see `convert`).
   *
   * @param options - As for `convert`, applied to every chunk.
   */
  transformStream(options?: ConvertOptions): TransformStream<CodeBuffer, ConversionResult>;
  /**
   * The channel's error and uncertainty budget (noise, resolution, nonlinearity, leads,
   * temperature, tolerances, combined and expanded uncertainty, headroom).
   *
   * @param options - The operating point, Monte Carlo on request.
   */
  budget(options?: BudgetOptions): ChannelBudget;
  /**
   * Firmware constants for the channel's map: for each type the cheapest function meeting a total
   * error target against this exact map, verified over every code (see `channelConstants`).
   *
   * @param options - Target, output step, types, word sizes, verification mode.
   */
  constants(options?: ConstantsOptions): ChannelConstants;
}

/** Internals other modules of this package use (interleaved conversion). */
export interface ChannelInternals {
  readonly resolved: ResolvedChannel;
  mappingAt(temperatureCelsius: number | undefined): Mapping;
}

const internals = new WeakMap<Channel, ChannelInternals>();

/** @internal The internals of a channel made by {@link createChannel}. */
export function channelInternals(channel: Channel): ChannelInternals {
  const i = internals.get(channel);
  if (i === undefined) {
    throw new BridgeworkError('wrong-type', '`channel` must be made by createChannel', { param: 'channel' });
  }
  return i;
}

/**
 * Creates one measurement channel from its spec: exact maps between converter codes and the
 * measured quantity, fast batch conversion, the budget and firmware constants.
 *
 * @remarks
 * The spec is validated first; an invalid spec is rejected with every problem listed by field
 * path (`invalid-spec`, with `issues`). The map is composed from the packages that own each
 * stage, exactly: the converter's coding (`@bridgework/chain` `createAdc`), the bridge with its
 * leads and source resistance (`@bridgework/bridge` `createStrainBridge`, the exact
 * two-reading method for a zero reading), temperature, thermal output and transverse
 * sensitivity (`@bridgework/compensation`), certificate scaling (`@bridgework/calibration`) and
 * member conversion (`@bridgework/mechanics`). Nothing is linearised.
 *
 * For every linear-fractional bridge (all arrangements but `'full-bending-poisson'`) and for
 * transducers, the composed map is a Möbius function of the code, q = (a·x + b)/(c·x + d). The
 * converter fits its four coefficients through three exact values and checks them against the
 * exact map at 65 codes (agreement within 1e-12 of the largest quantity), then converts each
 * sample with one multiply-add pair and one division (`method: 'kernel'`). RTDs and the quadratic
 * bridge use the exact scalar map per sample (`method: 'exact'`).
 *
 * @param spec - The channel spec (see {@link ChannelSpec} and docs/channel.md).
 * @param options - `convertUnit`: accept quantities written with units (the CLI passes one).
 * @returns The channel.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-spec` with every problem.
 * @example
 * ```ts
 * const channel = createChannel({
 *   sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
 *   bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
 *   excitation: { volts: 5 },
 *   amplifier: { gain: 128 },
 *   adc: { bits: 24, referenceVolts: 5, ratiometric: true },
 *   output: { quantity: 'strain' },
 * });
 * channel.quantityFromCode(563_000); // ≈ 1.0e-3 (m/m)
 * ```
 */
export function createChannel(
  spec: ChannelSpec,
  options: { readonly convertUnit?: (text: string, unit: string) => number } = {},
): Channel {
  const result = validateChannelSpec(spec, options);
  if (!result.ok) {
    throw new BridgeworkError(
      'invalid-spec',
      `channel spec has ${result.issues.length} problem${result.issues.length === 1 ? '' : 's'}:\n${result.issues.map((i) => `  ${i.message}`).join('\n')}`,
      { issues: result.issues },
    );
  }
  const valid = result.value;
  const name = valid.name ?? 'channel';
  let resolved: ResolvedChannel;
  let nominal: Mapping;
  try {
    resolved = resolveChannel(valid);
    nominal = createMapping(resolved, resolved.nominal);
  } catch (e) {
    asSpecError(name, e);
  }
  const cache = new Map<number, Mapping>();
  const mappingAt = (temperatureCelsius: number | undefined): Mapping => {
    if (temperatureCelsius === undefined || temperatureCelsius === resolved.nominal.temperatureCelsius)
      return nominal;
    const t = checkFinite('temperatureCelsius', temperatureCelsius);
    let m = cache.get(t);
    if (m === undefined) {
      if (cache.size >= 16) cache.clear();
      m = createMapping(resolved, { ...resolved.nominal, temperatureCelsius: t });
      cache.set(t, m);
    }
    return m;
  };

  const first = Math.floor(nominal.lo) + 1;
  const last = Math.ceil(nominal.hi) - 1;
  const ends = [nominal.quantityFromCode(first), nominal.quantityFromCode(last)];
  const range = valid.output.range;
  const span: Interval =
    range === undefined
      ? { min: Math.min(...ends), max: Math.max(...ends) }
      : { min: range[0], max: range[1] };

  function convert(codes: CodeBuffer, out?: Float64Array, opts: ConvertOptions = {}): ConversionResult {
    const { values, maxLocations } = readConversionArguments(codes, out, opts);
    const m = mappingAt(opts.temperatureCelsius);
    const tally = newTally(maxLocations, m.model.adc.codeMin, m.model.adc.codeMax);
    if (m.kernel !== undefined)
      convertLinearFractional(codes, values, m.kernel, tally, 0, 1, codes.length, 0, 1);
    else convertScalar(codes, values, m.quantityOrNaN, m.lo, m.hi, tally, 0, 1, codes.length, 0, 1);
    const status: ConversionStatus = statusOf(
      tally,
      codes.length,
      m.kernel !== undefined ? 'kernel' : 'exact',
    );
    if (opts.onInvalid === 'throw') throwIfRejected(status, name);
    return { values, status };
  }

  const channel: Channel = {
    name,
    spec: valid,
    quantity: valid.output.quantity,
    unit: outputUnits[valid.output.quantity],
    adc: nominal.model.adc,
    bridge: nominal.model.bridge,
    validCodes: { min: nominal.lo, max: nominal.hi },
    span,
    method: nominal.kernel !== undefined ? 'kernel' : 'exact',
    quantityFromCode: (code) => nominal.quantityFromCode(checkFinite('code', code)),
    codeFromQuantity(quantity) {
      const q = checkFinite('quantity', quantity);
      return nominal.model.codeFromRatio(nominal.model.ratioFromQuantity(q)).code;
    },
    convert,
    transformStream(opts: ConvertOptions = {}) {
      return new TransformStream<CodeBuffer, ConversionResult>({
        transform(chunk, controller) {
          controller.enqueue(convert(chunk, undefined, opts));
        },
      });
    },
    budget: (opts) => createChannelBudget(resolved, nominal, span, opts),
    constants: (opts) => channelConstants(channel, opts),
  };
  internals.set(channel, { resolved, mappingAt });
  return channel;
}
