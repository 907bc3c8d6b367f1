/**
 * Firmware constants for a channel: the firmware package designs and verifies them against the
 * channel's exact map. This module uses only the channel's public surface (`quantityFromCode`,
 * `validCodes`, `span`, `unit`, `name`, the spec's optional `output.firmwareResolution` and the
 * budget's combined standard uncertainty), so it does not depend on how the channel is built.
 */
import {
  BridgeworkError,
  checkFinite,
  checkOptions,
  checkPositive,
  formatValue,
  isBridgeworkError,
} from '@bridgework/core';
import {
  designFirmwareConstants,
  type EvaluatorType,
  type FirmwareChannel,
  type FirmwareFixedMap,
  type FirmwareFloatMap,
  type FixedPointRounding,
  type ReferenceError,
  type TotalErrors,
  type VerificationMode,
} from '@bridgework/firmware';
import { channelBudget } from '../budget/channelBudget.js';
import type { Channel } from '../Channel.js';
import { channelInternals } from '../internal/makeChannel.js';

/**
 * The accuracy the channel states for its binary64 map `quantityFromCode` against 40-digit
 * references at the codes of its span, relative to the span's largest |value| (not to each value:
 * near zero a value is a small difference of large ones; docs/channel.md, "Accuracy and
 * verification"). Times that largest value it is the reference error added to every firmware
 * bound.
 */
export const CHANNEL_MAP_RELATIVE_ACCURACY = 1e-13;

/** Options of {@link channelConstants}. */
export interface ConstantsOptions {
  /**
   * The total error every function must meet, in the output unit (> 0). Default: one tenth of the
   * channel's combined standard uncertainty at the budget point, or one output step of the
   * fixed-point function, whichever is larger.
   */
  readonly targetError?: number;
  /**
   * The fixed-point output step, in the output unit (> 0). Default: `output.firmwareResolution`;
   * else with `targetError` given, the largest power of ten not above it and not above 1e-4 of the
   * span's largest magnitude, but no finer than keeps the outputs within ±2^30 steps; else that
   * power of ten from the span alone.
   */
  readonly outputResolution?: number;
  /** The functions to design: `'fixed'`, `'float32'`, `'float64'`. Default all three. */
  readonly types?: readonly EvaluatorType[];
  /** Width of fixed-point coefficient words (8 … 32). Default 32. */
  readonly coefficientBits?: number;
  /** Accumulator of the affine fixed-point form: 64 (default) or 32. */
  readonly accumulatorBits?: 32 | 64;
  /** Rounding of the affine fixed-point form. Default `'half-even'`. */
  readonly rounding?: FixedPointRounding;
  /** Whether the target divides in hardware (the Möbius form becomes a float candidate). Default false. */
  readonly hardwareDivide?: boolean;
  /** Largest table of one function in bytes. Default 4096. */
  readonly maxTableBytes?: number;
  /** Highest polynomial degree tried (1 … 5). */
  readonly maxDegree?: number;
  /** `'auto'` (exhaustive up to 2^24 codes, default), `'exhaustive'` or `'sampled'`. */
  readonly verification?: VerificationMode;
}

/** A channel's firmware constants (see {@link channelConstants}). */
export interface ChannelConstants {
  /** Lowest code covered (the span of interest, strictly inside the valid codes). */
  readonly codeMin: number;
  /** Highest code covered. */
  readonly codeMax: number;
  /** The total error every function meets, output unit. */
  readonly targetError: number;
  /** How the target was set: given as an option, or the default rule. */
  readonly targetSource: 'option' | 'default';
  /** The channel's combined standard uncertainty at the budget point (output unit), when the default used it. */
  readonly standardUncertainty: number | undefined;
  /** The fixed-point output step, output unit. */
  readonly outputResolution: number;
  /** The channel map's own error added to every bound. */
  readonly referenceError: ReferenceError;
  /** The fixed-point function, when designed. */
  readonly fixed: FirmwareFixedMap | undefined;
  /** The float32 function, when designed. */
  readonly float32: FirmwareFloatMap | undefined;
  /** The float64 function, when designed. */
  readonly float64: FirmwareFloatMap | undefined;
  /** Each function's total error against the channel's exact map. */
  readonly totals: TotalErrors;
  /** Ready for `emitCHeader`, `emitJson` and `emitTestProgram` of `@bridgework/firmware`. */
  readonly firmwareChannel: FirmwareChannel;
}

