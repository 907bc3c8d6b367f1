/**
 * Pieces shared by the commands that stream a CSV recording row by row (`reduce-rosette`,
 * `reduce-member`): options read in the user's units, columns found by name or number, the
 * material from options or a channel file, the count of rows not reduced, and the streaming loop.
 */
import { createReadStream } from 'node:fs';
import { parseQuantity } from '@bridgework/channel';
import { BridgeworkError, formatValue, isBridgeworkError } from '@bridgework/core';
import { loadChannels } from '../../channels/loadChannels.js';
import { CsvRecordReader, CsvSyntaxError, type CsvRecord } from '../../internal/csvRecords.js';
import { describeFsError } from '../../internal/fileErrors.js';
import { theChannel } from '../shunt/runShuntApply.js';

/** An `invalid-option` error naming the option as the user wrote it. */
export function optionError(option: string, message: string, value?: unknown): BridgeworkError {
  return new BridgeworkError('invalid-option', `--${option}: ${message}`, {
    param: option,
    ...(value === undefined ? {} : { value }),
  });
}

/** A quantity option in a unit, or a typed error naming the option. */
export function quantityOption(option: string, text: string, unit: string): number {
  try {
    return parseQuantity(text, unit);
  } catch (e) {
    if (!isBridgeworkError(e)) throw e;
    throw new BridgeworkError('invalid-option', `--${option} '${text}': ${e.message}`, {
      param: option,
      value: text,
      cause: e,
    });
  }
}

/** The value of one unit in another (a unit option checked against its dimension). */
export function unitFactor(option: string, unit: string, si: string): number {
  return quantityOption(option, `1 ${unit}`, si);
}

/** Finds a column by header name (with or without its ' (unit)') or number from 1. */
export function findColumn(option: string, entry: string, header: readonly string[], file: string): number {
  if (/^\d+$/.test(entry)) {
    const i = Number(entry) - 1;
    if (i < 0 || i >= header.length) {
      throw optionError(
        option,
        `column ${entry} does not exist: ${file} has ${header.length} columns`,
        entry,
      );
    }
    return i;
  }
  let i = header.findIndex((h) => h === entry);
  if (i < 0) i = header.findIndex((h) => bareHeader(h) === entry);
  if (i < 0) {
    throw optionError(
      option,
      `'${entry}' is not a column of ${file}; its header names ${header.map((h) => `'${h}'`).join(', ')}`,
      entry,
    );
  }
  return i;
}

/** A header without its trailing ' (unit)'. */
export const bareHeader = (h: string): string => h.replace(/\s*\([^()]*\)\s*$/, '');

/** The unit a header names in its trailing parentheses, if any. */
export const headerUnit = (h: string): string | undefined => /\(([^()]*)\)\s*$/.exec(h)?.[1];

/** The specimen's E and ν, and where they came from. */
export interface SpecimenMaterial {
  readonly modulusPascals: number;
  readonly poissonRatio: number;
  /** `'options'` or `channel '<name>' of <file>`. */
  readonly from: string;
}

/** The material options of a reduction command. */
export interface MaterialOptions {
  readonly modulus?: string | undefined;
  readonly poisson?: number | undefined;
  readonly channelFile?: string | undefined;
  readonly channel?: string | undefined;
}

/**
 * E and ν from `--modulus` and `--poisson`, else from a channel file's `output.modulusPascals`
 * and `bridge.poissonRatio` (options win); `undefined` when neither gives them.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` (one of the two only; a channel
 *   without them), `invalid-option`, and the channel file's errors.
 */
