import { createHash } from 'node:crypto';
import { readFile, stat } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { basename } from 'node:path';
import {
  createChannel,
  createInterleavedConverter,
  type Channel,
  type ChannelSpec,
} from '@bridgework/channel';
import { BridgeworkError } from '@bridgework/core';
import { SAFETY_CAUTION } from '../../caution.js';
import { loadChannels, type LoadedChannel } from '../../channels/loadChannels.js';
import { formatClipSummary } from '../../data/clipCounter.js';
import { startConversionLanes, type ConversionLanes } from '../../data/conversionLanes.js';
import { convertRecording, type BlockTemperature } from '../../data/convertRecording.js';
import { openCodeSource, type OpenCodeSourceOptions } from '../../data/openCodeSource.js';
import type { RecordingSection } from '../../channelFile/recordingSection.js';
import { writeRecording } from '../../data/openRecordingOutput.js';
import { outputFormatFromPath } from '../../data/outputFormats.js';
import type { ChannelColumn, RecordingColumns } from '../../data/recordingColumns.js';
import { parseTimeWindow, windowMeans, type WindowMeans } from '../../data/timeWindow.js';
import { exitCodes } from '../../exitCodes.js';
import { refuseOutputOverInputs } from '../../internal/fileErrors.js';
import { readVersion } from '../../internal/readVersion.js';
import { splitOptionList } from '../../internal/splitOptionList.js';
import { planGroupOutput, type GroupOutputPlan } from '../../groups/groupWriter.js';
import { loadGroups } from '../../groups/loadGroups.js';
import type { CommandContext } from '../CommandContext.js';
import type { ConvertArgs } from './convertOptions.js';

/**
 * Splits `--channels`: channel names, comma-separated.
 *
 * @param list - The option's text, e.g. `'hook,trolley'`.
 * @returns The names.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an empty entry.
 */
export function parseChannelList(list: string): string[] {
  return splitOptionList(list, '--channels');
}

/**
 * Splits a `--columns` or `--keep-columns` list: column numbers (from 1) and header names.
 *
 * @param list - The option's text, e.g. `'2,4'` or `'hook,trolley'`.
 * @param option - The option, for messages.
 * @returns Numbers for digit-only entries, names otherwise.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an empty entry.
 */
export function parseColumnList(list: string, option = '--columns'): (string | number)[] {
  return splitOptionList(list, option).map((t) => (/^\d+$/.test(t) ? Number(t) : t));
}

/** The positions (in the recording's channel order) of the channels a list names. */
function positionsOf(
  list: string,
  option: string,
  channels: readonly LoadedChannel[],
  allowed: (c: LoadedChannel) => string | undefined,
): number[] {
  return splitOptionList(list, option).map((name) => {
    const i = channels.findIndex((c) => c.name === name);
    if (i < 0) {
      throw new BridgeworkError(
        'invalid-option',
        `${option}: '${name}' is not one of the recording's channels (${channels.map((c) => c.name).join(', ')}); the recording's channels are those of --channels`,
        { param: option, value: name },
      );
    }
    const why = allowed(channels[i] as LoadedChannel);
    if (why !== undefined) {
      throw new BridgeworkError('invalid-option', `${option}: '${name}' ${why}`, {
        param: option,
        value: name,
      });
    }
    return i;
  });
}

const isTemperature = (c: LoadedChannel): boolean => c.channel.quantity === 'temperature';

/**
 * The body of `bridgework convert`: loads the channel file, opens the recording, applies the
 * corrections taken from the data (zero readings from a window, the temperature channel's
 * per-block temperature), and streams the conversion of every lane through its channel's exact
 * map into the chosen output format, with a progress bar on a terminal and a summary of flagged
 * samples on standard error.
 *
 * @remarks
 * Column headings (CSV) are `name (unit)`; columnar outputs name columns after the channels and
 * keep the unit in the column metadata. Values are in the channel's unit, or with `--unit display`
 * in the unit a report shows (one multiplication per value).
 *
 * @param args - The parsed command line.
 * @param context - The command context.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` when samples were flagged and
 * `--fail-on-clip` is set.
 * @throws {@link @bridgework/core!BridgeworkError} for a bad channel file, recording, option or
 * output (see the readers and {@link writeRecording}).
 */
export async function run(args: ConvertArgs, context: CommandContext): Promise<number> {
  const lanes = await startLanes(args, context);
  try {
    return await convertWith(args, context, lanes);
  } finally {
    await lanes?.close();
  }
}

