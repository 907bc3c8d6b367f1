import { BridgeworkError, checkInteger, checkObject } from '@bridgework/core';
import { buffersOverlap, RejectTally } from './kernel.js';

/** What a conversion did: how many samples converted, and which did not and why. */
export interface ConversionStatus {
  /** Samples in the input (for an interleaved buffer: this channel's samples). */
  readonly samples: number;
  /** Samples converted to a quantity. */
  readonly converted: number;
  /** Samples written as NaN: `railLow + railHigh + outOfRange`. */
  readonly rejected: number;
  /** Codes at or below the converter's low rail. */
  readonly railLow: number;
  /** Codes at or above the converter's high rail. */
  readonly railHigh: number;
  /** Codes inside the rails whose ratio the sensor cannot produce. */
  readonly outOfRange: number;
  /** Output indices of the first rejected samples (at most `maxLocations` of them), ascending. */
  readonly locations: Int32Array;
  /** `'kernel'` (a checked closed form per sample, see `Channel.method`) or `'exact'` (the sensor's curve or the exact scalar map per sample). */
  readonly method: 'kernel' | 'exact';
}

/** Options of a conversion. */
export interface ConvertOptions {
  /** Gauge temperature of this block in °C (strain gauges); default: the channel's. The map is rebuilt for it. */
  readonly temperatureCelsius?: number;
  /** What to do with a code that cannot be converted: write NaN and count it (default), or throw. */
  readonly onInvalid?: 'nan' | 'throw';
  /** How many rejected sample indices to record (integer ≥ 0). Default 1024. */
  readonly maxLocations?: number;
}

/** The result of converting a buffer. */
export interface ConversionResult {
  /** The quantities (the `out` buffer when one was given). */
  readonly values: Float64Array;
  /** What happened. */
  readonly status: ConversionStatus;
}

export function newTally(maxLocations: number, railLowCode: number, railHighCode: number): RejectTally {
  return new RejectTally(maxLocations, railLowCode, railHighCode);
}

const NONE = new Int32Array(0);

export function statusOf(tally: RejectTally, samples: number, method: 'kernel' | 'exact'): ConversionStatus {
  const rejected = tally.rejected;
  return {
    samples,
    converted: samples - rejected,
    rejected,
    railLow: tally.railLow,
    railHigh: tally.railHigh,
    outOfRange: tally.outOfRange,
    locations: tally.locations === undefined ? NONE : tally.locations.slice(0, tally.located),
    method,
  };
}

/** Throws `clipped` for a conversion that rejected samples under the 'throw' policy. */
export function throwIfRejected(status: ConversionStatus, channel: string): void {
  if (status.rejected === 0) return;
  const first = status.locations[0];
  throw new BridgeworkError(
    'clipped',
    `channel '${channel}': ${status.rejected} of ${status.samples} codes cannot be converted (${status.railLow} at the low rail, ${status.railHigh} at the high rail, ${status.outOfRange} out of the sensor's range)${first === undefined ? '' : `; first at index ${first}`}`,
    { param: 'codes', value: status.rejected, ...(first === undefined ? {} : { limit: first }) },
  );
}

/**
 * Checks the arguments every conversion takes: the codes (Int32Array or Float64Array), the output
 * buffer (a Float64Array at least as long, or a new one; the codes' own Float64Array for a
 * conversion in place, but no other memory the codes occupy) and `maxLocations` (integer ≥ 0).
 */
export function readConversionArguments(
  codes: unknown,
  out: unknown,
  options: unknown,
): {
  readonly codes: Int32Array | Float64Array;
  readonly values: Float64Array;
  readonly maxLocations: number;
} {
  if (!(codes instanceof Int32Array || codes instanceof Float64Array)) {
    throw new BridgeworkError('wrong-type', '`codes` must be an Int32Array or a Float64Array', {
      param: 'codes',
    });
  }
  const o = checkObject('options', options);
  const values = out ?? new Float64Array(codes.length);
  if (!(values instanceof Float64Array) || values.length < codes.length) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`out\` must be a Float64Array of at least ${codes.length} values`,
      {
        param: 'out',
        limit: codes.length,
      },
    );
  }
  // In place is supported (each block is range-tested before it is written); any other overlap
  // would read codes that earlier samples have already overwritten.
  if (
    buffersOverlap(codes, values) &&
    !(codes instanceof Float64Array && codes.byteOffset === values.byteOffset)
  ) {
    throw new BridgeworkError(
      'invalid-shape',
      codes instanceof Float64Array
        ? '`out` overlaps `codes` but starts at a different element: convert in place (`out` = `codes`) or into a separate buffer'
        : '`out` shares memory with the Int32Array `codes`: convert into a separate Float64Array',
      { param: 'out' },
    );
  }
  const maxLocations =
    o['maxLocations'] === undefined ? 1024 : checkInteger('maxLocations', o['maxLocations'], { min: 0 });
  return { codes, values, maxLocations };
}