export async function specimenMaterial(o: MaterialOptions): Promise<SpecimenMaterial | undefined> {
  let modulus = o.modulus === undefined ? undefined : quantityOption('modulus', o.modulus, 'Pa');
  let poisson = o.poisson;
  let from = 'options';
  if (o.channelFile !== undefined) {
    const loaded = await loadChannels(o.channelFile, o.channel === undefined ? undefined : [o.channel]);
    const target = theChannel(loaded, o.channel);
    const spec = target.channel.spec;
    modulus ??= spec.output.modulusPascals;
    poisson ??= spec.bridge.poissonRatio;
    from = `channel '${target.name}' of ${o.channelFile}`;
    if (modulus === undefined || poisson === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `channel '${target.name}' of ${o.channelFile} gives no ${modulus === undefined ? 'output.modulusPascals' : 'bridge.poissonRatio'}: add it there or give --${modulus === undefined ? 'modulus' : 'poisson'}`,
        { param: modulus === undefined ? 'modulus' : 'poisson' },
      );
    }
  } else if (o.channel !== undefined) {
    throw new BridgeworkError(
      'missing-option',
      '--channel needs --channel-file (the file the channel is in)',
      {
        param: 'channel-file',
      },
    );
  }
  if ((modulus === undefined) !== (poisson === undefined)) {
    throw new BridgeworkError(
      'missing-option',
      `--${modulus === undefined ? 'modulus' : 'poisson'} is required with --${modulus === undefined ? 'poisson' : 'modulus'}: stresses need both E and ν`,
      { param: modulus === undefined ? 'modulus' : 'poisson' },
    );
  }
  if (modulus === undefined || poisson === undefined) return undefined;
  if (!(modulus > 0))
    throw optionError('modulus', `must be above 0; got ${formatValue(modulus)} Pa`, modulus);
  return {
    modulusPascals: modulus,
    poissonRatio: poisson,
    from: o.modulus !== undefined && o.poisson !== undefined ? 'options' : from,
  };
}

/** Shortest text of a number that reads back exactly; NaN as `NaN`, −0 as `0`. */
export const csvCell = (x: number): string => (Number.isNaN(x) ? 'NaN' : x === 0 ? '0' : String(x));

/** Why rows were not reduced, counted, with the first line of each. */
export class SkippedRows {
  /** Each reason with its count and first line. */
  readonly reasons = new Map<string, { count: number; firstLine: number }>();
  /** Counts a row not reduced for `reason` at `line`. */
  add(reason: string, line: number): void {
    const r = this.reasons.get(reason);
    if (r === undefined) this.reasons.set(reason, { count: 1, firstLine: line });
    else r.count++;
  }
  /** The rows not reduced. */
  get total(): number {
    let n = 0;
    for (const r of this.reasons.values()) n += r.count;
    return n;
  }
  /** The summary lines, one per reason. */
  lines(): string[] {
    return [...this.reasons].map(
      ([why, r]) =>
        `not reduced (NaN): ${r.count} row${r.count === 1 ? '' : 's'}: ${why} (first at line ${r.firstLine})`,
    );
  }
  /** The reasons as data, for JSON. */
  toJson(): { reason: string; rows: number; firstLine: number }[] {
    return [...this.reasons].map(([reason, r]) => ({ reason, rows: r.count, firstLine: r.firstLine }));
  }
}

/** Whether a CSV record is blank or a comment (`#` in its first field). */
export const isBlankOrComment = (f: readonly string[]): boolean =>
  f.every((x) => x.trim() === '') || (f[0] ?? '').trim().startsWith('#');

/**
 * Streams a CSV file in 1 MiB chunks, handing each chunk's records to `onRecords` (awaited), so
 * memory does not grow with the file.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `parse-error` (malformed CSV, with its line),
 *   `io-error` (unreadable file), and whatever `onRecords` throws.
 */
export async function streamCsvRecords(
  input: string,
  onRecords: (records: readonly CsvRecord[]) => Promise<void>,
): Promise<void> {
  const stream = createReadStream(input, { encoding: 'utf8', highWaterMark: 1 << 20 });
  const reader = new CsvRecordReader(',');
  try {
    for await (const chunk of stream) await onRecords(reader.push(chunk as string));
    await onRecords(reader.end());
  } catch (e) {
    if (e instanceof CsvSyntaxError) {
      throw new BridgeworkError('parse-error', `${input}:${e.line}: ${e.message}`, { param: input });
    }
    if (isBridgeworkError(e)) throw e;
    throw new BridgeworkError('io-error', `cannot read ${input}: ${describeFsError(e)}`, {
      param: input,
      cause: e,
    });
  } finally {
    stream.destroy();
  }
}

/**
 * Refuses `--json` without a file for the rows: the summary takes standard output.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` (`param` `out`).
 */
export function refuseJsonWithoutOut(json: boolean, out: string | undefined): void {
  if (json && (out === undefined || out === '-')) {
    throw new BridgeworkError(
      'missing-option',
      '--json prints the summary on standard output, so the rows need --out (a CSV file)',
      { param: 'out' },
    );
  }
}
