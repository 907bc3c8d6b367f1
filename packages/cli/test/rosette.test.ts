/**
 * `bridgework reduce-rosette`: rows against the mechanics package's `reduceRosette` and
 * `planeStress` called directly, against a handbook worked example and an independent closed-form
 * solve written here, the transverse-sensitivity correction against the forward model of the
 * gauges, pass-through columns, ill-conditioned layouts, errors in the user's terms, and memory
 * bounded on a large recording (10⁷ rows with BRIDGEWORK_HEAVY=1).
 */
import { closeSync, copyFileSync, openSync, readFileSync, readSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createRosette, planeStress, reduceRosette } from '@bridgework/mechanics';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { memoryIo } from './support/memoryIo.js';
import { exited, spawnTs, waitForLine } from './support/spawnChild.js';
import { useTempDir } from './support/tempDir.js';
import { formatNumber } from '../src/report/formatNumber.js';

const tmp = useTempDir('rosette');
const exampleDir = fileURLToPath(new URL('../../../examples/test-day/', import.meta.url));
const env = { NO_COLOR: '1' };

async function run(...argv: string[]) {
  const io = memoryIo({ env });
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

/** A CSV text as rows of cells (no quoting in these files but the one test of it). */
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

/** A deterministic pseudo-random stream in [0, 1) (Park–Miller). */
function random(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return s / 2147483647;
  };
}

