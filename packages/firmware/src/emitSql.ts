import {
  BridgeworkError,
  checkFinite,
  checkInteger,
  checkObject,
  checkOneOf,
  checkOptions,
  formatValue,
} from '@bridgework/core';
import { FIRMWARE_CAUTION } from './emitCHeader.js';
import { FIRMWARE_GENERATOR_VERSION } from './version.js';

/** The SQL engines whose syntax {@link emitSql} writes. */
export type SqlDialect = 'duckdb' | 'postgresql' | 'spark' | 'trino';

/** Every {@link SqlDialect}. */
export const sqlDialects: readonly SqlDialect[] = Object.freeze(['duckdb', 'postgresql', 'spark', 'trino']);

/**
 * A channel's code → value map in a form SQL can evaluate.
 *
 * - `'mobius'`: y = (a·x + b)/(c·x + d) for codes x strictly inside `validCodes` — the exact map of
 *   a linear-fractional channel, with the coefficients its batch conversion uses.
 * - `'polynomial'`: y = Σ c_k (x − offset)^k by Horner's rule in binary64 for codes in
 *   [`codeMin`, `codeMax`] — an approximation of a nonlinear channel's map with a stated bound
 *   `maxAbsError` against the exact map (the firmware package's verified float64 polynomial).
 * - `'piecewise-polynomial'`: one such polynomial per segment of codes (the firmware package's
 *   verified float64 piecewise polynomial, each segment in powers of the code minus its centre),
 *   within `maxAbsError` of the exact map on every covered code.
 */
export type SqlMap =
  | {
      /** One Möbius function of the code. */
      readonly form: 'mobius';
      /** Its coefficients. */
      readonly coefficients: {
        /** a. */
        readonly a: number;
        /** b. */
        readonly b: number;
        /** c. */
        readonly c: number;
        /** d. */
        readonly d: number;
      };
      /** Codes that convert, an open interval. */
      readonly validCodes: {
        /** Lower end (excluded). */
        readonly min: number;
        /** Upper end (excluded). */
        readonly max: number;
      };
    }
  | {
      /** A binary64 polynomial in powers of (code − offset). */
      readonly form: 'polynomial';
      /** The code subtracted first (a binary64 value). */
      readonly offset: number;
      /** Coefficients in ascending powers (binary64 values), at least one. */
      readonly coefficients: readonly number[];
      /** Lowest code covered (inclusive). */
      readonly codeMin: number;
      /** Highest code covered (inclusive). */
      readonly codeMax: number;
      /** Largest |y − exact map| over the covered codes, in the value's unit (a verified bound). */
      readonly maxAbsError: number;
      /** How `maxAbsError` was established: over every covered code, or on a sample. Default: not stated. */
      readonly boundCheck?: 'every-code' | 'sampled';
    }
  | {
      /** Binary64 polynomials on consecutive ranges of codes. */
      readonly form: 'piecewise-polynomial';
      /** The segments in ascending order of code, not overlapping (gaps give NULL). */
      readonly segments: readonly SqlPolynomialSegment[];
      /** Largest |y − exact map| over every covered code, in the value's unit (a verified bound). */
      readonly maxAbsError: number;
      /** How `maxAbsError` was established: over every covered code, or on a sample. Default: not stated. */
      readonly boundCheck?: 'every-code' | 'sampled';
    };

/** One segment of a `'piecewise-polynomial'` {@link SqlMap}: y = Σ c_k (x − offset)^k on its codes. */
export interface SqlPolynomialSegment {
  /** The code subtracted first (a binary64 value; the segment's centre in the firmware's layout). */
  readonly offset: number;
  /** Coefficients in ascending powers (binary64 values), at least one. */
  readonly coefficients: readonly number[];
  /** Lowest code of the segment (inclusive). */
  readonly codeMin: number;
  /** Highest code of the segment (inclusive). */
  readonly codeMax: number;
}