/**
 * From these input sizes up, `--convert-threads` defaults to worker threads on a machine of more
 * than two processors: a worker's start-up (loading the channel package, making the channels)
 * costs about 0.4 CPU s, which one thread spends converting about 8 MiB of int32 codes to CSV,
 * 30 MiB to Parquet and 300 MiB to raw or Arrow (docs/performance.md).
 */
const THREADED_FROM_BYTES = { csv: 8 * 2 ** 20, parquet: 64 * 2 ** 20, other: 256 * 2 ** 20 } as const;

/**
 * From this input size up, `--parquet-encoder auto` encodes in a worker thread on a machine of
 * more than two processors: 16 MiB, about ten times the input one thread converts to Parquet in
 * the 0.05–0.1 s the encoder thread takes to start and load parquet-wasm. On two vCPUs it was
 * 10 % faster near quiet and slower under load from other work (docs/performance.md), so it stays
 * off there unless asked for.
 */
const PARQUET_ENCODER_THREAD_FROM_BYTES = 16 << 20;

/**
 * The worker threads of a run (`--convert-threads`), started before the channel file is read so
 * that their start-up overlaps this thread's. By default none on one or two processors (measured
 * not to pay on a 2-processor machine shared with other work: docs/performance.md); on more, one
 * fewer than the processors (at most 4) when the input is at least {@link THREADED_FROM_BYTES}
 * for the output format. None for a channel kit of other sensor kinds: the workers make channels
 * with the built-in package.
 */
async function startLanes(args: ConvertArgs, context: CommandContext): Promise<ConversionLanes | undefined> {
  if (context.channels !== undefined) return undefined;
  let threads = args.options.convertThreads;
  if (threads === undefined) {
    const { out, to } = args.options;
    let format: string;
    try {
      format = to ?? outputFormatFromPath(out === undefined || out === '-' ? undefined : out);
    } catch {
      return undefined; // the run reports the format
    }
    const from = format === 'csv' ? 'csv' : format === 'parquet' ? 'parquet' : 'other';
    const size = await stat(args.positionals.codesFile).then(
      (s) => s.size,
      () => 0,
    );
    const processors = availableParallelism();
    threads = processors > 2 && size >= THREADED_FROM_BYTES[from] ? Math.min(4, processors - 1) : 0;
  }
  return threads > 0 ? startConversionLanes(threads) : undefined;
}

