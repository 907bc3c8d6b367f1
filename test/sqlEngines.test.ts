/**
 * The SQL of every example channel, run in real engines — DuckDB embedded, and a real PostgreSQL
 * server — over 10⁶ codes that sweep each converter's whole range, rails and beyond included,
 * against the channel package:
 *
 * - a Möbius (linear-fractional) channel: equal to `channel.convert` bit for bit, NULL where it
 *   gives NaN;
 * - a nonlinear channel (the RTD): equal to the firmware's float64 polynomial evaluator bit for bit
 *   on the codes it covers (NULL elsewhere), and within its stated bound of the exact map.
 *
 * The codes are made in the engine by integer arithmetic (`code = lo + ⌊i·span/(n − 1)⌋`) and the
 * same codes in JavaScript.
 */
import { fileURLToPath } from 'node:url';
import { DuckDBInstance } from '@duckdb/node-api';
import { channelConstants, type Channel } from '@bridgework/channel';
import { sqlExpression, type SqlDialect, type SqlMap } from '@bridgework/firmware';
import { loadChannels } from '../packages/cli/src/channels/loadChannels.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { postgresUnavailable, startPostgres, type TestPostgres } from './support/postgres.js';

const N = 1_000_000;
const example = fileURLToPath(new URL('../packages/cli/demo/footbridge-monitoring.yaml', import.meta.url));
const hopperSpec = {
  // The channel of examples/hopper-scale-channel.ts (a load cell read as mass), restated.
  name: 'hopper cell B',
  sensor: {
    kind: 'transducer',
    capacity: '2000 kg',
    ratedOutputVoltsPerVolt: 2.0013e-3,
    ratedOutputToleranceFraction: 0.0005,
    zeroBalanceVoltsPerVolt: 0.021e-3,
    inputOhms: 385,
    outputOhms: 350,
  },
  bridge: { wiring: 'six-wire', cable: { awg: 24, lengthMeters: 12 } },
  excitation: { volts: 5, remoteSense: true },
  amplifier: { gain: 128, inputVoltageNoiseVoltsPerRootHz: 6e-9 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true, filter: { order: 4, dataRateHertz: 20 } },
  tolerances: { gainFraction: 0.0002 },
  output: { quantity: 'mass', range: [0, 2000], firmwareResolution: 0.01 },
} as const;

interface Case {
  readonly name: string;
  readonly channel: Channel;
  readonly map: SqlMap;
  /** The library's value for a code (NaN where SQL must give NULL). */
  readonly expected: (codes: Int32Array) => Float64Array;
  /** Largest |SQL − exact map| allowed (0: bit for bit against `expected` is all that is asked). */
  readonly bound?: { readonly maxAbsError: number; readonly exact: (code: number) => number };
}

/** The channel's map for SQL: its kernel when it converts by one, else its float64 polynomial. */
function caseOf(channel: Channel): Case {
  // The kernel's coefficients and range, exactly as `channel.convert` uses them (`channel.map`).
  const m = channel.map;
  if (m.form === 'mobius') {
    return {
      name: channel.name,
      channel,
      map: { form: 'mobius', coefficients: m.coefficients, validCodes: m.validCodes },
      expected: (codes) => channel.convert(codes).values,
    };
  }
  // One float64 polynomial over the whole span (a table of at most 6 doubles: a single segment),
  // designed by the firmware package to the channel's default target and verified over every code.
  const designed = channelConstants(channel, { types: ['float64'], maxTableBytes: 48 });
  const f64 = designed.float64;
  const total = designed.totals.float64;
  if (f64?.kind !== 'piecewise-polynomial' || f64.segmentCount !== 1 || total === undefined)
    throw new Error('expected a verified single-segment polynomial');
  // The segment's centre: t = code − centre, as the firmware's evaluator forms it.
  const centre = f64.segmentBase + 2 ** (f64.segmentBits - 1);
  return {
    name: channel.name,
    channel,
    map: {
      form: 'polynomial',
      offset: centre,
      coefficients: f64.coefficients[0] as readonly number[],
      codeMin: f64.codeMin,
      codeMax: f64.codeMax,
      maxAbsError: total.bound,
    },
    expected: (codes) =>
      Float64Array.from(codes, (c) => (c >= f64.codeMin && c <= f64.codeMax ? f64.evaluate(c) : Number.NaN)),
    bound: { maxAbsError: total.bound, exact: (c) => channel.quantityFromCode(c) },
  };
}

