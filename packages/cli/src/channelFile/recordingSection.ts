import { closestName, formatValue, type SpecIssue } from '@bridgework/core';
import { sampleTypes, timeStampTypes, type SampleType, type TimeStampType } from '../data/formatLists.js';

/** A per-frame time stamp of a raw recording, as the `recording` section states it. */
export interface RecordingTimeStamp {
  /** How it is stored (`uint64le`…). */
  readonly type: TimeStampType;
  /** Its offset from the start of the frame, in bytes (default 0). */
  readonly offsetBytes?: number;
  /** Seconds per tick (1e-6 for a microsecond counter). */
  readonly secondsPerTick?: number;
}

/**
 * The `recording` section of a channel file: how the loggers that read these channels lay out
 * their recordings, written once so that `bridgework convert` needs no layout options.
 *
 * @remarks
 * Raw layouts: a file header of `fileHeaderBytes`, then frames of `frameHeaderBytes` (which may
 * hold `timeStamp`), one code of type `format` per channel in the order of `channels`, and
 * `frameTrailerBytes`. CSV layouts: `codeColumns` (the channels' code columns, in the order of
 * `channels`), `timeColumn` and `keepColumns`. Options given on the command line override the
 * section field by field; `--from` describes another recording, so with it the section's layout
 * is not used at all.
 */
export interface RecordingSection {
  /** `csv`, or the stored code type of a raw recording (`int24be`…). */
  readonly format: 'csv' | SampleType;
  /** The channels the recording holds, in frame (or code-column) order; default every channel, in file order. */
  readonly channels?: readonly string[];
  /** Frames per second. */
  readonly sampleRateHertz?: number;
  /** Raw: bytes before the first frame. */
  readonly fileHeaderBytes?: number;
  /** Raw: bytes at the start of each frame, before the codes. */
  readonly frameHeaderBytes?: number;
  /** Raw: bytes at the end of each frame, after the codes. */
  readonly frameTrailerBytes?: number;
  /** Raw: a time stamp in the frame header. */
  readonly timeStamp?: RecordingTimeStamp;
  /** CSV: the code columns (header names or column numbers from 1), in the order of `channels`. */
  readonly codeColumns?: readonly (string | number)[];
  /** CSV: a column of time in seconds. */
  readonly timeColumn?: string | number;
  /** CSV: the columns passed through as text, or `'none'`. */
  readonly keepColumns?: readonly (string | number)[] | 'none';
}

/** Largest header, trailer or offset, in bytes (the `convert` options' limit). */
const MAX_BYTES = 1_048_576;
const rawKeys = ['fileHeaderBytes', 'frameHeaderBytes', 'frameTrailerBytes', 'timeStamp'] as const;
const csvKeys = ['codeColumns', 'timeColumn', 'keepColumns'] as const;
/** The fields of a `recording` section. */
export const recordingKeys = ['format', 'channels', 'sampleRateHertz', ...rawKeys, ...csvKeys] as const;
const timeStampKeys = ['type', 'offsetBytes', 'secondsPerTick'] as const;
const formats: readonly string[] = ['csv', ...sampleTypes];

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

function unknownFields(
  record: Record<string, unknown>,
  known: readonly string[],
  prefix: string,
): SpecIssue[] {
  return Object.keys(record)
    .filter((k) => !known.includes(k))
    .map((k) => {
      const near = closestName(k, known);
      return {
        code: 'unknown-option' as const,
        path: `${prefix}.${k}`,
        message: `unknown field${near === undefined ? `; expected one of ${known.join(', ')}` : `; did you mean '${near}'?`}`,
      };
    });
}

/** A column: a header name, or a column number from 1. */
const isColumn = (x: unknown): x is string | number =>
  (typeof x === 'string' && x.trim() !== '') || (typeof x === 'number' && Number.isInteger(x) && x >= 1);

/**
 * Validates the `recording` section of a channel file.
 *
 * @param raw - The section as parsed.
 * @param channelNames - The names of the file's channels (every name in `channels` must be one).
 * @param parseQuantity - Reads a quantity written with a unit (`'100 Hz'`).
 * @returns The section when there are no issues, and every issue with its path (`recording.…`).
 */