async function convertWith(
  args: ConvertArgs,
  context: CommandContext,
  lanes: ConversionLanes | undefined,
): Promise<number> {
  const { options } = args;
  const input = args.positionals.codesFile;
  const channelFile = args.positionals.channelFile;
  const output = options.out === undefined || options.out === '-' ? undefined : options.out;
  if (output !== undefined) await refuseOutputOverInputs(output, [input, channelFile]);
  const names = options.channels === undefined ? undefined : parseChannelList(options.channels);
  // The channel file's recording section gives the layout, unless --from describes another one.
  const loaded = await loadChannels(
    channelFile,
    (file) => names ?? (options.from === undefined ? file.recording?.channels : undefined),
    context.channels,
  );
  const section = options.from === undefined ? loaded.file.recording : undefined;
  const all = loaded.channels;
  const sampleRate = options.sampleRate ?? section?.sampleRateHertz;
  if (sampleRate !== undefined && !(sampleRate > 0)) {
    throw new BridgeworkError('invalid-option', `--sample-rate must be above 0 Hz; got ${sampleRate}`, {
      param: '--sample-rate',
      value: sampleRate,
    });
  }
  const layout = recordingLayout(options, section);

  const source = await openCodeSource(input, {
    channels: all.length,
    blockFrames: options.block,
    ...layout,
  });
  if (source.channels !== all.length) {
    throw new BridgeworkError(
      'invalid-shape',
      `${input} has ${source.channels} code column${source.channels === 1 ? '' : 's'}, but ${all.length} channel${all.length === 1 ? ' is' : 's are'} selected; choose them with --columns and --channels`,
      { param: '<codes-file>', value: source.channels, limit: all.length },
    );
  }

  // Per-block temperature correction.
  let temperature: BlockTemperature | undefined;
  if (options.temperatureFrom !== undefined) {
    const [from] = positionsOf(options.temperatureFrom, '--temperature-from', all, (c) =>
      isTemperature(c) ? undefined : `measures ${c.channel.quantity}, not temperature`,
    ) as [number];
    const corrects =
      options.temperatureCorrects === undefined
        ? all.flatMap((c, i) => (c.spec.sensor.kind === 'strain-gauge' ? [i] : []))
        : positionsOf(options.temperatureCorrects, '--temperature-corrects', all, (c) =>
            isTemperature(c)
              ? 'is a temperature channel; its own reading needs no temperature correction'
              : undefined,
          );
    if (corrects.length === 0) {
      throw new BridgeworkError(
        'invalid-option',
        `--temperature-from: the recording has no strain-gauge channel to correct; name the channels with --temperature-corrects`,
        { param: '--temperature-corrects' },
      );
    }
    temperature = { from, corrects };
  } else if (options.temperatureCorrects !== undefined) {
    throw new BridgeworkError(
      'missing-option',
      '--temperature-corrects needs --temperature-from (the temperature channel)',
      {
        param: '--temperature-from',
      },
    );
  }

  // Zero readings from a window of the data.
  let channels: Channel[] = all.map((c) => c.channel);
  let zero:
    | { window: string; means: WindowMeans; zeroed: number[]; temperatureCelsius: number | undefined }
    | undefined;
  if (options.zeroWindow !== undefined) {
    const window = parseTimeWindow(options.zeroWindow, '--zero-window');
    const zeroed =
      options.zeroChannels === undefined
        ? all.flatMap((c, i) => (isTemperature(c) ? [] : [i]))
        : positionsOf(options.zeroChannels, '--zero-channels', all, (c) =>
            isTemperature(c)
              ? 'is a temperature channel: its reading is absolute and has no zero'
              : undefined,
          );
    if (zeroed.length === 0) {
      throw new BridgeworkError('invalid-option', '--zero-window: the recording has no channel to re-zero', {
        param: '--zero-channels',
      });
    }
    const means = await windowMeans(
      source,
      window,
      sampleRate === undefined ? {} : { sampleRateHertz: sampleRate },
      (j, code) =>
        code > (channels[j] as Channel).validCodes.min && code < (channels[j] as Channel).validCodes.max,
    );
    for (const j of [...zeroed, ...(temperature === undefined ? [] : [temperature.from])]) {
      if ((means.validCodes[j] as number) === 0) {
        throw new BridgeworkError(
          'out-of-range',
          `--zero-window: channel '${(all[j] as LoadedChannel).name}' has no valid code in frames ${means.firstFrame} to ${means.lastFrame} (all at the rails or out of range); choose another window`,
          { param: '--zero-window', value: options.zeroWindow },
        );
      }
    }
    const zeroTemperature =
      temperature === undefined
        ? undefined
        : (channels[temperature.from] as Channel).quantityFromCode(
            means.meanCodes[temperature.from] as number,
          );
    channels = channels.map((c, j) => {
      if (!zeroed.includes(j)) return c;
      const spec = (all[j] as LoadedChannel).spec;
      const rezeroed: ChannelSpec = {
        ...spec,
        zero: { code: means.meanCodes[j] as number },
        ...(zeroTemperature === undefined
          ? {}
          : { environment: { ...spec.environment, zeroTemperatureCelsius: zeroTemperature } }),
      };
      return createChannel(rezeroed);
    });
    zero = { window: options.zeroWindow, means, zeroed, temperatureCelsius: zeroTemperature };
  }

  // Columns and metadata.
  const display = options.unit === 'display';
  const units = channels.map((c) => (display ? c.display : { unit: c.unit, factor: 1 }));
  const channelColumns: ChannelColumn[] = all.map((c, j) => ({
    name: c.name,
    unit: (units[j] as { unit: string }).unit,
    quantity: c.channel.quantity,
  }));
  const channelBytes = await readFile(channelFile);
  const metadata: Record<string, string> = {
    'bridgework.version': await readVersion(),
    'bridgework.caution': SAFETY_CAUTION,
    'bridgework.channel-file': basename(channelFile),
    'bridgework.channel-file.sha256': createHash('sha256').update(channelBytes).digest('hex'),
    'bridgework.recording': basename(input),
    'bridgework.recording.format': source.format,
    'bridgework.channels': JSON.stringify(channelColumns),
    'bridgework.flagged':
      'samples whose code is at or beyond the converter rails, or outside what the sensor can produce, are null (NaN in CSV and raw outputs)',
    'bridgework.recording.layout-from': layoutFrom(options, section, basename(channelFile)),
    ...(sampleRate === undefined ? {} : { 'bridgework.sample-rate-hertz': String(sampleRate) }),
    ...(zero === undefined
      ? {}
      : {
          'bridgework.zero-window': zero.window,
          'bridgework.zero-codes': JSON.stringify(
            Object.fromEntries(
              zero.zeroed.map((j) => [(all[j] as LoadedChannel).name, zero?.means.meanCodes[j]]),
            ),
          ),
        }),
    ...(temperature === undefined
      ? {}
      : {
          'bridgework.temperature-from': (all[temperature.from] as LoadedChannel).name,
          'bridgework.temperature-corrects': temperature.corrects
            .map((j) => (all[j] as LoadedChannel).name)
            .join(','),
        }),
  };
  // Multi-bridge groups (--groups): their components beside or instead of their bridges.
  if (options.dropBridges && options.groups === undefined) {
    throw new BridgeworkError(
      'missing-option',
      '--drop-bridges needs --groups (the groups whose bridges it drops)',
      {
        param: '--groups',
      },
    );
  }
  const groupPlan =
    options.groups === undefined
      ? undefined
      : planGroupOutput({
          groups: await loadGroups(loaded),
          names: splitOptionList(options.groups, '--groups'),
          dropBridges: options.dropBridges,
          channels: channelColumns,
          factors: units.map((u) => u.factor),
          blockFrames: source.blockFrames,
        });
  if (groupPlan !== undefined) metadata['bridgework.groups'] = groupPlan.metadata;
  const columns: RecordingColumns = {
    channels: groupPlan?.columns ?? channelColumns,
    time: source.timeColumn,
    passThrough: source.passThroughNames,
    metadata,
  };

  const format = options.to ?? outputFormatFromPath(output);
  const progress = context.progressBar({ label: 'converting', total: source.totalBytes, unit: 'bytes' });
  let result;
  let groupWriter: ReturnType<GroupOutputPlan['wrap']> | undefined;
  try {
    result = await writeRecording(
      {
        format,
        output,
        stdout: context.io.stdout,
        force: options.force,
        columns,
        blockFrames: source.blockFrames,
        ...(options.digits === undefined ? {} : { digits: options.digits }),
        parquetCompression: options.parquetCompression,
        parquetEncoderThread:
          options.parquetEncoder === 'worker-thread' ||
          (options.parquetEncoder === 'auto' &&
            availableParallelism() > 2 &&
            source.totalBytes >= PARQUET_ENCODER_THREAD_FROM_BYTES),
      },
      (writer) =>
        convertRecording({
          source,
          channels,
          // With groups, the writer applies the display factors after the groups read the channels' own units.
          ...(groupPlan === undefined ? { factors: units.map((u) => u.factor) } : {}),
          ...(temperature === undefined ? {} : { temperature }),
          // Raw outputs take the frames as read, converted by all channels at once.
          ...(groupPlan === undefined ? { frameConverter: createInterleavedConverter(channels) } : {}),
          writer: groupPlan === undefined ? writer : (groupWriter = groupPlan.wrap(writer)),
          ...(lanes === undefined
            ? {}
            : {
                lanes: {
                  pool: lanes,
                  specs: channels.map((c) => c.spec),
                  // Every block to the workers, none converted here while they start (tests, measurements).
                  whileStarting:
                    context.io.env['BRIDGEWORK_CONVERT_THREADS_FROM_START'] === '1' ? 'wait' : 'main',
                },
              }),
          onBlock: (block) => progress.update(block.bytesRead),
        }),
    );
  } finally {
    progress.finish();
  }

  const headings = channelColumns.map((c) => `${c.name} (${c.unit})`);
  let summary = formatClipSummary(result.clip, headings);
  if (zero !== undefined) {
    summary += `zero readings from frames ${zero.means.firstFrame} to ${zero.means.lastFrame}: ${zero.zeroed
      .map((j) => `${(all[j] as LoadedChannel).name} ${formatCode(zero?.means.meanCodes[j] as number)}`)
      .join(
        ', ',
      )}${zero.temperatureCelsius === undefined ? '' : ` at ${zero.temperatureCelsius.toFixed(2)} °C`}\n`;
  }
  const groupFlagged = [...(groupWriter?.flagged ?? new Map<string, number>())].filter(
    ([, count]) => count > 0,
  );
  if (groupFlagged.length > 0) {
    summary += `group components written as NaN (a bridge reading flagged, or readings the calibration cannot explain): ${groupFlagged
      .map(([name, count]) => `${name} ${count}`)
      .join(', ')}\n`;
  }
  if (temperature !== undefined && result.temperatureGaps.frames > 0) {
    const g = result.temperatureGaps;
    summary += `no valid temperature in ${g.frames} frames (frames ${g.firstFrame} to ${g.lastFrame}): the corrected channels are NaN there\n`;
  }
  const flagged = result.clip.clipped > 0 || result.temperatureGaps.frames > 0 || groupFlagged.length > 0;
  context.io.stderr.write(flagged ? context.stderrStyle.yellow(summary) : summary);
  if (output !== undefined) context.io.stderr.write(`wrote ${result.frames} rows to ${output}\n`);
  return flagged && options.failOnClip ? exitCodes.failedCheck : exitCodes.ok;
}