/** The sweep: n codes from two codes below the low rail to two above the high rail. */
function sweep(channel: Channel): { lo: number; span: number; codes: Int32Array } {
  const lo = channel.adc.codeMin - 2;
  const span = channel.adc.codeMax + 2 - lo;
  const codes = Int32Array.from({ length: N }, (_, i) => lo + Math.floor((i * span) / (N - 1)));
  return { lo, span, codes };
}

let cases: Case[] = [];
beforeAll(async () => {
  const { createChannel } = await import('@bridgework/channel');
  const loaded = await loadChannels(example);
  cases = [...loaded.channels.map((c) => caseOf(c.channel)), caseOf(createChannel(hopperSpec as never))];
}, 300_000);

/** Compares SQL results with the library, and with the exact map for a polynomial. */
function check(c: Case, codes: Int32Array, got: readonly (number | null)[]): void {
  const want = c.expected(codes);
  let mismatches = 0;
  let first = '';
  let worst = 0;
  for (let i = 0; i < codes.length; i++) {
    const w = want[i] as number;
    const g = got[i] ?? null;
    const same = Number.isNaN(w) ? g === null : g !== null && Object.is(g, w);
    if (!same) {
      if (mismatches === 0) first = `code ${codes[i]}: SQL ${g}, library ${w}`;
      mismatches++;
    }
    if (c.bound !== undefined && g !== null)
      worst = Math.max(worst, Math.abs(g - c.bound.exact(codes[i] as number)));
  }
  expect(mismatches, `${c.name}: ${mismatches} of ${codes.length} differ; first ${first}`).toBe(0);
  // Rails and beyond are NULL; something converted.
  expect(got[0]).toBeNull();
  expect(got[codes.length - 1]).toBeNull();
  expect(got.filter((g) => g !== null).length).toBeGreaterThan(codes.length / 100);
  if (c.bound !== undefined) expect(worst).toBeLessThanOrEqual(c.bound.maxAbsError);
}

describe('DuckDB (embedded)', () => {
  let duck: Awaited<ReturnType<DuckDBInstance['connect']>>;
  beforeAll(async () => {
    duck = await (await DuckDBInstance.create(':memory:')).connect();
  });
  afterAll(() => duck.closeSync());

  it('covers every example channel: three from the footbridge file and the hopper load cell', () => {
    expect(cases.map((c) => [c.name, c.map.form])).toEqual([
      ['hanger-h3', 'mobius'],
      ['gusset-g2', 'mobius'],
      ['deck-temp', 'polynomial'],
      ['hopper cell B', 'mobius'],
    ]);
  });

  it.each([0, 1, 2, 3])('example channel %i: 10⁶ codes, rails included, equal the library', async (k) => {
    const c = cases[k] as Case;
    const { lo, span, codes } = sweep(c.channel);
    const expr = sqlExpression(c.map, '"code"', 'duckdb');
    const reader = await duck.runAndReadAll(
      `SELECT ${expr} AS v FROM (SELECT i, (${lo} + (i * ${span}) // ${N - 1}) AS code FROM range(0, ${N}) AS t(i)) ORDER BY i`,
    );
    const got = reader.getColumns()[0] as (number | null)[];
    check(c, codes, got);
  });
});

const pgMissing = postgresUnavailable();
const underCi = process.env['CI'] !== undefined;

describe.skipIf(pgMissing !== undefined && !underCi)(
  'PostgreSQL 15 (a real server on a local socket)',
  () => {
    let server: TestPostgres;
    beforeAll(async () => {
      if (pgMissing !== undefined) throw new Error(`PostgreSQL is needed under CI: ${pgMissing}`);
      server = await startPostgres();
    }, 60_000);
    afterAll(async () => server?.stop());

    it('prints binary64 with shortest round-trip digits (extra_float_digits)', async () => {
      const r = await server.client.query<{ v: number }>("SELECT float8 '0.1' + float8 '0.2' AS v");
      expect(Object.is(r.rows[0]?.v, 0.1 + 0.2)).toBe(true);
    });

    it.each([0, 1, 2, 3])(
      'example channel %i: 10⁶ codes, rails included, equal the library',
      async (k) => {
        const c = cases[k] as Case;
        const { lo, span, codes } = sweep(c.channel);
        const expr = sqlExpression(c.map, '"code"', 'postgresql' satisfies SqlDialect);
        const r = await server.client.query<{ v: number | null }>({
          text: `SELECT ${expr} AS v FROM (SELECT i, (${lo} + (i * ${span}::bigint) / ${N - 1}) AS code FROM generate_series(0::bigint, ${N - 1}) AS i) AS t ORDER BY i`,
          rowMode: 'array',
        } as never);
        const got = (r.rows as unknown as [number | null][]).map((row) => row[0]);
        check(c, codes, got);
      },
      120_000,
    );
  },
);