describe('reduce-rosette', () => {
  it('every row equals reduceRosette and planeStress called directly (rectangular, m/m and µε, MPa)', async () => {
    const next = random(11);
    const rows = Array.from({ length: 500 }, () =>
      [0, 1, 2].map(() => Math.round((next() - 0.5) * 4e6) / 1e3),
    );
    const file = write('legs.csv', `t,a,b,c\n${rows.map((r, i) => `${i},${r.join(',')}`).join('\n')}\n`);
    const r = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--modulus',
      '70 GPa',
      '--poisson',
      '0.33',
    );
    expect(r.code).toBe(exitCodes.ok);
    const out = table(r.stdout);
    expect(out[0]).toEqual([
      't',
      'strain_1 (µε)',
      'strain_2 (µε)',
      'max_shear_strain (µε)',
      'angle_from_a (°)',
      'stress_1 (MPa)',
      'stress_2 (MPa)',
      'max_shear_stress (MPa)',
      'von_mises (MPa)',
      'tresca (MPa)',
    ]);
    rows.forEach((legs, i) => {
      const cells = out[i + 1]!.map(Number);
      expect(cells[0]).toBe(i);
      const red = reduceRosette({
        layout: 'rectangular',
        strains: legs.map((x) => x * 1e-6) as [number, number, number],
      });
      const s = planeStress({ strainState: red, modulusPascals: 70e9, poissonRatio: 0.33 });
      // The command divides the library's m/m and Pa by the unit: exactly the same doubles back.
      expect(cells.slice(1)).toEqual([
        red.maxStrain / 1e-6,
        red.minStrain / 1e-6,
        red.maxShearStrain / 1e-6,
        red.angleRadians / (Math.PI / 180),
        s.maxStressPascals / 1e6,
        s.minStressPascals / 1e6,
        s.maxShearPascals / 1e6,
        s.vonMisesPascals / 1e6,
        s.trescaPascals / 1e6,
      ]);
    });
    expect(r.stderr).toMatch(/reduced 500 of 500 rows .* condition number 3\.87/);
    expect(r.stderr).toMatch(/support, and do not replace, qualified engineering judgement/);
  });

  it('a handbook worked example (0°/60°/120° rosette) and an independent closed-form solve', async () => {
    // Hibbeler, Mechanics of Materials, the strain-rosette example with legs at 0°, 60°, 120°:
    // εa = 60, εb = 135, εc = 264 µε give ε1 = 272 µε and ε2 = 33.9 µε (from memory, as printed to
    // three figures). Independently: εx = εa, εy = (2(εb + εc) − εa)/3, γxy = 2(εb − εc)/√3
    // (the three strain-transformation equations solved by hand), then Mohr's circle
    // ε1,2 = (εx + εy)/2 ± √(((εx − εy)/2)² + (γxy/2)²), and Hooke's law for plane stress
    // σ1 = E(ε1 + νε2)/(1 − ν²), σ2 = E(ε2 + νε1)/(1 − ν²), σvm = √(σ1² − σ1σ2 + σ2²).
    const file = write('hibbeler.csv', 'a,b,c\n60,135,264\n');
    const r = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--layout',
      'delta',
      '--modulus',
      '200 GPa',
      '--poisson',
      '0.3',
    );
    expect(r.code).toBe(exitCodes.ok);
    const [e1, e2, gmax, angle, s1, s2, , vm] = table(r.stdout)[1]!.map(Number) as number[];
    expect(e1).toBeNear(272, { abs: 0.5 });
    expect(e2).toBeNear(33.9, { abs: 0.05 });
    const ex = 60;
    const ey = (2 * (135 + 264) - 60) / 3;
    const g = (2 * (135 - 264)) / Math.sqrt(3);
    const c = (ex + ey) / 2;
    const R = Math.hypot((ex - ey) / 2, g / 2);
    expect(e1).toBeNear(c + R, { rel: 1e-13 });
    expect(e2).toBeNear(c - R, { rel: 1e-12 });
    expect(gmax).toBeNear(2 * R, { rel: 1e-13 });
    // Direction of ε1 from leg a: tan 2θ = γxy/(εx − εy), on the branch where ε(θ) = ε1.
    const theta = (angle! * Math.PI) / 180;
    const along =
      ex * Math.cos(theta) ** 2 + ey * Math.sin(theta) ** 2 + g * Math.sin(theta) * Math.cos(theta);
    expect(along).toBeNear(c + R, { rel: 1e-12 });
    const k = 200e9 / (1 - 0.09);
    const S1 = (k * (c + R + 0.3 * (c - R)) * 1e-6) / 1e6;
    const S2 = (k * (c - R + 0.3 * (c + R)) * 1e-6) / 1e6;
    expect(s1).toBeNear(S1, { rel: 1e-12 });
    expect(s2).toBeNear(S2, { rel: 1e-12 });
    expect(vm).toBeNear(Math.sqrt(S1 * S1 - S1 * S2 + S2 * S2), { rel: 1e-12 });
  });

  it('corrects transverse sensitivity per leg: legs made by the gauges’ forward model give the strain state back', async () => {
    // Each leg at θ reads ε̂ = (ε(θ) + Kt·ε(θ + 90°))/(1 − ν0·Kt) (the transverse-sensitivity
    // definition; ν0 = 0.285 the gauge-factor calibration beam; common practice).
    const state = { ex: 500e-6, ey: -180e-6, g: 340e-6 };
    const eps = (t: number) =>
      state.ex * Math.cos(t) ** 2 + state.ey * Math.sin(t) ** 2 + state.g * Math.sin(t) * Math.cos(t);
    const kt = [0.03, -0.012, 0.021];
    const angles = [0, 30, 100].map((d) => (d * Math.PI) / 180);
    const legs = angles.map((t, i) => (eps(t) + kt[i]! * eps(t + Math.PI / 2)) / (1 - 0.285 * kt[i]!));
    const file = write('kt.csv', `a (m/m),b (m/m),c (m/m)\n${legs.join(',')}\n`);
    const r = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--layout',
      'angles',
      '--angles',
      '0,30,100',
      '--transverse',
      kt.join(','),
      '--keep-legs',
    );
    expect(r.code).toBe(exitCodes.ok);
    const row = table(r.stdout)[1]!.map(Number);
    angles.forEach((t, i) => expect(row[i]).toBeNear(eps(t), { rel: 1e-12 }));
    const c = (state.ex + state.ey) / 2;
    const R = Math.hypot((state.ex - state.ey) / 2, state.g / 2);
    expect(row[3]).toBeNear(c + R, { rel: 1e-12 });
    expect(row[4]).toBeNear(c - R, { rel: 1e-12 });
    // Without the correction the legs as read give another state (the correction is not a no-op).
    const raw = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--layout',
      'angles',
      '--angles',
      '0,30,100',
    );
    expect(Math.abs(Number(table(raw.stdout)[1]![0]) - (c + R))).toBeGreaterThan(1e-6);
  });

  it('passes the other columns through as written, and flags rows it cannot reduce', async () => {
    const file = write(
      'pass.csv',
      '# a comment\ntime,"site, gauge",ra (µε),rb (µε),rc (µε)\n2026-12-05T10:00:00.000Z,"north, web",100,50,-20\n2026-12-05T10:00:00.100Z,x,,50,-20\n2026-12-05T10:00:00.200Z,y,100,100,100\n',
    );
    const r = await run('reduce-rosette', file, '--legs', 'ra,rb,rc');
    expect(r.code).toBe(exitCodes.ok);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe(
      'time,"site, gauge",strain_1 (µε),strain_2 (µε),max_shear_strain (µε),angle_from_a (°)',
    );
    expect(lines[1]!.startsWith('2026-12-05T10:00:00.000Z,"north, web",')).toBe(true);
    expect(lines[2]).toBe('2026-12-05T10:00:00.100Z,x,NaN,NaN,NaN,NaN');
    // Equal principal strains: every direction is principal, so the angle is NaN, not 0.
    expect(lines[3]).toBe('2026-12-05T10:00:00.200Z,y,100,100,0,NaN');
    expect(r.stderr).toMatch(
      /not reduced \(NaN\): 1 row: a leg is empty or not a number \(first at line 4\)/,
    );
    const kept = await run('reduce-rosette', file, '--legs', '3,4,5', '--keep-columns', '1');
    expect(kept.stdout.split('\n')[0]).toBe(
      'time,strain_1 (µε),strain_2 (µε),max_shear_strain (µε),angle_from_a (°)',
    );
  });

  it('flags an ill-conditioned layout (exit 2, results written) and refuses parallel legs (exit 1)', async () => {
    const file = write('ill.csv', 'a,b,c\n100,90,80\n');
    const ill = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--layout',
      'angles',
      '--angles',
      '0,10,20',
    );
    expect(ill.code).toBe(exitCodes.failedCheck);
    expect(ill.stdout.split('\n')).toHaveLength(3);
    expect(ill.stderr).toMatch(
      /check failed: the layout's condition number 69\.\d exceeds --max-condition 10/,
    );
    const ok = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--layout',
      'angles',
      '--angles',
      '0,10,20',
      '--max-condition',
      '100',
    );
    expect(ok.code).toBe(exitCodes.ok);
    const parallel = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--layout',
      'angles',
      '--angles',
      '0,0.1,0.2',
    );
    expect(parallel.code).toBe(exitCodes.badInput);
    expect(parallel.stderr).toMatch(/--angles 0,0\.1,0\.2: the legs are \(nearly\) parallel/);
  });

  it('takes E and ν from a channel file, and refuses what it cannot do in the user’s terms', async () => {
    const file = write('legs.csv', 'a,b,c\n100,50,-20\n');
    const yaml = write(
      'web.yaml',
      'channels:\n  web:\n    sensor: { kind: strain-gauge, gaugeFactor: 2.1, gaugeOhms: 350 Ω }\n    bridge: { arrangement: quarter, poissonRatio: 0.3 }\n    excitation: { volts: 5 V }\n    amplifier: { gain: 128 }\n    adc: { bits: 24, referenceVolts: 5 V, ratiometric: true }\n    output: { quantity: stress, unit: MPa, modulusPascals: 200 GPa }\n',
    );
    const fromFile = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--channel-file',
      yaml,
      '-c',
      'web',
    );
    const fromOptions = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--modulus',
      '200 GPa',
      '--poisson',
      '0.3',
    );
    expect(fromFile.stderr).toMatch(/from channel 'web' of/);
    expect(fromFile.code).toBe(exitCodes.ok);
    expect(fromFile.stdout).toBe(fromOptions.stdout);
    const cases: [string[], RegExp][] = [
      [[], /--legs is required/],
      [['--legs', 'a,b'], /--legs: name three columns/],
      [['--legs', 'a,b,x'], /--legs: 'x' is not a column of .*legs\.csv; its header names 'a', 'b', 'c'/],
      [['--legs', 'a,b,c', '--modulus', '200 GPa'], /--poisson is required with --modulus/],
      [['--legs', 'a,b,c', '--modulus', '200 kN', '--poisson', '0.3'], /--modulus '200 kN'/],
      [['--legs', 'a,b,c', '--layout', 'angles'], /--angles is required with --layout angles/],
      [['--legs', 'a,b,c', '--transverse', '1.5'], /--transverse: '1\.5' must be a transverse sensitivity/],
      [['--legs', 'a,b,c', '--strain-unit', 'kN'], /--strain-unit/],
      [['--legs', 'a,b,c', '-c', 'web'], /--channel needs --channel-file/],
    ];
    for (const [args, message] of cases) {
      const r = await run('reduce-rosette', file, ...args);
      expect(r.stderr).toMatch(message);
      expect(r.code).toBe(exitCodes.badInput);
    }
  });

  it('reduces the test day’s anchor-block rosette: full load gives the state the recording was made from', async () => {
    const dir = tmp();
    copyFileSync(join(exampleDir, 'anchor-rosette.csv'), join(dir, 'anchor-rosette.csv'));
    const out = join(dir, 'anchor-principal.csv');
    const r = await run(
      'reduce-rosette',
      join(dir, 'anchor-rosette.csv'),
      '--legs',
      'ra,rb,rc',
      '--transverse',
      '0.01',
      '--modulus',
      '205 GPa',
      '--poisson',
      '0.29',
      '-o',
      out,
    );
    expect(r.code).toBe(exitCodes.ok);
    const rows = table(readFileSync(out, 'utf8'));
    expect(rows[0]!.slice(0, 2)).toEqual(['time (s)', 'load step']);
    // The example's state at full load: εx = 420, εy = −130, γxy = 260 µε (legs written to 0.01 µε).
    const full = rows
      .find((x) => x[0] === '10.0')!
      .slice(2)
      .map(Number);
    const R = Math.hypot(275, 130);
    expect(full[0]).toBeNear(145 + R, { abs: 0.02 });
    expect(full[1]).toBeNear(145 - R, { abs: 0.02 });
    expect(full[2]).toBeNear(2 * R, { abs: 0.03 });
    expect(full[3]).toBeNear((Math.atan2(260, 550) * 90) / Math.PI, { abs: 0.01 });
  });
});

