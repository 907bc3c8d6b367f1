import { BridgeworkError, checkInteger, checkOneOf, checkOptions, checkPositive } from '@bridgework/core';
import { sampleTypes, timeStampTypes, type SampleType, type TimeStampType } from './formatLists.js';

export { sampleTypes, timeStampTypes, type SampleType, type TimeStampType } from './formatLists.js';

/** Bytes of one stored value of a sample or time-stamp type. */
export function storedBytes(type: SampleType | TimeStampType): number {
  const bits = Number(/\d+/.exec(type)?.[0]);
  return bits / 8;
}

/** A per-frame time stamp inside the frame header. */
export interface TimeStampLayout {
  /** How it is stored. */
  readonly type: TimeStampType;
  /** Its position in the frame header, bytes from the start of the frame (integer ≥ 0). Default 0. */
  readonly offsetBytes?: number;
  /** Seconds per tick (> 0), to place time windows; e.g. 1e-6 for a microsecond counter. */
  readonly secondsPerTick?: number;
}

/**
 * The layout of a raw recording: a file header, then frame after frame, each frame a header, one
 * code per channel in channel order, and a trailer.
 *
 * @remarks
 * ```
 * file:  [fileHeaderBytes] [frame 0] [frame 1] ...
 * frame: [frameHeaderBytes (may hold a time stamp)] [code 1] ... [code N] [frameTrailerBytes]
 * ```
 * Header and trailer bytes are skipped, except a time stamp, which is read from the frame header
 * and kept as the recording's time column.
 */
export interface RawLayout {
  /** How each code is stored. */
  readonly sample: SampleType;
  /** Codes per frame, one per channel (integer in [1, 4096]). */
  readonly channels: number;
  /** Bytes before the first frame, skipped (integer ≥ 0). Default 0. */
  readonly fileHeaderBytes?: number;
  /** Bytes at the start of every frame, before the codes (integer ≥ 0). Default 0. */
  readonly frameHeaderBytes?: number;
  /** Bytes at the end of every frame, after the codes, skipped (integer ≥ 0). Default 0. */
  readonly frameTrailerBytes?: number;
  /** A time stamp in the frame header, kept as the time column. Default none. */
  readonly timeStamp?: TimeStampLayout;
}

/** A time stamp of a {@link CheckedRawLayout}. */
export interface CheckedTimeStamp {
  /** How it is stored. */
  readonly type: TimeStampType;
  /** Its offset from the start of the frame, in bytes. */
  readonly offsetBytes: number;
  /** Its size in bytes. */
  readonly bytes: number;
  /** Seconds per tick, when stated. */
  readonly secondsPerTick?: number;
}

/** A {@link RawLayout} with every default applied and the byte offsets worked out. */
export interface CheckedRawLayout {
  /** How each code is stored. */
  readonly sample: SampleType;
  /** Codes per frame. */
  readonly channels: number;
  /** Bytes before the first frame. */
  readonly fileHeaderBytes: number;
  /** Bytes at the start of each frame. */
  readonly frameHeaderBytes: number;
  /** Bytes at the end of each frame. */
  readonly frameTrailerBytes: number;
  /** The time stamp, or `undefined`. */
  readonly timeStamp: CheckedTimeStamp | undefined;
  /** Bytes of one code. */
  readonly sampleBytes: number;
  /** Bytes of one frame. */
  readonly frameBytes: number;
}

/** Largest header, trailer or file-header size accepted: 1 MiB. */
const MAX_HEADER_BYTES = 1 << 20;

/**
 * Checks a raw layout and fills in its defaults.
 *
 * @param layout - The layout.
 * @returns The checked layout with byte sizes (`timeStamp` is `undefined` when there is none).
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option`,
 * `invalid-option` (a type not in the list), `not-integer` / `out-of-range` (sizes), `invalid-shape`
 * (a time stamp that does not fit in the frame header).
 * @example
 * ```ts
 * checkRawLayout({ sample: 'int24be', channels: 8, frameHeaderBytes: 8, timeStamp: { type: 'uint64le' } }).frameBytes; // 32
 * ```
 */
export function checkRawLayout(layout: RawLayout): CheckedRawLayout {
  const o = checkOptions('layout', layout, {
    known: ['sample', 'channels', 'fileHeaderBytes', 'frameHeaderBytes', 'frameTrailerBytes', 'timeStamp'],
    required: ['sample', 'channels'],
  });
  const sample = checkOneOf('layout.sample', o['sample'], sampleTypes);
  const channels = checkInteger('layout.channels', o['channels'], { min: 1, max: 4096 });
  const size = (key: string): number =>
    o[key] === undefined ? 0 : checkInteger(`layout.${key}`, o[key], { min: 0, max: MAX_HEADER_BYTES });
  const fileHeaderBytes = size('fileHeaderBytes');
  const frameHeaderBytes = size('frameHeaderBytes');
  const frameTrailerBytes = size('frameTrailerBytes');
  let timeStamp: CheckedTimeStamp | undefined;
  if (o['timeStamp'] !== undefined) {
    const t = checkOptions('layout.timeStamp', o['timeStamp'], {
      known: ['type', 'offsetBytes', 'secondsPerTick'],
      required: ['type'],
    });
    const type = checkOneOf('layout.timeStamp.type', t['type'], timeStampTypes);
    const offsetBytes =
      t['offsetBytes'] === undefined
        ? 0
        : checkInteger('layout.timeStamp.offsetBytes', t['offsetBytes'], { min: 0, max: MAX_HEADER_BYTES });
    const bytes = storedBytes(type);
    if (offsetBytes + bytes > frameHeaderBytes) {
      throw new BridgeworkError(
        'invalid-shape',
        `a ${type} time stamp at byte ${offsetBytes} of the frame needs a frame header of at least ${offsetBytes + bytes} bytes; the frame header has ${frameHeaderBytes}`,
        { param: 'layout.frameHeaderBytes', value: frameHeaderBytes, limit: offsetBytes + bytes },
      );
    }
    timeStamp = {
      type,
      offsetBytes,
      bytes,
      ...(t['secondsPerTick'] === undefined
        ? {}
        : { secondsPerTick: checkPositive('layout.timeStamp.secondsPerTick', t['secondsPerTick']) }),
    };
  }
  const sampleBytes = storedBytes(sample);
  return {
    sample,
    channels,
    fileHeaderBytes,
    frameHeaderBytes,
    frameTrailerBytes,
    timeStamp,
    sampleBytes,
    frameBytes: frameHeaderBytes + channels * sampleBytes + frameTrailerBytes,
  };
}

/** True when codes of this type fit an `Int32Array` exactly (else they are held as doubles). */
export function fitsInt32(sample: SampleType): boolean {
  return !sample.startsWith('float') && !sample.startsWith('uint32');
}
