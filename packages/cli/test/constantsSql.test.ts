/**
 * `bridgework constants --format sql`: each channel's map as SQL, run in real engines — DuckDB
 * embedded, and a real PostgreSQL server where one can be had (always under CI) — over a table of
 * codes that sweeps each converter's whole range, rails and beyond included, against the channel
 * package: a linear-fractional channel equals `channel.convert` bit for bit (NULL where it gives
 * NaN); the RTD equals its verified float64 piecewise polynomial (the firmware package's design at
 * the `--target-error` given, several segments) bit for bit on the codes it covers, within the
 * stated bound of the exact map. The channel file gives the gusset a fractional zero reading
 * (a mean of codes, as `convert --zero-window` takes), carried end to end.
 */
import { existsSync, readFileSync } from 'node:fs';
import { DuckDBInstance } from '@duckdb/node-api';
import { channelConstants, createChannel, type Channel } from '@bridgework/channel';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { examplePath, footbridgeSpecs } from './support/footbridge.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';
import { postgresUnavailable, startPostgres, type TestPostgres } from '../../../test/support/postgres.js';

const { file, outPath } = useTestFiles('constants-sql');
const N = 100_000;
const names = ['hanger-h3', 'gusset-g2', 'deck-temp'] as const;
const ZERO = -18433.375; // a mean of codes: not an integer
/** The RTD's --target-error in the engine runs (°C): tight enough to need several segments. */
const RTD_TARGET = 1e-6;

// The example file with the gusset's zero reading made fractional, written as JSON.
const doc = parse(readFileSync(examplePath, 'utf8')) as { channels: Record<string, Record<string, unknown>> };
doc.channels['gusset-g2']!['zero'] = { code: ZERO };
const channelFile = file('footbridge.json', JSON.stringify(doc));
const channels: Channel[] = names.map((n) =>
  createChannel(n === 'gusset-g2' ? { ...footbridgeSpecs[n], zero: { code: ZERO } } : footbridgeSpecs[n]),
);

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

/** Codes from two below the low rail to two above the high rail, N of them, per channel. */
function sweep(c: Channel): Int32Array {
  const lo = c.adc.codeMin - 2;
  const span = c.adc.codeMax + 2 - lo;
  return Int32Array.from({ length: N }, (_, i) => lo + Math.floor((i * span) / (N - 1)));
}
const codes = channels.map(sweep);

/** The library's value per code: `convert` for a Möbius channel, else the float64 polynomial (NaN outside). */
function expected(j: number): { values: Float64Array; bound?: number } {
  const c = channels[j] as Channel;
  if (c.map.form === 'mobius') return { values: c.convert(codes[j] as Int32Array).values };
  // The command's design: the firmware package's float64 function over the span at the target,
  // verified against the exact map (the command's --max-table-bytes default is 4096).
  const designed = channelConstants(c, {
    verification: 'sampled',
    types: ['float64'],
    targetError: RTD_TARGET,
    maxTableBytes: 4096,
  });
  const f64 = designed.float64;
  const total = designed.totals.float64;
  if (f64 === undefined || total === undefined) throw new Error('expected a verified float64 function');
  // The case this test exists for: a piecewise polynomial of several segments.
  expect(f64.kind === 'piecewise-polynomial' && f64.segmentCount).toBeGreaterThan(1);
  expect(total.bound).toBeLessThanOrEqual(RTD_TARGET);
  return {
    values: Float64Array.from(codes[j] as Int32Array, (x) =>
      x >= f64.codeMin && x <= f64.codeMax ? f64.evaluate(x) : Number.NaN,
    ),
    bound: total.bound,
  };
}

function check(j: number, got: readonly (number | null)[]): void {
  const { values, bound } = expected(j);
  const c = channels[j] as Channel;
  let mismatches = 0;
  let first = '';
  let worst = 0;
  let converted = 0;
  values.forEach((w, i) => {
    const g = got[i] ?? null;
    const same = Number.isNaN(w) ? g === null : g !== null && Object.is(g, w);
    if (!same && mismatches++ === 0) first = `code ${codes[j]![i]}: SQL ${g}, library ${w}`;
    if (g !== null) {
      converted++;
      // Against the exact map on every 16th code (the bound's own proof is the firmware package's).
      if (bound !== undefined && i % 16 === 0)
        worst = Math.max(worst, Math.abs(g - c.quantityFromCode(codes[j]![i] as number)));
    }
  });
  expect(mismatches, `${names[j]}: ${mismatches} of ${N} differ; first ${first}`).toBe(0);
  expect(got[0], 'below the low rail').toBeNull();
  expect(got[N - 1], 'above the high rail').toBeNull();
  expect(converted).toBeGreaterThan(N / 100);
  if (bound !== undefined) expect(worst).toBeLessThanOrEqual(bound);
}

