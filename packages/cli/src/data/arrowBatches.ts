import {
  Field,
  Float64,
  Int64,
  makeData,
  RecordBatch,
  Schema,
  Struct,
  Uint32,
  Uint64,
  Utf8,
  vectorFromArray,
  type Data,
  type DataType,
} from 'apache-arrow';
import type { ConvertedBlock } from './convertRecording.js';
import type { RecordingColumns } from './recordingColumns.js';

const littleEndianHost = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** The Arrow type of the time column (or of the frame column when there is no time). */
function timeType(columns: RecordingColumns): DataType {
  const t = columns.time;
  if (t === undefined) return new Int64();
  if (t.type.startsWith('uint32')) return new Uint32();
  if (t.type.startsWith('int64')) return new Int64();
  if (t.type.startsWith('uint64')) return new Uint64();
  return new Float64();
}

function emptyStamps(type: DataType): Uint32Array | BigInt64Array | BigUint64Array | Float64Array {
  if (type instanceof Uint32) return new Uint32Array(0);
  if (type instanceof Int64) return new BigInt64Array(0);
  if (type instanceof Uint64) return new BigUint64Array(0);
  return new Float64Array(0);
}

/**
 * The Arrow schema of a converted recording: the time column (or `frame`, the frame index, when
 * the recording has no time), the passed-through CSV columns (UTF-8 text), then one nullable
 * float64 column per channel named after the channel. Field metadata: `unit` and `quantity` on
 * each channel column, `unit` (`s`) or `seconds-per-tick` on the time column; schema metadata:
 * `columns.metadata`.
 *
 * @param columns - The columns.
 * @returns The schema.
 */
export function recordingSchema(columns: RecordingColumns): Schema {
  const t = columns.time;
  const timeMeta = new Map<string, string>();
  if (t === undefined) timeMeta.set('description', 'frame index from 0');
  else if (t.type === 'seconds') timeMeta.set('unit', 's');
  else {
    timeMeta.set('description', `time stamp as stored (${t.type})`);
    if (t.secondsPerTick !== undefined) timeMeta.set('seconds-per-tick', String(t.secondsPerTick));
  }
  const fields = [
    new Field(t === undefined ? 'frame' : t.name, timeType(columns), false, timeMeta),
    ...columns.passThrough.map((name) => new Field(name, new Utf8(), false)),
    ...columns.channels.map(
      (c) =>
        new Field(
          c.name,
          new Float64(),
          true,
          new Map([
            ['unit', c.unit],
            ['quantity', c.quantity],
          ]),
        ),
    ),
  ];
  return new Schema(fields, new Map(Object.entries(columns.metadata)));
}

/**
 * Builds Arrow record batches of converted blocks against {@link recordingSchema}.
 *
 * @remarks
 * Channel columns are views of the block's value lanes (no copy); a flagged sample (NaN) is null,
 * with a validity bitmap built only for a lane that holds one. Time stamps are views too; the frame
 * column is filled per block (64-bit integers written as two 32-bit halves, no `BigInt` per frame).
 * A batch refers to the block's memory, so it must be serialized before the block is reused; the
 * builder's own arrays (frame column, bitmaps) come in two sets used in turn, so a batch stays
 * valid while the next one is built.
 */
export function createBatchBuilder(columns: RecordingColumns, blockFrames: number) {
  const schema = recordingSchema(columns);
  const struct = new Struct(schema.fields);
  const channelCount = columns.channels.length;
  const timeDataType = schema.fields[0]!.type as DataType;
  const sets = [0, 1].map(() => {
    const frameIndex = columns.time === undefined ? new BigInt64Array(blockFrames) : undefined;
    return {
      frameIndex,
      frameWords: frameIndex === undefined ? undefined : new Uint32Array(frameIndex.buffer),
      bitmaps: columns.channels.map(() => new Uint8Array(Math.ceil(blockFrames / 8))),
    };
  });
  let turn = 0;

  return {
    schema,
    /** The batch of one block. */
    batch(block: ConvertedBlock): RecordBatch {
      const { frameIndex, frameWords, bitmaps } = sets[turn] as (typeof sets)[number];
      turn ^= 1;
      const n = block.frames;
      let time: Data;
      if (frameWords !== undefined && frameIndex !== undefined) {
        const lo = littleEndianHost ? 0 : 1;
        const first = block.firstFrame;
        if (first + n <= 4294967296) {
          // Every index of the block fits the low word (the usual case): int arithmetic only.
          for (let f = 0, i = first >>> 0; f < n; f++, i = (i + 1) >>> 0) {
            frameWords[2 * f + lo] = i;
            frameWords[2 * f + 1 - lo] = 0;
          }
        } else {
          for (let f = 0; f < n; f++) {
            const i = first + f;
            frameWords[2 * f + lo] = i % 4294967296;
            frameWords[2 * f + 1 - lo] = Math.floor(i / 4294967296);
          }
        }
        time = makeData({ type: new Int64(), length: n, nullCount: 0, data: frameIndex.subarray(0, n) });
      } else {
        const stamps = block.timeStamps ?? (n === 0 ? emptyStamps(timeDataType) : undefined);
        if (stamps === undefined)
          throw new Error('a recording with a time column gave a block without time stamps');
        time = makeData({
          type: timeDataType,
          length: n,
          nullCount: 0,
          data: stamps.subarray(0, n),
        } as Parameters<typeof makeData>[0]) as Data;
      }
      const texts = (block.passThrough ?? []).map(
        (column) => vectorFromArray(column.slice(0, n), new Utf8()).data[0] as Data,
      );
      const lanes: Data[] = [];
      for (let j = 0; j < channelCount; j++) {
        const values = block.values.subarray(j * block.laneStride, j * block.laneStride + n);
        const nulls = block.rejected[j] as number;
        if (nulls === 0) {
          lanes.push(makeData({ type: new Float64(), length: n, nullCount: 0, data: values }));
          continue;
        }
        const bitmap = bitmaps[j] as Uint8Array;
        bitmap.fill(0);
        for (let f = 0; f < n; f++) {
          const v = values[f] as number;
          if (v === v) bitmap[f >> 3] = (bitmap[f >> 3] as number) | (1 << (f & 7));
        }
        lanes.push(
          makeData({
            type: new Float64(),
            length: n,
            nullCount: nulls,
            data: values,
            nullBitmap: bitmap.subarray(0, Math.ceil(n / 8)),
          }),
        );
      }
      const children = [time, ...texts, ...lanes];
      return new RecordBatch(schema, makeData({ type: struct, length: n, nullCount: 0, children }));
    },
  };
}