const KNOWN = [
  'targetError',
  'outputResolution',
  'types',
  'coefficientBits',
  'accumulatorBits',
  'rounding',
  'hardwareDivide',
  'maxTableBytes',
  'maxDegree',
  'verification',
];

/** The largest power of ten not above x (x > 0). */
/** The smallest power of ten not below x (x > 0), as the double nearest it. */
function powerOfTenAtLeast(x: number): number {
  let e = Math.ceil(Math.log10(x));
  if (Number(`1e${e - 1}`) >= x) e -= 1;
  if (Number(`1e${e}`) < x) e += 1;
  return Number(`1e${e}`);
}

function powerOfTenBelow(x: number): number {
  // The double nearest 10^e, read from its decimal text (10 ** e can be an ulp off).
  let e = Math.floor(Math.log10(x));
  if (Number(`1e${e}`) > x) e -= 1;
  return Number(`1e${e}`);
}

/**
 * The codes whose quantity lies in the span, strictly inside the valid codes: the map is
 * monotone, so bisection on `quantityFromCode` finds both ends.
 */
function spanCodes(channel: Channel): { codeMin: number; codeMax: number } {
  const first = Math.floor(channel.validCodes.min) + 1;
  const last = Math.ceil(channel.validCodes.max) - 1;
  if (!(last > first)) {
    throw new BridgeworkError('out-of-range', 'the channel must have at least two valid converter codes', {
      param: 'output.range',
      limit: [first, last],
    });
  }
  const q = (c: number) => channel.quantityFromCode(c);
  const rising = q(last) > q(first);
  const { min, max } = channel.span;
  // Smallest code whose quantity is past `bound` in the direction of travel (or last + 1).
  const firstPast = (test: (value: number) => boolean): number => {
    let lo = first;
    let hi = last + 1;
    while (lo < hi) {
      const mid = lo + Math.floor((hi - lo) / 2);
      if (test(q(mid))) hi = mid;
      else lo = mid + 1;
    }
    return lo;
  };
  const codeMin = rising ? firstPast((v) => v >= min) : firstPast((v) => v <= max);
  const codeMax = (rising ? firstPast((v) => v > max) : firstPast((v) => v < min)) - 1;
  if (!(codeMax > codeMin)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`output.range\` must span at least two valid converter codes; it spans codes ${codeMin} … ${codeMax}`,
      { param: 'output.range', limit: [codeMin, codeMax] },
    );
  }
  return { codeMin, codeMax };
}

/** Runs the designer and names the channel's option where its message names the designer's. */
function inChannelTerms<T>(step: () => T): T {
  try {
    return step();
  } catch (e) {
    if (isBridgeworkError(e) && e.message.includes('`outputUnit`')) {
      throw new BridgeworkError(e.code, e.message.split('`outputUnit`').join('`outputResolution`'), {
        ...(e.param === undefined ? {} : { param: e.param === 'outputUnit' ? 'outputResolution' : e.param }),
        ...(e.value === undefined ? {} : { value: e.value }),
        ...(e.limit === undefined ? {} : { limit: e.limit }),
        cause: e,
      });
    }
    throw e;
  }
}

/**
 * Designs and verifies the firmware constants of a channel: for each requested type the cheapest
 * function (affine, piecewise polynomial, or Möbius where the target divides in hardware) whose
 * total error against the channel's exact map meets the target.
 *
 * @remarks
 * The exact map is the channel's own `quantityFromCode`; the firmware package's
 * `designFirmwareConstants` fits, chooses and verifies every code of the span (up to 2^24 codes;
 * above that the bound is measured, not proved) and adds the map's own error: the channel's stated
 * accuracy {@link CHANNEL_MAP_RELATIVE_ACCURACY} times the span's largest value.
 * Default target: max(u_c/10, one output step), with u_c the combined standard uncertainty of the
 * channel's budget at its default point (docs/firmware.md). A target no form meets is an
 * `out-of-range` error naming the best bound reached; no header is made.
 *
 * A separate function, not a method of the channel, so an application that only converts does not
 * carry the firmware package and decimal.js.
 *
 * @param channel - A channel from `createChannel`.
 * @param options - Target, output step, types and the target's limits.
 * @returns The functions, their total errors and the firmware package's channel record.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (param `targetError`) when a type
 *   cannot meet the target, or (param `output.range`) for a span of fewer than two codes;
 *   `unknown-option`, `not-positive`, `not-finite` and the firmware package's codes for bad options.
 * @example
 * ```ts
 * const c = channelConstants(channel, { targetError: 0.01 });
 * c.totals.fixed?.bound; // ≤ 0.01 (°C), proved over every code of the span
 * ```
 */