export function validateRecordingSection(
  raw: unknown,
  channelNames: readonly string[],
  parseQuantity: (text: string, unit: 'Hz' | 's') => number,
): { readonly value?: RecordingSection; readonly issues: readonly SpecIssue[] } {
  const issues: SpecIssue[] = [];
  const at = (path: string, message: string, extra: Partial<SpecIssue> = {}): void => {
    issues.push({ path: `recording${path === '' ? '' : `.${path}`}`, message, ...extra });
  };
  if (!isRecord(raw)) {
    at('', `must be a mapping (format, channels, header sizes…); got ${formatValue(raw)}`);
    return { issues };
  }
  issues.push(...unknownFields(raw, recordingKeys, 'recording'));
  const out: Record<string, unknown> = {};
  const format = raw['format'];
  if (format === undefined) {
    at('format', `is required: csv, or the stored code type (${sampleTypes.join(', ')})`, {
      code: 'missing-option',
    });
  } else if (typeof format !== 'string' || !formats.includes(format)) {
    const near = typeof format === 'string' ? closestName(format, formats) : undefined;
    at('format', `must be csv or one of ${sampleTypes.join(', ')}; got ${formatValue(format)}`, {
      code: 'invalid-option',
      expected: `one of ${formats.join(', ')}`,
      ...(near === undefined ? {} : { suggestion: `did you mean '${near}'?` }),
    });
  } else out['format'] = format;

  const channels = raw['channels'];
  if (channels !== undefined) {
    if (!Array.isArray(channels) || channels.length === 0) {
      at('channels', `must be a non-empty list of the file's channel names; got ${formatValue(channels)}`);
    } else {
      channels.forEach((name: unknown, i) => {
        if (typeof name !== 'string' || !channelNames.includes(name)) {
          const near = typeof name === 'string' ? closestName(name, channelNames) : undefined;
          at(
            `channels[${i}]`,
            `${formatValue(name)} is not a channel of this file${near === undefined ? ` (it has ${channelNames.join(', ')})` : `; did you mean '${near}'?`}`,
            { code: 'invalid-option' },
          );
        } else if (channels.indexOf(name) !== i) {
          at(`channels[${i}]`, `'${name}' is listed twice; each channel has one place in a frame`, {
            code: 'invalid-option',
          });
        }
      });
      out['channels'] = channels;
    }
  }

  const rate = raw['sampleRateHertz'];
  if (rate !== undefined) {
    let hz: number | undefined;
    if (typeof rate === 'number') hz = rate;
    else if (typeof rate === 'string') {
      try {
        hz = parseQuantity(rate, 'Hz');
      } catch (e) {
        at('sampleRateHertz', e instanceof Error ? e.message : String(e));
      }
    } else at('sampleRateHertz', `must be a frequency (100, or '100 Hz'); got ${formatValue(rate)}`);
    if (hz !== undefined) {
      if (Number.isFinite(hz) && hz > 0) out['sampleRateHertz'] = hz;
      else at('sampleRateHertz', `must be above 0 Hz; got ${formatValue(rate)}`, { code: 'out-of-range' });
    }
  }

  const bytes = (record: Record<string, unknown>, key: string, path: string): number | undefined => {
    const v = record[key];
    if (v === undefined) return undefined;
    if (typeof v !== 'number' || !Number.isInteger(v) || v < 0 || v > MAX_BYTES) {
      at(path, `must be a whole number of bytes from 0 to ${MAX_BYTES}; got ${formatValue(v)}`, {
        code: 'out-of-range',
      });
      return undefined;
    }
    return v;
  };
  const isCsv = format === 'csv';
  const sectionFormat = typeof format === 'string' ? format : undefined;
  for (const key of isCsv ? rawKeys : csvKeys) {
    if (raw[key] !== undefined && sectionFormat !== undefined && formats.includes(sectionFormat)) {
      at(
        key,
        `applies to ${isCsv ? 'raw recordings' : 'CSV recordings'}, and this recording is ${sectionFormat}`,
        {
          code: 'invalid-option',
        },
      );
    }
  }
  for (const key of ['fileHeaderBytes', 'frameHeaderBytes', 'frameTrailerBytes'] as const) {
    const v = bytes(raw, key, key);
    if (v !== undefined) out[key] = v;
  }
  const stamp = raw['timeStamp'];
  if (stamp !== undefined) {
    if (!isRecord(stamp))
      at('timeStamp', `must be a mapping (type, offsetBytes, secondsPerTick); got ${formatValue(stamp)}`);
    else {
      issues.push(...unknownFields(stamp, timeStampKeys, 'recording.timeStamp'));
      const type = stamp['type'];
      const ts: Record<string, unknown> = {};
      if (typeof type !== 'string' || !(timeStampTypes as readonly string[]).includes(type)) {
        at('timeStamp.type', `must be one of ${timeStampTypes.join(', ')}; got ${formatValue(type)}`, {
          code: type === undefined ? 'missing-option' : 'invalid-option',
        });
      } else ts['type'] = type;
      const offset = bytes(stamp, 'offsetBytes', 'timeStamp.offsetBytes');
      if (offset !== undefined) ts['offsetBytes'] = offset;
      const tick = stamp['secondsPerTick'];
      if (tick !== undefined) {
        let s: number | undefined;
        if (typeof tick === 'number') s = tick;
        else if (typeof tick === 'string') {
          try {
            s = parseQuantity(tick, 's');
          } catch (e) {
            at('timeStamp.secondsPerTick', e instanceof Error ? e.message : String(e));
          }
        } else
          at('timeStamp.secondsPerTick', `must be a duration (1e-6, or '1 us'); got ${formatValue(tick)}`);
        if (s !== undefined) {
          if (Number.isFinite(s) && s > 0) ts['secondsPerTick'] = s;
          else
            at('timeStamp.secondsPerTick', `must be above 0 s; got ${formatValue(tick)}`, {
              code: 'out-of-range',
            });
        }
      }
      if (typeof ts['type'] === 'string') {
        const size = Number(/\d+/.exec(ts['type'])?.[0]) / 8;
        const need = ((ts['offsetBytes'] as number | undefined) ?? 0) + size;
        const header = (out['frameHeaderBytes'] as number | undefined) ?? 0;
        if (need > header) {
          at(
            'timeStamp',
            `a ${ts['type']} time stamp at byte ${(ts['offsetBytes'] as number | undefined) ?? 0} of the frame needs frameHeaderBytes of at least ${need}; it is ${header}`,
            { code: 'invalid-shape', limit: `${need} bytes` },
          );
        }
        out['timeStamp'] = ts;
      }
    }
  }

  const columnList = (key: 'codeColumns' | 'keepColumns'): void => {
    const v = raw[key];
    if (v === undefined) return;
    if (key === 'keepColumns' && v === 'none') {
      out[key] = 'none';
      return;
    }
    if (!Array.isArray(v) || v.length === 0 || !v.every(isColumn)) {
      at(
        key,
        `must be a non-empty list of header names or column numbers from 1${key === 'keepColumns' ? ", or 'none'" : ''}; got ${formatValue(v)}`,
      );
    } else out[key] = v;
  };
  columnList('codeColumns');
  columnList('keepColumns');
  const time = raw['timeColumn'];
  if (time !== undefined) {
    if (!isColumn(time))
      at('timeColumn', `must be a header name or a column number from 1; got ${formatValue(time)}`);
    else out['timeColumn'] = time;
  }
  const codeColumns = out['codeColumns'] as readonly unknown[] | undefined;
  const listed = (out['channels'] as readonly string[] | undefined) ?? channelNames;
  if (codeColumns !== undefined && codeColumns.length !== listed.length) {
    at(
      'codeColumns',
      `names ${codeColumns.length} column${codeColumns.length === 1 ? '' : 's'} for ${listed.length} channel${listed.length === 1 ? '' : 's'} (${listed.join(', ')}); give one code column per channel, in the same order`,
      { code: 'invalid-shape' },
    );
  }
  return issues.length === 0 ? { value: out as unknown as RecordingSection, issues } : { issues };
}