/** One channel of {@link emitSql}. */
export interface SqlChannel {
  /** The channel's name: the result column's name. */
  readonly name: string;
  /** The unit of the values (`'N'`, `'µε'`, `'°C'`). */
  readonly unit: string;
  /** The column holding the channel's codes. Default: the channel's name. */
  readonly codeColumn?: string;
  /** The map. */
  readonly map: SqlMap;
}

/** Options of {@link emitSql}. */
export interface EmitSqlOptions {
  /** The engine's dialect. Default `'duckdb'`. */
  readonly dialect?: SqlDialect;
  /** The table (or view, or table expression name) holding the codes. Default `'codes'`. */
  readonly table?: string;
  /** Columns of the table passed through before the channels (a time column, say). Default none. */
  readonly keepColumns?: readonly string[];
}

/** The text of a binary64 value that the dialect reads back as exactly that double. */
function literal(value: number, dialect: SqlDialect): string {
  const v = checkFinite('coefficient', value);
  // toExponential() without digits gives the fewest digits that identify the double.
  const text = Object.is(v, -0) ? '-0e+0' : v.toExponential();
  switch (dialect) {
    case 'postgresql':
      return `float8 '${text}'`;
    case 'trino':
      return `DOUBLE '${text}'`;
    case 'spark':
      return v < 0 || Object.is(v, -0) ? `(${text}D)` : `${text}D`;
    case 'duckdb':
      return `CAST('${text}' AS DOUBLE)`;
  }
}

/** A quoted identifier. */
function identifier(name: string, dialect: SqlDialect, param = 'name'): string {
  if (typeof name !== 'string' || name === '' || name.includes('\0')) {
    throw new BridgeworkError(
      'invalid-option',
      `a SQL identifier must be non-empty text; got ${formatValue(name)}`,
      {
        param,
        value: name,
      },
    );
  }
  return dialect === 'spark' ? `\`${name.replace(/`/g, '``')}\`` : `"${name.replace(/"/g, '""')}"`;
}

/** A table name: dotted parts (`schema.table`) each quoted. */
function tableName(name: string, dialect: SqlDialect): string {
  return name
    .split('.')
    .map((part) => identifier(part, dialect, 'options.table'))
    .join('.');
}

function asDouble(sql: string, dialect: SqlDialect): string {
  return dialect === 'postgresql' ? `CAST(${sql} AS float8)` : `CAST(${sql} AS DOUBLE)`;
}

/** The offset, coefficients and code range of one polynomial (`param` its name in messages). */
function checkSegment(param: string, m: Record<string, unknown>): { codeMin: number; codeMax: number } {
  checkFinite(`${param}.offset`, m['offset']);
  const c = m['coefficients'];
  if (!Array.isArray(c) || c.length === 0) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`${param}.coefficients\` must be a non-empty array of numbers`,
      {
        param: `${param}.coefficients`,
      },
    );
  }
  c.forEach((x, i) => checkFinite(`${param}.coefficients[${i}]`, x));
  const codeMin = checkInteger(`${param}.codeMin`, m['codeMin']);
  const codeMax = checkInteger(`${param}.codeMax`, m['codeMax'], { min: codeMin });
  return { codeMin, codeMax };
}

