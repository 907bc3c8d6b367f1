/**
 * The opt-in conversion of IEC 60751 platinum RTD channels through a checked piecewise polynomial
 * in the code: `import { createRtdPolynomialConverter } from '@bridgework/channel/rtd-polynomial'`.
 * A separate entry point, so an application that converts with `channel.convert` alone never
 * carries it (the browser bundle of `createChannel` + `convert` does not grow).
 *
 * @module rtd-polynomial
 */
import { BridgeworkError, checkOneOf, checkOptions } from '@bridgework/core';
import type { Channel, CodeBuffer } from './Channel.js';
import {
  newTally,
  readConversionArguments,
  statusOf,
  throwIfRejected,
  type ConversionResult,
  type ConvertOptions,
} from './convert/ConversionStatus.js';
import type { CallendarVanDusenKernel } from './convert/curveKernels.js';
import {
  checkSegment,
  convertRtdPolynomial,
  createRtdPolynomial,
  type RtdPolynomialPath,
} from './convert/rtdPolynomial.js';
import { instantiateRtdPolynomialWasm } from './convert/wasm/rtdPolynomialLoop.js';
import { checkConvertOptions } from './internal/convertOptions.js';
import { channelInternals } from './internal/makeChannel.js';

export type { CodeBuffer } from './Channel.js';
export type { ConversionResult, ConversionStatus, ConvertOptions } from './convert/ConversionStatus.js';

/** How far a converter's polynomial has been checked (see {@link RtdPolynomialConverter.segments}). */
export interface RtdPolynomialSegments {
  /** Segments of the valid integer codes (0 when the codes are too many or too few for a polynomial). */
  readonly total: number;
  /** Segments checked at every code and serving the polynomial. */
  readonly checked: number;
  /** Segments whose check failed (or that hold a code the exact path refuses): their codes take the exact loop. */
  readonly exact: number;
  /** Codes per segment (a power of two; 0 without a polynomial). */
  readonly codesPerSegment: number;
}

/** Which loop evaluates the polynomial on Int32 codes (the results are the same, bit for bit). */
export type RtdPolynomialLoop = 'webassembly' | 'javascript';

/** A channel's conversion through the checked RTD polynomial (see {@link createRtdPolynomialConverter}). */
export interface RtdPolynomialConverter {
  /** The channel it converts for. */
  readonly channel: Channel;
  /** The loop that serves contiguous Int32 codes (see {@link RtdPolynomialConverterOptions.loop}). */
  readonly loop: RtdPolynomialLoop;
  /**
   * Converts a buffer of codes as `channel.convert` does — same arguments, same NaN (and counts and
   * locations) for codes at the rails or outside what the sensor can produce, same `onInvalid` —
   * with each integer code's value from its segment's polynomial, within 1 ulp of the exact
   * composition (of 1 in the channel's unit for values below 1 in magnitude); fractional codes and
   * the codes of segments that failed their check take the exact loop of `channel.convert`, bit for
   * bit. The status's `method` is `'kernel'` (a checked approximation).
   *
   * @param codes - Codes (Int32Array, or Float64Array of possibly averaged codes).
   * @param out - Output buffer of at least `codes.length` (default: a new one; the codes' own
   *   Float64Array for a conversion in place).
   * @param options - As for `channel.convert`.
   * @throws {@link @bridgework/core!BridgeworkError} as `channel.convert`.
   */
  convert(codes: CodeBuffer, out?: Float64Array, options?: ConvertOptions): ConversionResult;
  /** How many segments are checked so far, and how many take the exact loop. */
  segments(): RtdPolynomialSegments;
}

/** Options of {@link createRtdPolynomialConverter}. */
export interface RtdPolynomialConverterOptions {
  /**
   * Check every segment now, at creation (0.3–1.8 s for a 24-bit converter), instead of each the
   * first time a conversion meets one of its codes. Default false.
   */
  readonly checkAllSegments?: boolean;
  /**
   * The loop for contiguous Int32 codes: `'webassembly'` (a 350-byte module compiled at creation,
   * the same expression in binary64 without the bounds checks of a JavaScript array access, about
   * 1.6× faster) or `'javascript'`; both give the same values bit for bit. Default: WebAssembly
   * where the runtime has it and allows compiling it (a content security policy without
   * `'wasm-unsafe-eval'` does not), else JavaScript.
   */
  readonly loop?: RtdPolynomialLoop;
}

