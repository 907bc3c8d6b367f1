/**
 * The interleaved path of `bridgework convert` (raw outputs: the codes stay frame after frame, all
 * channels are converted at once, and one pass scales, rounds and counts into the writer's buffer).
 * Checked bit for bit against each channel's own `convert` of its lane (the channel package's
 * reference path, taken lane by lane here, not through the interleaved converter the command uses),
 * times the display factor in one multiplication, rounded by `Math.fround` for float32 (IEEE 754
 * round to nearest, ties to even), with the bytes read back through DataView in the stated order;
 * and byte for byte against the lane path of the same pipeline, over every stored type and frame
 * layout. The tolerance is zero throughout: these are the same operations on the same doubles.
 */
import { readFileSync } from 'node:fs';
import { createChannel, createInterleavedConverter, type Channel } from '@bridgework/channel';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createClipCounter } from '../src/data/clipCounter.js';
import { convertRecording, type FrameConverter } from '../src/data/convertRecording.js';
import { createRawWriter } from '../src/data/createRawWriter.js';
import type { OutputSink } from '../src/data/outputSink.js';
import { openRawCodes } from '../src/data/readRawCodes.js';
import type { RawOutputFormat } from '../src/data/outputFormats.js';
import { sampleTypes } from '../src/data/recordingLayout.js';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { caught } from './support/caught.js';
import { codeRange, encodeRecording } from './support/encodeRecording.js';
import { exampleShown, footbridgeNames, footbridgeSpecs } from './support/footbridge.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';
import { passThroughChannel } from './support/passThroughConverter.js';

const { file, outPath } = useTestFiles('interleaved');
const channels: Channel[] = footbridgeNames.map((n) => createChannel(footbridgeSpecs[n]));
const rawFormats: readonly RawOutputFormat[] = ['float32le', 'float32be', 'float64le', 'float64be'];

/** 500 frames sweeping each channel's span, with rail codes in two channels. */
function recording(frames = 500): Int32Array {
  const codes = new Int32Array(frames * 3);
  for (let f = 0; f < frames; f++) {
    channels.forEach((c, j) => {
      const q = c.span.min + ((c.span.max - c.span.min) * f) / (frames - 1);
      codes[f * 3 + j] = c.codeFromQuantity(q);
    });
  }
  codes[9 * 3 + 0] = 2 ** 23 - 1;
  codes[411 * 3 + 2] = -(2 ** 23);
  return codes;
}

/** The library's values, each channel's own `convert` of its lane, frame-major, times `factors`. */
function reference(codes: Int32Array, factors: readonly number[]): Float64Array {
  const n = channels.length;
  const frames = codes.length / n;
  const out = new Float64Array(codes.length);
  channels.forEach((c, j) => {
    const lane = c.convert(Int32Array.from({ length: frames }, (_, f) => codes[f * n + j] as number)).values;
    for (let f = 0; f < frames; f++) out[f * n + j] = (lane[f] as number) * (factors[j] as number);
  });
  return out;
}

/** Reads a raw output file back with DataView, in the format's type and byte order. */
function readBack(bytes: Uint8Array, format: RawOutputFormat): number[] {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const size = format.startsWith('float64') ? 8 : 4;
  const little = format.endsWith('le');
  return Array.from({ length: bytes.length / size }, (_, i) =>
    size === 8 ? view.getFloat64(8 * i, little) : view.getFloat32(4 * i, little),
  );
}

function expectSame(got: readonly number[], want: Float64Array, format: RawOutputFormat): void {
  expect(got).toHaveLength(want.length);
  const narrow = format.startsWith('float32');
  for (let i = 0; i < want.length; i++) {
    const w = narrow ? Math.fround(want[i] as number) : (want[i] as number);
    if (Number.isNaN(w)) expect(got[i], `value ${i}`).toBeNaN();
    else expect(Object.is(got[i], w), `value ${i}: ${got[i]} vs ${w}`).toBe(true);
  }
}

function collector(): OutputSink & { bytes: () => Uint8Array } {
  const chunks: Uint8Array[] = [];
  return {
    write(chunk) {
      chunks.push(typeof chunk === 'string' ? new TextEncoder().encode(chunk) : chunk.slice());
      return Promise.resolve();
    },
    bytes: () => Uint8Array.from(chunks.flatMap((c) => [...c])),
  };
}

