import { BridgeworkError } from '@bridgework/core';
import { formatClipSummary, type InterleavedConverter } from '../../data/clipCounter.js';
import { convertToCsv } from '../../data/convertToCsv.js';
import { openCodeSource } from '../../data/openCodeSource.js';
import { exitCodes } from '../../exitCodes.js';
import { splitOptionList } from '../../internal/splitOptionList.js';
import type { CommandContext } from '../CommandContext.js';
import type { ConvertArgs } from './convertCommand.js';

/** The channels a conversion writes: what the channel package provides to `convert`. */
export interface ConversionChannels {
  /** Output column headings, one per channel in data order, e.g. `'hook (N)'`. */
  readonly columns: readonly string[];
  /** The interleaved converter of those channels, in the same order. */
  readonly converter: InterleavedConverter;
}

/**
 * Splits a `--columns` list: column numbers (from 1) and header names, comma-separated.
 *
 * @param list - The option's text, e.g. `'2,4'` or `'hook,trolley'`.
 * @returns Numbers for digit-only entries, names otherwise.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an empty entry.
 */
export function parseColumnList(list: string): (string | number)[] {
  return splitOptionList(list, '--columns').map((t) => (/^\d+$/.test(t) ? Number(t) : t));
}

/**
 * Everything `convert` does once the channels are known: opens the codes file, checks that its
 * columns match the channels, streams the conversion to the output (atomically, with a progress
 * bar on a terminal), prints the clipped-sample summary on standard error and returns the exit code.
 *
 * @param args - The parsed command line of `convert`.
 * @param context - The command context.
 * @param channels - Column headings and the converter of the selected channels.
 * @returns `exitCodes.ok`, or `exitCodes.failedCheck` when samples were clipped and
 * `--fail-on-clip` is set.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` (the file's columns do not match the channels),
 * and everything {@link openCodeSource} and {@link convertToCsv} throw.
 */
export async function runConversion(
  args: ConvertArgs,
  context: CommandContext,
  channels: ConversionChannels,
): Promise<number> {
  const { options } = args;
  const input = args.positionals.codesFile;
  const columns = options.columns === undefined ? undefined : parseColumnList(options.columns);
  const source = await openCodeSource(input, {
    channels: channels.columns.length,
    blockFrames: options.block,
    ...(options.from === undefined ? {} : { format: options.from }),
    ...(columns === undefined ? {} : { columns }),
  });
  if (source.channels !== channels.columns.length) {
    throw new BridgeworkError(
      'invalid-shape',
      `${input} has ${source.channels} code column${source.channels === 1 ? '' : 's'}, but ${channels.columns.length} channel${channels.columns.length === 1 ? ' is' : 's are'} selected; choose them with --columns and --channels`,
      { param: '<codes-file>', value: source.channels, limit: channels.columns.length },
    );
  }
  const result = await convertToCsv({
    source,
    converter: channels.converter,
    output: options.out === undefined || options.out === '-' ? undefined : options.out,
    stdout: context.io.stdout,
    force: options.force,
    header: channels.columns,
    ...(options.digits === undefined ? {} : { digits: options.digits }),
    progress: context.progressBar({ label: 'converting', total: source.totalBytes, unit: 'bytes' }),
  });
  const summary = formatClipSummary(result.clip, channels.columns);
  context.io.stderr.write(result.clip.clipped > 0 ? context.stderrStyle.yellow(summary) : summary);
  if (options.out !== undefined && options.out !== '-') {
    context.io.stderr.write(`wrote ${result.frames} rows to ${options.out}\n`);
  }
  return result.clip.clipped > 0 && options.failOnClip ? exitCodes.failedCheck : exitCodes.ok;
}