function checkMap(map: SqlMap): SqlMap {
  const m = checkObject('map', map);
  const form = checkOneOf('map.form', m['form'], ['mobius', 'polynomial', 'piecewise-polynomial'] as const);
  if (form === 'mobius') {
    checkOptions('map', m, {
      known: ['form', 'coefficients', 'validCodes'],
      required: ['coefficients', 'validCodes'],
    });
    const k = checkOptions('map.coefficients', m['coefficients'], {
      known: ['a', 'b', 'c', 'd'],
      required: ['a', 'b', 'c', 'd'],
    });
    for (const key of ['a', 'b', 'c', 'd']) checkFinite(`map.coefficients.${key}`, k[key]);
    const v = checkOptions('map.validCodes', m['validCodes'], {
      known: ['min', 'max'],
      required: ['min', 'max'],
    });
    const min = checkFinite('map.validCodes.min', v['min']);
    const max = checkFinite('map.validCodes.max', v['max']);
    if (!(max > min)) {
      throw new BridgeworkError('out-of-range', `map.validCodes must have max > min; got (${min}, ${max})`, {
        param: 'map.validCodes',
        value: [min, max],
      });
    }
  } else if (form === 'polynomial') {
    checkOptions('map', m, {
      known: ['form', 'offset', 'coefficients', 'codeMin', 'codeMax', 'maxAbsError', 'boundCheck'],
      required: ['offset', 'coefficients', 'codeMin', 'codeMax', 'maxAbsError'],
    });
    checkSegment('map', m);
  } else {
    checkOptions('map', m, {
      known: ['form', 'segments', 'maxAbsError', 'boundCheck'],
      required: ['segments', 'maxAbsError'],
    });
    const segments = m['segments'];
    if (!Array.isArray(segments) || segments.length === 0) {
      throw new BridgeworkError('invalid-shape', '`map.segments` must be a non-empty array of segments', {
        param: 'map.segments',
      });
    }
    let previous = -Infinity;
    segments.forEach((raw, i) => {
      const param = `map.segments[${i}]`;
      const seg = checkOptions(param, raw, {
        known: ['offset', 'coefficients', 'codeMin', 'codeMax'],
        required: ['offset', 'coefficients', 'codeMin', 'codeMax'],
      });
      const { codeMin, codeMax } = checkSegment(param, seg);
      if (!(codeMin > previous)) {
        throw new BridgeworkError(
          'out-of-range',
          `\`${param}\` must start after the previous segment ends (codes ascending, no overlap); it starts at ${codeMin}, the previous ends at ${previous}`,
          { param: `${param}.codeMin`, value: codeMin },
        );
      }
      previous = codeMax;
    });
  }
  if (form !== 'mobius') {
    if (m['boundCheck'] !== undefined)
      checkOneOf('map.boundCheck', m['boundCheck'], ['every-code', 'sampled'] as const);
    const e = checkFinite('map.maxAbsError', m['maxAbsError']);
    if (e < 0)
      throw new BridgeworkError('negative', '`map.maxAbsError` must be ≥ 0', {
        param: 'map.maxAbsError',
        value: e,
      });
  }
  return map;
}

/**
 * A channel's map as one SQL expression over a column of codes: the value, or NULL for a code that
 * does not convert.
 *
 * @remarks
 * The code is cast to binary64 once in each place it is used (exact for every integer code below
 * 2^53) and every constant is written as a typed binary64 literal of its shortest round-trip
 * digits (DuckDB `CAST('…' AS DOUBLE)`, PostgreSQL `float8 '…'`, Spark SQL `…D`, Trino
 * `DOUBLE '…'`), so no constant passes through a decimal type. The expression is fully
 * parenthesised in the order of operations of the library's evaluation:
 *
 * - Möbius: `CASE WHEN x > lo AND x < hi THEN ((a * x) + b) / ((c * x) + d) END` — the order of
 *   `channel.convert` (multiply, add, multiply, add, divide), so an engine that evaluates each SQL
 *   operator as one IEEE 754 binary64 operation, rounded to nearest, as written (no fused
 *   multiply-add, no reassociation) gives the library's results bit for bit. Codes at or beyond
 *   the rails or outside the sensor's range (and NULL or NaN codes) give NULL.
 * - Polynomial: `CASE WHEN x >= codeMin AND x <= codeMax THEN …((c_n * t) + c_(n−1)) * t … + c_0
 *   END` with `t = x − offset`: Horner's rule as the firmware evaluator computes it, so the results
 *   equal that evaluator bit for bit and lie within `maxAbsError` of the exact map; codes outside
 *   the covered span give NULL.
 * - Piecewise polynomial: one `WHEN x >= codeMin AND x <= codeMax THEN …` arm per segment, each
 *   Horner's rule in powers of (x − that segment's offset), in one `CASE`; codes in no segment give
 *   NULL.
 *
 * @param map - The map.
 * @param codeSql - The SQL of the code (a quoted column name, or any expression).
 * @param dialect - The engine's dialect.
 * @returns The expression.
 * @throws {@link @bridgework/core!BridgeworkError} for a malformed map (`wrong-type`,
 * `unknown-option`, `missing-option`, `not-finite`, `out-of-range`, `invalid-shape`, `not-integer`,
 * `negative`) or dialect (`invalid-option`).
 * @example
 * ```ts
 * sqlExpression(
 *   { form: 'mobius', coefficients: { a: 2, b: 1, c: 0, d: 1 }, validCodes: { min: -10, max: 10 } },
 *   '"hook"',
 *   'postgresql',
 * );
 * // CASE WHEN CAST("hook" AS float8) > float8 '-1e+1' AND … THEN ((float8 '2e+0' * CAST("hook" AS float8)) + …) / (…) END
 * ```
 */
