import { channelConstants } from '@bridgework/channel';
import { BridgeworkError } from '@bridgework/core';
import { emitSql, type SqlChannel, type SqlDialect, type SqlMap } from '@bridgework/firmware';
import { inChannel, type LoadedChannel, type LoadedChannels } from '../channels/loadChannels.js';

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
  verification: ConstantsSqlOptions['verification'],
): SqlMap {
  const m = c.channel.map;
  if (m.form === 'mobius') {
    return { form: 'mobius', coefficients: m.coefficients, validCodes: m.validCodes };
  }
  // One float64 polynomial over the whole span (a table of at most 6 doubles: a single segment),
  // designed by the firmware package to the channel's default target and verified against the
  // channel's exact map.
  const designed = inChannel(loaded, c, () =>
    channelConstants(c.channel, { verification, types: ['float64'], maxTableBytes: 48 }),
  );
  const f64 = designed.float64;
  const total = designed.totals.float64;
  if (f64?.kind !== 'piecewise-polynomial' || f64.segmentCount !== 1 || total === undefined) {
    throw new BridgeworkError(
      'invalid-spec',
      `channel '${c.name}' has no verified single float64 polynomial over its span for SQL (its map is not a ratio of affine functions of the code, and one polynomial of degree 5 or less does not meet its target error); write its constants as C or JSON instead`,
      { param: `channels.${c.name}` },
    );
  }
  return {
    form: 'polynomial',
    // The segment's centre: t = code − centre, as the firmware's evaluator forms it.
    offset: f64.segmentBase + 2 ** (f64.segmentBits - 1),
    coefficients: f64.coefficients[0] as readonly number[],
    codeMin: f64.codeMin,
    codeMax: f64.codeMax,
    maxAbsError: total.bound,
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
export function constantsSql(loaded: LoadedChannels, options: ConstantsSqlOptions): string {
  if (!/^[^\0]+$/.test(options.table) || options.table.split('.').some((part) => part === '')) {
    throw new BridgeworkError(
      'invalid-option',
      `--table must name a table, a view or schema.table (no empty part); got '${options.table}'`,
      { param: '--table', value: options.table },
    );
  }
  const channels: SqlChannel[] = loaded.channels.map((c) => ({
    name: c.name,
    unit: c.channel.unit,
    map: sqlMapOf(loaded, c, options.verification),
  }));
  const sql = emitSql(channels, { dialect: options.dialect, table: options.table });
  const names = loaded.channels.map((c) => c.name).join(', ');
  // One comment line: no line break may end it early.
  const line = `-- From the channel file ${loaded.file.file} (channels ${names}) by ${options.generator}.`;
  return `${line.replace(/[\r\n\u2028\u2029]/g, ' ')}\n${sql}`;
}