/** A mean code in full (shortest round trip), so that it can be copied into `zero.code` exactly. */
function formatCode(code: number): string {
  return String(code);
}

/** The layout options of the command line, as their names. */
const LAYOUT_OPTIONS = [
  ['from', '--from'],
  ['channels', '--channels'],
  ['fileHeader', '--file-header'],
  ['frameHeader', '--frame-header'],
  ['frameTrailer', '--frame-trailer'],
  ['timeStamp', '--time-stamp'],
  ['timeStampAt', '--time-stamp-at'],
  ['tick', '--tick'],
  ['sampleRate', '--sample-rate'],
  ['columns', '--columns'],
  ['timeColumn', '--time-column'],
  ['keepColumns', '--keep-columns'],
] as const;

/**
 * Where the recording's layout came from, for the output's metadata: the channel file's recording
 * section, the layout options given (named), both, or neither (the defaults).
 */
function layoutFrom(
  options: ConvertArgs['options'],
  section: RecordingSection | undefined,
  file: string,
): string {
  const given = LAYOUT_OPTIONS.filter(([key]) => options[key] !== undefined).map(([, name]) => name);
  const line = `command line (${given.join(', ')})`;
  if (section === undefined) {
    return given.length === 0 ? 'defaults (no layout option, no recording section)' : line;
  }
  return given.length === 0
    ? `the recording section of ${file}`
    : `${line} over the recording section of ${file}`;
}