export function sqlExpression(map: SqlMap, codeSql: string, dialect: SqlDialect): string {
  checkOneOf('dialect', dialect, sqlDialects);
  const m = checkMap(map);
  const x = asDouble(codeSql, dialect);
  const l = (v: number): string => literal(v, dialect);
  if (m.form === 'mobius') {
    const { a, b, c, d } = m.coefficients;
    const { min, max } = m.validCodes;
    return `CASE WHEN ${x} > ${l(min)} AND ${x} < ${l(max)} THEN ((${l(a)} * ${x}) + ${l(b)}) / ((${l(c)} * ${x}) + ${l(d)}) END`;
  }
  const segments = m.form === 'polynomial' ? [m] : m.segments;
  const arms = segments.map((seg) => {
    const t = `(${x} - ${l(seg.offset)})`;
    const cs = seg.coefficients;
    let y = l(cs[cs.length - 1] as number);
    for (let k = cs.length - 2; k >= 0; k--) y = `((${y} * ${t}) + ${l(cs[k] as number)})`;
    return `WHEN ${x} >= ${l(seg.codeMin)} AND ${x} <= ${l(seg.codeMax)} THEN ${y}`;
  });
  return `CASE ${arms.join(' ')} END`;
}

/** A bound to three significant digits, rounded up so that it stays a bound. */
function boundText(x: number): string {
  if (x === 0) return '0';
  let up = Number(x.toPrecision(3));
  if (up < x) up = Number((up + 10 ** (Math.floor(Math.log10(x)) - 2)).toPrecision(3));
  return up < 1e-3 || up >= 1e6 ? up.toExponential() : String(up);
}

/** What the emitted script says of one channel's accuracy. */
function accuracyNote(c: SqlChannel): string {
  const m = c.map;
  if (m.form === 'mobius') {
    return `the exact map, in the order of operations of the library's conversion: equal to it bit for bit where the engine evaluates IEEE 754 binary64 as written; NULL at or beyond the converter rails and outside the sensor's range`;
  }
  const how =
    m.boundCheck === 'every-code'
      ? 'a bound proved over every covered code'
      : m.boundCheck === 'sampled'
        ? 'a bound measured on a sample of the codes, not proved'
        : 'a stated bound';
  const within = `within ${boundText(m.maxAbsError)} ${c.unit} of the exact map (${how}; not bit identity); NULL outside those codes`;
  if (m.form === 'polynomial') {
    return `a binary64 polynomial of degree ${m.coefficients.length - 1} (Horner's rule) on codes ${m.codeMin} to ${m.codeMax}: ${within}`;
  }
  const segs = m.segments;
  const degree = Math.max(...segs.map((s) => s.coefficients.length - 1));
  const first = (segs[0] as SqlPolynomialSegment).codeMin;
  const last = (segs[segs.length - 1] as SqlPolynomialSegment).codeMax;
  return `a binary64 piecewise polynomial, ${segs.length} segment${segs.length === 1 ? '' : 's'} of degree ${degree} or less (Horner's rule in powers of the code minus the segment's centre) on codes ${first} to ${last}: ${within}`;
}