describe('bridgework convert to raw values (the interleaved path)', () => {
  const codes = recording();

  for (const format of rawFormats) {
    for (const unit of ['channel', 'display'] as const) {
      it(`${format}, ${unit} units: each channel's own convert, bit for bit; the clip summary as for CSV`, async () => {
        const input = file('rec.bin', int32le([...codes]));
        const out = outPath(`rec.${format}`);
        const io = memoryIo();
        const argv = ['convert', exampleShown, input, '--to', format, '-o', out, '--block', '77'];
        const code = await runCli(unit === 'display' ? [...argv, '--unit', 'display'] : argv, io);
        expect(code).toBe(exitCodes.ok);
        expect(io.stderr.text()).toBe(
          `clipped samples: 2 of 1500 (0.1 %)\n  hanger-h3 (${unit === 'display' ? 'kN' : 'N'}): 1, frame 9\n  deck-temp (°C): 1, frame 411\nwrote 500 rows to ${out}\n`,
        );
        const factors = channels.map((c) => (unit === 'display' ? c.display.factor : 1));
        expectSame(readBack(readFileSync(out), format), reference(codes, factors), format);
      });
    }
  }
});

/** Converts with the pipeline, interleaved or lane by lane, into a raw writer; returns the bytes. */
async function convertBytes(
  path: string,
  layout: Parameters<typeof openRawCodes>[1],
  format: RawOutputFormat,
  interleaved: boolean,
  factors: readonly number[],
): Promise<{ bytes: Uint8Array; clipped: number[] }> {
  const source = await openRawCodes(path, layout);
  const sink = collector();
  const writer = createRawWriter(sink, format, source.channels, source.blockFrames);
  const result = await convertRecording({
    source,
    channels,
    factors,
    writer,
    ...(interleaved ? { frameConverter: createInterleavedConverter(channels) } : {}),
  });
  return { bytes: sink.bytes(), clipped: result.clip.perChannel.map((c) => c.clipped) };
}

