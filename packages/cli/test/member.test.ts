/**
 * `bridgework reduce-member`: every row against the mechanics package's createMemberReduction
 * called directly, the loads behind a recording written here from the handbook equations
 * (σx = N/A + My·z/Iy − Mz·y/Iz, εs = −ν·εx, γ = T·r/(G·J), εθ by the strain transformation), the
 * JSON summary field by field, the checks (condition number, residual with the gauge named), and
 * refusals in the user's terms. Memory on a large recording: BRIDGEWORK_HEAVY=1.
 */
import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createMemberReduction, sectionProperties } from '@bridgework/mechanics';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { memoryIo } from './support/memoryIo.js';
import { exited, spawnTs, waitForLine } from './support/spawnChild.js';
import { useTempDir } from './support/tempDir.js';
import { MAX_BUCKETS, RowEnvelope } from '../src/commands/member/memberHtml.js';
import { formatNumber } from '../src/report/formatNumber.js';

const tmp = useTempDir('member');
const exampleDir = fileURLToPath(new URL('../../../examples/test-day/', import.meta.url));
const env = { NO_COLOR: '1' };

async function run(...argv: string[]) {
  const io = memoryIo({ env });
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

const table = (text: string) =>
  text
    .trim()
    .split('\n')
    .map((l) => l.split(','));

function write(name: string, text: string): string {
  const path = join(tmp(), name);
  writeFileSync(path, text);
  return path;
}

// A tube 88.9 × 76.3 mm bore, steel E = 205 GPa, ν = 0.29 (invented mast).
const E = 205e9;
const NU = 0.29;
const D = 0.0889;
const BORE = 0.0763;
const r = D / 2;
const props = sectionProperties({ shape: 'circular', diameterMeters: D, innerDiameterMeters: BORE });
const J = 2 * props.secondMomentOfAreaMeters4;
const G = E / (2 * (1 + NU));
/** n@+z, s@-z, e@+y, w@-y, t1@+y@45, t2@+y@-45 as (y, z, θ). */
const layout: [number, number, number][] = [
  [0, r, 0],
  [0, -r, 0],
  [r, 0, 0],
  [-r, 0, 0],
  [r, 0, Math.PI / 4],
  [r, 0, -Math.PI / 4],
];
const gaugesOption = 'n@+z,s@-z,e@+y,w@-y,t1@+y@45,t2@+y@-45';

/** Strain at (y, z, θ) under N, My, Mz, T: the handbook equations, written here (Gere & Goodno; from memory). */
function strainAt(
  [y, z, th]: [number, number, number],
  n: number,
  my: number,
  mz: number,
  t: number,
): number {
  const ex =
    (n / props.areaSquareMeters +
      (my * z) / props.secondMomentOfAreaMeters4 -
      (mz * y) / props.secondMomentOfAreaMeters4) /
    E;
  const gamma = (t * Math.hypot(y, z)) / (G * J);
  return ex * Math.cos(th) ** 2 - NU * ex * Math.sin(th) ** 2 + gamma * Math.sin(th) * Math.cos(th);
}

/** A recording: time, six gauges in µε (rounded to 0.001 µε), the loads behind each row. */
function recording(rows: number) {
  const loads: [number, number, number, number][] = [];
  const lines = ['time (s),n (µε),s (µε),e (µε),w (µε),t1 (µε),t2 (µε)'];
  for (let i = 0; i < rows; i++) {
    const k = i / rows;
    const l: [number, number, number, number] = [
      2e5 * Math.sin(7 * k),
      6e3 * Math.cos(5 * k),
      -3e3 * k,
      4e3 * Math.sin(3 * k + 1),
    ];
    loads.push(l);
    lines.push([(i / 100).toFixed(2), ...layout.map((g) => (strainAt(g, ...l) * 1e6).toFixed(3))].join(','));
  }
  return { text: `${lines.join('\n')}\n`, loads };
}

const common = [
  '--gauges',
  gaugesOption,
  '--diameter',
  '88.9 mm',
  '--bore',
  '76.3 mm',
  '--modulus',
  '205 GPa',
  '--poisson',
  '0.29',
];

describe('reduce-member', () => {
  it('every row equals createMemberReduction called directly, and recovers the loads behind the recording', async () => {
    const rec = recording(200);
    const file = write('mast.csv', rec.text);
    const out = join(tmp(), 'mast-loads.csv');
    const res = await run('reduce-member', file, ...common, '-o', out);
    expect(res.code).toBe(exitCodes.ok);
    const rows = table(readFileSync(out, 'utf8'));
    expect(rows[0]).toEqual([
      'time (s)',
      'axial_force (kN)',
      'bending_moment_y (kN·m)',
      'bending_moment_z (kN·m)',
      'torque (kN·m)',
      'max_residual (µε)',
    ]);
    const direct = createMemberReduction({
      modulusPascals: E,
      poissonRatio: NU,
      section: { shape: 'circular', diameterMeters: D, innerDiameterMeters: BORE },
      gauges: layout.map(([y, z, th]) => ({ yMeters: y, zMeters: z, angleRadians: th })),
    });
    const input = table(rec.text);
    for (let i = 1; i < rows.length; i++) {
      const row = rows[i]!.map(Number);
      const x = direct.reduce(input[i]!.slice(1).map((v) => Number(v) * 1e-6));
      expect(rows[i]![0]).toBe(input[i]![0]);
      // µε parsed the same way and scaled once: the same doubles up to the unit conversion.
      expect(row[1]).toBeNear(x.axialForceNewtons! / 1e3, { rel: 1e-14, abs: 1e-12 });
      expect(row[2]).toBeNear(x.bendingMomentYNewtonMeters! / 1e3, { rel: 1e-14, abs: 1e-12 });
      expect(row[3]).toBeNear(x.bendingMomentZNewtonMeters! / 1e3, { rel: 1e-14, abs: 1e-12 });
      expect(row[4]).toBeNear(x.torqueNewtonMeters! / 1e3, { rel: 1e-14, abs: 1e-12 });
      expect(row[5]).toBeNear(x.maxResidualStrain / 1e-6, { rel: 1e-12, abs: 1e-12 });
      // The loads behind the row, within what rounding the gauges to 0.001 µε leaves:
      // N: E·A·0.0005 µε ≈ 0.2 N; moments and torque: E·S·0.0005 µε ≈ 0.003 N·m.
      const [n, my, mz, t] = rec.loads[i - 1]!;
      expect(row[1]! * 1e3).toBeNear(n, { abs: 1 });
      expect(row[2]! * 1e3).toBeNear(my, { abs: 0.02 });
      expect(row[3]! * 1e3).toBeNear(mz, { abs: 0.02 });
      expect(row[4]! * 1e3).toBeNear(t, { abs: 0.02 });
      expect(row[5]!).toBeLessThan(0.002);
    }
    expect(res.stderr).toMatch(
      /reduced 200 of 200 rows .*6 gauges on a tube 88\.9 × 76\.3 mm bore, solving axial, bending-y, bending-z, torsion; condition number/,
    );
    expect(res.stderr).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
  });

  it('--json: the summary field by field against the library; a gauge that drifts fails --max-residual and is named', async () => {
    const rec = recording(50);
    const lines = rec.text.trim().split('\n');
    // Row 31: gauge 'e' reads 60 µε high (a zero shift).
    const cells = lines[31]!.split(',');
    cells[3] = String(Number(cells[3]) + 60);
    lines[31] = cells.join(',');
    lines[40] = `${lines[40]!.split(',')[0]},1,2,x,4,5,6`;
    const file = write('drift.csv', `${lines.join('\n')}\n`);
    const out = join(tmp(), 'drift-loads.csv');
    const res = await run(
      'reduce-member',
      file,
      ...common,
      '-o',
      out,
      '--json',
      '--max-residual',
      '20 µε',
      '--force-unit',
      'N',
      '--moment-unit',
      'N·m',
    );
    expect(res.code).toBe(exitCodes.failedCheck);
    const j = JSON.parse(res.stdout) as Record<string, any>;
    const direct = createMemberReduction({
      modulusPascals: E,
      poissonRatio: NU,
      section: { shape: 'circular', diameterMeters: D, innerDiameterMeters: BORE },
      gauges: layout.map(([y, z, th]) => ({ yMeters: y, zMeters: z, angleRadians: th })),
    });
    expect(j['caution']).toMatch(/qualified engineering judgement/);
    expect(j['rows']).toBe(50);
    expect(j['reducedRows']).toBe(49);
    expect(j['skipped']).toEqual([{ reason: 'a gauge is empty or not a number', rows: 1, firstLine: 41 }]);
    expect(j['conditionNumber']).toBeNear(direct.conditionNumber, { ulps: 0 });
    expect(j['redundancy']).toBe(2);
    expect(j['resultants']).toEqual(['axial', 'bending-y', 'bending-z', 'torsion']);
    expect(j['units']).toEqual({ strain: 'µε', force: 'N', moment: 'N·m' });
    expect(j['gauges'][4]).toEqual({ column: 't1', yMeters: r, zMeters: 0, angleDegrees: 45 });
    const strains = lines[31]!
      .split(',')
      .slice(1)
      .map((v) => Number(v) * 1e-6);
    const drifted = direct.reduce(strains);
    expect(j['largestResidual']['gauge']).toBe('e');
    expect(j['largestResidual']['line']).toBe(32);
    expect(j['largestResidual']['value']).toBeNear(drifted.maxResidualStrain / 1e-6, { rel: 1e-12 });
    expect(j['checks'].map((c: { id: string; status: string }) => [c.id, c.status])).toEqual([
      ['condition-number', 'pass'],
      ['residual', 'fail'],
    ]);
    expect(j['checks'][1]['message']).toMatch(
      /1 row with a residual above --max-residual 20 µε \(first at line 32\).*gauge 'e'/,
    );
    expect(j['ok']).toBe(false);
    // The rows in N and N·m against the library.
    const rows = table(readFileSync(out, 'utf8'));
    expect(Number(rows[31]![1])).toBeNear(drifted.axialForceNewtons!, { rel: 1e-14 });
    expect(rows[40]!.slice(1)).toEqual(['NaN', 'NaN', 'NaN', 'NaN', 'NaN']);
  });

  it('a box section with gauges by coordinates; Bredt torsion; the section options in the user’s terms', async () => {
    const b = 0.08;
    const h = 0.12;
    const t = 0.006;
    const file = write('box.csv', 'a,b,c,d,q\n300,-100,120,80,40\n');
    const res = await run(
      'reduce-member',
      file,
      '--gauges',
      'a@+z,b@-z,c@+y,d@0mm:60mm@90,q@-y@45',
      '--width',
      '80 mm',
      '--depth',
      '120 mm',
      '--wall',
      '6 mm',
      '--modulus',
      '205 GPa',
      '--poisson',
      '0.29',
      '--strain-unit',
      'µε',
    );
    expect(res.code).toBe(exitCodes.ok);
    const direct = createMemberReduction({
      modulusPascals: E,
      poissonRatio: NU,
      section: { shape: 'rectangular', widthMeters: b, depthMeters: h, wallThicknessMeters: t },
      gauges: [
        { yMeters: 0, zMeters: h / 2 },
        { yMeters: 0, zMeters: -h / 2 },
        { yMeters: b / 2, zMeters: 0 },
        { yMeters: 0, zMeters: 0.06, angleRadians: Math.PI / 2 },
        { yMeters: -b / 2, zMeters: 0, angleRadians: Math.PI / 4 },
      ],
    });
    const x = direct.reduce([300e-6, -100e-6, 120e-6, 80e-6, 40e-6]);
    const row = table(res.stdout)[1]!.map(Number);
    expect(row[0]).toBeNear(x.axialForceNewtons! / 1e3, { rel: 1e-14 });
    expect(row[3]).toBeNear(x.torqueNewtonMeters! / 1e3, { rel: 1e-14 });
    expect(res.stderr).toMatch(/hollow rectangle 80 \(y\) × 120 \(z\) × 6 mm wall/);
    const cases: [string[], RegExp, number][] = [
      [
        ['--gauges', 'a@+z,b@+z', '--diameter', '50 mm'],
        /--gauges: .*cannot separate|--gauges.*at least one gauge per resultant/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y,d@-y', '--diameter', '50'],
        /--diameter: '50' needs its unit, e\.g\. '50 mm'/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y,d@-y', '--diameter', '50 mm', '--width', '20 mm'],
        /describe different sections: give one/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y,d@30°', '--width', '20 mm', '--depth', '40 mm'],
        /needs a round section/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y,zz@-y', '--diameter', '50 mm'],
        /--gauges: 'zz' is not a column of .*box\.csv/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y,d@-y@45', '--width', '20 mm', '--depth', '40 mm'],
        /--torsion-modulus/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y,d@0mm:90mm', '--diameter', '50 mm'],
        /--gauges 'd@0mm:90mm' at .* lies outside the section/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y', '--diameter', '50 mm', '--json'],
        /--json prints the summary on standard output, so the rows need --out/,
        1,
      ],
      [
        ['--gauges', 'a@+z,b@-z,c@+y', '--diameter', '50 mm', '--max-residual', '5 µε'],
        /--max-residual: needs more gauges than resultants/,
        1,
      ],
    ];
    for (const [args, message, code] of cases) {
      const e = await run('reduce-member', file, '--modulus', '205 GPa', '--poisson', '0.29', ...args);
      expect(e.stderr).toMatch(message);
      expect(e.code).toBe(code);
    }
  });
});

describe('reduce-member --html', () => {
  it('draws the resultants over the recording with every extreme kept, in bounded memory', async () => {
    const rec = recording(5000);
    const file = write('mast-html.csv', rec.text);
    const page = join(tmp(), 'mast.html');
    const out = join(tmp(), 'mast-html.csv.out');
    const r = await run('reduce-member', file, ...common, '-o', out, '--html', page);
    expect(r.code).toBe(exitCodes.ok);
    const html = readFileSync(page, 'utf8');
    expect(html).toMatch(/data-plot="member-force"[^>]*data-series-count="1"/);
    expect(html).toMatch(/data-plot="member-moment"[^>]*data-series-count="3"/);
    expect(html).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
    // 5000 rows into at most 1000 strokes; the table's extremes are those of the rows written.
    expect(html).toMatch(/\d+ strokes for 5000 rows/);
    const rows = table(readFileSync(out, 'utf8'))
      .slice(1)
      .map((x) => x.map(Number));
    const max = Math.max(...rows.map((x) => x[1]!));
    expect(html).toContain(formatNumber(max, 5));
  });

  it('RowEnvelope keeps at most MAX_BUCKETS buckets and every extreme, whatever the row count', () => {
    const env = new RowEnvelope(1);
    let lo = Infinity;
    let hi = -Infinity;
    for (let row = 1; row <= 123_457; row++) {
      if (row % 17 === 0) continue; // rows not reduced leave gaps
      const v = Math.sin(row / 700) * 100 + (row === 77_777 ? 500 : 0);
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
      env.add(row, [v]);
      expect(env.buckets).toBeLessThanOrEqual(MAX_BUCKETS);
    }
    expect(env.range(0).max).toBe(hi);
    expect(env.range(0).min).toBe(lo);
    const line = env.polyline(0);
    expect(Math.max(...line.y)).toBe(500 + Math.sin(77_777 / 700) * 100);
    // Abscissas increase (strokes in row order).
    for (let i = 2; i < line.x.length; i += 2) expect(line.x[i]!).toBeGreaterThan(line.x[i - 2]!);
  });
});

describe('reduce-member on a large recording (BRIDGEWORK_HEAVY=1)', () => {
  // As the rosette's memory test: V8's old space capped at 80 MiB, below the output (about 100
  // bytes a row: 200 MB at 2·10⁶ rows); a reduction that kept its rows or output could not finish.
  const heavy = process.env['BRIDGEWORK_HEAVY'] === '1';
  const flags = ['--max-old-space-size=80', '--max-semi-space-size=4'];
  const child = fileURLToPath(new URL('./support/memberChild.ts', import.meta.url));
  it.skipIf(!heavy)('streams 2·10⁶ rows within an 80 MiB heap', { timeout: 1_800_000 }, async () => {
    const rows = 2_000_000;
    const p = spawnTs(child, [tmp(), String(rows)], flags);
    const m = await waitForLine(p, /^(\{.*\})$/);
    expect((await exited(p)).code).toBe(0);
    const r = JSON.parse(m[1]!) as { code: number; rows: number };
    expect(r.code).toBe(0);
    expect(statSync(join(tmp(), `loads-${rows}.csv`)).size).toBeGreaterThan(rows * 80);
    // The figure recorded in docs/test-day.md.
    console.log(`reduce-member ${rows} rows: ${m[1]!}`);
  });
});

describe('reduce-member on the example test day', () => {
  it("recovers the scenario's tie loads from examples/test-day/anchor-tie-gauges.csv", async () => {
    // The scenario (the file's header): N = 2.5 kN per kN of rope, the force 1.0 mm off the axis
    // toward +z and 0.6 mm toward +y, so My = N·1.0 mm and Mz = −N·0.6 mm; gauges within ±0.4 µε of noise.
    const file = join(exampleDir, 'anchor-tie-gauges.csv');
    const out = join(tmp(), 'anchor-tie-loads.csv');
    const res = await run(
      'reduce-member',
      file,
      '--gauges',
      'n@+z,s@-z,e@+y,w@-y',
      '--diameter',
      '36 mm',
      '--modulus',
      '205 GPa',
      '--poisson',
      '0.29',
      '--max-residual',
      '2 µε',
      '-o',
      out,
    );
    expect(res.code).toBe(exitCodes.ok);
    const rows = table(readFileSync(out, 'utf8'));
    expect(rows[0]!.slice(0, 2)).toEqual(['time (s)', 'rope (kN)']);
    // 0.4 µε of noise is E·A·0.4 µε ≈ 0.08 kN of axial force and E·S·0.4 µε ≈ 0.0004 kN·m of moment.
    for (const row of rows.slice(1).map((r) => r.map(Number))) {
      const n = 2.5 * row[1]!;
      expect(row[2]).toBeNear(n, { abs: 0.1 });
      expect(row[3]).toBeNear(n * 1.0e-3, { abs: 0.001 });
      expect(row[4]).toBeNear(-n * 0.6e-3, { abs: 0.001 });
      expect(row[5]).toBeLessThan(0.5);
    }
    expect(res.stderr).toMatch(/largest residual 0\.2525 µε at gauge 'e' \(line 13\)/);
  });
});