describe('reduce-rosette --json', () => {
  it('prints the summary as JSON, field by field against createRosette; the rows go to --out', async () => {
    const file = write('json-legs.csv', 't,a,b,c\n0,100,50,-20\n1,x,2,3\n2,400,300,-100\n');
    const out = join(tmp(), 'json-principal.csv');
    const r = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--layout',
      'delta',
      '--transverse',
      '0.01',
      '--modulus',
      '200 GPa',
      '--poisson',
      '0.3',
      '-o',
      out,
      '--json',
      '--max-condition',
      '3',
    );
    // Delta: κF = √10 = 3.16 > 3, so the check fails (exit 2) and the rows are written.
    expect(r.code).toBe(exitCodes.failedCheck);
    const j = JSON.parse(r.stdout) as Record<string, any>;
    const rosette = createRosette({ layout: 'delta' });
    expect(j['caution']).toMatch(/qualified engineering judgement/);
    expect(j['rows']).toBe(3);
    expect(j['reducedRows']).toBe(2);
    expect(j['layout']['name']).toBe('delta');
    expect(j['layout']['conditionNumber']).toBeNear(rosette.conditionNumber, { ulps: 0 });
    expect(j['layout']['conditionNumber']).toBeNear(Math.sqrt(10), { rel: 1e-14 }); // the delta's κF (mechanics.md)
    j['layout']['anglesDegrees'].forEach((a: number, i: number) =>
      expect(a).toBeNear([0, 60, 120][i]!, { abs: 1e-12 }),
    );
    expect(j['transverse']).toEqual({
      transverseSensitivity: [0.01, 0.01, 0.01],
      calibrationPoissonRatio: 0.285,
    });
    expect(j['material']).toEqual({ modulusPascals: 200e9, poissonRatio: 0.3, from: 'options' });
    expect(j['units']).toEqual({ strain: 'µε', stress: 'MPa' });
    expect(j['skipped']).toEqual([{ reason: 'a leg is empty or not a number', rows: 1, firstLine: 3 }]);
    expect(j['checks']).toEqual([
      expect.objectContaining({ id: 'condition-number', status: 'fail', limit: 3 }),
    ]);
    expect(j['ok']).toBe(false);
    expect(table(readFileSync(out, 'utf8'))).toHaveLength(4);
    expect(r.stderr).not.toMatch(/reduced 2 of 3 rows/);
    const refused = await run('reduce-rosette', file, '--legs', 'a,b,c', '--json');
    expect(refused.code).toBe(exitCodes.badInput);
    expect(refused.stderr).toMatch(/--json prints the summary on standard output, so the rows need --out/);
  });
});

