/**
 * TEST ONLY. Writes raw recordings byte by byte from known codes, independently of the readers:
 * each stored type is encoded from its definition (two's complement or unsigned, the stated byte
 * order; 24-bit codes as three bytes; IEEE 754 floats through DataView), with file headers, frame
 * headers, time stamps and trailers filled with a recognisable pattern.
 */
import type { SampleType, TimeStampType } from '../../src/data/recordingLayout.js';

export interface TestLayout {
  readonly sample: SampleType;
  readonly channels: number;
  readonly fileHeaderBytes?: number;
  readonly frameHeaderBytes?: number;
  readonly frameTrailerBytes?: number;
  readonly timeStamp?: { readonly type: TimeStampType; readonly offsetBytes?: number };
}

const bits = (type: string): number => Number(/\d+/.exec(type)?.[0]);

/** Writes one integer of `bytes` bytes, two's complement, in the given order. */
function putInteger(out: Uint8Array, at: number, value: bigint, bytes: number, little: boolean): void {
  let v = BigInt.asUintN(8 * bytes, value);
  for (let k = 0; k < bytes; k++) {
    out[at + (little ? k : bytes - 1 - k)] = Number(v & 0xffn);
    v >>= 8n;
  }
}

function putValue(out: Uint8Array, at: number, type: string, value: number | bigint): void {
  const little = type.endsWith('le');
  const size = bits(type) / 8;
  const view = new DataView(out.buffer, out.byteOffset, out.byteLength);
  if (type.startsWith('float32')) view.setFloat32(at, Number(value), little);
  else if (type.startsWith('float64')) view.setFloat64(at, Number(value), little);
  else putInteger(out, at, BigInt(value), size, little);
}

/** The bytes of a recording of `codes` (frame-major, `channels` per frame) with optional stamps. */
export function encodeRecording(
  layout: TestLayout,
  codes: readonly number[],
  stamps?: readonly (number | bigint)[],
): Uint8Array {
  const size = bits(layout.sample) / 8;
  const header = layout.frameHeaderBytes ?? 0;
  const trailer = layout.frameTrailerBytes ?? 0;
  const fileHeader = layout.fileHeaderBytes ?? 0;
  const frameBytes = header + layout.channels * size + trailer;
  const frames = codes.length / layout.channels;
  const out = new Uint8Array(fileHeader + frames * frameBytes);
  for (let i = 0; i < fileHeader; i++) out[i] = 0xa5 ^ i;
  for (let f = 0; f < frames; f++) {
    const base = fileHeader + f * frameBytes;
    for (let i = 0; i < header; i++) out[base + i] = 0xee;
    for (let i = 0; i < trailer; i++) out[base + header + layout.channels * size + i] = 0xcc;
    if (layout.timeStamp !== undefined && stamps !== undefined) {
      putValue(
        out,
        base + (layout.timeStamp.offsetBytes ?? 0),
        layout.timeStamp.type,
        stamps[f] as number | bigint,
      );
    }
    for (let j = 0; j < layout.channels; j++) {
      putValue(out, base + header + j * size, layout.sample, codes[f * layout.channels + j] as number);
    }
  }
  return out;
}

/** The range of codes a stored integer type holds (floats: a wide range of integers and fractions). */
export function codeRange(sample: SampleType): { min: number; max: number } {
  const b = bits(sample);
  if (sample.startsWith('uint')) return { min: 0, max: 2 ** b - 1 };
  if (sample.startsWith('int')) return { min: -(2 ** (b - 1)), max: 2 ** (b - 1) - 1 };
  return { min: -(2 ** 31), max: 2 ** 31 - 1 };
}
