import { storedBytes, type SampleType, type TimeStampType } from './recordingLayout.js';

/** Codes of a block, one lane per channel: `Int32Array` for types that fit, else `Float64Array`. */
export type CodeLanes = Int32Array | Float64Array;

/** Time stamps of a block as stored: the typed array that holds the type exactly. */
export type TimeStamps = Uint32Array | BigInt64Array | BigUint64Array | Float64Array;

/** Where the codes sit in each frame. */
export interface FrameGeometry {
  /** How each code is stored. */
  readonly sample: SampleType;
  /** Codes per frame. */
  readonly channels: number;
  /** Bytes per frame. */
  readonly frameBytes: number;
  /** Offset of the first code in a frame (the frame header's size). */
  readonly codeOffset: number;
}

const littleEndianHost = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** Frames de-interleaved at a time on the int32le path (32 KiB of 8-channel frames). */
const DECODE_TILE_FRAMES = 1024;

/**
 * Decodes the codes of `frames` frames into channel lanes: the code of channel `j` in frame `f`
 * goes to `lanes[j * laneStride + f]`.
 *
 * @remarks
 * Each type is decoded by its own loop with `DataView` reads (or, for aligned little-endian int32
 * on a little-endian host, an `Int32Array` view of the bytes): 24-bit codes are assembled from
 * their three bytes and sign-extended for `int24…`; `uint32…` and the float types go to a
 * `Float64Array` (exact: every uint32 and float32 is a double), the others to an `Int32Array`.
 *
 * @param bytes - The frames (at least `frames × frameBytes` bytes).
 * @param frames - Frames to decode.
 * @param geometry - Sample type, channels, frame size and code offset.
 * @param lanes - Receives the codes (`Int32Array` or `Float64Array` as {@link fitsInt32} says).
 * @param laneStride - Distance between lanes (≥ frames).
 */
export function decodeFrames(
  bytes: Uint8Array,
  frames: number,
  geometry: FrameGeometry,
  lanes: CodeLanes,
  laneStride: number,
): void {
  const { sample, channels, frameBytes, codeOffset } = geometry;
  if (frames === 0) return;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const little = sample.endsWith('le');
  if (
    sample === 'int32le' &&
    littleEndianHost &&
    lanes instanceof Int32Array &&
    (bytes.byteOffset + codeOffset) % 4 === 0 &&
    frameBytes % 4 === 0
  ) {
    const words = new Int32Array(
      bytes.buffer,
      bytes.byteOffset + codeOffset,
      ((frames - 1) * frameBytes) / 4 + channels,
    );
    const stride = frameBytes / 4;
    // In tiles of frames, so that each lane's pass reads the tile from the cache, not memory.
    for (let f0 = 0; f0 < frames; f0 += DECODE_TILE_FRAMES) {
      const f1 = Math.min(frames, f0 + DECODE_TILE_FRAMES);
      for (let j = 0; j < channels; j++) {
        const base = j * laneStride;
        for (let f = f0, w = f0 * stride + j; f < f1; f++, w += stride) lanes[base + f] = words[w] as number;
      }
    }
    return;
  }
  for (let j = 0; j < channels; j++) {
    const base = j * laneStride;
    switch (sample) {
      case 'int16le':
      case 'int16be': {
        let p = codeOffset + 2 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) lanes[base + f] = view.getInt16(p, little);
        break;
      }
      case 'uint16le':
      case 'uint16be': {
        let p = codeOffset + 2 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) lanes[base + f] = view.getUint16(p, little);
        break;
      }
      case 'int24le':
      case 'uint24le': {
        const signed = sample === 'int24le';
        let p = codeOffset + 3 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) {
          const u = (bytes[p] as number) | ((bytes[p + 1] as number) << 8) | ((bytes[p + 2] as number) << 16);
          lanes[base + f] = signed ? (u << 8) >> 8 : u;
        }
        break;
      }
      case 'int24be':
      case 'uint24be': {
        const signed = sample === 'int24be';
        let p = codeOffset + 3 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) {
          const u = ((bytes[p] as number) << 16) | ((bytes[p + 1] as number) << 8) | (bytes[p + 2] as number);
          lanes[base + f] = signed ? (u << 8) >> 8 : u;
        }
        break;
      }
      case 'int32le':
      case 'int32be': {
        let p = codeOffset + 4 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) lanes[base + f] = view.getInt32(p, little);
        break;
      }
      case 'uint32le':
      case 'uint32be': {
        let p = codeOffset + 4 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) lanes[base + f] = view.getUint32(p, little);
        break;
      }
      case 'float32le':
      case 'float32be': {
        let p = codeOffset + 4 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) lanes[base + f] = view.getFloat32(p, little);
        break;
      }
      case 'float64le':
      case 'float64be': {
        let p = codeOffset + 8 * j;
        for (let f = 0; f < frames; f++, p += frameBytes) lanes[base + f] = view.getFloat64(p, little);
        break;
      }
    }
  }
}

/**
 * The codes of `frames` frames as an `Int32Array` view of the bytes themselves, when they already
 * lie in memory as one: int32 little-endian on a little-endian host, 4-byte aligned, frames of
 * codes only (no frame header or trailer). Otherwise `undefined` (decode with
 * {@link decodeInterleaved}).
 *
 * @param bytes - The frames.
 * @param frames - Frames to view.
 * @param geometry - Sample type, channels, frame size and code offset.
 * @returns The view (`frames × channels` codes, frame after frame), or `undefined`.
 */