describe('the interleaved path equals the lane path byte for byte', () => {
  it('over every stored type, frame headers and trailers, block sizes and output formats (property)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...sampleTypes),
        fc.integer({ min: 0, max: 5 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 1, max: 40 }),
        fc.constantFrom(...rawFormats),
        fc.boolean(),
        fc.integer({ min: 1, max: 60 }),
        async (sample, frameHeaderBytes, frameTrailerBytes, blockFrames, format, display, frames) => {
          const { min, max } = codeRange(sample);
          const list = Array.from({ length: frames * 3 }, (_, i) => {
            const u = ((Math.imul(i + 11, 2654435761) >>> 0) % 100_003) / 100_002;
            const code = Math.round(min + (max - min) * u);
            return sample.startsWith('float32') ? Math.fround(code) : code;
          });
          const layout = { sample, channels: 3, frameHeaderBytes, frameTrailerBytes };
          const path = file('p.bin', encodeRecording(layout, list));
          const factors = channels.map((c) => (display ? c.display.factor : 1));
          const lanes = await convertBytes(path, { ...layout, blockFrames }, format, false, factors);
          const frames2 = await convertBytes(path, { ...layout, blockFrames }, format, true, factors);
          expect(frames2.clipped).toEqual(lanes.clipped);
          expect(Buffer.from(frames2.bytes).equals(Buffer.from(lanes.bytes))).toBe(true);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('int32le over several decoding tiles of 1024 frames, with a short last block', async () => {
    const path = file('tiles.bin', int32le([...recording(3000)]));
    const layout = { sample: 'int32le' as const, channels: 3, blockFrames: 2500 };
    for (const format of rawFormats) {
      const lanes = await convertBytes(path, layout, format, false, [1, 1, 1]);
      const frames = await convertBytes(path, layout, format, true, [1, 1, 1]);
      expect(frames.clipped).toEqual(lanes.clipped);
      expect(Buffer.from(frames.bytes).equals(Buffer.from(lanes.bytes)), format).toBe(true);
    }
  });

  it('int32le frames of codes only are read without decoding: a view of the bytes read', async () => {
    const list = [...recording(70)];
    const path = file('view.bin', int32le(list));
    const source = await openRawCodes(path, { sample: 'int32le', channels: 3, blockFrames: 32 });
    const seen: number[] = [];
    const sizes: number[] = [];
    for await (const block of source.frames!()) {
      expect(block.codes).toBeInstanceOf(Int32Array);
      expect(block.codes.length).toBe(block.frames * 3);
      sizes.push(block.frames);
      seen.push(...block.codes);
    }
    expect(seen).toEqual(list);
    expect(sizes).toEqual([32, 32, 6]);
  });
});

describe('the one pass into the output buffer (ClipCounter.addFrames)', () => {
  it('counts NaN per channel with first and last frame, scales by the factors, rounds to float32', () => {
    const counter = createClipCounter(2);
    // Frames [1, NaN], [0.1, 2], [NaN, NaN] from frame 10.
    const values = Float64Array.of(1, NaN, 0.1, 2, NaN, NaN);
    const target = new Float32Array(6);
    counter.addFrames(values, target, 3, 10, [1, 2], Float64Array.of(3, 1e-3));
    // By hand: 1×3, NaN, 0.1×3, 2×1e-3, NaN, NaN; each rounded to float32.
    expect([...target]).toEqual([3, NaN, Math.fround(0.1 * 3), Math.fround(2 * 1e-3), NaN, NaN]);
    expect(counter.summary()).toEqual({
      frames: 3,
      channels: 2,
      clipped: 3,
      perChannel: [
        { clipped: 1, firstFrame: 12, lastFrame: 12 },
        { clipped: 2, firstFrame: 10, lastFrame: 12 },
      ],
    });
    const inPlace = Float64Array.of(1.5, -2, NaN, 4);
    const c2 = createClipCounter(2);
    c2.addFrames(inPlace, inPlace, 2, 0, [1, 0], Float64Array.of(2, 1));
    expect([...inPlace]).toEqual([3, -2, NaN, 4]);
    expect(c2.summary().perChannel[0]).toEqual({ clipped: 1, firstFrame: 1, lastFrame: 1 });
  });

  it('refuses a value beyond float32, a converter whose count disagrees, ±Infinity and short buffers', () => {
    const c = createClipCounter(2);
    const ones = Float64Array.of(1, 1);
    // 1e38 × 10 = 1e39 > (2 − 2⁻²³) × 2¹²⁷ ≈ 3.4028e38: float32 cannot hold it.
    expect(() =>
      c.addFrames(Float64Array.of(1, 1e38), new Float32Array(2), 1, 4, [0, 0], Float64Array.of(1, 10)),
    ).toThrowBridgeworkError('out-of-range', { param: '--to' });
    expect(() => c.addFrames(Float64Array.of(NaN, 1), new Float64Array(2), 1, 0, [0, 0], ones)).toThrow(
      /reported 0 clipped samples of channel 1 .* but 1 are NaN/,
    );
    expect(() => c.addFrames(Float64Array.of(1, 1), new Float64Array(2), 1, 0, [0, 1], ones)).toThrow(
      /reported 1 clipped samples of channel 2 .* but 0 are NaN/,
    );
    expect(() =>
      c.addFrames(Float64Array.of(1, -Infinity), new Float64Array(2), 1, 0, [0, 0], ones),
    ).toThrowBridgeworkError('model-not-finite', { param: 'values' });
    expect(() =>
      c.addFrames(Float64Array.of(1), new Float64Array(2), 1, 0, [0, 0], ones),
    ).toThrowBridgeworkError('invalid-shape', { param: 'values' });
  });

  it('a value beyond float32 is refused on both paths, never written as ±Infinity', async () => {
    const path = file('big.bin', int32le([1, 2_000_000_000]));
    const frameConverter: FrameConverter = {
      convert(codes, out) {
        for (let i = 0; i < codes.length; i++) out[i] = codes[i] as number;
        return { statuses: [{ rejected: 0 }, { rejected: 0 }] };
      },
    };
    for (const interleaved of [false, true]) {
      const source = await openRawCodes(path, { sample: 'int32le', channels: 2 });
      const run = convertRecording({
        source,
        channels: [passThroughChannel('a'), passThroughChannel('b')],
        factors: [1, 1e30], // 2e9 × 1e30 = 2e39
        writer: createRawWriter(collector(), 'float32le', 2, source.blockFrames),
        ...(interleaved ? { frameConverter } : {}),
      });
      expect(await caught(run), `interleaved: ${interleaved}`).toThrowBridgeworkError('out-of-range', {
        param: '--to',
      });
    }
  });
});