export function channelConstants(channel: Channel, options: ConstantsOptions = {}): ChannelConstants {
  channelInternals(channel); // a channel made by createChannel, or wrong-type
  const o = checkOptions('options', options, { known: KNOWN });
  const { codeMin, codeMax } = spanCodes(channel);
  const spanMagnitude = Math.max(Math.abs(channel.span.min), Math.abs(channel.span.max));
  const spanStep = powerOfTenBelow(spanMagnitude > 0 ? spanMagnitude * 1e-4 : 1e-4);
  const explicitTarget =
    o['targetError'] === undefined ? undefined : checkPositive('targetError', o['targetError']);
  const largest = Math.max(
    Math.abs(checkFinite('quantityFromCode', channel.quantityFromCode(codeMin))),
    Math.abs(checkFinite('quantityFromCode', channel.quantityFromCode(codeMax))),
  );
  // The finest default step whose outputs over the span stay within ±2^30 (an int32 with room).
  const finestStep = powerOfTenAtLeast(Math.max(largest / 2 ** 30, 1e-300));
  const specResolution = channel.spec.output.firmwareResolution;
  const resolution =
    o['outputResolution'] !== undefined
      ? checkPositive('outputResolution', o['outputResolution'])
      : specResolution !== undefined
        ? specResolution
        : explicitTarget !== undefined
          ? Math.max(finestStep, Math.min(spanStep, powerOfTenBelow(explicitTarget)))
          : spanStep;
  // A fixed-point output step must resolve the span and keep its outputs in an int32.
  if (o['outputResolution'] !== undefined || specResolution !== undefined) {
    const param = o['outputResolution'] !== undefined ? 'outputResolution' : 'output.firmwareResolution';
    const unit = channel.unit;
    const coarsest = spanMagnitude > 0 ? spanMagnitude : largest;
    const finest = largest / 2 ** 31;
    if (!(resolution <= coarsest && resolution >= finest)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`${param}\` must lie in [${formatValue(finest)}, ${formatValue(coarsest)}] ${unit}: at most the span's largest magnitude (a coarser step cannot resolve the span) and at least that of the largest output / 2^31 (finer steps overflow the int32 outputs); got ${formatValue(resolution)}; the default is ${formatValue(spanStep)}`,
        { param, value: resolution, limit: [finest, coarsest] },
      );
    }
  }
  let targetError: number;
  let standardUncertainty: number | undefined;
  if (explicitTarget !== undefined) {
    targetError = explicitTarget;
  } else {
    const uc = channelBudget(channel).combined.standardUncertainty;
    if (!(Number.isFinite(uc) && uc > 0)) {
      throw new BridgeworkError(
        'not-finite',
        `the channel's combined standard uncertainty must be finite and positive to set the default \`targetError\`; got ${formatValue(uc)}: give \`targetError\``,
        { param: 'targetError', value: uc },
      );
    }
    standardUncertainty = uc;
    targetError = Math.max(uc / 10, resolution);
  }
  const referenceError: ReferenceError = {
    bound: CHANNEL_MAP_RELATIVE_ACCURACY * largest,
    source: `the channel's stated accuracy of its binary64 map, ${CHANNEL_MAP_RELATIVE_ACCURACY} of the span's largest value against 40-digit references (docs/channel.md, measured by its tests)`,
  };
  const pass = (key: string) => (o[key] === undefined ? {} : { [key]: o[key] });
  const design = inChannelTerms(() =>
    designFirmwareConstants({
      name: channel.name,
      exact: (code) => channel.quantityFromCode(code),
      referenceError,
      codeMin,
      codeMax,
      quantityUnit: channel.unit,
      targetError,
      outputUnit: String(resolution),
      ...pass('types'),
      ...pass('coefficientBits'),
      ...pass('accumulatorBits'),
      ...pass('rounding'),
      ...pass('hardwareDivide'),
      ...pass('maxTableBytes'),
      ...pass('maxDegree'),
      ...pass('verification'),
    }),
  );
  return Object.freeze({
    codeMin,
    codeMax,
    targetError,
    targetSource: explicitTarget === undefined ? ('default' as const) : ('option' as const),
    standardUncertainty,
    outputResolution: resolution,
    referenceError,
    fixed: design.fixed,
    float32: design.float32,
    float64: design.float64,
    totals: design.totals ?? {},
    firmwareChannel: design,
  });
}
