/**
 * emitSql and sqlExpression: the text of every constant reads back as the same binary64 value, the
 * expressions have the library's order of operations, and bad maps are typed errors. Running the
 * SQL in real engines (DuckDB, PostgreSQL) against the channel package is in test/sqlEngines.test.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { emitSql, sqlDialects, sqlExpression, type SqlMap } from '../src/index.js';

const mobius: SqlMap = {
  form: 'mobius',
  coefficients: { a: 1.2345678901234567e-7, b: -3.5, c: -2.5e-13, d: 1 },
  validCodes: { min: -8388608, max: 8388607 },
};

/** The literals of an expression, read back as numbers. */
function literals(sql: string): number[] {
  const out: number[] = [];
  for (const m of sql.matchAll(
    /float8 '([^']+)'|DOUBLE '([^']+)'|CAST\('([^']+)' AS DOUBLE\)|(-?[0-9.]+e[+-]\d+)D/g,
  )) {
    out.push(Number(m[1] ?? m[2] ?? m[3] ?? m[4]));
  }
  return out;
}

describe('sqlExpression', () => {
  it('writes every constant so that it reads back as the same double, in every dialect (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.constantFrom(...sqlDialects),
        (a, b, dialect) => {
          const map: SqlMap = { ...mobius, coefficients: { a, b, c: 0, d: 1 } };
          const got = literals(sqlExpression(map, '"code"', dialect));
          // lo, hi, a, b, c, d in that order.
          expect(got.map((v) => (Object.is(v, -0) ? 0 : v))).toEqual(
            [-8388608, 8388607, a, b, 0, 1].map((v) => (Object.is(v, -0) ? 0 : v)),
          );
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('is fully parenthesised in the order multiply, add, multiply, add, divide, with NULL outside the open range', () => {
    const sql = sqlExpression(mobius, '"hook"', 'postgresql');
    expect(sql).toBe(
      `CASE WHEN CAST("hook" AS float8) > float8 '-8.388608e+6' AND CAST("hook" AS float8) < float8 '8.388607e+6' THEN ((float8 '1.2345678901234566e-7' * CAST("hook" AS float8)) + float8 '-3.5e+0') / ((float8 '-2.5e-13' * CAST("hook" AS float8)) + float8 '1e+0') END`,
    );
    expect(sqlExpression(mobius, '`hook`', 'spark')).toContain(
      '(1.2345678901234566e-7D * CAST(`hook` AS DOUBLE)) + (-3.5e+0D)',
    );
    expect(sqlExpression(mobius, '"hook"', 'trino')).toContain(
      'DOUBLE \'1.2345678901234566e-7\' * CAST("hook" AS DOUBLE)',
    );
    expect(sqlExpression(mobius, '"hook"', 'duckdb')).toContain(
      'CAST(\'1.2345678901234566e-7\' AS DOUBLE) * CAST("hook" AS DOUBLE)',
    );
  });

  it('writes a polynomial by Horner’s rule in powers of (code − offset), NULL outside the covered codes', () => {
    const poly: SqlMap = {
      form: 'polynomial',
      offset: 100,
      coefficients: [1, 2, 3],
      codeMin: 0,
      codeMax: 200,
      maxAbsError: 1e-6,
    };
    const t = `(CAST("c" AS float8) - float8 '1e+2')`;
    expect(sqlExpression(poly, '"c"', 'postgresql')).toBe(
      `CASE WHEN CAST("c" AS float8) >= float8 '0e+0' AND CAST("c" AS float8) <= float8 '2e+2' THEN ((((float8 '3e+0' * ${t}) + float8 '2e+0') * ${t}) + float8 '1e+0') END`,
    );
  });

  it('writes a piecewise polynomial as one CASE arm per segment, each in powers of (code − its offset)', () => {
    const piecewise: SqlMap = {
      form: 'piecewise-polynomial',
      segments: [
        { offset: 8, coefficients: [1, 2], codeMin: 0, codeMax: 15 },
        { offset: 24, coefficients: [-1, 0.5, 0.25], codeMin: 16, codeMax: 31 },
      ],
      maxAbsError: 1e-9,
    };
    const x = 'CAST("c" AS float8)';
    const f = (v: string) => `float8 '${v}'`;
    const t1 = `(${x} - ${f('8e+0')})`;
    const t2 = `(${x} - ${f('2.4e+1')})`;
    expect(sqlExpression(piecewise, '"c"', 'postgresql')).toBe(
      `CASE WHEN ${x} >= ${f('0e+0')} AND ${x} <= ${f('1.5e+1')} THEN ((${f('2e+0')} * ${t1}) + ${f('1e+0')}) ` +
        `WHEN ${x} >= ${f('1.6e+1')} AND ${x} <= ${f('3.1e+1')} THEN ((((${f('2.5e-1')} * ${t2}) + ${f('5e-1')}) * ${t2}) + ${f('-1e+0')}) END`,
    );
    // The script says how the bound was found, rounded up to three digits (never below the bound).
    const note = (boundCheck?: 'every-code' | 'sampled') =>
      emitSql([
        {
          name: 't',
          unit: '°C',
          map: { ...piecewise, maxAbsError: 1.2341e-6, ...(boundCheck === undefined ? {} : { boundCheck }) },
        },
      ]);
    expect(note('every-code')).toContain(
      "a binary64 piecewise polynomial, 2 segments of degree 2 or less (Horner's rule in powers of the code minus the segment's centre) on codes 0 to 31: within 1.24e-6 °C of the exact map (a bound proved over every covered code; not bit identity)",
    );
    expect(note('sampled')).toContain(
      '(a bound measured on a sample of the codes, not proved; not bit identity)',
    );
    expect(note()).toContain('(a stated bound; not bit identity)');
  });

  it('rejects malformed maps and dialects with typed errors', () => {
    expect(() => sqlExpression(mobius, '"c"', 'oracle' as never)).toThrowBridgeworkError('invalid-option', {
      param: 'dialect',
    });
    expect(() =>
      sqlExpression({ ...mobius, coefficients: { a: NaN, b: 0, c: 0, d: 1 } }, '"c"', 'duckdb'),
    ).toThrowBridgeworkError('not-finite', { param: 'map.coefficients.a' });
    expect(() =>
      sqlExpression({ ...mobius, validCodes: { min: 5, max: 5 } }, '"c"', 'duckdb'),
    ).toThrowBridgeworkError('out-of-range', { param: 'map.validCodes' });
    expect(() => sqlExpression({ ...mobius, scale: 2 } as never, '"c"', 'duckdb')).toThrowBridgeworkError(
      'unknown-option',
      {
        param: 'map.scale',
      },
    );
    expect(() =>
      sqlExpression(
        { form: 'polynomial', offset: 0, coefficients: [], codeMin: 0, codeMax: 1, maxAbsError: 0 },
        '"c"',
        'duckdb',
      ),
    ).toThrowBridgeworkError('invalid-shape', { param: 'map.coefficients' });
    expect(() =>
      sqlExpression(
        { form: 'polynomial', offset: 0, coefficients: [1], codeMin: 0, codeMax: 1, maxAbsError: -1 },
        '"c"',
        'duckdb',
      ),
    ).toThrowBridgeworkError('negative', { param: 'map.maxAbsError' });
    const seg = { offset: 0, coefficients: [1], codeMin: 0, codeMax: 9 };
    const pw = (segments: unknown[], extra: object = {}) =>
      sqlExpression(
        { form: 'piecewise-polynomial', segments, maxAbsError: 0, ...extra } as never,
        '"c"',
        'duckdb',
      );
    expect(() => pw([])).toThrowBridgeworkError('invalid-shape', { param: 'map.segments' });
    expect(() => pw([seg, { ...seg, codeMin: 9, codeMax: 20 }])).toThrowBridgeworkError('out-of-range', {
      param: 'map.segments[1].codeMin',
    });
    expect(() => pw([{ ...seg, coefficients: [] }])).toThrowBridgeworkError('invalid-shape', {
      param: 'map.segments[0].coefficients',
    });
    expect(() => pw([{ ...seg, codeMax: -1 }])).toThrowBridgeworkError('out-of-range', {
      param: 'map.segments[0].codeMax',
    });
    expect(() => pw([{ ...seg, centre: 4 }])).toThrowBridgeworkError('unknown-option', {
      param: 'map.segments[0].centre',
    });
    expect(() => pw([seg], { boundCheck: 'proved' })).toThrowBridgeworkError('invalid-option', {
      param: 'map.boundCheck',
    });
  });
});

describe('emitSql', () => {
  it('writes one SELECT with a column per channel, the caution, the version and each column’s guarantee', () => {
    const sql = emitSql(
      [
        { name: 'hook', unit: 'N', map: mobius },
        {
          name: 'deck "temp"',
          unit: '°C',
          codeColumn: 'deck_code',
          map: {
            form: 'polynomial',
            offset: 0,
            coefficients: [0.5, 1e-6],
            codeMin: -10,
            codeMax: 10,
            maxAbsError: 2.5e-7,
          },
        },
      ],
      { dialect: 'duckdb', table: 'lake.rig_codes', keepColumns: ['time'] },
    );
    const lines = sql.split('\n');
    expect(lines[0]).toBe('-- bridgework 0.1.0: SQL maps from converter codes to values (dialect duckdb)');
    expect(lines[1]).toMatch(/^-- Results support, and do not replace, qualified engineering judgement/);
    expect(sql).toContain('hook (N), from column hook: the exact map');
    expect(sql).toContain('within 2.5e-7 °C of the exact map (a stated bound; not bit identity)');
    expect(sql).toContain('  "time",\n  CASE WHEN CAST("hook" AS DOUBLE)');
    expect(sql).toContain('END AS "deck ""temp"""');
    expect(sql).toContain('CAST("deck_code" AS DOUBLE)');
    expect(sql.endsWith('FROM "lake"."rig_codes";\n')).toBe(true);
    expect(emitSql([{ name: 'x', unit: 'N', map: mobius }], { dialect: 'spark', table: 't' })).toContain(
      'AS `x`\nFROM `t`;',
    );
  });

  it('rejects no channels, repeated names and unknown options', () => {
    expect(() => emitSql([])).toThrowBridgeworkError('invalid-shape', { param: 'channels' });
    const one = { name: 'x', unit: 'N', map: mobius };
    expect(() => emitSql([one, one])).toThrowBridgeworkError('invalid-option', { param: 'channels[1].name' });
    expect(() => emitSql([one], { dialekt: 'duckdb' } as never)).toThrowBridgeworkError('unknown-option', {
      param: 'options.dialekt',
    });
  });

  it('names the option at fault for a table or kept column that is not a name (issue 15: keepColumns was a TypeError)', () => {
    const one = { name: 'x', unit: 'N', map: mobius };
    expect(() => emitSql([one], { keepColumns: 'time' as never })).toThrowBridgeworkError('invalid-option', {
      param: 'options.keepColumns',
    });
    expect(() => emitSql([one], { keepColumns: ['time', 7 as never] })).toThrowBridgeworkError(
      'invalid-option',
      { param: 'options.keepColumns[1]' },
    );
    expect(() => emitSql([one], { table: {} as never })).toThrowBridgeworkError('invalid-option', {
      param: 'options.table',
    });
    expect(() => emitSql([one], { table: 'lake..codes' })).toThrowBridgeworkError('invalid-option', {
      param: 'options.table',
    });
    // A channel name that is a bigint is named in the message (was a TypeError from JSON.stringify; fuzz seed 7).
    expect(() => emitSql([{ ...one, name: 10n as never }])).toThrowBridgeworkError('invalid-option');
  });
});