export function interleavedView(
  bytes: Uint8Array,
  frames: number,
  geometry: FrameGeometry,
): Int32Array | undefined {
  const { sample, channels, frameBytes, codeOffset } = geometry;
  if (
    sample !== 'int32le' ||
    !littleEndianHost ||
    codeOffset !== 0 ||
    frameBytes !== 4 * channels ||
    bytes.byteOffset % 4 !== 0
  ) {
    return undefined;
  }
  return new Int32Array(bytes.buffer, bytes.byteOffset, frames * channels);
}

/**
 * Decodes the codes of `frames` frames keeping them interleaved: the code of channel `j` in frame
 * `f` goes to `out[f × channels + j]` (the frame headers and trailers are left out).
 *
 * @remarks
 * The same per-type reads as {@link decodeFrames} (so the same codes, bit for bit), written in one
 * sequential pass over the frames.
 *
 * @param bytes - The frames (at least `frames × frameBytes` bytes).
 * @param frames - Frames to decode.
 * @param geometry - Sample type, channels, frame size and code offset.
 * @param out - Receives `frames × channels` codes (`Int32Array` or `Float64Array` as
 *   {@link fitsInt32} says).
 */
export function decodeInterleaved(
  bytes: Uint8Array,
  frames: number,
  geometry: FrameGeometry,
  out: CodeLanes,
): void {
  const { sample, channels, frameBytes, codeOffset } = geometry;
  if (frames === 0) return;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const little = sample.endsWith('le');
  const size = storedBytes(sample);
  let o = 0;
  for (let f = 0; f < frames; f++) {
    let p = f * frameBytes + codeOffset;
    switch (sample) {
      case 'int16le':
      case 'int16be':
        for (let j = 0; j < channels; j++, p += size) out[o++] = view.getInt16(p, little);
        break;
      case 'uint16le':
      case 'uint16be':
        for (let j = 0; j < channels; j++, p += size) out[o++] = view.getUint16(p, little);
        break;
      case 'int24le':
      case 'uint24le':
        for (let j = 0; j < channels; j++, p += size) {
          const u = (bytes[p] as number) | ((bytes[p + 1] as number) << 8) | ((bytes[p + 2] as number) << 16);
          out[o++] = sample === 'int24le' ? (u << 8) >> 8 : u;
        }
        break;
      case 'int24be':
      case 'uint24be':
        for (let j = 0; j < channels; j++, p += size) {
          const u = ((bytes[p] as number) << 16) | ((bytes[p + 1] as number) << 8) | (bytes[p + 2] as number);
          out[o++] = sample === 'int24be' ? (u << 8) >> 8 : u;
        }
        break;
      case 'int32le':
      case 'int32be':
        for (let j = 0; j < channels; j++, p += size) out[o++] = view.getInt32(p, little);
        break;
      case 'uint32le':
      case 'uint32be':
        for (let j = 0; j < channels; j++, p += size) out[o++] = view.getUint32(p, little);
        break;
      case 'float32le':
      case 'float32be':
        for (let j = 0; j < channels; j++, p += size) out[o++] = view.getFloat32(p, little);
        break;
      case 'float64le':
      case 'float64be':
        for (let j = 0; j < channels; j++, p += size) out[o++] = view.getFloat64(p, little);
        break;
    }
  }
}

/** A new array that holds `length` time stamps of a type exactly. */
export function timeStampArray(type: TimeStampType, length: number): TimeStamps {
  if (type.startsWith('uint32')) return new Uint32Array(length);
  if (type.startsWith('int64')) return new BigInt64Array(length);
  if (type.startsWith('uint64')) return new BigUint64Array(length);
  return new Float64Array(length);
}

/**
 * Copies the time stamp of each of `frames` frames (at `offset` bytes into the frame) into `out`.
 *
 * @remarks
 * 64-bit integer stamps are copied byte by byte into the 64-bit array's memory (reversed when the
 * byte orders of file and host differ), so no `BigInt` is made per frame.
 *
 * @param bytes - The frames.
 * @param frames - Frames to read.
 * @param frameBytes - Bytes per frame.
 * @param offset - Offset of the stamp in a frame.
 * @param type - How the stamp is stored.
 * @param out - Receives the stamps (made by {@link timeStampArray} for `type`).
 */
export function decodeTimeStamps(
  bytes: Uint8Array,
  frames: number,
  frameBytes: number,
  offset: number,
  type: TimeStampType,
  out: TimeStamps,
): void {
  const little = type.endsWith('le');
  if (out instanceof BigInt64Array || out instanceof BigUint64Array) {
    const target = new Uint8Array(out.buffer, out.byteOffset, frames * 8);
    const swap = little !== littleEndianHost;
    for (let f = 0, p = offset, q = 0; f < frames; f++, p += frameBytes, q += 8) {
      for (let k = 0; k < 8; k++) target[q + k] = bytes[p + (swap ? 7 - k : k)] as number;
    }
    return;
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (out instanceof Uint32Array) {
    for (let f = 0, p = offset; f < frames; f++, p += frameBytes) out[f] = view.getUint32(p, little);
  } else {
    for (let f = 0, p = offset; f < frames; f++, p += frameBytes) out[f] = view.getFloat64(p, little);
  }
}