/**
 * Creates the polynomial converter of an RTD channel (`channel.map.form === 'resistance-curve'`
 * with the IEC 60751 Callendar–Van Dusen curve), for applications that convert long runs of
 * integer codes and accept results within 1 ulp of the exact composition instead of bit-identical
 * to `channel.convert`.
 *
 * @remarks
 * The valid integer codes are cut into segments of 2^k codes (about a thousand over a 24-bit
 * converter); on each, the value is a double-double centre value plus a degree-5 polynomial in the
 * offset times the offset, fitted at Chebyshev nodes to the exact composition code → resistance
 * (the channel's Möbius function) → Callendar–Van Dusen inverse → unit. A segment serves only
 * after every one of its codes has been evaluated through it and compared with the exact
 * composition computed in double-double (about 1e-25 of the value), and found within 1 ulp of it
 * (of 1 in the channel's unit below 1 in magnitude). The check runs the first time a conversion
 * meets a code of the segment (a few ms per segment; a whole 24-bit range 0.3–1.8 s, once per
 * converter); a segment that fails it, and fractional codes, take the exact loop of
 * `channel.convert`. Per sample: a table look-up and eleven multiply-adds, no division or square
 * root, in a 350-byte WebAssembly module for contiguous Int32 codes (the JavaScript loop where the
 * runtime has no WebAssembly; the same values bit for bit) — about 2–4× the exact loop's
 * throughput, 1.8–2.6× the plain affine loop's time (docs/performance.md). The exact loop (and so
 * `channel.convert`) is bit-identical to the channel's scalar path, which is itself up to about 35
 * ulp from the exact composition between 10 and 100 °C (R/R0 − 1 cancels): the polynomial is
 * closer to the exact value than the default path, but not bit-identical to it.
 *
 * @param channel - A channel made by `createChannel` with an IEC 60751 RTD curve.
 * @param options - Whether to check every segment at creation, and which loop serves (see
 *   {@link RtdPolynomialConverterOptions}).
 * @returns The converter.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` for something other than a channel;
 *   `invalid-option` for a channel without an RTD curve (its `convert` is the path);
 *   `unknown-option` for a key it does not know; `wrong-type` for a `checkAllSegments` that is
 *   not a boolean, or for `loop: 'webassembly'` where the runtime has no WebAssembly (or refuses
 *   to compile it); `invalid-option` for another `loop`.
 * @example
 * ```ts
 * import { createRtdPolynomialConverter } from '@bridgework/channel/rtd-polynomial';
 * const fast = createRtdPolynomialConverter(channel);
 * const { values, status } = fast.convert(codes); // status.rejected as channel.convert counts it
 * ```
 */
export function createRtdPolynomialConverter(
  channel: Channel,
  options: RtdPolynomialConverterOptions = {},
): RtdPolynomialConverter {
  const o = checkOptions('options', options, { known: ['checkAllSegments', 'loop'] });
  const wanted =
    o['loop'] === undefined
      ? undefined
      : checkOneOf('options.loop', o['loop'], ['webassembly', 'javascript']);
  const checkAll = o['checkAllSegments'] ?? false;
  if (typeof checkAll !== 'boolean') {
    throw new BridgeworkError('wrong-type', '`options.checkAllSegments` must be true or false', {
      param: 'options.checkAllSegments',
      value: checkAll,
    });
  }
  const internals = channelInternals(channel);
  const cache = new WeakMap<CallendarVanDusenKernel, RtdPolynomialPath>();
  const prepare = (k: CallendarVanDusenKernel): RtdPolynomialPath => {
    let p = cache.get(k);
    if (p === undefined) {
      const { ra, rb, rc, rd, lo, hi, minOhms, maxOhms } = k;
      const wasm = wanted === 'javascript' ? undefined : instantiateRtdPolynomialWasm();
      if (wasm === undefined && wanted === 'webassembly') {
        throw new BridgeworkError(
          'wrong-type',
          "this runtime has no WebAssembly, or does not allow compiling it: use `loop: 'javascript'` (the same values)",
          { param: 'options.loop', value: wanted },
        );
      }
      p = {
        kernel: k,
        polynomial: createRtdPolynomial(k, wasm?.table),
        wasm,
        // The scalar path's acceptance of a code: valid, and its resistance inside the curve's range.
        convertible: (x: number) => {
          if (!(x > lo && x < hi)) return false;
          const ohms = (ra * x + rb) / (rc * x + rd);
          return ohms >= minOhms && ohms <= maxOhms;
        },
      };
      cache.set(k, p);
    }
    return p;
  };
  const kernelOf = (temperatureCelsius: number | undefined): CallendarVanDusenKernel | undefined =>
    internals.mappingAt(temperatureCelsius).resistanceCurve?.kernel;
  const nominal = kernelOf(undefined);
  if (nominal === undefined) {
    throw new BridgeworkError(
      'invalid-option',
      `channel '${channel.name}' has no IEC 60751 RTD curve (map.form '${channel.map.form}'): convert it with \`channel.convert\``,
      { param: 'channel', value: channel.map.form },
    );
  }
  const nominalPrepared = prepare(nominal);
  const poly = nominalPrepared.polynomial;
  if (checkAll && poly !== undefined)
    for (let s = 0; s < poly.segments; s++) checkSegment(poly, s, nominalPrepared.convertible);

  function convert(codes: CodeBuffer, out?: Float64Array, convertOptions?: ConvertOptions): ConversionResult {
    const o = checkConvertOptions(convertOptions);
    const { values, maxLocations } = readConversionArguments(codes, out, o);
    const temperature = o['temperatureCelsius'] as number | undefined;
    const m = internals.mappingAt(temperature);
    const k = m.resistanceCurve?.kernel;
    if (k === undefined) {
      throw new BridgeworkError(
        'invalid-option',
        `channel '${channel.name}' has no IEC 60751 RTD curve at this temperature: convert it with \`channel.convert\``,
        { param: 'options.temperatureCelsius', value: temperature },
      );
    }
    const p = prepare(k);
    const tally = newTally(maxLocations, m.model.adc.codeMin, m.model.adc.codeMax);
    const n = codes.length;
    convertRtdPolynomial(codes, values, p, tally, n);
    const status = statusOf(tally, n, p.polynomial === undefined ? 'exact' : 'kernel');
    if (o['onInvalid'] === 'throw') throwIfRejected(status, channel.name);
    return { values, status };
  }

  function segments(): RtdPolynomialSegments {
    const poly = nominalPrepared.polynomial;
    return poly === undefined
      ? { total: 0, checked: 0, exact: 0, codesPerSegment: 0 }
      : {
          total: poly.segments,
          checked: poly.counts.checked,
          exact: poly.counts.exact,
          codesPerSegment: poly.offsetMask + 1,
        };
  }

  const loop: RtdPolynomialLoop = nominalPrepared.wasm === undefined ? 'javascript' : 'webassembly';
  return Object.freeze({ channel, loop, convert, segments });
}