/**
 * A SQL script that turns a table of converter codes into engineering values: one `SELECT` with
 * one column per channel, named after the channel, for the user's engine to run.
 *
 * @remarks
 * Each channel's column is {@link sqlExpression} of its map over its code column. The script's
 * comments carry the generator version, the safety caution, each channel's unit and what its
 * expression guarantees: bit-for-bit equality with the library for Möbius maps where the engine
 * evaluates IEEE binary64 as written (DuckDB, PostgreSQL, Spark SQL and Trino evaluate each
 * arithmetic operator on DOUBLE as one correctly rounded binary64 operation), or the stated bound
 * of a polynomial. The engine runs the conversion wherever the table lives — one machine or a
 * cluster; the script holds no data and no engine-specific functions beyond `CAST`.
 *
 * @param channels - The channels (at least one; names unique).
 * @param options - Dialect, table and passed-through columns.
 * @returns The script.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` (no channel), `invalid-option`
 * (a repeated name, a bad dialect or identifier), and the map checks of {@link sqlExpression}.
 * @example
 * ```ts
 * emitSql([{ name: 'hook', unit: 'N', map: hookMap }], { dialect: 'duckdb', table: 'rig_codes' });
 * // -- bridgework 0.1.0: SQL maps from converter codes to values (dialect duckdb)
 * // ...
 * // SELECT
 * //   CASE WHEN … END AS "hook"
 * // FROM "rig_codes";
 * ```
 */
export function emitSql(channels: readonly SqlChannel[], options: EmitSqlOptions = {}): string {
  const o = checkOptions('options', options, { known: ['dialect', 'table', 'keepColumns'] });
  const dialect =
    o['dialect'] === undefined ? 'duckdb' : checkOneOf('options.dialect', o['dialect'], sqlDialects);
  const table = o['table'] === undefined ? 'codes' : o['table'];
  if (typeof table !== 'string') {
    throw new BridgeworkError(
      'invalid-option',
      `\`options.table\` must be a table name (text); got ${formatValue(table)}`,
      {
        param: 'options.table',
        value: table,
      },
    );
  }
  const keep = o['keepColumns'] ?? [];
  if (!Array.isArray(keep)) {
    throw new BridgeworkError(
      'invalid-option',
      `\`options.keepColumns\` must be a list of column names; got ${formatValue(keep)}`,
      { param: 'options.keepColumns', value: keep },
    );
  }
  if (!Array.isArray(channels) || channels.length === 0) {
    throw new BridgeworkError('invalid-shape', '`channels` must be a non-empty array', { param: 'channels' });
  }
  const seen = new Set<string>();
  const notes: string[] = [];
  const columns = channels.map((raw, i) => {
    const c = checkOptions(`channels[${i}]`, raw, {
      known: ['name', 'unit', 'codeColumn', 'map'],
      required: ['name', 'unit', 'map'],
    }) as unknown as SqlChannel;
    if (seen.has(c.name)) {
      throw new BridgeworkError(
        'invalid-option',
        `two channels are named '${c.name}'; result columns need distinct names`,
        {
          param: `channels[${i}].name`,
          value: c.name,
        },
      );
    }
    seen.add(c.name);
    const expr = sqlExpression(c.map, identifier(c.codeColumn ?? c.name, dialect), dialect);
    notes.push(`--   ${c.name} (${c.unit}), from column ${c.codeColumn ?? c.name}: ${accuracyNote(c)}.`);
    return `  ${expr} AS ${identifier(c.name, dialect)}`;
  });
  const kept = (keep as readonly string[]).map(
    (k, i) => `  ${identifier(k, dialect, `options.keepColumns[${i}]`)}`,
  );
  return [
    `-- bridgework ${FIRMWARE_GENERATOR_VERSION}: SQL maps from converter codes to values (dialect ${dialect})`,
    `-- ${FIRMWARE_CAUTION}`,
    '-- Columns:',
    ...notes,
    '-- Constants are binary64 literals of their shortest round-trip digits; codes are cast to binary64.',
    'SELECT',
    [...kept, ...columns].join(',\n'),
    `FROM ${tableName(table, dialect)};`,
    '',
  ].join('\n');
}