describe('bridgework constants --format sql', () => {
  it('writes the provenance, the caution and each channel’s guarantee', async () => {
    const r = await run('constants', channelFile, '--format', 'sql', '--verification', 'sampled');
    expect(r.code, r.stderr).toBe(exitCodes.ok);
    expect(r.stdout).toMatch(
      /^-- From the channel file .*footbridge\.json \(channels hanger-h3, gusset-g2, deck-temp\) by bridgework /,
    );
    expect(r.stdout).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
    expect(r.stdout).toContain('hanger-h3 (N), from column hanger-h3: the exact map');
    expect(r.stdout).toContain('gusset-g2 (µε), from column gusset-g2: the exact map');
    // The default target: the cheapest verified float64 form; sampled verification is said to be so.
    expect(r.stdout).toMatch(
      /deck-temp \(°C\), from column deck-temp: a binary64 (piecewise )?polynomial.* of degree \d.*a bound measured on a sample of the codes, not proved/,
    );
    expect(r.stderr).toMatch(
      /deck-temp: SQL polynomial of degree \d, \d+ segments?, total error <= [\d.e-]+ °C .*measured on \d+ codes/,
    );
    expect(r.stdout.trimEnd().endsWith('FROM "codes";')).toBe(true);
  });

  it('refuses --types (firmware evaluators) and a malformed --table, naming the option', async () => {
    const types = await run('constants', channelFile, '--format', 'sql', '--types', 'fixed');
    expect(types.code).toBe(exitCodes.badInput);
    expect(types.stderr).toContain('--types chooses firmware evaluators');
    const table = await run('constants', channelFile, '--format', 'sql', '--table', 'lake..codes');
    expect(table.code).toBe(exitCodes.badInput);
    expect(table.stderr).toContain('--table must name a table');
    // Fixed-point and firmware-only options are refused, not silently ignored.
    const step = await run('constants', channelFile, '--format', 'sql', '--output-step', '0.01');
    expect(step.code).toBe(exitCodes.badInput);
    expect(step.stderr).toContain("--output-step sets the fixed-point function's output step");
    const divide = await run('constants', channelFile, '--format', 'sql', '--hardware-divide');
    expect(divide.code).toBe(exitCodes.badInput);
    expect(divide.stderr).toContain('--hardware-divide');
  });

  it('takes --target-error for a nonlinear channel, and refuses one no table allows, writing nothing', async () => {
    const out = outPath('rtd.sql');
    const argv = [
      'constants',
      channelFile,
      '-c',
      'deck-temp',
      '--format',
      'sql',
      '--verification',
      'sampled',
    ];
    const r = await run(...argv, '--target-error', 'deck-temp=1e-6', '-o', out);
    expect(r.code, r.stderr).toBe(exitCodes.ok);
    const sql = readFileSync(out, 'utf8');
    const segments = Number(/deck-temp: SQL polynomial of degree \d, (\d+) segments/.exec(r.stderr)?.[1]);
    expect(segments).toBeGreaterThan(1);
    // One CASE arm per segment.
    expect(sql.match(/ WHEN /g)).toHaveLength(segments);
    const none = outPath('none.sql');
    const tooTight = await run(...argv, '--target-error', '1e-13', '--max-table-bytes', '64', '-o', none);
    expect(tooTight.code).toBe(exitCodes.badInput);
    expect(tooTight.stderr).toMatch(
      /`--target-error` 1e-13 °C cannot be met by a float64 function.*`--max-table-bytes`/s,
    );
    expect(existsSync(none)).toBe(false);
  });

  describe('in DuckDB (embedded)', () => {
    let duck: Awaited<ReturnType<DuckDBInstance['connect']>>;
    beforeAll(async () => {
      duck = await (await DuckDBInstance.create(':memory:')).connect();
      // The table of codes: one column per channel, named after it; i keeps the order.
      const lo = codes.map((c) => c[0] as number);
      const span = codes.map((c) => (c[N - 1] as number) - (c[0] as number));
      await duck.run(
        `CREATE TABLE codes AS SELECT i, ${names
          .map((n, j) => `(${lo[j]} + (i * ${span[j]}) // ${N - 1})::INTEGER AS "${n}"`)
          .join(', ')} FROM range(0, ${N}) AS t(i) ORDER BY i`,
      );
    });
    afterAll(() => duck.closeSync());

    it('the script, run as written, equals the library for every channel (rails NULL)', async () => {
      const r = await run(
        'constants',
        channelFile,
        '--format',
        'sql',
        '--verification',
        'sampled',
        '--target-error',
        `deck-temp=${RTD_TARGET}`,
        '--table',
        'main.codes',
      );
      expect(r.code, r.stderr).toBe(exitCodes.ok);
      // The table's codes are the test's codes.
      const stored = (await duck.runAndReadAll('SELECT * FROM codes ORDER BY i')).getColumns();
      names.forEach((_, j) => expect(Int32Array.from(stored[j + 1] as number[])).toEqual(codes[j]));
      // DuckDB keeps insertion order for a scan and projection (preserve_insertion_order, its default).
      const got = (await duck.runAndReadAll(r.stdout)).getColumns() as (number | null)[][];
      expect(got).toHaveLength(3);
      names.forEach((_, j) => check(j, got[j] as (number | null)[]));
    });
  });

  it('convert carries the fractional zero reading too: equal to the channel package bit for bit', async () => {
    const frames = 200;
    const interleaved = new Int32Array(frames * 3);
    for (let f = 0; f < frames; f++) {
      for (let j = 0; j < 3; j++)
        interleaved[f * 3 + j] = codes[j]![Math.floor((f * (N - 1)) / (frames - 1))] as number;
    }
    const r = await run('convert', channelFile, file('codes.bin', int32le([...interleaved])));
    expect(r.code, r.stderr).toBe(exitCodes.ok);
    const rows = r.stdout
      .trimEnd()
      .split('\n')
      .slice(1)
      .map((l) => l.split(','));
    const gusset = channels[1] as Channel;
    const want = gusset.convert(
      Int32Array.from({ length: frames }, (_, f) => interleaved[f * 3 + 1] as number),
    ).values;
    rows.forEach((row, f) => expect(row[1], `frame ${f}`).toBe(String(want[f])));
    // A zero reading moves the map: the integer zero of the file gives other values.
    const integerZero = createChannel({ ...footbridgeSpecs['gusset-g2'], zero: { code: Math.round(ZERO) } });
    expect(integerZero.quantityFromCode(0)).not.toBe(gusset.quantityFromCode(0));
  });

  const pgMissing = postgresUnavailable();
  describe.skipIf(pgMissing !== undefined && process.env['CI'] === undefined)(
    'in PostgreSQL 15 (a real server)',
    () => {
      let server: TestPostgres;
      beforeAll(async () => {
        if (pgMissing !== undefined) throw new Error(`PostgreSQL is needed under CI: ${pgMissing}`);
        server = await startPostgres();
        const lo = codes.map((c) => c[0] as number);
        const span = codes.map((c) => (c[N - 1] as number) - (c[0] as number));
        await server.client.query(
          `CREATE TEMPORARY TABLE codes AS SELECT i, ${names
            .map((n, j) => `(${lo[j]} + (i * ${span[j]}::bigint) / ${N - 1})::integer AS "${n}"`)
            .join(', ')} FROM generate_series(0::bigint, ${N - 1}) AS i ORDER BY i`,
        );
      }, 60_000);
      afterAll(async () => server?.stop());

      it('the script equals the library for every channel (rails NULL)', async () => {
        const r = await run(
          'constants',
          channelFile,
          '--format',
          'sql',
          '--dialect',
          'postgresql',
          '--verification',
          'sampled',
          '--target-error',
          `deck-temp=${RTD_TARGET}`,
        );
        expect(r.code, r.stderr).toBe(exitCodes.ok);
        // Ordered by i: the script's SELECT over a subquery that keeps the order column.
        const script = r.stdout.replace('FROM "codes";', 'FROM (SELECT * FROM codes ORDER BY i) AS "codes";');
        const q = await server.client.query({ text: script, rowMode: 'array' } as never);
        const rows = (q as unknown as { rows: (number | null)[][] }).rows;
        expect(rows).toHaveLength(N);
        names.forEach((_, j) =>
          check(
            j,
            rows.map((row) => row[j] ?? null),
          ),
        );
      }, 120_000);
    },
  );
});