describe('reduce-rosette on a large recording', () => {
  const rows = process.env['BRIDGEWORK_HEAVY'] === '1' ? 10_000_000 : 400_000;
  // V8's old space is capped at 80 MiB, below the output (about 175 bytes a row: 70 MB for 400 000
  // rows, 1.7 GB for 10⁷): a reduction that kept its rows or its output could not finish. The
  // control, which holds the output's lines, runs out of memory under the same cap, so the cap
  // binds. (RSS is not compared: the old space fills with garbage up to its cap either way.)
  const flags = ['--max-old-space-size=80', '--max-semi-space-size=4'];
  const child = fileURLToPath(new URL('./support/rosetteChild.ts', import.meta.url));
  it(
    `streams ${rows} rows within an 80 MiB heap; holding the output does not fit`,
    { timeout: 1_800_000 },
    async () => {
      const p = spawnTs(child, ['stream', tmp(), String(rows)], flags);
      const m = await waitForLine(p, /^(\{.*\})$/);
      expect((await exited(p)).code).toBe(0);
      const r = JSON.parse(m[1]!) as { code: number; rows: number; baselineRss: number; peakRss: number };
      expect(r.code).toBe(0);
      // The figure recorded in docs/cli.md (peak RSS of the reducing process) comes from this line.
      if (rows > 400_000) console.log(`reduce-rosette ${rows} rows: ${m[1]!}`);
      const out = join(tmp(), `principal-${rows}.csv`);
      expect(statSync(out).size).toBeGreaterThan(rows * 150);
      // The last line, read from the file's end (the whole output is 1.7 GB at 10⁷ rows: reading
      // it here would put the test runner, not the reduction, at that size).
      const end = Buffer.alloc(300);
      const fd = openSync(out, 'r');
      readSync(fd, end, 0, 300, statSync(out).size - 300);
      closeSync(fd);
      const tail = end.toString('utf8').trim().split('\n').pop()!;
      expect(tail.split(',')[0]).toBe(String((rows - 1) / 1000));
      if (rows <= 400_000) {
        const control = spawnTs(child, ['whole', tmp(), String(rows)], flags);
        const end = await exited(control);
        expect(end.code === 0 && end.signal === null).toBe(false);
      }
    },
  );
});