/**
 * The JSON Schema of the `recording` section, for editors (the command's checks are those of
 * {@link validateRecordingSection}).
 *
 * @returns A JSON-serialisable schema.
 */
export function recordingSectionJsonSchema(): Record<string, unknown> {
  const size = (description: string) => ({
    type: 'integer',
    minimum: 0,
    maximum: MAX_BYTES,
    description,
    'x-unit': 'bytes',
  });
  const column = {
    oneOf: [
      { type: 'string', pattern: '\\S' },
      { type: 'integer', minimum: 1 },
    ],
  };
  return {
    type: 'object',
    description:
      'How the recordings of these channels are laid out, so that `bridgework convert` needs no layout options (command-line options override it)',
    additionalProperties: false,
    required: ['format'],
    properties: {
      format: { enum: formats, description: 'csv, or the stored code type of a raw recording' },
      channels: {
        type: 'array',
        minItems: 1,
        items: { type: 'string' },
        description:
          "The recording's channels, in frame (or code-column) order; default every channel, in file order",
      },
      sampleRateHertz: {
        oneOf: [{ type: 'number', exclusiveMinimum: 0 }, { type: 'string' }],
        description: 'Frames per second',
        'x-unit': 'Hz',
      },
      fileHeaderBytes: size('Raw: bytes before the first frame, skipped'),
      frameHeaderBytes: size('Raw: bytes at the start of each frame (may hold the time stamp)'),
      frameTrailerBytes: size('Raw: bytes at the end of each frame, skipped'),
      timeStamp: {
        type: 'object',
        additionalProperties: false,
        required: ['type'],
        description: 'Raw: a time stamp in the frame header, kept as the time column',
        properties: {
          type: { enum: [...timeStampTypes], description: 'How the time stamp is stored' },
          offsetBytes: size('Offset of the time stamp from the start of the frame'),
          secondsPerTick: {
            oneOf: [{ type: 'number', exclusiveMinimum: 0 }, { type: 'string' }],
            description: 'Seconds per tick of the time stamp',
            'x-unit': 's',
          },
        },
      },
      codeColumns: {
        type: 'array',
        minItems: 1,
        items: column,
        description: 'CSV: the code columns (names or numbers from 1), in the order of channels',
      },
      timeColumn: { ...column, description: 'CSV: a column of time in seconds' },
      keepColumns: {
        oneOf: [{ const: 'none' }, { type: 'array', minItems: 1, items: column }],
        description: "CSV: columns passed through as text, or 'none'",
      },
    },
  };
}
