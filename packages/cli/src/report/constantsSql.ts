import { channelConstants } from '@bridgework/channel';
import { BridgeworkError } from '@bridgework/core';
import { emitSql, segmentCodes, type SqlChannel, type SqlDialect, type SqlMap } from '@bridgework/firmware';
import { inChannel, type LoadedChannel, type LoadedChannels } from '../channels/loadChannels.js';
import { asCommandLine, howChecked, short, shortUp } from './constantsText.js';

/** Options of {@link constantsSql}. */
export interface ConstantsSqlOptions {
  /** The engine's dialect. */
  readonly dialect: SqlDialect;
  /** The table (or view) holding the codes, one column per channel named after it. */
  readonly table: string;
  /** How the polynomial bounds of nonlinear channels are verified. */
  readonly verification: 'auto' | 'exhaustive' | 'sampled';
  /** The tool and version for the script's first comment (`'bridgework 0.1.0'`). */
  readonly generator: string;
  /** Per channel name, the total error a nonlinear channel's polynomial must meet (`--target-error`). */
  readonly targetErrors?: ReadonlyMap<string, number>;
  /** The largest coefficient table of a nonlinear channel's polynomial, bytes (`--max-table-bytes`). */
  readonly maxTableBytes?: number;
}

/** What {@link constantsSql} returns: the script, and a line per nonlinear channel for standard error. */
export interface ConstantsSqlResult {
  /** The SQL script. */
  readonly sql: string;
  /** One line per channel written as a polynomial: its form and its verified bound. */
  readonly summary: readonly string[];
}

/**
 * A channel's map in the form SQL evaluates: its Möbius kernel when `convert` computes one (the
 * exact map, in the library's order of operations: the engine's result equals `convert` bit for
 * bit), else the firmware package's verified float64 polynomial over the channel's span, with
 * its bound against the exact map.
 */
function sqlMapOf(
  loaded: LoadedChannels,
  c: LoadedChannel,
  options: ConstantsSqlOptions,
): { map: SqlMap; summary?: string } {
  const m = c.channel.map;
  if (m.form === 'mobius') {
    return { map: { form: 'mobius', coefficients: m.coefficients, validCodes: m.validCodes } };
  }
  // The firmware package's float64 function over the channel's span: the cheapest form (affine,
  // or a piecewise polynomial of up to degree 5 in segments of 2^k codes) that meets the target
  // error against the channel's exact map, verified over the span's codes.
  const target = options.targetErrors?.get(c.name);
  const designed = inChannel(loaded, c, () => {
    try {
      return channelConstants(c.channel, {
        verification: options.verification,
        types: ['float64'],
        ...(target === undefined ? {} : { targetError: target }),
        ...(options.maxTableBytes === undefined ? {} : { maxTableBytes: options.maxTableBytes }),
      });
    } catch (e) {
      return asCommandLine(e);
    }
  });
  const f64 = designed.float64;
  const total = designed.totals.float64;
  if (f64 === undefined || total === undefined || f64.kind === 'mobius') {
    throw new BridgeworkError(
      'invalid-spec',
      `channel '${c.name}' has no verified float64 polynomial over its span for SQL (its map is not a ratio of affine functions of the code); write its constants as C or JSON instead`,
      { param: `channels.${c.name}` },
    );
  }
  const unit = c.channel.unit;
  const bound = `total error <= ${shortUp(total.bound)} ${unit} against the exact map (${howChecked(total)}; target ${short(designed.targetError)} ${unit})`;
  const boundCheck = total.proved ? ('every-code' as const) : ('sampled' as const);
  if (f64.kind === 'piecewise-polynomial') {
    const layout = {
      codeMin: f64.codeMin,
      codeMax: f64.codeMax,
      segmentBase: f64.segmentBase,
      segmentBits: f64.segmentBits,
    };
    const segments = f64.coefficients.map((coefficients, i) => {
      // Each segment in powers of (code − its centre), as the firmware's evaluator forms it.
      const s = segmentCodes(layout, i);
      return { offset: s.centre, coefficients, codeMin: s.first, codeMax: s.last };
    });
    return {
      map: { form: 'piecewise-polynomial', segments, maxAbsError: total.bound, boundCheck },
      summary: `${c.name}: SQL polynomial of degree ${f64.degree}, ${segments.length} segment${segments.length === 1 ? '' : 's'}, ${bound}`,
    };
  }
  // y = (code − offset)·scale or a polynomial in (code − offset): Horner's rule in powers of t = code − offset.
  const coefficients = f64.kind === 'affine' ? [0, f64.scale] : f64.coefficients;
  return {
    map: {
      form: 'polynomial',
      offset: f64.offset,
      coefficients,
      codeMin: f64.codeMin,
      codeMax: f64.codeMax,
      maxAbsError: total.bound,
      boundCheck,
    },
    summary: `${c.name}: SQL polynomial of degree ${coefficients.length - 1}, one segment, ${bound}`,
  };
}

/**
 * The loaded channels' maps as one SQL script (the firmware package's `emitSql`): a `SELECT` over
 * `table` with one column of values per channel, computed from the code column of the same name,
 * in the channel's own unit, after a comment naming the channel file, its channels and the
 * generator.
 *
 * @remarks
 * A channel whose `convert` is one Möbius function of the code (every linear-fractional bridge and
 * transducer, zero readings included, whole or fractional) is written as that function with the
 * library's coefficients and order of operations: where the engine evaluates IEEE 754 binary64 as
 * written (DuckDB, PostgreSQL, Spark SQL, Trino) each value equals `channel.convert` bit for bit,
 * and NULL where it gives NaN (rails, codes the sensor cannot produce). A nonlinear channel (an
 * RTD or thermistor, a quadratic bridge) is written as its verified float64 polynomial over its
 * span, whose bound against the exact map the script's comment states; codes outside the span
 * give NULL.
 *
 * @param loaded - The channel file and its selected channels.
 * @param options - Dialect, table and verification.
 * @returns The script.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` (param `--table`) for a bad table
 * name, and what the channel's constants throw.
 */
export function constantsSql(loaded: LoadedChannels, options: ConstantsSqlOptions): ConstantsSqlResult {
  if (!/^[^\0]+$/.test(options.table) || options.table.split('.').some((part) => part === '')) {
    throw new BridgeworkError(
      'invalid-option',
      `--table must name a table, a view or schema.table (no empty part); got '${options.table}'`,
      { param: '--table', value: options.table },
    );
  }
  const summary: string[] = [];
  const channels: SqlChannel[] = loaded.channels.map((c) => {
    const { map, summary: line } = sqlMapOf(loaded, c, options);
    if (line !== undefined) summary.push(line);
    return { name: c.name, unit: c.channel.unit, map };
  });
  const sql = emitSql(channels, { dialect: options.dialect, table: options.table });
  const names = loaded.channels.map((c) => c.name).join(', ');
  // One comment line: no line break may end it early.
  const line = `-- From the channel file ${loaded.file.file} (channels ${names}) by ${options.generator}.`;
  return { sql: `${line.replace(/[\r\n\u2028\u2029]/g, ' ')}\n${sql}`, summary };
}