describe('reduce-rosette --html', () => {
  it("draws Mohr's circle of the row asked for, or of the largest von Mises stress", async () => {
    const file = write('mohr.csv', 'a,b,c\n100,50,-20\n400,300,-100\n1,,2\n');
    const html = join(tmp(), 'mohr.html');
    const r = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--modulus',
      '200 GPa',
      '--poisson',
      '0.3',
      '--html',
      html,
    );
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stderr).toMatch(/wrote the HTML page to .*mohr\.html \(row 2\)/);
    const page = readFileSync(html, 'utf8');
    // The circle, the principal diameter and a radius to each of the three legs; the stress circle.
    expect(page).toMatch(/data-plot="mohr-strain"[^>]*data-series-count="6"/);
    expect(page).toMatch(/data-plot="mohr-stress"[^>]*data-series-count="3"/);
    expect(page).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
    const red = reduceRosette({ layout: 'rectangular', strains: [400e-6, 300e-6, -100e-6] });
    expect(page).toContain(`${formatNumber(red.maxStrain / 1e-6, 6)} µε`);
    const first = await run(
      'reduce-rosette',
      file,
      '--legs',
      'a,b,c',
      '--html',
      html,
      '--mohr-row',
      '1',
      '-f',
    );
    expect(first.stderr).toMatch(/\(row 1\)/);
    expect(readFileSync(html, 'utf8')).not.toMatch(/data-plot="mohr-stress"/);
    const cases: [string[], RegExp][] = [
      [['--html', join(tmp(), 'x.html'), '--mohr-row', '7'], /--mohr-row 7: .*mohr\.csv has 3 data rows/],
      [['--html', join(tmp(), 'x.html'), '--mohr-row', '3'], /row 3 could not be reduced/],
      [['--mohr-row', '1'], /--mohr-row needs --html/],
    ];
    for (const [args, message] of cases) {
      const e = await run('reduce-rosette', file, '--legs', 'a,b,c', ...args);
      expect(e.stderr).toMatch(message);
      expect(e.code).toBe(exitCodes.badInput);
    }
  });
});