/**
 * The recording's layout: each option given on the command line, else the channel file's
 * recording section's field (none when `--from` is given: the section then does not apply).
 */
function recordingLayout(
  options: ConvertArgs['options'],
  section: RecordingSection | undefined,
): OpenCodeSourceOptions {
  const pick = <T>(given: T | undefined, fromFile: T | undefined): T | undefined => given ?? fromFile;
  const format = pick(options.from, section?.format);
  const fileHeaderBytes = pick(options.fileHeader, section?.fileHeaderBytes);
  const frameHeaderBytes = pick(options.frameHeader, section?.frameHeaderBytes);
  const frameTrailerBytes = pick(options.frameTrailer, section?.frameTrailerBytes);
  const stampType = pick(options.timeStamp, section?.timeStamp?.type);
  const offsetBytes = pick(options.timeStampAt, section?.timeStamp?.offsetBytes) ?? 0;
  const secondsPerTick = pick(options.tick, section?.timeStamp?.secondsPerTick);
  if (stampType === undefined && (options.timeStampAt !== undefined || options.tick !== undefined)) {
    const given = options.tick !== undefined ? '--tick' : '--time-stamp-at';
    throw new BridgeworkError(
      'missing-option',
      `${given} describes a time stamp in the frame header, but the recording has none; give its type with --time-stamp (or timeStamp in the channel file's recording section)`,
      { param: '--time-stamp' },
    );
  }
  const columns = options.columns === undefined ? section?.codeColumns : parseColumnList(options.columns);
  const timeColumn =
    options.timeColumn === undefined
      ? section?.timeColumn
      : /^\d+$/.test(options.timeColumn)
        ? Number(options.timeColumn)
        : options.timeColumn;
  const keep =
    options.keepColumns === undefined
      ? section?.keepColumns
      : options.keepColumns === 'none'
        ? 'none'
        : parseColumnList(options.keepColumns, '--keep-columns');
  return {
    ...(format === undefined ? {} : { format }),
    ...(fileHeaderBytes === undefined ? {} : { fileHeaderBytes }),
    ...(frameHeaderBytes === undefined ? {} : { frameHeaderBytes }),
    ...(frameTrailerBytes === undefined ? {} : { frameTrailerBytes }),
    ...(stampType === undefined
      ? {}
      : {
          timeStamp: {
            type: stampType,
            offsetBytes,
            ...(secondsPerTick === undefined ? {} : { secondsPerTick }),
          },
        }),
    ...(columns === undefined ? {} : { columns }),
    ...(timeColumn === undefined ? {} : { timeColumn }),
    ...(keep === undefined ? {} : { keep }),
  };
}
